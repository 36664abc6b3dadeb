"""Crash recovery: unsaved edits are copied aside and offered back after a crash."""

from kneeboard.app.recovery import Recovery


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
    qtbot.waitUntil(lambda: bool(Recovery(tmp_path / "recovery").pending()), timeout=5000)
    (pending,) = Recovery(tmp_path / "recovery").pending()
    assert pending.path == window.doc.path and pending.text == window.doc.text()
    assert window.autosave() is None  # unchanged since the last copy


def test_crash_then_restore_on_next_start(qtbot, window, settings, tmp_path, fleet):
    original = (fleet / "demo_trainer.toml").read_text()
    edit(window)
    edited = window.doc.text()
    window.autosave()
    # the "crash": this window never closes; a new one starts with the same data folder
    window.autosave_timer.stop()
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
    w2 = new_window(qtbot, settings, tmp_path / "recovery")
    w2.ask_restore = lambda pending: False
    assert w2.offer_recovery() == 0
    assert Recovery(tmp_path / "recovery").pending() == []


def test_normal_close_and_discard_leave_nothing(qtbot, window, tmp_path, fleet):
    edit(window)
    window.autosave()
    assert Recovery(tmp_path / "recovery").pending()
    window.answers = ["discard"]
    assert window.open_profile(fleet / "demo_glider.toml")
    assert Recovery(tmp_path / "recovery").pending() == []
    edit_glider = window.editor.fields["card.buffer"]
    edit_glider.edited.emit("12 km/h")
    window.autosave()
    window.answers = ["save"]
    assert window.close()
    assert Recovery(tmp_path / "recovery").pending() == []


def test_untitled_profile_is_recovered_too(qtbot, window, settings, tmp_path):
    window.new_profile("normal")
    window.editor.fields["aircraft.registration"].edited.emit("NEW-9")
    window.autosave()
    window.autosave_timer.stop()
    w2 = new_window(qtbot, settings, tmp_path / "recovery")
    w2.ask_restore = lambda pending: pending.path is None
    assert w2.offer_recovery() == 1
    assert w2.doc.path is None and w2.doc.loaded.profile.aircraft.registration == "NEW-9"
    assert w2.doc.modified


def test_unreadable_recovery_records_are_skipped(tmp_path):
    folder = tmp_path / "recovery"
    folder.mkdir()
    (folder / "junk.json").write_bytes(b"\xff\xfe not json")
    (folder / "half.json").write_text('{"path": null}')
    assert Recovery(folder).pending() == []
