"""The floor of every drawing figure: reportlab alone putting the same marks on pages of the same size.

A page here is plain data (`ink_of` makes it from a card's laid-out pages): its size, and the strings, lines,
rectangles, circles and paths on it, at their places. `draw` puts them on paper with no layout, no style, no
figures and no checks: what is left is the least any program pays to print that card with reportlab. Hatching is
ink too, so each hatched rectangle brings its hatch lines.

This module imports only reportlab (and the standard library): the fleet floor runs it as a bare script.
"""

import io
import math

from reportlab import rl_config
from reportlab.pdfbase import pdfmetrics
from reportlab.pdfbase.ttfonts import TTFont
from reportlab.pdfgen.canvas import Canvas

HATCH_SPACING = 2.8  #: as the card draws it [pt]
PREFIX = "Floor-"  #: the floor's own font names, so an in-process floor never replaces the card's fonts


def ink_of(pages) -> list[dict]:
    """Plain data of laid-out pages (`kneeboard.card.ops.Page`): every mark at its place on the page [pt]."""
    from kneeboard.card.ops import Circle, Line, Path, Rect, Text

    out = []
    for page in pages:
        ink: dict = {"w": page.width, "h": page.height, "texts": [], "lines": [], "rects": [], "circles": [],
                     "paths": []}
        for op in page.ops:
            if type(op) is Text:
                ink["texts"].append((op.font, op.size, op.x, op.y, op.text))
            elif type(op) is Line:
                ink["lines"].append((op.x1, op.y1, op.x2, op.y2))
            elif type(op) is Rect:
                ink["rects"].append((op.x, op.y, op.w, op.h))
                if op.hatch:
                    ink["lines"] += _hatch(op.x, op.y, op.w, op.h)
            elif type(op) is Circle:
                ink["circles"].append((op.x, op.y, op.r))
            elif type(op) is Path and len(op.points) > 1:
                ink["paths"].append(tuple(op.points))
        out.append(ink)
    return out


def _hatch(x, y, w, h) -> list[tuple]:
    """The hatch lines of a rectangle, cut at its edges (the card clips them; the floor draws them cut)."""
    lines = []
    for i in range(math.ceil((w + h) / HATCH_SPACING)):
        k = -h + i * HATCH_SPACING
        x1, y1 = (x + k, y) if k >= 0 else (x, y - k)
        x2, y2 = (x + k + h, y + h) if k + h <= w else (x + w, y + (w - k))
        lines.append((x1, y1, x2, y2))
    return lines


def register(font_files: dict[str, str]) -> None:
    """Register each font file under the floor's name for it (`PREFIX` + the card's font name)."""
    for name, path in font_files.items():
        if PREFIX + name not in pdfmetrics.getRegisteredFontNames():
            pdfmetrics.registerFont(TTFont(PREFIX + name, path))


def pdf(pages: list[dict], count: int | None = None) -> bytes:
    """A PDF of `count` pages (default: one for each of `pages`, which repeat in turn when `count` is larger).

    Fonts must be `register`ed first. Streams are compressed and binary, as the card's are.
    """
    rl_config.useA85 = 0
    buf = io.BytesIO()
    first = pages[0]
    c = Canvas(buf, pagesize=(first["w"], first["h"]), invariant=1, pageCompression=1)
    for i in range(len(pages) if count is None else count):
        draw(c, pages[i % len(pages)])
        c.showPage()
    c.save()
    return buf.getvalue()


def draw(c: Canvas, page: dict) -> None:
    c.setPageSize((page["w"], page["h"]))
    for font, size, x, y, text in page["texts"]:
        c.setFont(PREFIX + font, size)
        c.drawString(x, y, text)
    for x1, y1, x2, y2 in page["lines"]:
        c.line(x1, y1, x2, y2)
    for x, y, w, h in page["rects"]:
        c.rect(x, y, w, h, stroke=1, fill=1)
    for x, y, r in page["circles"]:
        c.circle(x, y, r, stroke=1, fill=1)
    for points in page["paths"]:
        path = c.beginPath()
        path.moveTo(*points[0])
        for x, y in points[1:]:
            path.lineTo(x, y)
        c.drawPath(path)
