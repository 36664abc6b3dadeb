"""A newcomer's first minutes in the app: Ctrl+N, the placeholders of a new profile, the fleet's highlight following
the profile being edited, the confirmation of an export, and where the sample fleet lives."""

from pathlib import Path

from PySide6.QtCore import Qt
from PySide6.QtGui import QKeySequence

from kneeboard.app.fields import PLACEHOLDER_NOTE
from kneeboard.pipeline import PLACEHOLDER


def highlighted(window) -> list[str]:
    """The registrations the fleet highlights: selected or current (where the keyboard is)."""
    tree = window.fleet.tree
    rows = {index.row() for index in tree.selectionModel().selectedRows()}
    rows |= {tree.currentIndex().row()} if tree.currentIndex().isValid() else set()
    return sorted(tree.model().index(row, 1).data() for row in rows)


def test_ctrl_n_asks_the_category_offering_the_open_ones_and_opens_its_template(qtbot, window):
    assert window.act_new_profile.shortcut() == QKeySequence(QKeySequence.StandardKey.New)
    assert window.act_new_profile.shortcut().toString() == "Ctrl+N"
    offered = []
    window.ask_category = lambda current: offered.append(current) or "glider"
    window.activateWindow()
    qtbot.keyClick(window, Qt.Key.Key_N, Qt.KeyboardModifier.ControlModifier)  # as a person presses it
    qtbot.waitUntil(lambda: window.doc.path is None)
    assert offered == ["utility"]  # offered first: the category of the trainer that was open
    assert window.doc.loaded.profile.aircraft.category == "glider"
    assert highlighted(window) == []  # the new profile is none of the fleet's aircraft
    assert "template “Glider”" in window.statusBar().currentMessage()


def test_a_cancelled_question_leaves_the_open_profile(qtbot, window):
    path = window.doc.path
    window.act_new_profile.trigger()  # the window fixture answers nothing: cancelled
    assert window.doc.path == path and highlighted(window) == ["DEMO-TRN"]


def test_placeholder_notes_take_one_line_each_and_keep_the_sentence_on_hover(qtbot, window):
    window.act_new["normal"].trigger()
    fields = [f for f in window.editor.fields.values() if f.problem is not None and f.problem.message == PLACEHOLDER]
    assert len(fields) >= 5
    for f in fields:
        label = f.problem_label
        assert label.text() == PLACEHOLDER_NOTE
        lines = label.heightForWidth(f.input.width()) / label.fontMetrics().lineSpacing()
        assert lines < 1.5, (f.problem.path, lines)  # one line at the field's own width
        assert PLACEHOLDER in f.input.toolTip()
    # any other problem keeps its whole sentence under the field
    registration = window.editor.fields["aircraft.registration"]
    registration.input.setFocus()
    registration.input.selectAll()
    qtbot.keyClicks(registration.input, "X" * 20)
    assert registration.problem_label.text().startswith("Error: ") and "characters" in registration.problem_label.text()


def test_the_fleet_highlights_the_profile_being_edited(qtbot, window, fleet):
    assert highlighted(window) == ["DEMO-TRN"]
    window.ask_open_path = lambda *_: fleet / "demo_glider.toml"
    window.act_open.trigger()  # opened from the menu, not the list
    assert highlighted(window) == ["DEMO-GL"]
    window.fleet.reload.click()  # listed again: still the glider
    assert highlighted(window) == ["DEMO-GL"]
    window.act_new["normal"].trigger()
    registration = window.editor.fields["aircraft.registration"]
    registration.input.setFocus()
    qtbot.keyClick(registration.input, Qt.Key.Key_End)
    qtbot.keyClicks(registration.input, "7")  # an unsaved edit to the new profile
    assert window.doc.modified and highlighted(window) == []
    # a click on an aircraft, then Cancel at "save the changes?": the new profile stays, and nothing is highlighted
    window.answers.append("cancel")
    tree = window.fleet.tree
    tourer = next(tree.model().index(i, 1) for i in range(tree.model().rowCount())
                  if tree.model().index(i, 1).data() == "DEMO-TOUR")
    rect = tree.visualRect(tourer)
    qtbot.mouseClick(window.fleet.tree.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())
    assert window.doc.path is None and highlighted(window) == []
    window.ask_save_path = lambda *_: fleet / "mine.toml"
    window.act_save.trigger()
    assert highlighted(window) == ["NEW-17"]


def test_an_export_is_confirmed_in_the_status_bar_naming_the_file(qtbot, window, tmp_path):
    deep = tmp_path.joinpath(*["a folder with a long name"] * 8)  # longer than the room left of the caution
    deep.mkdir(parents=True)
    for action, name, what in ((window.act_export, "trainer card.pdf", "the card of DEMO-TRN"),
                               (window.act_export_csv, "trainer.csv", "the table of DEMO-TRN"),
                               (window.act_export_fleet, "all.pdf", "5 cards")):
        for folder in (tmp_path, deep):
            window.ask_save_path = lambda *_, f=folder, n=name: f / n
            action.trigger()
            assert (folder / name).is_file()
            message = window.statusBar().currentMessage()
            assert message.startswith(f"Exported {what}: {name} in ")
            # on screen, not hidden behind the caution: the message fits left of it
            assert window.statusBar().fontMetrics().horizontalAdvance(message) < window.caution.geometry().left()
        assert message.endswith(" with a long name") and "…" in message  # the folder shortened in its middle
    assert window.caution.isVisible()


def test_the_sample_fleet_lives_in_one_kneeboard_folder_and_the_fleet_says_where(qtbot, window, tmp_path,
                                                                                    monkeypatch):
    from kneeboard.app.places import data_folder, sample_fleet

    monkeypatch.setenv("HOME", str(tmp_path))
    monkeypatch.delenv("XDG_DATA_HOME", raising=False)
    assert data_folder() == tmp_path / ".local" / "share" / "kneeboard"  # not kneeboard/kneeboard
    folder = sample_fleet()
    assert folder == data_folder() / "sample fleet" and len(list(folder.glob("demo_*.toml"))) == 5
    assert (folder / "fleet.style.toml").is_file()  # the fleet's style, to edit
    window.ask_folder = lambda *_: folder
    window.act_open_folder.trigger()
    assert window.fleet.title.text() == "Fleet: sample fleet"
    assert window.fleet.where.isVisible() and window.fleet.where.text() == "in ~/.local/share/kneeboard"
    assert window.fleet.where.toolTip() == str(Path(folder))
