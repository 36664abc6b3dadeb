"""Read profile data (the plain dict of a TOML file) into a `Profile`, collecting every problem.

Nothing is thrown away: each field is read on its own, a bad field becomes a `Problem` naming
its path, what is wrong and what would be accepted, and reading goes on so that one run reports
everything. Errors make the profile unusable; warnings are shown but do not stop a card.
"""

import difflib
import json
import math
import re
import unicodedata

from kneeboard import fields, units
from kneeboard.fields import (
    MAX_BANK_DEG,
    OAT_RANGE,
    SINK_RANGE,
    SPEED_RANGE,
)
from kneeboard.problems import ERROR, WARNING, Problem
from kneeboard.profile import (
    AVGAS_DENSITY,
    DEFAULT_BANKS_DEG,
    DEFAULT_PATTERN_FACTOR,
    FLAPS,
    NOTHING,
    Aircraft,
    Calibration,
    CardSettings,
    Configuration,
    Loading,
    Polar,
    Profile,
    WeightItem,
)

SCHEMA_VERSION = 1
MAX_CONFIGURATIONS = 12
MAX_BANKS = 24
MAX_ITEMS = 40
MAX_POLAR_POINTS = 40

#: Section -> the keys a file may have there, derived from the field declarations.
KNOWN_KEYS = fields.known_keys()


