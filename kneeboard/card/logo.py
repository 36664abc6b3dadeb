"""Logos drawn into the one small PNG a card prints, when a card is drawn (never when a style is read).

The style reader checks a logo without drawing it (`logocheck`: no Qt) and keeps the bytes it checked
(`CardStyle.logo_bytes`); here those bytes, never the file again, are decoded with Qt's image reader and written
again as a plain PNG no larger than the card needs, or, for an SVG, drawn by Qt's SVG renderer. Each logo is
drawn once per process (`drawn_logo` keeps the last few). A failure is a LogoProblem saying what is wrong.
"""

from functools import lru_cache
from pathlib import Path

from kneeboard.card.logocheck import PNG_SIGNATURE, LogoProblem, bound, check_logo, png_size, read_logo, svg_facts
from kneeboard.i18n import Msg

LOGO_PIXELS = 600  #: long side of a logo drawn to PNG: over 600 dpi at the size a logo prints
MAX_KEPT_SIDE = 1200  #: a raster logo larger than this is scaled down: the card prints it about 2 cm wide


def drawn_logo(style) -> bytes | None:
    """The PNG bytes a card of `style` (a `CardStyle`) prints as its logo, or None without one; raises LogoProblem.

    Made from the bytes checked when the style was read; a style built in code (no bytes) has its file read.
    """
    if style.logo is None:
        return None
    if style.logo_bytes is None:
        return load_logo(style.logo)
    return _drawn(style.logo_bytes, Path(style.logo).suffix.lower().lstrip("."))


def load_logo(path: Path) -> bytes:
    """The PNG bytes to draw for the logo file at `path`, read and checked now; raises LogoProblem."""
    checked = read_logo(Path(path))
    return _drawn(checked.data, checked.kind)


def logo_png(path: Path | None) -> bytes | None:
    """The PNG bytes of a logo file, or None without one; raises LogoProblem (a ValueError) for a bad logo."""
    return None if path is None else load_logo(path)


@lru_cache(maxsize=8)
def _drawn(data: bytes, kind: str) -> bytes:
    checked = check_logo(data, kind)  # the same checks again: these bytes may come from anywhere
    return png_logo(checked.data) if checked.kind == "png" else svg_logo(checked.data)


def png_logo(data: bytes) -> bytes:
    """Check PNG bytes and give them back as a plain PNG of at most MAX_KEPT_SIDE pixels a side."""
    check_logo(data, "png")
    width, height = png_size(data)
    image = _decode(data, b"png", width, height)
    return _png_bytes(_scaled(image, MAX_KEPT_SIDE))


def svg_logo(data: bytes) -> bytes:
    """Check SVG bytes and draw them into a PNG with Qt's SVG renderer."""
    facts = svg_facts(data)
    for embedded in facts.embedded:
        _decode_embedded(embedded)
    return _render_svg(data, facts.width, facts.height)


def _decode_embedded(data: bytes) -> None:
    """An image inside an SVG, checked from its header already, is decoded once before the renderer meets it."""
    if data.startswith(PNG_SIGNATURE):
        width, height = png_size(data)
        _decode(data, b"png", width, height)
        return
    reader, _buffer = _reader(data, b"jpeg")
    size = reader.size()  # from the header: nothing decoded yet
    if not size.isValid():
        raise LogoProblem(Msg("embeds an image that cannot be read ({detail})", detail=reader.errorString()))
    bound(size.width(), size.height(), "embeds")
    if reader.read().isNull():
        raise LogoProblem(Msg("embeds an image that cannot be decoded ({detail})", detail=reader.errorString()))


def _reader(data: bytes, fmt: bytes):
    from PySide6.QtCore import QBuffer, QByteArray, QIODevice
    from PySide6.QtGui import QImageReader

    from kneeboard.qt import ensure_gui_app

    ensure_gui_app()
    buffer = QBuffer()
    buffer.setData(QByteArray(data))
    buffer.open(QIODevice.OpenModeFlag.ReadOnly)
    reader = QImageReader(buffer, fmt)
    reader.setDecideFormatFromContent(False)
    return reader, buffer  # the buffer must outlive the reader


def _decode(data: bytes, fmt: bytes, width: int, height: int):
    reader, _buffer = _reader(data, fmt)
    image = reader.read()
    if image.isNull():
        raise LogoProblem(Msg("cannot be decoded ({detail})", detail=reader.errorString()))
    if (image.width(), image.height()) != (width, height):
        raise LogoProblem(Msg("cannot be decoded (its pixels do not match its header)"))
    return image


def _scaled(image, side: int):
    from PySide6.QtCore import Qt

    if max(image.width(), image.height()) <= side:
        return image
    return image.scaled(side, side, Qt.AspectRatioMode.KeepAspectRatio, Qt.TransformationMode.SmoothTransformation)


def _png_bytes(image) -> bytes:
    from PySide6.QtCore import QBuffer, QByteArray, QIODevice

    data = QByteArray()
    buffer = QBuffer(data)
    buffer.open(QIODevice.OpenModeFlag.WriteOnly)
    if not image.save(buffer, "PNG"):
        raise LogoProblem(Msg("cannot be turned into a PNG for the card"))
    buffer.close()
    return bytes(data.data())


def _render_svg(data: bytes, width: float, height: float) -> bytes:
    from PySide6.QtCore import QByteArray
    from PySide6.QtGui import QImage, QPainter
    from PySide6.QtSvg import QSvgRenderer

    from kneeboard.qt import ensure_gui_app

    ensure_gui_app()
    renderer = QSvgRenderer(QByteArray(data))  # the checked bytes, never the path: the file may change meanwhile
    if not renderer.isValid():
        raise LogoProblem(Msg("is not an SVG image Qt can draw"))
    scale = LOGO_PIXELS / max(width, height)
    image = QImage(max(1, round(width * scale)), max(1, round(height * scale)), QImage.Format.Format_ARGB32)
    image.fill(0)
    painter = QPainter(image)
    renderer.render(painter)
    painter.end()
    return _png_bytes(image)
