"""Logos checked without drawing them: what the style reader may do without Qt, fonts or reportlab.

A PNG is checked chunk by chunk (signature, checksums, an end), its pixel count bounded from its header, and its
pixel data inflated (never further than its header says it holds) to see that it is all there. An SVG passes
`svgcheck` (nothing outside the file, bounded size and complexity), and each image it embeds is held to a logo
file's rules: a PNG as above, a JPEG by its frame header. The format is told by the file's first bytes, not its
name. Turning a checked logo into the PNG a card draws is `kneeboard.card.logo`'s work, when a card is drawn.
"""

import struct
import zlib
from dataclasses import dataclass
from pathlib import Path

from kneeboard.card.svgcheck import MAX_ASPECT, SvgProblem, check_svg
from kneeboard.fileio import FileProblem, read_bytes
from kneeboard.i18n import Msg, Num
from kneeboard.problems import Told

MAX_LOGO_BYTES = 2 * 1024 * 1024  #: a logo file larger than this is refused unread
MAX_PIXELS = 4000 * 4000  #: pixels of a raster logo (or an image inside an SVG), read from its header
PNG_SIGNATURE = b"\x89PNG\r\n\x1a\n"
_CHANNELS = {0: 1, 2: 3, 3: 1, 4: 2, 6: 4}  #: samples per pixel of each PNG colour type (PNG specification 11.2.2)
_ADAM7 = ((0, 0, 8, 8), (4, 0, 8, 8), (0, 4, 4, 8), (2, 0, 4, 4), (0, 2, 2, 4), (1, 0, 2, 2), (0, 1, 1, 2))


class LogoProblem(Told, ValueError):
    """A logo that cannot be used; the message says why, without the file's name."""


@dataclass(frozen=True)
class CheckedLogo:
    """A logo file's bytes as read and checked; `kind` is "png" or "svg"."""

    data: bytes
    kind: str


def read_logo(path: Path) -> CheckedLogo:
    """Read and check the logo file at `path` (".png" or ".svg"); raises LogoProblem. Nothing is drawn."""
    path = Path(path)
    try:
        data = read_bytes(path, MAX_LOGO_BYTES, "a logo is a small image")
    except FileProblem as exc:
        raise LogoProblem(_without_path(exc, path)) from None
    kind = path.suffix.lower().lstrip(".")
    if kind not in ("png", "svg"):
        raise LogoProblem(Msg("is not a PNG or SVG file"))
    return check_logo(data, kind)


def check_logo(data: bytes, kind: str) -> CheckedLogo:
    """Check the bytes of a logo named as a `kind` ("png" | "svg") file; raises LogoProblem."""
    if kind == "png":
        if not data.startswith(PNG_SIGNATURE):
            raise LogoProblem(Msg("is not a PNG image ({why})", why=_what_it_is(data)))
        png_pixels(data)
    else:
        svg_facts(data)
    return CheckedLogo(data, kind)


def svg_facts(data: bytes):
    """The `svgcheck.SvgFacts` of an SVG logo, every embedded image and the canvas checked; raises LogoProblem."""
    if data.startswith(PNG_SIGNATURE):
        raise LogoProblem(Msg("is a PNG image named .svg; rename it to .png"))
    try:
        facts = check_svg(data)
    except SvgProblem as exc:
        raise LogoProblem(exc.args[0]) from None  # its Msg, told later
    for embedded in facts.embedded:
        if embedded.startswith(PNG_SIGNATURE):
            png_pixels(embedded)
        else:
            width, height = jpeg_size(embedded)
            bound(width, height, "embeds")
    width, height = facts.width, facts.height
    if not (width and height):  # a renderer would guess 100 x 100: a logo says its size
        raise LogoProblem(Msg("has no size: give the <svg> a width and height or a viewBox"))
    if max(width / height, height / width) > MAX_ASPECT:
        raise LogoProblem(Msg("is {width} x {height} units: a logo's sides differ at most {most} times",
                               width=Num(f"{width:g}"), height=Num(f"{height:g}"), most=Num(f"{MAX_ASPECT:g}")))
    return facts


def png_size(data: bytes) -> tuple[int, int]:
    """Width and height of a PNG from its header, after checking every chunk; raises LogoProblem.

    The pixel count is bounded before anything is decoded: a small file can declare 30000 x 30000.
    """
    return _chunks(data)[:2]