class _Reader:
    """Reads fields one by one and keeps every problem it finds."""

    def __init__(self):
        self.problems: list[Problem] = []

    def problem(self, path, message, expected="", value=None, severity=ERROR):
        self.problems.append(Problem(path, message, expected, value, severity))

    def table(self, data, key, path, required=False):
        value = data.get(key)
        if value is None:
            if required:
                self.problem(path, "the section is missing", f"a [{path}] section")
            return None
        if not isinstance(value, dict):
            self.problem(path, "must be a section (a [table])", f"a [{path}] section", value)
            return None
        return value

    def unknown(self, data, known_set, prefix):
        """Keys not declared here: kept in the file, not used; one that looks like a misspelt known key says so.

        A misspelt *section* at the top level (`[weigth]`) is an error: the card would silently go without it.
        """
        for key in data:
            if key in known_set:
                continue
            path = f"{prefix}.{_key_text(key)}" if prefix else _key_text(key)
            close = difflib.get_close_matches(key, sorted(known_set), n=1, cutoff=0.75) if isinstance(key, str) \
                else []
            if close and not prefix and close[0] in fields.SECTIONS and isinstance(data[key], (dict, list)):
                # named at the section it looks like: that is the field the person will look for
                self.problem(close[0], f"[{_key_text(key)}] is not a section of a profile; did you mean "
                             f"[{close[0]}]?", f"[{close[0]}]")
            elif close:
                self.problem(path, f"unknown key, kept in the file but not used; did you mean {close[0]}?",
                             value=data[key], severity=WARNING)
            else:
                self.problem(path, "unknown key, kept in the file but not used", value=data[key], severity=WARNING)

    def read(self, name: str, data: dict, path: str | None = None, default=None):
        """The value of the declared field `name` ("aircraft.max_weight") from its table `data`, checked by its
        declaration; `path` is where it is in the file when the section repeats ("configuration[2].name")."""
        f = fields.BY_PATH[name]
        path = path or f.path
        if f.kind == fields.QUANTITY:
            return self.quantity(data, f.key, path, f.quantity, f.bounds, f.required)
        if f.kind == fields.NUMBER:
            return self.number(data, f.key, path, *f.bounds, required=f.required)
        if f.kind in (fields.TEXT, fields.NOTES):
            return self.text(data, f.key, path, f.limit, f.required, multiline=f.kind == fields.NOTES,
                             default="" if default is None else default)
        if f.kind == fields.CHOICE:
            return self.choice(data, f.key, path, f.options, default)
        raise ValueError(f"{name} is read by its own code")

    def quantity(self, data, key, path, kind, bounds=None, required=False):
        if key not in data:
            if required:
                self.problem(path, "is required", f"a {kind.name} such as {kind.examples}")
            return None
        return self.quantity_value(data[key], path, kind, bounds)

    def quantity_value(self, raw, path, kind, bounds=None):
        try:
            value = units.parse(raw, kind)
        except units.QuantityError as exc:
            self.problem(path, str(exc), exc.expected, raw)
            return None
        if bounds is not None:
            low, high, wording = bounds
            if not low < value <= high:
                self.problem(path, "is out of range", f"a {kind.name} {wording}", raw)
                return None
        return value

    def number(self, data, key, path, low, high, wording, required=False):
        if key not in data:
            if required:
                self.problem(path, "is required", wording)
            return None
        raw = data[key]
        if isinstance(raw, bool) or not isinstance(raw, (int, float)):
            self.problem(path, "must be a plain number", wording, raw)
            return None
        if not (_finite(raw) and low < raw <= high):
            self.problem(path, "is out of range", wording, raw)
            return None
        return float(raw)

    def text(self, data, key, path, limit, required=False, default="", multiline=False):
        if key not in data:
            if required:
                self.problem(path, "is required", f"text of 1 to {limit} characters")
            return default
        raw = data[key]
        if not isinstance(raw, str):
            self.problem(path, "must be text in quotes", f"text of up to {limit} characters", raw)
            return default
        if len(raw) > limit:
            self.problem(path, f"is {len(raw)} characters long", f"text of up to {limit} characters", raw)
            return raw[:limit]
        bad = _not_text(raw, "\n" if multiline else "")
        if bad is not None:
            self.problem(path, f"contains the control character U+{ord(bad):04X}",
                         "printable text" + (" (line breaks are fine)" if multiline else " on one line"), raw)
            return default
        if required and not raw.strip():
            self.problem(path, "must not be empty", f"text of 1 to {limit} characters", raw)
        return raw.strip() if required else raw

    def choice(self, data, key, path, options, default):
        raw = data.get(key, default)
        if raw not in options:
            self.problem(path, "is not one of the accepted values", " | ".join(options), raw)
            return default
        return raw

    def calibration(self, data, path):
        raw = data.get("calibration")
        if raw is None:
            return None
        wanted = 'at least two [IAS, CAS] pairs, ascending, e.g. [["40 kt", "44 kt"], ["60 kt", "61 kt"]]'
        if not isinstance(raw, list) or len(raw) < 2 or len(raw) > MAX_POLAR_POINTS:
            self.problem(path, "must be a list of [IAS, CAS] pairs", wanted, raw)
            return None
        pairs = self.pairs(raw, path, (units.SPEED, SPEED_RANGE), (units.SPEED, SPEED_RANGE), wanted)
        if pairs is None:
            return None
        ias, cas = zip(*pairs)
        if any(b <= a for a, b in zip(ias, ias[1:])) or any(b <= a for a, b in zip(cas, cas[1:])):
            self.problem(path, "the pairs are not in strictly ascending order", wanted, raw)
            return None
        return Calibration(tuple(ias), tuple(cas))

    def pairs(self, raw, path, first, second, wanted):
        """[a, b] pairs; `first` and `second` are (kind, bounds) of a and b."""
        result = []
        for i, pair in enumerate(raw, start=1):
            here = f"{path}[{i}]"
            if not isinstance(pair, list) or len(pair) != 2:
                self.problem(here, "must be a pair of two quantities", wanted, pair)
                return None
            a = self.quantity_value(pair[0], f"{here}[1]", *first)
            b = self.quantity_value(pair[1], f"{here}[2]", *second)
            if a is None or b is None:
                return None
            result.append((a, b))
        return result


def profile_from_data(data: dict) -> tuple[Profile | None, list[Problem]]:
    """Build a Profile from the plain data of a profile file; None when any error was found."""
    r = _Reader()
    if not isinstance(data, dict):
        r.problem("(file)", "is not a TOML table", "a profile file")
        return None, r.problems
    _read_schema(r, data)
    r.unknown(data, KNOWN_KEYS[""], "")
    aircraft = _read_aircraft(r, data)
    loading = _read_loading(r, data)
    configurations = _read_configurations(r, data)
    glider = _read_glider(r, data)
    card = _read_card(r, data)
    if any(p.is_error for p in r.problems) or aircraft is None or not configurations:
        return None, r.problems
    profile = Profile(aircraft, tuple(configurations), card, loading, glider)
    _cross_checks(r, profile)
    if any(p.is_error for p in r.problems):
        return None, r.problems
    return profile, r.problems


