"""Printing a card at its true size: the same PDF the preview shows, page by page, at 1:1.

A laminated card has to be the size the layout was checked for, so the printer's page is set to
each PDF page's exact size with no margins, and the page is drawn at 1:1 from a render at the
printer's resolution. A printer that refuses such a paper keeps its own, and the card is still
drawn at true size, centred, to be cut out.
"""

from PySide6.QtCore import QMarginsF, QRectF, QSize, QSizeF
from PySide6.QtGui import QColor, QImage, QPageLayout, QPageSize, QPainter
from PySide6.QtPrintSupport import QAbstractPrintDialog, QPrintDialog, QPrinter
from PySide6.QtWidgets import QDialog, QWidget

from kneeboard.app.preview import PdfProblem, open_pdf
from kneeboard.app.words import tr
from kneeboard.i18n import Msg
from kneeboard.problems import Told

__all__ = ["page_layout", "print_pdf", "print_with_dialog"]

#: Highest resolution a page is rendered at for printing [dpi]. A 1200 dpi printer gets the page
#: drawn from a 600 dpi render, still at true size: 7 pt type needs no more, and a whole Letter
#: sheet at 1200 dpi would be a single image of over 500 MB.
MAX_RENDER_DPI = 600


def page_layout(points: QSizeF) -> QPageLayout:
    """A portrait, margin-free page layout of exactly `points` (width x height as given) [pt]."""
    size = QPageSize(points, QPageSize.Unit.Point, "Card", QPageSize.SizeMatchPolicy.ExactMatch)
    return QPageLayout(size, QPageLayout.Orientation.Portrait, QMarginsF(0, 0, 0, 0), QPageLayout.Unit.Point)


def _pages_to_print(printer: QPrinter, count: int) -> list[int]:
    """Page indices in printing order, honouring the page range and order chosen in a print dialog."""
    first, last = 0, count - 1
    if printer.printRange() == QPrinter.PrintRange.PageRange and printer.fromPage() > 0:
        first = min(count, printer.fromPage()) - 1
        last = max(first, min(count, printer.toPage() or count) - 1)
    pages = list(range(first, last + 1))
    if printer.pageOrder() == QPrinter.PageOrder.LastPageFirst:
        pages.reverse()
    # a printer (or the PDF writer) that cannot make copies itself gets each page as often as asked
    copies = 1 if printer.supportsMultipleCopies() else max(1, printer.copyCount())
    if printer.collateCopies():
        return pages * copies
    return [page for page in pages for _ in range(copies)]


class PrinterProblem(Told, OSError):
    """A printer that cannot start or take another page; its message is told in the app's language."""


def print_pdf(pdf: bytes, printer: QPrinter) -> int:
    """Print every page of `pdf` on `printer` at its true size; returns the number of pages printed.

    Each page sets the printer's page to the PDF page's own size, with no margin, and is drawn at
    1:1 from a render at the printer's resolution (at most MAX_RENDER_DPI). The page range, page
    order and copies chosen in a print dialog are honoured.

    Raises
    ------
    PdfProblem
        (a ValueError) When `pdf` is not a PDF that can be read.
    PrinterProblem
        (an OSError) When the printer cannot start or cannot take another page.
    """
    try:
        doc = open_pdf(pdf)
    except PdfProblem as exc:
        raise PdfProblem(Msg("nothing was printed: {reason}", reason=exc.args[0])) from None
    try:
        pages = _pages_to_print(printer, doc.pageCount())
        printer.setFullPage(True)  # the painter's origin is the paper's corner, not a margin's
        painter = QPainter()
        try:
            for n, page in enumerate(pages):
                # a layout set before begin() applies to the first page, before newPage() to the next one
                printer.setPageLayout(page_layout(doc.pagePointSize(page)))
                if n == 0 and not painter.begin(printer):
                    raise PrinterProblem(Msg("the printer {printer} could not start printing",
                                             printer=repr(printer.printerName() or printer.outputFileName())))
                if n > 0 and not printer.newPage():
                    raise PrinterProblem(Msg("the printer could not start a new page"))
                _draw_page(painter, printer, doc, page)
        finally:
            if painter.isActive():
                painter.end()
        return len(pages)
    finally:
        doc.close()
        doc.deleteLater()


def _draw_page(painter: QPainter, printer: QPrinter, doc, page: int) -> None:
    """Draw `page` at 1:1 physical size, centred on the printer's paper."""
    points = doc.pagePointSize(page)
    dpi_x, dpi_y = printer.logicalDpiX(), printer.logicalDpiY()
    target = QRectF(0, 0, points.width() * dpi_x / 72, points.height() * dpi_y / 72)
    # the paper is a whole number of points, the card may be a fraction of one smaller: share the difference
    target.moveCenter(printer.paperRect(QPrinter.Unit.DevicePixel).center())
    scale = min(1.0, MAX_RENDER_DPI / max(dpi_x, dpi_y))
    image = doc.render(page, QSize(max(1, round(target.width() * scale)), max(1, round(target.height() * scale))))
    # QtPdf leaves the paper transparent; printers and PDF writers do best with plain white, and
    # painting it in behind the page in place saves a second copy of a large image
    flatten = QPainter(image)
    flatten.setCompositionMode(QPainter.CompositionMode.CompositionMode_DestinationOver)
    flatten.fillRect(image.rect(), QColor("white"))
    flatten.end()
    image.convertTo(QImage.Format.Format_RGB32)
    painter.drawImage(target, image)


def print_with_dialog(parent: QWidget | None, pdf: bytes, title: str) -> bool:
    """Show the system print dialog for `pdf` and print it if accepted; returns whether it printed.

    Raises
    ------
    ValueError
        When `pdf` cannot be read (before any dialog is shown).
    """
    doc = open_pdf(pdf)
    count, first = doc.pageCount(), doc.pagePointSize(0)
    doc.close()
    doc.deleteLater()
    printer = QPrinter(QPrinter.PrinterMode.HighResolution)
    printer.setDocName(title)
    printer.setCreator("kneeboard")
    printer.setFullPage(True)
    printer.setPageLayout(page_layout(first))  # the dialog then offers the card's own paper
    dialog = QPrintDialog(printer, parent)
    dialog.setWindowTitle(tr("Print {name}", name=title))
    dialog.setMinMax(1, count)
    dialog.setOption(QAbstractPrintDialog.PrintDialogOption.PrintPageRange, count > 1)
    dialog.setOption(QAbstractPrintDialog.PrintDialogOption.PrintSelection, False)
    if dialog.exec() != QDialog.DialogCode.Accepted:
        return False
    print_pdf(pdf, printer)
    return True
