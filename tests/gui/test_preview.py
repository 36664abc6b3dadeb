"""The card viewer: the card's own PDF, shown with its page, zoom and mode controls. The renders that make the PDF
are tested without a widget (tests/test_app_preview_jobs.py). The cards are of the invented demo tourer."""

from functools import cache

import pytest
from card_helpers import SMALL_CARD, card_of
from PySide6.QtGui import QAction
from PySide6.QtPdfWidgets import QPdfView
from PySide6.QtWidgets import QComboBox, QWidget

from kneeboard.app.preview import ZOOM_STEPS, CardPreview
from kneeboard.card import card_pdf, fleet_pdf
from kneeboard.inputs.styles import load_style

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


def tourer_pdf(weight: float | None = None, **changes) -> bytes:
    return card_pdf(tourer_card(weight, **changes))


@pytest.fixture
def preview(qtbot):
    widget = CardPreview()
    qtbot.addWidget(widget)
    widget.resize(640, 820)
    widget.show()
    return widget


def show(preview, pdf: bytes) -> None:
    assert preview.show_pdf(pdf)


def control(preview, kind, name):
    found = preview.findChild(kind, name)
    assert found is not None, name
    return found


def test_shows_the_cards_own_pdf_at_its_page_size(qtbot, preview):
    show(preview, tourer_pdf())
    assert preview.pdf_bytes() == card_pdf(tourer_card())  # the same bytes that print: one renderer
    assert preview.page_count() == 2
    size = preview.page_size_points(0)
    assert size.width() == pytest.approx(A5_POINTS[0], abs=0.1)
    assert size.height() == pytest.approx(A5_POINTS[1], abs=0.1)
    assert preview.current_page() == 0
    assert preview.error_text() == ""


def test_a_smaller_card_size_changes_the_page(qtbot, preview):
    show(preview, tourer_pdf())
    show(preview, tourer_pdf(size="4x6", front=SMALL_CARD))
    size = preview.page_size_points(0)
    assert (size.width(), size.height()) == pytest.approx(SIX_BY_FOUR_POINTS, abs=0.1)


def test_page_and_zoom_survive_an_update(qtbot, preview):
    show(preview, tourer_pdf())
    pages = control(preview, QComboBox, "pageSelector")
    assert [pages.itemText(i) for i in range(pages.count())] == ["Front", "Back"]
    qtbot.waitUntil(pages.isVisible, timeout=WAIT_MS)  # the toolbar lays itself out on its next event
    pages.setCurrentIndex(1)  # as a person picks "Back"
    assert preview.current_page() == 1
    control(preview, QAction, "zoomIn").trigger()
    control(preview, QAction, "zoomIn").trigger()
    factor = preview.zoom_factor()
    assert preview.zoom_mode() == Zoom.Custom and factor in ZOOM_STEPS

    show(preview, tourer_pdf(1000.0))
    assert preview.pdf_bytes() == card_pdf(tourer_card(1000.0))
    assert preview.current_page() == 1 and pages.currentText() == "Back"
    assert preview.zoom_mode() == Zoom.Custom and preview.zoom_factor() == factor

    control(preview, QAction, "fitWidth").trigger()
    show(preview, tourer_pdf(1050.0))
    assert preview.zoom_mode() == Zoom.FitToWidth and control(preview, QAction, "fitWidth").isChecked()
    assert preview.current_page() == 1


def test_zoom_steps_stop_at_their_limits(qtbot, preview):
    show(preview, tourer_pdf())
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
    show(preview, fleet_pdf(cards))  # six faces: three cards, as a card set of three shows them
    assert preview.page_count() == 6
    assert [pages.itemText(i) for i in range(pages.count())] == [
        f"Card {i // 2 + 1} of 3 · {('front', 'back')[i % 2]} (face {i + 1} of 6)" for i in range(6)]
    pages.setCurrentIndex(4)
    assert preview.current_page() == 4

    show(preview, fleet_pdf(cards[:1], "a4"))
    size = preview.page_size_points(0)
    assert (size.width(), size.height()) == pytest.approx(A4_POINTS, abs=0.1)
    assert preview.current_page() == preview.page_count() - 1  # the page asked for is gone: the last one
    with pytest.raises(IndexError):
        preview.set_page(preview.page_count())

    show(preview, tourer_pdf(front=("header", "margin-table")))
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


def test_an_error_is_shown_over_the_last_good_page_which_stays(qtbot, preview):
    show(preview, tourer_pdf())
    good = preview.pdf_bytes()
    message = "The card cannot be made: the blocks do not fit (a test's words)."
    with qtbot.waitSignal(preview.failed, timeout=WAIT_MS) as failed:
        preview.show_error(message)
    assert failed.args == [message] and preview.error_text() == message
    assert control(preview, QWidget, "previewError").isVisible()
    assert preview.pdf_bytes() == good and preview.page_count() == 2  # the last good card stays underneath
    show(preview, tourer_pdf(1000.0))
    assert preview.error_text() == "" and not control(preview, QWidget, "previewError").isVisible()


def test_bytes_that_are_no_pdf_are_reported_not_shown(qtbot, preview):
    with qtbot.waitSignal(preview.failed, timeout=WAIT_MS) as failed:
        assert preview.show_pdf(b"%PDF-1.4 but not really") is False
    assert "could not" in failed.args[0]
    assert preview.pdf_bytes() is None and preview.page_count() == 0


def test_a_long_render_says_it_is_updating_and_a_quick_one_never_flashes(qtbot, preview):
    updating = next(w for w in preview.findChildren(QWidget) if getattr(w, "text", lambda: "")() == "Updating…")
    preview.set_busy(True)
    preview.set_busy(False)  # quicker than BUSY_DELAY_MS
    qtbot.wait(400)
    assert not updating.isVisible()
    preview.set_busy(True)
    qtbot.waitUntil(updating.isVisible, timeout=WAIT_MS)
    preview.set_busy(False)
    qtbot.waitUntil(lambda: not updating.isVisible(), timeout=WAIT_MS)  # the tool bar hides it on its next turn


def test_clear_shows_nothing(preview):
    show(preview, tourer_pdf())
    preview.mark_stale("NOT CURRENT: a test")
    preview.clear()
    assert preview.pdf_bytes() is None and preview.page_count() == 0 and preview.error_text() == ""
    assert preview.current_page() == -1