def _read_schema(r, data):
    version = data.get("schema")
    wanted = f"schema = {SCHEMA_VERSION}"
    if version is None:
        r.problem("schema", f"is missing, so this is a format-0 file; it is read as format {SCHEMA_VERSION}, and "
                  "saving it from the app adds the number and keeps the original as a .format0.bak file",
                  wanted, severity=WARNING)
    elif isinstance(version, bool) or not isinstance(version, int) or version < 1:
        r.problem("schema", "is not a format number", wanted, version)
    elif version > SCHEMA_VERSION:
        r.problem(
            "schema",
            f"the file is format {version}, written by a newer kneeboard; this version reads format {SCHEMA_VERSION}",
            "a newer kneeboard to open it",
            version,
        )


def _read_aircraft(r, data):
    a = r.table(data, "aircraft", "aircraft", required=True)
    if a is None:
        return None
    r.unknown(a, KNOWN_KEYS["aircraft"], "aircraft")
    registration = r.read("aircraft.registration", a)
    model = r.read("aircraft.model", a)
    category = r.read("aircraft.category", a, default="normal")
    max_weight = r.read("aircraft.max_weight", a)
    reference = r.read("aircraft.reference_weight", a)
    n_limit = r.read("aircraft.limit_load_factor", a)
    va = r.read("aircraft.maneuvering_speed", a)
    va_weight = r.read("aircraft.maneuvering_speed_weight", a)
    basis = r.read("aircraft.speed_basis", a, default="IAS")
    calibration = r.calibration(a, "aircraft.calibration")
    if max_weight is None:
        return None
    return Aircraft(
        registration=registration,
        model=model,
        category=category,
        max_weight=max_weight,
        reference_weight=max_weight if reference is None else reference,
        limit_load_factor=n_limit,
        maneuvering_speed=va,
        maneuvering_speed_weight=va_weight,
        speed_basis=basis,
        calibration=calibration,
    )


def _read_loading(r, data):
    w = r.table(data, "weight", "weight")
    if w is None:
        return None
    r.unknown(w, KNOWN_KEYS["weight"], "weight")
    total = r.read("weight.total", w)
    empty = r.read("weight.empty", w)
    raw_items = w.get("item", [])
    if "total" in w and ("empty" in w or raw_items):
        r.problem("weight", "gives both a total and a build-up", "either total, or empty with [[weight.item]] tables")
        return None
    if "total" not in w and "empty" not in w:
        r.problem("weight", "gives neither a total nor an empty weight",
                  'total = "690 kg", or empty = "480 kg" plus items')
        return None
    if not isinstance(raw_items, list) or len(raw_items) > MAX_ITEMS:
        r.problem("weight.item", f"must be up to {MAX_ITEMS} [[weight.item]] tables", value=raw_items)
        return None
    items = [_read_item(r, raw, f"weight.item[{i}]") for i, raw in enumerate(raw_items, start=1)]
    if total is None and (empty is None or None in items):
        return None
    return Loading(total=total, empty=empty, items=tuple(items))


def _read_item(r, raw, path):
    if not isinstance(raw, dict):
        r.problem(path, "must be a [[weight.item]] table", "name and mass, or name and volume", raw)
        return None
    r.unknown(raw, KNOWN_KEYS["weight.item"], path)
    name = r.read("weight.item.name", raw, f"{path}.name")
    if ("mass" in raw) == ("volume" in raw):
        r.problem(path, "needs exactly one of mass or volume", 'mass = "80 kg", or volume = "60 L"')
        return None
    if "mass" in raw:
        if "density" in raw:
            r.problem(f"{path}.density", "goes with a volume, but this item gives a mass", "mass alone, or volume and "
                      "density", raw["density"])
        mass = r.read("weight.item.mass", raw, f"{path}.mass")
        return None if mass is None else WeightItem(name, mass)
    volume = r.read("weight.item.volume", raw, f"{path}.volume")
    density = r.read("weight.item.density", raw, f"{path}.density")
    if volume is None or ("density" in raw and density is None):
        return None
    density = AVGAS_DENSITY if density is None else density
    return WeightItem(name, volume * density, volume, density)


