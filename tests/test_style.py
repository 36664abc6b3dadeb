"""The code stays ruff clean (STYLE: `ruff` clean), checked in the suite so CI catches it."""

import shutil
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent


def test_ruff_clean():
    ruff = shutil.which("ruff", path=str(Path(sys.executable).parent)) or shutil.which("ruff")
    assert ruff, "ruff is a test dependency; install the test extra"
    proc = subprocess.run([ruff, "check", "kneeboard", "tests", "benchmarks", "packaging"], cwd=ROOT,
                          capture_output=True, text=True)
    assert proc.returncode == 0, proc.stdout


def test_modules_stay_small():
    # STYLE.md: a module past ~500 lines is two ideas.
    long = {p.name: n for p in (ROOT / "kneeboard").rglob("*.py") if (n := len(p.read_text().splitlines())) > 500}
    assert not long, long
