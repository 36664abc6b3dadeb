"""The app's flows without a window: opening, saving, changes on disk, the card's renders and the card style.

A `Controller` is driven as the window drives it, with a scripted person answering its questions (conftest.Person);
no widget is made (the `make_controller` fixture checks it). The aircraft are the invented samples.
"""

import io
import re
import subprocess
import sys
import threading
from pathlib import Path

import pytest
from conftest import WAIT_MS, check_fleet, fleet_rows, settle
from pypdf import PdfReader

from kneeboard import fileio
from kneeboard.card.data import read_card_data
from kneeboard.card.geometry import CARD_SIZES

LB = 0.45359237  #: [kg] the avoirdupois pound (exact, by definition)


def edit(c, text="1450 lb"):
    """What typing a total weight into the editor does to the document."""
    c.doc.set(("weight", "total"), text, "Change card weight")


def page_size(pdf: bytes) -> tuple[float, float]:
    box = PdfReader(io.BytesIO(pdf)).pages[0].mediabox
    return float(box.width), float(box.height)


# --- opening ------------------------------------------------------------------------------------


def test_a_folder_lists_its_fleet_and_opens_its_first_profile(qtbot, make_controller, person, fleet):
    c = make_controller(person)
    opened, highlighted, titles = [], [], []
    c.documentChanged.connect(opened.append)
    c.highlight.connect(highlighted.append)
    c.titleChanged.connect(lambda title, modified: titles.append((title, modified)))
    c.open_folder(fleet)
    rows = fleet_rows(c)
    registrations = [r[1] for r in rows]
    assert registrations == sorted(registrations) and len(registrations) == 5
    assert opened == [c.doc] and c.doc.path == rows[0][2] == highlighted[-1]
    assert titles[-1] == (f"{registrations[0]} — {rows[0][2].name}[*] — kneeboard", False)
    with qtbot.waitSignal(c.cardReady, timeout=WAIT_MS) as ready:
        pass
    assert read_card_data(ready.args[1])[0]["registration"] == registrations[0]
    assert Path(c.settings.value("last_folder")) == fleet and c.recent() == [str(rows[0][2])]


def test_opening_prepares_each_profile_of_the_fleet_once(qtbot, make_controller, person, fleet):
    # the open profile was prepared again from disk by the fleet's check: six for a fleet of five
    c = make_controller(person)
    prepared = []
    prepare = c.session.prepare_source
    c.session.prepare_source = lambda source, weight=None: prepared.append(source.path) or prepare(source, weight)
    c.open_folder(fleet)
    check_fleet(qtbot, c)
    assert len(prepared) == len(set(prepared)) == 5
    marks = {r[2]: r[0] for r in fleet_rows(c)}
    assert marks[c.doc.path] == ""  # the open profile is marked too, from its own preparation


def test_a_file_that_cannot_be_read_is_said_and_what_was_open_stays(controller, person, fleet):
    broken = fleet / "zz_broken.toml"
    broken.write_text("[aircraft\nregistration = ", encoding="utf-8")
    assert not controller.open_profile(broken)
    assert "zz_broken.toml" in person.problems[-1][0]
    assert controller.doc.path.name == "demo_trainer.toml"


def test_a_profile_with_errors_opens_and_names_them(controller, person, fleet):
    bad = fleet / "zz_values.toml"
    bad.write_text((fleet / "demo_trainer.toml").read_text(encoding="utf-8").replace('"48 kt"', '"48 kg"')
                   .replace('"DEMO-TRN"', '"DEMO-VAL"'), encoding="utf-8")
    assert controller.open_profile(bad)
    title, text = person.problems[-1]
    assert title == "zz_values.toml has problems" and "configuration[1].stall_speed" in text


