"""PNG pictures of card pages, rendered from the PDF itself with QtPdf, for pilots who fly with a tablet."""

from kneeboard.qt import ensure_gui_app


def pdf_to_pngs(pdf: bytes, dpi: int) -> list[bytes]:
    """Every page of `pdf` as PNG bytes at `dpi`, white background."""
    from PySide6.QtCore import QBuffer, QByteArray, QIODevice, QSize
    from PySide6.QtGui import QColor, QImage, QPainter
    from PySide6.QtPdf import QPdfDocument

    ensure_gui_app()
    data = QByteArray(pdf)
    source = QBuffer(data)
    source.open(QIODevice.OpenModeFlag.ReadOnly)
    doc = QPdfDocument()
    doc.load(source)
    if doc.status() != QPdfDocument.Status.Ready:
        raise ValueError("the PDF could not be read back for rendering")
    pngs = []
    for i in range(doc.pageCount()):
        points = doc.pagePointSize(i)
        size = QSize(round(points.width() * dpi / 72), round(points.height() * dpi / 72))
        image = doc.render(i, size)
        flat = QImage(image.size(), QImage.Format.Format_RGB32)
        flat.fill(QColor("white"))
        painter = QPainter(flat)
        painter.drawImage(0, 0, image)
        painter.end()
        out = QByteArray()
        buf = QBuffer(out)
        buf.open(QIODevice.OpenModeFlag.WriteOnly)
        flat.save(buf, "PNG")
        pngs.append(bytes(out.data()))
    doc.close()
    return pngs
