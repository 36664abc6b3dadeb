"""Checks of a profile that need the flight mechanics: each names the field to change.

They read the results the card is made from (`kneeboard.compute.compute` runs once per card), so a check and the
figure it judges can never disagree. Checks that need only the file's values live in `kneeboard.schema`.
"""

import numpy as np

from kneeboard import units
from kneeboard.aero import atmosphere
from kneeboard.compute import Airspeeds, Results
from kneeboard.problems import ERROR, WARNING, Problem
from kneeboard.profile import Profile

LEAST_PATTERN_FACTOR = 1.3  #: 1.3 VS0 on final where the manufacturer gives no figure (FAA-H-8083-3, ch. 9)
FAR_FROM_STANDARD = 40.0  #: a temperature this far from the standard at the altitude is worth a second look [K]


def physics_checks(profile: Profile, results: Results) -> list[Problem]:
    """Problems that only show once the flight mechanics ran on `profile`, read from its `results`."""
    found = []
    a = profile.aircraft
    basis = a.speed_basis
    clean = Airspeeds(a.calibration, basis)
    weight_unit = profile.card.weight_unit
    if results.limit_load_factor < 1.0:
        found.append(Problem(
            "weight", f"at {_mass(results.weight, weight_unit)} the structure's limit load is reached in level "
            f"flight (equivalent limit load factor {results.limit_load_factor:.2f})",
            "a weight at or below aircraft.max_weight"))
    if results.maneuvering_speed is not None:
        if not (clean.to_cas(a.maneuvering_speed)[0] > 0 and results.maneuvering_speed > 0):
            found.append(_speed_at_or_below_zero("aircraft.calibration", "the maneuvering speed"))
        elif results.va_extrapolated:
            found.append(_beyond_table("aircraft.calibration", "the maneuvering speed VA"))
    for i, (c, r) in enumerate(zip(profile.configurations, results.configurations), start=1):
        path = f"configuration[{i}]"
        table = f"{path}.calibration" if c.calibration is not None else "aircraft.calibration"
        if not (r.level_stall_cas > 0 and r.level_stall_speed > 0):
            found.append(_speed_at_or_below_zero(table, f"the stall speed of {path}"))
            continue
        field = "pattern_speed" if c.pattern_speed is not None else "pattern_factor"
        if not r.pattern_speed > r.level_stall_speed or not r.pattern_cas > r.level_stall_cas:
            found.append(Problem(
                f"{path}.{field}", "the pattern speed is not above the stall speed at the card weight",
                "a pattern speed above the wings-level stall speed", severity=ERROR,
            ))
        elif r.pattern_cas < LEAST_PATTERN_FACTOR * r.level_stall_cas * (1 - 1e-12):
            found.append(Problem(
                f"{path}.{field}", f"the pattern speed is {r.pattern_cas / r.level_stall_cas:.2f} x the stall speed "
                "at the card weight in CAS, less than the least usual 1.3 (FAA-H-8083-3)",
                "1.3 x stall speed or more, in CAS", severity=WARNING,
            ))
        if r.flap_limit_speed is not None and r.pattern_speed > r.flap_limit_speed:
            found.append(Problem(f"{path}.flap_limit_speed", "the pattern speed is above the flap limit speed",
                                 "a pattern speed at or below VFE", severity=WARNING))
        if r.calibration_extrapolated:
            found.append(_beyond_table(table, f"the speeds of {c.name}"))
        if c.limit_load_factor is not None and c.limit_load_factor > results.design_limit_load_factor:
            found.append(Problem(f"{path}.limit_load_factor", "is above the aircraft's limit load factor",
                                 f"at most {results.design_limit_load_factor:g}", c.limit_load_factor, WARNING))
    found += _atmosphere_checks(profile, results)
    if profile.glider is not None:
        found += _glider_checks(profile, results, clean)
    return found


def _glider_checks(profile: Profile, results: Results, clean: Airspeeds) -> list[Problem]:
    polar_cas = clean.to_cas(profile.glider.speeds)[0]
    if not polar_cas.min() > 0:
        return [_speed_at_or_below_zero("aircraft.calibration", "a polar speed")]
    g = results.glider
    v_ms = g.polar_minimum_cas
    expected = "points on both sides of minimum sink, whose sink falls then rises with speed, as a measured polar's"
    if not np.isfinite(v_ms) or v_ms > polar_cas.max():
        return [Problem("glider.polar", "the fitted polar has no minimum sink within the measured speeds", expected)]
    if v_ms < polar_cas.min():
        return [Problem("glider.polar", "the fitted polar's minimum sink lies below the slowest measured point",
                        expected)]
    if not g.min_sink_speed > 0:
        return [_speed_at_or_below_zero("aircraft.calibration", "the minimum-sink speed")]
    clean_stall = results.configurations[0]
    if not g.min_sink_cas > clean_stall.level_stall_cas:
        unit = profile.card.speed_unit
        return [Problem(
            "glider.polar", f"the minimum-sink speed at the card weight ({_speed(g.min_sink_cas, unit)} CAS) is not "
            f"above the stall speed of {clean_stall.name} ({_speed(clean_stall.level_stall_cas, unit)} CAS)",
            "a polar whose minimum sink lies above the first configuration's stall speed")]
    return []


def _atmosphere_checks(profile: Profile, results: Results) -> list[Problem]:
    card = profile.card
    if card.temperature is None:
        return []
    standard = float(atmosphere.isa_temperature(card.pressure_altitude))
    plausible = 203.15 <= card.temperature <= 333.15  # outside -70..+60 degC the file's reader warns already
    if plausible and abs(card.temperature - standard) > FAR_FROM_STANDARD:
        return [Problem("card.temperature", f"is {card.temperature - standard:+.0f} degC from the standard "
                        f"temperature at this pressure altitude ({standard - 273.15:.0f} degC); check it",
                        "an outside air temperature as measured", severity=WARNING)]
    return []


def _speed(v: float, unit: str) -> str:
    return units.format_quantity(v, units.SPEED, unit)


def _mass(m: float, unit: str) -> str:
    return units.format_quantity(m, units.MASS, unit)


def _beyond_table(path: str, what: str) -> Problem:
    return Problem(path, f"does not cover {what}; beyond the table its end offset is held",
                   "pairs reaching the speeds converted", severity=WARNING)


def _speed_at_or_below_zero(path: str, what: str) -> Problem:
    """A calibration table whose offsets turn a speed into one at or below zero: no figure would mean anything."""
    return Problem(path, f"turns {what} into a speed at or below zero",
                   "[IAS, CAS] pairs that differ by a few knots, as a flight manual's do")
