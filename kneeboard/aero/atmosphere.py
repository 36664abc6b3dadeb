"""The ICAO standard atmosphere to 20 km, and the airspeed relations that use it.

Source: ICAO Doc 7488 (Manual of the ICAO Standard Atmosphere), identical below 32 km to the U.S. Standard
Atmosphere 1976: a troposphere with a lapse of 6.5 K/km to the tropopause at 11 km geopotential (36,089 ft), then
an isothermal layer at 216.65 K to 20 km. Profiles give pressure altitudes up to the tropopause; a density
altitude may lie above it (a warm day at 36,000 ft), so both layers are modelled.

True airspeed comes from calibrated airspeed through the compressible (subsonic) relations of the standard
atmosphere: CAS gives the impact pressure at sea level, the impact pressure at the actual static pressure gives the
Mach number, the Mach number and the actual temperature give the true airspeed (e.g. the isentropic flow relations
in any aerodynamics text; FAA-H-8083-25, "Airspeed").
"""

import numpy as np

G0 = 9.80665  #: standard gravity [m/s^2]
T0 = 288.15  #: sea-level standard temperature [K]
P0 = 101_325.0  #: sea-level standard pressure [Pa]
LAPSE = 0.0065  #: tropospheric temperature lapse rate [K/m]
R_AIR = 287.052_87  #: specific gas constant of dry air [J/(kg K)]
GAMMA = 1.4  #: ratio of specific heats of air [-]
RHO0 = P0 / (R_AIR * T0)  #: sea-level standard density, 1.225 [kg/m^3]
A0 = float(np.sqrt(GAMMA * R_AIR * T0))  #: sea-level speed of sound, 340.29 [m/s]
TROPOPAUSE = 11_000.0  #: [m] geopotential
TOP = 20_000.0  #: top of the isothermal layer, and of this model [m]

# Exponent of the pressure law p = P0 (T/T0)^(g/(L R)).
_PRESSURE_EXP = G0 / (LAPSE * R_AIR)
T11 = T0 - LAPSE * TROPOPAUSE  #: 216.65 [K]
P11 = P0 * (T11 / T0) ** _PRESSURE_EXP  #: 22 632 [Pa]
RHO11 = P11 / (R_AIR * T11)  #: 0.3639 [kg/m^3]
_SCALE_HEIGHT = R_AIR * T11 / G0  #: of the isothermal layer [m]


def isa_temperature(h):
    """Standard temperature at pressure altitude `h` [m] -> [K]."""
    h = np.asarray(h, dtype=float)
    return np.where(h <= TROPOPAUSE, T0 - LAPSE * h, T11)


def isa_pressure(h):
    """Static pressure at pressure altitude `h` [m] -> [Pa].

    By definition a pressure altitude is the standard-atmosphere altitude of that pressure,
    so this is the standard pressure whatever the actual temperature.
    """
    h = np.asarray(h, dtype=float)
    low = P0 * ((T0 - LAPSE * np.minimum(h, TROPOPAUSE)) / T0) ** _PRESSURE_EXP
    return np.where(h <= TROPOPAUSE, low, P11 * np.exp(-(h - TROPOPAUSE) / _SCALE_HEIGHT))


def air_density(h, temperature=None):
    """Density at pressure altitude `h` [m] and outside air temperature [K] -> [kg/m^3].

    Ideal gas, rho = p / (R T). Without a temperature the standard temperature is used,
    which gives the standard density.
    """
    t = isa_temperature(h) if temperature is None else np.asarray(temperature, dtype=float)
    return isa_pressure(h) / (R_AIR * t)


def density_altitude(rho):
    """Standard-atmosphere altitude with density `rho` [kg/m^3] -> [m], in either layer.

    The troposphere inverts rho/rho0 = (T/T0)^(g/(L R) - 1); above the tropopause density falls exponentially
    with the isothermal layer's scale height.
    """
    rho = np.asarray(rho, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        low = T0 / LAPSE * (1.0 - (rho / RHO0) ** (1.0 / (_PRESSURE_EXP - 1.0)))
        high = TROPOPAUSE + _SCALE_HEIGHT * np.log(RHO11 / rho)
    return np.where(rho >= RHO11, low, high)


def impact_pressure(cas):
    """Impact (pitot minus static) pressure of calibrated airspeed `cas` [m/s] -> [Pa], subsonic.

    CAS is defined by the sea-level standard atmosphere: qc = P0 ((1 + (gamma-1)/2 (CAS/a0)^2)^(gamma/(gamma-1)) - 1).
    """
    cas = np.asarray(cas, dtype=float)
    return P0 * ((1.0 + 0.2 * (cas / A0) ** 2) ** 3.5 - 1.0)


def mach_from_cas(cas, pressure):
    """Mach number at static `pressure` [Pa] of calibrated airspeed `cas` [m/s] -> [-], subsonic."""
    qc = impact_pressure(cas)
    return np.sqrt(5.0 * ((qc / np.asarray(pressure, dtype=float) + 1.0) ** (2.0 / 7.0) - 1.0))


def tas_from_cas(cas, h, temperature=None):
    """True airspeed [m/s] of calibrated airspeed `cas` [m/s] at pressure altitude `h` [m] and outside air
    temperature [K] (default standard), through the compressible relations.

    At the speeds and heights of a traffic pattern this is within a fraction of a percent of the incompressible
    CAS sqrt(rho0 / rho); at 150 kt CAS at 35,000 ft the incompressible form would overstate TAS by 2 %.
    """
    t = isa_temperature(h) if temperature is None else np.asarray(temperature, dtype=float)
    return mach_from_cas(cas, isa_pressure(h)) * np.sqrt(GAMMA * R_AIR * t)
