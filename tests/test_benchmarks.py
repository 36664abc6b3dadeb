"""The benchmark runs in a tiny smoke mode and reports every figure beside its floor; speed is never asserted here."""

import json
import math
import re
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parent.parent
FIGURES = {"start-up", "one card", "layout of one card", "preview", "fleet", "large fleet time",
           "large fleet peak memory"}


def finite_positive(value) -> bool:
    return isinstance(value, int | float) and math.isfinite(value) and value > 0


@pytest.fixture(scope="module")
def smoke(tmp_path_factory):
    out = tmp_path_factory.mktemp("bench") / "bench.json"
    proc = subprocess.run([sys.executable, "-m", "benchmarks", "--smoke", "--json", str(out)], cwd=ROOT,
                          capture_output=True, text=True, timeout=600)
    assert proc.returncode == 0, proc.stderr[-2000:]
    return json.loads(out.read_text()), proc.stdout


def test_smoke_reports_every_figure_with_its_floor_and_ratio(smoke):
    data, stdout = smoke
    assert data["smoke"] is True
    assert set(data["figures"]) == FIGURES
    for name, figure in data["figures"].items():
        for part in ("measured", "floor", "ratio"):
            assert finite_positive(figure[part]["p50"]) and finite_positive(figure[part]["p95"]), (name, part)
            assert figure[part]["p50"] <= figure[part]["p95"], (name, part)
            assert figure[part]["n"] >= 1, (name, part)
        assert figure["floor"]["what"], name
        assert figure["targets"], name
        assert figure["met"] is None, name  # smoke sizes are never judged against the targets
        assert name in stdout


def test_each_ratio_is_of_its_own_pairs(smoke):
    # one pair in smoke mode: the ratio is that pair's, so a ratio taken against the wrong floor shows here
    data, _ = smoke
    for name, figure in data["figures"].items():
        if figure["ratio"]["n"] == 1:
            expected = figure["measured"]["p50"] / figure["floor"]["p50"]
            assert math.isclose(figure["ratio"]["p50"], expected, rel_tol=1e-9), name


def test_fleet_floor_draws_as_many_sheets(smoke):
    data, _ = smoke
    fleet = data["figures"]["fleet"]
    assert fleet["sheets"] >= 1 and fleet["cards"] >= 1
    assert data["figures"]["large fleet time"]["cards"] > fleet["cards"]


def test_preview_counts_renders_for_edits_that_print_nothing_new(smoke):
    data, stdout = smoke
    preview = data["figures"]["preview"]
    assert preview["unchanged_edits"] >= 1
    assert 0 <= preview["renders_for_unchanged"] <= 4 * preview["unchanged_edits"]
    assert "print nothing new" in stdout


def test_machine_is_named(smoke):
    data, _ = smoke
    assert {"cpu", "cores", "python", "date"} <= set(data["machine"])


def test_floor_draws_the_pages_asked_for_and_every_mark():
    from benchmarks import ink
    from benchmarks.card import card_ink, font_files

    pages = card_ink()
    assert sum(len(page["texts"]) for page in pages) > 100  # the card's strings reach the floor
    ink.register(font_files())
    pdf = ink.pdf(pages, count=5)
    assert len(re.findall(rb"/Type /Page[^s]", pdf)) == 5


def test_hatch_lines_stay_inside_their_rectangle():
    from benchmarks.ink import _hatch

    x, y, w, h = 10.0, 20.0, 30.0, 7.0
    lines = _hatch(x, y, w, h)
    assert len(lines) == math.ceil((w + h) / 2.8)
    for x1, y1, x2, y2 in lines:
        assert x <= x1 <= x2 <= x + w + 1e-9 and y <= y1 <= y2 <= y + h + 1e-9
        assert math.isclose(x2 - x1, y2 - y1)  # 45 degrees, as the card draws them
