"""kneeboard's benchmark: preview latency, one card against the bare-reportlab floor, a fleet, start-up."""
