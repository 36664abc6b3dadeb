"""The card preview: the card's own PDF, built off the GUI thread, shown with its page, zoom and mode controls."""

import threading
from functools import cache

import numpy as np
import pytest
from card_helpers import SMALL_CARD, card_of
from PySide6.QtCore import QTimer
from PySide6.QtGui import QAction, QImage
from PySide6.QtPdfWidgets import QPdfView
from PySide6.QtWidgets import QComboBox, QWidget

from kneeboard.app.preview import ZOOM_STEPS, CardPreview
from kneeboard.card import LayoutError, card_pdf, fleet_pdf
from kneeboard.card.style import load_style

MADE_ON = "2026-12-01"
WAIT_MS = 10_000  #: generous: a loaded test machine must not fail a test, only slow it
A5_POINTS = (419.53, 595.28)  # 148 x 210 mm, computed
SIX_BY_FOUR_POINTS = (288.0, 432.0)  # 4 x 6 in, computed
A4_POINTS = (595.28, 841.89)  # 210 x 297 mm, computed
Zoom = QPdfView.ZoomMode


@cache
def style():
    s, problems = load_style()
    assert s is not None, problems
    return s


@cache
def tourer_card(weight: float | None = None, **changes):
    """The demo tourer's card through the pipeline, at `weight` [kg] when given."""
    overrides = {"weight": f"{weight} kg"} if weight is not None else {}
    return card_of("demo_tourer", style().with_changes(**changes), **overrides)


def tourer_job(weight: float | None = None, **changes):
    """A job as the window sends it: build and draw the card, in the worker thread."""
    return lambda: card_pdf(tourer_card(weight, **changes))


def layout_error() -> LayoutError:
    """The real error of a card that cannot be laid out: two dozen bank angles on a 4x6 card capped at 2 faces."""
    try:
        card_of("demo_tourer", style().with_changes(size="4x6", max_faces=2),
                bank_angles=tuple(float(b) for b in range(0, 72, 3)))
    except LayoutError as exc:
        return exc
    raise AssertionError("this card was expected not to fit")


@pytest.fixture
def preview(qtbot):
    widget = CardPreview()
    qtbot.addWidget(widget)
    widget.resize(640, 820)
    widget.show()
    yield widget
    assert widget.wait_idle(WAIT_MS)  # no job outlives its test


def show(qtbot, preview, job):
    """Request `job` and wait until its PDF is shown; returns (generation, milliseconds)."""
    with qtbot.waitSignal(preview.rendered, timeout=WAIT_MS) as shown:
        generation = preview.request(job)
    assert shown.args[0] == generation
    return shown.args


def control(preview, kind, name):
    found = preview.findChild(kind, name)
    assert found is not None, name
    return found


def dark_fraction(image: QImage) -> float:
    gray = image.convertToFormat(QImage.Format.Format_Grayscale8)
    rows = np.frombuffer(gray.constBits(), np.uint8, gray.sizeInBytes()).reshape(gray.height(), gray.bytesPerLine())
    return float((rows[:, : gray.width()] < 128).mean())


def test_shows_the_cards_own_pdf_at_its_page_size(qtbot, preview):
    generation, ms = show(qtbot, preview, tourer_job())
    assert isinstance(generation, int) and isinstance(ms, float) and ms >= 0
    assert preview.pdf_bytes() == card_pdf(tourer_card())  # the same bytes that print: one renderer
    assert preview.page_count() == 2
    size = preview.page_size_points(0)
    assert size.width() == pytest.approx(A5_POINTS[0], abs=0.1)
    assert size.height() == pytest.approx(A5_POINTS[1], abs=0.1)
    assert preview.current_page() == 0
    assert preview.error_text() == ""


def test_a_smaller_card_size_changes_the_page(qtbot, preview):
    show(qtbot, preview, tourer_job())
    show(qtbot, preview, tourer_job(size="4x6", front=SMALL_CARD))
    size = preview.page_size_points(0)
    assert (size.width(), size.height()) == pytest.approx(SIX_BY_FOUR_POINTS, abs=0.1)


