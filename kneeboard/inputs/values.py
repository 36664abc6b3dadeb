"""Reading the values of a profile file one by one, each by its declaration (`kneeboard.inputs.profile_keys`),
keeping every problem: the reader `kneeboard.inputs.schema` builds a profile with it. Also the text rules every text
field (and a card style's) is held to."""

import difflib
import json
import math
import re
import unicodedata

from kneeboard import units
from kneeboard.i18n import Msg
from kneeboard.inputs import profile_keys
from kneeboard.inputs.profile_keys import SPEED_RANGE
from kneeboard.problems import ERROR, WARNING, Problem
from kneeboard.profile import Calibration

MAX_POLAR_POINTS = 40
#: The kinds of field `Reader.read` reads from their declaration alone (banks, pairs and items have their own code).
READ_BY_DECLARATION = (profile_keys.QUANTITY, profile_keys.NUMBER, profile_keys.TEXT, profile_keys.NOTES,
                       profile_keys.CHOICE)
#: How the card tells of an entry of the profile that nothing reads (gathered into one line with their count)
UNKNOWN_ENTRY = Msg("An entry of the profile is not read; the card is made without it: check no figure is missing")

# the messages several fields share
REQUIRED = Msg("is required")
OUT_OF_RANGE = Msg("is out of range")
MUST_BE_TEXT = Msg("must be text in quotes")
ONE_LINE = Msg("printable text on one line")


def too_long(text: str) -> Msg:
    """What a text longer than its field allows is told."""
    return Msg("is {length} characters long", length=str(len(text)))


def control_character(ch: str) -> Msg:
    """What a text holding a control (or bidi, zero-width) character is told: the character by its code point."""
    code = f"{ord(ch):04X}"
    return Msg("contains the control character U+{code}", code=code)


def told(exc: Exception) -> str:
    """The message of a refusal (a quantity's, a logo's) as a problem carries it: the `Msg` it was made as, so the
    problem tells it in whatever language it is shown in; else its text."""
    message = exc.args[0] if exc.args else ""
    return message if isinstance(message, Msg) else str(exc)


