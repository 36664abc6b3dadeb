"""Airspeed calibration, limits and the glider polar."""

import math

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from kneeboard.aero import airspeed, glider, limits

IAS = (40.0, 60.0, 90.0)
CAS = (44.0, 61.0, 90.0)


def test_calibration_interpolates_inside_the_table():
    cas, ext = airspeed.ias_to_cas([40.0, 50.0, 75.0], IAS, CAS)
    assert cas == pytest.approx([44.0, 52.5, 75.5])
    assert not ext.any()


def test_calibration_holds_end_offset_outside_and_flags_it():
    cas, ext = airspeed.ias_to_cas([30.0, 100.0], IAS, CAS)
    assert cas == pytest.approx([34.0, 100.0])
    assert ext.tolist() == [True, True]


@given(st.floats(1, 200))
def test_calibration_round_trip(v):
    cas, _ = airspeed.ias_to_cas(v, IAS, CAS)
    ias, _ = airspeed.cas_to_ias(cas, IAS, CAS)
    assert ias == pytest.approx(v, rel=1e-9, abs=1e-9)


def test_category_limit_loads():
    # 14 CFR 23.337 before amendment 23-64: normal 3.8, utility 4.4, acrobatic 6.0; EASA CS 22.337 utility 5.3.
    assert limits.CATEGORY_LIMIT_LOAD == {"normal": 3.8, "utility": 4.4, "acrobatic": 6.0, "glider": 5.3}


def test_normal_category_formula():
    # 14 CFR 23.337(a)(1): n = 2.1 + 24000 / (W + 10000), need not exceed 3.8.
    assert limits.normal_category_limit_load(2000) == pytest.approx(3.8)
    assert limits.normal_category_limit_load(12_500) == pytest.approx(2.1 + 24000 / 22500)


def test_default_limit_load_follows_the_regulation_for_heavy_normal_aeroplanes():
    # 14 CFR 23.337(a)(1) before amendment 23-64: 2.1 + 24000 / (W + 10000), at most 3.8, W in lb.
    assert limits.default_limit_load("normal", 1500.0) == pytest.approx(3.8)  # 3307 lb
    assert limits.default_limit_load("normal", 6000 * 0.45359237) == pytest.approx(3.6)
    assert limits.default_limit_load("utility", 6000 * 0.45359237) == pytest.approx(4.4)


def test_maneuvering_speed_falls_with_weight_as_in_the_handbook_example():
    # FAA-H-8083-25 (PHAK), chapter "Aerodynamics of Flight" (chapter 5 of the B edition; the example from memory):
    # "100 kt heavy, 90 kt light"; a 19 % lighter aeroplane (0.9^2 = 0.81 of the weight) has a 10 % lower VA.
    assert limits.maneuvering_speed_at_weight(100.0, 810.0, 1000.0) == pytest.approx(90.0)


@given(va=st.floats(20, 150), weight=st.floats(100, 6000), va_weight=st.floats(100, 6000))
def test_maneuvering_speed_is_never_above_the_published_one(va, weight, va_weight):
    # 14 CFR 23.1507; CS 22.1507: the operating VA may not exceed the design VA.
    assert limits.maneuvering_speed_at_weight(va, weight, va_weight) <= va * (1 + 1e-12)


@given(n=st.floats(1.5, 9), weight=st.floats(100, 6000), max_weight=st.floats(100, 6000))
def test_overweight_limit_never_above_the_design_limit(n, weight, max_weight):
    # computed from the design limit load at the maximum weight: n W_max / W above it, n at or below
    got = float(limits.overweight_limit_load(n, weight, max_weight))
    assert got <= n * (1 + 1e-12)
    assert got * weight == pytest.approx(n * max_weight) if weight > max_weight else got == n


def test_flaps_extended_limits_follow_the_regulations():
    # 14 CFR 23.345(a)(1) before amendment 23-64: +2.0 with flaps fully extended; CS 22.345(b)(1)(i): +4.0 with
    # wing-flaps in a landing setting; CS 22.345(a)(1): load factors up to 3.5 with the air brakes extended.
    assert limits.flaps_limit_load("normal", 3.8) == 2.0
    assert limits.flaps_limit_load("utility", 4.4) == 2.0
    assert limits.flaps_limit_load("glider", 5.3) == 4.0
    assert limits.AIR_BRAKES_LIMIT_LOAD == 3.5
    assert limits.flaps_limit_load("glider", 3.0) == 3.0  # never above the aircraft's own


