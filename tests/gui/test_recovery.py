"""Crash recovery: unsaved edits are copied aside and offered back after a crash, and only then."""

import json
import subprocess
import sys

from kneeboard.app.recovery import Recovery


def records(folder):
    """The recovery records in `folder`, as written."""
    return [json.loads(f.read_text(encoding="utf-8")) for f in sorted(folder.glob("*.json"))] if folder.is_dir() else []


def crash(folder):
    """What a crash leaves: the records of a process that has ended (a real pid, of a finished child)."""
    dead = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"], capture_output=True,
                          text=True).stdout.strip()
    for f in folder.glob("*.json"):
        record = json.loads(f.read_text(encoding="utf-8"))
        record["owner"]["pid"] = int(dead)
        f.write_text(json.dumps(record, ensure_ascii=False), encoding="utf-8")


def edit(window, text="1450 lb"):
    window.editor.fields["weight.total"].edited.emit(text)


def new_window(qtbot, settings, recovery_dir):
    from kneeboard.app.window import MainWindow

    w = MainWindow(settings, recovery_dir=recovery_dir)
    qtbot.addWidget(w)
    w.ask_unsaved = lambda: "discard"
    return w


def test_autosave_runs_on_its_own_and_only_when_something_changed(qtbot, window, tmp_path):
    window.autosave_timer.setInterval(50)
    assert window.autosave() is None  # nothing unsaved, nothing written
    edit(window)
    qtbot.waitUntil(lambda: bool(records(tmp_path / "recovery")), timeout=5000)
    (record,) = records(tmp_path / "recovery")
    assert record["path"] == str(window.doc.path) and record["text"] == window.doc.text()
    assert Recovery(tmp_path / "recovery").pending() == []  # its owner (this window) is still running
    assert window.autosave() is None  # unchanged since the last copy


def test_crash_then_restore_on_next_start(qtbot, window, settings, tmp_path, fleet):
    original = (fleet / "demo_trainer.toml").read_text()
    edit(window)
    edited = window.doc.text()
    window.autosave()
    # the "crash": this window never closes, its process is gone; a new one starts with the same data folder
    window.autosave_timer.stop()
    crash(tmp_path / "recovery")
    w2 = new_window(qtbot, settings, tmp_path / "recovery")
    asked = []
    w2.ask_restore = lambda pending: asked.append(pending) or True
    w2.open_folder(fleet)
    assert w2.offer_recovery() == 1
    assert [p.path.name for p in asked] == ["demo_trainer.toml"]
    assert w2.doc.path == fleet / "demo_trainer.toml"
    assert w2.doc.text() == edited and w2.doc.modified
    assert (fleet / "demo_trainer.toml").read_text() == original  # nothing written behind the person's back
    w2.doc.undo_stack.undo()
    assert w2.doc.text() == original  # the restore is one undoable step
    w2.doc.undo_stack.redo()
    assert w2.save()
    assert Recovery(tmp_path / "recovery").pending() == []
    assert w2.offer_recovery() == 0


def test_declined_restore_is_forgotten(qtbot, window, settings, tmp_path, fleet):
    edit(window)
    window.autosave()
    window.autosave_timer.stop()
    crash(tmp_path / "recovery")
    w2 = new_window(qtbot, settings, tmp_path / "recovery")
    w2.ask_restore = lambda pending: False
    assert w2.offer_recovery() == 0
    assert Recovery(tmp_path / "recovery").pending() == []


def test_normal_close_and_discard_leave_nothing(qtbot, window, tmp_path, fleet):
    edit(window)
    window.autosave()
    assert records(tmp_path / "recovery")
    window.answers = ["discard"]
    assert window.open_profile(fleet / "demo_glider.toml")
    assert records(tmp_path / "recovery") == []
    edit_glider = window.editor.fields["card.buffer"]
    edit_glider.edited.emit("12 km/h")
    window.autosave()
    window.answers = ["save"]
    assert window.close()
    assert records(tmp_path / "recovery") == []


def test_untitled_profile_is_recovered_too(qtbot, window, settings, tmp_path):
    window.new_profile("normal")
    window.editor.fields["aircraft.registration"].edited.emit("NEW-9")
    window.autosave()
    window.autosave_timer.stop()
    crash(tmp_path / "recovery")
    w2 = new_window(qtbot, settings, tmp_path / "recovery")
    w2.ask_restore = lambda pending: pending.path is None
    assert w2.offer_recovery() == 1
    assert w2.doc.path is None and w2.doc.loaded.profile.aircraft.registration == "NEW-9"
    assert w2.doc.modified


def test_unreadable_records_are_reported_and_kept(qtbot, settings, tmp_path):
    folder = tmp_path / "recovery"
    folder.mkdir()
    (folder / "junk.json").write_bytes(b"\xff\xfe not json")
    (folder / "half.json").write_text('{"path": null}')
    recovery = Recovery(folder)
    assert recovery.pending() == []
    assert len(recovery.unreadable) == 2 and all("cannot be read back" in line for line in recovery.unreadable)
    w = new_window(qtbot, settings, folder)
    seen = []
    w.show_problems = lambda title, text: seen.append((title, text))
    assert w.offer_recovery() == 0
    assert seen and "junk.json" in seen[0][1] and "half.json" in seen[0][1]
    assert sorted(p.name for p in folder.iterdir()) == ["half.json", "junk.json"]  # kept for the person


def test_a_running_windows_edits_are_never_taken_and_two_windows_keep_their_own(qtbot, window, settings, tmp_path,
                                                                                  fleet):
    edit(window, "1450 lb")
    window.autosave()
    w2 = new_window(qtbot, settings, tmp_path / "recovery")
    w2.open_profile(fleet / "demo_trainer.toml")
    w2.editor.fields["weight.total"].edited.emit("1500 lb")
    w2.autosave()
    texts = sorted(r["text"] for r in records(tmp_path / "recovery"))
    assert len(texts) == 2 and any("1450 lb" in t for t in texts) and any("1500 lb" in t for t in texts)
    w3 = new_window(qtbot, settings, tmp_path / "recovery")
    w3.ask_restore = lambda pending: True
    assert w3.offer_recovery() == 0  # both owners still run: nothing is offered, nothing removed
    assert len(records(tmp_path / "recovery")) == 2


def test_records_keep_every_letter_and_a_failed_restore_keeps_its_record(qtbot, window, settings, tmp_path):
    window.editor.fields["aircraft.model"].edited.emit("Ředitelský kluzák (invented)")
    window.autosave()
    (file,) = (tmp_path / "recovery").glob("*.json")
    assert "Ředitelský" in file.read_text(encoding="utf-8")  # UTF-8 as typed, not \u escapes
    window.autosave_timer.stop()
    crash(tmp_path / "recovery")
    w2 = new_window(qtbot, settings, tmp_path / "recovery")
    w2.ask_restore = lambda pending: True
    w2._restore = lambda pending: False  # the file could not be opened now
    assert w2.offer_recovery() == 0
    assert len(records(tmp_path / "recovery")) == 1  # offered again next time, never lost
