"""Checks of a profile that need the flight mechanics: each names the field to change.

They read the results the card is made from (`kneeboard.compute.compute` runs once per card), so a check and the
figure it judges can never disagree. Checks that need only the file's values live in `kneeboard.schema`.
"""

import numpy as np

from kneeboard.aero import glider
from kneeboard.compute import Airspeeds, Results
from kneeboard.problems import ERROR, WARNING, Problem
from kneeboard.profile import Profile


def physics_checks(profile: Profile, results: Results) -> list[Problem]:
    """Problems that only show once the flight mechanics ran on `profile`, read from its `results`."""
    found = []
    basis = profile.aircraft.speed_basis
    clean = Airspeeds(profile.aircraft.calibration, basis)
    if results.maneuvering_speed is not None and not (clean.to_cas(profile.aircraft.maneuvering_speed)[0] > 0
                                                      and results.maneuvering_speed > 0):
        found.append(_speed_at_or_below_zero("aircraft.calibration", "the maneuvering speed"))
    for i, (c, r) in enumerate(zip(profile.configurations, results.configurations), start=1):
        path = f"configuration[{i}]"
        vs0 = r.level_stall_speed
        if not (Airspeeds(profile.calibration_for(c), basis).to_cas(c.stall_speed)[0] > 0 and vs0 > 0):
            table = f"{path}.calibration" if c.calibration is not None else "aircraft.calibration"
            found.append(_speed_at_or_below_zero(table, f"the stall speed of {path}"))
            continue
        if not r.pattern_speed > vs0:
            field = "pattern_speed" if c.pattern_speed is not None else "pattern_factor"
            found.append(Problem(
                f"{path}.{field}", "the pattern speed is not above the stall speed at the card weight",
                "a pattern speed above the wings-level stall speed", severity=ERROR,
            ))
        elif c.pattern_speed is not None and r.pattern_speed < 1.3 * vs0:
            found.append(Problem(
                f"{path}.pattern_speed", "is less than 1.3 x the stall speed at the card weight (FAA-H-8083-3)",
                "1.3 x stall speed or more", severity=WARNING,
            ))
        if r.flap_limit_speed is not None and r.pattern_speed > r.flap_limit_speed:
            found.append(Problem(f"{path}.flap_limit_speed", "the pattern speed is above the flap limit speed",
                                 "a pattern speed at or below VFE", severity=WARNING))
        if np.any(r.stall_extrapolated):
            found.append(Problem(
                f"{path}.calibration", "does not cover the stall speeds of every bank asked for; "
                "beyond it the end offset is held", "pairs reaching the highest stall speed", severity=WARNING,
            ))
    if profile.glider is not None:
        polar_cas = clean.to_cas(profile.glider.speeds)[0]
        if not polar_cas.min() > 0:
            found.append(_speed_at_or_below_zero("aircraft.calibration", "a polar speed"))
            return found
        v_ms, _ = glider.polar_minimum(glider.fit_polar(polar_cas, profile.glider.sinks))
        if np.isfinite(v_ms) and not results.glider.min_sink_speed > 0:
            found.append(_speed_at_or_below_zero("aircraft.calibration", "the minimum-sink speed"))
        elif not (np.isfinite(v_ms) and v_ms <= polar_cas.max()):
            found.append(Problem("glider.polar", "the fitted polar has no minimum sink within the measured speeds",
                                 "points whose sink falls then rises with speed, as a measured polar does"))
        elif v_ms < polar_cas.min():
            found.append(Problem("glider.polar", "the minimum sink lies below the slowest measured point",
                                 "points on both sides of minimum sink", severity=WARNING))
    return found


def _speed_at_or_below_zero(path: str, what: str) -> Problem:
    """A calibration table whose offsets turn a speed into one at or below zero: no figure would mean anything."""
    return Problem(path, f"turns {what} into a speed at or below zero",
                   "[IAS, CAS] pairs that differ by a few knots, as a flight manual's do")
