"""The one renderer: draws layout pages into vector PDF with reportlab, fonts embedded.

The app previews exactly these bytes and the command line writes them, so what is seen is
what prints.
"""

import io

from reportlab.lib.colors import HexColor
from reportlab.lib.utils import ImageReader
from reportlab.pdfgen.canvas import Canvas

from kneeboard import __version__
from kneeboard.card import fonts
from kneeboard.card.ops import Circle, Image, Line, Page, Path, Rect, Text

HATCH_SPACING = 2.8  #: distance between hatch lines [pt]


def pdf_bytes(pages, title: str = "kneeboard card", subject: str = "") -> bytes:
    """One PDF page per layout page, each page box exactly the page's size."""
    fonts.register()
    buf = io.BytesIO()
    # the initial font is ours too, so no unembedded standard font is ever referenced
    c = Canvas(buf, pagesize=(pages[0].width, pages[0].height), invariant=1, pageCompression=1,
               initialFontName=fonts.REGULAR, initialFontSize=10)
    c.setTitle(title)
    c.setSubject(subject)
    c.setCreator(f"kneeboard {__version__}")
    for page in pages:
        c.setPageSize((page.width, page.height))
        draw_ops(c, page.ops)
        c.showPage()
    c.save()
    return buf.getvalue()


def draw_ops(c: Canvas, ops, dx: float = 0.0, dy: float = 0.0) -> None:
    """Draw layout ops on a reportlab canvas, shifted by (dx, dy) [pt] (for imposing on sheets)."""
    if dx or dy:
        c.saveState()
        c.translate(dx, dy)
    for op in ops:
        _DRAW[type(op)](c, op)
    if dx or dy:
        c.restoreState()


def _text(c: Canvas, t: Text) -> None:
    c.setFillColor(HexColor(t.color))
    c.setFont(t.font, t.size)
    if t.align == "right":
        c.drawRightString(t.x, t.y, t.text)
    elif t.align == "centre":
        c.drawCentredString(t.x, t.y, t.text)
    else:
        c.drawString(t.x, t.y, t.text)


def _line(c: Canvas, op: Line) -> None:
    c.setStrokeColor(HexColor(op.color))
    c.setLineWidth(op.width)
    c.setDash(list(op.dash) if op.dash else [])
    c.line(op.x1, op.y1, op.x2, op.y2)
    c.setDash([])


def _rect(c: Canvas, r: Rect) -> None:
    if r.fill:
        c.setFillColor(HexColor(r.fill))
        c.rect(r.x, r.y, r.w, r.h, stroke=0, fill=1)
    if r.hatch:
        c.saveState()
        clip = c.beginPath()
        clip.rect(r.x, r.y, r.w, r.h)
        c.clipPath(clip, stroke=0, fill=0)
        c.setStrokeColor(HexColor(r.hatch))
        c.setLineWidth(0.6)
        k = -r.h
        while k < r.w:
            c.line(r.x + k, r.y, r.x + k + r.h, r.y + r.h)
            k += HATCH_SPACING
        c.restoreState()
    if r.stroke:
        c.setStrokeColor(HexColor(r.stroke))
        c.setLineWidth(r.width)
        c.rect(r.x, r.y, r.w, r.h, stroke=1, fill=0)


def _path(c: Canvas, p: Path) -> None:
    if len(p.points) < 2:
        return
    path = c.beginPath()
    path.moveTo(*p.points[0])
    for x, y in p.points[1:]:
        path.lineTo(x, y)
    if p.closed:
        path.close()
    if p.fill:
        c.saveState()
        c.setFillColor(HexColor(p.fill))
        c.setFillAlpha(p.fill_alpha)
        c.drawPath(path, stroke=0, fill=1)
        c.restoreState()
    if p.color:
        c.setStrokeColor(HexColor(p.color))
        c.setLineWidth(p.width)
        c.setLineJoin(1)
        c.setDash(list(p.dash) if p.dash else [])
        c.drawPath(path, stroke=1, fill=0)
        c.setDash([])


def _circle(c: Canvas, op: Circle) -> None:
    if op.fill:
        c.setFillColor(HexColor(op.fill))
    if op.stroke:
        c.setStrokeColor(HexColor(op.stroke))
        c.setLineWidth(op.width)
    c.circle(op.x, op.y, op.r, stroke=1 if op.stroke else 0, fill=1 if op.fill else 0)


def _image(c: Canvas, op: Image) -> None:
    c.drawImage(ImageReader(io.BytesIO(op.png)), op.x, op.y, op.w, op.h, mask="auto", preserveAspectRatio=True,
                anchor="e")


_DRAW = {Text: _text, Line: _line, Rect: _rect, Path: _path, Circle: _circle, Image: _image}


def pages_of(cards) -> list[Page]:
    return [page for card in cards for page in card.pages]