def test_unsaved_edits_ask_before_another_profile_opens(controller, person, fleet):
    edit(controller, "1500 lb")
    person.answer("ask_unsaved", "cancel")
    assert not controller.open_profile(fleet / "demo_tourer.toml")
    assert controller.doc.path.name == "demo_trainer.toml" and controller.doc.modified
    person.answer("ask_unsaved", "discard")
    assert controller.open_profile(fleet / "demo_tourer.toml")
    assert "1500 lb" not in (fleet / "demo_trainer.toml").read_text(encoding="utf-8")
    controller.doc.set(("card", "buffer"), "9 kt")
    person.answer("ask_unsaved", "save")
    assert controller.open_profile(fleet / "demo_trainer.toml")
    assert 'buffer = "9 kt"' in (fleet / "demo_tourer.toml").read_text(encoding="utf-8")


def test_a_new_profile_is_none_of_the_fleet_until_saved_into_it(controller, person, fleet):
    highlighted, said = [], []
    controller.highlight.connect(highlighted.append)
    controller.status.connect(lambda text, _ms: said.append(text))
    person.answer("ask_category", lambda current: "glider" if current == "utility" else None)
    controller.new_profile_asked()  # offered first: the category of the trainer that was open
    assert controller.doc.path is None and controller.doc.loaded.profile.aircraft.category == "glider"
    assert highlighted[-1] is None and "template “Glider”" in said[-1]
    person.answer("ask_save_path", fleet / "new_glider.toml")
    assert controller.save()
    assert (fleet / "new_glider.toml").is_file() and not controller.doc.modified
    assert "NEW-GL" in [r[1] for r in fleet_rows(controller)] and highlighted[-1] == fleet / "new_glider.toml"


def test_an_empty_folder_closes_the_other_fleets_aircraft(qtbot, controller, person, tmp_path):
    empty = tmp_path / "empty"
    empty.mkdir()
    seen = []
    controller.cardCleared.connect(lambda: seen.append("cleared"))
    controller.figuresWithheld.connect(seen.append)
    controller.open_folder(empty)
    assert controller.doc is None and fleet_rows(controller) == [] and seen[0] == "cleared"
    assert "No profile open" in seen[1]
    controller.outputs.export_card()
    controller.outputs.print_card()
    controller.outputs.compare_with_printed()
    assert [title for title, _ in person.problems] == ["No card"] * 3


def test_recent_files_and_settings_keep_absolute_paths(controller, fleet, settings, monkeypatch):
    monkeypatch.chdir(fleet.parent)
    changed = []
    controller.recentChanged.connect(lambda: changed.append(1))
    assert controller.open_profile(Path(fleet.name) / "demo_glider.toml")
    assert controller.recent()[:2] == [str(fleet / "demo_glider.toml"), str(fleet / "demo_trainer.toml")]
    assert Path(settings.value("last_folder")).is_absolute() and changed


# --- saving and changes on disk -------------------------------------------------------------------


def test_save_writes_the_text_as_edited_and_nothing_when_unedited(controller, fleet):
    path = fleet / "demo_trainer.toml"
    untouched = path.read_bytes()
    assert controller.save() and path.read_bytes() == untouched
    edit(controller, "1500 lb")
    edited = controller.doc.text()
    assert controller.save()
    assert path.read_text(encoding="utf-8") == edited and not controller.doc.modified


def test_an_unedited_profile_takes_their_change_and_undo_brings_back_the_old(qtbot, controller, fleet):
    path = fleet / "demo_trainer.toml"
    before = path.read_text(encoding="utf-8")
    fileio.write_atomic(path, before.replace("DEMO-TRN", "DEMO-TRX"))
    qtbot.waitUntil(lambda: controller.doc.text() == path.read_text(encoding="utf-8"), timeout=WAIT_MS)
    assert not controller.doc.modified and controller.doc.loaded.profile.aircraft.registration == "DEMO-TRX"
    controller.doc.undo_stack.undo()
    assert controller.doc.text() == before


