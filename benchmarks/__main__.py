"""`python -m benchmarks [--smoke] [--only NAME ...] [--json PATH]`: every figure beside its floor, as JSON.

Absolute times on shared machines swing threefold from run to run; a figure's ratio to a floor measured beside it,
A B A B in the same run, holds. Each figure is printed with its floor, the ratio's median and 95th percentile (pair
by pair) and whether its target is met.
"""

import argparse
import json
import os
import platform
import sys
import tempfile
import time
from pathlib import Path

from benchmarks import card, fleet, preview, process, startup

DEFAULT_JSON = Path(__file__).resolve().parent / "results.json"
MODULES = {"start-up": startup, "card": card, "preview": preview, "fleet": fleet}


def machine() -> dict:
    cpu = platform.processor() or platform.machine()
    memory = None
    try:
        for line in Path("/proc/cpuinfo").read_text().splitlines():
            if line.startswith("model name"):
                cpu = line.split(":", 1)[1].strip()
                break
        memory = round(os.sysconf("SC_PAGE_SIZE") * os.sysconf("SC_PHYS_PAGES") / 2**30, 1)
    except (OSError, ValueError):
        pass
    return {"cpu": cpu, "cores": len(os.sched_getaffinity(0)) if hasattr(os, "sched_getaffinity") else os.cpu_count(),
            "memory GiB": memory, "python": platform.python_version(), "system": platform.system(),
            "date": time.strftime("%Y-%m-%d %H:%M UTC", time.gmtime())}


def child_env(home: Path) -> dict:
    """The environment of every measured process: offscreen Qt, and settings and caches of its own."""
    return dict(os.environ, QT_QPA_PLATFORM="offscreen", HOME=str(home), XDG_CONFIG_HOME=str(home / "config"),
                XDG_DATA_HOME=str(home / "data"), XDG_CACHE_HOME=str(home / "cache"))


def main(argv=None) -> int:
    p = argparse.ArgumentParser(prog="python -m benchmarks", description=__doc__,
                                formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("--smoke", action="store_true", help="tiny sizes that only prove every figure can be taken")
    p.add_argument("--only", nargs="+", choices=tuple(MODULES), help="take only these figures")
    p.add_argument("--json", type=Path, default=DEFAULT_JSON, help=f"where to write the figures ({DEFAULT_JSON})")
    args = p.parse_args(argv)
    figures = {}
    started = time.perf_counter()
    process.start_launcher()  # while this process is small: see benchmarks.process
    with tempfile.TemporaryDirectory(prefix="kneeboard-bench-") as tmp:
        work = Path(tmp)
        env = child_env(work / "home")
        for name in args.only or MODULES:
            results = MODULES[name].run(smoke=args.smoke, env=env, work=work)
            figures.update(results)
            for key, value in results.items():
                print(describe(key, value), flush=True)
    process.stop_launcher()
    data = {"machine": machine(), "smoke": args.smoke, "seconds": round(time.perf_counter() - started, 1),
            "figures": figures}
    args.json.write_text(json.dumps(data, indent=2) + "\n")
    print(f"written to {args.json}")
    return 0


def describe(name: str, value: dict) -> str:
    m, f, r = value["measured"], value["floor"], value["ratio"]
    met = {None: "not judged (smoke)", True: "met", False: "MISSED"}[value["met"]]
    targets = ", ".join(f"{key} <= {limit:g}" for key, limit in value["targets"].items())
    return (f"{name:<24} {m['p50']:.4g} {m['unit']} (p95 {m['p95']:.4g})  floor {f['p50']:.4g} {f['unit']}"
            f"  ratio {r['p50']:.3g} x (p95 {r['p95']:.3g} x, n={r['n']})  target {targets}: {met}"
            + (f"\n{'':<24} renders for {value['unchanged_edits']} edits that print nothing new: "
               f"{value['renders_for_unchanged']} (target 0)" if "unchanged_edits" in value else ""))


if __name__ == "__main__":
    sys.exit(main())
