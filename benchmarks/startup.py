"""Start-up: the app's whole process, from its start to its window shown on the sample fleet and quit, beside a bare
PySide6 process that shows an empty window of the same size."""

import re
import sys

from benchmarks.process import checked
from benchmarks.stats import figure, ratios_of, summary

APP = [sys.executable, "-m", "kneeboard", "sample_aircraft"]
FLOOR = [sys.executable, "-m", "benchmarks.floors.bare_window"]
FLOOR_IS = "a bare PySide6 process showing an empty 1400 x 900 QMainWindow, quitting after its first frame"
PROBE = re.compile(r"shown after ([\d.]+) s, peak (\d+) KiB")


def run(smoke: bool = False, env: dict | None = None, work=None) -> dict:
    repeats = 1 if smoke else 15
    env = dict(env or {}, KNEEBOARD_STARTUP_PROBE="1")

    def app():
        result = checked(APP, "the app's start-up probe", env, timeout=120)
        found = PROBE.search(result.stderr)
        if not found:
            raise RuntimeError(f"the app did not report its window shown: {result.stderr[-800:]}")
        return result, float(found.group(1))

    def floor():
        return checked(FLOOR, "the bare window", env, timeout=120)

    app(), floor()  # the warm-up: the file cache, the font cache, Python's bytecode
    a, b, shown = [], [], []
    for _ in range(repeats):
        result, seconds = app()
        a.append(result)
        shown.append(seconds)
        b.append(floor())
    seconds, floor_seconds = [r.seconds for r in a], [r.seconds for r in b]
    return {"start-up": figure(summary(seconds, "s"), summary(floor_seconds, "s"), ratios_of(seconds, floor_seconds),
                               FLOOR_IS, {"ratio p50": 2.5}, smoke,
                               what="python -m kneeboard sample_aircraft to its window shown, then quit; whole process",
                               shown=summary(shown, "s"), peak=summary([r.peak_mb for r in a], "MB"),
                               floor_peak=summary([r.peak_mb for r in b], "MB"))}
