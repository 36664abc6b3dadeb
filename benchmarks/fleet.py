"""Fleets: generated profiles imposed on Letter sheets by the command line, each run a whole process.

The fleet is measured beside a bare reportlab process that draws as many sheets with as much ink; the large
fleet beside the fleet itself, for how time and memory grow with the number of profiles.
"""

import json
import re
import sys
from pathlib import Path

from benchmarks import ink
from benchmarks.card import MADE_ON, font_files
from benchmarks.process import checked
from benchmarks.stats import figure, ratios_of, summary

SAMPLES = Path(__file__).resolve().parents[1] / "sample_aircraft"
POWERED = ("demo_trainer", "demo_tourer", "demo_retractable", "demo_microlight")
SHEET = "letter"
MEMORY_TARGET_MB = 300
FLOOR_IS = "a bare reportlab process drawing as many Letter sheets, same marks (the first cards' sheets in turn)"


def generate(folder: Path, count: int) -> list[Path]:
    """`count` invented profiles: the powered samples with new registrations and shifted stall speeds."""
    folder.mkdir(parents=True, exist_ok=True)
    texts = [(SAMPLES / f"{name}.toml").read_text() for name in POWERED]
    paths = []
    for i in range(count):
        text = texts[i % len(texts)]
        text = re.sub(r'registration = "[^"]+"', f'registration = "GEN-{i:04d}"', text)
        shift = i % 5
        text = re.sub(r'stall_speed = "(\d+) kt"', lambda m, k=shift: f'stall_speed = "{int(m.group(1)) + k} kt"', text)
        path = folder / f"gen_{i:04d}.toml"
        path.write_text(text)
        paths.append(path)
    return paths


def export_command(folder: Path, out: Path) -> list[str]:
    return [sys.executable, "-m", "kneeboard", "card", str(folder), "-o", str(out), "--sheet", SHEET]


def sheets_written(stdout: str) -> int:
    found = re.search(r"card\(s\) on (\d+) sheets", stdout)
    if not found:
        raise RuntimeError(f"the fleet export did not say how many sheets it wrote: {stdout[-300:]}")
    return int(found.group(1))


def group_ink(paths: list[Path]) -> list[dict]:
    """The sheets of the fleet's first cards, one of each sample (the fleet repeats them in turn), imposed as the
    export imposes them: the floor draws these sheets in turn, so its ink per sheet is the fleet's."""
    from kneeboard.card.sheets import grid_for, impose
    from kneeboard.pipeline import Styles, make_card, prepare_file

    styles = Styles()
    first = make_card(prepare_file(paths[0], styles), made_on=MADE_ON).pages[0]
    per_sheet = grid_for(first.width, first.height, SHEET).per_sheet
    cards = [make_card(prepare_file(path, styles), made_on=MADE_ON).pages for path in paths[:len(POWERED) * per_sheet]]
    sheets = []
    for start in range(0, len(cards), per_sheet):
        sheets += impose(cards[start:start + per_sheet], SHEET)
    return ink.ink_of(sheets)


def run(smoke: bool = False, env: dict | None = None, work: Path | None = None) -> dict:
    small, large = (4, 12) if smoke else (200, 5000)
    repeats, large_repeats = (1, 1) if smoke else (9, 3)
    small_paths = generate(work / "fleet", small)
    generate(work / "large", large)
    spec = work / "ink.json"
    spec.write_text(json.dumps({"fonts": font_files(), "pages": group_ink(small_paths)}))
    out, floor_out = work / "fleet.pdf", work / "floor.pdf"

    def ours():
        return checked(export_command(work / "fleet", out), "the fleet export", env)

    sheets = sheets_written(ours().stdout)  # the warm-up: the font cache and the file cache, and the sheet count
    floor_command = [sys.executable, "-m", "benchmarks.floors.bare_fleet", str(spec), str(sheets), str(floor_out)]

    def floor():
        return checked(floor_command, "the fleet floor", env)

    floor()
    a, b = [], []
    for _ in range(repeats):
        a.append(ours())
        b.append(floor())
    seconds, floor_seconds = [r.seconds for r in a], [r.seconds for r in b]
    figures = {"fleet": figure(summary(seconds, "s"), summary(floor_seconds, "s"), ratios_of(seconds, floor_seconds),
                               FLOOR_IS, {"ratio p50": 2.2}, smoke, cards=small, sheets=sheets,
                               peak=summary([r.peak_mb for r in a], "MB"),
                               what=f"kneeboard card FOLDER -o out.pdf --sheet {SHEET}: {small} profiles, one process")}

    # the large fleet against the fleet: pairs again, so a slower minute falls on both
    big, pair = [], []
    for _ in range(large_repeats):
        big.append(checked(export_command(work / "large", out), "the large fleet export", env, timeout=1800))
        pair.append(ours())
    big_s, pair_s = [r.seconds for r in big], [r.seconds for r in pair]
    scale = large / small
    figures["large fleet time"] = figure(
        summary(big_s, "s"), summary(pair_s, "s"), ratios_of(big_s, pair_s), f"the fleet of {small}, same run",
        {"ratio p50": scale}, smoke, cards=large, linearity=summary([r / scale for r in ratios_of(big_s, pair_s)], "x"),
        what=f"{large} profiles; linear growth is a ratio of {scale:g} or less (the start-up is paid once)")
    big_mb, pair_mb = [r.peak_mb for r in big], [r.peak_mb for r in pair]
    figures["large fleet peak memory"] = figure(
        summary(big_mb, "MB"), summary(pair_mb, "MB"), ratios_of(big_mb, pair_mb), f"the fleet of {small}'s peak",
        {"measured p50": MEMORY_TARGET_MB}, smoke, cards=large,
        what=f"{large} profiles: the exporting process's largest resident set (ru_maxrss)")
    return figures