def _read_configurations(r, data):
    raw = data.get("configuration")
    wanted = 'one or more [[configuration]] tables with a name and a stall_speed'
    if raw is None:
        r.problem("configuration", "no configuration is given", wanted)
        return []
    if not isinstance(raw, list) or not raw or len(raw) > MAX_CONFIGURATIONS:
        r.problem("configuration", f"must be 1 to {MAX_CONFIGURATIONS} [[configuration]] tables", wanted, raw)
        return []
    result, seen = [], set()
    for i, c in enumerate(raw, start=1):
        path = f"configuration[{i}]"
        if not isinstance(c, dict):
            r.problem(path, "must be a [[configuration]] table", wanted, c)
            continue
        r.unknown(c, KNOWN_KEYS["configuration"], path)
        name = r.read("configuration.name", c, f"{path}.name")
        if name and _name_key(name) in seen:
            r.problem(f"{path}.name", "is used by an earlier configuration", "a name unique in this profile", name)
        seen.add(_name_key(name))
        stall = r.read("configuration.stall_speed", c, f"{path}.stall_speed")
        factor = r.read("configuration.pattern_factor", c, f"{path}.pattern_factor")
        fixed = r.read("configuration.pattern_speed", c, f"{path}.pattern_speed")
        if "pattern_factor" in c and "pattern_speed" in c:
            r.problem(path, "gives both pattern_factor and pattern_speed", "one of them, never both")
        vfe = r.read("configuration.flap_limit_speed", c, f"{path}.flap_limit_speed")
        calibration = r.calibration(c, f"{path}.calibration")
        extended = r.read("configuration.extended", c, f"{path}.extended",
                          default=FLAPS if vfe is not None else NOTHING)
        n_limit = r.read("configuration.limit_load_factor", c, f"{path}.limit_load_factor")
        if stall is None:
            continue
        if fixed is None and factor is None:
            factor = DEFAULT_PATTERN_FACTOR
        result.append(Configuration(name, stall, None if fixed is not None else factor, fixed, vfe, calibration,
                                    extended, n_limit))
    return result


def _read_glider(r, data):
    g = r.table(data, "glider", "glider")
    if g is None:
        return None
    r.unknown(g, KNOWN_KEYS["glider"], "glider")
    weight = r.read("glider.polar_weight", g)
    raw = g.get("polar")
    wanted = 'at least three [speed, sink rate] points, e.g. [["80 km/h", "0.62 m/s"], ...]'
    if not isinstance(raw, list) or not 3 <= len(raw) <= MAX_POLAR_POINTS:
        r.problem("glider.polar", "must be a list of 3 to 40 [speed, sink rate] points", wanted, raw)
        return None
    points = r.pairs(raw, "glider.polar", (units.SPEED, SPEED_RANGE), (units.SPEED, SINK_RANGE), wanted)
    if points is None or weight is None:
        return None
    speeds, sinks = zip(*points)
    if len(set(speeds)) < 3:
        r.problem("glider.polar", "needs at least three different speeds", wanted, raw)
        return None
    return Polar(weight, tuple(speeds), tuple(sinks))


def _read_card(r, data):
    c = r.table(data, "card", "card") or {}
    r.unknown(c, KNOWN_KEYS["card"], "card")
    banks = _read_banks(r, c)
    speed_unit = r.read("card.speed_unit", c,
                        default=units.display_unit(_first_stall_speed(data), units.SPEED_UNITS) or "kt")
    distance_unit = r.read("card.distance_unit", c, default="m" if speed_unit == "km/h" else "ft")
    aircraft = data.get("aircraft") if isinstance(data.get("aircraft"), dict) else {}
    weight_unit = r.read("card.weight_unit", c,
                         default=units.display_unit(aircraft.get("max_weight"), units.WEIGHT_UNITS) or "kg")
    buffer = r.read("card.buffer", c)
    altitude = r.read("card.pressure_altitude", c)
    temperature = r.read("card.temperature", c)
    if temperature is not None and temperature <= 0.0:
        r.problem("card.temperature", "is at or below absolute zero", "a temperature above -273.15 degC",
                  c["temperature"])
        temperature = None
    elif temperature is not None and not OAT_RANGE[0] <= temperature <= OAT_RANGE[1]:
        r.problem("card.temperature", "is not an outside air temperature", OAT_RANGE[2], c["temperature"])
        temperature = None
    elif temperature is not None and not 203.15 <= temperature <= 333.15:
        r.problem("card.temperature", "is outside -70 to +60 degC; check it", "an outside air temperature",
                  c["temperature"], WARNING)
    notes = r.read("card.notes", c)
    return CardSettings(
        bank_angles_deg=banks,
        speed_unit=speed_unit,
        distance_unit=distance_unit,
        weight_unit=weight_unit,
        buffer=buffer or 0.0,
        pressure_altitude=altitude or 0.0,
        temperature=temperature,
        notes=notes,
    )


