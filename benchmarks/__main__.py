"""`python -m benchmarks [--smoke] [--json PATH]`: every figure as median and 95th percentile, and as JSON."""

import argparse
import json
import os
import platform
import sys
import time
from pathlib import Path

from benchmarks import card, fleet, preview, startup

DEFAULT_JSON = Path(__file__).resolve().parent / "results.json"


def machine() -> dict:
    cpu = platform.processor() or platform.machine()
    try:
        for line in Path("/proc/cpuinfo").read_text().splitlines():
            if line.startswith("model name"):
                cpu = line.split(":", 1)[1].strip()
                break
    except OSError:
        pass
    return {"cpu": cpu, "cores": os.cpu_count(), "python": platform.python_version(), "system": platform.system(),
            "date": time.strftime("%Y-%m-%d")}


def main(argv=None) -> int:
    p = argparse.ArgumentParser(prog="python -m benchmarks", description=__doc__)
    p.add_argument("--smoke", action="store_true", help="a tiny run that only proves every figure can be taken")
    p.add_argument("--json", type=Path, default=DEFAULT_JSON, help=f"where to write the figures ({DEFAULT_JSON})")
    args = p.parse_args(argv)
    figures = {}
    for module in (preview, card, fleet, startup):
        results = module.run(smoke=args.smoke)
        figures.update(results)
        for key, value in results.items():
            print(f"{key:<24} {describe(value)}", flush=True)
    data = {"machine": machine(), "smoke": args.smoke, "figures": figures}
    args.json.write_text(json.dumps(data, indent=2) + "\n")
    print(f"written to {args.json}")
    return 0


def describe(value: dict) -> str:
    unit = value["unit"]
    if "p50" in value:
        return f"p50 {value['p50']:.3g} {unit}   p95 {value['p95']:.3g} {unit}   (n={value['n']})"
    return f"{value['value']:.3g} {unit}"


if __name__ == "__main__":
    sys.exit(main())
