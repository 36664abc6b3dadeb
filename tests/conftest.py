"""Test configuration: headless Qt for every test, and shared fixtures."""

import os
import shutil
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import pytest  # noqa: E402

ROOT = Path(__file__).resolve().parent.parent
SAMPLES = ROOT / "sample_aircraft"

MINIMAL = """\
schema = 1

[aircraft]
registration = "TEST-1"
model = "Test aircraft (invented)"
max_weight = "750 kg"

[[configuration]]
name = "Flaps up"
stall_speed = "50 kt"
"""


def checked(text: str, path=None):
    """A profile text through the whole pipeline (the checks `kneeboard check` makes), with the default style."""
    from kneeboard.card.style import load_style
    from kneeboard.pipeline import prepare_text

    style, _ = load_style()
    return prepare_text(text, style, path=path)


def checked_file(path):
    from kneeboard.pipeline import Styles, prepare_file

    return prepare_file(path, Styles())


@pytest.fixture
def open_document(qapp):
    """Open profile documents for a test and delete them when it ends, on the main thread.

    A QObject left to Python's cyclic garbage collector may be destroyed on whatever thread collects it (a test's
    worker thread, say), and Qt objects must die on the thread they live in.
    """
    import shiboken6

    from kneeboard.app.document import ProfileDocument

    made = []

    def open_(path):
        made.append(ProfileDocument.open(path))
        return made[-1]

    yield open_
    for doc in made:
        if shiboken6.isValid(doc):
            shiboken6.delete(doc)


@pytest.fixture
def sample_paths():
    return sorted(SAMPLES.glob("*.toml"))


@pytest.fixture
def minimal_text():
    return MINIMAL


# --- GUI fixtures: a main window on a private copy of the sample fleet, with private settings ---


@pytest.fixture(autouse=True)
def no_modal_dialogs(request, monkeypatch):
    """A modal dialog nobody answers would hang the suite: in a GUI test it fails the test instead, naming it.

    Tests answer the window's questions through its hooks (ask_unsaved, ask_conflict, ask_save_path, ...).
    """
    if "qtbot" not in request.fixturenames:
        return
    from PySide6.QtWidgets import QColorDialog, QDialog, QFileDialog, QMessageBox

    def refuse(name):
        def modal(*args, **_kwargs):
            title = next((a for a in args if isinstance(a, str)), "")
            raise AssertionError(f"a modal {name} opened unanswered: {title!r}")
        return modal

    for name in ("question", "warning", "information", "critical"):
        monkeypatch.setattr(QMessageBox, name, staticmethod(refuse(f"QMessageBox.{name}")))
    monkeypatch.setattr(QMessageBox, "exec", refuse("QMessageBox"))
    monkeypatch.setattr(QDialog, "exec", refuse("dialog"))
    for name in ("getOpenFileName", "getSaveFileName", "getExistingDirectory"):
        monkeypatch.setattr(QFileDialog, name, staticmethod(refuse(f"QFileDialog.{name}")))
    monkeypatch.setattr(QColorDialog, "getColor", staticmethod(refuse("QColorDialog")))


@pytest.fixture
def fleet(tmp_path):
    folder = tmp_path / "fleet"
    shutil.copytree(SAMPLES, folder)
    return folder


@pytest.fixture
def settings(tmp_path):
    from PySide6.QtCore import QSettings

    return QSettings(str(tmp_path / "settings.ini"), QSettings.Format.IniFormat)


@pytest.fixture
def window(qtbot, fleet, settings, tmp_path):
    from kneeboard.app.window import MainWindow

    def settle_before_close(w):
        # pytest-qt closes and deletes the window before this fixture's own teardown runs: a render still running
        # then was dropped with its widget, and waiting for it afterwards waited 10 s for nothing. So the fleet's
        # checks and the renders are waited for here, while the window lives, and the wait's result is checked.
        w.timer.stop()
        w.fleet.check_all()
        assert w.preview.wait_idle(10_000), "a render still running 10 s after the test"

    w = MainWindow(settings, recovery_dir=tmp_path / "recovery")
    qtbot.addWidget(w, before_close_func=settle_before_close)
    w.problems_seen = []
    w.show_problems = lambda title, text: w.problems_seen.append((title, text))
    w.answers = []
    w.ask_unsaved = lambda: w.answers.pop(0) if w.answers else "discard"
    w.conflicts = []  # a test that expects the question sets its answer here
    w.ask_conflict = lambda: w.conflicts.pop(0) if w.conflicts else "cancel"
    w.categories = []  # File › New profile's question: a test sets the category; unanswered, it is cancelled
    w.ask_category = lambda _current: w.categories.pop(0) if w.categories else None
    w.show()
    w.open_profile(fleet / "demo_trainer.toml")
    qtbot.wait(w.timer.interval() + 20)
    assert w.preview.wait_idle(10_000)
    return w
