"""Level, coordinated turns: load factor, stall speed in a bank, margins and turn geometry.

Sources: FAA-H-8083-25 (Pilot's Handbook of Aeronautical Knowledge), "Load Factors" and
"Radius of Turn"/"Rate of Turn"; the lift equation for the square-root laws.
"""

import numpy as np

from kneeboard.aero.atmosphere import G0


def load_factor(bank):
    """Load factor n = 1 / cos(bank) of a level, coordinated turn; `bank` [rad] -> [-]."""
    return 1.0 / np.cos(np.asarray(bank, dtype=float))


def weight_factor(weight, reference_weight):
    """Speed scale for a weight change, sqrt(W / Wref); weights [kg] -> [-].

    Stall speed and manoeuvring speed both follow it (lift equation at constant CL).
    """
    return np.sqrt(np.asarray(weight, dtype=float) / np.asarray(reference_weight, dtype=float))


def stall_speed_in_bank(vs, bank):
    """Stall speed in a level turn, Vs sqrt(n); `vs` wings-level stall speed [m/s], `bank` [rad] -> [m/s]."""
    return np.asarray(vs, dtype=float) * np.sqrt(load_factor(bank))


def bank_at_stall_speed(vs, v):
    """Bank [rad] at which the stall speed in a level turn rises to `v` [m/s]; `vs` wings level [m/s].

    arccos((vs / v)^2). NaN where `v` is below the wings-level stall speed: there is no such bank.
    """
    ratio = np.asarray(vs, dtype=float) / np.asarray(v, dtype=float)
    with np.errstate(invalid="ignore"):
        return np.where(ratio <= 1.0, np.arccos(np.minimum(ratio, 1.0) ** 2), np.nan)


def limit_bank(n_limit):
    """Bank [rad] of a level turn that reaches the load factor `n_limit` [-]: arccos(1 / n)."""
    return np.arccos(1.0 / np.asarray(n_limit, dtype=float))


def turn_radius(tas, bank):
    """Radius of a level turn, V^2 / (g tan(bank)); `tas` [m/s], `bank` [rad] -> [m]; inf at 0 bank."""
    tan = np.tan(np.asarray(bank, dtype=float))
    with np.errstate(divide="ignore"):
        return np.asarray(tas, dtype=float) ** 2 / (G0 * tan)


def turn_rate(tas, bank):
    """Rate of a level turn, g tan(bank) / V; `tas` [m/s], `bank` [rad] -> [rad/s]."""
    return G0 * np.tan(np.asarray(bank, dtype=float)) / np.asarray(tas, dtype=float)


def turn_time(tas, bank, heading_change):
    """Time to turn through `heading_change` [rad] at `tas` [m/s] and `bank` [rad] -> [s]; inf at 0 bank."""
    with np.errstate(divide="ignore"):
        return np.asarray(heading_change, dtype=float) / turn_rate(tas, bank)
