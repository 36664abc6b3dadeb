"""The one pint registry of kneeboard: every quantity is parsed and formatted here and nowhere else.

A profile value is a string of a number and a unit ("52 kt", "1150 kg", "15 degC"). It is
parsed with a strict pattern (a plain decimal number in ASCII digits, then a unit expression
of unit names, `*`, `/`, parentheses and small integer powers, which pint resolves) rather than
pint's expression evaluator, so a file can only ever yield a number of the expected kind: no
arithmetic, no powers that take forever, nothing executed.
"""

import math
import re
from dataclasses import dataclass
from functools import lru_cache

import pint

from kneeboard.i18n import N_, Msg
from kneeboard.problems import Told

#: Display units a card may use, as written in profiles and styles (named in `unit_names`, which loads no pint).
from kneeboard.unit_names import DISTANCE_UNITS, SPEED_UNITS, WEIGHT_UNITS  # noqa: F401


def _registry() -> pint.UnitRegistry:
    """The registry, from pint's own cache of its parsed definitions when it can keep one.

    Building it from the definitions text takes a third of a second, most of the app's start-up;
    the cache (in the user's cache folder) cuts that tenfold. Without a writable cache it is built.
    """
    try:
        return pint.UnitRegistry(cache_folder=":auto:", autoconvert_offset_to_baseunit=False)
    except Exception:  # an unwritable or damaged cache must never stop the program
        return pint.UnitRegistry(autoconvert_offset_to_baseunit=False)


ureg = _registry()
# Spellings pilots write that pint does not know.
ureg.define("kts = knot")
ureg.define("fpm = foot / minute")


@dataclass(frozen=True)
class Kind:
    """A kind of physical quantity a profile field holds."""

    name: str  #: what a person calls it: "speed" (a Word, translated where it is shown)
    dimensionality: str  #: pint dimensionality it must have
    si_unit: str  #: unit of the float the program works with
    examples: str  #: what would be accepted, for messages (a Msg: its "or" is told in the user's language)
    such_as: str = ""  #: what would be accepted as one sentence (a Msg), "a speed such as ..."

    @property
    def expected(self) -> str:
        """What would be accepted, as a message's expected text: "a speed such as "52 kt", ..."."""
        return self.such_as or Msg("a {kind} such as {examples}", kind=self.name, examples=self.examples)


SPEED = Kind(N_("speed"), "[length] / [time]", "m/s", Msg('"52 kt", "96 km/h" or "60 mph"'),
             Msg('a speed such as "52 kt", "96 km/h" or "60 mph"'))
MASS = Kind(N_("mass"), "[mass]", "kg", Msg('"750 kg" or "1650 lb"'), Msg('a mass such as "750 kg" or "1650 lb"'))
LENGTH = Kind(N_("length"), "[length]", "m", Msg('"1000 ft" or "300 m"'), Msg('a length such as "1000 ft" or "300 m"'))
VOLUME = Kind(N_("volume"), "[length] ** 3", "m**3", Msg('"100 L" or "26 gal"'),
              Msg('a volume such as "100 L" or "26 gal"'))
DENSITY = Kind(N_("density"), "[mass] / [length] ** 3", "kg/m**3", '"0.72 kg/L"', Msg('a density such as "0.72 kg/L"'))
TEMPERATURE = Kind(N_("temperature"), "[temperature]", "K", Msg('"15 degC", "59 degF" or "288 K"'),
                   Msg('a temperature such as "15 degC", "59 degF" or "288 K"'))
TIME = Kind(N_("time"), "[time]", "s", '"4 s"', Msg('a time such as "4 s"'))


MAX_TEXT = 64
# ASCII digits only: other scripts' digits (Bengali 4 looks like 8) would read as a number a person does not see.
_NUMBER_UNIT = re.compile(r"\s*([-+]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][-+]?[0-9]+)?)\s*(.*?)\s*\Z")
# A unit expression, token by token: names, * / ( ), and one-digit powers of a name ("m**3"). A number
# is only ever such an exponent, so "kt**9**9**9" and "((nmi/mi)**99)**99" (exact integer powers pint
# would spend hours on) and "kt*1e300" never reach pint.
_UNIT_TOKEN = re.compile(r"\s*(?:(?P<name>[A-Za-z_°µ][A-Za-z_°µ0-9]*)|(?P<power>(?:\*\*|\^)\s*-?[0-9](?![0-9.]))"
                         r"|(?P<op>[*/()]))")


class QuantityError(Told, ValueError):
    """A value that is not a quantity of the expected kind; `expected` says what would be.

    `message` is the message as made (a `Msg`, told in any language: a problem made from it keeps it so); `str` of
    the error is it told in the user's language.
    """

    def __init__(self, message: str, expected: str):
        super().__init__(message)
        self.message, self.expected = message, expected


