"""Apply the flight-mechanics core to a profile: every figure a card or table needs, in SI floats.

**Every stall happens at one angle of attack**, whatever the bank or the weight, and the airspeed indicator's
position error follows the angle of attack. So the indicated stall speed rises by sqrt(n) and sqrt(W / Wr) just
like the calibrated one (flight manuals' stall-speed-by-bank tables list IAS and CAS each rising by sqrt(n)):

    Vs_IAS(W, bank) = Vs_IAS(Wr, wings level) sqrt(W / Wr) sqrt(n),   and the same in CAS.

A calibration table is a 1-g table: it converts the published stall speed to the basis the file does not give (at
the reference weight), and the speeds flown at 1 g: the pattern speed, VA, VFE. A pattern speed given as a factor
is factor x the CAS stall speed at the card weight (the rule is in CAS: FAA-H-8083-3), then converted to IAS.
Margins and banks are taken on the IAS the pilot reads:

    margin(bank) = Vp_IAS - Vs_IAS(bank);  zero-margin bank = arccos((Vs_IAS / Vp_IAS)^2);
    buffer bank = arccos((Vs_IAS / (Vp_IAS - buffer))^2).

Limits never rise above the flight manual's (see `kneeboard.aero.limits`). Nothing here is rounded: rounding for
print happens once, in `kneeboard.tables`.
"""

from dataclasses import dataclass

import numpy as np

from kneeboard.aero import airspeed, atmosphere, glide, glider, limits, turns
from kneeboard.profile import AIR_BRAKES, FLAPS, NOTHING, Calibration, Configuration, Profile, name_key

#: Banks of the chart's curves [deg]: 1 degree steps, a smooth curve at card size. They are evaluated in the same
#: vectorised call as the card's own banks, so a card computes its physics once.
CURVE_BANKS_DEG = np.arange(0.0, 86.0, 1.0)


@dataclass(frozen=True)
class Airspeeds:
    """1-g conversions between the profile's speed basis, CAS and IAS through one calibration table.

    Every method returns (speed, extrapolated): the mask says where the table had to be extended, which the flight
    manual does not cover.
    """

    calibration: Calibration | None
    basis: str  #: "IAS" or "CAS": how the profile's speeds are written

    def _convert(self, v, to_cas: bool):
        v = np.asarray(v, dtype=float)
        if self.calibration is None:
            return v, np.zeros(v.shape, dtype=bool)
        table = (self.calibration.ias, self.calibration.cas)
        return airspeed.ias_to_cas(v, *table) if to_cas else airspeed.cas_to_ias(v, *table)

    def to_cas(self, v):
        """CAS [m/s] of speeds written in the profile's basis."""
        if self.basis == "CAS":
            v = np.asarray(v, dtype=float)
            return v, np.zeros(v.shape, dtype=bool)
        return self._convert(v, to_cas=True)

    def to_ias(self, v):
        """IAS [m/s] of speeds written in the profile's basis."""
        if self.basis == "IAS":
            v = np.asarray(v, dtype=float)
            return v, np.zeros(v.shape, dtype=bool)
        return self._convert(v, to_cas=False)

    def cas_to_ias(self, cas):
        """IAS [m/s] of calibrated airspeeds."""
        return self._convert(cas, to_cas=False)


