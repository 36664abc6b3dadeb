"""Saves never overwrite what someone else wrote: a change on disk is noticed, and the person decides.

Another program (here: a plain write, or fileio's atomic replace as an editor would do it) or a
second window changes the open file; the document notices (watcher and a check before every
save), and the window asks through its `ask_conflict` hook: reload theirs, keep mine, save mine
elsewhere, or cancel. Nothing either side wrote is lost.
"""

import os

import pytest

from kneeboard import fileio
from kneeboard.app.document import SaveConflict
from kneeboard.fileio import FileProblem

WATCH_MS = 10_000  #: how long to wait for the file watcher's signal; reached only when it never comes


@pytest.fixture
def profile(tmp_path, minimal_text):
    path = tmp_path / "p.toml"
    path.write_text(minimal_text)
    return path


def theirs(text: str) -> str:
    return text.replace('"750 kg"', '"760 kg"')


def edit(window, text="1450 lb"):
    window.editor.fields["weight.total"].edited.emit(text)


def second_window(qtbot, settings, tmp_path, path):
    from kneeboard.app.window import MainWindow

    w = MainWindow(settings, recovery_dir=tmp_path / "recovery2")
    qtbot.addWidget(w)
    w.problems_seen = []
    w.show_problems = lambda title, text: w.problems_seen.append((title, text))
    w.ask_unsaved = lambda: "discard"
    assert w.open_profile(path)
    return w


# --- the document -------------------------------------------------------------------------------


def test_a_change_on_disk_stops_the_save(qtbot, open_document, profile, minimal_text):
    doc = open_document(profile)
    assert not doc.changed_on_disk()
    doc.set(("aircraft", "model"), "Mine (invented)")
    profile.write_text(theirs(minimal_text))  # written in place, as some programs do
    assert doc.changed_on_disk()
    with pytest.raises(SaveConflict, match="changed on disk") as err:
        doc.save()
    assert isinstance(err.value, FileProblem)
    assert profile.read_text() == theirs(minimal_text) and doc.modified  # theirs intact, mine still here
    doc.save(force=True)
    assert "Mine (invented)" in profile.read_text() and not doc.changed_on_disk() and not doc.modified


def test_own_saves_and_touches_are_no_change(qtbot, open_document, profile):
    doc = open_document(profile)
    doc.set(("aircraft", "model"), "Mine (invented)")
    doc.save()
    assert not doc.changed_on_disk()
    os.utime(profile, ns=(1, 1))  # the time changes, the bytes do not
    assert not doc.changed_on_disk()
    doc.set(("aircraft", "model"), "Mine again (invented)")
    doc.save()
    assert "Mine again" in profile.read_text()


def test_a_deleted_file_is_a_change(qtbot, open_document, profile):
    doc = open_document(profile)
    profile.unlink()
    assert doc.changed_on_disk()
    with pytest.raises(SaveConflict):
        doc.save()
    assert not profile.exists()
    doc.save(force=True)
    assert profile.is_file()


def test_reload_is_one_undoable_step(qtbot, open_document, profile, minimal_text):
    doc = open_document(profile)
    doc.set(("aircraft", "model"), "Mine (invented)")
    mine = doc.text()
    fileio.write_atomic(profile, theirs(minimal_text))
    doc.reload_from_disk()
    assert doc.text() == theirs(minimal_text) and not doc.modified and not doc.changed_on_disk()
    doc.undo_stack.undo()
    assert doc.text() == mine and doc.modified  # my edits are one undo away
    doc.undo_stack.redo()
    doc.save()
    assert profile.read_text() == theirs(minimal_text)


def test_the_watcher_notices_every_change_even_after_atomic_replaces(qtbot, open_document, profile, minimal_text):
    doc = open_document(profile)
    with qtbot.waitSignal(doc.changedOnDisk, timeout=WATCH_MS):
        fileio.write_atomic(profile, theirs(minimal_text))  # a rename: the watched file is another one now
    doc.reload_from_disk()
    with qtbot.waitSignal(doc.changedOnDisk, timeout=WATCH_MS):
        fileio.write_atomic(profile, minimal_text.replace('"750 kg"', '"770 kg"'))
    doc.reload_from_disk()
    with qtbot.waitSignal(doc.changedOnDisk, timeout=WATCH_MS):
        profile.write_text(minimal_text)  # in place
    assert doc.changed_on_disk()


