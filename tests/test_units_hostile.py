"""Unit strings built to break the units library: every one is a plain quantity or a QuantityError.

The number a person writes is the number the program uses, in a unit of the right dimension:
logarithmic units, pure-number factors (turn, percent, radian, degree of angle, ppm...), units
hiding one (rpm counts radians) and units that cancel ("g/kg") are refused with a reason.
"""

import math

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from kneeboard import units
from kneeboard.units import ureg

KINDS = (units.SPEED, units.MASS, units.LENGTH, units.VOLUME, units.DENSITY, units.TEMPERATURE)
#: Every name pint's registry knows (units, their symbols and aliases), sorted so runs are repeatable.
REGISTRY_NAMES = sorted(ureg._units)


@pytest.mark.parametrize("text, kind", [
    # each of these ended in pint's UndefinedUnitError 'delta_neper' (and the like) out of `dimensionality`
    ("48 kt*neper", units.SPEED),
    ("1650 lb*decibel", units.MASS),
    ("48 kt*dB", units.SPEED),
    ("1000 ft*decade", units.LENGTH),
    ("48 kt*octave", units.SPEED),
    ("48 neper*kt", units.SPEED),
    ("48 kt/neper", units.SPEED),
    ("48 dB", units.SPEED),
])
def test_logarithmic_units_are_refused_with_a_reason(text, kind):
    with pytest.raises(units.QuantityError) as err:
        units.parse(text, kind)
    assert "logarithmic" in str(err.value)
    assert kind.name in err.value.expected


@pytest.mark.parametrize("text, kind, factor", [
    # each of these was accepted and changed the number as written (8 kt*turn was 50.3 kt)
    ("8 kt*turn", units.SPEED, "turn"),
    ("5200 percent*kt", units.SPEED, "percent"),
    ("52 kt*radian", units.SPEED, "radian"),
    ("52 kt*rad", units.SPEED, "radian"),
    ("52 kt*degree", units.SPEED, "degree"),
    ("52 kt*ppm", units.SPEED, "ppm"),
    ("52 kt*count", units.SPEED, "count"),
    ("750 kg*percent", units.MASS, "percent"),
    ("750 kg/turn", units.MASS, "turn"),
    ("100 L*steradian", units.VOLUME, "steradian"),
])
def test_pure_number_factors_are_refused(text, kind, factor):
    with pytest.raises(units.QuantityError) as err:
        units.parse(text, kind)
    assert factor in str(err.value) and "pure number" in str(err.value)


@pytest.mark.parametrize("text, kind", [
    ("52 rpm*m", units.SPEED),  # rpm is 2 pi radian per minute: a speed by dimension, off by 2 pi
    ("52 bps*m", units.SPEED),  # a baud is a bit per second
])
def test_units_hiding_a_pure_number_are_refused(text, kind):
    with pytest.raises(units.QuantityError, match="pure number"):
        units.parse(text, kind)


@pytest.mark.parametrize("text, kind", [
    ("52 kt*g/kg", units.SPEED),  # g/kg is 1/1000
    ("52 kt*h/s", units.SPEED),  # h/s is 3600
    ("750 kg*ft/m", units.MASS),
    ("100 L*lb/kg", units.VOLUME),
])
def test_units_that_cancel_are_refused(text, kind):
    with pytest.raises(units.QuantityError, match="cancel"):
        units.parse(text, kind)


@pytest.mark.parametrize("text", ["15 degC*m", "15 m*degC", "15 degF/s", "15 degC**2"])
def test_temperature_scales_only_stand_alone(text):
    for kind in KINDS:
        with pytest.raises(units.QuantityError):
            units.parse(text, kind)


@pytest.mark.parametrize("text, kind, si", [
    # exact definitions (pint's definitions file, after NIST SP 811): 1 kt = 1852 m / 3600 s, 1 lb = 0.45359237 kg
    ("52 kt", units.SPEED, 52 * 1852 / 3600),
    ("52 knots", units.SPEED, 52 * 1852 / 3600),
    ("96 km/h", units.SPEED, 96 / 3.6),
    ("10 m/s", units.SPEED, 10.0),
    ("500 fpm", units.SPEED, 500 * 0.3048 / 60),
    ("1560 lb", units.MASS, 1560 * 0.45359237),
    ("0.72 kg/L", units.DENSITY, 720.0),
    ("6 lb/gal", units.DENSITY, 6 * 0.45359237 / 3.785411784e-3),  # US gallon = 231 in^3 = 3.785411784 L (NIST)
    ("2 m**3", units.VOLUME, 2.0),
    ("15 degC", units.TEMPERATURE, 288.15),
    ("288.15 K", units.TEMPERATURE, 288.15),
])
def test_plain_units_still_read_as_written(text, kind, si):
    assert units.parse(text, kind) == pytest.approx(si, rel=1e-12)


