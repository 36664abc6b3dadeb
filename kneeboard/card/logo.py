"""Logos: checked and turned into one small PNG when the style is loaded, so drawing never meets a bad one.

A PNG is checked chunk by chunk (signature, checksums, an end), its pixel count is bounded from
its header before anything is decoded, and it is decoded with Qt's image reader and written
again as a plain PNG no larger than the card needs. An SVG passes `svgcheck` first (nothing
outside the file, bounded size and complexity), then Qt's SVG renderer draws it into a PNG.
Every failure is a LogoProblem saying what is wrong; no file but the logo itself is ever read.
"""

import struct
import zlib
from functools import lru_cache
from pathlib import Path

from kneeboard.card.svgcheck import MAX_ASPECT, SvgProblem, check_svg
from kneeboard.fileio import FileProblem, read_bytes

LOGO_PIXELS = 600  #: long side of a logo drawn to PNG: over 600 dpi at the size a logo prints
MAX_LOGO_BYTES = 2 * 1024 * 1024  #: a logo file larger than this is refused unread
MAX_PIXELS = 4000 * 4000  #: pixels of a raster logo (or an image inside an SVG), read from its header
MAX_KEPT_SIDE = 1200  #: a raster logo larger than this is scaled down: the card prints it about 2 cm wide
PNG_SIGNATURE = b"\x89PNG\r\n\x1a\n"


class LogoProblem(ValueError):
    """A logo that cannot be used; the message says why, without the file's name."""


def load_logo(path: Path) -> bytes:
    """The PNG bytes to draw for the logo file at `path`; raises LogoProblem.

    Read once per version of the file (its size and modification time), so reloading a style
    does not decode its logo again.
    """
    path = Path(path)
    try:
        info = path.stat()
    except (OSError, ValueError):
        info = None  # read_bytes below says what is wrong
    return _load(str(path), (info.st_mtime_ns, info.st_size, info.st_ino) if info else None)


def logo_png(path: Path | None) -> bytes | None:
    """The PNG bytes of a logo file, or None without one; raises LogoProblem (a ValueError) for a bad logo."""
    return None if path is None else load_logo(path)


@lru_cache(maxsize=8)
def _load(path: str, _version) -> bytes:
    try:
        data = read_bytes(Path(path), MAX_LOGO_BYTES, "a logo is a small image")
    except FileProblem as exc:
        raise LogoProblem(str(exc).removeprefix(f"{path}: ")) from None
    if path.lower().endswith(".png"):
        return png_logo(data)
    if path.lower().endswith(".svg"):
        return svg_logo(data)
    raise LogoProblem("is not a PNG or SVG file")


def png_logo(data: bytes) -> bytes:
    """Check PNG bytes and give them back as a plain PNG of at most MAX_KEPT_SIDE pixels a side."""
    if not data.startswith(PNG_SIGNATURE):
        raise LogoProblem("is not a PNG image" + _what_it_is(data))
    width, height = png_size(data)
    image = _decode(data, b"png", width, height)
    return _png_bytes(_scaled(image, MAX_KEPT_SIDE))


def png_size(data: bytes) -> tuple[int, int]:
    """Width and height of a PNG from its header, after checking every chunk; raises LogoProblem.

    The pixel count is bounded before anything is decoded: a small file can declare 30000 x 30000.
    """
    if len(data) < 33 or data[12:16] != b"IHDR" or struct.unpack(">I", data[8:12])[0] != 13:
        raise LogoProblem("is not a complete PNG image (its header is missing)")
    width, height = struct.unpack(">II", data[16:24])
    _bound(width, height, "is")
    pos, seen_data = 8, False
    while True:
        if pos + 12 > len(data):
            raise LogoProblem("is a truncated PNG image (it ends before its last chunk)")
        length, kind = struct.unpack(">I4s", data[pos:pos + 8])
        end = pos + 8 + length
        if end + 4 > len(data):
            raise LogoProblem("is a truncated PNG image (a chunk runs past the end of the file)")
        if zlib.crc32(data[pos + 4:end]) != struct.unpack(">I", data[end:end + 4])[0]:
            raise LogoProblem(f"is a damaged PNG image (its {kind.decode('latin-1')!r} chunk fails its checksum)")
        seen_data |= kind == b"IDAT"
        pos = end + 4
        if kind == b"IEND":
            break
    if not seen_data:
        raise LogoProblem("is a PNG image without pixel data")
    return width, height


