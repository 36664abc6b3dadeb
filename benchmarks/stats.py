"""Figures beside their floors: measured A B A B, so the machine's drift falls on both and cancels in the ratio."""

import math
import statistics
from collections.abc import Callable


def percentile(samples: list[float], q: float) -> float:
    """The `q` quantile (0..1) of `samples`, nearest rank (no interpolation between runs)."""
    ordered = sorted(samples)
    return ordered[min(len(ordered) - 1, round(q * (len(ordered) - 1)))]


def summary(samples: list[float], unit: str) -> dict:
    return {"p50": statistics.median(samples), "p95": percentile(samples, 0.95), "n": len(samples), "unit": unit}


def interleaved(measure: Callable[[], float], floor: Callable[[], float], repeats: int) -> tuple[list, list]:
    """`repeats` pairs, the figure then its floor each time (A B A B ...): each callable returns one sample."""
    ours, theirs = [], []
    for _ in range(repeats):
        ours.append(measure())
        theirs.append(floor())
    return ours, theirs


def figure(measured: dict, floor: dict, ratios: list[float], floor_is: str, targets: dict[str, float],
           smoke: bool, **extra) -> dict:
    """One reported figure: what was measured, its floor, the pair-by-pair ratios, and whether the targets hold.

    `targets` maps "ratio p50", "ratio p95" or "measured p50" to the most it may be; in smoke mode the sizes are
    too small to mean anything, so nothing is judged (`met` is None).
    """
    ratio = {"p50": statistics.median(ratios), "p95": percentile(ratios, 0.95), "n": len(ratios), "unit": "x"}
    values = {"ratio p50": ratio["p50"], "ratio p95": ratio["p95"], "measured p50": measured["p50"],
              "measured p95": measured["p95"]}
    met = None if smoke else all(values[key] <= limit for key, limit in targets.items())
    return {"measured": measured, "floor": dict(floor, what=floor_is), "ratio": ratio, "targets": targets,
            "met": met, **extra}


def ratios_of(ours: list[float], theirs: list[float]) -> list[float]:
    """Each run over the floor run paired with it."""
    return [a / b for a, b in zip(ours, theirs, strict=True) if b > 0 and math.isfinite(a / b)]