@pytest.mark.parametrize("text, kind, hint", [
    ("1,560 lb", units.MASS, "write 1560 lb"),
    ("1,560,000 lb", units.MASS, "write 1560000 lb"),
    ("1 560 lb", units.MASS, "write 1560 lb"),
    ("1'560 lb", units.MASS, "write 1560 lb"),
    ("1_560 lb", units.MASS, "write 1560 lb"),
    ("2,535.5 lb", units.MASS, "write 2535.5 lb"),
])
def test_thousands_separators_get_a_message_that_says_so(text, kind, hint):
    with pytest.raises(units.QuantityError) as err:
        units.parse(text, kind)
    assert "thousands separators are not accepted" in str(err.value)
    assert hint in str(err.value)
    assert "is not a unit" not in str(err.value)


def test_a_decimal_comma_gets_a_message_that_says_so():
    with pytest.raises(units.QuantityError) as err:
        units.parse("52,5 kt", units.SPEED)
    assert "decimal separator is a point" in str(err.value) and "write 52.5 kt" in str(err.value)


def _parse_or_refuse(text: str, kind: units.Kind):
    """The float, or None for a QuantityError; anything else raised fails the test."""
    try:
        value = units.parse(text, kind)
    except units.QuantityError as exc:
        assert str(exc) and kind.name in exc.expected
        return None
    assert isinstance(value, float) and math.isfinite(value)
    return value


TEMPLATES = ("48 {}", "48 kt*{}", "48 {}*kt", "48 kt/{}", "48 {}**2", "48 {}/s", "48 m*{}")


@pytest.mark.parametrize("template", TEMPLATES)
def test_every_unit_of_the_registry_parses_or_is_refused(template):
    # Exhaustive over pint's own unit names: none may raise anything but QuantityError.
    accepted = set()
    for name in REGISTRY_NAMES:
        for kind in KINDS:
            text = template.format(name)
            value = _parse_or_refuse(text, kind)
            if value is not None:
                _accepted_is_plain(text, kind, value)
                accepted.add(name)
    refused_everywhere = {"neper", "decibel", "turn", "percent", "radian", "degree", "ppm", "count"}
    assert not accepted & refused_everywhere
    if template == "48 {}":
        assert {"knot", "pound", "foot", "liter", "degree_Celsius"} <= accepted


def _accepted_is_plain(text: str, kind: units.Kind, value: float) -> None:
    """An accepted quantity is the written number times a unit with no pure-number part, of the right kind."""
    number, unit_text = units.split(text)
    quantity = ureg.Quantity(number, ureg.parse_units(unit_text))
    assert quantity.dimensionality == ureg.get_dimensionality(kind.dimensionality)
    root_units = quantity.to_root_units().units._units
    assert all(ureg.get_dimensionality(root) for root in root_units), text
    if kind is not units.TEMPERATURE:
        assert value == pytest.approx(quantity.to(kind.si_unit).magnitude, rel=1e-9)


@settings(max_examples=600, derandomize=True, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(
    names=st.lists(st.sampled_from(REGISTRY_NAMES + ["kt", "lb", "kg", "ft", "m", "s", "h", "L"]),
                   min_size=1, max_size=3),
    ops=st.lists(st.sampled_from(["*", "/", " "]), min_size=2, max_size=2),
    power=st.sampled_from(["", "**2", "**-1", "^3"]),
    kind=st.sampled_from(KINDS),
)
def test_random_unit_expressions_never_raise_anything_but_quantity_error(names, ops, power, kind):
    expression = names[0] + power
    for op, name in zip(ops, names[1:]):
        expression += op + name
    text = f"48 {expression}"
    value = _parse_or_refuse(text, kind)
    if value is not None:
        _accepted_is_plain(text, kind, value)