def test_rapid_requests_coalesce_and_the_newest_is_shown(qtbot, preview):
    weights = [900.0, 950.0, 1000.0, 1050.0, 1100.0]
    expected = card_pdf(tourer_card(weights[-1]))
    assert expected != card_pdf(tourer_card(weights[0]))  # the jobs can be told apart by their bytes
    ran, shown = [], []
    preview.rendered.connect(lambda generation, _ms: shown.append(generation))

    def job(generation_index, weight):
        def run():
            ran.append(generation_index)
            return card_pdf(tourer_card(weight))
        return run

    generations = [preview.request(job(i, w)) for i, w in enumerate(weights)]
    assert generations == sorted(set(generations))
    assert preview.wait_idle(WAIT_MS)
    # the first starts at once; the three in between are replaced before they start; the first's result is stale
    assert ran == [0, 4]
    assert shown == [generations[-1]]
    assert preview.pdf_bytes() == expected


def test_a_failing_job_shows_its_message_and_keeps_the_last_good_page(qtbot, preview):
    show(qtbot, preview, tourer_job())
    good = preview.pdf_bytes()
    error = layout_error()
    message = str(error)
    assert message

    def failing():
        raise error

    with qtbot.assertNotEmitted(preview.rendered), qtbot.waitSignal(preview.failed, timeout=WAIT_MS) as failed:
        preview.request(failing)
    assert failed.args == [message]
    assert preview.error_text() == message
    assert control(preview, QWidget, "previewError").isVisible()
    assert preview.pdf_bytes() == good and preview.page_count() == 2  # the last good card stays underneath

    show(qtbot, preview, tourer_job(1000.0))
    assert preview.error_text() == ""
    assert not control(preview, QWidget, "previewError").isVisible()


def test_a_job_that_returns_no_pdf_is_reported_not_shown(qtbot, preview):
    with qtbot.waitSignal(preview.failed, timeout=WAIT_MS) as failed:
        preview.request(lambda: b"%PDF-1.4 but not really")
    assert "could not" in failed.args[0]
    assert preview.pdf_bytes() is None and preview.page_count() == 0


def test_page_and_zoom_survive_an_update(qtbot, preview):
    show(qtbot, preview, tourer_job())
    pages = control(preview, QComboBox, "pageSelector")
    assert [pages.itemText(i) for i in range(pages.count())] == ["Front", "Back"]
    qtbot.waitUntil(pages.isVisible, timeout=WAIT_MS)  # the toolbar lays itself out on its next event
    pages.setCurrentIndex(1)  # as a person picks "Back"
    assert preview.current_page() == 1
    control(preview, QAction, "zoomIn").trigger()
    control(preview, QAction, "zoomIn").trigger()
    factor = preview.zoom_factor()
    assert preview.zoom_mode() == Zoom.Custom and factor in ZOOM_STEPS

    show(qtbot, preview, tourer_job(1000.0))
    assert preview.pdf_bytes() == card_pdf(tourer_card(1000.0))
    assert preview.current_page() == 1 and pages.currentText() == "Back"
    assert preview.zoom_mode() == Zoom.Custom and preview.zoom_factor() == factor

    control(preview, QAction, "fitWidth").trigger()
    show(qtbot, preview, tourer_job(1050.0))
    assert preview.zoom_mode() == Zoom.FitToWidth and control(preview, QAction, "fitWidth").isChecked()
    assert preview.current_page() == 1


def test_zoom_steps_stop_at_their_limits(qtbot, preview):
    show(qtbot, preview, tourer_job())
    zoom_in, zoom_out = control(preview, QAction, "zoomIn"), control(preview, QAction, "zoomOut")
    for _ in range(len(ZOOM_STEPS) + 1):
        zoom_out.trigger()
    assert preview.zoom_factor() == ZOOM_STEPS[0] and not zoom_out.isEnabled() and zoom_in.isEnabled()
    for _ in range(len(ZOOM_STEPS) + 1):
        zoom_in.trigger()
    assert preview.zoom_factor() == ZOOM_STEPS[-1] and not zoom_in.isEnabled() and zoom_out.isEnabled()
    control(preview, QAction, "wholePage").trigger()
    assert preview.zoom_mode() == Zoom.FitInView and control(preview, QAction, "wholePage").isChecked()
    assert not control(preview, QAction, "fitWidth").isChecked()


