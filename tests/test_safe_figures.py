"""Figures a pilot may trust: never beyond the flight manual, warnings on the paper, stall speeds at one angle of
attack, margins that add up. Each check names the rule it holds the card to."""

import io
import json
import math

import pytest
from card_helpers import card_from_text, card_of, prepared
from conftest import MINIMAL, SAMPLES, checked
from flightcondition import FlightCondition, unit
from hypothesis import given, settings
from hypothesis import strategies as st
from pypdf import PdfReader

from kneeboard.aero.atmosphere import G0
from kneeboard.card import card_pdf
from kneeboard.cli import main

KT = 1852.0 / 3600.0
LB = 0.45359237
SAMPLE_NAMES = sorted(p.stem for p in SAMPLES.glob("*.toml"))


def texts_of(card) -> list[str]:
    return [page.extract_text() for page in PdfReader(io.BytesIO(card_pdf(card))).pages]


# --- limits never above the flight manual's ---------------------------------------------------------------------


def test_an_overweight_trainer_prints_its_reduced_limits_va_and_warnings_on_every_page(capsys):
    # The invented trainer: maximum 1,650 lb, utility category 4.4 g, VA 97 kt at 1,650 lb; flown at 1,985 lb.
    p = prepared("demo_trainer", weight="1985 lb")
    t = p.table
    # equivalent limit: 4.4 x 1650 / 1985 = 3.657 (computed from the design limit load at the maximum weight)
    assert p.results.limit_load_factor == pytest.approx(4.4 * 1650 / 1985)
    assert t.limit_load_factor.text == "3.6"  # rounded down
    assert t.limit_bank.text == str(math.floor(math.degrees(math.acos(1 / (4.4 * 1650 / 1985)))))
    # VA is not raised above the published 97 kt (14 CFR 23.1507)
    assert t.maneuvering_speed.text == "97"
    # flaps full has a VFE: +2.0 (14 CFR 23.345(a)(1)), then x 1650 / 1985
    flaps = next(c for c in t.configurations if c.flap_limit_speed is not None)
    assert flaps.limit_load_factor.value == pytest.approx(math.floor(2.0 * 1650 / 1985 * 10) / 10)
    assert all(r.over_limit == (r.load_factor.value >= 2.0 * 1650 / 1985) for r in flaps.rows if r.bank_text != "0")
    pages = texts_of(card_of("demo_trainer", weight="1985 lb"))
    assert len(pages) >= 1 and all("WARNING" in page and "maximum weight" in page for page in pages)
    assert main(["table", str(SAMPLES / "demo_trainer.toml"), "--weight", "1985 lb", "--format", "json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["over_max_weight"] is True and data["maneuvering_speed"] == pytest.approx(97.0)
    assert data["limit_load_factor"] == pytest.approx(4.4 * 1650 / 1985)
    assert data["configurations"][1]["limit_load_factor"] == pytest.approx(2.0 * 1650 / 1985)
    assert data["configurations"][1]["limit_bank_deg"] == pytest.approx(math.degrees(math.acos(1985 / 3300)))
    assert any("maximum weight" in w for w in data["warnings"]) and "flight manual" in data["caution"]


def test_va_of_a_glider_heavier_than_its_publication_weight_stays_at_the_published_figure():
    # The invented glider: VA 180 km/h published at 400 kg (its reference weight), flown at 467 kg with water.
    t = prepared("demo_glider").table
    assert t.maneuvering_speed.text == "180"  # CS 22.1507: not the 194 a square-root scaling would give
    light = prepared("demo_glider", weight="350 kg").table
    assert light.maneuvering_speed.value == math.floor(180 * math.sqrt(350 / 400))


@settings(max_examples=60, deadline=None)
@given(weight_lb=st.floats(900, 3000))
def test_limits_and_va_never_above_the_published_ones_at_any_weight(weight_lb):
    p = prepared("demo_trainer", weight=f"{weight_lb} lb")
    r = p.results
    assert r.maneuvering_speed <= 97 * KT * (1 + 1e-9)
    assert r.limit_load_factor <= 4.4 * (1 + 1e-12)
    for c in r.configurations:
        assert c.limit_load_factor <= r.limit_load_factor * (1 + 1e-12)
        # one angle of attack: the indicated stall speed in a bank is sqrt(n) x the wings-level one
        assert c.stall_speed == pytest.approx(c.level_stall_speed * c.load_factor ** 0.5, rel=1e-12)


def test_glider_configurations_get_the_cs22_limits():
    r = prepared("demo_glider").results
    clean, brakes = r.configurations
    assert clean.limit_load_factor == pytest.approx(5.3)  # CS 22.337, utility category
    assert brakes.limit_load_factor == pytest.approx(3.5)  # CS 22.345(a)(1), air brakes extended


def test_a_configurations_own_limit_overrides_the_regulations():
    text = MINIMAL + 'flap_limit_speed = "90 kt"\nlimit_load_factor = 2.5\n'
    assert checked(text).results.configurations[0].limit_load_factor == 2.5
    assert checked(MINIMAL + 'flap_limit_speed = "90 kt"\n').results.configurations[0].limit_load_factor == 2.0


# --- stall speeds at one angle of attack --------------------------------------------------------------------------


CALIBRATED = MINIMAL.replace('stall_speed = "50 kt"', 'stall_speed = "40 kt"\npattern_speed = "53 kt"') + \
    'calibration = [["35 kt", "43 kt"], ["50 kt", "54 kt"]]\n'


def test_the_calibration_table_converts_1g_speeds_only():
    # Stall 40 KIAS -> 48.6 KCAS at 1 g (interpolated); at 60 degrees the indicated stall speed is 40 sqrt(2) = 56.6
    # KIAS, the same angle of attack (computed). Reading the table at the accelerated CAS would give 68.7 KIAS.
    r = checked(CALIBRATED.replace("[card]", "") + "[card]\nbank_angles = [0, 60]\n").results.configurations[0]
    assert r.level_stall_cas / KT == pytest.approx(43 + 5 * 11 / 15)
    assert r.stall_speed[1] / KT == pytest.approx(40 * math.sqrt(2))


def test_the_13_rule_is_checked_in_cas():
    # 53 / 40 = 1.33 in IAS, but 54.2 / 48.7 = 1.11 in CAS: under 1.3 (FAA-H-8083-3), so a warning.
    found = checked(CALIBRATED)
    (warning,) = [p for p in found.warnings if p.path == "configuration[1].pattern_speed"]
    assert "in CAS" in warning.message and "1.3" in warning.message
    assert any("1.3" in line for line in found.table.warnings)


# --- warnings on the paper ------------------------------------------------------------------------------------------


def test_a_pattern_speed_a_hair_above_the_stall_never_prints_silently():
    text = MINIMAL.replace('stall_speed = "50 kt"', 'stall_speed = "50 kt"\npattern_speed = "50.5 kt"')
    pages = texts_of(card_from_text(text))
    assert all("WARNING" in page and "1.3" in page for page in pages)


def test_every_warning_check_gives_is_on_the_card():
    text = MINIMAL + 'flap_limit_speed = "60 kt"\npattern_speed = "66 kt"\n[card]\ntemperature = "-40 degC"\n'
    p = checked(text)
    assert len(p.warnings) == len(p.table.warnings) >= 2
    for page in texts_of(card_from_text(text)):
        assert page.count("WARNING") == len(p.table.warnings)  # every warning on every page


# --- refusals -------------------------------------------------------------------------------------------------------


POLAR = ('[glider]\npolar_weight = "400 kg"\n'
         'polar = [["{}", "{}"], ["{}", "{}"], ["{}", "{}"], ["{}", "1.40 m/s"]]\n')


@pytest.mark.parametrize("text, field", [
    (MINIMAL + "[card]\nbank_angles = [0, 30, 86]\n", "card.bank_angles[3]"),
    # a fitted minimum below the slowest measured point (at 71.6 km/h, below 80: computed with numpy.polyfit)
    (MINIMAL + POLAR.format("80 km/h", "0.62 m/s", "90 km/h", "0.66 m/s", "110 km/h", "0.80 m/s", "150 km/h"),
     "glider.polar"),
    # minimum sink at 55 km/h (29.7 kt, computed): under the 50 kt stall speed of the first configuration
    (MINIMAL + POLAR.format("45 km/h", "0.70 m/s", "55 km/h", "0.62 m/s", "70 km/h", "0.75 m/s", "100 km/h"),
     "glider.polar"),
], ids=["bank above 85", "polar minimum below its points", "minimum sink below the stall speed"])
def test_refusals_exit_2_naming_the_field(tmp_path, capsys, text, field):
    path = tmp_path / "p.toml"
    path.write_text(text)
    assert main(["check", str(path)]) == 2
    assert f"error: {field}:" in capsys.readouterr().out


# --- printed figures that add up ------------------------------------------------------------------------------------


@pytest.mark.parametrize("name", SAMPLE_NAMES)
def test_printed_margins_add_up_on_every_row_of_every_sample(name):
    for c in prepared(name).table.configurations:
        for row in c.rows:
            assert int(c.pattern_speed.text) - int(row.stall_speed.text) == int(row.margin.text), (c.name, row)


def test_text_and_csv_print_no_turn_where_the_card_prints_a_dash(capsys):
    assert main(["table", str(SAMPLES / "demo_trainer.toml"), "--format", "csv"]) == 0
    stalled = [line for line in capsys.readouterr().out.splitlines() if line.endswith("STALL")]
    assert stalled and all(",,,," in line for line in stalled)


# --- a whole card at altitude and in a warm day -------------------------------------------------------------------


def test_turns_at_a_hot_high_field_use_the_true_airspeed_of_the_standard_atmosphere():
    text = MINIMAL + '[card]\nbank_angles = [0, 30]\npressure_altitude = "5000 ft"\ntemperature = "30 degC"\n'
    p = checked(text)
    r = p.results.configurations[0]
    # flightcondition (PyPI) at standard temperature, then the speed of sound's sqrt(T) for the warm day
    h = 5000 * 0.3048
    ref = FlightCondition(h=6_356_766 * h / (6_356_766 - h) * unit("m"), CAS=70 * unit("knots")).TAS
    tas = ref.to("m/s").magnitude * math.sqrt(303.15 / (288.15 - 0.0065 * h))
    assert r.pattern_tas == pytest.approx(tas, rel=1e-6)
    assert r.turn_radius[1] == pytest.approx(tas**2 / (G0 * math.tan(math.radians(30))))
    # a 5,000 ft field at 30 degC is about 8,000 ft density altitude (rule of thumb: common practice)
    assert p.table.density_altitude.value == pytest.approx(8000, abs=400)


# --- the glider's figures, numerically --------------------------------------------------------------------------------


def test_glider_circling_figures_from_the_published_relations():
    # Computed from the published relations (Welch, Welch & Irving): a quadratic polar; ballast x sqrt(W / Wp) on
    # speed and sink; in a turn speed x sqrt(n), sink x n^1.5; circle time 2 pi V / (g tan phi) at the true airspeed.
    import numpy as np

    p = prepared("demo_glider")
    g = p.results.glider
    v = np.array([75, 85, 100, 120, 150, 180]) / 3.6
    s = np.array([0.66, 0.61, 0.66, 0.86, 1.42, 2.25])
    a, b, c = np.polyfit(v, s, 2)
    v_min = -b / (2 * a)
    k = math.sqrt(467.0 / 400.0)  # 275 + 92 + 100 L of water
    assert g.min_sink_cas == pytest.approx(v_min * k)
    density = float(p.results.density)
    for i, bank in enumerate(np.radians([0, 20, 30, 40, 45, 50, 60])):
        n = 1 / math.cos(bank)
        assert g.speed[i] == pytest.approx(v_min * k * math.sqrt(n), rel=1e-9)
        if bank > 0:
            tas = g.speed[i] * math.sqrt(1.225 / density)  # low speed: the incompressible form within 0.1 %
            assert g.circle_time[i] == pytest.approx(2 * math.pi * tas / (G0 * math.tan(bank)), rel=2e-3)
            sink = (a * v_min**2 + b * v_min + c) * k * n**1.5 * math.sqrt(1.225 / density)
            assert g.sink_rate[i] == pytest.approx(sink, rel=2e-3)
            assert g.height_loss_180[i] == pytest.approx(sink * g.circle_time[i] / 2, rel=4e-3)


def test_the_retractable_samples_note_quotes_the_speeds_its_card_prints():
    t = prepared("demo_retractable").table
    printed = [c.pattern_speed.text for c in t.configurations]
    assert f"{printed[0]} downwind, {printed[1]} base, {printed[2]} final (KIAS" in t.notes