def png_pixels(data: bytes) -> tuple[int, int]:
    """`png_size`, and the pixel data inflated to see that it holds every row its header declares."""
    width, height, header, compressed = _chunks(data)
    depth, colour, interlace = header[8], header[9], header[12]
    if colour not in _CHANNELS or depth not in (1, 2, 4, 8, 16):
        raise LogoProblem(Msg("cannot be decoded (colour type {colour}, bit depth {depth})", colour=str(colour),
                               depth=str(depth)))
    bits = _CHANNELS[colour] * depth
    passes = _ADAM7 if interlace else ((0, 0, 1, 1),)
    expected = 0
    for x0, y0, dx, dy in passes:
        w, h = -(-(width - x0) // dx), -(-(height - y0) // dy)
        if w > 0 and h > 0:
            expected += h * (1 + -(-w * bits // 8))
    try:
        # never inflated past what the header declares: a small file cannot unpack into gigabytes here
        got = len(zlib.decompressobj().decompress(compressed, expected + 1))
    except zlib.error as exc:
        raise LogoProblem(Msg("cannot be decoded (its pixel data is damaged: {detail})", detail=str(exc))) from None
    if got != expected:
        raise LogoProblem(Msg("cannot be decoded (its pixel data does not match its header)"))
    return width, height


def _chunks(data: bytes) -> tuple[int, int, bytes, bytes]:
    """Width, height, the IHDR data and the joined IDAT data of a PNG whose every chunk is checked."""
    if len(data) < 33 or data[12:16] != b"IHDR" or struct.unpack(">I", data[8:12])[0] != 13:
        raise LogoProblem(Msg("is not a complete PNG image (its header is missing)"))
    width, height = struct.unpack(">II", data[16:24])
    bound(width, height, "is")
    pos, pixels = 8, []
    while True:
        if pos + 12 > len(data):
            raise LogoProblem(Msg("is a truncated PNG image (it ends before its last chunk)"))
        length, kind = struct.unpack(">I4s", data[pos:pos + 8])
        end = pos + 8 + length
        if end + 4 > len(data):
            raise LogoProblem(Msg("is a truncated PNG image (a chunk runs past the end of the file)"))
        if zlib.crc32(data[pos + 4:end]) != struct.unpack(">I", data[end:end + 4])[0]:
            raise LogoProblem(Msg("is a damaged PNG image (its {chunk} chunk fails its checksum)",
                                   chunk=repr(kind.decode("latin-1"))))
        if kind == b"IDAT":
            pixels.append(data[pos + 8:end])
        pos = end + 4
        if kind == b"IEND":
            break
    if not pixels:
        raise LogoProblem(Msg("is a PNG image without pixel data"))
    return width, height, data[16:29], b"".join(pixels)


def jpeg_size(data: bytes) -> tuple[int, int]:
    """Width and height of a JPEG from its frame header (ITU T.81, B.2.2), nothing decoded; raises LogoProblem."""
    if not data.startswith(b"\xff\xd8"):
        raise LogoProblem(Msg("embeds an image that cannot be read (neither a PNG nor a JPEG)"))
    pos = 2
    while pos + 4 <= len(data):
        if data[pos] != 0xFF:
            break
        marker = data[pos + 1]
        if marker == 0xFF:  # fill byte
            pos += 1
            continue
        if marker in (0xD8, 0x01) or 0xD0 <= marker <= 0xD7:  # markers without a length
            pos += 2
            continue
        length = struct.unpack(">H", data[pos + 2:pos + 4])[0]
        if 0xC0 <= marker <= 0xCF and marker not in (0xC4, 0xC8, 0xCC):
            if pos + 9 > len(data):
                break
            height, width = struct.unpack(">HH", data[pos + 5:pos + 9])
            return width, height
        if marker in (0xD9, 0xDA) or length < 2:  # the image's end or its data, and no frame header yet
            break
        pos += 2 + length
    raise LogoProblem(Msg("embeds an image that cannot be read (a JPEG without its frame header)"))


def bound(width: int, height: int, subject: str) -> None:
    """Refuse an image of no pixels, of too many, or too narrow for a logo; `subject` is "is" (the logo itself) or
    "embeds" (an image inside an SVG): each says its own sentence."""
    embeds = subject == "embeds"
    if width < 1 or height < 1:
        w, h = str(width), str(height)
        raise LogoProblem(Msg("embeds an image of {width} x {height} pixels", width=w, height=h) if embeds else
                          Msg("is an image of {width} x {height} pixels", width=w, height=h))
    w, h, most = f"{width:,}", f"{height:,}", str(MAX_PIXELS // 1_000_000)
    if width * height > MAX_PIXELS:
        raise LogoProblem(
            Msg("embeds an image of {width} x {height} pixels; a logo has at most {most} million (e.g. 4000 x 4000)",
                width=w, height=h, most=most) if embeds else
            Msg("is an image of {width} x {height} pixels; a logo has at most {most} million (e.g. 4000 x 4000)",
                width=w, height=h, most=most))
    if max(width / height, height / width) > MAX_ASPECT:
        most = Num(f"{MAX_ASPECT:g}")
        raise LogoProblem(
            Msg("embeds an image of {width} x {height} pixels: a logo's sides differ at most {most} times", width=w,
                height=h, most=most) if embeds else
            Msg("is an image of {width} x {height} pixels: a logo's sides differ at most {most} times", width=w,
                height=h, most=most))


def _what_it_is(data: bytes) -> Msg:
    """What a file named .png that is no PNG seems to be, said in the refusal's brackets."""
    head = data[:256].lstrip(b"\xef\xbb\xbf \t\r\n")
    if not data:
        return Msg("the file is empty")
    if head.startswith(b"<"):
        return Msg("it is text, perhaps an SVG named .png: rename it to .svg")
    if head.startswith(b"\xff\xd8"):
        return Msg("it is a JPEG image: save it as PNG")
    return Msg("its first bytes are not a PNG signature")


def _without_path(exc: FileProblem, path: Path) -> str:
    """A file's refusal without the file's name (the style's problem names the file). Made as "{path}: {reason}",
    its reason is kept as made (a `Msg` is told in the user's language wherever it is shown); otherwise its text,
    the name cut off."""
    message = exc.args[0] if exc.args else ""
    if isinstance(message, Msg) and message.template.startswith("{path}: "):
        rest = message.template.removeprefix("{path}: ")
        if rest[:1] == "{" and rest[-1:] == "}" and rest[1:-1] in message.params:
            return message.params[rest[1:-1]]
    return str(exc).removeprefix(f"{path}: ")
