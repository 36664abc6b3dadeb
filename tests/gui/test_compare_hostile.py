"""Card › Compare with the printed card, given a hostile PDF: the file is named with the reason, the app goes on."""

import zlib

from kneeboard.card.data import COMPRESSED_MARK, MARKER


def test_the_app_names_a_hostile_card_and_goes_on(qtbot, window, tmp_path):
    hostile = tmp_path / "deep.pdf"
    deep = zlib.compress(MARKER + b"[" * 200_000 + b"]" * 200_000 + b"}")
    hostile.write_bytes(b"%PDF-1.4\n/" + COMPRESSED_MARK.encode() + b" /Card\nstream\n" + deep + b"\nendstream\n")
    window.ask_open_path = lambda *_: hostile
    window.act_compare_printed.trigger()
    title, text = window.problems_seen[-1]
    assert title == "Cannot read the card" and "deep.pdf" in text and "levels deep" in text
    assert window.isVisible()
