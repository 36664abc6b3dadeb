"""Profile validation: every bad value is named by its field, with what would be accepted."""

import math

import pytest
from conftest import checked

from kneeboard.tables import build

MINIMAL = """\
schema = 1

[aircraft]
registration = "TEST-1"
model = "Test aircraft (invented)"
max_weight = "750 kg"

[[configuration]]
name = "Flaps up"
stall_speed = "50 kt"
"""


def load(text):
    """Everything `kneeboard check` finds: the file's values, then the checks that need the physics."""
    return checked(text)


def only_error_paths(text):
    loaded = load(text)
    assert loaded.profile is None
    return [p.path for p in loaded.errors]


def test_minimal_profile_and_defaults():
    loaded = load(MINIMAL)
    assert loaded.errors == []
    p = loaded.profile
    assert p.aircraft.category == "normal"
    assert loaded.results.limit_load_factor == 3.8  # 14 CFR 23.337 before amendment 23-64
    assert p.aircraft.reference_weight == p.aircraft.max_weight == 750.0
    assert p.weight == 750.0
    assert p.configurations[0].pattern_factor == 1.4
    assert p.card.bank_angles_deg == (0, 15, 30, 45, 60)
    assert (p.card.speed_unit, p.card.distance_unit, p.card.weight_unit) == ("kt", "ft", "kg")


@pytest.mark.parametrize("category, n", [("utility", 4.4), ("acrobatic", 6.0), ("glider", 5.3)])
def test_category_sets_limit_load(category, n):
    text = MINIMAL.replace('max_weight = "750 kg"', f'max_weight = "750 kg"\ncategory = "{category}"')
    assert load(text).results.limit_load_factor == n


def test_negative_weight():
    paths = only_error_paths(MINIMAL.replace('"750 kg"', '"-750 kg"'))
    assert paths == ["aircraft.max_weight"]


def test_bank_of_90():
    loaded = load(MINIMAL + "[card]\nbank_angles = [0, 30, 90]\n")
    assert [p.path for p in loaded.errors] == ["card.bank_angles[3]"]
    assert "from 0 to 85" in loaded.errors[0].expected


def test_banks_steeper_than_85_degrees_are_refused():
    # n = 11.5 at 85 degrees: no figure a card needs lies beyond it
    assert [p.path for p in load(MINIMAL + "[card]\nbank_angles = [0, 85.001]\n").errors] == ["card.bank_angles[2]"]
    assert load(MINIMAL + "[card]\nbank_angles = [0, 85]\n").errors == []


def test_speed_in_kg():
    loaded = load(MINIMAL.replace('stall_speed = "50 kt"', 'stall_speed = "50 kg"'))
    (problem,) = loaded.errors
    assert problem.path == "configuration[1].stall_speed"
    assert "mass, not of speed" in problem.message
    assert problem.value == "50 kg"
    assert "speed" in problem.expected


def test_missing_configuration():
    text = MINIMAL.split("[[configuration]]")[0]
    assert only_error_paths(text) == ["configuration"]


def test_missing_required_aircraft_fields():
    text = 'schema = 1\n[aircraft]\n[[configuration]]\nname = "a"\nstall_speed = "50 kt"\n'
    assert sorted(only_error_paths(text)) == ["aircraft.max_weight", "aircraft.model", "aircraft.registration"]


def test_every_problem_reported_in_one_run():
    text = MINIMAL.replace('"750 kg"', '"750 kt"').replace('"50 kt"', '"-3 kt"') + (
        '[card]\nspeed_unit = "furlong"\npressure_altitude = "40000 ft"\n'
    )
    assert sorted(only_error_paths(text)) == sorted([
        "aircraft.max_weight", "configuration[1].stall_speed", "card.speed_unit", "card.pressure_altitude",
    ])


def test_pattern_factor_and_speed_never_both():
    text = MINIMAL + 'pattern_factor = 1.4\npattern_speed = "70 kt"\n'
    assert only_error_paths(text) == ["configuration[1]"]


