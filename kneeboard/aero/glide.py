"""The gliding turn: the height a turn back costs after an engine failure (or a glider's launch failure).

Derivation, from the lift equation (published analyses of the turn back after take-off reach the same result,
e.g. Rogers, "The Possible 'Impossible' Turn", Journal of Aircraft 32(2), 1995; from memory). In a steady,
coordinated gliding turn at bank phi flown at the best-glide angle of attack (so at the best glide ratio L/D):

- lift carries the weight and turns the path: L = n W with n = 1 / cos(phi); at one angle of attack the speed
  rises with sqrt(n): V = V_bg sqrt(n);
- drag D = L / (L/D) = n W / (L/D), and the power it takes comes from the height: W w = D V, so the sink rate is
  w = n V / (L/D) = V / ((L/D) cos(phi));
- the rate of turn is omega = g tan(phi) / V, so a heading change dpsi takes t = dpsi V / (g tan(phi));
- the height lost is w t = n V^2 dpsi / ((L/D) g tan(phi)) = V_bg^2 dpsi / (g (L/D) sin(phi) cos(phi)).

sin(phi) cos(phi) = sin(2 phi) / 2 is largest at 45 degrees, where the turn costs least height (the trade's "about
45 degrees for a low turn back" is thus the optimum at constant angle of attack). V_bg is the true airspeed of
best glide at 1 g at the card weight. Before the turn, the pilot glides straight for the reaction time:
V_bg t / (L/D). The figures hold for still air and exclude the roll-in and roll-out (FAA-H-8083-3, engine failure
after take-off, for the decision itself).
"""

import numpy as np

from kneeboard.aero.atmosphere import G0
from kneeboard.aero.turns import load_factor


def turn_speed(v_bg, bank):
    """Speed [m/s] of the gliding turn at `bank` [rad] at the best-glide angle of attack: V_bg sqrt(n)."""
    return np.asarray(v_bg, dtype=float) * np.sqrt(load_factor(bank))


def turn_height_loss(v_bg, glide_ratio, bank, heading_change):
    """Height [m] lost through `heading_change` [rad] in a gliding turn at `bank` [rad].

    V_bg^2 dpsi / (g (L/D) sin(phi) cos(phi)), `v_bg` the true best-glide airspeed at 1 g [m/s]; infinite at 0 bank
    (no turn) and at 90 degrees.
    """
    bank = np.asarray(bank, dtype=float)
    with np.errstate(divide="ignore"):
        return (np.asarray(v_bg, dtype=float) ** 2 * np.asarray(heading_change, dtype=float)
                / (G0 * np.asarray(glide_ratio, dtype=float) * np.sin(bank) * np.cos(bank)))


def straight_height_loss(v_bg, glide_ratio, seconds):
    """Height [m] lost gliding straight at the best-glide true airspeed `v_bg` [m/s] for `seconds` [s]."""
    return np.asarray(v_bg, dtype=float) * np.asarray(seconds, dtype=float) / np.asarray(glide_ratio, dtype=float)


def glide_ratio_from_sink(v_bg, sink):
    """Glide ratio [-] at the best-glide speed `v_bg` [m/s] from its sink rate `sink` [m/s] (small glide angle)."""
    return np.asarray(v_bg, dtype=float) / np.asarray(sink, dtype=float)


LEAST_LOSS_BANK = np.pi / 4  #: [rad] where sin(phi) cos(phi) is largest
