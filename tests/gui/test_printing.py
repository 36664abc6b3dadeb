"""Printing: every page of the card's PDF on paper of the card's own size, drawn at 1:1."""

import io
from functools import cache

import numpy as np
import pypdfium2
import pytest
from card_helpers import SMALL_CARD, card_of
from pypdf import PdfReader
from PySide6.QtPrintSupport import QPrintDialog, QPrinter
from PySide6.QtWidgets import QDialog

from kneeboard.app.printing import print_pdf, print_with_dialog
from kneeboard.card import card_pdf, fleet_pdf
from kneeboard.inputs.styles import load_style

MADE_ON = "2026-12-01"


@cache
def card(name: str = "demo_tourer", **changes):
    style, problems = load_style()
    assert style is not None, problems
    return card_of(name, style.with_changes(**changes))


def pdf_printer(path, dpi: int = 150) -> QPrinter:
    printer = QPrinter()
    printer.setOutputFormat(QPrinter.OutputFormat.PdfFormat)
    printer.setOutputFileName(str(path))
    printer.setResolution(dpi)  # enough to check placement; a real printer brings its own
    return printer


def boxes(data_or_path) -> list[tuple[float, float]]:
    """Each page's media box (width, height) [pt]."""
    reader = PdfReader(io.BytesIO(data_or_path) if isinstance(data_or_path, bytes) else data_or_path)
    return [(float(p.mediabox.width), float(p.mediabox.height)) for p in reader.pages]


def gray(data: bytes, page: int = 0) -> np.ndarray:
    """A page rendered at 72 dpi (one pixel a point) by pypdfium2, outside Qt."""
    doc = pypdfium2.PdfDocument(data)
    return np.asarray(doc[page].render(scale=1.0).to_pil().convert("L"), dtype=float)


@pytest.mark.parametrize("changes", [{}, {"size": "4x6", "front": SMALL_CARD}, {"landscape": True},
                                     {"size": "half-letter"}],
                         ids=["a5", "4x6", "a5-landscape", "half-letter"])
def test_each_page_prints_on_paper_of_the_cards_size(qtbot, tmp_path, changes):
    pdf = card_pdf(card(**changes))
    out = tmp_path / "printed.pdf"
    expected = boxes(pdf)
    assert print_pdf(pdf, pdf_printer(out)) == len(expected)
    printed = boxes(out)
    assert len(printed) == len(expected)
    for (w, h), (ew, eh) in zip(printed, expected, strict=True):
        # Qt keeps page sizes in whole points: within 1 pt, and never turned round
        assert w == pytest.approx(ew, abs=1.0) and h == pytest.approx(eh, abs=1.0)


def test_sheets_of_a_fleet_print_on_their_sheets(qtbot, tmp_path):
    cards = [card(name, size="4x6", front=SMALL_CARD) for name in ("demo_trainer", "demo_microlight")]
    pdf = fleet_pdf(cards, "letter")
    out = tmp_path / "sheets.pdf"
    expected = boxes(pdf)
    assert len(expected) >= 2
    assert print_pdf(pdf, pdf_printer(out, dpi=72)) == len(expected)
    printed = boxes(out)
    assert len(printed) == len(expected)
    for (w, h), (ew, eh) in zip(printed, expected, strict=True):
        assert sorted((w, h)) == pytest.approx([612.0, 792.0], abs=1.0)  # US Letter, 8.5 x 11 in, computed
        assert (w, h) == pytest.approx((ew, eh), abs=1.0)  # turned as the sheet is