@lru_cache(maxsize=512)
def _unit(text: str):
    """Resolve a unit expression once and check it is a plain unit; pint objects are immutable, so caching is safe.

    Every call into pint happens inside the one `try`: pint raises many unrelated types for junk
    (and some only later, from `dimensionality`), so nothing it raises may escape as anything but
    QuantityError.
    """
    if not _is_unit_expression(text):
        raise QuantityError(Msg("{text} is not a unit", text=repr(text)), "")
    try:
        unit = ureg.parse_units(text)
        _check_plain(text, unit)
        unit.dimensionality  # noqa: B018 - resolved here, where a failure can still be caught
    except QuantityError:
        raise
    except Exception as exc:  # pint raises several unrelated types for junk
        raise QuantityError(Msg("unknown unit {text}", text=repr(text)), "") from exc
    return unit


def _check_plain(text: str, unit) -> None:
    """Refuse a unit that would change the number as written, or that is no amount at all.

    A logarithmic unit (neper, decibel, octave, decade) is a level, not an amount; a pure-number
    factor (percent, turn, radian, degree of angle, dozen, ppm...) or a unit hiding one (rpm is
    2 pi radian per minute) silently scales the number; units whose dimensions cancel ("g/kg")
    are such a factor too. A temperature scale with an offset (degC) only stands alone.
    """
    container = unit._units
    names = list(container)
    for name in names:
        plain_name = name.removeprefix("delta_")
        definition = ureg._units.get(name) or ureg._units.get(plain_name)
        if definition is None:
            raise QuantityError(Msg("{text} is not a unit a value can have", text=repr(text)), "")
        if definition.is_logarithmic:
            raise QuantityError(Msg("{text} holds {unit}, a logarithmic unit (a level, not an amount); only plain "
                                    "units are accepted", text=repr(text), unit=plain_name), "")
        if name not in ureg._units or not definition.is_multiplicative and (len(names) > 1 or container[name] != 1):
            # pint turns an offset scale inside a product into a made-up delta_ unit
            raise QuantityError(Msg('{text} puts the temperature scale {unit} inside an expression; a temperature '
                                    'is written alone, e.g. "15 degC"', text=repr(text), unit=plain_name), "")
        if not ureg.get_dimensionality(name):
            raise QuantityError(Msg("{text} holds {unit}, a pure number that would change the value as written; "
                                    "write the value in a plain unit", text=repr(text), unit=name), "")
        roots = ureg.get_root_units(name)[1]._units
        hidden = [root for root in roots if not ureg.get_dimensionality(root)]
        if hidden:
            raise QuantityError(Msg("{text} holds {unit}, which counts {counted}s (a pure number); write the value "
                                    "in a plain unit", text=repr(text), unit=name, counted=hidden[0]), "")
    _check_no_cancelling(text, container)


def _check_no_cancelling(text: str, container) -> None:
    """Refuse units whose dimensions cancel between them ("kt*g/kg", "kt*h/s"): a pure-number factor in disguise."""
    used: dict[str, float] = {}
    total: dict[str, float] = {}
    for name, power in container.items():
        for dim, exponent in ureg.get_dimensionality(name).items():
            used[dim] = used.get(dim, 0) + abs(exponent * power)
            total[dim] = total.get(dim, 0) + exponent * power
    if any(used[dim] != abs(total[dim]) for dim in used):
        raise QuantityError(Msg("{text} has units that cancel each other (a pure-number factor); write the value in "
                                "one plain unit", text=repr(text)), "")


def _is_unit_expression(text: str) -> bool:
    """Whether `text` is made of unit names, * / ( ) and one-digit integer powers of a name."""
    pos, previous = 0, None
    while pos < len(text.rstrip()):
        m = _UNIT_TOKEN.match(text, pos)
        if not m or m.end() == pos:
            return False
        kind = m.lastgroup
        if kind == "power" and previous != "name":
            return False
        previous, pos = (m.group("op") if kind == "op" else kind), m.end()
    return previous is not None


@lru_cache(maxsize=512)
def _factor(unit_text: str, si_unit: str) -> float:
    return float(ureg.Quantity(1.0, _unit(unit_text)).to(si_unit).magnitude)


# "1,560 lb", "1 560 lb", "1'560 lb", "1_560 lb": digits grouped in threes. Read as written they would be
# 1 of a unit called ",560 lb"; refused with a word on how to write them.
_GROUPED = re.compile(r"\s*([-+]?[0-9]{1,3}(?:([,' _])[0-9]{3})(?:\2[0-9]{3})*(?:\.[0-9]*)?)\s*(.*?)\s*\Z")
_DECIMAL_COMMA = re.compile(r"\s*([-+]?[0-9]+),([0-9]+)\s*(.*?)\s*\Z")


def split(text: str) -> tuple[float, str]:
    """Split "52 kt" into (52.0, "kt"); raises QuantityError when it is not number-and-unit."""
    m = _NUMBER_UNIT.match(text) if len(text) <= MAX_TEXT else None
    if not m:
        raise QuantityError(Msg("not a number followed by a unit"), "")
    if m.group(2)[:1] in (",", "'", "_") or m.group(2)[:1].isdigit():
        _refuse_separators(text)
    return float(m.group(1)), m.group(2)


