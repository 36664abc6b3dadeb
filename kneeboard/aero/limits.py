"""Structural limits: limit load factors by category and configuration, and the manoeuvring speed at weight.

No figure here ever rises above what the flight manual and the design regulation give:

- Limit manoeuvring load factors: normal 3.8 (less above about 4,118 lb), utility 4.4, acrobatic 6.0
  (14 CFR 23.337 before amendment 23-64); sailplanes, utility category +5.3 (EASA CS 22.337).
- With flaps extended: aeroplanes +2.0 with the flaps fully extended, up to VF (14 CFR 23.345(a)(1) before
  amendment 23-64); sailplanes +4.0 with the wing-flaps in the landing settings, up to VF (CS 22.345(b)(1)(i)), and
  +3.5 with the air brakes extended (CS 22.345(a)(1)).
- Above the maximum weight the structure reaches its design limit load sooner: the equivalent limit load factor is
  n_limit x W_max / W (computed from the design limit load, which is n_limit x W_max).
- The operating manoeuvring speed may not exceed the design VA (14 CFR 23.1507; CS 22.1507): VA at a lighter
  weight is VA x sqrt(W / W_VA), and at a weight above W_VA it stays the published VA.
"""

import numpy as np

#: Positive limit manoeuvring load factor by category [-].
CATEGORY_LIMIT_LOAD = {"normal": 3.8, "utility": 4.4, "acrobatic": 6.0, "glider": 5.3}
#: Positive limit load factor with the flaps extended [-]: aeroplanes (14 CFR 23.345(a)(1)), sailplanes with
#: wing-flaps in a landing setting (CS 22.345(b)(1)(i)).
FLAPS_LIMIT_LOAD = {"normal": 2.0, "utility": 2.0, "acrobatic": 2.0, "glider": 4.0}
#: Sailplanes with the air brakes extended (CS 22.345(a)(1)) [-].
AIR_BRAKES_LIMIT_LOAD = 3.5


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


def flaps_limit_load(category: str, aircraft_limit: float) -> float:
    """The limit load factor of a flaps-extended configuration [-]: the regulation's, never above the aircraft's."""
    return min(FLAPS_LIMIT_LOAD[category], aircraft_limit)


def overweight_limit_load(n_limit, weight, max_weight):
    """The equivalent limit load factor [-] at `weight` [kg] of a structure designed for `n_limit` at `max_weight`.

    At or below the maximum weight it is `n_limit`; above, the same design load is reached at n_limit W_max / W.
    """
    weight = np.asarray(weight, dtype=float)
    return np.asarray(n_limit, dtype=float) * np.minimum(1.0, np.asarray(max_weight, dtype=float) / weight)


def maneuvering_speed_at_weight(va, weight, va_weight):
    """Manoeuvring speed [m/s] at `weight` [kg] from the design VA [m/s] published at `va_weight` [kg].

    VA is the stall speed at the limit load factor, so it falls as sqrt(W / W_VA) at lighter weights
    (FAA-H-8083-25, chapter on aerodynamics of flight); above W_VA it is not raised: the loads of a full
    control deflection depend on airspeed, and the operating VA may not exceed the design VA.
    """
    ratio = np.minimum(np.asarray(weight, dtype=float), va_weight) / np.asarray(va_weight, dtype=float)
    return np.asarray(va, dtype=float) * np.sqrt(ratio)


def available_load_factor(speed, stall_speed):
    """Load factor [-] at which the wing stalls at `speed` [m/s], wings level: (V / Vs)^2.

    `stall_speed` is the 1-g stall speed [m/s] at the same weight, on the same basis as `speed` (both IAS, or both
    CAS): the stall happens at one angle of attack (FAA-H-8083-25, "Load Factors and Stalling Speeds").
    """
    return (np.asarray(speed, dtype=float) / np.asarray(stall_speed, dtype=float)) ** 2
