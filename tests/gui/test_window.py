"""The main window driven as a person drives it: typing, undo, saving, prompts, broken files, exports."""

import io
from pathlib import Path

import pytest
from pypdf import PdfReader
from PySide6.QtCore import Qt
from PySide6.QtGui import QKeySequence

from kneeboard.card.geometry import CARD_SIZES

LB = 0.45359237


def settle(qtbot, w, timeout=10_000):
    """Let the debounce fire and the preview finish."""
    qtbot.wait(w.timer.interval() + 20)
    assert w.preview.wait_idle(timeout)


def type_into(qtbot, field, text):
    field.input.setFocus()
    field.input.selectAll()
    qtbot.keyClicks(field.input, text)


def test_opens_on_the_fleet_with_marks(window, fleet):
    regs = [r[1] for r in window.fleet.rows()]
    assert regs == sorted(regs) and "DEMO-TRN" in regs and len(regs) == 5
    assert "DEMO-TRN" in window.windowTitle() and "demo_trainer.toml" in window.windowTitle()
    assert window.preview.page_count() == 2


def test_typing_a_weight_updates_model_readout_and_preview(qtbot, window):
    before = window.readout.figures["weight"]
    type_into(qtbot, window.editor.fields["weight.total"], "1450 lb")
    settle(qtbot, window)
    assert window.doc.get(("weight", "total")) == "1450 lb"
    assert window.doc.loaded.profile.weight == pytest.approx(1450 * LB)
    assert window.readout.figures["weight"] == "1450 lb" != before
    shown = PdfReader(io.BytesIO(window.preview.pdf_bytes())).pages[0].extract_text()
    assert "1450 lb" in shown
    assert window.isWindowModified()


def test_other_units_convert_beside_the_field(qtbot, window):
    field = window.editor.fields["weight.total"]
    type_into(qtbot, field, "700 kg")
    assert field.beside.text() == "= 1543 lb"
    stall = window.editor.fields["configuration[1].stall_speed"]
    type_into(qtbot, stall, "90 km/h")
    assert stall.beside.text() == "= 48.6 kt"
    assert window.doc.loaded.profile.configurations[0].stall_speed == pytest.approx(25.0)


def test_invalid_entry_is_marked_kept_and_blocks_nothing(qtbot, window):
    field = window.editor.fields["weight.total"]
    type_into(qtbot, field, "1450 kt")
    settle(qtbot, window)
    assert field.problem is not None and "mass" in field.problem.message
    assert field.problem_label.isVisible() and "expected a mass" in field.problem_label.text()
    assert field.input.text() == "1450 kt" and window.doc.get(("weight", "total")) == "1450 kt"
    assert window.preview_note.isVisible() and "error" in window.preview_note.text()
    # the rest of the window still works
    type_into(qtbot, window.editor.fields["aircraft.model"], "Renamed trainer (invented)")
    assert window.doc.get(("aircraft", "model")) == "Renamed trainer (invented)"


@pytest.mark.parametrize("key, text, marked, says", [
    ("weight.total", "2000 lb", "weight", "above the maximum"),
    ("configuration[1].pattern_factor", "0.9", "configuration[1].pattern_factor", "out of range"),
    ("configuration[1].pattern_factor", "1.2", "configuration[1].pattern_factor", "below 1.3"),
    ("card.bank_angles", "0, 30, 90", "card.bank_angles", "bank angle"),
])
def test_unflyable_values_are_explained(qtbot, window, key, text, marked, says):
    type_into(qtbot, window.editor.fields[key], text)
    settle(qtbot, window)
    assert window.isVisible()
    field = window.editor.fields[marked]
    assert field.problem is not None and says in field.problem.message
    assert field.problem_label.isVisible()


def test_undo_and_redo(qtbot, window):
    original = window.doc.text()
    type_into(qtbot, window.editor.fields["weight.total"], "1500 lb")
    type_into(qtbot, window.editor.fields["card.buffer"], "8 kt")
    assert window.doc.undo_stack.count() == 2  # each field's typing is one step
    window.act_undo.trigger()
    assert window.doc.get(("card", "buffer")) == "5 kt"
    assert window.editor.fields["card.buffer"].input.text() == "5 kt"
    window.act_undo.trigger()
    assert window.doc.text() == original and not window.isWindowModified()
    window.act_redo.trigger()
    assert window.doc.get(("weight", "total")) == "1500 lb"


