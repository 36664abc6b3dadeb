"""The benchmark runs in a tiny smoke mode and reports every figure; speed itself is never asserted here."""

import json
import math
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
FIGURES = {"preview latency", "one card", "card floor (reportlab)", "card / floor", "fleet of 6",
           "fleet of 6 peak memory", "start-up", "start-up peak memory"}


def test_benchmark_smoke_reports_every_figure(tmp_path):
    out = tmp_path / "bench.json"
    proc = subprocess.run([sys.executable, "-m", "benchmarks", "--smoke", "--json", str(out)], cwd=ROOT,
                          capture_output=True, text=True, timeout=600)
    assert proc.returncode == 0, proc.stderr[-2000:]
    data = json.loads(out.read_text())
    assert set(data["figures"]) == FIGURES
    for name, figure in data["figures"].items():
        values = [figure[k] for k in ("p50", "p95", "value") if k in figure]
        assert values and all(math.isfinite(v) and v > 0 for v in values), name
        assert name in proc.stdout
    assert {"cpu", "cores", "python"} <= set(data["machine"])
