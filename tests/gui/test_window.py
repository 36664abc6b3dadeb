"""The main window driven as a person drives it: typing, undo, the menus, the fleet list, the card on screen.

The flows behind the menus (opening, saving, changes on disk, exports, compare, the renders) are tested without a
window in tests/test_app_*.py; here the menus are triggered and the widgets read, as a person uses them.
"""

import csv
import io
from pathlib import Path

import pytest
from conftest import check_fleet, fleet_rows
from conftest import settle as settle_controller
from pypdf import PdfReader
from PySide6.QtCore import Qt
from PySide6.QtGui import QKeySequence
from PySide6.QtWidgets import QLabel, QMenu, QMessageBox

from kneeboard import terms
from kneeboard.app.dialogs import CompareDialog
from kneeboard.card.data import read_card_data
from kneeboard.card.geometry import CARD_SIZES

LB = 0.45359237


def settle(qtbot, w):
    """Let the debounce fire and the preview finish."""
    settle_controller(qtbot, w.controller)


def type_into(qtbot, field, text):
    field.input.setFocus()
    field.input.selectAll()
    qtbot.keyClicks(field.input, text)


def test_opens_on_the_fleet_with_marks(qtbot, window, fleet):
    (fleet / "zz_broken.toml").write_text("[aircraft\n", encoding="utf-8")
    window.fleet.reload.click()
    check_fleet(qtbot, window.controller)
    tree = window.fleet.tree
    regs = [tree.model().index(i, 1).data() for i in range(tree.model().rowCount())]
    assert regs == sorted(regs) and "DEMO-TRN" in regs and len(regs) == 6
    broken = tree.model().index(regs.index("zz_broken"), 0)
    assert not broken.data(Qt.ItemDataRole.DecorationRole).isNull()  # the mark's icon
    assert "not valid TOML" in broken.data(Qt.ItemDataRole.ToolTipRole)  # and its reason on hover
    assert tree.model().index(regs.index("DEMO-TRN"), 0).data(Qt.ItemDataRole.DecorationRole) is None
    assert tree.currentIndex().row() == regs.index("DEMO-TRN")  # the profile being edited is highlighted
    assert "DEMO-TRN" in window.windowTitle() and "demo_trainer.toml" in window.windowTitle()
    assert window.preview.page_count() == 2


def test_typing_a_weight_updates_model_readout_and_preview(qtbot, window):
    before = window.readout.figures[terms.CARD_WEIGHT]
    fingerprint = window.readout.figures[terms.FINGERPRINT]
    type_into(qtbot, window.editor.fields["weight.total"], "1450 lb")
    settle(qtbot, window)
    # the key figures show the fingerprint the card prints, and it follows the edit
    assert window.readout.figures[terms.FINGERPRINT] == window.doc.loaded.fingerprint != fingerprint
    assert window.doc.get(("weight", "total")) == "1450 lb"
    assert window.doc.loaded.profile.weight == pytest.approx(1450 * LB)
    assert window.readout.figures[terms.CARD_WEIGHT] == "1450 lb" != before
    shown = PdfReader(io.BytesIO(window.preview.pdf_bytes())).pages[0].extract_text()
    assert "1450 lb" in shown and f"fingerprint {window.doc.loaded.fingerprint}" in shown
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
    ("configuration[1].pattern_factor", "1.2", "configuration[1].pattern_factor", "least usual 1.3"),
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


def test_close_asks_and_can_be_cancelled(qtbot, window, fleet):
    type_into(qtbot, window.editor.fields["card.buffer"], "9 kt")
    window.answers = ["cancel"]
    assert not window.close()
    assert window.isVisible()
    window.answers = ["save"]
    assert window.close()
    assert 'buffer = "9 kt"' in (fleet / "demo_trainer.toml").read_text()


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


def test_preview_page_size_follows_the_style_file_chosen_in_the_menu(qtbot, window, tmp_path):
    w, h = window.preview.page_size_points(0).width(), window.preview.page_size_points(0).height()
    assert (w, h) == pytest.approx(CARD_SIZES["a5"], abs=0.1)
    small = tmp_path / "small.style.toml"
    small.write_text('style = 1\nsize = "4x6"\nfront = ["header", "margin-table", "limits"]\n')
    window.ask_open_path = lambda *_: small
    window.act_pick_style.trigger()
    settle(qtbot, window)
    size = window.preview.page_size_points(0)
    assert (size.width(), size.height()) == pytest.approx(CARD_SIZES["4x6"], abs=0.1)
    window.act_folder_style.trigger()  # back to the folder's (here: the default) style
    settle(qtbot, window)
    assert window.preview.page_size_points(0).width() == pytest.approx(CARD_SIZES["a5"][0], abs=0.1)


