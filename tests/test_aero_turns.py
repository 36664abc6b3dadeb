"""Level-turn mechanics against the FAA handbooks (sources named at each check)."""

import math

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from kneeboard.aero import turns
from kneeboard.aero.atmosphere import G0

KT = 1852.0 / 3600.0


@pytest.mark.parametrize(
    "bank_deg, n, rel",
    [
        # FAA-CT-8080-2H figure 2 "Load Factor Chart", same chart in FAA-H-8083-25 (PHAK),
        # "Aerodynamics of Flight": printed values.
        (0, 1.0, 1e-9),
        (10, 1.015, 1e-3),
        (30, 1.154, 1e-3),
        (45, 1.414, 1e-3),
        (60, 2.000, 1e-9),
        (70, 2.923, 1e-3),
        (80, 5.76, 5e-3),  # the chart prints 5.747; 1 / cos(80 deg) is 5.7588 (computed): the handbook text's 5.76
    ],
)
def test_load_factor_matches_faa_chart(bank_deg, n, rel):
    assert turns.load_factor(math.radians(bank_deg)) == pytest.approx(n, rel=rel)


@pytest.mark.parametrize("bank_deg, chart_n", [(30, 1.154), (45, 1.414), (60, 2.000)])
def test_stall_speed_increase_in_bank(bank_deg, chart_n):
    # Computed from two published pieces, not printed anywhere as such: the load factors the FAA-CT-8080-2H /
    # FAA-H-8083-25 load factor chart prints, and the handbook's rule that the stall speed rises with sqrt(n)
    # ("Load Factors and Stalling Speeds"). The chart's three decimals allow 1e-3.
    vs = 50 * KT
    rise = turns.stall_speed_in_bank(vs, math.radians(bank_deg)) / vs - 1
    assert rise == pytest.approx(math.sqrt(chart_n) - 1, abs=1e-3)
    # and the brief's rounded "about 7 %, 19 %, 41 %" (computed figures, rounded to a percent)
    assert round(rise * 100) == {30: 7, 45: 19, 60: 41}[bank_deg]


def test_fifty_knot_stall_becomes_hundred_at_four_g():
    # FAA-H-8083-25A, "Load Factors and Stalling Speeds": a 50 kt stall speed becomes 100 kt at 4 G.
    bank_4g = math.acos(1 / 4)
    assert turns.stall_speed_in_bank(50 * KT, bank_4g) / KT == pytest.approx(100.0)


def test_three_g_at_seventy_degrees():
    # FAA-H-8083-3A (Airplane Flying Handbook), chapter 9: about 3 G at 70 degrees of bank.
    assert turns.load_factor(math.radians(70)) == pytest.approx(3.0, abs=0.1)


def test_pattern_factor_1_4_leaves_no_margin_near_60_degrees():
    # Common practice, no source: 1.4 x stall speed leaves zero margin at about 60 degrees (sqrt(2) = 1.414).
    vs = 47 * KT
    bank = turns.bank_at_stall_speed(vs, 1.4 * vs)
    assert math.degrees(bank) == pytest.approx(60, abs=1.0)
    # and exactly sqrt(2) gives exactly 60 degrees
    assert math.degrees(turns.bank_at_stall_speed(vs, math.sqrt(2) * vs)) == pytest.approx(60.0)


def test_bank_at_stall_speed_none_below_level_stall():
    assert np.isnan(turns.bank_at_stall_speed(50.0, 40.0))
    assert turns.bank_at_stall_speed(50.0, 50.0) == pytest.approx(0.0)


