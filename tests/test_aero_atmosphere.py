"""Standard atmosphere and airspeeds against reference libraries (`ambiance`: ICAO 1993; `flightcondition`:
compressible airspeed conversions) and published ratios."""

import numpy as np
import pytest
from ambiance import Atmosphere
from flightcondition import FlightCondition, unit

from kneeboard.aero import atmosphere as isa

FT = 0.3048
KT = 1852.0 / 3600.0
EARTH_RADIUS = 6_356_766.0  #: of the 1976 standard atmosphere's geopotential [m]


def geometric(h_geopotential):
    """The geometric height of a geopotential altitude (U.S. Standard Atmosphere 1976, eq. 18)."""
    return EARTH_RADIUS * h_geopotential / (EARTH_RADIUS - h_geopotential)


@pytest.mark.parametrize("h", [-500.0, 0.0, 500.0, 1524.0, 3048.0, 6000.0, 10_999.0, 11_000.0, 13_000.0, 19_900.0])
def test_matches_ambiance_icao_1993(h):
    # ambiance (PyPI) implements the ICAO standard atmosphere 1993 (= U.S. Standard Atmosphere 1976 below 32 km).
    # It takes geometric height; a pressure altitude is geopotential, so convert first.
    ref = Atmosphere(Atmosphere.geop2geom_height(h))
    assert isa.isa_temperature(h) == pytest.approx(ref.temperature[0], rel=1e-6)
    assert isa.isa_pressure(h) == pytest.approx(ref.pressure[0], rel=1e-4)
    assert isa.air_density(h) == pytest.approx(ref.density[0], rel=1e-4)


def test_sea_level_constants():
    # ICAO Doc 7488 / U.S. Standard Atmosphere 1976: 288.15 K, 101 325 Pa, 1.225 kg/m3.
    assert pytest.approx(1.225, abs=5e-4) == isa.RHO0
    assert isa.air_density(0.0) == pytest.approx(1.225, abs=5e-4)


@pytest.mark.parametrize("alt_ft, ratio", [(5000, 0.8617), (10_000, 0.7385)])
def test_density_ratios(alt_ft, ratio):
    # U.S. Standard Atmosphere 1976: density ratio 0.8617 at 5,000 ft, 0.7385 at 10,000 ft (computed).
    assert isa.air_density(alt_ft * FT) / isa.RHO0 == pytest.approx(ratio, abs=2e-4)


@pytest.mark.parametrize("h", [0.0, 1000.0, 3000.0, 9000.0, 11_000.0, 12_000.0, 15_000.0, 19_000.0])
def test_density_altitude_is_the_altitude_of_that_density_in_ambiance(h):
    # ambiance's ICAO 1993 density at a geopotential altitude, read back as a density altitude: both layers.
    rho = Atmosphere(Atmosphere.geop2geom_height(h)).density[0]
    assert isa.density_altitude(rho) == pytest.approx(h, abs=0.5)


def test_density_altitude_above_the_tropopause():
    # 36,000 ft at -30 degC: the density of about 38,400 ft in the standard atmosphere (ambiance: the density is
    # found between 38,350 and 38,450 ft), not the 38,907 ft the troposphere's law would give.
    rho = isa.air_density(36_000 * FT, 273.15 - 30)
    lo, hi = (Atmosphere(Atmosphere.geop2geom_height(h * FT)).density[0] for h in (38_350, 38_450))
    assert hi < rho < lo
    assert isa.density_altitude(rho) / FT == pytest.approx(38_400, abs=50)


def test_density_altitude_about_120_ft_per_degree():
    # Common practice: about 120 ft of density altitude per degC above standard (118.6 linearised).
    h = 2000 * FT
    t_std = float(isa.isa_temperature(h))
    per_degree = (isa.density_altitude(isa.air_density(h, t_std + 10)) - h) / 10 / FT
    assert per_degree == pytest.approx(120, abs=8)


def test_hot_high_field():
    # Rule of thumb from a pilots' association safety page: a 5,000 ft field at 30 degC is about
    # 8,000 ft density altitude.
    da_ft = isa.density_altitude(isa.air_density(5000 * FT, 273.15 + 30)) / FT
    assert da_ft == pytest.approx(8000, abs=300)


@pytest.mark.parametrize("cas_kt", [40, 100, 160, 250])
@pytest.mark.parametrize("h_ft, dt", [(-1000, 10), (0, 0), (5000, 20), (20_000, -15), (36_000, 5)])
def test_tas_from_cas_matches_flightcondition(cas_kt, h_ft, dt):
    # flightcondition (PyPI) converts CAS to TAS through the same compressible relations; it takes a geometric
    # height and the standard temperature, so compare at standard temperature and scale ours by sqrt(T) for dt.
    h = h_ft * FT
    ref = FlightCondition(h=geometric(h) * unit("m"), CAS=cas_kt * unit("knots")).TAS.to("m/s").magnitude
    assert isa.tas_from_cas(cas_kt * KT, h) == pytest.approx(ref, rel=1e-6)
    t_std = float(isa.isa_temperature(h))
    warm = isa.tas_from_cas(cas_kt * KT, h, t_std + dt)
    assert warm == pytest.approx(ref * np.sqrt((t_std + dt) / t_std), rel=1e-6)  # a = sqrt(gamma R T)


def test_incompressible_relation_would_overstate_tas_at_altitude():
    # 150 KCAS at 35,000 ft: compressible 264 KTAS (flightcondition: 264.2), CAS sqrt(rho0/rho) gives 269.5: +2 %.
    tas = isa.tas_from_cas(150 * KT, 35_000 * FT) / KT
    incompressible = 150 * np.sqrt(isa.RHO0 / isa.air_density(35_000 * FT))
    assert tas == pytest.approx(264.2, abs=0.1)
    assert incompressible / tas - 1 == pytest.approx(0.02, abs=0.003)
