"""Logos: a PNG is used as it is; an SVG is drawn once into a PNG with Qt's SVG renderer."""

from functools import lru_cache
from pathlib import Path

LOGO_PIXELS = 600  #: width of an SVG logo drawn to PNG: over 600 dpi at the size a logo prints


def logo_png(path: Path | None) -> bytes | None:
    if path is None:
        return None
    return _load(str(path), Path(path).stat().st_mtime_ns)


@lru_cache(maxsize=8)
def _load(path: str, _mtime: int) -> bytes:
    if path.lower().endswith(".png"):
        return Path(path).read_bytes()
    return _svg_to_png(path)


def _svg_to_png(path: str) -> bytes:
    from PySide6.QtCore import QBuffer, QByteArray, QIODevice
    from PySide6.QtGui import QImage, QPainter
    from PySide6.QtSvg import QSvgRenderer

    from kneeboard.qt import ensure_gui_app

    ensure_gui_app()
    renderer = QSvgRenderer(path)
    if not renderer.isValid():
        raise ValueError(f"{path}: not a readable SVG image")
    size = renderer.defaultSize()
    w = LOGO_PIXELS
    h = max(1, round(w * size.height() / max(size.width(), 1)))
    image = QImage(w, h, QImage.Format.Format_ARGB32)
    image.fill(0)
    painter = QPainter(image)
    renderer.render(painter)
    painter.end()
    data = QByteArray()
    buf = QBuffer(data)
    buf.open(QIODevice.OpenModeFlag.WriteOnly)
    image.save(buf, "PNG")
    return bytes(data.data())