def test_changes_since_saved_lists_exactly_the_changed_figures(qtbot, window):
    type_into(qtbot, window.editor.fields["weight.total"], "1300 lb")
    changes = window.controller.outputs.compare_changes()
    window.act_compare_saved.trigger()
    (dialog,) = window.findChildren(CompareDialog)
    assert dialog.row_count() == len(changes) > 0
    assert terms.CARD_WEIGHT in [figure for figure, _old, _new in dialog.rows()]
    assert [dialog.table.horizontalHeaderItem(j).text() for j in range(3)] == [
        "Figure", "In the saved file", "With your edits"]


def test_exports_from_the_menu(qtbot, window, tmp_path):
    window.ask_save_path = lambda *_: tmp_path / "card.pdf"
    window.act_export.trigger()
    path = tmp_path / "card.pdf"
    assert len(PdfReader(str(path)).pages) == 2
    assert path.read_bytes() == window.preview.pdf_bytes()  # the very bytes the preview shows
    assert "card.pdf" in window.statusBar().currentMessage()
    window.ask_save_path = lambda *_: tmp_path / "table.csv"
    window.act_export_csv.trigger()
    # UTF-8 with its byte-order mark, so a spreadsheet program reads the degree and limit signs as written
    exported = (tmp_path / "table.csv").read_bytes()
    assert exported.startswith(b"\xef\xbb\xbfregistration,card_weight_")
    rows = list(csv.DictReader(io.StringIO(exported.decode("utf-8-sig"))))
    assert rows[-1]["note"].startswith("CAUTION") and rows[-1]["fingerprint"] == window.doc.loaded.fingerprint
    window.ask_save_path = lambda *_: tmp_path / "fleet.pdf"
    window.act_export_fleet.trigger()  # the menu item: it once received `checked` as its output path
    found = read_card_data((tmp_path / "fleet.pdf").read_bytes())
    assert sorted(d["registration"] for d in found) == sorted(r[1] for r in fleet_rows(window.controller))
    assert not window.problems_seen


def test_compare_with_the_printed_card_after_saving(qtbot, window, tmp_path):
    """Export, change the weight, save (the natural order), compare: the printed card is out of date."""
    window.ask_save_path = lambda *_: tmp_path / "DEMO-TRN.pdf"
    window.act_export.trigger()
    window.act_compare_printed.trigger()
    (dialog,) = window.findChildren(CompareDialog)
    assert dialog.row_count() == 0 and "No printed figure changed" in dialog.summary.text()
    dialog.close()
    dialog.deleteLater()  # the window owns its dialogs: Qt deletes it, once
    qtbot.waitUntil(lambda: not window.findChildren(CompareDialog), timeout=2000)
    type_into(qtbot, window.editor.fields["weight.total"], "1300 lb")
    window.act_save.trigger()
    assert not window.doc.modified
    window.act_compare_printed.trigger()
    (dialog,) = window.findChildren(CompareDialog)
    rows = {figure: (old, new) for figure, old, new in dialog.rows()}
    assert rows[terms.CARD_WEIGHT] == ("1560 lb", "1300 lb")
    assert "print a new card" in dialog.summary.text() and "DEMO-TRN.pdf" in dialog.summary.text()


def test_edit_the_fleet_style_from_the_menu(qtbot, window, fleet):
    def answer(dialog):
        dialog.organization.setText("Aeroklub Říčany (invented)")
        sizes = [dialog.size.itemText(i) for i in range(dialog.size.count())]
        assert "5 x 8 in" in sizes and "4 x 6 in" in sizes  # sizes say inches
        # the open profile's card, counted with the dialog's values as they change
        layout = window.controller.session.card(window.doc.loaded).layout
        faces = dialog.findChild(QLabel, "faces")
        assert faces.text().startswith(f"{layout.cards} card{'s' if layout.cards > 1 else ''}, {layout.faces} face")
        dialog.size.setCurrentIndex(dialog.size.findData("4x6"))
        dialog.orientation.setCurrentIndex(dialog.orientation.findData("landscape"))
        cards = int(faces.text().split()[0])
        assert cards > layout.cards and "faces" in faces.text()  # a 4x6 landscape card takes a card set
        dialog.orientation.setCurrentIndex(dialog.orientation.findData("portrait"))
        dialog.size.setCurrentIndex(dialog.size.findData("5x8"))
        return True

    window.ask_style = answer
    window.act_edit_style.trigger()
    assert 'organization = "Aeroklub Říčany (invented)"' in (fleet / "fleet.style.toml").read_text(encoding="utf-8")
    settle(qtbot, window)
    assert 'size = "5x8"' in (fleet / "fleet.style.toml").read_text(encoding="utf-8")
    assert "Aeroklub" in PdfReader(io.BytesIO(window.preview.pdf_bytes())).pages[0].extract_text()
    assert window.preview.page_size_points(0).width() == pytest.approx(CARD_SIZES["5x8"][0], abs=0.1)


