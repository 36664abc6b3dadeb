"""The preview shows the card that prints: never an older card as current, and a stale card greyed and named.

The pixels on screen are compared with a fresh preview of the exported bytes: a view that shows anything else (a page
of an earlier card, say) fails, whatever the widget believes it shows.
"""

import threading

import numpy as np
import pytest
from card_helpers import card_of
from PySide6.QtCore import Qt
from PySide6.QtGui import QImage
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QWidget

from kneeboard.app.preview import CardPreview
from kneeboard.card import card_pdf
from kneeboard.card.style import load_style

WAIT_MS = 10_000
KEY_DELAY_MS = 15  #: a quick typist: renders start between keystrokes and are overtaken by the next ones


def view_pixels(qtbot, preview: CardPreview) -> QImage:
    """What the preview's page area shows once its page is drawn: two equal grabs in a row with ink on them.

    QPdfView draws a page on a worker thread after it first paints, so a grab may show a blank page for a while.
    """
    found = {}

    def steady() -> bool:
        view = preview.findChild(QWidget, "previewView")
        image = view.viewport().grab().toImage()
        steady_now = found.get("last") == image and ink(image) > 0.002
        found["last"] = image
        return steady_now

    qtbot.waitUntil(steady, timeout=WAIT_MS)
    return found["last"]


def ink(image: QImage) -> float:
    gray = image.convertToFormat(QImage.Format.Format_Grayscale8)
    rows = np.frombuffer(gray.constBits(), np.uint8, gray.sizeInBytes()).reshape(gray.height(), gray.bytesPerLine())
    return float((rows[:, : gray.width()] < 100).mean())


def pixels_of(qtbot, pdf: bytes, like: CardPreview) -> QImage:
    """`pdf` as a fresh preview of the same size shows it: a view that has never shown another document."""
    reference = CardPreview()
    qtbot.addWidget(reference)
    reference.resize(like.size())
    reference.show()
    with qtbot.waitSignal(reference.rendered, timeout=WAIT_MS):
        reference.request(lambda: pdf)
    return view_pixels(qtbot, reference)


def type_and_tab(field, text: str) -> None:
    field.input.setFocus()
    field.input.selectAll()
    QTest.keyClicks(field.input, text, Qt.KeyboardModifier.NoModifier, KEY_DELAY_MS)
    QTest.keyClick(field.input, Qt.Key.Key_Tab)


def settle(qtbot, window) -> None:
    qtbot.wait(window.timer.interval() + 20)
    assert window.preview.wait_idle(WAIT_MS)


def test_the_page_on_screen_is_the_exported_card_in_20_of_20_tries(qtbot, window, tmp_path):
    """The reported steps: a new profile from the normal template, a maximum weight, Tab, a VA, Tab; then export."""
    for attempt in range(20):
        window.act_new["normal"].trigger()
        settle(qtbot, window)
        type_and_tab(window.editor.fields["aircraft.max_weight"], f"{1010 + 10 * attempt} kg")
        type_and_tab(window.editor.fields["aircraft.maneuvering_speed"], f"{101 + attempt} kt")
        settle(qtbot, window)
        out = tmp_path / f"card{attempt}.pdf"
        window.ask_save_path = lambda *_args, out=out: out
        window.act_export.trigger()
        exported = out.read_bytes()
        assert window.preview.error_text() == ""
        assert view_pixels(qtbot, window.preview) == pixels_of(qtbot, exported, window.preview), attempt


def test_a_page_drawn_for_the_previous_card_never_shows_as_the_new_one(qtbot):
    """The previous card's page is being drawn (the view painted it) when the next card arrives: 20 times over."""
    style, _ = load_style()
    cards = [card_pdf(card_of("demo_tourer", style, weight=f"{w} kg")) for w in (900, 1100)]
    assert cards[0] != cards[1]
    preview = CardPreview()
    qtbot.addWidget(preview)
    preview.resize(640, 820)
    preview.show()
    for attempt in range(20):
        old, new = cards[attempt % 2], cards[1 - attempt % 2]
        with qtbot.waitSignal(preview.rendered, timeout=WAIT_MS):
            preview.request(lambda old=old: old)
        preview.findChild(QWidget, "previewView").viewport().repaint()  # the old page goes to the view's renderer
        with qtbot.waitSignal(preview.rendered, timeout=WAIT_MS):
            preview.request(lambda new=new: new)
        assert preview.pdf_bytes() == new
        assert view_pixels(qtbot, preview) == pixels_of(qtbot, new, preview), attempt


