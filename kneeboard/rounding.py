"""Conservative rounding: every printed figure is rounded toward safety, once, here.

Stall speeds, turn radii, times and heights round up; margins, banks and limit speeds round
down. Values are first snapped to 9 decimals of the step so that binary noise (60.000000000001)
does not push an exact figure to the next step; the snap moves a value by at most 1e-9 of a step.
"""

import math

_SNAP = 9


def up(x: float, step: float = 1.0) -> float:
    """Smallest multiple of `step` at or above `x`."""
    return math.ceil(round(x / step, _SNAP)) * step


def down(x: float, step: float = 1.0) -> float:
    """Largest multiple of `step` at or below `x`."""
    return math.floor(round(x / step, _SNAP)) * step


def nearest(x: float, step: float = 1.0) -> float:
    """Plain rounding, for data that is not a safety figure (a reference weight, say)."""
    return round(x / step) * step


def text(x: float, step: float) -> str:
    """A rounded figure as printed: no decimals for whole steps, else as many as the step has."""
    decimals = max(0, -math.floor(math.log10(step) + 1e-12)) if step < 1 else 0
    return f"{x:.{decimals}f}"
