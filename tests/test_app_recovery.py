"""Crash recovery without a window: unsaved edits are copied aside and offered back after a crash, and only then.

A "crash" is a controller whose process is gone (its records rewritten with the pid of a finished process); the next
start is a new controller on the same recovery folder. The aircraft are the invented samples.
"""

import json
import subprocess
import sys

import pytest
from conftest import Person, settle

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


def edit(c, text="1450 lb"):
    c.doc.set(("weight", "total"), text, "Change card weight")


@pytest.fixture
def next_start(make_controller, controller, tmp_path):
    """The edits of `controller` copied aside, its process then gone; returns (new controller, its person)."""
    def start(text="1450 lb"):
        edit(controller, text)
        assert controller.autosave() is not None
        controller.autosave_timer.stop()
        controller.doc.changedOnDisk.disconnect()  # a process that is gone watches nothing
        crash(tmp_path / "recovery")
        person = Person()
        return make_controller(person), person

    return start


def test_autosave_runs_on_its_own_and_only_when_something_changed(qtbot, controller, tmp_path):
    controller.autosave_timer.setInterval(50)
    assert controller.autosave() is None  # nothing unsaved, nothing written
    edit(controller)
    qtbot.waitUntil(lambda: bool(records(tmp_path / "recovery")), timeout=5000)
    (record,) = records(tmp_path / "recovery")
    assert record["path"] == str(controller.doc.path) and record["text"] == controller.doc.text()
    assert Recovery(tmp_path / "recovery").pending() == []  # its owner (this controller) is still running
    assert controller.autosave() is None  # unchanged since the last copy


def test_crash_then_restore_on_next_start(next_start, controller, fleet, tmp_path):
    original = (fleet / "demo_trainer.toml").read_text(encoding="utf-8")
    c2, person = next_start()
    edited = controller.doc.text()
    person.answer("ask_restore", True)
    c2.open_folder(fleet)
    assert c2.offer_recovery() == 1
    assert c2.doc.path == fleet / "demo_trainer.toml"
    assert c2.doc.text() == edited and c2.doc.modified
    assert (fleet / "demo_trainer.toml").read_text(encoding="utf-8") == original  # nothing written unasked
    c2.doc.undo_stack.undo()
    assert c2.doc.text() == original  # the restore is one undoable step
    c2.doc.undo_stack.redo()
    assert c2.save()
    assert Recovery(tmp_path / "recovery").pending() == []
    assert c2.offer_recovery() == 0


def test_a_declined_restore_is_forgotten(next_start, tmp_path):
    c2, person = next_start()
    person.answer("ask_restore", False)
    assert c2.offer_recovery() == 0
    assert Recovery(tmp_path / "recovery").pending() == []


def test_save_discard_and_close_leave_nothing(controller, person, fleet, tmp_path):
    edit(controller)
    controller.autosave()
    assert records(tmp_path / "recovery")
    person.answer("ask_unsaved", "discard")
    assert controller.open_profile(fleet / "demo_glider.toml")
    assert records(tmp_path / "recovery") == []
    controller.doc.set(("card", "buffer"), "12 km/h")
    controller.autosave()
    person.answer("ask_unsaved", "save")
    assert controller.close()
    assert records(tmp_path / "recovery") == []


def test_a_new_profile_is_recovered_too(make_controller, controller, tmp_path):
    controller.new_profile("normal")
    controller.doc.set(("aircraft", "registration"), "NEW-9")
    controller.autosave()
    controller.autosave_timer.stop()
    crash(tmp_path / "recovery")
    c2 = make_controller(Person().answer("ask_restore", lambda pending: pending.path is None))
    assert c2.offer_recovery() == 1
    assert c2.doc.path is None and c2.doc.loaded.profile.aircraft.registration == "NEW-9"
    assert c2.doc.modified


def test_unreadable_records_are_reported_and_kept(make_controller, tmp_path):
    folder = tmp_path / "recovery"
    folder.mkdir()
    (folder / "junk.json").write_bytes(b"\xff\xfe not json")
    (folder / "half.json").write_text('{"path": null}', encoding="utf-8")
    person = Person()
    c = make_controller(person, folder)
    assert c.offer_recovery() == 0
    (title, text), = person.problems
    assert title == "Unsaved edits that cannot be read" and "junk.json" in text and "half.json" in text
    assert sorted(p.name for p in folder.iterdir()) == ["half.json", "junk.json"]  # kept for the person


def test_a_running_apps_edits_are_never_taken_and_two_keep_their_own(make_controller, controller, fleet, tmp_path):
    edit(controller, "1450 lb")
    controller.autosave()
    c2 = make_controller(Person())
    c2.open_profile(fleet / "demo_trainer.toml")
    edit(c2, "1500 lb")
    c2.autosave()
    texts = sorted(r["text"] for r in records(tmp_path / "recovery"))
    assert len(texts) == 2 and any("1450 lb" in t for t in texts) and any("1500 lb" in t for t in texts)
    person = Person()
    c3 = make_controller(person)
    assert c3.offer_recovery() == 0 and person.asked == []  # both owners still run: nothing offered or removed
    assert len(records(tmp_path / "recovery")) == 2