def test_an_input_error_greys_the_last_card_and_says_it_is_not_current(qtbot, window, tmp_path):
    settle(qtbot, window)
    good = window.preview.pdf_bytes()
    field = window.editor.fields["weight.total"]
    field.input.setFocus()
    field.input.selectAll()
    QTest.keyClicks(field.input, "1450 kt")  # a speed for a weight: an error
    settle(qtbot, window)
    veil = window.preview.findChild(QWidget, "previewError")
    assert veil.isVisible()
    assert "NOT CURRENT" in window.preview.error_text() and "1 error" in window.preview.error_text()
    assert window.preview.pdf_bytes() == good  # the last good card stays under the veil, greyed
    # the greyed card is never the one exported or printed
    window.ask_save_path = lambda *_args: tmp_path / "x.pdf"
    window.act_export.trigger()
    assert not (tmp_path / "x.pdf").exists() and window.problems_seen[-1][0] == "No card"
    # the value as it was (the very card under the veil) is current again, drawn anew
    field.input.selectAll()
    QTest.keyClicks(field.input, "1560 lb")
    settle(qtbot, window)
    assert window.preview.error_text() == "" and not veil.isVisible()
    assert window.preview.pdf_bytes() == good


def test_a_render_running_when_the_profile_breaks_does_not_clear_the_mark(qtbot, window):
    """An edit starts a render, the next edit breaks the profile before it ends: the finished render is dropped."""
    settle(qtbot, window)
    weight = window.editor.fields["weight.total"]
    weight.input.setFocus()
    weight.input.selectAll()
    QTest.keyClicks(weight.input, "1500 lb")
    qtbot.wait(window.timer.interval() + 5)  # its render is running now
    QTest.keyClicks(weight.input, " kt")  # "1500 lb kt": an error
    settle(qtbot, window)
    assert "NOT CURRENT" in window.preview.error_text()
    assert window.preview.findChild(QWidget, "previewError").isVisible()


@pytest.mark.parametrize("cancel", ["clear", "mark_stale"])
def test_waiting_for_renders_never_waits_for_one_that_was_cancelled(qtbot, cancel):
    """A render cancelled while it runs (its card closed, or made stale by an input error) is dropped when it ends:
    waiting for the preview's work must not wait for it (test teardowns waited 10 s for such renders)."""
    preview = CardPreview()
    qtbot.addWidget(preview)
    preview.show()
    released = threading.Event()
    style, _ = load_style()
    card = card_pdf(card_of("demo_tourer", style))
    preview.request(lambda: released.wait(3 * WAIT_MS / 1000) and card)  # blocked until released
    assert preview.wait_idle(timeout_ms=20) is False  # wanted, and still running
    if cancel == "clear":
        preview.clear()
    else:
        preview.mark_stale("NOT CURRENT: test")
    try:
        assert preview.wait_idle(timeout_ms=2000) is True  # the cancelled render is blocked for 30 s yet
    finally:
        released.set()
    qtbot.wait(50)
    assert preview.pdf_bytes() is None  # its result was dropped, never shown
    # a new request after it is waited for, and shown
    with qtbot.waitSignal(preview.rendered, timeout=WAIT_MS):
        preview.request(lambda: card)
    assert preview.pdf_bytes() == card and preview.error_text() == ""


def test_waiting_for_renders_of_a_deleted_preview_returns_at_once(qtbot):
    """pytest-qt deletes a test's window before the fixture's teardown runs: a render running then is dropped with
    its widget, and the teardown waited 10 s for it (about half the runs of one test)."""
    import shiboken6

    preview = CardPreview()
    preview.show()
    released = threading.Event()
    style, _ = load_style()
    card = card_pdf(card_of("demo_tourer", style))
    preview.request(lambda: released.wait(3 * WAIT_MS / 1000) and card)
    assert preview.wait_idle(timeout_ms=20) is False
    shiboken6.delete(preview)
    try:
        assert preview.wait_idle(timeout_ms=2000) is True
    finally:
        released.set()
    qtbot.wait(100)  # the dropped result reaches the relay, which discards it