def test_save_and_reopen_round_trip(qtbot, window, fleet):
    path = fleet / "demo_trainer.toml"
    untouched = path.read_bytes()
    assert window.save()
    assert path.read_bytes() == untouched  # saving without edits changes nothing
    type_into(qtbot, window.editor.fields["weight.total"], "1500 lb")
    edited = window.doc.text()
    assert window.save()
    assert path.read_text() == edited and not window.isWindowModified()
    window.open_profile(fleet / "demo_tourer.toml")
    window.open_profile(path)
    assert window.doc.text() == edited
    assert window.editor.fields["weight.total"].input.text() == "1500 lb"


def test_unsaved_changes_prompt(qtbot, window, fleet):
    type_into(qtbot, window.editor.fields["weight.total"], "1500 lb")
    window.answers = ["cancel"]
    assert not window.open_profile(fleet / "demo_tourer.toml")
    assert window.doc.path.name == "demo_trainer.toml" and window.doc.modified
    window.answers = ["discard"]
    assert window.open_profile(fleet / "demo_tourer.toml")
    assert window.doc.path.name == "demo_tourer.toml"
    assert "1500 lb" not in (fleet / "demo_trainer.toml").read_text()


def test_close_asks_and_can_be_cancelled(qtbot, window, fleet):
    type_into(qtbot, window.editor.fields["card.buffer"], "9 kt")
    window.answers = ["cancel"]
    assert not window.close()
    assert window.isVisible()
    window.answers = ["save"]
    assert window.close()
    assert 'buffer = "9 kt"' in (fleet / "demo_trainer.toml").read_text()


def test_broken_files_show_problems_and_keep_the_app(qtbot, window, fleet):
    bad_toml = fleet / "zz_broken.toml"
    bad_toml.write_text("[aircraft\nregistration = ")
    assert not window.open_profile(bad_toml)
    assert window.problems_seen and "zz_broken.toml" in window.problems_seen[-1][0]
    assert window.doc.path.name == "demo_trainer.toml"  # what was open stays open
    bad_values = fleet / "zz_values.toml"
    bad_values.write_text((fleet / "demo_trainer.toml").read_text().replace('"48 kt"', '"48 kg"'))
    window.fleet.show_folder(fleet)
    marks = {r[1]: r[0] for r in window.fleet.rows()}
    assert marks["zz_broken"] == "error" and marks["DEMO-TRN"] == ""
    assert window.open_profile(bad_values)
    assert "configuration[1].stall_speed" in window.problems_seen[-1][1]
    assert window.editor.fields["configuration[1].stall_speed"].problem is not None


def test_configurations_add_duplicate_move_remove(qtbot, window):
    ed = window.editor
    ed.config_buttons["Duplicate"].click()
    assert [c.name for c in window.doc.loaded.profile.configurations] == ["Flaps up", "Flaps up (copy)", "Flaps full"]
    ed.config_tabs.setCurrentIndex(1)
    ed.config_buttons["Move right"].click()
    assert [c.name for c in window.doc.loaded.profile.configurations] == ["Flaps up", "Flaps full", "Flaps up (copy)"]
    ed.config_buttons["Remove"].click()
    assert [c.name for c in window.doc.loaded.profile.configurations] == ["Flaps up", "Flaps full"]
    ed.config_buttons["Add"].click()
    assert len(window.doc.loaded.profile.configurations) == 3
    assert ed.config_tabs.count() == 3
    # a fixed pattern speed instead of the factor
    mode = ed.fields["configuration[1].pattern_mode"]
    mode.edited.emit("fixed")
    assert window.doc.get(("configuration", 0, "pattern_speed")) == "66 kt"
    assert window.doc.get(("configuration", 0, "pattern_factor")) is None


