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
def test_each_configurations_limit_bank_is_on_the_chart_even_beyond_its_axis(name):
    c = card(name)
    (part,) = chart_blocks(c)
    labels = [op.text for op in part.ops if hasattr(op, "text")]
    tagged = {f.label: f.text for op in part.ops if hasattr(op, "figures") for f in op.figures}
    for cfg in c.table.configurations:  # in its legend row, and as a labelled line (or an edge note) on the plot
        assert tagged[f"{cfg.name} · limit bank"] == f"{cfg.limit_bank.text}°"
        assert any(f"limit {cfg.limit_bank.text}°" in text or f"limit bank {cfg.limit_bank.text}°" in text
                   for text in labels if "(" in text)


def test_no_marker_lies_at_or_past_its_configurations_own_limit_bank():
    # the tourer's Flaps 30 (a triangle) has its buffer bank 64 and zero-margin bank 68 past its own limit of 60;
    # Flaps 10 (a square) its zero-margin bank 64; Flaps 0 (a circle) both banks inside its 74
    c = card("demo_tourer")
    assert [(cfg.buffer_bank.text, cfg.zero_margin_bank.text, cfg.limit_bank.text)
            for cfg in c.table.configurations] == [("59", "63", "74"), ("59", "≥60", "60"), ("≥60", "≥60", "60")]
    (part,) = chart_blocks(c)
    axis = next(op.y for op in part.ops if hasattr(op, "text") and op.text == "bank angle")
    plotted = [op for op in part.ops if getattr(op, "y", None) is not None and op.y > axis or
               type(op) is Path and op.closed and min(y for _, y in op.points) > axis]
    circles = [op for op in plotted if type(op) is Circle and op.r > 1.5]
    shapes = [op for op in plotted if type(op) is Path and op.closed and op.fill is not None and op.color is not None]
    squares = [op for op in shapes if len(op.points) == 4 and len({round(y, 3) for _, y in op.points}) == 2]
    triangles = [op for op in shapes if len(op.points) == 3]
    assert len(circles) == 2  # Flaps 0: 59 and 63
    assert len(squares) == 1 and squares[0].fill == "#ffffff"  # Flaps 10: the buffer bank 59 only
    assert triangles == []  # Flaps 30: both past 60
