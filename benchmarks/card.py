"""One card, profile to finished PDF bytes, in-process; and the floor: reportlab alone drawing as much."""

import io
import time
from pathlib import Path

from reportlab.pdfgen.canvas import Canvas

from benchmarks.stats import summary
from kneeboard.card import fonts
from kneeboard.card.ops import Circle, Line, Rect, Text
from kneeboard.card.ops import Path as PathOp
from kneeboard.pipeline import Styles, card_pdf, make_card, prepare_file

LARGEST = Path(__file__).resolve().parents[1] / "sample_aircraft" / "demo_tourer.toml"


def floor_pdf(pages) -> bytes:
    """The same strings, lines and paths on pages of the same size, drawn by reportlab with no layout."""
    fonts.register()
    buf = io.BytesIO()
    c = Canvas(buf, pagesize=(pages[0].width, pages[0].height), invariant=1, initialFontName=fonts.REGULAR)
    for page in pages:
        c.setPageSize((page.width, page.height))
        for op in page.ops:
            if isinstance(op, Text):
                c.setFont(op.font, op.size)
                c.drawString(op.x, op.y, op.text)
            elif isinstance(op, Line):
                c.line(op.x1, op.y1, op.x2, op.y2)
            elif isinstance(op, Rect):
                c.rect(op.x, op.y, op.w, op.h, stroke=1, fill=1)
            elif isinstance(op, Circle):
                c.circle(op.x, op.y, op.r, stroke=1, fill=1)
            elif isinstance(op, PathOp) and len(op.points) > 1:
                path = c.beginPath()
                path.moveTo(*op.points[0])
                for x, y in op.points[1:]:
                    path.lineTo(x, y)
                c.drawPath(path)
        c.showPage()
    c.save()
    return buf.getvalue()


def run(smoke: bool = False) -> dict:
    repeats = 3 if smoke else 60
    styles = Styles()

    def make():
        return card_pdf(make_card(prepare_file(LARGEST, styles), made_on="2026-12-01"))

    make()  # first call registers fonts and fills caches: start-up, not the steady cost
    ours, floor = [], []
    pages = make_card(prepare_file(LARGEST, styles), made_on="2026-12-01").pages
    floor_pdf(pages)
    for _ in range(repeats):
        t = time.perf_counter()
        make()
        ours.append((time.perf_counter() - t) * 1000)
        t = time.perf_counter()
        floor_pdf(pages)
        floor.append((time.perf_counter() - t) * 1000)
    a, b = summary(ours, "ms"), summary(floor, "ms")
    return {"one card": a, "card floor (reportlab)": b,
            "card / floor": {"value": a["p50"] / b["p50"], "unit": "x"}}