def test_records_keep_every_letter_and_a_failed_restore_keeps_its_record(make_controller, controller, tmp_path):
    controller.doc.set(("aircraft", "model"), "Ředitelský kluzák (invented)")
    controller.autosave()
    (file,) = (tmp_path / "recovery").glob("*.json")
    assert "Ředitelský" in file.read_text(encoding="utf-8")  # UTF-8 as typed, not \u escapes
    controller.autosave_timer.stop()
    crash(tmp_path / "recovery")
    c2 = make_controller(Person().answer("ask_restore", True))
    c2.safe.restore = lambda pending: "failed"  # the file could not be opened now
    assert c2.offer_recovery() == 0
    assert len(records(tmp_path / "recovery")) == 1  # offered again next time, never lost


@pytest.mark.parametrize("answer", ["restore", "theirs", "later"])
def test_a_restore_over_a_file_changed_since_the_crash_asks(next_start, fleet, tmp_path, answer):
    # the restore silently reverted another program's change made while the app was down
    c2, person = next_start()
    profile = fleet / "demo_trainer.toml"
    theirs = profile.read_text(encoding="utf-8").replace('total = "1560 lb"', 'total = "1600 lb"')
    profile.write_text(theirs, encoding="utf-8")
    person.answer("ask_restore", True).answer("ask_restore_changed", answer)
    c2.open_folder(fleet)
    restored = c2.offer_recovery()
    assert person.asked == ["ask_restore", "ask_restore_changed"]
    assert profile.read_text(encoding="utf-8") == theirs  # nothing written behind the person's back
    kept = list((tmp_path / "recovery").glob("*.json"))
    if answer == "restore":
        assert restored == 1 and c2.doc.get(("weight", "total")) == "1450 lb" and c2.doc.modified
        assert c2.doc.undo_stack.canUndo()  # one undoable step back to theirs
    else:
        assert restored == 0 and c2.doc.get(("weight", "total")) == "1600 lb"
        assert len(kept) == (1 if answer == "later" else 0)  # put off: offered again; theirs: discarded


def test_a_restore_over_an_unchanged_file_asks_nothing_more(next_start, fleet):
    c2, person = next_start()
    person.answer("ask_restore", True)  # and no answer for ask_restore_changed: asking it would fail the test
    c2.open_folder(fleet)
    assert c2.offer_recovery() == 1 and c2.doc.get(("weight", "total")) == "1450 lb"


def test_a_record_of_another_host_name_is_offered_and_named(make_controller, controller, fleet, tmp_path):
    # written under the machine's previous name: it was never offered, never named
    edit(controller)
    record_file = controller.autosave()
    controller.autosave_timer.stop()
    record = json.loads(record_file.read_text(encoding="utf-8"))
    record["owner"]["host"] = "old-name-of-this-machine"
    record_file.write_text(json.dumps(record), encoding="utf-8")
    offered = []
    c2 = make_controller(Person().answer("ask_restore", lambda pending: offered.append(pending.host) or False))
    c2.open_folder(fleet)
    assert c2.offer_recovery() == 0
    assert offered == ["old-name-of-this-machine"]
    assert not record_file.exists()  # discarded as the person chose


@pytest.mark.parametrize("blocked", ["data", "data/recovery"])
def test_a_recovery_folder_that_cannot_be_written_is_said_once(qtbot, make_controller, fleet, tmp_path, blocked):
    # a file where the data folder (or the recovery folder) belongs, as a read-only home does for anyone but root:
    # recovery switched off without a word, with a traceback at every autosave tick
    if blocked != "data":
        (tmp_path / "data").mkdir()
    (tmp_path / blocked).write_text("a file where a folder belongs", encoding="utf-8")
    c = make_controller(Person().answer("ask_unsaved", "discard"), tmp_path / "data" / "recovery")
    notes, said = [], []
    c.recoveryNote.connect(lambda text, tip: notes.append((text, tip)))
    c.status.connect(lambda text, _ms: said.append(text))
    c.open_profile(fleet / "demo_trainer.toml")
    settle(qtbot, c)
    edit(c)
    assert c.autosave() is None  # the tick answers, no traceback
    (text, tip), = notes
    assert text.startswith("Crash recovery is off") and str(tmp_path / "data" / "recovery") in text + tip
    edit(c, "1460 lb")
    assert c.autosave() is None and len(notes) == 1  # said once, retried quietly
    (tmp_path / blocked).unlink()  # the person makes room: the next tick copies the edits aside again
    assert c.autosave() is not None and notes[-1] == ("", "") and "copied aside again" in said[-1]