@dataclass(frozen=True)
class ConfigurationResult:
    """One configuration at the card weight; arrays run over the bank angles. Speeds IAS [m/s] unless named CAS."""

    name: str
    bank: np.ndarray  #: [rad]
    load_factor: np.ndarray  #: [-]
    stall_speed: np.ndarray  #: IAS in each bank [m/s]
    pattern_speed: float  #: IAS [m/s]
    margin: np.ndarray  #: pattern speed minus stall speed, IAS [m/s]; negative: stalled at that bank
    zero_margin_bank: float  #: [rad]
    buffer_bank: float | None  #: [rad]; None when even wings level the margin is below the buffer
    flap_limit_speed: float | None  #: VFE IAS [m/s]
    pattern_tas: float  #: [m/s]
    turn_radius: np.ndarray  #: at the pattern speed [m]; inf at 0 bank
    turn_rate: np.ndarray  #: at the pattern speed [rad/s]
    time_180: np.ndarray  #: [s]; inf at 0 bank
    time_360: np.ndarray  #: [s]; inf at 0 bank
    level_stall_speed: float  #: wings-level stall speed at the card weight, IAS [m/s]
    level_stall_cas: float  #: the same in CAS [m/s]
    pattern_cas: float  #: [m/s]
    limit_load_factor: float  #: this configuration's limit at the card weight [-]
    limit_bank: float  #: level-turn bank at that limit [rad]
    over_limit: np.ndarray  #: True where the bank's load factor reaches or exceeds this configuration's limit
    calibration_extrapolated: bool  #: a 1-g conversion of this configuration went beyond the calibration table
    curve_stall_speed: np.ndarray  #: IAS at each of CURVE_BANKS_DEG [m/s], for the chart
    available_load_factor: float  #: (Vp / Vs)^2: the pull that stalls the wing at the pattern speed, IAS [-]


@dataclass(frozen=True)
class GliderResult:
    """Circling at minimum-sink angle of attack at the card weight; arrays run over the bank angles."""

    min_sink_speed: float  #: IAS, straight flight, at card weight [m/s]
    min_sink_cas: float  #: [m/s]
    min_sink_rate: float  #: true sink rate, straight flight [m/s]
    polar_minimum_cas: float  #: the fitted polar's minimum-sink speed at the polar's weight [m/s]; NaN if none
    bank: np.ndarray  #: [rad]
    speed: np.ndarray  #: IAS in the turn [m/s]
    sink_rate: np.ndarray  #: true sink rate [m/s]
    turn_radius: np.ndarray  #: [m]; inf at 0 bank
    circle_time: np.ndarray  #: time for a full circle [s]; inf at 0 bank
    height_loss_180: np.ndarray  #: height lost turning back through 180 degrees [m]; inf at 0 bank
    polar_extrapolated: bool  #: the minimum-sink speed lies outside the measured points


@dataclass(frozen=True)
class TurnBackResult:
    """The gliding turn back at best-glide angle of attack (`aero.glide`) at the card weight and density."""

    best_glide_speed: float  #: IAS at 1 g at the card weight [m/s]
    best_glide_tas: float  #: [m/s]
    glide_ratio: float  #: [-]
    headings: np.ndarray  #: heading changes [rad]
    reaction_time: float  #: [s]
    reaction_height_loss: float  #: straight glide during the reaction time [m]
    bank: np.ndarray  #: the card's banks above 0 [rad]
    speed: np.ndarray  #: IAS flown in the turn at each bank [m/s]
    margin: np.ndarray  #: that speed minus the glide configuration's stall speed at the bank, IAS [m/s]
    height_loss: np.ndarray  #: [bank, heading] height lost in the turn alone [m]
    extrapolated: bool  #: the best-glide speed's conversion went beyond the calibration table
    configuration: int = 0  #: index of the configuration it glides in (`glide_configuration`)


@dataclass(frozen=True)
class Results:
    weight: float  #: the card weight [kg]
    reference_weight: float  #: [kg]
    max_weight: float  #: [kg]
    design_limit_load_factor: float  #: the aircraft's limit at or below the maximum weight [-]
    limit_load_factor: float  #: the aircraft's limit at the card weight (lower when overweight) [-]
    limit_bank: float  #: [rad]
    maneuvering_speed: float | None  #: VA IAS at card weight, never above the published VA [m/s]
    va_extrapolated: bool  #: VA's conversion went beyond the calibration table
    pressure_altitude: float  #: [m]
    temperature: float  #: [K]
    density: float  #: [kg/m^3]
    density_altitude: float  #: [m]
    configurations: tuple[ConfigurationResult, ...]
    glider: GliderResult | None
    curve_bank_deg: np.ndarray  #: banks of each configuration's curve_stall_speed [deg]
    turn_back: TurnBackResult | None = None  #: when the profile gives the best glide
    buffer: float = 0.0  #: the least margin the pilot wants to keep [m/s]

    @property
    def over_max_weight(self) -> bool:
        return self.weight > self.max_weight * (1 + 1e-9)


