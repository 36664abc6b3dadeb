"""The preview's renders without a widget: off the GUI thread, the newest request wins, a cancelled or stale result
is dropped, and nothing waits for a render nobody wants. The cards are of the invented demo tourer."""

import threading
from functools import cache

import pytest
import shiboken6
from card_helpers import card_of
from PySide6.QtCore import QTimer

from kneeboard.app.preview_jobs import Renders
from kneeboard.card import LayoutError, card_pdf
from kneeboard.inputs.styles import load_style

WAIT_MS = 10_000


@cache
def tourer_pdf(weight: float | None = None) -> bytes:
    style, _ = load_style()
    return card_pdf(card_of("demo_tourer", style, **({"weight": f"{weight} kg"} if weight else {})))


@pytest.fixture
def renders(qtbot):
    runner = Renders()
    yield runner
    qtbot.waitUntil(lambda: not runner.busy(), timeout=WAIT_MS)  # no job outlives its test
    shiboken6.delete(runner)


def test_rapid_requests_coalesce_and_only_the_newest_is_reported(qtbot, renders):
    weights = [900.0, 950.0, 1000.0, 1050.0, 1100.0]
    assert tourer_pdf(weights[-1]) != tourer_pdf(weights[0])  # the jobs can be told apart by their bytes
    ran, done, busy = [], [], []
    renders.done.connect(lambda generation, pdf, _ms: done.append((generation, pdf)))
    renders.busyChanged.connect(busy.append)

    def job(index, weight):
        def run():
            ran.append(index)
            return tourer_pdf(weight)
        return run

    generations = [renders.request(job(i, w)) for i, w in enumerate(weights)]
    assert generations == sorted(set(generations)) and renders.busy()
    qtbot.waitUntil(lambda: not renders.busy(), timeout=WAIT_MS)
    # the first starts at once; the three in between are replaced before they start; the first's result is stale
    assert ran == [0, 4]
    assert done == [(generations[-1], tourer_pdf(weights[-1]))]
    assert busy == [True, False]


def test_a_failing_job_reports_its_message(qtbot, renders):
    try:
        card_of("demo_tourer", load_style()[0].with_changes(size="4x6", max_faces=2),
                bank_angles=tuple(float(b) for b in range(0, 72, 3)))
    except LayoutError as exc:
        error = exc  # the real error of a card that cannot be laid out: two dozen banks on a 4x6 capped at 2 faces
    else:
        raise AssertionError("this card was expected not to fit")

    def failing():
        raise error

    with qtbot.assertNotEmitted(renders.done), qtbot.waitSignal(renders.failed, timeout=WAIT_MS) as failed:
        generation = renders.request(failing)
    assert failed.args == [generation, str(error)] and str(error)


def test_a_job_that_returns_no_bytes_is_a_failure_naming_it(qtbot, renders):
    with qtbot.waitSignal(renders.failed, timeout=WAIT_MS) as failed:
        renders.request(lambda: "a card")
    assert "must return PDF bytes, not str" in failed.args[1]


def test_a_slow_job_leaves_the_gui_thread_free(qtbot, renders):
    released = threading.Event()
    order = []

    def slow():
        # only the GUI thread's timer can release this job: a blocked GUI thread would never get here
        if not released.wait(WAIT_MS / 1000):
            raise RuntimeError("the GUI thread was blocked while the job ran")
        order.append("job finished")
        return tourer_pdf()

    def tick():
        order.append("timer fired")
        released.set()

    with qtbot.waitSignal(renders.done, timeout=WAIT_MS):
        renders.request(slow)
        assert not released.is_set()  # request() returned while the job was still waiting
        QTimer.singleShot(0, tick)
    assert order == ["timer fired", "job finished"]


def test_a_cancelled_render_is_not_waited_for_and_its_result_is_dropped(qtbot, renders):
    """A render cancelled while it runs (its card closed, or made stale by an input error) ends on its own: waiting
    for the renders must not wait for it (test teardowns waited 10 s for such renders)."""
    released = threading.Event()
    done = []
    renders.done.connect(lambda generation, pdf, _ms: done.append(pdf))
    renders.request(lambda: released.wait(3 * WAIT_MS / 1000) and tourer_pdf())  # blocked until released
    assert renders.busy()
    renders.cancel()
    assert not renders.busy()  # the cancelled render is blocked for 30 s yet
    released.set()
    qtbot.wait(100)
    assert done == []  # its result was dropped, never reported
    with qtbot.waitSignal(renders.done, timeout=WAIT_MS):
        renders.request(lambda: tourer_pdf())  # a new request after it is reported
    assert done == [tourer_pdf()]


def test_deleting_the_runner_while_a_job_runs_is_safe(qtbot):
    runner = Renders()
    started, released, finished = threading.Event(), threading.Event(), threading.Event()
    ran_after = []

    def slow():
        started.set()
        released.wait(WAIT_MS / 1000)
        finished.set()
        return tourer_pdf()

    runner.request(slow)
    runner.request(lambda: ran_after.append(True) or b"")  # waits behind the slow one
    assert started.wait(WAIT_MS / 1000)
    relay = runner._relay  # the result's receiver, which must outlive the runner and then go
    with qtbot.waitSignal(runner.destroyed, timeout=WAIT_MS):
        runner.deleteLater()
    assert runner.busy() is False  # nobody waits for the renders of a runner that is gone
    with qtbot.waitSignal(relay.destroyed, timeout=WAIT_MS):
        released.set()  # the result now arrives with nobody to take it
    assert finished.is_set()
    assert ran_after == []  # the waiting job was dropped with its runner
