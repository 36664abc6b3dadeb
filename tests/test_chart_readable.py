"""The margin chart read at arm's length: no label on another label, a curve or a marker, on every sample at every
card size and orientation; every configuration told apart by its own marker shape; the limit bank always shown."""

import pytest
from card_helpers import SAMPLE_NAMES, card
from pypdf import PdfReader

from kneeboard.card import LayoutError, card_pdf
from kneeboard.card.blocks.margin_chart import SHAPES, ink_outside_text, label_boxes
from kneeboard.card.geometry import CARD_SIZES
from kneeboard.card.ops import Circle, Path

COMBINATIONS = [(n, s, land) for n in SAMPLE_NAMES for s in CARD_SIZES for land in (False, True)]


def chart_blocks(c):
    for page in c.pages:
        for name, part in zip(page.blocks, page.parts):
            if name == "margin-chart":
                yield part


def overlaps(a, b) -> bool:
    return a[0] < b[2] and b[0] < a[2] and a[1] < b[3] and b[1] < a[3]


def ink_boxes(op):
    if type(op) is Circle:
        return [(op.x - op.r, op.y - op.r, op.x + op.r, op.y + op.r)]
    half = op.width / 2
    pts = list(op.points) + ([op.points[0]] if op.closed else [])
    boxes = []
    for (x0, y0), (x1, y1) in zip(pts, pts[1:]):
        steps = max(1, int(max(abs(x1 - x0), abs(y1 - y0)) / 0.5))
        for k in range(steps + 1):
            x, y = x0 + (x1 - x0) * k / steps, y0 + (y1 - y0) * k / steps
            boxes.append((x - half, y - half, x + half, y + half))
    return boxes


@pytest.mark.parametrize("name, size, landscape", COMBINATIONS)
def test_no_chart_label_touches_another_label_a_curve_or_a_marker(name, size, landscape):
    try:
        c = card(name, size, landscape)
    except LayoutError:
        return  # reported by name elsewhere (test_card_layout); a card that is not made has no chart to read
    for part in chart_blocks(c):
        texts = label_boxes(part)
        for i, a in enumerate(texts):
            for b in texts[i + 1:]:
                assert not overlaps(a, b), (a, b)
        ink = [box for op in ink_outside_text(part) for box in ink_boxes(op)]
        for a in texts:
            assert not any(overlaps(a, b) for b in ink), a


@pytest.mark.parametrize("name", SAMPLE_NAMES)
def test_each_configuration_has_its_own_marker_shape_and_its_legend_row(name):
    c = card(name)
    (part,) = chart_blocks(c)
    closed = [op for op in part.ops if type(op) is Path and op.closed and op.color is not None]
    circles = [op for op in part.ops if type(op) is Circle]
    n = len(c.table.configurations)
    assert n <= len(SHAPES)
    assert circles  # the first configuration's markers
    if n > 1:
        assert len({len(op.points) for op in closed}) == min(n - 1, 3)  # square 4, triangle 3, diamond 4 points
    text = " ".join(p.extract_text() for p in PdfReader(__import__("io").BytesIO(card_pdf(c))).pages)
    assert "filled marker: zero-margin bank; open: buffer bank" in " ".join(text.split())
    tagged = {f.label: f.text for f in part.ops and [f for op in part.ops if hasattr(op, "figures")
                                                     for f in op.figures]}
    for cfg in c.table.configurations:  # each bank in its configuration's legend row, tagged as that figure
        assert tagged[f"{cfg.name} · zero-margin bank"] == f"{cfg.zero_margin_bank.text}°"


@pytest.mark.parametrize("name", SAMPLE_NAMES)
def test_the_limit_bank_is_on_the_chart_even_beyond_its_axis(name):
    c = card(name)
    (part,) = chart_blocks(c)
    labels = [op.text for op in part.ops if hasattr(op, "text")]
    assert any(text.startswith(f"limit bank {c.table.limit_bank.text}°") for text in labels)


def test_hatched_cells_keep_a_clear_area_behind_their_digits():
    # the demo tourer's 60 degree rows are under the buffer: hatched, with the figure on a clear patch
    import pypdfium2 as pdfium

    from kneeboard.card import fonts
    from kneeboard.card.draw import HATCH, WHITE
    from kneeboard.card.ops import Rect, Text

    c = card("demo_tourer")
    page = c.pages[0]
    ops = page.ops
    # the cells (wider than high), not the legend's square swatch
    hatched = [i for i, op in enumerate(ops) if type(op) is Rect and op.hatch == HATCH and op.w > op.h * 1.5]
    assert hatched
    dpi = 200
    image = pdfium.PdfDocument(card_pdf(c))[0].render(scale=dpi / 72).to_pil().convert("L")
    for i in hatched:
        clear = ops[i + 1]
        text = next(op for op in ops[i + 2:] if type(op) is Text)  # after the patch (and a frame, if any)
        assert type(clear) is Rect and clear.fill == WHITE
        w = fonts.width(text.text, text.font, text.size)
        # the digits' box lies inside the clear patch
        assert clear.x <= text.x - w and text.x <= clear.x + clear.w
        assert clear.y <= text.y and text.y + fonts.ascent(text.size) <= clear.y + clear.h
        # and on paper: the ring between the digits and the patch's edge is white, no hatch line crosses it
        k = dpi / 72
        for x, y in ((clear.x + 0.6, clear.y + clear.h / 2), (clear.x + clear.w - 0.6, clear.y + clear.h / 2)):
            assert image.getpixel((round(x * k), round((page.height - y) * k))) > 240