def compute(profile: Profile, weight: float | None = None, banks_deg=None) -> Results:
    """Every card figure of `profile` at `weight` [kg] (default: the profile's) and bank angles [deg]."""
    if weight is not None:
        profile = profile.with_weight(weight)
    a, card = profile.aircraft, profile.card
    bank = np.radians(np.asarray(card.bank_angles_deg if banks_deg is None else banks_deg, dtype=float))
    curve = np.radians(CURVE_BANKS_DEG)
    k = float(turns.weight_factor(profile.weight, a.reference_weight))
    h = card.pressure_altitude
    temperature = float(atmosphere.isa_temperature(h)) if card.temperature is None else card.temperature
    rho = float(atmosphere.air_density(h, temperature))
    design = design_limit_load_factor(a)
    n_limit = float(limits.overweight_limit_load(design, profile.weight, a.max_weight))

    def tas(cas):
        return atmosphere.tas_from_cas(cas, h, temperature)

    configs = tuple(_configuration(profile, c, bank, curve, k, tas, design) for c in profile.configurations)
    va, va_extrapolated = None, False
    if a.maneuvering_speed is not None:
        clean = Airspeeds(a.calibration, a.speed_basis)
        va_cas, ext = clean.to_cas(a.maneuvering_speed)
        va_weight = a.reference_weight if a.maneuvering_speed_weight is None else a.maneuvering_speed_weight
        va_cas = limits.maneuvering_speed_at_weight(va_cas, profile.weight, va_weight)
        va_ias, ext2 = clean.cas_to_ias(va_cas)
        va, va_extrapolated = float(va_ias), bool(ext | ext2)
    return Results(
        weight=profile.weight,
        reference_weight=a.reference_weight,
        max_weight=a.max_weight,
        design_limit_load_factor=design,
        limit_load_factor=n_limit,
        limit_bank=_limit_bank(n_limit),
        maneuvering_speed=va,
        va_extrapolated=va_extrapolated,
        pressure_altitude=h,
        temperature=temperature,
        density=rho,
        density_altitude=float(atmosphere.density_altitude(rho)),
        configurations=configs,
        glider=None if profile.glider is None else _glider(profile, bank, tas),
        curve_bank_deg=CURVE_BANKS_DEG,
        buffer=card.buffer,
        turn_back=(_turn_back(profile, bank, k, tas, configs, glide_configuration(profile, configs))
                   if a.best_glide_speed is not None else None),
    )


def glide_configuration(profile: Profile, configs=None) -> int:
    """Index of the configuration the turn back glides in: the one the profile names, else the clean one.

    The best-glide speed is published clean (nothing extended). Of several configurations with nothing extended
    (a retractable's gear down, a flap setting entered without its flap limit) the one that stalls fastest is taken,
    so its margins err low; with none clean, the fastest-stalling of all (`checks` warns). `configs` are the
    configurations' results; without them the published stall speeds are compared.
    """
    named = profile.aircraft.glide_configuration
    configurations = profile.configurations
    if named is not None:
        for i, c in enumerate(configurations):
            if name_key(c.name) == name_key(named):
                return i
    clean = [i for i, c in enumerate(configurations) if c.extended == NOTHING] or range(len(configurations))

    def stall(i):
        return configs[i].level_stall_speed if configs is not None else configurations[i].stall_speed

    return max(clean, key=lambda i: (stall(i), -i))


