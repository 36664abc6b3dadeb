"""Median and 95th percentile of repeated measurements."""

import statistics


def summary(samples: list[float], unit: str) -> dict:
    ordered = sorted(samples)
    p95 = ordered[min(len(ordered) - 1, round(0.95 * (len(ordered) - 1)))]
    return {"p50": statistics.median(ordered), "p95": p95, "n": len(ordered), "unit": unit}
