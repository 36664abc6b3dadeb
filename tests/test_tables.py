"""Computation on profiles and the conservative rounding of the table builder."""

import math

import pytest
from conftest import checked_file
from hypothesis import given
from hypothesis import strategies as st

from kneeboard import rounding
from kneeboard.compute import compute
from kneeboard.profile import Aircraft, CardSettings, Configuration, Profile
from kneeboard.tables import BUFFER, OK, STALL, build

KT = 1852 / 3600


def profile(vs_kt=50.0, factor=1.4, weight=None, ref=750.0, banks=(0, 15, 30, 45, 60), buffer_kt=5.0, **config):
    aircraft = Aircraft("TEST-1", "Test (invented)", "normal", 800.0, ref, 3.8, 100 * KT)
    c = Configuration("Flaps up", vs_kt * KT, factor, **config)
    p = Profile(aircraft, (c,), CardSettings(bank_angles_deg=banks, buffer=buffer_kt * KT))
    return p if weight is None else p.with_weight(weight)


def test_weight_scaling_square_root_law():
    # FAA-H-8083-25 (lift equation; from memory): Vs2 = Vs1 sqrt(W2 / W1); VA likewise.
    r = compute(profile(), weight=600.0)
    k = math.sqrt(600 / 750)
    assert r.configurations[0].level_stall_speed == pytest.approx(50 * KT * k)
    assert r.maneuvering_speed == pytest.approx(100 * KT * k)


def test_margin_and_zero_margin_bank():
    r = compute(profile()).configurations[0]
    assert r.pattern_speed == pytest.approx(70 * KT)
    assert r.margin[0] == pytest.approx(20 * KT)
    assert math.degrees(r.zero_margin_bank) == pytest.approx(math.degrees(math.acos(1 / 1.96)))
    assert r.margin[-1] < 0  # 60 degrees with a 1.4 factor: stalled, and shown


def test_buffer_bank():
    r = compute(profile(buffer_kt=5.0)).configurations[0]
    # the bank at which stall speed reaches 70 - 5 = 65 kt: arccos((50/65)^2)
    assert math.degrees(r.buffer_bank) == pytest.approx(math.degrees(math.acos((50 / 65) ** 2)))
    assert compute(profile(buffer_kt=25.0)).configurations[0].buffer_bank is None


def test_fixed_pattern_speed():
    r = compute(profile(factor=None, pattern_speed=65 * KT)).configurations[0]
    assert r.pattern_speed == pytest.approx(65 * KT)


def test_calibration_used_both_ways():
    from kneeboard.profile import Calibration

    cal = Calibration((40 * KT, 60 * KT, 90 * KT), (44 * KT, 61 * KT, 90 * KT))
    r = compute(profile(vs_kt=40, calibration=cal, banks=(0, 60))).configurations[0]
    # 40 IAS -> 44 CAS (the table at 1 g); the pattern factor is applied in CAS: 1.4 x 44 = 61.6 CAS -> IAS
    # 60 + 0.6 * 30 / 29. Every stall is at one angle of attack: the IAS stall speed at 60 degrees is 40 sqrt(2),
    # not the table read at the accelerated stall's CAS (computed).
    vp = 60 + 0.6 * 30 / 29
    assert r.level_stall_speed == pytest.approx(40 * KT) and r.level_stall_cas == pytest.approx(44 * KT)
    assert r.pattern_speed / KT == pytest.approx(vp) and r.pattern_cas / KT == pytest.approx(61.6)
    assert r.stall_speed[1] / KT == pytest.approx(40 * math.sqrt(2))
    assert math.degrees(r.zero_margin_bank) == pytest.approx(math.degrees(math.acos((40 / vp) ** 2)))


def test_row_states_survive_as_data():
    t = build(profile(buffer_kt=5.0))
    states = [row.state for row in t.configurations[0].rows]
    assert states == [OK, OK, OK, OK, STALL]
    t = build(profile(buffer_kt=5.0, banks=(0, 50, 55)))
    assert [row.state for row in t.configurations[0].rows] == [OK, OK, BUFFER]


