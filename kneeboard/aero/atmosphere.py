"""The ICAO standard atmosphere below the tropopause, and the airspeed relations that use it.

Source: ICAO Doc 7488 (Manual of the ICAO Standard Atmosphere), identical below 32 km to the
U.S. Standard Atmosphere 1976. Only the troposphere (geopotential altitude below 11 km,
36,089 ft) is modelled: cockpit cards for light aircraft and gliders never need more.
"""

import numpy as np

G0 = 9.80665  #: standard gravity [m/s^2]
T0 = 288.15  #: sea-level standard temperature [K]
P0 = 101_325.0  #: sea-level standard pressure [Pa]
LAPSE = 0.0065  #: tropospheric temperature lapse rate [K/m]
R_AIR = 287.052_87  #: specific gas constant of dry air [J/(kg K)]
RHO0 = P0 / (R_AIR * T0)  #: sea-level standard density, 1.225 [kg/m^3]
TROPOPAUSE = 11_000.0  #: top of the modelled atmosphere [m]

# Exponent of the pressure law p = P0 (T/T0)^(g/(L R)).
_PRESSURE_EXP = G0 / (LAPSE * R_AIR)


def isa_temperature(h):
    """Standard temperature at pressure altitude `h` [m] -> [K]."""
    return T0 - LAPSE * np.asarray(h, dtype=float)


def isa_pressure(h):
    """Static pressure at pressure altitude `h` [m] -> [Pa].

    By definition a pressure altitude is the standard-atmosphere altitude of that pressure,
    so this is the standard pressure whatever the actual temperature.
    """
    return P0 * (isa_temperature(h) / T0) ** _PRESSURE_EXP


def air_density(h, temperature=None):
    """Density at pressure altitude `h` [m] and outside air temperature [K] -> [kg/m^3].

    Ideal gas, rho = p / (R T). Without a temperature the standard temperature is used,
    which gives the standard density.
    """
    t = isa_temperature(h) if temperature is None else np.asarray(temperature, dtype=float)
    return isa_pressure(h) / (R_AIR * t)


def density_altitude(rho):
    """Standard-atmosphere altitude with density `rho` [kg/m^3] -> [m].

    Inverse of the standard density law rho/rho0 = (T/T0)^(g/(L R) - 1).
    """
    ratio = np.asarray(rho, dtype=float) / RHO0
    return T0 / LAPSE * (1.0 - ratio ** (1.0 / (_PRESSURE_EXP - 1.0)))


def tas_from_cas(cas, rho):
    """True airspeed from calibrated airspeed `cas` [m/s] at density `rho` [kg/m^3] -> [m/s].

    The incompressible relation TAS = CAS sqrt(rho0 / rho); at the speeds of a traffic
    pattern (Mach < 0.3) compressibility changes it by well under 1 %.
    """
    return np.asarray(cas, dtype=float) * np.sqrt(RHO0 / np.asarray(rho, dtype=float))
