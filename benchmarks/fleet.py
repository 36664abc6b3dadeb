"""A fleet: generated profiles exported imposed on Letter sheets by the command line, as a whole process."""

import re
import subprocess
import sys
import tempfile
import time
from pathlib import Path

from benchmarks.stats import summary

SAMPLES = Path(__file__).resolve().parents[1] / "sample_aircraft"
POWERED = ("demo_trainer", "demo_tourer", "demo_retractable", "demo_microlight")
# The child measures its own peak resident memory (ru_maxrss is in KiB on Linux) as it ends.
CHILD = ("import resource, sys; from kneeboard.cli import main; rc = main(sys.argv[1:]); "
         "print('peak_kib', resource.getrusage(resource.RUSAGE_SELF).ru_maxrss, file=sys.stderr); sys.exit(rc)")


def generate(folder: Path, count: int) -> None:
    """`count` invented profiles: the powered samples with new registrations and shifted stall speeds."""
    texts = [(SAMPLES / f"{name}.toml").read_text() for name in POWERED]
    for i in range(count):
        text = texts[i % len(texts)]
        text = re.sub(r'registration = "[^"]+"', f'registration = "GEN-{i:03d}"', text)
        shift = i % 5
        text = re.sub(r'stall_speed = "(\d+) kt"', lambda m, k=shift: f'stall_speed = "{int(m.group(1)) + k} kt"', text)
        (folder / f"gen_{i:03d}.toml").write_text(text)


def run(smoke: bool = False) -> dict:
    count, repeats = (6, 1) if smoke else (200, 3)
    seconds, peaks = [], []
    with tempfile.TemporaryDirectory() as tmp:
        folder = Path(tmp) / "fleet"
        folder.mkdir()
        generate(folder, count)
        for _ in range(repeats):
            t = time.perf_counter()
            proc = subprocess.run([sys.executable, "-c", CHILD, "card", str(folder), "-o", str(Path(tmp) / "f.pdf"),
                                   "--sheet", "letter"], capture_output=True, text=True)
            seconds.append(time.perf_counter() - t)
            if proc.returncode != 0:
                raise RuntimeError(f"fleet export failed: {proc.stderr[-500:]}")
            peaks.append(int(re.search(r"peak_kib (\d+)", proc.stderr).group(1)) / 1024)
    return {f"fleet of {count}": summary(seconds, "s"), f"fleet of {count} peak memory": summary(peaks, "MB")}