def test_available_load_factor_at_1_4_vs():
    # FAA-H-8083-25, "Load Factors and Stalling Speeds": the load factor at which the wing stalls is (V / Vs)^2;
    # 1.96 g at 1.4 Vs (computed); a 50 kt stall at 100 kt stalls at 4 g (the handbook's own example).
    assert limits.available_load_factor(1.4 * 50, 50) == pytest.approx(1.96)
    assert limits.available_load_factor(100, 50) == pytest.approx(4.0)


@given(weight_lb=st.floats(900, 1650))
def test_the_cards_va_keeps_the_regulations_relation_to_the_stall_speed_at_every_weight(weight_lb):
    # 14 CFR 23.335(c) before amendment 23-64 (relation confirmed, wording from memory): VA >= VS sqrt(n), n the
    # limit load factor. An invented utility aeroplane whose published VA is exactly that minimum at its maximum
    # weight (48 kt x sqrt(4.4) = 100.69 kt): the card's VA, computed by the program at a lighter weight, must keep
    # the relation against the card's own stall speed at that weight (both scale with sqrt(W), FAA-H-8083-25).
    from kneeboard.compute import compute
    from kneeboard.profile import Aircraft, CardSettings, Configuration, Profile

    kt, lb = 1852 / 3600, 0.45359237
    va = 48 * math.sqrt(4.4)
    aircraft = Aircraft("TEST-VA", "VA check (invented)", "utility", 1650 * lb, 1650 * lb, None, va * kt)
    profile = Profile(aircraft, (Configuration("Flaps up", 48 * kt),), CardSettings())
    r = compute(profile, weight=weight_lb * lb)
    vs = r.configurations[0].level_stall_speed
    assert r.maneuvering_speed >= vs * math.sqrt(r.limit_load_factor) * (1 - 1e-9)
    assert r.maneuvering_speed <= va * kt * (1 + 1e-12)  # and never above the published VA (14 CFR 23.1507)


def test_polar_fit_through_three_points_is_exact():
    a, b, c = glider.fit_polar([20.0, 30.0, 40.0], [0.8, 0.7, 1.0])
    for v, s in [(20.0, 0.8), (30.0, 0.7), (40.0, 1.0)]:
        assert a * v * v + b * v + c == pytest.approx(s)
    v_ms, s_ms = glider.polar_minimum((a, b, c))
    assert 20 < v_ms < 40
    assert s_ms <= 0.7


def test_polar_without_minimum():
    assert math.isnan(glider.polar_minimum(glider.fit_polar([20, 30, 40], [1.0, 0.8, 0.6]))[0])
    assert math.isnan(glider.polar_minimum((0.001, 0.1, 0.5))[0])  # vertex at negative speed


def test_ballast_scales_speed_and_sink():
    k = glider.ballast_factor(500.0, 400.0)
    assert k == pytest.approx(math.sqrt(1.25))


@pytest.mark.parametrize("bank_deg, sink", [(30, 1.0), (45, 1.3), (60, 2.2)])
def test_sink_in_turn_soaring_handbook(bank_deg, sink):
    # Welch, Welch & Irving, The Complete Soaring Pilot's Handbook (table, seen in a reproduction):
    # 0.8 m/s straight becomes about 1.0 / 1.3 / 2.2 m/s at 30 / 45 / 60 degrees. The table's "about"
    # figures are rounded (0.8 x 2^1.5 = 2.26), hence 5 %.
    _, s = glider.circling(25.0, 0.8, math.radians(bank_deg))
    assert s == pytest.approx(sink, rel=0.05)


def test_circling_speed_rises_with_sqrt_n():
    v, _ = glider.circling(25.0, 0.8, np.radians([0, 60]))
    assert v == pytest.approx([25.0, 25.0 * math.sqrt(2)])