def test_fixed_pattern_speed_must_exceed_stall_speed():
    assert only_error_paths(MINIMAL + 'pattern_speed = "50 kt"\n') == ["configuration[1].pattern_speed"]
    assert only_error_paths(MINIMAL + "pattern_factor = 1.0\n") == ["configuration[1].pattern_factor"]


def test_low_pattern_factor_is_a_warning():
    loaded = load(MINIMAL + "pattern_factor = 1.2\n")
    assert loaded.profile is not None
    assert [p.path for p in loaded.warnings] == ["configuration[1].pattern_factor"]


def test_duplicate_configuration_names():
    text = MINIMAL + '\n[[configuration]]\nname = "flaps UP"\nstall_speed = "45 kt"\n'
    assert only_error_paths(text) == ["configuration[2].name"]


def test_weight_above_maximum_is_a_warning():
    loaded = load(MINIMAL + '[weight]\ntotal = "800 kg"\n')
    assert loaded.profile is not None and loaded.profile.weight == 800.0
    assert any(p.path == "weight" and "above the maximum" in p.message for p in loaded.warnings)


def test_weight_build_up_with_fuel_by_volume():
    text = MINIMAL + (
        '[weight]\nempty = "480 kg"\n'
        '[[weight.item]]\nname = "Pilot"\nmass = "180 lb"\n'
        '[[weight.item]]\nname = "Fuel"\nvolume = "100 L"\n'  # default density 0.72 kg/L (avgas)
        '[[weight.item]]\nname = "Water"\nvolume = "20 L"\ndensity = "1 kg/L"\n'
    )
    p = load(text).profile
    assert p.weight == pytest.approx(480 + 180 * 0.45359237 + 72 + 20)


def test_weight_total_and_build_up_never_both():
    assert only_error_paths(MINIMAL + '[weight]\ntotal = "700 kg"\nempty = "480 kg"\n') == ["weight"]


def test_calibration_out_of_order():
    text = MINIMAL + 'calibration = [["60 kt", "61 kt"], ["40 kt", "44 kt"]]\n'
    assert only_error_paths(text) == ["configuration[1].calibration"]


def test_calibration_not_covering_banks_is_a_warning():
    text = MINIMAL + 'calibration = [["50 kt", "52 kt"], ["60 kt", "61 kt"]]\n'
    loaded = load(text)
    assert loaded.profile is not None
    assert [p.path for p in loaded.warnings] == ["configuration[1].calibration"]


def test_polar_needs_three_points_and_a_minimum():
    few = MINIMAL + '[glider]\npolar_weight = "400 kg"\npolar = [["80 km/h", "0.7 m/s"], ["100 km/h", "0.8 m/s"]]\n'
    assert only_error_paths(few) == ["glider.polar"]
    falling = MINIMAL + ('[glider]\npolar_weight = "400 kg"\n'
                         'polar = [["80 km/h", "0.9 m/s"], ["100 km/h", "0.8 m/s"], ["120 km/h", "0.7 m/s"]]\n')
    assert only_error_paths(falling) == ["glider.polar"]


def test_troposphere_and_absolute_zero():
    assert only_error_paths(MINIMAL + '[card]\npressure_altitude = "36100 ft"\n') == ["card.pressure_altitude"]
    assert only_error_paths(MINIMAL + '[card]\ntemperature = "-300 degC"\n') == ["card.temperature"]
    ok = load(MINIMAL + '[card]\npressure_altitude = "36000 ft"\ntemperature = "-56 degC"\n')
    assert ok.errors == []


def test_absurd_magnitudes():
    assert only_error_paths(MINIMAL.replace('"50 kt"', '"1e300 kt"')) == ["configuration[1].stall_speed"]


def test_unknown_key_is_a_warning():
    loaded = load(MINIMAL + 'colour = "red"\n')
    assert loaded.profile is not None
    assert [(p.path, p.severity) for p in loaded.problems] == [("configuration[1].colour", "warning")]


