"""The card's ways out of the app, without a window: exports, print, and compare with the saved profile or with the
printed card. The aircraft are the invented samples and the invented test aircraft."""

import csv
import io
import shutil
import subprocess
import sys
import zlib
from pathlib import Path

import pytest
from conftest import SAMPLES, fleet_rows
from pypdf import PdfReader

from kneeboard import terms
from kneeboard.card.data import COMPRESSED_MARK, MARKER, read_card_data
from kneeboard.card.geometry import CARD_SIZES

AIRCRAFT = Path(__file__).parent / "aircraft"


def edit(c, text):
    c.doc.set(("weight", "total"), text, "Change card weight")


def cli_card(profile: Path, out: Path, *options: str) -> Path:
    done = subprocess.run([sys.executable, "-m", "kneeboard", "card", str(profile), *options, "-o", str(out)],
                          capture_output=True, text=True)
    assert done.returncode == 0, done.stderr
    return out


# --- exports -------------------------------------------------------------------------------------


def test_the_card_the_table_and_the_fleet_are_exported_and_confirmed(controller, person, tmp_path):
    confirmed = []
    controller.exported.connect(lambda what, path: confirmed.append((what, path)))
    person.answer("ask_save_path", tmp_path / "card.pdf", tmp_path / "table.csv", tmp_path / "fleet.pdf")
    assert controller.outputs.export_card() == tmp_path / "card.pdf"
    assert len(PdfReader(str(tmp_path / "card.pdf")).pages) == 2
    controller.outputs.export_csv()
    # UTF-8 with its byte-order mark, so a spreadsheet program reads the degree and limit signs as written
    exported = (tmp_path / "table.csv").read_bytes()
    assert exported.startswith(b"\xef\xbb\xbfregistration,card_weight_")
    rows = list(csv.DictReader(io.StringIO(exported.decode("utf-8-sig"))))
    assert rows[-1]["note"].startswith("CAUTION") and rows[-1]["fingerprint"] == controller.doc.loaded.fingerprint
    result = controller.outputs.export_fleet()
    found = read_card_data((tmp_path / "fleet.pdf").read_bytes())
    assert sorted(d["registration"] for d in found) == sorted(r[1] for r in fleet_rows(controller))
    (progress,) = person.progresses
    assert progress.total == 5 and progress.closed and len(progress.labels) == 5 and result.cards == 5
    assert confirmed == [("the card of DEMO-TRN", tmp_path / "card.pdf"),
                         ("the table of DEMO-TRN", tmp_path / "table.csv"), ("5 cards", tmp_path / "fleet.pdf")]
    assert person.problems == []


@pytest.mark.parametrize("name", ["demo_glider.toml", "fleet.style.toml"])
def test_an_export_never_replaces_a_profile_or_a_style(controller, person, fleet, name):
    (fleet / "fleet.style.toml").write_text("style = 1\n", encoding="utf-8")
    controller.restyle()
    before = (fleet / name).read_bytes()
    person.answer("ask_save_path", fleet / name, fleet / name)
    assert controller.outputs.export_card() is None and controller.outputs.export_csv() is None
    assert (fleet / name).read_bytes() == before
    assert [title for title, _ in person.problems] == ["The card was not exported", "The table was not exported"]
    assert name in person.problems[0][1] and "Nothing was written" in person.problems[0][1]


def test_unsaved_edits_of_the_fleet_are_saved_or_kept_out_before_its_export(controller, person, fleet, tmp_path):
    edit(controller, "1450 lb")
    person.answer("ask_unsaved", "cancel")
    assert controller.outputs.export_fleet() is None and not (tmp_path / "fleet.pdf").exists()
    person.answer("ask_unsaved", "save").answer("ask_save_path", tmp_path / "fleet.pdf")
    controller.outputs.export_fleet()
    weights = {d["registration"]: d["card_weight"] for d in read_card_data((tmp_path / "fleet.pdf").read_bytes())}
    assert "1450 lb" in weights["DEMO-TRN"]


def test_a_print_sends_the_card_and_remembers_it(controller, person):
    person.answer("print_pdf", True)
    assert controller.outputs.print_card()
    ((pdf, name),) = person.printed
    assert pdf == controller.shown.pdf and name == "DEMO-TRN_card"
    assert controller.session.last_printed("demo-trn").where == "the printer"


def test_a_printer_that_refuses_is_told_and_nothing_counts_as_printed(controller, person):
    from kneeboard.app.printing import PrinterProblem
    from kneeboard.i18n import Msg

    def refuses():
        raise PrinterProblem(Msg("the printer {printer} could not start printing", printer="'Club laser'"))

    person.answer("print_pdf", refuses)
    assert controller.outputs.print_card() is False
    assert person.problems == [("The card was not printed", "the printer 'Club laser' could not start printing")]
    assert controller.session.last_printed("demo-trn") is None  # compare never takes it for the printed card