def test_an_edited_profile_asks_and_cancel_keeps_both(qtbot, controller, person, fleet):
    path = fleet / "demo_trainer.toml"
    edit(controller)
    mine = controller.doc.text()
    person.answer("ask_conflict", "cancel", "cancel")
    other = path.read_text(encoding="utf-8").replace("DEMO-TRN", "DEMO-TRX")
    fileio.write_atomic(path, other)
    qtbot.waitUntil(lambda: person.asked == ["ask_conflict"], timeout=WAIT_MS)  # the watcher asked
    assert controller.doc.text() == mine
    assert controller.save() is False and person.asked == ["ask_conflict"] * 2  # the save asked again
    assert path.read_text(encoding="utf-8") == other and controller.doc.text() == mine and controller.doc.modified


@pytest.mark.parametrize("answer", ["reload", "overwrite", "save-as"])
def test_each_answer_to_a_change_on_disk_at_save(qtbot, controller, person, fleet, tmp_path, answer):
    path = fleet / "demo_trainer.toml"
    edit(controller)
    mine = controller.doc.text()
    other = path.read_text(encoding="utf-8").replace("DEMO-TRN", "DEMO-TRX")
    controller.doc.changedOnDisk.disconnect()  # the watcher's question is another test's: here, the save's
    path.write_text(other, encoding="utf-8")
    elsewhere = tmp_path / "mine.toml"
    person.answer("ask_conflict", answer).answer("ask_save_path", elsewhere)
    saved = controller.save()
    if answer == "reload":
        assert saved is False and controller.doc.text() == other and path.read_text(encoding="utf-8") == other
        controller.doc.undo_stack.undo()
        assert controller.doc.text() == mine
    elif answer == "overwrite":
        assert saved and path.read_text(encoding="utf-8") == mine and not controller.doc.modified
    else:
        assert saved and elsewhere.read_text(encoding="utf-8") == mine and path.read_text(encoding="utf-8") == other
        assert controller.doc.path == elsewhere


def test_two_apps_on_one_file_never_overwrite_each_other(qtbot, controller, make_controller, fleet):
    from conftest import Person

    path = fleet / "demo_trainer.toml"
    first, other = controller.ui, Person()
    second = make_controller(other)
    assert second.open_profile(path)
    edit(controller, "1450 lb")
    second.doc.set(("aircraft", "model"), "Renamed in the second window (invented)")
    mine2 = second.doc.text()
    assert controller.save()  # the first save meets no change
    saved = path.read_text(encoding="utf-8")
    other.answer("ask_conflict", "cancel", "cancel", "reload", "overwrite")
    qtbot.waitUntil(lambda: other.asked == ["ask_conflict"], timeout=WAIT_MS)  # the second was told at once
    assert second.save() is False and path.read_text(encoding="utf-8") == saved  # its save asks, no overwrite
    assert second.save() is False  # reload
    assert second.doc.text() == saved and "1450 lb" in second.doc.text()
    second.doc.undo_stack.undo()
    assert second.doc.text() == mine2  # the second one's own edit is one undo away
    assert second.save() and path.read_text(encoding="utf-8") == mine2  # overwrite
    # the first, unedited since its save, takes the second's file
    qtbot.waitUntil(lambda: controller.doc.text() == mine2, timeout=WAIT_MS)
    assert first.asked == []


def test_save_as_through_a_linked_folder_onto_the_open_file_asks_first(controller, person, fleet, tmp_path):
    # the paths were compared as text: the open file reached through a link was overwritten without a question
    edit(controller)
    controller.doc.changedOnDisk.disconnect()
    theirs = (fleet / "demo_trainer.toml").read_text(encoding="utf-8").replace('total = "1560 lb"',
                                                                               'total = "1600 lb"')
    (fleet / "demo_trainer.toml").write_text(theirs, encoding="utf-8")  # another program's change
    link = tmp_path / "linked_fleet"
    link.symlink_to(fleet, target_is_directory=True)
    person.answer("ask_save_path", link / "demo_trainer.toml").answer("ask_conflict", "cancel")
    assert controller.save_as() is False
    assert person.asked == ["ask_save_path", "ask_conflict"]
    assert (fleet / "demo_trainer.toml").read_text(encoding="utf-8") == theirs  # their change kept
    assert controller.doc.get(("weight", "total")) == "1450 lb" and controller.doc.modified  # and mine too