def test_new_profile_from_template_then_save_as(qtbot, window, fleet):
    window.act_new["glider"].trigger()
    assert window.doc.path is None and window.doc.loaded.profile.aircraft.category == "glider"
    assert "new profile" in window.windowTitle()
    assert not window.fleet.tree.currentIndex().isValid()  # the new profile is none of the fleet's aircraft
    placeholders = [p for p in window.doc.loaded.warnings if "placeholder" in p.message]
    assert placeholders and window.editor.all_clear.isHidden()
    window.ask_save_path = lambda *_: fleet / "new_glider.toml"
    window.act_save.trigger()
    assert (fleet / "new_glider.toml").is_file() and not window.doc.modified
    assert "NEW-GL" in [r[1] for r in fleet_rows(window.controller)]


def test_an_empty_folder_says_what_to_do_and_closes_the_other_fleets_aircraft(qtbot, window, tmp_path):
    empty = tmp_path / "empty"
    empty.mkdir()
    window.ask_folder = lambda *_: empty
    window.act_open_folder.trigger()
    assert window.fleet.hint.isVisible() and "New profile from template" in window.fleet.hint.text()
    assert window.doc is None and window.preview.page_count() == 0
    for action in (window.act_export, window.act_print, window.act_compare_printed):
        action.trigger()
    assert [title for title, _ in window.problems_seen] == ["No card"] * 3


def test_every_menu_item_answers_without_an_exception(qtbot, window, monkeypatch):
    seen = []
    for name in ("information", "warning", "question"):
        monkeypatch.setattr(QMessageBox, name, staticmethod(lambda *a, **k: seen.append(a[1])))
    window.ask_save_path = window.ask_open_path = window.ask_folder = lambda *_: None  # every file dialog cancelled
    window.ask_style = lambda dialog: False
    monkeypatch.setattr("kneeboard.app.printing.print_with_dialog", lambda *a: False)
    actions = [a for menu in window.menuBar().findChildren(QMenu) for a in menu.actions()
               if a.text() and not a.isSeparator() and a.menu() is None and a is not window.act_quit]
    assert len(actions) >= 20
    for action in actions:
        action.trigger()
        qtbot.wait(1)
    assert window.isVisible() and window.doc is not None
    window.close()


def test_recent_files_and_drop(qtbot, window, fleet, settings):
    window.ask_open_path = lambda *_: fleet / "demo_glider.toml"
    window.act_open.trigger()
    recent = [a.text() for a in window.recent_menu.actions()]
    assert recent[:2] == [str(fleet / "demo_glider.toml"), str(fleet / "demo_trainer.toml")]
    window.recent_menu.actions()[1].trigger()
    assert window.doc.path == fleet / "demo_trainer.toml"
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


def test_the_form_stays_put_when_a_problem_appears(qtbot, window):
    field = window.editor.fields["aircraft.registration"]
    before = field.mapTo(window.editor.widget(), field.rect().topLeft()).y()
    type_into(qtbot, window.editor.fields["weight.total"], "1450 kt")
    qtbot.wait(20)
    assert window.editor.problem_list.isVisible() and window.editor.all_clear.isHidden()
    assert field.mapTo(window.editor.widget(), field.rect().topLeft()).y() == before


def test_a_sink_rate_converts_to_the_cards_sink_unit(qtbot, window, fleet):
    window.controller.open_profile(fleet / "demo_glider.toml")  # a metric card: sink rates in m/s
    field = window.editor.fields["aircraft.best_glide_sink"]
    type_into(qtbot, field, "780 fpm")
    assert field.beside.text() == "= 4.0 m/s"  # 780 ft/min = 3.96 m/s
