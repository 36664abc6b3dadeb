"""Apply the flight-mechanics core to a profile: every figure a card or table needs, in SI floats.

Physics works in calibrated airspeed (CAS); the pilot reads indicated airspeed (IAS). Speeds of
the profile are converted to CAS through the configuration's calibration table (or the
aircraft's), scaled, and converted back to IAS for display. Without a table IAS is taken equal
to CAS. Nothing here is rounded: rounding for print happens once, in `kneeboard.tables`.
"""

from dataclasses import dataclass

import numpy as np

from kneeboard.aero import airspeed, atmosphere, glider, limits, turns
from kneeboard.profile import Calibration, Configuration, Profile

#: Banks of the chart's curves [deg]: 1 degree steps, a smooth curve at card size. They are evaluated in the same
#: vectorised call as the card's own banks, so a card computes its physics once.
CURVE_BANKS_DEG = np.arange(0.0, 86.0, 1.0)


@dataclass(frozen=True)
class Airspeeds:
    """Converts between the profile's speed basis, CAS and IAS for one calibration table."""

    calibration: Calibration | None
    basis: str  #: "IAS" or "CAS": how the profile's speeds are written

    def to_cas(self, v):
        """CAS [m/s] of speeds written in the profile's basis; returns (cas, extrapolated)."""
        v = np.asarray(v, dtype=float)
        if self.basis == "CAS" or self.calibration is None:
            return v, np.zeros(v.shape, dtype=bool)
        return airspeed.ias_to_cas(v, self.calibration.ias, self.calibration.cas)

    def ias_to_cas(self, ias):
        ias = np.asarray(ias, dtype=float)
        if self.calibration is None:
            return ias, np.zeros(ias.shape, dtype=bool)
        return airspeed.ias_to_cas(ias, self.calibration.ias, self.calibration.cas)

    def to_ias(self, cas):
        """IAS [m/s] of calibrated airspeeds; returns (ias, extrapolated)."""
        cas = np.asarray(cas, dtype=float)
        if self.calibration is None:
            return cas, np.zeros(cas.shape, dtype=bool)
        return airspeed.cas_to_ias(cas, self.calibration.ias, self.calibration.cas)


@dataclass(frozen=True)
class ConfigurationResult:
    """One configuration at the card weight; arrays run over the bank angles. Speeds IAS [m/s]."""

    name: str
    bank: np.ndarray  #: [rad]
    load_factor: np.ndarray  #: [-]
    stall_speed: np.ndarray  #: IAS in each bank [m/s]
    stall_extrapolated: np.ndarray  #: True where the calibration table had to be extrapolated
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
    curve_stall_speed: np.ndarray  #: IAS at each of CURVE_BANKS_DEG [m/s], for the chart


@dataclass(frozen=True)
class GliderResult:
    """Circling at minimum-sink angle of attack at the card weight; arrays run over the bank angles."""

    min_sink_speed: float  #: IAS, straight flight, at card weight [m/s]
    min_sink_rate: float  #: true sink rate, straight flight [m/s]
    bank: np.ndarray  #: [rad]
    speed: np.ndarray  #: IAS in the turn [m/s]
    sink_rate: np.ndarray  #: true sink rate [m/s]
    turn_radius: np.ndarray  #: [m]; inf at 0 bank
    circle_time: np.ndarray  #: time for a full circle [s]; inf at 0 bank
    height_loss_180: np.ndarray  #: height lost turning back through 180 degrees [m]; inf at 0 bank


@dataclass(frozen=True)
class Results:
    weight: float  #: the card weight [kg]
    reference_weight: float  #: [kg]
    max_weight: float  #: [kg]
    limit_load_factor: float  #: [-]
    limit_bank: float  #: [rad]
    maneuvering_speed: float | None  #: VA IAS at card weight [m/s]
    pressure_altitude: float  #: [m]
    temperature: float  #: [K]
    density: float  #: [kg/m^3]
    density_altitude: float  #: [m]
    configurations: tuple[ConfigurationResult, ...]
    glider: GliderResult | None
    curve_bank_deg: np.ndarray  #: banks of each configuration's curve_stall_speed [deg]

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
    temperature = (
        float(atmosphere.isa_temperature(card.pressure_altitude)) if card.temperature is None else card.temperature
    )
    rho = float(atmosphere.air_density(card.pressure_altitude, temperature))
    n_limit = limit_load_factor(a)
    configs = tuple(_configuration(profile, c, bank, curve, k, rho) for c in profile.configurations)
    va = None
    if a.maneuvering_speed is not None:
        clean = Airspeeds(a.calibration, a.speed_basis)
        va_cas = limits.maneuvering_speed_at_weight(clean.to_cas(a.maneuvering_speed)[0], profile.weight,
                                                    a.reference_weight)
        va = float(clean.to_ias(va_cas)[0])
    return Results(
        weight=profile.weight,
        reference_weight=a.reference_weight,
        max_weight=a.max_weight,
        limit_load_factor=n_limit,
        limit_bank=float(turns.limit_bank(n_limit)),
        maneuvering_speed=va,
        pressure_altitude=card.pressure_altitude,
        temperature=temperature,
        density=rho,
        density_altitude=float(atmosphere.density_altitude(rho)),
        configurations=configs,
        glider=None if profile.glider is None else _glider(profile, bank, rho),
        curve_bank_deg=CURVE_BANKS_DEG,
    )