def test_pages_are_named_front_and_back_or_by_card_and_face(qtbot, preview):
    pages = control(preview, QComboBox, "pageSelector")
    cards = [tourer_card(), tourer_card(1000.0), tourer_card(1100.0)]
    show(qtbot, preview, lambda: fleet_pdf(cards))  # six faces: three cards, as a card set of three shows them
    assert preview.page_count() == 6
    assert [pages.itemText(i) for i in range(pages.count())] == [
        f"Card {i // 2 + 1} of 3 · {('front', 'back')[i % 2]} (face {i + 1} of 6)" for i in range(6)]
    pages.setCurrentIndex(4)
    assert preview.current_page() == 4

    show(qtbot, preview, lambda: fleet_pdf(cards[:1], "a4"))
    size = preview.page_size_points(0)
    assert (size.width(), size.height()) == pytest.approx(A4_POINTS, abs=0.1)
    assert preview.current_page() == preview.page_count() - 1  # the page asked for is gone: the last one
    with pytest.raises(IndexError):
        preview.set_page(preview.page_count())

    show(qtbot, preview, tourer_job(front=("header", "margin-table")))
    assert preview.page_count() == 1 and preview.current_page() == 0
    qtbot.waitUntil(lambda: not pages.isVisible(), timeout=WAIT_MS)  # nothing to choose


def test_the_mode_selector_asks_for_card_or_sheet(qtbot, preview):
    modes = control(preview, QComboBox, "modeSelector")
    assert [modes.itemText(i) for i in range(modes.count())] == ["Card", "Sheet (Letter)", "Sheet (A4)"]
    assert preview.mode() == "card"
    with qtbot.waitSignal(preview.modeChanged, timeout=WAIT_MS) as changed:
        modes.setCurrentIndex(modes.findText("Sheet (A4)"))
    assert changed.args == ["a4"] and preview.mode() == "a4"
    with qtbot.waitSignal(preview.modeChanged, timeout=WAIT_MS) as changed:
        preview.set_mode("letter")
    assert changed.args == ["letter"] and modes.currentText() == "Sheet (Letter)"
    with pytest.raises(ValueError):
        preview.set_mode("tabloid")


def test_image_of_a_shown_page_is_the_card(qtbot, preview):
    show(qtbot, preview, tourer_job())
    front, back = preview.image(0, dpi=60), preview.image(1, dpi=60)
    assert (front.width(), front.height()) == (round(A5_POINTS[0] * 60 / 72), round(A5_POINTS[1] * 60 / 72))
    assert dark_fraction(front) > 0.02 and dark_fraction(back) > 0.005  # type, rules and the chart, not blank
    assert front != back
    blank = QImage(front.size(), QImage.Format.Format_RGB32)
    blank.fill(0xFFFFFFFF)
    assert dark_fraction(blank) == 0.0  # the measure itself can tell blank from printed


def test_a_slow_job_leaves_the_gui_thread_free(qtbot, preview):
    released = threading.Event()
    order = []

    def slow():
        # only the GUI thread's timer can release this job: a blocked GUI thread would never get here
        if not released.wait(WAIT_MS / 1000):
            raise RuntimeError("the GUI thread was blocked while the job ran")
        order.append("job finished")
        return card_pdf(tourer_card())

    def tick():
        order.append("timer fired")
        released.set()

    with qtbot.waitSignal(preview.rendered, timeout=WAIT_MS):
        preview.request(slow)
        assert not released.is_set()  # request() returned while the job was still waiting
        QTimer.singleShot(0, tick)
    assert order == ["timer fired", "job finished"]


def test_wait_idle_reports_a_job_still_running(qtbot, preview):
    released = threading.Event()
    preview.request(lambda: released.wait(WAIT_MS / 1000) and card_pdf(tourer_card()))
    assert preview.wait_idle(timeout_ms=20) is False
    released.set()
    assert preview.wait_idle(WAIT_MS) is True
    assert preview.page_count() == 2


def test_destroying_the_widget_while_a_job_runs_is_safe(qtbot):
    widget = CardPreview()
    widget.show()
    started, released, finished = threading.Event(), threading.Event(), threading.Event()
    ran_after = []

    def slow():
        started.set()
        released.wait(WAIT_MS / 1000)
        finished.set()
        return card_pdf(tourer_card())

    widget.request(slow)
    widget.request(lambda: ran_after.append(True) or b"")  # waits behind the slow one
    assert started.wait(WAIT_MS / 1000)
    relay = widget._relay  # the result's receiver, which must outlive the widget and then go
    with qtbot.waitSignal(widget.destroyed, timeout=WAIT_MS):
        widget.deleteLater()
    with qtbot.waitSignal(relay.destroyed, timeout=WAIT_MS):
        released.set()  # the result now arrives with nobody to show it
    assert finished.is_set()
    assert ran_after == []  # the waiting job was dropped with its widget
