"""The text, CSV and JSON reports carry what the card carries: the card weight, the warnings, the caution, the
fingerprint and every limit mark. Every aircraft here is invented."""

import csv
import io
import json

from conftest import checked
from test_printed_limits import TOURER

from kneeboard import report
from kneeboard.pipeline import report_text
from kneeboard.tables import LIMIT_MARK
from kneeboard.texts import CAUTION

# the invented tourer at 1,300 kg, above its 1,200 kg maximum: two warnings, reduced limits
HEAVY = TOURER.replace('maneuvering_speed = "105 kt"', 'maneuvering_speed = "105 kt"\n[weight]\ntotal = "1300 kg"',
                       1).replace('name = "Clean"', 'name = "=Clean"')


def rows_of(text: str) -> list[dict]:
    return list(csv.DictReader(io.StringIO(text)))


def test_the_csv_carries_the_card_weight_the_warnings_and_the_caution_on_one_table():
    p = checked(HEAVY)
    assert p.table.over_max_weight and p.table.warnings
    text = report_text(p, "csv", made_on="2026-12-04")
    lines = list(csv.reader(io.StringIO(text)))
    assert len({len(line) for line in lines}) == 1  # one header, the same columns on every line
    rows = rows_of(text)
    assert {r["card_weight_kg"] for r in rows} == {"1300"}  # every line, so a filter keeps it
    assert {r["fingerprint"] for r in rows} == {p.fingerprint} and {r["date"] for r in rows} == {"2026-12-04"}
    notes = [r["note"] for r in rows if not r["configuration"]]
    assert notes == [*p.table.warnings, CAUTION]
    assert any("above the maximum weight" in note for note in notes)
    # a text cell that would start a formula is led by an apostrophe (OWASP, CSV injection)
    assert {r["configuration"] for r in rows if r["configuration"]} == {"Flaps 40", "'=Clean"}


def test_the_csv_marks_banks_and_load_factors_past_a_configurations_limit():
    rows = rows_of(report.to_csv(checked(TOURER).table))
    flaps = [r for r in rows if r["configuration"] == "Flaps 40"]
    assert {r["zero_margin_bank_deg"] for r in flaps} == {f"{LIMIT_MARK}60"}
    assert {r["buffer_bank_deg"] for r in flaps} == {f"{LIMIT_MARK}60"}
    # 60 degrees reaches the flaps' 2.0 g (14 CFR 23.345, from memory): marked from there on
    assert [r["bank_deg"] for r in flaps if ">limit" in r["note"]] == ["60", "70", "80"]


def test_a_csv_file_opens_as_utf8_in_spreadsheet_programs():
    text = report.csv_file(checked(TOURER).table)
    assert text.startswith("\ufeffregistration,")  # the byte-order mark spreadsheets read UTF-8 by
    assert "\r\n" in text and "\n" not in text.replace("\r\n", "")  # RFC 4180 line ends


def test_the_text_report_names_every_mark_the_card_makes():
    p = checked(TOURER)
    text = report_text(p, "text")
    flaps = next(line for line in text.splitlines() if line.startswith("Flaps 40:"))
    assert f"zero-margin bank {LIMIT_MARK}60 deg (at or past its limit bank)" in flaps
    pull = text.splitlines()[text.splitlines().index(flaps) + 1]
    assert pull.endswith("at 2.5 g >limit, 70 kt at 3 g >limit")
    back = [line.split() for line in text.splitlines() if line.strip().startswith(("70 ", "80 "))][-2:]
    assert back[0][-1] != ">limit" and back[1][-1] == ">limit"  # the turn back's 80 deg row, past 74.7 deg
    assert "gliding in Clean" in text and f"fingerprint {p.fingerprint}" in text
    assert f"{LIMIT_MARK} a buffer or zero-margin bank at or past" in text


def test_the_json_adds_the_fingerprint_date_buffer_and_density_altitude():
    p = checked(TOURER.replace("[card]", '[card]\npressure_altitude = "5000 ft"\ntemperature = "30 degC"'))
    data = json.loads(report_text(p, "json", made_on="2026-12-04"))
    assert data["schema"] == 2
    assert data["fingerprint"] == p.fingerprint and data["date"] == "2026-12-04"
    assert data["buffer"] == 5.0 and data["pressure_altitude"] == 5000.0 and data["temperature_c"] == 30.0
    # common practice: about 120 ft per degree C above standard; a 5,000 ft field at 30 degC is about 8,000 ft
    # (a pilots' association's worked example) - within 300 ft
    assert abs(data["density_altitude"] - 8000) < 300
    flaps = data["configurations"][0]
    assert flaps["zero_margin_bank_past_limit"] and flaps["buffer_bank_past_limit"]
    assert [s["past_limit"] for s in flaps["stall_at_load"]] == [False, False, True, True]
    assert data["turn_back"]["configuration"] == "Clean"
    assert [r["past_limit"] for r in data["turn_back"]["rows"]] == [False, False, False, False, True]