def test_the_printed_page_is_the_card_at_one_to_one(qtbot, tmp_path):
    pdf = card_pdf(card())
    out = tmp_path / "printed.pdf"
    print_pdf(pdf, pdf_printer(out))
    printed_data = out.read_bytes()
    for page in (0, 1):
        source, printed = gray(pdf, page), gray(printed_data, page)
        h, w = min(source.shape[0], printed.shape[0]) - 8, min(source.shape[1], printed.shape[1]) - 8

        def mismatch(dy, dx, source=source, printed=printed, h=h, w=w):
            return np.abs(source[4:h, 4:w] - printed[4 + dy:h + dy, 4 + dx:w + dx]).mean()

        shifts = {(dy, dx): mismatch(dy, dx) for dy in range(-3, 4) for dx in range(-3, 4)}
        best = min(shifts, key=shifts.get)
        assert abs(best[0]) <= 1 and abs(best[1]) <= 1, shifts  # not scaled, not moved: within a point
        assert shifts[best] < shifts[(3, 3)] / 2  # and the match is a real one, not a blank against a blank
        dark_source, dark_printed = (source < 128).mean(), (printed < 128).mean()
        assert dark_printed == pytest.approx(dark_source, rel=0.25)


def test_a_page_range_prints_only_those_pages(qtbot, tmp_path):
    pdf = card_pdf(card())
    out = tmp_path / "back.pdf"
    printer = pdf_printer(out, dpi=72)
    printer.setPrintRange(QPrinter.PrintRange.PageRange)
    printer.setFromTo(2, 2)
    assert print_pdf(pdf, printer) == 1
    assert len(boxes(out)) == 1
    assert (gray(out.read_bytes()) < 128).mean() == pytest.approx((gray(pdf, 1) < 128).mean(), rel=0.25)


def test_copies_the_pdf_writer_cannot_make_are_printed_collated(qtbot, tmp_path):
    pdf = card_pdf(card())
    out = tmp_path / "copies.pdf"
    printer = pdf_printer(out, dpi=72)
    printer.setCopyCount(2)
    assert not printer.supportsMultipleCopies()  # so the pages themselves are repeated
    assert print_pdf(pdf, printer) == 4
    assert len(boxes(out)) == 4
    for i, expected_page in enumerate((0, 1, 0, 1)):
        dark = (gray(out.read_bytes(), i) < 128).mean()
        assert dark == pytest.approx((gray(pdf, expected_page) < 128).mean(), rel=0.25)


def test_bytes_that_are_no_pdf_are_refused_before_printing(qtbot, tmp_path):
    out = tmp_path / "never.pdf"
    with pytest.raises(ValueError, match="PDF could not be read"):
        print_pdf(b"this is not a card", pdf_printer(out))
    assert not out.exists()


def test_the_print_dialog_prints_when_accepted(qtbot, tmp_path, monkeypatch):
    pdf = card_pdf(card())
    out = tmp_path / "from-dialog.pdf"
    seen = {}

    def accept(dialog):
        # what a person does in the system dialog: here, choose to print to a PDF file
        seen.update(title=dialog.windowTitle(), pages=(dialog.minPage(), dialog.maxPage()))
        dialog.printer().setOutputFormat(QPrinter.OutputFormat.PdfFormat)
        dialog.printer().setOutputFileName(str(out))
        dialog.printer().setResolution(72)
        return QDialog.DialogCode.Accepted

    monkeypatch.setattr(QPrintDialog, "exec", accept)
    assert print_with_dialog(None, pdf, "DEMO-TOUR") is True
    assert seen == {"title": "Print DEMO-TOUR", "pages": (1, 2)}
    assert len(boxes(out)) == 2


def test_the_print_dialog_prints_nothing_when_cancelled(qtbot, tmp_path, monkeypatch):
    out = tmp_path / "cancelled.pdf"

    def cancel(dialog):
        dialog.printer().setOutputFormat(QPrinter.OutputFormat.PdfFormat)
        dialog.printer().setOutputFileName(str(out))
        return QDialog.DialogCode.Rejected

    monkeypatch.setattr(QPrintDialog, "exec", cancel)
    assert print_with_dialog(None, card_pdf(card()), "DEMO-TOUR") is False
    assert not out.exists()