def _first_stall_speed(data):
    configurations = data.get("configuration")
    if isinstance(configurations, list) and configurations and isinstance(configurations[0], dict):
        return configurations[0].get("stall_speed")
    return None


def _read_banks(r, c):
    if "bank_angles" not in c:
        return DEFAULT_BANKS_DEG
    raw = c["bank_angles"]
    wanted = (f"a list of 1 to {MAX_BANKS} bank angles in degrees, each from 0 to {MAX_BANK_DEG:g}, "
              "e.g. [0, 15, 30, 45, 60]")
    if not isinstance(raw, list) or not 1 <= len(raw) <= MAX_BANKS:
        r.problem("card.bank_angles", "must be a list of numbers", wanted, raw)
        return DEFAULT_BANKS_DEG
    banks = []
    for i, b in enumerate(raw, start=1):
        if isinstance(b, bool) or not isinstance(b, (int, float)) or not (_finite(b) and 0 <= b <= MAX_BANK_DEG):
            r.problem(f"card.bank_angles[{i}]", "is not a bank angle a level turn can hold", wanted, b)
            continue
        banks.append(float(b))
    if len(set(banks)) != len(banks):
        r.problem("card.bank_angles", "lists a bank twice; it is printed once", "each bank once", raw, WARNING)
    return tuple(sorted(set(banks))) or DEFAULT_BANKS_DEG


def _finite(x) -> bool:
    """math.isfinite that also answers for integers too large for a float (TOML has no limit on them)."""
    try:
        return math.isfinite(x)
    except OverflowError:
        return False


_NOT_TEXT = {"Cc", "Cf", "Cs", "Co", "Cn", "Zl", "Zp"}  #: controls, bidi and zero-width marks, line separators


def _not_text(text: str, allowed: str = "") -> str | None:
    """The first character of `text` that is not printable text (it would reach a terminal or card raw), or None."""
    return next((ch for ch in text if ch not in allowed and unicodedata.category(ch) in _NOT_TEXT), None)


def _key_text(key: str) -> str:
    """A key as a field path shows it: a plain name as is, anything else quoted with its controls escaped."""
    if re.fullmatch(r"[A-Za-z0-9_-]{1,40}", key):
        return key
    shown = key if len(key) <= 40 else key[:37] + "..."
    return json.dumps(shown, ensure_ascii=not shown.isprintable())


def _name_key(name: str) -> str:
    """What makes two configuration names the same on a card: case, character width and spacing do not count."""
    return " ".join(unicodedata.normalize("NFKC", name).casefold().split())


def _cross_checks(r, profile):
    """Checks that need more than one field; the ones needing flight mechanics live in `kneeboard.checks`."""
    a = profile.aircraft
    if profile.weight > a.max_weight * (1 + 1e-9):
        unit = profile.card.weight_unit
        r.problem(
            "weight", f"{units.format_quantity(profile.weight, units.MASS, unit)} is above the maximum weight of "
            f"{units.format_quantity(a.max_weight, units.MASS, unit)}; limit loads are reduced in proportion",
            "a weight at or below aircraft.max_weight", severity=WARNING,
        )
    if a.reference_weight > a.max_weight * (1 + 1e-9):
        r.problem("aircraft.reference_weight", "is above the maximum weight", "at most aircraft.max_weight",
                  severity=WARNING)