@pytest.mark.parametrize("v, bank_deg", [(30.0, 15.0), (61.73, 30.0), (45.0, 60.0)])
def test_turn_radius_and_time_from_a_flown_turn(v, bank_deg):
    # An independent derivation: fly the level turn step by step. In a coordinated level turn lift balances the
    # weight (L cos phi = m g), so the sideways force L sin phi turns the velocity: dv/dt = g tan phi, normal to v.
    # Integrate the path (fourth-order Runge-Kutta) through a full circle and measure its radius and duration.
    a = G0 * math.tan(math.radians(bank_deg))

    def f(state):
        x, y, vx, vy = state
        return np.array([vx, vy, -a * vy / v, a * vx / v])

    state, dt, t, turned = np.array([0.0, 0.0, v, 0.0]), 0.002, 0.0, 0.0
    points = [state[:2].copy()]
    while turned < 2 * math.pi:  # the heading change, measured off the velocity vector itself
        before = math.atan2(state[3], state[2])
        k1 = f(state)
        k2 = f(state + dt / 2 * k1)
        k3 = f(state + dt / 2 * k2)
        k4 = f(state + dt * k3)
        state = state + dt / 6 * (k1 + 2 * k2 + 2 * k3 + k4)
        t += dt
        turned += (math.atan2(state[3], state[2]) - before + math.pi) % (2 * math.pi) - math.pi
        points.append(state[:2].copy())
    pts = np.array(points)
    diameter = pts[:, 1].max() - pts[:, 1].min()
    assert turns.turn_radius(v, math.radians(bank_deg)) == pytest.approx(diameter / 2, rel=1e-3)
    assert turns.turn_time(v, math.radians(bank_deg), 2 * math.pi) == pytest.approx(t, abs=2 * dt)


def test_handbook_worked_example_120_kt_30_degrees():
    # FAA-H-8083-25A "Rate of Turn": 120 kt at 30 degrees, 5.25 deg/s and 68.6 s per 360 degrees;
    # "Radius of Turn": about 2,214 ft. The handbook's constants are rounded: within 0.5 %.
    v, phi = 120 * KT, math.radians(30)
    assert math.degrees(turns.turn_rate(v, phi)) == pytest.approx(5.25, rel=5e-3)
    assert turns.turn_time(v, phi, 2 * math.pi) == pytest.approx(68.6, rel=5e-3)
    assert turns.turn_radius(v, phi) / 0.3048 == pytest.approx(2214, rel=5e-3)


@given(st.floats(40, 250), st.floats(1, 80))
def test_handbook_forms_within_half_a_percent(v_kt, bank_deg):
    # PHAK forms R[ft] = V[kt]^2 / (11.26 tan phi), rate = 1091 tan phi / V[kt]; exact constants 11.29 and 1092.2.
    phi = math.radians(bank_deg)
    radius_ft = turns.turn_radius(v_kt * KT, phi) / 0.3048
    rate_deg = math.degrees(turns.turn_rate(v_kt * KT, phi))
    assert radius_ft == pytest.approx(v_kt**2 / (11.26 * math.tan(phi)), rel=5e-3)
    assert rate_deg == pytest.approx(1091 * math.tan(phi) / v_kt, rel=5e-3)


def test_limit_bank():
    # Level-turn bank at the limit load factor: arccos(1 / n). 3.8 -> 74.7 degrees (computed).
    assert math.degrees(turns.limit_bank(3.8)) == pytest.approx(74.74, abs=0.01)
    assert math.degrees(turns.limit_bank(2.0)) == pytest.approx(60.0)


@given(st.floats(10, 200), st.floats(0, 89), st.floats(0, 89))
def test_stall_speed_rises_with_bank(vs, a, b):
    lo, hi = sorted((a, b))
    assert turns.stall_speed_in_bank(vs, math.radians(lo)) <= turns.stall_speed_in_bank(vs, math.radians(hi))


def test_vectorised_over_banks_and_aircraft():
    vs = np.array([[40.0], [50.0]]) * KT  # two aircraft
    banks = np.radians([0, 30, 60])  # three banks
    out = turns.stall_speed_in_bank(vs, banks)
    assert out.shape == (2, 3)
    assert out[1, 2] / KT == pytest.approx(50 * math.sqrt(2))
