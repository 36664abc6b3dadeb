"""Checks of a profile that need the flight mechanics: each names the field to change.

They read the results the card is made from (`kneeboard.compute.compute` runs once per card), so a check and the
figure it judges can never disagree. Checks that need only the file's values live in `kneeboard.inputs.schema`.
"""

import numpy as np

from kneeboard import rounding, units
from kneeboard.aero import atmosphere
from kneeboard.compute import Airspeeds, Results, glide_configuration
from kneeboard.i18n import N_, Msg, Num
from kneeboard.problems import ERROR, WARNING, Problem
from kneeboard.profile import NOTHING, Profile

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
            "weight", Msg("at {weight} the structure's limit load is reached in level flight (equivalent limit load "
                          "factor {load})", weight=Num(_mass(results.weight, weight_unit)),
                          load=Num(_ratio(results.limit_load_factor))),
            Msg("a weight at or below aircraft.max_weight")))
    if results.maneuvering_speed is not None:
        if not (clean.to_cas(a.maneuvering_speed)[0] > 0 and results.maneuvering_speed > 0):
            found.append(_speed_at_or_below_zero("aircraft.calibration", N_("the maneuvering speed")))
        elif results.va_extrapolated:
            found.append(_beyond_table("aircraft.calibration", N_("the maneuvering speed VA"),
                                       Msg("The calibration table does not reach VA; its last correction is carried "
                                           "on. Check VA in the flight manual")))
    unit = profile.card.speed_unit
    for i, (c, r) in enumerate(zip(profile.configurations, results.configurations), start=1):
        path = f"configuration[{i}]"
        table = f"{path}.calibration" if c.calibration is not None else "aircraft.calibration"
        if not (r.level_stall_cas > 0 and r.level_stall_speed > 0):
            found.append(_speed_at_or_below_zero(table, Msg("the stall speed of {path}", path=path)))
            continue
        field = "pattern_speed" if c.pattern_speed is not None else "pattern_factor"
        # as the card prints them: both rounded up, so a pattern speed a hair above the stall speed is refused too
        pattern, stall = _printed_speed(r.pattern_speed, unit), _printed_speed(r.level_stall_speed, unit)
        if not r.pattern_speed > r.level_stall_speed or not r.pattern_cas > r.level_stall_cas or pattern <= stall:
            found.append(Problem(
                f"{path}.{field}", Msg("{name}: the pattern speed ({pattern} {unit}) is not above the stall speed at "
                                       "the card weight ({stall} {unit}) as the card prints them: no margin even "
                                       "wings level", name=c.name, pattern=Num(f"{pattern:g}"), unit=unit,
                                       stall=Num(f"{stall:g}")),
                Msg("a pattern speed above the wings-level stall speed"), severity=ERROR,
            ))
        elif r.pattern_cas < LEAST_PATTERN_FACTOR * r.level_stall_cas * (1 - 1e-12):
            ratio = _ratio(r.pattern_cas / r.level_stall_cas)
            found.append(Problem(
                f"{path}.{field}", Msg("the pattern speed is {ratio} x the stall speed at the card weight in CAS, "
                                       "less than the least usual {least} (FAA-H-8083-3)", ratio=Num(ratio),
                                       least=Num("1.3")),
                Msg("{least} x stall speed or more, in CAS", least=Num("1.3")), severity=WARNING,
                plain=Msg("{name}: pattern speed {speed} {unit} is {ratio} x stall speed (CAS), under the least usual "
                          "1.3 (Airplane Flying Handbook). Check the flight manual's approach speeds", name=c.name,
                          speed=float(pattern), unit=unit, ratio=Num(ratio)),
            ))
        if r.flap_limit_speed is not None and r.pattern_speed > r.flap_limit_speed:
            vfe = rounding.down(float(units.from_si(r.flap_limit_speed, units.SPEED, unit)))
            found.append(Problem(f"{path}.flap_limit_speed", Msg("the pattern speed is above the flap limit speed"),
                                 Msg("a pattern speed at or below VFE"), severity=WARNING,
                                 plain=Msg("{name}: pattern speed {speed} {unit} is above VFE {vfe} {unit}. Check "
                                           "both in the flight manual", name=c.name, speed=float(pattern), unit=unit,
                                           vfe=float(vfe))))
        if r.calibration_extrapolated:
            found.append(_beyond_table(table, Msg("the speeds of {name}", name=c.name),
                                       Msg("{name}: the calibration table does not reach all its speeds; its last "
                                           "correction is carried on. Check them in the flight manual", name=c.name)))
        if c.limit_load_factor is not None and c.limit_load_factor > results.design_limit_load_factor:
            found.append(Problem(f"{path}.limit_load_factor", Msg("is above the aircraft's limit load factor"),
                                 Msg("at most {limit}", limit=Num(f"{results.design_limit_load_factor:g}")),
                                 c.limit_load_factor, WARNING,
                                 plain=Msg("{name}: limit load factor {load} is above the aircraft's {limit}. Check "
                                           "both in the flight manual", name=c.name, load=float(c.limit_load_factor),
                                           limit=float(results.design_limit_load_factor))))
    found += _glide_checks(profile, results)
    found += _atmosphere_checks(profile, results)
    if profile.glider is not None:
        found += _glider_checks(profile, results, clean)
    return found


