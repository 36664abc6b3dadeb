"""Glider speed polar: quadratic fit, ballast scaling and circling flight.

The polar (sink rate against airspeed) is fitted with a least-squares quadratic through all
measured points, the common way of handling published polars. Ballast scales speed and sink
by sqrt(W / Wpolar); in a turn at the same angle of attack speed rises by sqrt(n) and sink by
n^1.5 (lift equation; e.g. Welch, Welch & Irving, The Complete Soaring Pilot's Handbook).
"""

import numpy as np

from kneeboard.aero.turns import load_factor


def fit_polar(speeds, sinks):
    """Least-squares quadratic sink = a v^2 + b v + c through the polar points.

    `speeds` [m/s] and `sinks` [m/s, positive down] -> (a [s/m], b [-], c [m/s]).
    """
    a, b, c = np.polyfit(np.asarray(speeds, dtype=float), np.asarray(sinks, dtype=float), 2)
    return float(a), float(b), float(c)


def polar_minimum(coefficients):
    """Speed of minimum sink [m/s] and that sink [m/s] of a fitted polar; NaN when it has none.

    A polar has a minimum only when it curves upward (a > 0) with the vertex at a positive speed.
    """
    a, b, c = coefficients
    if not a > 0.0:
        return float("nan"), float("nan")
    v = -b / (2.0 * a)
    if not v > 0.0:
        return float("nan"), float("nan")
    return v, a * v * v + b * v + c


def ballast_factor(weight, polar_weight):
    """Speed and sink scale for flying at `weight` a polar measured at `polar_weight` [kg] -> [-]."""
    return np.sqrt(np.asarray(weight, dtype=float) / np.asarray(polar_weight, dtype=float))


def circling(speed, sink, bank):
    """Speed [m/s] and sink [m/s] in a level-equivalent turn at `bank` [rad] and the same angle of attack.

    `speed` and `sink` are those of straight flight at that angle of attack.
    """
    n = load_factor(bank)
    return np.asarray(speed, dtype=float) * np.sqrt(n), np.asarray(sink, dtype=float) * n**1.5
