"""What the editor shows beside and inside its fields, worked out without a widget. Conversion factors are exact by
definition (the international knot 1852 m/h, the avoirdupois pound 0.45359237 kg, the international foot 0.3048 m);
the category limit load factors are 14 CFR 23.337 (before amendment 23-64) and CS-22. Aircraft are invented."""

import pytest
from conftest import MINIMAL, checked

from kneeboard import units
from kneeboard.app import hints


@pytest.mark.parametrize("text, kind, unit, shown", [
    ("90 km/h", units.SPEED, "kt", "= 48.6 kt"),  # 90 / 1.852 = 48.60, computed
    ("700 kg", units.MASS, "lb", "= 1543 lb"),  # 700 / 0.45359237 = 1543.2, computed
    ("1000 m", units.LENGTH, "ft", "= 3281 ft"),  # 1000 / 0.3048 = 3280.8, computed
    ("59 degF", units.TEMPERATURE, "degC", "= 15.0 °C"),  # (59 - 32) * 5 / 9, computed
    ("52 kt", units.SPEED, "kt", ""),  # already in the card's unit
    ("52 kg", units.SPEED, "kt", ""),  # not a speed: the field's problem says so, nothing beside it
    ("", units.SPEED, "kt", ""),
    ("52 km/h", units.SPEED, None, ""),
])
def test_a_value_in_another_unit_is_shown_in_the_cards(text, kind, unit, shown):
    assert hints.converted(text, kind, unit) == shown


def test_a_sink_rate_is_shown_in_the_cards_sink_unit_not_its_speed_unit():
    metric = ("km/h", "m", "kg")
    assert hints.target_unit(units.SPEED, True, metric) == "m/s"
    assert hints.target_unit(units.SPEED, False, metric) == "km/h"
    # 780 ft/min = 780 * 0.3048 / 60 = 3.96 m/s, computed
    assert hints.converted("780 fpm", units.SPEED, hints.target_unit(units.SPEED, True, metric)) == "= 4.0 m/s"
    assert hints.target_unit(units.MASS, False, metric) == "kg"
    assert hints.target_unit(units.VOLUME, False, metric) is None


def test_the_cards_units_come_from_the_profile_or_from_what_its_file_names():
    good = checked(MINIMAL + '\n[card]\nspeed_unit = "km/h"\ndistance_unit = "ft"\nweight_unit = "lb"\n')
    assert hints.card_units(good, None) == ("km/h", "ft", "lb")
    broken = checked(MINIMAL.replace('"50 kt"', '"fast"') + '\n[card]\nspeed_unit = "mph"\ndistance_unit = "fathom"\n')
    assert broken.profile is None
    assert hints.card_units(broken, {"speed_unit": "mph", "distance_unit": "fathom"}) == ("mph", "ft", "kg")
    assert hints.card_units(broken, "not a table") == ("kt", "ft", "kg")  # the declared defaults
    # the reader's rule, not a second one: a card in km/h measures distance in metres unless it says otherwise
    assert hints.card_units(broken, {"speed_unit": "km/h"}) == ("km/h", "m", "kg")


@pytest.mark.parametrize("category, shown", [
    ("utility", "4.4 for the utility category at this maximum weight"),  # 14 CFR 23.337
    ("glider", "5.3 for the glider category at this maximum weight"),  # CS 22.337
])
def test_the_limit_load_factor_a_card_uses_by_default(category, shown):
    prepared = checked(MINIMAL.replace('max_weight = "750 kg"', f'max_weight = "750 kg"\ncategory = "{category}"'))
    assert hints.limit_load_hint(prepared, category) == shown
    broken = checked(MINIMAL.replace('"50 kt"', '"fast"'))
    assert hints.limit_load_hint(broken, category) == shown.removesuffix(" at this maximum weight")
    assert hints.limit_load_hint(broken, "airship") is None


def test_a_new_way_of_giving_a_value_starts_from_what_the_card_prints():
    prepared = checked(MINIMAL.replace('stall_speed = "50 kt"', 'stall_speed = "50 kt"\npattern_factor = 1.4'))
    assert hints.pattern_speed_text(prepared, 0, "kt") == f"{prepared.table.configurations[0].pattern_speed.text} kt"
    assert hints.pattern_speed_text(prepared, 0, "kt") == "70 kt"  # 1.4 x 50 kt, computed
    assert hints.weight_text(prepared, "lb") == "1653 lb"  # 750 / 0.45359237 = 1653.5, computed (rounded down)
    broken = checked(MINIMAL.replace('"50 kt"', '"fast"'))
    assert hints.pattern_speed_text(broken, 0, "km/h") == "70 km/h" and hints.weight_text(broken, "kg") is None


@pytest.mark.parametrize("text, volume", [("60 L", True), ("26 gal", True), ("80 kg", False), ("plenty", False)])
def test_an_items_amount_is_a_volume_or_a_mass(text, volume):
    assert hints.is_volume(text) is volume
