"""Standard atmosphere against the reference library `ambiance` (ICAO 1993) and published ratios."""

import math

import pytest
from ambiance import Atmosphere

from kneeboard.aero import atmosphere as isa

FT = 0.3048


@pytest.mark.parametrize("h", [-500.0, 0.0, 500.0, 1524.0, 3048.0, 6000.0, 10_999.0])
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


def test_density_altitude_of_standard_day_is_pressure_altitude():
    for h in (0.0, 1000.0, 3000.0):
        assert isa.density_altitude(isa.air_density(h)) == pytest.approx(h, abs=1e-6)


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


def test_tas_from_cas():
    # TAS = CAS sqrt(rho0 / rho) (FAA-H-8083-25, incompressible); at 10,000 ft density ratio 0.7385.
    rho = isa.air_density(10_000 * FT)
    assert isa.tas_from_cas(100.0, rho) == pytest.approx(100 / math.sqrt(0.7385), rel=2e-4)
