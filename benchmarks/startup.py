"""Start-up: the `kneeboard` process from its start to the main window shown on the sample fleet."""

import os
import re
import subprocess
import sys
import tempfile
import time

from benchmarks.stats import summary


def run(smoke: bool = False) -> dict:
    repeats = 1 if smoke else 7
    seconds, peaks = [], []
    with tempfile.TemporaryDirectory() as tmp:
        env = dict(os.environ, QT_QPA_PLATFORM="offscreen", KNEEBOARD_STARTUP_PROBE="1",
                   XDG_CONFIG_HOME=tmp, XDG_DATA_HOME=tmp, HOME=tmp)
        for _ in range(repeats):
            t = time.perf_counter()
            proc = subprocess.run([sys.executable, "-m", "kneeboard", "sample_aircraft"], env=env,
                                  capture_output=True, text=True, cwd=os.path.dirname(os.path.dirname(__file__)))
            elapsed = time.perf_counter() - t
            found = re.search(r"shown after ([\d.]+) s, peak (\d+) KiB", proc.stderr)
            if proc.returncode != 0 or not found:
                raise RuntimeError(f"start-up probe failed: {proc.stderr[-500:]}")
            seconds.append(elapsed)
            peaks.append(int(found.group(2)) / 1024)
    return {"start-up": summary(seconds, "s"), "start-up peak memory": summary(peaks, "MB")}