def test_newer_format_refused():
    loaded = load(MINIMAL.replace("schema = 1", "schema = 7"))
    assert loaded.profile is None
    assert "newer kneeboard" in loaded.errors[0].message


def test_nan_and_inf_numbers():
    assert only_error_paths(MINIMAL + "pattern_factor = nan\n") == ["configuration[1].pattern_factor"]
    assert only_error_paths(MINIMAL.replace('registration = "TEST-1"', 'registration = "TEST-1"\n'
                                            'limit_load_factor = inf')) == ["aircraft.limit_load_factor"]


def test_invalid_toml_names_the_line():
    loaded = load(MINIMAL + "this is not toml\n")
    assert loaded.profile is None
    assert "line" in loaded.errors[0].message


def test_problem_text_has_file_path_value_and_expectation():
    loaded = load(MINIMAL.replace('"50 kt"', '"50 kg"'))
    line = str(loaded.errors[0])
    assert "configuration[1].stall_speed" in line and "'50 kg'" in line and "expected a speed" in line


def test_speeds_stay_finite():
    p = load(MINIMAL).profile
    assert math.isfinite(p.configurations[0].stall_speed)


# --- hostile files (issue 5): one test per bug the generated cases of test_hostile.py found ---


def card_of(text):
    loaded = load(text)
    assert loaded.errors == [], [str(p) for p in loaded.errors]
    return build(loaded.profile)


def test_integer_too_large_for_a_float_is_out_of_range():
    # TOML integers have no size limit; math.isfinite(10**400) raised OverflowError out of the loader.
    huge = "1" + "0" * 400
    assert only_error_paths(MINIMAL + f"[card]\nbank_angles = [0, {huge}]\n") == ["card.bank_angles[2]"]
    assert only_error_paths(MINIMAL + f"pattern_factor = -{huge}\n") == ["configuration[1].pattern_factor"]


def test_weights_and_speeds_too_small_for_an_aircraft_are_refused():
    # "1e-300 kg" was a valid maximum weight; with a real card weight the speeds scaled by sqrt(W / Wref)
    # overflowed, and the table builder crashed on an infinite turn radius.
    text = MINIMAL.replace('"750 kg"', '"1e-300 kg"') + '[weight]\ntotal = "690 kg"\n'
    assert only_error_paths(text) == ["aircraft.max_weight"]
    assert only_error_paths(MINIMAL.replace('"50 kt"', '"1e-300 kt"')) == ["configuration[1].stall_speed"]
    assert "above 1 kg" in load(MINIMAL.replace('"750 kg"', '"0.5 kg"')).errors[0].expected


def test_temperature_that_no_outside_air_has_is_an_error():
    # "1e300 K" was only a warning: the density fell to nothing and every turn figure became infinite.
    for written in ("1e300 K", "1e-300 K", "200 degC", "-150 degC"):
        assert only_error_paths(MINIMAL + f'[card]\ntemperature = "{written}"\n') == ["card.temperature"]
    assert [p.severity for p in load(MINIMAL + '[card]\ntemperature = "-80 degC"\n').problems] == ["warning"]


def test_polar_sink_rates_must_be_plausible():
    # A sink of 590 kt was accepted; tiny polars failed the fit as "(profile): cannot be computed", no field named.
    polar = ('[glider]\npolar_weight = "400 kg"\n'
             'polar = [["80 km/h", "{}"], ["100 km/h", "0.6 m/s"], ["150 km/h", "1.4 m/s"]]\n')
    for sink in ("590 kt", "0 m/s", "1e-300 m/s", "-0.5 m/s"):
        assert only_error_paths(MINIMAL + polar.format(sink)) == ["glider.polar[1][2]"]
    assert load(MINIMAL + polar.format("0.7 m/s")).errors == []