def design_limit_load_factor(aircraft) -> float:
    """The aircraft's positive limit load factor [-]: the profile's, or the category's by the regulation."""
    if aircraft.limit_load_factor is not None:
        return aircraft.limit_load_factor
    return limits.default_limit_load(aircraft.category, aircraft.max_weight)


def configuration_design_limit(category: str, c: Configuration, aircraft_limit: float) -> float:
    """A configuration's limit load factor at or below the maximum weight [-]: the flight manual's own if the
    profile gives it, else the regulation's for what is extended (never above the aircraft's)."""
    if c.limit_load_factor is not None:
        return c.limit_load_factor
    if c.extended == FLAPS:
        return limits.flaps_limit_load(category, aircraft_limit)
    if c.extended == AIR_BRAKES and category == "glider":
        return min(limits.AIR_BRAKES_LIMIT_LOAD, aircraft_limit)
    return aircraft_limit


def _limit_bank(n: float) -> float:
    # an equivalent limit below 1 (a grossly overweight aircraft) is reached in level flight: the checks refuse it
    return float(turns.limit_bank(max(n, 1.0)))


def _configuration(profile: Profile, c: Configuration, bank, curve, k: float, tas, design: float):
    a = profile.aircraft
    speeds = Airspeeds(profile.calibration_for(c), a.speed_basis)
    # the published 1-g stall speed in both bases, at the reference weight; then scaled at one angle of attack
    vs_ref_cas, ext_cas = speeds.to_cas(c.stall_speed)
    vs_ref_ias, ext_ias = speeds.to_ias(c.stall_speed)
    vs0_cas, vs0_ias = float(vs_ref_cas) * k, float(vs_ref_ias) * k
    extrapolated = bool(ext_cas | ext_ias)
    if c.pattern_speed is not None:
        vp_cas, e1 = speeds.to_cas(c.pattern_speed)
        vp_ias, e2 = speeds.to_ias(c.pattern_speed)
    else:
        vp_cas = c.pattern_factor * vs0_cas
        (vp_ias, e2), e1 = speeds.cas_to_ias(vp_cas), False
    vp_cas, vp_ias = float(vp_cas), float(vp_ias)
    extrapolated |= bool(e1 | e2)
    # the card's banks and the chart's curve in one vectorised evaluation
    both = turns.stall_speed_in_bank(vs0_ias, np.concatenate([bank, curve]))
    stall_ias, curve_ias = both[:bank.size], both[bank.size:]
    buffer_ias = vp_ias - profile.card.buffer
    buffer_bank = float(turns.bank_at_stall_speed(vs0_ias, buffer_ias)) if buffer_ias >= vs0_ias else None
    pattern_tas = float(tas(vp_cas))
    with np.errstate(over="ignore"):  # a bank too small to turn has an infinite radius and time, as 0 does
        radius, rate = turns.turn_radius(pattern_tas, bank), turns.turn_rate(pattern_tas, bank)
        time_180, time_360 = turns.turn_time(pattern_tas, bank, np.pi), turns.turn_time(pattern_tas, bank, 2 * np.pi)
    vfe = None
    if c.flap_limit_speed is not None:
        vfe_ias, e3 = speeds.to_ias(c.flap_limit_speed)
        vfe, extrapolated = float(vfe_ias), extrapolated | bool(e3)
    n_limit = float(limits.overweight_limit_load(configuration_design_limit(a.category, c, design), profile.weight,
                                                 a.max_weight))
    load = turns.load_factor(bank)
    return ConfigurationResult(
        name=c.name,
        bank=bank,
        load_factor=load,
        stall_speed=stall_ias,
        pattern_speed=vp_ias,
        margin=vp_ias - stall_ias,
        zero_margin_bank=float(turns.bank_at_stall_speed(vs0_ias, vp_ias)),
        buffer_bank=buffer_bank,
        flap_limit_speed=vfe,
        pattern_tas=pattern_tas,
        turn_radius=radius,
        turn_rate=rate,
        time_180=time_180,
        time_360=time_360,
        level_stall_speed=vs0_ias,
        level_stall_cas=vs0_cas,
        pattern_cas=vp_cas,
        limit_load_factor=n_limit,
        limit_bank=_limit_bank(n_limit),
        over_limit=load >= n_limit * (1 - 1e-9),  # at the limit is the structure's edge: marked too
        calibration_extrapolated=extrapolated,
        curve_stall_speed=curve_ias,
        available_load_factor=float(limits.available_load_factor(vp_ias, vs0_ias)),
    )