def test_printed_values_are_rounded_conservatively():
    t = build(profile(vs_kt=47.2, banks=(0, 45)))
    c = t.configurations[0]
    assert c.stall_speed.text == "48"  # 47.2 up
    assert c.rows[1].stall_speed.value == math.ceil(47.2 * 2**0.25)
    pattern = math.ceil(47.2 * 1.4)  # 66.08 up: the speed flown
    assert c.pattern_speed.value == pattern
    # margins and banks from the printed pattern speed: printed pattern - printed stall = printed margin
    assert c.rows[1].margin.value == pattern - math.ceil(47.2 * 2**0.25)
    assert c.zero_margin_bank.value == math.floor(math.degrees(math.acos((47.2 / pattern) ** 2)))


def test_exact_values_are_not_pushed_a_step():
    t = build(profile(vs_kt=50.0, banks=(0, 60)))
    assert t.configurations[0].rows[1].load_factor.text == "2.00"
    assert t.configurations[0].stall_speed.text == "50"


@given(st.floats(-1e4, 1e4, allow_nan=False), st.sampled_from([1.0, 0.1, 0.01, 5.0, 100.0]))
def test_rounding_never_toward_danger(x, step):
    # Up never lands below x, down never above, beyond the 1e-9-of-a-step snap that removes binary noise.
    assert rounding.up(x, step) >= x - 1e-9 * step
    assert rounding.down(x, step) <= x + 1e-9 * step
    assert rounding.up(x, step) - x < step * (1 + 1e-9)


@given(st.floats(30, 120), st.floats(300, 800), st.floats(300, 800), st.floats(1.05, 2.0))
def test_properties_of_the_computation(vs, w1, w2, factor):
    lo, hi = sorted((w1, w2))
    p = profile(vs_kt=vs, factor=factor, ref=500.0, banks=(0, 10, 20, 30, 40, 50, 60, 70, 80))
    light = compute(p, weight=lo).configurations[0]
    heavy = compute(p, weight=hi).configurations[0]
    assert all(a <= b + 1e-12 for a, b in zip(light.stall_speed, heavy.stall_speed))  # rises with weight
    assert all(a < b for a, b in zip(light.stall_speed, light.stall_speed[1:]))  # rises with bank
    assert all(a > b for a, b in zip(light.margin, light.margin[1:]))  # margin falls with bank
    # one angle of attack: the indicated stall speed in a bank is sqrt(n) x the wings-level one
    assert light.stall_speed == pytest.approx(light.level_stall_speed * light.load_factor ** 0.5, rel=1e-12)
    printed = build(p, weight=lo).configurations[0]
    assert printed.pattern_speed.value >= light.pattern_speed / KT - 1e-9
    for row, exact_vs in zip(printed.rows, light.stall_speed):
        assert row.stall_speed.value >= exact_vs / KT - 1e-9  # stall speeds up
        # margins add up, and never exceed what flying the printed pattern speed leaves
        assert row.margin.value == printed.pattern_speed.value - row.stall_speed.value
        assert row.margin.value <= printed.pattern_speed.value - exact_vs / KT + 1e-9


def test_samples_compute(sample_paths):
    assert len(sample_paths) >= 5
    for path in sample_paths:
        loaded = checked_file(path)
        assert loaded.errors == [], path
        t = build(loaded.profile)
        assert t.configurations and all(c.rows for c in t.configurations)


def test_glider_sample_circling():
    loaded = checked_file(next(p for p in __import__("conftest").SAMPLES.glob("*glider*.toml")))
    t = build(loaded.profile)
    g = t.glider
    speeds = [row.speed.value for row in g.rows]
    sinks = [row.sink_rate.value for row in g.rows]
    assert speeds == sorted(speeds) and sinks == sorted(sinks)
    assert g.rows[0].turn_radius is None  # no radius wings level
    # with ballast, the card weight is above the polar weight, so min-sink speed rises over the polar's
    r = t.results
    assert r.weight > loaded.profile.glider.weight