def test_text_with_control_characters_is_refused():
    # A line break in a registration printed a line of its own in `kneeboard check`; escapes reached the terminal.
    loaded = load(MINIMAL.replace('"TEST-1"', '"T\\nerror: forged"'))
    assert [p.path for p in loaded.errors] == ["aircraft.registration"]
    assert "U+000A" in loaded.errors[0].message and "\n" not in str(loaded.errors[0])
    assert only_error_paths(MINIMAL + '[card]\nnotes = "\\u001b[2J"\n') == ["card.notes"]
    assert only_error_paths(MINIMAL.replace('"Flaps up"', '"Flaps\\u202eup"')) == ["configuration[1].name"]
    assert load(MINIMAL + '[card]\nnotes = """two\nlines"""\n').errors == []  # notes may break lines


def test_unknown_key_is_quoted_in_its_path():
    # The key was printed raw: '"a\nerror: x" = 1' forged an error line of its own.
    loaded = load(MINIMAL + '"a\\nerror: x" = 1\n')
    (warning,) = loaded.warnings
    assert warning.path == 'configuration[1]."a\\nerror: x"' and "\n" not in str(warning)


def test_unknown_key_of_a_weight_item_names_the_item():
    # It was reported as "weight.item.colour", without saying which item.
    text = MINIMAL + '[weight]\nempty = "500 kg"\n[[weight.item]]\nname = "a"\nmass = "1 kg"\n' \
                     '[[weight.item]]\nname = "b"\nmass = "1 kg"\ncolour = "red"\n'
    assert [p.path for p in load(text).warnings] == ["weight.item[2].colour"]


def test_density_beside_a_mass_is_an_error():
    # The density of an item given by mass was never read, so even "52 kt" there got no answer.
    text = MINIMAL + '[weight]\nempty = "500 kg"\n[[weight.item]]\nname = "a"\nmass = "80 kg"\ndensity = "52 kt"\n'
    assert only_error_paths(text) == ["weight.item[1].density"]


def test_duplicate_names_differing_in_width_or_spacing():
    # "Ｆｌａｐｓ ｕｐ" (full width) and "Flaps  up" print like "Flaps up" but were accepted as other names.
    for twin in ("\uff26\uff4c\uff41\uff50\uff53 \uff55\uff50", "Flaps  up", " flaps UP "):
        text = MINIMAL + f'\n[[configuration]]\nname = "{twin}"\nstall_speed = "45 kt"\n'
        assert only_error_paths(text) == ["configuration[2].name"]


def test_calibration_that_turns_a_speed_negative_names_the_table():
    # Ascending pairs with CAS far below IAS made the calibrated stall speed negative: a NaN bank crashed the
    # table builder, or the error blamed the pattern factor.
    calibration = 'calibration = [["500 kt", "60 kt"], ["600 kt", "70 kt"]]\n'
    assert only_error_paths(MINIMAL + calibration) == ["configuration[1].calibration"]
    assert only_error_paths(MINIMAL + 'pattern_speed = "70 kt"\n' + calibration) == ["configuration[1].calibration"]
    aircraft = MINIMAL.replace('max_weight = "750 kg"', 'max_weight = "750 kg"\n' + calibration)
    assert only_error_paths(aircraft) == ["aircraft.calibration"]


def test_bank_printed_rounded_down_never_up():
    # "%.4g" printed 89.9999 as "90" and 87.625 as "87.63", banks the row was not computed for, and 1e-05 as "1e-05".
    card = card_of(MINIMAL + "[card]\nbank_angles = [0.00001, 12.5, 84.625, 84.9999]\n")
    assert [row.bank_text for row in card.configurations[0].rows] == ["0", "12.5", "84.62", "84.99"]


def test_bank_too_small_to_turn_prints_as_level():
    # A bank of 1e-310 degrees gave an infinite turn radius, which crashed the table builder.
    card = card_of(MINIMAL + "[card]\nbank_angles = [1e-310, 0.004, 30]\n")
    rows = card.configurations[0].rows
    assert [row.bank_text for row in rows] == ["0", "0", "30"]
    assert [row.turn_radius is None for row in rows] == [True, True, False]
    assert all(math.isfinite(p.value) for row in rows for p in (row.stall_speed, row.margin, row.load_factor))