def test_own_saves_raise_no_signal(qtbot, open_document, profile):
    doc = open_document(profile)
    seen = []
    doc.changedOnDisk.connect(lambda: seen.append(1))
    doc.set(("aircraft", "model"), "Mine (invented)")
    doc.save()
    qtbot.wait(300)  # let any event of our own rename arrive: it must not count as someone else's
    assert seen == [] and not doc.changed_on_disk()


def test_a_linked_profile_is_saved_at_its_target(qtbot, open_document, tmp_path, profile):
    link = tmp_path / "mine.toml"
    link.symlink_to(profile)
    doc = open_document(link)
    doc.set(("aircraft", "model"), "Mine (invented)")
    doc.save()
    assert link.is_symlink() and "Mine (invented)" in profile.read_text()
    assert not doc.changed_on_disk()


# --- the window ----------------------------------------------------------------------------------


def test_an_unedited_window_takes_their_change_and_undo_brings_back_the_old(qtbot, window, fleet):
    path = fleet / "demo_trainer.toml"
    before = path.read_text()
    asked = []
    window.ask_conflict = lambda: asked.append(1) or "cancel"
    fileio.write_atomic(path, before.replace("DEMO-TRN", "DEMO-TRX"))
    qtbot.waitUntil(lambda: window.doc.text() == path.read_text(), timeout=WATCH_MS)
    assert asked == [] and not window.doc.modified
    assert window.doc.loaded.profile.aircraft.registration == "DEMO-TRX"
    window.doc.undo_stack.undo()
    assert window.doc.text() == before


def test_an_edited_window_asks_and_cancel_keeps_both(qtbot, window, fleet):
    path = fleet / "demo_trainer.toml"
    edit(window)
    mine = window.doc.text()
    answers = ["cancel", "cancel"]
    window.ask_conflict = lambda: answers.pop(0)
    other = path.read_text().replace("DEMO-TRN", "DEMO-TRX")
    fileio.write_atomic(path, other)
    qtbot.waitUntil(lambda: answers == ["cancel"], timeout=WATCH_MS)  # the watcher asked
    assert window.doc.text() == mine
    assert window.save() is False and answers == []  # the save asked again
    assert path.read_text() == other and window.doc.text() == mine and window.doc.modified


@pytest.mark.parametrize("answer", ["reload", "overwrite", "save-as"])
def test_each_answer_on_save(qtbot, window, fleet, tmp_path, answer):
    path = fleet / "demo_trainer.toml"
    window.ask_conflict = lambda: "cancel"  # the watcher's question: not now
    edit(window)
    mine = window.doc.text()
    other = path.read_text().replace("DEMO-TRN", "DEMO-TRX")
    path.write_text(other)
    window.ask_conflict = lambda: answer
    elsewhere = tmp_path / "mine.toml"
    window.ask_save_path = lambda *args: elsewhere
    saved = window.save()
    if answer == "reload":
        assert saved is False and window.doc.text() == other and path.read_text() == other
        window.doc.undo_stack.undo()
        assert window.doc.text() == mine
    elif answer == "overwrite":
        assert saved and path.read_text() == mine and not window.doc.modified
    else:
        assert saved and elsewhere.read_text() == mine and path.read_text() == other
        assert window.doc.path == elsewhere


def test_two_windows_on_one_file_never_overwrite_each_other(qtbot, window, settings, tmp_path, fleet):
    path = fleet / "demo_trainer.toml"
    w2 = second_window(qtbot, settings, tmp_path, path)
    asked = {window: [], w2: []}
    window.ask_conflict = lambda: asked[window].append("cancel") or "cancel"
    w2.ask_conflict = lambda: asked[w2].append("cancel") or "cancel"
    edit(window, "1450 lb")
    w2.editor.fields["aircraft.model"].edited.emit("Renamed in the second window (invented)")
    mine2 = w2.doc.text()
    assert window.save()  # the first save meets no change
    first = path.read_text()
    assert "1450 lb" in first
    qtbot.waitUntil(lambda: asked[w2] == ["cancel"], timeout=WATCH_MS)  # the second window was told at once
    assert w2.save() is False and path.read_text() == first  # and its save asks instead of overwriting
    w2.ask_conflict = lambda: "reload"
    assert w2.save() is False
    assert w2.doc.text() == first and "1450 lb" in w2.doc.text()
    w2.doc.undo_stack.undo()
    assert w2.doc.text() == mine2  # the second window's own edit is one undo away
    w2.ask_conflict = lambda: "overwrite"
    assert w2.save() and path.read_text() == mine2
    # the first window, unedited since its save, takes the second's file
    qtbot.waitUntil(lambda: window.doc.text() == mine2, timeout=WATCH_MS)
    assert asked[window] == []
