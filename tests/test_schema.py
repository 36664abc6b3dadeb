"""Profile validation: every bad value is named by its field, with what would be accepted."""

import math

import pytest

from kneeboard.profile_io import profile_from_text

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
    return profile_from_text(text)


def only_error_paths(text):
    loaded = load(text)
    assert loaded.profile is None
    return [p.path for p in loaded.errors]


def test_minimal_profile_and_defaults():
    loaded = load(MINIMAL)
    assert loaded.errors == []
    p = loaded.profile
    assert p.aircraft.category == "normal"
    assert p.aircraft.limit_load_factor == 3.8  # 14 CFR 23.337 before amendment 23-64
    assert p.aircraft.reference_weight == p.aircraft.max_weight == 750.0
    assert p.weight == 750.0
    assert p.configurations[0].pattern_factor == 1.4
    assert p.card.bank_angles_deg == (0, 15, 30, 45, 60)
    assert (p.card.speed_unit, p.card.distance_unit, p.card.weight_unit) == ("kt", "ft", "kg")


@pytest.mark.parametrize("category, n", [("utility", 4.4), ("acrobatic", 6.0), ("glider", 5.3)])
def test_category_sets_limit_load(category, n):
    text = MINIMAL.replace('max_weight = "750 kg"', f'max_weight = "750 kg"\ncategory = "{category}"')
    assert load(text).profile.aircraft.limit_load_factor == n


def test_negative_weight():
    paths = only_error_paths(MINIMAL.replace('"750 kg"', '"-750 kg"'))
    assert paths == ["aircraft.max_weight"]


def test_bank_of_90():
    loaded = load(MINIMAL + "[card]\nbank_angles = [0, 30, 90]\n")
    assert [p.path for p in loaded.errors] == ["card.bank_angles[3]"]
    assert "0 <= b < 90" in loaded.errors[0].expected


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
    loaded = profile_from_text(MINIMAL.replace('"50 kt"', '"50 kg"'))
    line = str(loaded.errors[0])
    assert "configuration[1].stall_speed" in line and "'50 kg'" in line and "expected a speed" in line


def test_speeds_stay_finite():
    p = load(MINIMAL).profile
    assert math.isfinite(p.configurations[0].stall_speed)