def test_weight_build_up_with_fuel_by_volume(qtbot, window):
    ed = window.editor
    ed.weight_mode.edited.emit("build-up")
    assert window.doc.get(("weight", "empty")) == "1560 lb"
    type_into(qtbot, ed.fields["weight.empty"], "1100 lb")
    ed.fields["weight.item"].add.click()
    items = ed.fields["weight.item"]
    items.input.item(0, 1).setText("100 L")
    assert window.doc.get(("weight", "item"))[0] == {"name": "New item", "volume": "100 L"}
    assert window.doc.loaded.profile.weight == pytest.approx(1100 * LB + 72.0)


def test_preview_page_size_follows_the_style(qtbot, window):
    w, h = window.preview.page_size_points(0).width(), window.preview.page_size_points(0).height()
    assert (w, h) == pytest.approx(CARD_SIZES["a5"], abs=0.1)
    window.style = window.style.with_changes(size="4x6")
    window.schedule_preview()
    settle(qtbot, window)
    size = window.preview.page_size_points(0)
    assert (size.width(), size.height()) == pytest.approx(CARD_SIZES["4x6"], abs=0.1)


def test_compare_with_saved_lists_exactly_the_changed_figures(qtbot, window):
    assert window.compare_changes() == []
    type_into(qtbot, window.editor.fields["weight.total"], "1300 lb")
    changes = window.compare_changes()
    labels = {c.label for c in changes}
    assert "weight" in labels
    assert all(c.old != c.new for c in changes)
    assert not any("load factor" in label for label in labels)  # load factors do not depend on weight
    dialog = window.compare_with_saved()
    assert dialog.row_count() == len(changes)


def test_exports(qtbot, window, tmp_path):
    window.ask_save_path = lambda *_: tmp_path / "card.pdf"
    path = window.export_card()
    assert len(PdfReader(str(path)).pages) == 2
    window.ask_save_path = lambda *_: tmp_path / "table.csv"
    csv = window.export_csv()
    assert csv.read_text().startswith("registration,configuration")
    batch = window.export_fleet(each=tmp_path / "each")
    assert sorted(p.name for p in (tmp_path / "each").iterdir()) == sorted(
        f"{r[1]}.pdf" for r in window.fleet.rows())
    assert not batch.failures


def test_new_profile_from_template_then_save_as(qtbot, window, fleet):
    window.new_profile("glider")
    assert window.doc.path is None and window.doc.loaded.profile.aircraft.category == "glider"
    assert "new profile" in window.windowTitle()
    window.ask_save_path = lambda *_: fleet / "new_glider.toml"
    assert window.save()
    assert (fleet / "new_glider.toml").is_file()
    assert "NEW-GL" in [r[1] for r in window.fleet.rows()]


def test_recent_files_and_drop(qtbot, window, fleet, settings):
    window.open_profile(fleet / "demo_glider.toml")
    assert window.recent()[:2] == [str(fleet / "demo_glider.toml"), str(fleet / "demo_trainer.toml")]
    from PySide6.QtCore import QMimeData, QPointF, QUrl
    from PySide6.QtGui import QDropEvent

    mime = QMimeData()
    mime.setUrls([QUrl.fromLocalFile(str(fleet / "demo_microlight.toml"))])
    event = QDropEvent(QPointF(10, 10), Qt.DropAction.CopyAction, mime, Qt.MouseButton.NoButton,
                       Qt.KeyboardModifier.NoModifier)
    window.dropEvent(event)
    assert window.doc.path == Path(fleet / "demo_microlight.toml")


def test_standard_shortcuts(window):
    assert window.act_save.shortcut() == QKeySequence(QKeySequence.StandardKey.Save)
    assert window.act_undo.shortcut() == QKeySequence(QKeySequence.StandardKey.Undo)
    assert window.act_open.shortcut() == QKeySequence(QKeySequence.StandardKey.Open)


def test_the_caution_is_always_on_screen(window):
    assert window.caution.isVisible()
    assert "flight manual and local regulations govern" in window.caution.text()
    assert "coordinated, level flight at the stated weight" in window.caution.text()
