"""Indicated and calibrated airspeed through a flight manual's calibration table.

The table is a set of (IAS, CAS) pairs, both strictly ascending. Inside the table the
conversion interpolates linearly; outside it, the CAS - IAS offset of the nearest end is held
constant and the value is flagged as extrapolated, because the manual says nothing there.
"""

import numpy as np


def _convert(v, from_speeds, to_speeds):
    v = np.asarray(v, dtype=float)
    x = np.asarray(from_speeds, dtype=float)
    y = np.asarray(to_speeds, dtype=float)
    inside = np.interp(v, x, y)
    below = v + (y[0] - x[0])
    above = v + (y[-1] - x[-1])
    out = np.where(v < x[0], below, np.where(v > x[-1], above, inside))
    extrapolated = (v < x[0]) | (v > x[-1])
    return out, extrapolated


def ias_to_cas(ias, table_ias, table_cas):
    """CAS [m/s] for IAS `ias` [m/s]; returns (cas, extrapolated) with a boolean mask."""
    return _convert(ias, table_ias, table_cas)


def cas_to_ias(cas, table_ias, table_cas):
    """IAS [m/s] for CAS `cas` [m/s]; returns (ias, extrapolated) with a boolean mask."""
    return _convert(cas, table_cas, table_ias)
