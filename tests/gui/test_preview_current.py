"""The preview shows the card that prints: never an older card as current, and a stale card greyed and named.

The pixels on screen are compared with a fresh preview of the exported bytes: a view that shows anything else (a page
of an earlier card, say) fails, whatever the widget believes it shows.
"""

import numpy as np
from card_helpers import card_of
from conftest import settle
from PySide6.QtCore import Qt
from PySide6.QtGui import QImage
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QWidget

from kneeboard.app.preview import CardPreview
from kneeboard.card import card_pdf
from kneeboard.inputs.styles import load_style

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
    assert reference.show_pdf(pdf)
    return view_pixels(qtbot, reference)


def type_and_tab(field, text: str) -> None:
    field.input.setFocus()
    field.input.selectAll()
    QTest.keyClicks(field.input, text, Qt.KeyboardModifier.NoModifier, KEY_DELAY_MS)
    QTest.keyClick(field.input, Qt.Key.Key_Tab)


def test_the_page_on_screen_is_the_exported_card_in_20_of_20_tries(qtbot, window, tmp_path):
    """The reported steps: a new profile from the normal template, a maximum weight, Tab, a VA, Tab; then export."""
    for attempt in range(20):
        window.act_new["normal"].trigger()
        settle(qtbot, window.controller)
        type_and_tab(window.editor.fields["aircraft.max_weight"], f"{1010 + 10 * attempt} kg")
        type_and_tab(window.editor.fields["aircraft.maneuvering_speed"], f"{101 + attempt} kt")
        settle(qtbot, window.controller)
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
        assert preview.show_pdf(old)
        preview.findChild(QWidget, "previewView").viewport().repaint()  # the old page goes to the view's renderer
        assert preview.show_pdf(new)
        assert preview.pdf_bytes() == new
        assert view_pixels(qtbot, preview) == pixels_of(qtbot, new, preview), attempt


def test_an_input_error_greys_the_last_card_and_says_it_is_not_current(qtbot, window, tmp_path):
    settle(qtbot, window.controller)
    good = window.preview.pdf_bytes()
    field = window.editor.fields["weight.total"]
    field.input.setFocus()
    field.input.selectAll()
    QTest.keyClicks(field.input, "1450 kt")  # a speed for a weight: an error
    settle(qtbot, window.controller)
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
    settle(qtbot, window.controller)
    assert window.preview.error_text() == "" and not veil.isVisible()
    assert window.preview.pdf_bytes() == good


def test_a_render_running_when_the_profile_breaks_does_not_clear_the_mark(qtbot, window):
    """An edit starts a render, the next edit breaks the profile before it ends: the finished render is dropped."""
    settle(qtbot, window.controller)
    weight = window.editor.fields["weight.total"]
    weight.input.setFocus()
    weight.input.selectAll()
    QTest.keyClicks(weight.input, "1500 lb")
    qtbot.wait(window.controller.timer.interval() + 5)  # its render is running now
    QTest.keyClicks(weight.input, " kt")  # "1500 lb kt": an error
    settle(qtbot, window.controller)
    assert "NOT CURRENT" in window.preview.error_text()
    assert window.preview.findChild(QWidget, "previewError").isVisible()
