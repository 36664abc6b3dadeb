"""Structural limits: limit load factors by category and the manoeuvring speed at weight.

Sources: 14 CFR 23.337 before amendment 23-64 (normal 3.8, utility 4.4, acrobatic 6.0);
EASA CS-22, CS 22.337 (gliders, utility category +5.3).
"""

import numpy as np

from kneeboard.aero.turns import weight_factor

#: Positive limit manoeuvring load factor by category [-].
CATEGORY_LIMIT_LOAD = {"normal": 3.8, "utility": 4.4, "acrobatic": 6.0, "glider": 5.3}


def normal_category_limit_load(weight_lb):
    """14 CFR 23.337(a)(1) before amendment 23-64: n = 2.1 + 24000 / (W + 10000), at most 3.8.

    `weight_lb` is the design maximum weight [lb] (the regulation's own unit) -> [-].
    The rule never asks for less than 3.8 for aeroplanes under about 4,118 lb.
    """
    return np.minimum(2.1 + 24_000.0 / (np.asarray(weight_lb, dtype=float) + 10_000.0), 3.8)


def default_limit_load(category: str, max_weight: float) -> float:
    """The limit load factor to assume when the profile gives none; `max_weight` [kg] -> [-].

    For the normal category, 14 CFR 23.337(a)(1) asks for less than 3.8 above about 4,118 lb
    (2.1 + 24000 / (W + 10000)); assuming 3.8 there would overstate the aeroplane's strength.
    """
    if category == "normal":
        return float(normal_category_limit_load(max_weight / 0.45359237))
    return CATEGORY_LIMIT_LOAD[category]


def maneuvering_speed_at_weight(va, weight, reference_weight):
    """Manoeuvring speed [m/s] at `weight` from VA [m/s] published at `reference_weight` [kg].

    VA is a stall speed at the limit load factor, so it scales with sqrt(W / Wref) and falls as
    the aeroplane gets lighter (FAA-H-8083-25, chapter on aerodynamics of flight).
    """
    return np.asarray(va, dtype=float) * weight_factor(weight, reference_weight)
