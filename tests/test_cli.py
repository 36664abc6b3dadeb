"""The command line as a person or a script uses it: exit codes, messages, the JSON interface."""

import json
import subprocess
import sys

import pytest
from conftest import MINIMAL, SAMPLES

from kneeboard.cli import main

JSON_KEYS = {"schema", "registration", "model", "fingerprint", "date", "weight_kg", "speed_unit", "distance_unit",
             "buffer", "pressure_altitude", "temperature_c", "density_altitude", "over_max_weight",
             "limit_load_factor", "limit_bank_deg", "maneuvering_speed", "configurations", "glider", "turn_back",
             "warnings", "caution"}
CONFIG_KEYS = {"name", "stall_speed", "pattern_speed", "zero_margin_bank_deg", "zero_margin_bank_past_limit",
               "buffer_bank_deg", "buffer_bank_past_limit", "limit_load_factor", "limit_bank_deg",
               "available_load_factor", "stall_at_load", "rows"}
ROW_KEYS = {"bank_deg", "load_factor", "stall_speed", "margin", "turn_radius", "turn_rate_deg_s", "over_limit"}
GLIDER_KEYS = {"min_sink_speed", "min_sink_rate_m_s", "rows"}
GLIDER_ROW_KEYS = {"bank_deg", "speed", "sink_rate_m_s", "turn_radius", "circle_time_s", "height_loss_180"}


def run(capsys, *args):
    code = main(list(args))
    out, err = capsys.readouterr()
    return code, out, err


def test_check_all_samples(capsys):
    code, out, _ = run(capsys, "check", str(SAMPLES))
    assert code == 0
    assert out.count(": ok") == len(list(SAMPLES.glob("*.toml")))
    assert "flight manual" in out  # the caution


@pytest.mark.parametrize("path", sorted(SAMPLES.glob("*.toml")), ids=lambda p: p.stem)
def test_table_json_keys(capsys, path):
    code, out, err = run(capsys, "table", str(path), "--format", "json")
    assert code == 0
    data = json.loads(out)
    assert set(data) == JSON_KEYS
    assert data["schema"] == 2
    for c in data["configurations"]:
        assert set(c) == CONFIG_KEYS
        for row in c["rows"]:
            assert set(row) == ROW_KEYS
        assert c["rows"][0]["bank_deg"] != 0 or c["rows"][0]["turn_radius"] is None
    if data["glider"] is not None:
        assert set(data["glider"]) == GLIDER_KEYS
        assert all(set(r) == GLIDER_ROW_KEYS for r in data["glider"]["rows"])
    assert "flight manual" in err  # caution on stderr when stdout is a machine format


def test_table_options(capsys, tmp_path):
    f = tmp_path / "p.toml"
    f.write_text(MINIMAL)
    code, out, _ = run(capsys, "table", str(f), "--weight", "1500 lb", "--bank", "0,20,40",
                       "--speed-unit", "km/h", "--format", "json")
    assert code == 0
    data = json.loads(out)
    assert data["weight_kg"] == pytest.approx(1500 * 0.45359237)
    assert [r["bank_deg"] for r in data["configurations"][0]["rows"]] == [0, 20, 40]
    assert data["speed_unit"] == "km/h"
    # 50 kt at 750 kg scaled to 680.4 kg, in km/h
    assert data["configurations"][0]["stall_speed"] == pytest.approx(50 * 1.852 * (680.388555 / 750) ** 0.5)


def test_table_csv_and_text(capsys):
    path = SAMPLES / "demo_trainer.toml"
    code, out, err = run(capsys, "table", str(path), "--format", "csv")
    assert code == 0 and out.startswith("registration,card_weight_lb,configuration,bank_deg")
    assert "flight manual" in err
    code, out, _ = run(capsys, "table", str(path))
    assert code == 0 and "DEMO-TRN" in out and "flight manual" in out


@pytest.mark.parametrize(
    "change, field",
    [
        (('"750 kg"', '"-750 kg"'), "aircraft.max_weight"),
        (('"50 kt"', '"50 kg"'), "configuration[1].stall_speed"),
    ],
)
def test_bad_profile_one_line_per_problem_exit_2(capsys, tmp_path, change, field):
    f = tmp_path / "bad.toml"
    f.write_text(MINIMAL.replace(*change))
    for command in ("check", "table"):
        code, out, err = run(capsys, command, str(f))
        assert code == 2
        lines = [line for line in (out + err).splitlines() if "error:" in line]
        assert len(lines) == 1 and field in lines[0] and str(f) in lines[0]


def test_bank_of_90_and_missing_configuration(capsys, tmp_path):
    f = tmp_path / "bank.toml"
    f.write_text(MINIMAL + "[card]\nbank_angles = [0, 90]\n")
    g = tmp_path / "noconf.toml"
    g.write_text(MINIMAL.split("[[configuration]]")[0])
    code, out, _ = run(capsys, "check", str(f), str(g))
    assert code == 2
    assert "card.bank_angles[2]" in out and "configuration: no configuration" in out


