"""Quantity parsing against pint's own unit definitions."""

import subprocess
import sys

import pytest

from kneeboard import units


@pytest.mark.parametrize(
    "text, kind, si",
    [
        # Exact definitions: 1 kt = 1852 m/h (international nautical mile), 1 lb = 0.45359237 kg,
        # 1 ft = 0.3048 m, 1 mile = 1609.344 m (pint's definitions file, which follows NIST SP 811).
        ("52 kt", units.SPEED, 52 * 1852 / 3600),
        ("96 km/h", units.SPEED, 96 / 3.6),
        ("60 mph", units.SPEED, 60 * 1609.344 / 3600),
        ("2535 lb", units.MASS, 2535 * 0.45359237),
        ("1150 kg", units.MASS, 1150.0),
        ("1000 ft", units.LENGTH, 304.8),
        ("100 L", units.VOLUME, 0.1),
        ("0.72 kg/L", units.DENSITY, 720.0),
        ("15 degC", units.TEMPERATURE, 288.15),
        ("59 degF", units.TEMPERATURE, 288.15),
        ("  48.5   knot ", units.SPEED, 48.5 * 1852 / 3600),
    ],
)
def test_parse_to_si(text, kind, si):
    assert units.parse(text, kind) == pytest.approx(si, rel=1e-12)


@pytest.mark.parametrize(
    "value, kind, says",
    [
        ("52 kg", units.SPEED, "mass, not of speed"),
        (52, units.SPEED, "bare number"),
        ("52", units.SPEED, "unit is missing"),
        ("fast", units.SPEED, "not a number"),
        ("5 parsecs/fortnight/zz", units.SPEED, "unknown unit"),
        ("1e400 kt", units.SPEED, "too large"),
        ("5 delta_degC", units.TEMPERATURE, "difference"),
        ("15 degC", units.SPEED, "temperature"),
        ("x" * 100, units.MASS, "too long"),
        (True, units.MASS, "not bool"),
    ],
)
def test_parse_errors_say_why_and_what_would_do(value, kind, says):
    with pytest.raises(units.QuantityError) as err:
        units.parse(value, kind)
    assert says in str(err.value) or says == "not bool"
    assert kind.name in err.value.expected


def test_expression_evaluation_is_not_available():
    # Only "number unit" is accepted: no arithmetic and no huge powers reach pint's evaluator.
    for text in ("2**1000000 kt", "(1+1) kt", "10 * 5 kt", "5 kt ** 100000000"):
        with pytest.raises(units.QuantityError):
            units.parse(text, units.SPEED)


def test_display_round_trip():
    si = units.parse("47 kt", units.SPEED)
    assert units.format_quantity(si, units.SPEED, "kt") == "47 kt"
    assert units.from_si(si, units.SPEED, "km/h") == pytest.approx(47 * 1.852)


def test_display_unit_recognises_spellings():
    assert units.display_unit("50 knot", units.SPEED_UNITS) == "kt"
    assert units.display_unit("50 kts", units.SPEED_UNITS) == "kt"
    assert units.display_unit("50 kph", units.SPEED_UNITS) == "km/h"
    assert units.display_unit("50 m/s", units.SPEED_UNITS) is None
    assert units.display_unit("1500 pound", units.WEIGHT_UNITS) == "lb"


def test_one_registry():
    import kneeboard.units as again

    assert again.ureg is units.ureg


def test_unit_power_towers_are_refused_without_evaluating():
    # pint works out integer powers exactly: "9**9**9" or "((nmi/mi)**99)**99" took hours. Only one-digit powers
    # of a unit name are read. A separate process, so a regression fails on the timeout instead of hanging.
    code = (
        "from kneeboard import units\n"
        "for text in ('5 kt**9**9**9', '5 kt^9^9^9', '5 kt**(9**9**9)', '5 ((((nmi/mi)**99)**99)**99)**99*kt'):\n"
        "    try:\n"
        "        units.parse(text, units.SPEED)\n"
        "    except units.QuantityError as exc:\n"
        "        assert 'not a unit' in str(exc), exc\n"
        "    else:\n"
        "        raise SystemExit(f'{text} was read')\n"
    )
    proc = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, timeout=60)  # hang guard
    assert proc.returncode == 0, proc.stdout + proc.stderr


def test_unit_conversion_overflow_is_a_quantity_error():
    # (nmi/mi) to the 9801st power overflowed a float inside pint and escaped as OverflowError.
    for text in ("5 (nmi**99/mi**99)**99*kt", "5 ((nmi/mi)**99)**99*kt"):
        with pytest.raises(units.QuantityError):
            units.parse(text, units.SPEED)


def test_digits_of_other_scripts_are_not_numbers():
    # Bengali four looks like an 8: "\u09ea0 kt" was read as 40 kt where a person sees 80.
    for text in ("\u09ea0 kt", "\uff15 kt", "\u0665 kt", "\U0001d7d3 kt"):
        with pytest.raises(units.QuantityError, match="not a number"):
            units.parse(text, units.SPEED)
    assert units.parse("40 kt", units.SPEED) == pytest.approx(40 * 1852 / 3600)


def test_fractional_unit_powers_are_not_units():
    # "m**1.0000000001/s" was refused as "a unit of [length] ** 1 / [time], not of speed": a riddle.
    with pytest.raises(units.QuantityError, match="is not a unit"):
        units.parse("5 m**1.0000000001/s", units.SPEED)
    assert units.parse("0.72 kg/m**3", units.DENSITY) == pytest.approx(0.72)