def limit_load_factor(aircraft) -> float:
    """The aircraft's positive limit load factor [-]: the profile's, or the category's by the regulation."""
    if aircraft.limit_load_factor is not None:
        return aircraft.limit_load_factor
    return limits.default_limit_load(aircraft.category, aircraft.max_weight)


def _configuration(profile: Profile, c: Configuration, bank, curve, k: float, rho: float) -> ConfigurationResult:
    speeds = Airspeeds(profile.calibration_for(c), profile.aircraft.speed_basis)
    vs_ref_cas, _ = speeds.to_cas(c.stall_speed)
    vs0_cas = float(vs_ref_cas) * k
    # the card's banks and the chart's curve in one vectorised evaluation
    stall_cas = turns.stall_speed_in_bank(vs0_cas, np.concatenate([bank, curve]))
    all_ias, all_extrapolated = speeds.to_ias(stall_cas)
    stall_ias, extrapolated, curve_ias = all_ias[:bank.size], all_extrapolated[:bank.size], all_ias[bank.size:]
    if c.pattern_speed is not None:
        vp_cas = float(speeds.to_cas(c.pattern_speed)[0])
    else:
        vp_cas = c.pattern_factor * vs0_cas
    vp_ias = float(speeds.to_ias(vp_cas)[0])
    vs0_ias = float(speeds.to_ias(vs0_cas)[0])
    buffer_ias = vp_ias - profile.card.buffer
    buffer_bank = None
    if buffer_ias >= vs0_ias:
        buffer_bank = float(turns.bank_at_stall_speed(vs0_cas, speeds.ias_to_cas(buffer_ias)[0]))
    tas = float(atmosphere.tas_from_cas(vp_cas, rho))
    with np.errstate(over="ignore"):  # a bank too small to turn has an infinite radius and time, as 0 does
        radius, rate = turns.turn_radius(tas, bank), turns.turn_rate(tas, bank)
        time_180, time_360 = turns.turn_time(tas, bank, np.pi), turns.turn_time(tas, bank, 2 * np.pi)
    vfe = None
    if c.flap_limit_speed is not None:
        vfe = float(speeds.to_ias(speeds.to_cas(c.flap_limit_speed)[0])[0])
    return ConfigurationResult(
        name=c.name,
        bank=bank,
        load_factor=turns.load_factor(bank),
        stall_speed=stall_ias,
        stall_extrapolated=extrapolated,
        pattern_speed=vp_ias,
        margin=vp_ias - stall_ias,
        zero_margin_bank=float(turns.bank_at_stall_speed(vs0_cas, vp_cas)),
        buffer_bank=buffer_bank,
        flap_limit_speed=vfe,
        pattern_tas=tas,
        turn_radius=radius,
        turn_rate=rate,
        time_180=time_180,
        time_360=time_360,
        level_stall_speed=vs0_ias,
        curve_stall_speed=curve_ias,
    )


def _glider(profile: Profile, bank, rho: float) -> GliderResult:
    polar = profile.glider
    speeds = Airspeeds(profile.aircraft.calibration, profile.aircraft.speed_basis)
    polar_cas, _ = speeds.to_cas(polar.speeds)
    v_ms, s_ms = glider.polar_minimum(glider.fit_polar(polar_cas, polar.sinks))
    kb = float(glider.ballast_factor(profile.weight, polar.weight))
    density_ratio = float(np.sqrt(atmosphere.RHO0 / rho))
    v_cas, sink_eas = glider.circling(v_ms * kb, s_ms * kb, bank)
    sink = sink_eas * density_ratio
    tas = atmosphere.tas_from_cas(v_cas, rho)
    with np.errstate(over="ignore"):  # a bank too small to turn has an infinite radius and time, as 0 does
        time_180, time_360 = turns.turn_time(tas, bank, np.pi), turns.turn_time(tas, bank, 2 * np.pi)
        radius = turns.turn_radius(tas, bank)
    return GliderResult(
        min_sink_speed=float(speeds.to_ias(v_ms * kb)[0]),
        min_sink_rate=s_ms * kb * density_ratio,
        bank=bank,
        speed=speeds.to_ias(v_cas)[0],
        sink_rate=sink,
        turn_radius=radius,
        circle_time=time_360,
        height_loss_180=sink * time_180,
    )