def test_closing_asks_for_unsaved_edits_and_can_be_cancelled(controller, person, fleet):
    controller.doc.set(("card", "buffer"), "9 kt")
    person.answer("ask_unsaved", "cancel", "save")
    assert not controller.close() and controller.autosave_timer.isActive()
    assert controller.close() and not controller.autosave_timer.isActive()
    assert 'buffer = "9 kt"' in (fleet / "demo_trainer.toml").read_text(encoding="utf-8")


# --- the card's renders ---------------------------------------------------------------------------


def test_the_card_shown_is_the_card_exported(qtbot, controller, person, tmp_path):
    edit(controller, "1450 lb")
    with qtbot.waitSignal(controller.cardReady, timeout=WAIT_MS) as ready:
        pass
    generation, pdf, ms = ready.args
    assert generation == controller.card_generation and ms >= 0
    assert f"fingerprint {controller.doc.loaded.fingerprint}" in PdfReader(io.BytesIO(pdf)).pages[0].extract_text()
    person.answer("ask_save_path", tmp_path / "card.pdf")
    controller.outputs.export_card()
    assert (tmp_path / "card.pdf").read_bytes() == pdf  # the very bytes shown


def test_an_edit_that_prints_nothing_new_renders_nothing(qtbot, controller):
    edit(controller, "1500 lb")
    settle(qtbot, controller)
    requested, fingerprint = controller.renders.generation, controller.doc.loaded.fingerprint
    for same in ("1500.0 lb", " 1500 lb", "1500.00 lb"):  # the same figure written another way
        edit(controller, same)
        settle(qtbot, controller)
        assert controller.doc.get(("weight", "total")) == same  # kept as typed
        assert controller.doc.loaded.fingerprint == fingerprint
    assert controller.renders.generation == requested  # no render
    edit(controller, "1501 lb")
    settle(qtbot, controller)
    assert controller.renders.generation > requested and controller.shown.generation == controller.card_generation


def test_an_input_error_makes_the_card_stale_and_drops_its_renders(qtbot, controller, person, tmp_path,
                                                                   monkeypatch):
    good = controller.shown.pdf
    stale, withheld, shown = [], [], []
    controller.cardStale.connect(lambda note, over: stale.append((note, over)))
    controller.figuresWithheld.connect(withheld.append)
    controller.cardReady.connect(lambda _generation, pdf, _ms: shown.append(pdf))
    # the render is held on its thread until the error is in, whatever the machine's load
    started, gate = threading.Event(), threading.Event()
    card_job = controller.card_job

    def held(prepared, mode="card"):
        job = card_job(prepared, mode)

        def when_let_go():
            started.set()
            gate.wait(WAIT_MS / 1000)
            return job()

        return when_let_go

    monkeypatch.setattr(controller, "card_job", held)
    edit(controller, "1500 lb")
    qtbot.waitUntil(started.is_set, timeout=WAIT_MS)  # its render is running now
    edit(controller, "1500 lb kt")  # an error before it ends
    qtbot.waitUntil(lambda: bool(stale), timeout=WAIT_MS)
    assert not controller.renders.busy()  # the running render's result is not wanted any more
    note, over = stale[-1]
    assert "1 error" in note and over.startswith("NOT CURRENT") and "as it was before them" in over
    assert withheld and controller.shown.pdf == good
    person.answer("ask_save_path", tmp_path / "x.pdf")
    controller.outputs.export_card()  # the greyed card is never the one exported
    assert not (tmp_path / "x.pdf").exists() and person.problems[-1][0] == "No card" and person.asked == []
    gate.set()  # the 1500 lb card is drawn now, and comes back too late
    edit(controller, "1560 lb")  # the value as it was: waits for the running render, then the very card, anew
    settle(qtbot, controller)
    assert controller.shown.pdf == good and shown == [good]  # the 1500 lb card was never shown