class Reader:
    """Reads fields one by one and keeps every problem it finds."""

    def __init__(self):
        self.problems: list[Problem] = []

    def problem(self, path, message, expected="", value=None, severity=ERROR, plain=""):
        self.problems.append(Problem(path, message, expected, value, severity, plain=plain))

    def table(self, data, key, path, required=False):
        value = data.get(key)
        if value is None:
            if required:
                self.problem(path, Msg("the section is missing"), Msg("a [{section}] section", section=path))
            return None
        if not isinstance(value, dict):
            self.problem(path, Msg("must be a section (a [table])"), Msg("a [{section}] section", section=path), value)
            return None
        return value

    def unknown(self, data, known_set, prefix):
        """Keys not declared here: kept in the file, not used; one that looks like a misspelt known key says so.

        A misspelt *section* at the top level (`[weigth]`) is an error: the card would silently go without it.
        """
        for key in data:
            if key in known_set:
                continue
            path = f"{prefix}.{key_text(key)}" if prefix else key_text(key)
            close = difflib.get_close_matches(key, sorted(known_set), n=1, cutoff=0.75) if isinstance(key, str) \
                else []
            if close and not prefix and close[0] in profile_keys.SECTIONS and isinstance(data[key], (dict, list)):
                # named at the section it looks like: that is the field the person will look for
                # one sentence: the suggestion is what would do, so it is not said a second time as "expected"
                self.problem(close[0], Msg("[{key}] is not a section of a profile; did you mean [{section}]?",
                                           key=key_text(key), section=close[0]))
            elif close:
                near = profile_keys.BY_PATH.get(re.sub(r"\[\d+\]", "", f"{prefix}.{close[0]}"))
                self.problem(path, Msg("unknown key, kept in the file but not used; did you mean {key}?", key=close[0]),
                             value=data[key], severity=WARNING,
                             plain=UNKNOWN_ENTRY if near is None else
                             Msg("An entry of the profile looks like a misspelt '{field}' and is not read: check "
                                 "that figure", field=near.label))
            else:
                self.problem(path, Msg("unknown key, kept in the file but not used"), value=data[key],
                             severity=WARNING, plain=UNKNOWN_ENTRY)

    def read(self, name: str, data: dict, path: str | None = None, default=None):
        """The value of the declared field `name` ("aircraft.max_weight") from its table `data`, checked by its
        declaration; `path` is where it is in the file when the section repeats ("configuration[2].name").

        A key the file leaves out reads as `default` when one is given (a default that follows a rule, worked out
        by the caller), else as its declaration's default (None where it has none)."""
        f = profile_keys.BY_PATH[name]
        path = path or f.path
        default = f.default if default is None else default
        if f.kind in (profile_keys.QUANTITY, profile_keys.NUMBER) and f.key not in data and not f.required:
            return default
        if f.kind == profile_keys.QUANTITY:
            return self.quantity(data, f.key, path, f.quantity, f.bounds, f.required)
        if f.kind == profile_keys.NUMBER:
            return self.number(data, f.key, path, *f.bounds, required=f.required)
        if f.kind in (profile_keys.TEXT, profile_keys.NOTES):
            return self.text(data, f.key, path, f.limit, f.required, multiline=f.kind == profile_keys.NOTES,
                             default="" if default is None else default)
        if f.kind == profile_keys.CHOICE:
            return self.choice(data, f.key, path, f.options, default)
        raise ValueError(f"{name} is read by its own code")

    def read_section(self, section: str, data: dict, path: str | None = None, **defaults) -> dict:
        """Every field of `section` that `read` reads, in the order declared: key -> value. `defaults` are the
        defaults that follow a rule (by key); the others are the declarations'."""
        return {f.key: self.read(f.path, data, f"{path or section}.{f.key}", defaults.get(f.key))
                for f in profile_keys.in_section(section) if f.kind in READ_BY_DECLARATION}

    def quantity(self, data, key, path, kind, bounds=None, required=False):
        if key not in data:
            if required:
                self.problem(path, REQUIRED, kind.expected)
            return None
        return self.quantity_value(data[key], path, kind, bounds)

    def quantity_value(self, raw, path, kind, bounds=None):
        try:
            value = units.parse(raw, kind)
        except units.QuantityError as exc:
            self.problem(path, told(exc), exc.expected, raw)
            return None
        if bounds is not None:
            low, high, wording = bounds
            if not low < value <= high:
                self.problem(path, OUT_OF_RANGE, Msg("a {kind} {wording}", kind=kind.name, wording=wording), raw)
                return None
        return value

    def number(self, data, key, path, low, high, wording, required=False):
        if key not in data:
            if required:
                self.problem(path, REQUIRED, wording)
            return None
        raw = data[key]
        if isinstance(raw, bool) or not isinstance(raw, (int, float)):
            self.problem(path, Msg("must be a plain number"), wording, raw)
            return None
        if not (finite(raw) and low < raw <= high):
            self.problem(path, OUT_OF_RANGE, wording, raw)
            return None
        return float(raw)

    def text(self, data, key, path, limit, required=False, default="", multiline=False):
        if key not in data:
            if required:
                self.problem(path, REQUIRED, Msg("text of 1 to {limit} characters", limit=str(limit)))
            return default
        raw = data[key]
        if not isinstance(raw, str):
            self.problem(path, MUST_BE_TEXT, Msg("text of up to {limit} characters", limit=str(limit)), raw)
            return default
        if len(raw) > limit:
            self.problem(path, too_long(raw), Msg("text of up to {limit} characters", limit=str(limit)), raw)
            return raw[:limit]
        bad = first_non_text(raw, "\n" if multiline else "")
        if bad is not None:
            self.problem(path, control_character(bad),
                         Msg("printable text (line breaks are fine)") if multiline else ONE_LINE, raw)
            return default
        if required and not raw.strip():
            self.problem(path, Msg("must not be empty"), Msg("text of 1 to {limit} characters", limit=str(limit)), raw)
        return raw.strip() if required else raw

    def choice(self, data, key, path, options, default):
        raw = data.get(key, default)
        if raw not in options:
            self.problem(path, Msg("is not one of the accepted values"), " | ".join(options), raw)
            return default
        return raw

    def calibration(self, data, path):
        raw = data.get("calibration")
        if raw is None:
            return None
        wanted = Msg('at least two [IAS, CAS] pairs, ascending, e.g. [["40 kt", "44 kt"], ["60 kt", "61 kt"]]')
        if not isinstance(raw, list) or len(raw) < 2 or len(raw) > MAX_POLAR_POINTS:
            self.problem(path, Msg("must be a list of [IAS, CAS] pairs"), wanted, raw)
            return None
        pairs = self.pairs(raw, path, (units.SPEED, SPEED_RANGE), (units.SPEED, SPEED_RANGE), wanted)
        if pairs is None:
            return None
        ias, cas = zip(*pairs)
        if any(b <= a for a, b in zip(ias, ias[1:])) or any(b <= a for a, b in zip(cas, cas[1:])):
            self.problem(path, Msg("the pairs are not in strictly ascending order"), wanted, raw)
            return None
        return Calibration(tuple(ias), tuple(cas))

    def pairs(self, raw, path, first, second, wanted):
        """[a, b] pairs; `first` and `second` are (kind, bounds) of a and b."""
        result = []
        for i, pair in enumerate(raw, start=1):
            here = f"{path}[{i}]"
            if not isinstance(pair, list) or len(pair) != 2:
                self.problem(here, Msg("must be a pair of two quantities"), wanted, pair)
                return None
            a = self.quantity_value(pair[0], f"{here}[1]", *first)
            b = self.quantity_value(pair[1], f"{here}[2]", *second)
            if a is None or b is None:
                return None
            result.append((a, b))
        return result


def finite(x) -> bool:
    """math.isfinite that also answers for integers too large for a float (TOML has no limit on them)."""
    try:
        return math.isfinite(x)
    except OverflowError:
        return False


_NOT_TEXT = {"Cc", "Cf", "Cs", "Co", "Cn", "Zl", "Zp"}  #: controls, bidi and zero-width marks, line separators


def first_non_text(text: str, allowed: str = "") -> str | None:
    """The first character of `text` that is not printable text (it would reach a terminal or card raw), or None."""
    return next((ch for ch in text if ch not in allowed and unicodedata.category(ch) in _NOT_TEXT), None)


def key_text(key: str) -> str:
    """A key as a field path shows it: a plain name as is, anything else quoted with its controls escaped."""
    if re.fullmatch(r"[A-Za-z0-9_-]{1,40}", key):
        return key
    shown = key if len(key) <= 40 else key[:37] + "..."
    return json.dumps(shown, ensure_ascii=not shown.isprintable())


