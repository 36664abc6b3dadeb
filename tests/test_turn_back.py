"""The turn back after an engine failure: the gliding turn's height loss against its derivation, flown step by
step; least at 45 degrees; scaling with weight and density; the card's block and the machine interface."""

import json
import math

import numpy as np
import pytest
from card_helpers import card_of, prepared
from conftest import MINIMAL, SAMPLES, checked
from hypothesis import given
from hypothesis import strategies as st

from kneeboard.aero import glide
from kneeboard.aero.atmosphere import G0
from kneeboard.cli import main

KT = 1852.0 / 3600.0


def flown_height_loss(v_bg, ratio, bank, heading_change, dt=0.01):
    """An independent route: fly the steady gliding turn in small time steps, from the forces.

    At one angle of attack lift is n W (n = 1 / cos bank) and drag is lift / ratio; the speed is v_bg sqrt(n). The
    heading turns at the rate the horizontal lift component gives, L sin(bank) / (m V); the height falls at the
    rate that pays for the drag's power, D V / W. Both integrated with the trapezoid rule until the heading change is
    done (the last step cut to size).
    """
    n = 1 / math.cos(bank)
    v = v_bg * math.sqrt(n)
    lift_per_mass = n * G0
    turn_rate = lift_per_mass * math.sin(bank) / v
    sink = (lift_per_mass / ratio) * v / G0
    heading = height = 0.0
    while heading < heading_change:
        step = min(dt, (heading_change - heading) / turn_rate)
        heading += turn_rate * step
        height += sink * step
    return height


@pytest.mark.parametrize("v_kt, ratio, bank_deg, heading_deg", [
    (65, 9, 45, 180), (65, 9, 30, 270), (75, 10.5, 60, 180), (52, 28, 20, 210), (90, 7, 50, 360)])
def test_the_formula_agrees_with_the_turn_flown_step_by_step(v_kt, ratio, bank_deg, heading_deg):
    v = v_kt * KT
    expected = flown_height_loss(v, ratio, math.radians(bank_deg), math.radians(heading_deg))
    got = glide.turn_height_loss(v, ratio, math.radians(bank_deg), math.radians(heading_deg))
    assert got == pytest.approx(expected, rel=3e-3)  # the 0.3 %


@given(v=st.floats(15, 80), ratio=st.floats(3, 60), bank_deg=st.floats(1, 85), heading_deg=st.floats(10, 360))
def test_the_least_height_loss_is_at_45_degrees(v, ratio, bank_deg, heading_deg):
    heading = math.radians(heading_deg)
    at_45 = glide.turn_height_loss(v, ratio, math.radians(45), heading)
    assert at_45 <= glide.turn_height_loss(v, ratio, math.radians(bank_deg), heading) * (1 + 1e-12)


def test_the_trades_45_degrees_for_a_low_turn_back():
    # common practice (glider pilots are taught about 45 degrees for a low turn back): the formula's optimum
    banks = np.radians(np.arange(5, 86, 1.0))
    losses = glide.turn_height_loss(30.0, 9.0, banks, math.pi)
    assert math.degrees(banks[int(np.argmin(losses))]) == pytest.approx(45.0)


def test_height_scales_with_weight_and_density():
    base = prepared("demo_trainer", weight="1500 lb").results.turn_back
    heavy = prepared("demo_trainer", weight="1650 lb").results.turn_back
    # V_bg scales with sqrt(W): the loss, with V^2, in proportion to the weight (computed; the compressible TAS
    # departs from CAS's proportion by a few parts in a million at these speeds)
    assert heavy.height_loss / base.height_loss == pytest.approx(np.full(base.height_loss.shape, 1650 / 1500),
                                                                 rel=1e-5)
    text = (SAMPLES / "demo_trainer.toml").read_text().replace('pressure_altitude = "800 ft"',
                                                               'pressure_altitude = "6000 ft"')
    high = checked(text).results
    low = prepared("demo_trainer").results
    # a thinner air flies the same CAS at a higher TAS: the loss grows as TAS^2
    ratio = (high.turn_back.best_glide_tas / low.turn_back.best_glide_tas) ** 2
    assert high.turn_back.height_loss / low.turn_back.height_loss == pytest.approx(
        np.full(low.turn_back.height_loss.shape, ratio), rel=1e-9)