def test_bad_options(capsys, tmp_path):
    f = tmp_path / "p.toml"
    f.write_text(MINIMAL)
    code, _, err = run(capsys, "table", str(f), "--weight", "700 kt")
    assert code == 2 and "--weight" in err and "mass" in err
    code, _, err = run(capsys, "table", str(f), "--bank", "0,95")
    assert code == 2 and "--bank" in err
    code, _, err = run(capsys, "table", str(tmp_path / "missing.toml"))
    assert code == 2 and "no such file" in err


def test_console_script_has_no_traceback(tmp_path):
    f = tmp_path / "junk.toml"
    f.write_bytes(b"\xff\xfe not utf8 [[[")
    proc = subprocess.run([sys.executable, "-m", "kneeboard", "check", str(f)], capture_output=True, text=True)
    assert proc.returncode == 2
    assert "Traceback" not in proc.stdout + proc.stderr
    assert "UTF-8" in proc.stdout


def test_the_command_lines_choices_are_the_style_keys_options():
    # the options that mirror a style key come from its declaration, never from a copy
    from kneeboard import cli, units
    from kneeboard.inputs.style_keys import BY_KEY

    actions = {(name, a.dest): a for name, sub in cli._parser()._subparsers._group_actions[0].choices.items()
               for a in sub._actions}
    assert tuple(actions["card", "size"].choices) == BY_KEY["size"].options
    for command in ("table", "card", "compare"):
        assert tuple(actions[command, "language"].choices) == BY_KEY["language"].options
    assert tuple(actions["table", "speed_unit"].choices) == BY_KEY["speed_unit"].options == units.SPEED_UNITS


def test_each_commands_usage_names_the_command_and_the_main_usage_names_every_command(capsys):
    from kneeboard.cli import COMMANDS, main

    for name in COMMANDS:
        with pytest.raises(SystemExit):
            main([name, "--help"])
        out = capsys.readouterr().out
        assert out.startswith(f"usage: kneeboard {name} [-h]"), out[:120]
    with pytest.raises(SystemExit):
        main(["--help"])
    assert "check | table | card | compare" in capsys.readouterr().out


def _text_rows(section: list[str]) -> dict[str, list[str]]:
    """The rows of a text table under its two header lines, by their first column (the bank)."""
    return {line.split()[0]: line.split()[1:] for line in section[3:] if line[:5].strip().isdigit()}


@pytest.mark.parametrize("name", ["demo_trainer", "demo_tourer"])
def test_table_text_prints_the_turn_back_and_pull_figures_of_the_card(capsys, name):
    """The terminal's table carries the card's turn-back and pull blocks, figure for figure (the card's own
    printed figures, read from its layout), so the command line and the card never disagree."""
    from kneeboard import terms
    from kneeboard.pipeline import Styles, make_card, prepare_file

    path = SAMPLES / f"{name}.toml"
    card = make_card(prepare_file(path, Styles()), made_on="2026-12-01")
    code, out, _ = run(capsys, "table", str(path))
    assert code == 0
    lines = out.splitlines()
    start = next(i for i, line in enumerate(lines) if line.startswith("turn back after"))
    section = lines[start:lines.index("", start)]
    rows = _text_rows(section)
    headings = [h.split()[0] for h in section[1].split()[3:] if h != "deg"]
    checked = 0
    for f in card.figures().values():
        parts = f.label.split(terms.SEP)
        number = f.text.split()[0]
        if parts[0] == terms.TURN_BACK and parts[1].endswith("°"):
            row = rows[parts[1].rstrip("°")]
            kind = parts[2]
            column = 0 if kind == terms.SPEED else 1 if kind == terms.MARGIN else 2 + headings.index(
                kind.split("°")[0])
            assert row[column] == number, f.label
            checked += 1
        elif parts[0] == terms.TURN_BACK:
            assert f" {number} " in f" {section[0]} ".replace(";", " "), f.label
            checked += 1
        elif parts[-1] == terms.AVAILABLE_LOAD:
            assert f"  pattern stalls at {number} g" in out, f.label
            checked += 1
    rows_on_card = len(card.table.turn_back.rows)
    assert rows_on_card and len(rows) == rows_on_card
    # every row's speed, margin and losses, the three heading figures, one pull figure per configuration
    assert checked == rows_on_card * (2 + len(headings)) + 3 + len(card.table.configurations)
    assert "a turn back is a decision" in out  # its own caution travels with it


def test_check_quotes_configuration_names_which_may_hold_commas(capsys, tmp_path):
    f = tmp_path / "p.toml"
    f.write_text(MINIMAL + '\n[[configuration]]\nname = "Flaps 10, gear down"\nstall_speed = "45 kt"\n'
                 '\n[[configuration]]\nname = "Say \\"full\\""\nstall_speed = "42 kt"\n', encoding="utf-8")
    code, out, _ = run(capsys, "check", str(f))
    assert code == 0
    assert '3 configuration(s): "Flaps up", "Flaps 10, gear down", "Say \\"full\\""; fingerprint' in out