def test_a_sheet_is_rendered_for_the_preview_and_the_card_alone_is_exported(qtbot, controller, person, tmp_path):
    card = controller.shown.pdf
    controller.set_preview_mode("letter")
    settle(qtbot, controller)
    assert page_size(controller.shown.pdf) == pytest.approx((612, 792), abs=0.5)  # 8.5 x 11 in, computed
    person.answer("ask_save_path", tmp_path / "card.pdf")
    controller.outputs.export_card()
    assert (tmp_path / "card.pdf").read_bytes() == card
    with pytest.raises(ValueError, match="tabloid"):
        controller.set_preview_mode("tabloid")


# --- the card style ------------------------------------------------------------------------------


def test_another_style_file_changes_the_card_and_checks_the_fleet_again(qtbot, controller, person, fleet, tmp_path):
    (fleet / "zz_broken.toml").write_text("[aircraft\n", encoding="utf-8")
    controller.reload_fleet()
    check_fleet(qtbot, controller)
    assert {r[2].name: r[0] for r in fleet_rows(controller)}["zz_broken.toml"] == "error"
    small = tmp_path / "small.style.toml"
    small.write_text('style = 1\nsize = "4x6"\nfront = ["header", "margin-table", "limits"]\n', encoding="utf-8")
    person.answer("ask_open_path", small)
    assert controller.outputs.pick_style() == small
    assert controller.checks_pending == len(fleet_rows(controller))  # every mark is being made again ...
    check_fleet(qtbot, controller)
    marks = {r[2].name: r[0] for r in fleet_rows(controller)}
    assert marks["zz_broken.toml"] == "error" and marks["demo_trainer.toml"] == ""  # ... under the new style
    settle(qtbot, controller)
    assert page_size(controller.shown.pdf) == pytest.approx(CARD_SIZES["4x6"], abs=0.1)
    controller.use_style_file(None)  # back to the folder's (here: the default) style
    settle(qtbot, controller)
    assert page_size(controller.shown.pdf) == pytest.approx(CARD_SIZES["a5"], abs=0.1)


def test_a_style_that_cannot_be_saved_is_said_and_nothing_changes(qtbot, controller, person, fleet):
    style_edit = controller.outputs.style_to_edit()
    assert style_edit.target == fleet / "fleet.style.toml"
    assert re.fullmatch(r"\d+ cards?, \d+ faces? \(DEMO-TRN\)", style_edit.faces(_values(style_edit.style)))
    restyled = []
    controller.restyled.connect(lambda: restyled.append(1))

    def cannot(_path):
        raise fileio.FileProblem(f"{style_edit.target}: is not valid TOML; it was left as it is")

    assert controller.outputs.save_style(cannot, style_edit.target) is False and not restyled
    assert person.problems[-1][0] == "The style was not saved" and "Your entries are kept" in person.problems[-1][1]
    from kneeboard.inputs.styles import load_style

    assert controller.outputs.save_style(lambda path: load_style(None), style_edit.target) is True and restyled


def _values(style) -> dict:
    """A style's keys as the style dialog gives them."""
    return {"organization": style.organization, "accent": style.accent, "font_scale": style.font_scale,
            "size": "4x6", "orientation": "landscape", "binding": style.binding,
            "front": ["header", "margin-table", "limits"]}


def test_the_app_and_the_command_line_make_the_same_card_with_a_fleet_style(qtbot, controller, fleet, tmp_path):
    (fleet / "fleet.style.toml").write_text('style = 1\nbank_angles = [0, 20, 40, 60]\nspeed_unit = "km/h"\n',
                                            encoding="utf-8")
    controller.open_folder(fleet)
    settle(qtbot, controller)
    app_card = read_card_data(controller.shown.pdf)[0]
    out = tmp_path / "cli.pdf"
    cli = subprocess.run([sys.executable, "-m", "kneeboard", "card", str(controller.doc.path), "-o", str(out)],
                         capture_output=True, text=True)
    assert cli.returncode == 0, cli.stderr
    assert app_card["figures"] == read_card_data(out.read_bytes())[0]["figures"]
    assert any("20°" in f["label"] for f in app_card["figures"])