def test_the_trainers_block_agrees_with_an_independent_calculation_and_is_least_at_45():
    # The invented trainer: best glide 65 KIAS (no calibration table: IAS = CAS) at 1,650 lb, glide ratio 9, flown
    # at 1,560 lb at a pressure altitude of 800 ft, standard day; 4 s of reaction.
    t = prepared("demo_trainer").table
    tb = t.turn_back
    assert tb is not None and tb.headings == ("180", "270") and tb.reaction_time.text == "4"
    v_ias = 65 * math.sqrt(1560 / 1650)
    assert tb.best_glide_speed.value == math.ceil(v_ias)
    rho = 1.225 * (1 - 0.0065 * 800 * 0.3048 / 288.15) ** 4.2559  # standard atmosphere (computed)
    tas = v_ias * KT * math.sqrt(1.225 / rho)  # low speed: the incompressible form, within 0.1 %
    for row in tb.rows:
        phi = math.radians(row.bank_deg)
        for heading, printed in zip((180, 270), row.height_loss):
            exact_ft = tas**2 * math.radians(heading) / (G0 * 9 * math.sin(phi) * math.cos(phi)) / 0.3048
            assert exact_ft <= printed.value * (1 + 3e-3)  # rounded up (to 10 ft), within 0.3 %
            assert printed.value - exact_ft <= 10 + exact_ft * 3e-3
    (least,) = [row for row in tb.rows if row.least]
    assert least.bank_text == "45"
    reaction_ft = tas * 4 / 9 / 0.3048
    assert tb.reaction_height_loss.value == math.ceil(reaction_ft * (1 - 2e-3) / 10) * 10


def test_the_margin_is_over_the_clean_stall_speed_in_the_same_bank():
    t = prepared("demo_trainer").table
    clean = {row.bank_text: row.stall_speed.value for row in t.configurations[0].rows}
    for row in t.turn_back.rows:
        assert row.margin.value == row.speed.value - clean[row.bank_text]  # printed figures that add up


def test_two_samples_show_the_block_on_their_cards():
    for name in ("demo_trainer", "demo_tourer"):
        c = card_of(name)
        assert any("turn-back" in page.blocks for page in c.pages), name
    # the tourer gives a sink rate instead of a ratio: its 75 KIAS is 75.5 KCAS on its calibration table (62 + 13.5
    # between 60 and 80 KIAS), over 780 fpm (computed)
    cas_kt = 62 + (75 - 60) / 20 * 18
    assert prepared("demo_tourer").results.turn_back.glide_ratio == pytest.approx(
        cas_kt * 1852 / 0.3048 / 60 / 780, rel=1e-9)


def test_the_json_carries_the_turn_back_and_the_available_load_factor(capsys):
    assert main(["table", str(SAMPLES / "demo_trainer.toml"), "--format", "json"]) == 0
    data = json.loads(capsys.readouterr().out)
    tb = data["turn_back"]
    assert set(tb) == {"configuration", "limit_bank_deg", "best_glide_speed", "glide_ratio", "headings_deg",
                       "reaction_time_s", "reaction_height_loss", "rows"}
    assert tb["configuration"] == "Flaps up"
    assert tb["headings_deg"] == [180.0, 270.0] and tb["reaction_time_s"] == 4.0
    assert [r["bank_deg"] for r in tb["rows"]] == [10, 20, 30, 40, 45, 50, 60]  # every card bank above 0
    assert all(set(r) == {"bank_deg", "speed", "margin", "height_loss", "past_limit"} and len(r["height_loss"]) == 2
               for r in tb["rows"])
    for c in data["configurations"]:
        # (Vp / Vs)^2 on the margins' IAS basis; 1.96 g at 1.4 Vs (FAA-H-8083-25, computed)
        assert c["available_load_factor"] == pytest.approx((c["pattern_speed"] / c["stall_speed"]) ** 2)
    assert main(["table", str(SAMPLES / "demo_microlight.toml"), "--format", "json"]) == 0
    assert json.loads(capsys.readouterr().out)["turn_back"] is None


def test_glide_data_needs_both_figures_and_one_kind_of_ratio():
    half = checked(MINIMAL.replace('max_weight = "750 kg"', 'max_weight = "750 kg"\nbest_glide_speed = "60 kt"'))
    assert half.results.turn_back is None and any("both" in w.message for w in half.warnings)
    both = checked(MINIMAL.replace('max_weight = "750 kg"', 'max_weight = "750 kg"\nbest_glide_speed = "60 kt"\n'
                                   'glide_ratio = 9\nbest_glide_sink = "700 fpm"'))
    assert [e.path for e in both.errors] == ["aircraft"]


@pytest.mark.parametrize("category", ["normal", "utility", "acrobatic", "glider"])
def test_each_template_shows_the_turn_back_fields_and_they_read_as_written(category):
    """The templates name the turn-back inputs (commented: optional); uncommented, they give a turn-back table."""
    from kneeboard.pipeline import prepare_text
    from kneeboard.shipped import template_path

    text = template_path(category).read_text(encoding="utf-8")
    keys = ("best_glide_speed", "glide_ratio", "turn_back_degrees", "reaction_time")
    assert all(f"# {key} = " in text for key in keys)
    for key in keys:
        text = text.replace(f"# {key} = ", f"{key} = ")
    from kneeboard.inputs.styles import load_style

    style, _ = load_style()
    prepared = prepare_text(text, style)
    assert prepared.table is not None, prepared.errors
    assert prepared.table.turn_back is not None
    # an example left as written is a placeholder like the template's other figures; the defaults are not
    flagged = {p.path for p in prepared.warnings if "placeholder" in p.message}
    assert {"aircraft.best_glide_speed", "aircraft.glide_ratio"} <= flagged
    assert not flagged & {"card.turn_back_degrees", "card.reaction_time"}
