"""One set of printed rows behind every output: the card's blocks print `kneeboard.printed`'s rows, and the card,
the text, CSV and JSON reports and the app's key figures can be held to them figure by figure."""

import csv
import io
import json
import subprocess
import sys
from pathlib import Path

import pytest
from card_helpers import MADE_ON, default_style
from conftest import SAMPLES

from kneeboard import printed, report, rounding
from kneeboard.inputs.profiles import read_source
from kneeboard.pipeline import Overrides, make_card, prepare

AIRCRAFT = Path(__file__).parent / "aircraft"
PROFILES = sorted(SAMPLES.glob("*.toml")) + sorted(AIRCRAFT.glob("*.toml"))


def prepared(path):
    p = prepare(read_source(path), default_style(), Overrides())
    assert p.table is not None, p.errors
    return p


@pytest.mark.parametrize("path", PROFILES, ids=lambda p: p.stem)
def test_the_card_prints_exactly_the_printed_rows(path):
    p = prepared(path)
    card = make_card(p, MADE_ON)
    on_card = {k: (f.text, f.past_limit) for k, f in card.figures().items()}
    declared = {k: (f.text, f.past_limit) for k, f in printed.figures(p.table).items()}
    assert on_card == declared


def test_the_printed_rows_load_neither_reportlab_nor_qt():
    code = ("import sys, kneeboard.printed; "
            "bad = [m for m in sys.modules if m.startswith(('reportlab', 'PySide6'))]; assert not bad, bad")
    run = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True)
    assert run.returncode == 0, run.stderr


@pytest.mark.parametrize("path", PROFILES, ids=lambda p: p.stem)
def test_the_csv_and_the_text_carry_the_cards_bank_rows(path):
    t = prepared(path).table
    rows = list(csv.DictReader(io.StringIO(report.to_csv(t, "ABCD1234", MADE_ON))))
    su, du = t.speed_unit, t.distance_unit
    text = report.to_text(t, "ABCD1234", MADE_ON)
    for c in t.configurations:
        cells = printed.margin_rows(t, [c])  # bank, load, stall, margin
        turns = {row[0].text: row for row in printed.turn_rows(t, [c])}  # bank, radius, 180/360
        mine = [r for r in rows if r["configuration"] == c.name]
        assert len(mine) == len(cells)
        for line, row in zip(mine, cells):
            bank, load, stall, margin = (cell.text for cell in row)
            assert f"{line['bank_deg']}°" == bank
            assert (line["load_factor"], line[f"stall_speed_{su}"], line[f"margin_{su}"]) == (load, stall, margin)
            if bank in turns and turns[bank][1].figure is not None:
                radius, times = turns[bank][1].text, turns[bank][2].text
                assert line[f"turn_radius_{du}"] == radius
                assert f"{line['time_180_s']}/{line['time_360_s']}" == times
            # the text report's row for this bank holds the same figures in the same order
            found = [ln.split() for ln in text.splitlines()
                     if ln.split()[:4] == [bank.rstrip("°"), load, stall, margin]]
            assert found, (c.name, bank)
    # the weight, every warning and the caution ride along in the CSV
    assert {r[f"card_weight_{t.weight_unit}"] for r in rows} == {t.weight.text}
    notes = [r["note"] for r in rows if r["note"]]
    for warning in t.warnings:
        assert any(warning.lstrip("=+-@") in note for note in notes)
    assert any(note.startswith("CAUTION") for note in notes)


@pytest.mark.parametrize("path", PROFILES, ids=lambda p: p.stem)
def test_every_printed_figure_is_the_json_figure_rounded_the_safe_way(path):
    t = prepared(path).table
    data = json.loads(report.to_json(t, "ABCD1234", MADE_ON))
    for c, j in zip(t.configurations, data["configurations"]):
        assert c.stall_speed.value == rounding.up(j["stall_speed"])  # stall speeds up
        assert c.pattern_speed.value == rounding.up(j["pattern_speed"])
        assert c.limit_bank.value == rounding.down(j["limit_bank_deg"])  # banks down
        for row, jr in zip(c.rows, j["rows"]):
            assert row.stall_speed.value == rounding.up(jr["stall_speed"])
            assert row.load_factor.value == rounding.up(jr["load_factor"], 0.01)
            if jr["turn_radius"] is not None and row.turn_radius is not None:
                assert row.turn_radius.value >= jr["turn_radius"] - 1e-9