def _refuse_separators(text: str) -> None:
    """Say how to write a number with thousands separators or a decimal comma, which are not read."""
    grouped = _GROUPED.match(text)
    if grouped:
        digits = re.sub(r"[,' _]", "", grouped.group(1))
        raise QuantityError(Msg("thousands separators are not accepted; write {written}",
                                written=" ".join(filter(None, (digits, grouped.group(3))))), "")
    comma = _DECIMAL_COMMA.match(text)
    if comma:
        written = " ".join(filter(None, (f"{comma.group(1)}.{comma.group(2)}", comma.group(3))))
        raise QuantityError(Msg("the decimal separator is a point, not a comma; write {written}", written=written), "")


def parse(value: object, kind: Kind) -> float:
    """Parse a profile value into the SI float of `kind`; raises QuantityError with the reason.

    Accepts only a string "number unit" whose unit has the dimension of `kind`. Strings are
    immutable, so each (text, kind) is parsed once: an edit re-reads the whole profile.
    """
    if isinstance(value, str):
        result = _parse_text(value, kind)
        if isinstance(result, QuantityError):
            raise QuantityError(result.message, result.expected)
        return result
    return _parse(value, kind)


@lru_cache(maxsize=4096)
def _parse_text(value: str, kind: Kind):
    try:
        return _parse(value, kind)
    except QuantityError as exc:
        return exc  # a wrong entry is as stable as a right one: remember the answer, raise it afresh


def _parse(value: object, kind: Kind) -> float:
    expected = kind.expected
    if isinstance(value, bool) or not isinstance(value, str):
        if isinstance(value, (int, float)):
            raise QuantityError(Msg("a bare number has no unit; write it with its unit"), expected)
        raise QuantityError(Msg("expected text with a number and a unit, not {type}", type=type(value).__name__),
                            expected)
    if len(value) > MAX_TEXT:
        raise QuantityError(Msg("text of {length} characters is too long for a quantity", length=str(len(value))),
                            expected)
    try:
        number, unit_text = split(value)
        if not unit_text:
            raise QuantityError(Msg("the unit is missing"), expected)
        unit = _unit(unit_text)
    except QuantityError as exc:
        raise QuantityError(exc.message, expected) from None
    if not math.isfinite(number):
        raise QuantityError(Msg("the number is too large"), expected)
    if unit.dimensionality != ureg.get_dimensionality(kind.dimensionality):
        raise QuantityError(Msg("{unit} is a unit of {described}, not of {kind}", unit=repr(unit_text),
                                described=_describe(unit), kind=kind.name), expected)
    if kind is TEMPERATURE:
        if "delta" in str(unit):
            raise QuantityError(Msg("{unit} is a temperature difference, not a temperature", unit=repr(unit_text)),
                                expected)
    elif unit.dimensionality == ureg.get_dimensionality("[temperature]"):
        raise QuantityError(Msg("a temperature unit here makes no sense"), expected)
    try:
        if kind is TEMPERATURE:
            result = float(ureg.Quantity(number, unit).to("K").magnitude)
        else:
            result = number * _factor(unit_text, kind.si_unit)
    except Exception:  # pint's conversions raise overflow and offset-unit errors of several types
        raise QuantityError(Msg("{unit} cannot be converted to {si_unit}", unit=repr(unit_text), si_unit=kind.si_unit),
                            expected) from None
    if not math.isfinite(result):
        raise QuantityError(Msg("the number is too large"), expected)
    return result


def _describe(unit) -> str:
    dims = unit.dimensionality
    for kind in (SPEED, MASS, LENGTH, VOLUME, DENSITY, TEMPERATURE, TIME):
        if dims == ureg.get_dimensionality(kind.dimensionality):
            return kind.name
    return str(dims) if dims else N_("a pure number")


def display_unit(value: object, options: tuple[str, ...]) -> str | None:
    """Which of the display `options` the unit of a written quantity is ("knots" -> "kt"), or None."""
    if not isinstance(value, str):
        return None
    try:
        unit_text = split(value)[1]
        for option in options:
            same_kind = _unit(option).dimensionality == _unit(unit_text).dimensionality
            if same_kind and abs(_factor(unit_text, option) - 1.0) < 1e-12:
                return option
        return None
    except QuantityError:
        return None


def from_si(value, kind: Kind, unit: str):
    """Express an SI float (or numpy array) of `kind` in `unit` ("kt", "ft", "lb"...)."""
    if kind is TEMPERATURE:
        return ureg.Quantity(value, "K").to(unit).magnitude
    return value / _factor(unit, kind.si_unit)


def to_si(value, kind: Kind, unit: str):
    """Express a number (or numpy array) given in `unit` as the SI float of `kind`."""
    return value * _factor(unit, kind.si_unit)


def format_quantity(value: float, kind: Kind, unit: str, decimals: int = 0) -> str:
    """Format an SI float as text in `unit`, e.g. "52 kt", so it parses back to (about) the same."""
    return f"{from_si(value, kind, unit):.{decimals}f} {unit}"