def _bound(width: int, height: int, subject: str) -> None:
    if width < 1 or height < 1:
        raise LogoProblem(f"{subject} an image of {width} x {height} pixels")
    if width * height > MAX_PIXELS:
        raise LogoProblem(f"{subject} an image of {width:,} x {height:,} pixels; a logo has at most "
                          f"{MAX_PIXELS // 1_000_000} million (e.g. 4000 x 4000)")
    if max(width / height, height / width) > MAX_ASPECT:
        raise LogoProblem(f"{subject} an image of {width:,} x {height:,} pixels: a logo's sides differ at most "
                          f"{MAX_ASPECT:g} times")


def svg_logo(data: bytes) -> bytes:
    """Check SVG bytes and draw them into a PNG with Qt's SVG renderer."""
    if data.startswith(PNG_SIGNATURE):
        raise LogoProblem("is a PNG image named .svg; rename it to .png")
    try:
        facts = check_svg(data)
    except SvgProblem as exc:
        raise LogoProblem(str(exc)) from None
    for embedded in facts.embedded:
        _check_embedded(embedded)
    return _render_svg(data, facts.width, facts.height)


def _check_embedded(data: bytes) -> None:
    """An image inside an SVG is held to a logo file's rules, so the renderer never decodes a bomb."""
    if data.startswith(PNG_SIGNATURE):
        width, height = png_size(data)
        _decode(data, b"png", width, height)
        return
    reader, _buffer = _reader(data, b"jpeg")
    size = reader.size()  # from the header: nothing decoded yet
    if not size.isValid():
        raise LogoProblem(f"embeds an image that cannot be read ({reader.errorString()})")
    _bound(size.width(), size.height(), "embeds")
    image = reader.read()
    if image.isNull():
        raise LogoProblem(f"embeds an image that cannot be decoded ({reader.errorString()})")


def _what_it_is(data: bytes) -> str:
    head = data[:256].lstrip(b"\xef\xbb\xbf \t\r\n")
    if not data:
        return " (the file is empty)"
    if head.startswith(b"<"):
        return " (it is text, perhaps an SVG named .png: rename it to .svg)"
    if head.startswith(b"\xff\xd8"):
        return " (it is a JPEG image: save it as PNG)"
    return " (its first bytes are not a PNG signature)"


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
        raise LogoProblem(f"cannot be decoded ({reader.errorString()})")
    if (image.width(), image.height()) != (width, height):
        raise LogoProblem("cannot be decoded (its pixels do not match its header)")
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
        raise LogoProblem("cannot be turned into a PNG for the card")
    buffer.close()
    return bytes(data.data())


def _render_svg(data: bytes, width: float | None, height: float | None) -> bytes:
    from PySide6.QtCore import QByteArray
    from PySide6.QtGui import QImage, QPainter
    from PySide6.QtSvg import QSvgRenderer

    from kneeboard.qt import ensure_gui_app

    ensure_gui_app()
    renderer = QSvgRenderer(QByteArray(data))  # the checked bytes, never the path: the file may change meanwhile
    if not renderer.isValid():
        raise LogoProblem("is not an SVG image Qt can draw")
    if not (width and height):  # Qt would guess 100 x 100: a logo says its size
        raise LogoProblem("has no size: give the <svg> a width and height or a viewBox")
    if max(width / height, height / width) > MAX_ASPECT:
        raise LogoProblem(f"is {width:g} x {height:g} units: a logo's sides differ at most {MAX_ASPECT:g} times")
    scale = LOGO_PIXELS / max(width, height)
    image = QImage(max(1, round(width * scale)), max(1, round(height * scale)), QImage.Format.Format_ARGB32)
    image.fill(0)
    painter = QPainter(image)
    renderer.render(painter)
    painter.end()
    return _png_bytes(image)
