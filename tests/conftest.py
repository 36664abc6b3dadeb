"""Test configuration: headless Qt for every test, and shared fixtures."""

import os
import shutil
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
# The command line speaks the locale's language and the app the system's: the tests' own words are English whatever
# the machine's locale (a test of another language sets its own; LANGUAGE goes before LANG, as gettext reads them)
os.environ["LANGUAGE"] = "en"

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


@pytest.fixture(autouse=True)
def _the_user_reads_english():
    """Each test starts with the user's language English (a test of the app in German or of a German locale's
    command line leaves it so), since problems and refusals are told in it."""
    from kneeboard.i18n import ENGLISH, USER

    USER.use(ENGLISH)
    yield
    USER.use(ENGLISH)


def checked(text: str, path=None):
    """A profile text through the whole pipeline (the checks `kneeboard check` makes), with the default style."""
    from kneeboard.inputs.styles import load_style
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
    from PySide6.QtCore import QLocale, QSettings

    QLocale.setDefault(QLocale(QLocale.Language.English, QLocale.Country.UnitedStates))  # the app's language: English
    return QSettings(str(tmp_path / "settings.ini"), QSettings.Format.IniFormat)


WAIT_MS = 10_000  #: generous: a loaded test machine must not fail a test, only slow it


def settle(qtbot, controller, timeout=WAIT_MS):
    """Let the preview's debounce fire and every render whose result is wanted end."""
    qtbot.wait(controller.timer.interval() + 20)
    qtbot.waitUntil(lambda: not controller.renders.busy(), timeout=timeout)


def check_fleet(qtbot, controller, timeout=WAIT_MS):
    """Wait until every profile of the fleet has its mark."""
    qtbot.waitUntil(lambda: controller.checks_pending == 0, timeout=timeout)


def fleet_rows(controller):
    """(mark, registration, path) per row of the fleet, read through the model's named roles."""
    from kneeboard.app.fleet import MARK_ROLE, PATH_ROLE, REGISTRATION_ROLE

    model = controller.fleet
    return [(model.index(i, 0).data(MARK_ROLE), model.index(i, 0).data(REGISTRATION_ROLE),
             model.index(i, 0).data(PATH_ROLE)) for i in range(model.rowCount())]


@pytest.fixture
def window(qtbot, fleet, settings, tmp_path):
    from kneeboard.app.window import MainWindow

    def settle_before_close(w):
        # pytest-qt closes and deletes the window before this fixture's own teardown runs: a render still running
        # then was dropped with its widget, and waiting for it afterwards waited 10 s for nothing. So the fleet's
        # checks and the renders are waited for here, while the window lives.
        w.controller.timer.stop()
        check_fleet(qtbot, w.controller)
        qtbot.waitUntil(lambda: not w.controller.renders.busy(), timeout=WAIT_MS)

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
    w.controller.open_profile(fleet / "demo_trainer.toml")
    settle(qtbot, w.controller)
    return w


# --- the app's flows without a window: the controller and a person answering its questions ---


class Person:
    """The controller's `ui`, answering as a test scripts it: each question takes the next answer of its list.

    A question with no answer left fails the test (asked, it would have opened a dialog nobody expected), except
    the few a test sets a standing answer for. Every question asked is recorded in `asked`, problems in `problems`.
    """

    def __init__(self):
        self.answers: dict[str, list] = {}
        self.asked: list[str] = []
        self.problems: list[tuple[str, str]] = []
        self.printed: list[tuple[bytes, str]] = []
        self.progresses: list = []

    def answer(self, question: str, *answers) -> "Person":
        self.answers.setdefault(question, []).extend(answers)
        return self

    def _next(self, question: str, *args):
        self.asked.append(question)
        waiting = self.answers.get(question)
        if not waiting:
            raise AssertionError(f"{question} was asked, and the test gave no answer")
        answer = waiting.pop(0)
        return answer(*args) if callable(answer) else answer

    def ask_unsaved(self):
        return self._next("ask_unsaved")

    def ask_conflict(self):
        return self._next("ask_conflict")

    def ask_save_path(self, title, start, filters):
        return self._next("ask_save_path", title, start, filters)

    def ask_open_path(self, title, start, filters):
        return self._next("ask_open_path", title, start, filters)

    def ask_folder(self, title, start):
        return self._next("ask_folder", title, start)

    def ask_category(self, current):
        return self._next("ask_category", current)

    def ask_restore(self, pending):
        return self._next("ask_restore", pending)

    def ask_restore_changed(self, pending):
        return self._next("ask_restore_changed", pending)

    def show_problems(self, title, text):
        self.problems.append((title, text))

    def progress(self, total):
        progress = Progress(total)
        self.progresses.append(progress)
        return progress

    def print_pdf(self, pdf, name):
        self.printed.append((pdf, name))
        return self._next("print_pdf")


class Progress:
    """The fleet export's progress, as a person sees it, without a dialog."""

    def __init__(self, total):
        self.total, self.value, self.labels, self.closed = total, 0, [], False

    def setValue(self, value):  # noqa: N802 - Qt's name
        self.value = value

    def setLabelText(self, text):  # noqa: N802 - Qt's name
        self.labels.append(text)

    def wasCanceled(self):  # noqa: N802 - Qt's name
        return False

    def close(self):
        self.closed = True


@pytest.fixture
def person():
    return Person()


@pytest.fixture
def make_controller(qtbot, settings, tmp_path):
    """Controllers with no window, deleted on the main thread when the test ends; no widget is ever made."""
    import shiboken6
    from PySide6.QtCore import QEvent
    from PySide6.QtWidgets import QApplication

    from kneeboard.app.controller import Controller

    def widgets() -> set[int]:
        QApplication.sendPostedEvents(None, QEvent.Type.DeferredDelete)  # widgets of earlier tests, deleted later
        return {shiboken6.getCppPointer(w)[0] for w in QApplication.allWidgets()}

    before = widgets()
    made = []

    def make(person, recovery_dir=None):
        made.append(Controller(person, settings, recovery_dir or tmp_path / "recovery"))
        return made[-1]

    yield make
    for c in made:
        c.timer.stop()
        qtbot.waitUntil(lambda c=c: not c.renders.busy(), timeout=WAIT_MS)
        c.autosave_timer.stop()
    assert widgets() <= before, "the controller made a widget"
    for c in made:
        if shiboken6.isValid(c):
            shiboken6.delete(c)


@pytest.fixture
def controller(make_controller, person, fleet, qtbot):
    """A controller on a private copy of the sample fleet, with the trainer open and its card rendered."""
    c = make_controller(person)
    assert c.open_profile(fleet / "demo_trainer.toml")
    settle(qtbot, c)
    return c