@pytest.fixture
def mixed_fleet(tmp_path):
    folder = tmp_path / "mixed"
    shutil.copytree(SAMPLES, folder)
    for path in AIRCRAFT.glob("*.toml"):
        shutil.copy(path, folder / path.name)
    return folder


def test_the_fleet_export_makes_every_card_at_every_size(make_controller, person, mixed_fleet, tmp_path):
    c = make_controller(person)
    c.open_folder(mixed_fleet)
    registrations = sorted(r[1] for r in fleet_rows(c))
    assert len(registrations) == len(list(mixed_fleet.glob("*.toml")))
    combos = [(size, orientation, scale) for size in CARD_SIZES for orientation in ("portrait", "landscape")
              for scale in ((0.7, 1.6) if size in ("a5", "4x6") else (1.0,))]
    for size, orientation, scale in combos:
        (mixed_fleet / "fleet.style.toml").write_text(
            f'size = "{size}"\norientation = "{orientation}"\nfont_scale = {scale}\n', encoding="utf-8")
        c.restyle()
        out = tmp_path / f"{size}-{orientation}-{scale}.pdf"
        person.answer("ask_save_path", out)
        c.outputs.export_fleet()
        assert not person.problems, (size, orientation, person.problems)
        found = read_card_data(out.read_bytes())
        assert sorted(d["registration"] for d in found) == registrations, (size, orientation, scale)
        pages = PdfReader(str(out)).pages
        assert len(pages) >= len(registrations)
        w, h = CARD_SIZES[size]
        if orientation == "landscape":
            w, h = h, w
        assert {(round(float(p.mediabox.width)), round(float(p.mediabox.height))) for p in pages} == {
            (round(w), round(h))}


# --- compare -------------------------------------------------------------------------------------------


def test_changes_since_saved_are_exactly_the_changed_figures(controller):
    assert controller.outputs.compare_changes() == []
    edit(controller, "1300 lb")
    comparison = controller.outputs.compare_with_saved()
    labels = {c.label for c in comparison.changes}
    assert terms.CARD_WEIGHT in labels and all(c.old != c.new for c in comparison.changes)
    assert not any(label.endswith("load factor") for label in labels)  # load factors do not depend on weight
    assert comparison.columns == ("In the saved file", "With your edits") and comparison.registration == "DEMO-TRN"


def test_the_printed_card_is_compared_after_a_save(controller, person, tmp_path):
    """Export, change the weight, save (the natural order), compare: the printed card is out of date."""
    person.answer("ask_save_path", tmp_path / "DEMO-TRN.pdf")
    controller.outputs.export_card()
    assert controller.outputs.compare_with_printed().changes == []
    edit(controller, "1300 lb")
    assert controller.save()
    comparison = controller.outputs.compare_with_printed()
    rows = {c.label: (c.old, c.new) for c in comparison.changes}
    assert rows[terms.CARD_WEIGHT] == ("1560 lb", "1300 lb")
    assert comparison.columns == ("On the printed card", "Now") and "DEMO-TRN.pdf" in comparison.since


def test_a_card_printed_by_the_command_line_reads_the_same(controller, person, fleet, tmp_path):
    person.answer("ask_open_path", cli_card(fleet / "demo_trainer.toml", tmp_path / "printed.pdf"))
    assert controller.outputs.compare_with_printed().changes == []  # the app makes the very card the CLI printed


def test_a_card_made_for_another_weight_is_made_again_at_that_weight(controller, person, fleet, tmp_path):
    out = cli_card(fleet / "demo_trainer.toml", tmp_path / "heavy.pdf", "--weight", "1985 lb")
    person.answer("ask_open_path", out)
    comparison = controller.outputs.compare_with_printed()
    # the profile is unchanged: at the card's own weight every figure reads the same, and the comparison says so
    assert comparison.changes == [] and "at 1985 lb, the weight it was made for" in comparison.since


def test_another_aircrafts_card_and_a_hostile_card_are_named(controller, person, fleet, tmp_path):
    glider = cli_card(fleet / "demo_glider.toml", tmp_path / "glider.pdf")
    hostile = tmp_path / "deep.pdf"
    deep = zlib.compress(MARKER + b"[" * 200_000 + b"]" * 200_000 + b"}")
    hostile.write_bytes(b"%PDF-1.4\n/" + COMPRESSED_MARK.encode() + b" /Card\nstream\n" + deep + b"\nendstream\n")
    person.answer("ask_open_path", glider, hostile)
    assert controller.outputs.compare_with_printed() is None
    assert controller.outputs.compare_with_printed() is None
    (title1, text1), (title2, text2) = person.problems
    assert title1 == "Not this aircraft's card" and "DEMO-GL" in text1
    assert title2 == "Cannot read the card" and "deep.pdf" in text2 and "levels deep" in text2
