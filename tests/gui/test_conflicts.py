"""Saves never overwrite what someone else wrote: a change on disk is noticed, and the person decides.

Another program (here: a plain write, or fileio's atomic replace as an editor would do it) or a
second window changes the open file; the document notices (watcher and a check before every
save), and the window asks through its `ask_conflict` hook: reload theirs, keep mine, save mine
elsewhere, or cancel. Nothing either side wrote is lost. The document is tested here, the answers
without a window in tests/test_app_controller.py.
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
# Each answer, two apps on one file and the watcher's question are tested without a window
# (tests/test_app_controller.py); here File › Save asks, as a person meets it.


def test_file_save_asks_when_the_file_changed_on_disk(qtbot, window, fleet):
    path = fleet / "demo_trainer.toml"
    edit(window)
    mine = window.doc.text()
    other = path.read_text().replace("DEMO-TRN", "DEMO-TRX")
    window.conflicts.extend(["cancel", "overwrite"])  # the watcher's question: not now; then File › Save's
    fileio.write_atomic(path, other)
    qtbot.waitUntil(lambda: window.conflicts == ["overwrite"], timeout=WATCH_MS)
    window.act_save.trigger()
    assert window.conflicts == [] and path.read_text() == mine and not window.isWindowModified()