def _turn_back(profile: Profile, bank, k: float, tas, configs, index: int) -> TurnBackResult:
    a, card = profile.aircraft, profile.card
    clean = configs[index]
    speeds = Airspeeds(a.calibration, a.speed_basis)
    v_cas, e1 = speeds.to_cas(a.best_glide_speed)
    v_ias, e2 = speeds.to_ias(a.best_glide_speed)
    v_cas, v_ias = float(v_cas) * k, float(v_ias) * k  # one angle of attack: best glide scales with sqrt(W / Wr)
    ratio = a.glide_ratio if a.glide_ratio is not None else float(glide.glide_ratio_from_sink(v_cas / k,
                                                                                             a.best_glide_sink))
    v_tas = float(tas(v_cas))
    turning = bank[bank > 0]
    headings = np.radians(np.asarray(card.turn_back_deg, dtype=float))
    speed = glide.turn_speed(v_ias, turning)
    return TurnBackResult(
        best_glide_speed=v_ias,
        best_glide_tas=v_tas,
        glide_ratio=float(ratio),
        headings=headings,
        reaction_time=card.reaction_time,
        reaction_height_loss=float(glide.straight_height_loss(v_tas, ratio, card.reaction_time)),
        bank=turning,
        speed=speed,
        margin=speed - turns.stall_speed_in_bank(clean.level_stall_speed, turning),
        height_loss=glide.turn_height_loss(v_tas, ratio, turning[:, None], headings[None, :]),
        extrapolated=bool(e1 | e2),
        configuration=index,
    )


def _glider(profile: Profile, bank, tas) -> GliderResult:
    polar = profile.glider
    speeds = Airspeeds(profile.aircraft.calibration, profile.aircraft.speed_basis)
    polar_cas, _ = speeds.to_cas(polar.speeds)
    v_ms, s_ms = glider.polar_minimum(glider.fit_polar(polar_cas, polar.sinks))
    kb = float(glider.ballast_factor(profile.weight, polar.weight))
    v_cas, sink_eas = glider.circling(v_ms * kb, s_ms * kb, bank)
    # the polar's sink is measured at sea-level density; at altitude speed and sink scale alike by TAS / EAS
    straight_tas = float(tas(v_ms * kb))
    density_ratio = straight_tas / (v_ms * kb) if v_ms > 0 else float("nan")
    sink = sink_eas * density_ratio
    turn_tas = tas(v_cas)
    with np.errstate(over="ignore"):  # a bank too small to turn has an infinite radius and time, as 0 does
        time_180, time_360 = turns.turn_time(turn_tas, bank, np.pi), turns.turn_time(turn_tas, bank, 2 * np.pi)
        radius = turns.turn_radius(turn_tas, bank)
    straight_ias, _ = speeds.cas_to_ias(v_ms * kb)
    circling_ias = float(straight_ias) * np.sqrt(turns.load_factor(bank))  # one angle of attack: IAS as CAS
    return GliderResult(
        min_sink_speed=float(straight_ias),
        min_sink_cas=v_ms * kb,
        min_sink_rate=s_ms * kb * density_ratio,
        polar_minimum_cas=v_ms,
        bank=bank,
        speed=circling_ias,
        sink_rate=sink,
        turn_radius=radius,
        circle_time=time_360,
        height_loss_180=sink * time_180,
        polar_extrapolated=not (np.isfinite(v_ms) and polar_cas.min() <= v_ms <= polar_cas.max()),
    )
