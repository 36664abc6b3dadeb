"""Nothing a person made is lost: a style file that cannot be read, saves a few milliseconds apart, a restore over a
file another program changed, a recovery folder that cannot be written."""

import json

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


# --- saving over the open file by another path ---------------------------------------------------------------------


def test_save_as_through_a_linked_folder_onto_the_open_file_asks_first(qtbot, window, fleet, tmp_path):
    # the paths were compared as text: the open file reached through a link was overwritten without a question
    window.editor.fields["weight.total"].edited.emit("1450 lb")
    theirs = (fleet / "demo_trainer.toml").read_text(encoding="utf-8").replace('total = "1560 lb"',
                                                                               'total = "1600 lb"')
    (fleet / "demo_trainer.toml").write_text(theirs, encoding="utf-8")  # another program's change
    link = tmp_path / "linked_fleet"
    link.symlink_to(fleet, target_is_directory=True)
    window.ask_save_path = lambda *_: link / "demo_trainer.toml"
    window.conflicts.append("cancel")
    window.act_save_as.trigger()
    assert window.conflicts == []  # the question was asked
    assert (fleet / "demo_trainer.toml").read_text(encoding="utf-8") == theirs  # their change kept
    assert window.doc.get(("weight", "total")) == "1450 lb" and window.doc.modified  # and mine still here


# --- restoring after a crash -----------------------------------------------------------------------------------------


def crashed_edits(qtbot, window, settings, tmp_path, text="1450 lb"):
    """Edits copied aside, then the window's process "gone": a new window on the same data folder."""
    from test_recovery import crash, new_window

    window.editor.fields["weight.total"].edited.emit(text)
    window.autosave()
    window.autosave_timer.stop()
    crash(tmp_path / "recovery")
    w2 = new_window(qtbot, settings, tmp_path / "recovery")
    w2.problems_seen = []
    w2.show_problems = lambda title, text: w2.problems_seen.append((title, text))
    w2.ask_restore = lambda pending: True
    return w2


@pytest.mark.parametrize("answer", ["restore", "theirs", "later"])
def test_a_restore_over_a_file_changed_since_the_crash_asks(qtbot, window, settings, tmp_path, fleet, answer):
    # the restore silently reverted another program's change made while the app was down
    w2 = crashed_edits(qtbot, window, settings, tmp_path)
    profile = fleet / "demo_trainer.toml"
    theirs = profile.read_text(encoding="utf-8").replace('total = "1560 lb"', 'total = "1600 lb"')
    profile.write_text(theirs, encoding="utf-8")
    asked = []
    w2.ask_restore_changed = lambda pending: asked.append(pending.path.name) or answer
    w2.open_folder(fleet)
    restored = w2.offer_recovery()
    assert asked == ["demo_trainer.toml"]
    assert profile.read_text(encoding="utf-8") == theirs  # nothing written behind the person's back
    records = list((tmp_path / "recovery").glob("*.json"))
    if answer == "restore":
        assert restored == 1 and w2.doc.get(("weight", "total")) == "1450 lb" and w2.doc.modified
        assert w2.doc.undo_stack.canUndo()  # one undoable step back to theirs
    else:
        assert restored == 0 and w2.doc.get(("weight", "total")) == "1600 lb"
        assert len(records) == (1 if answer == "later" else 0)  # put off: offered again; theirs: discarded


def test_a_restore_over_an_unchanged_file_asks_nothing_more(qtbot, window, settings, tmp_path, fleet):
    w2 = crashed_edits(qtbot, window, settings, tmp_path)
    w2.ask_restore_changed = lambda pending: pytest.fail("the file did not change; nothing to ask")
    w2.open_folder(fleet)
    assert w2.offer_recovery() == 1 and w2.doc.get(("weight", "total")) == "1450 lb"


def test_a_record_of_another_host_name_is_offered_and_named(qtbot, window, settings, tmp_path, fleet):
    # written under the machine's previous name: it was never offered, never named
    window.editor.fields["weight.total"].edited.emit("1450 lb")
    record_file = window.autosave()
    window.autosave_timer.stop()
    record = json.loads(record_file.read_text(encoding="utf-8"))
    record["owner"]["host"] = "old-name-of-this-machine"
    record_file.write_text(json.dumps(record), encoding="utf-8")
    from test_recovery import new_window

    w2 = new_window(qtbot, settings, tmp_path / "recovery")
    offered = []
    w2.ask_restore = lambda pending: offered.append(pending.host) or False  # seen, then discarded
    w2.open_folder(fleet)
    assert w2.offer_recovery() == 0
    assert offered == ["old-name-of-this-machine"]
    assert not record_file.exists()  # discarded as the person chose


# --- a recovery folder that cannot be written ------------------------------------------------------------------------


@pytest.mark.parametrize("blocked", ["data", "data/recovery"])
def test_a_recovery_folder_that_cannot_be_written_is_said_once(qtbot, fleet, settings, tmp_path, blocked):
    # a file where the data folder (or the recovery folder) belongs, as a read-only home does for anyone but root:
    # recovery switched off without a word, with a traceback at every autosave tick
    from kneeboard.app.window import MainWindow

    if blocked != "data":
        (tmp_path / "data").mkdir()
    (tmp_path / blocked).write_text("a file where a folder belongs")
    w = MainWindow(settings, recovery_dir=tmp_path / "data" / "recovery")
    qtbot.addWidget(w)
    w.show()
    w.open_profile(fleet / "demo_trainer.toml")
    w.editor.fields["weight.total"].edited.emit("1450 lb")
    assert w.autosave() is None  # the tick answers, no traceback
    note = w.recovery_note
    assert isinstance(note, QLabel) and note.isVisible()
    assert "Crash recovery is off" in note.text() and str(tmp_path / "data" / "recovery") in note.text()
    shown = note.text()
    w.editor.fields["weight.total"].edited.emit("1460 lb")
    assert w.autosave() is None and note.text() == shown  # said once, retried quietly
    (tmp_path / blocked).unlink()  # the person makes room: the next tick copies the edits aside again
    assert w.autosave() is not None and note.isHidden()
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
    assert window.open_profile(path)
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
