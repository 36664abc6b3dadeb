"""Nothing a person made is lost, as the window shows it: a style file that cannot be read, a recovery folder that
cannot be written, a profile past its limits. The flows themselves (saves over a changed file, restores after a
crash) are tested without a window in tests/test_app_controller.py and tests/test_app_recovery.py."""

import pytest
from PySide6.QtWidgets import QLabel


@pytest.mark.parametrize("broken", ['front = ["header"\n', "= 1\n", "[a]\n[a]\n"])
def test_an_unreadable_style_file_is_said_and_the_entries_are_kept(qtbot, window, fleet, broken):
    # saving into a style file that is not valid TOML raised an uncaught error: nothing saved, nothing shown
    target = fleet / "fleet.style.toml"
    target.write_text("# the club's style, half edited\n" + broken, encoding="utf-8")
    shown = []

    def answer(dialog):
        shown.append(dialog.values())
        if len(shown) == 1:
            dialog.organization.setText("Aeroklub Říčany (invented)")
            dialog.accent.setText("#224466")
        return len(shown) == 1  # saved the first time; cancelled when it comes back

    window.ask_style = answer
    window.act_edit_style.trigger()
    assert len(shown) == 2  # the dialog came back after the message
    assert shown[1]["organization"] == "Aeroklub Říčany (invented)" and shown[1]["accent"] == "#224466"
    title, text = window.problems_seen[-1]
    assert title == "The style was not saved" and "fleet.style.toml" in text and "not valid TOML" in text
    assert target.read_text(encoding="utf-8") == "# the club's style, half edited\n" + broken  # untouched
    assert window.isVisible()


# --- a recovery folder that cannot be written ------------------------------------------------------------------------


def test_a_recovery_folder_that_cannot_be_written_is_said_in_the_status_bar(qtbot, fleet, settings, tmp_path):
    # a file where the data folder belongs, as a read-only home does for anyone but root
    from kneeboard.app.window import MainWindow

    (tmp_path / "data").write_text("a file where a folder belongs")
    w = MainWindow(settings, recovery_dir=tmp_path / "data" / "recovery")
    qtbot.addWidget(w)
    w.show()
    w.controller.open_profile(fleet / "demo_trainer.toml")
    w.editor.fields["weight.total"].edited.emit("1450 lb")
    w.controller.autosave_timer.setInterval(20)  # the tick, as it comes every few seconds
    note = w.recovery_note
    qtbot.waitUntil(note.isVisible, timeout=10_000)
    assert isinstance(note, QLabel) and "Crash recovery is off" in note.text()
    assert str(tmp_path / "data" / "recovery") in note.text() + note.toolTip()
    (tmp_path / "data").unlink()  # the person makes room: the next tick copies the edits aside again
    qtbot.waitUntil(note.isHidden, timeout=10_000)
    assert "copied aside again" in w.statusBar().currentMessage()
    w.ask_unsaved = lambda: "discard"
    w.close()


# --- a profile past its limits -----------------------------------------------------------------------------------


def huge(fleet, configurations=10_000, items=0):
    text = (fleet / "demo_trainer.toml").read_text(encoding="utf-8").split("[[configuration]]")[0]
    text = text.replace('total = "1560 lb"', 'empty = "1100 lb"') if items else text
    text += "".join(f'[[weight.item]]\nname = "Bag {n}"\nmass = "1 lb"\n' for n in range(items))
    text += "".join(f'[[configuration]]\nname = "C{n}"\nstall_speed = "50 kt"\n' for n in range(configurations))
    return text


@pytest.mark.parametrize("configurations, items, refused", [(10_000, 0, "configuration"),
                                                            (2, 5_000, "weight.item")])
def test_a_profile_past_its_limits_is_refused_before_widgets_are_built(qtbot, window, fleet, configurations, items,
                                                                       refused):
    # 10,000 configurations froze the app for more than 90 s and 2.5 GB: a tab for each was built before the limit
    path = fleet / "huge.toml"
    path.write_text(huge(fleet, configurations, items), encoding="utf-8")
    assert window.controller.open_profile(path)
    editor = window.editor
    assert editor.config_tabs.count() <= 12
    assert editor.fields["weight.item"].input.rowCount() <= 40
    said = [text for _title, text in window.problems_seen]
    assert any(f"{refused}: must be" in text for text in said)  # the command line's own words
    listed = [editor.problem_list.item(i).text() for i in range(editor.problem_list.count())]
    assert any(f"{refused}: must be" in line for line in listed)
    assert not editor.fields["aircraft.model"].isEnabled()  # nothing to edit into a partial view of the lists
    qtbot.waitUntil(lambda: window.preview.error_text().startswith("NOT CURRENT"), timeout=10_000)  # no card


def test_a_change_on_disk_past_the_limits_is_refused_and_undo_comes_back(qtbot, window, fleet):
    path = fleet / "demo_trainer.toml"
    before = path.read_text(encoding="utf-8")
    path.write_text(huge(fleet), encoding="utf-8")  # another program writes it while the app has it open
    qtbot.waitUntil(lambda: window.doc.text() != before, timeout=10_000)
    assert window.editor.config_tabs.count() <= 12 and not window.editor.fields["aircraft.model"].isEnabled()
    window.act_undo.trigger()
    assert window.doc.text() == before and window.editor.fields["aircraft.model"].isEnabled()
    assert window.editor.config_tabs.count() == 2