def _glider_checks(profile: Profile, results: Results, clean: Airspeeds) -> list[Problem]:
    polar_cas = clean.to_cas(profile.glider.speeds)[0]
    if not polar_cas.min() > 0:
        return [_speed_at_or_below_zero("aircraft.calibration", N_("a polar speed"))]
    g = results.glider
    v_ms = g.polar_minimum_cas
    expected = Msg("points on both sides of minimum sink, whose sink falls then rises with speed, as a measured "
                   "polar's")
    if not np.isfinite(v_ms) or v_ms > polar_cas.max():
        return [Problem("glider.polar", Msg("the fitted polar has no minimum sink within the measured speeds"),
                        expected)]
    if v_ms < polar_cas.min():
        return [Problem("glider.polar", Msg("the fitted polar's minimum sink lies below the slowest measured point"),
                        expected)]
    if not g.min_sink_speed > 0:
        return [_speed_at_or_below_zero("aircraft.calibration", N_("the minimum-sink speed"))]
    clean_stall = results.configurations[glide_configuration(profile, results.configurations)]
    if not g.min_sink_cas > clean_stall.level_stall_cas:
        unit = profile.card.speed_unit
        return [Problem(
            "glider.polar", Msg("the minimum-sink speed at the card weight ({min_sink} CAS) is not above the stall "
                                "speed of {name} ({stall} CAS)", min_sink=Num(_speed(g.min_sink_cas, unit)),
                                name=clean_stall.name, stall=Num(_speed(clean_stall.level_stall_cas, unit))),
            Msg("a polar whose minimum sink lies above the clean configuration's stall speed"))]
    return []


def _atmosphere_checks(profile: Profile, results: Results) -> list[Problem]:
    card = profile.card
    if card.temperature is None:
        return []
    standard = float(atmosphere.isa_temperature(card.pressure_altitude))
    plausible = 203.15 <= card.temperature <= 333.15  # outside -70..+60 degC the file's reader warns already
    if plausible and abs(card.temperature - standard) > FAR_FROM_STANDARD:
        oat, difference = Num(f"{card.temperature - 273.15:.0f}"), Num(f"{abs(card.temperature - standard):.0f}")
        return [Problem("card.temperature", Msg("is {difference} degC from the standard temperature at this "
                                                "pressure altitude ({standard} degC); check it",
                                                difference=Num(f"{card.temperature - standard:+.0f}"),
                                                standard=Num(f"{standard - 273.15:.0f}")),
                        Msg("an outside air temperature as measured"), severity=WARNING,
                        plain=Msg("Temperature {temperature} °C is {difference} °C above standard at this altitude: "
                                  "check the temperature of the turn figures", temperature=oat, difference=difference)
                        if card.temperature > standard else
                        Msg("Temperature {temperature} °C is {difference} °C below standard at this altitude: check "
                            "the temperature of the turn figures", temperature=oat, difference=difference))]
    return []


def _glide_checks(profile: Profile, results: Results) -> list[Problem]:
    """The turn back glides in the configuration the profile names, else a clean one: with none clean, say so."""
    tb = results.turn_back
    if tb is None or profile.aircraft.glide_configuration is not None:
        return []
    if any(c.extended == NOTHING for c in profile.configurations):
        return []
    name = profile.configurations[tb.configuration].name
    return [Problem("aircraft.glide_configuration", Msg("no configuration has nothing extended, so the turn back's "
                                                        "margins are taken over {name}'s stall speed, the highest",
                                                        name=name),
                    Msg("the name of the configuration the flight manual's best glide is flown in"), severity=WARNING,
                    plain=Msg("No configuration is clean: turn-back margins are over {name}'s stall speed, the "
                              "highest. Check the flight manual's best-glide configuration", name=name))]


def _printed_speed(v: float, unit: str) -> float:
    """A speed [m/s] as the card prints it: in its unit, rounded up (`kneeboard.tables`)."""
    return rounding.up(float(units.from_si(v, units.SPEED, unit)))


def _ratio(x: float) -> str:
    """A ratio in a message, rounded down: every ratio the checks name is one whose lower values are worse."""
    return f"{rounding.down(x, 0.01):.2f}"


def _speed(v: float, unit: str) -> str:
    return units.format_quantity(v, units.SPEED, unit)


def _mass(m: float, unit: str) -> str:
    return units.format_quantity(m, units.MASS, unit)


def _beyond_table(path: str, what: str, plain: str) -> Problem:
    return Problem(path, Msg("does not cover {what}; beyond the table its end offset is held", what=what),
                   Msg("pairs reaching the speeds converted"), severity=WARNING, plain=plain)


def _speed_at_or_below_zero(path: str, what: str) -> Problem:
    """A calibration table whose offsets turn a speed into one at or below zero: no figure would mean anything."""
    return Problem(path, Msg("turns {what} into a speed at or below zero", what=what),
                   Msg("[IAS, CAS] pairs that differ by a few knots, as a flight manual's do"))
