"""Cards read back from the PDF: page boxes, embedded fonts, the figures on the page, ink where it belongs."""

import io
import re

import pypdfium2 as pdfium
import pytest
from card_helpers import SAMPLE_NAMES, card, card_of, default_style, pdf
from pypdf import PdfReader

from kneeboard.card import card_pdf
from kneeboard.card.geometry import CARD_SIZES, SAFE_MARGIN
from kneeboard.card.ops import Text
from kneeboard.texts import CAUTION_CARD


def reader(data: bytes) -> PdfReader:
    return PdfReader(io.BytesIO(data))


@pytest.mark.parametrize("size", list(CARD_SIZES))
@pytest.mark.parametrize("landscape", [False, True])
def test_page_box_is_exactly_the_card_size(size, landscape):
    w, h = CARD_SIZES[size]
    if landscape:
        w, h = h, w
    style = default_style().with_changes(size=size, landscape=landscape, front=("header", "margin-table"))
    data = card_pdf(card_of("demo_microlight", style))
    for page in reader(data).pages:
        box = page.mediabox
        assert float(box.width) == pytest.approx(w, abs=0.1)
        assert float(box.height) == pytest.approx(h, abs=0.1)


def test_a5_is_148_by_210_mm():
    w, h = CARD_SIZES["a5"]
    assert (w * 25.4 / 72, h * 25.4 / 72) == pytest.approx((148, 210), abs=0.01)


def test_fonts_are_embedded():
    r = reader(pdf("demo_tourer"))
    seen = 0
    for page in r.pages:
        for font in page["/Resources"]["/Font"].values():
            font = font.get_object()
            descriptor = font["/FontDescriptor"].get_object()  # a missing one (a standard font) fails here
            assert any(k in descriptor for k in ("/FontFile", "/FontFile2", "/FontFile3")), font
            seen += 1
    assert seen >= 2


def _words(data: bytes) -> list[str]:
    return [page.extract_text() for page in reader(data).pages]


@pytest.mark.parametrize("name", SAMPLE_NAMES)
def test_text_on_page_carries_the_table_builders_figures(name):
    c = card(name)
    text = " ".join(_words(pdf(name)))
    tokens = set(re.findall(r"-?\d+(?:\.\d+)?", text))
    t = c.table
    assert t.registration in text
    assert f"{t.weight.text} {t.weight_unit}" in text
    assert c.fingerprint in text
    for config in t.configurations:
        assert config.name.split()[0] in text
        assert config.pattern_speed.text in tokens
        for row in config.rows:
            assert row.stall_speed.text in tokens, (config.name, row.bank_text)
            assert row.margin.text in tokens, (config.name, row.bank_text)


@pytest.mark.parametrize("name", SAMPLE_NAMES)
def test_caution_on_every_page(name):
    for page_text in _words(pdf(name)):
        flat = " ".join(page_text.split())
        assert "CAUTION" in flat
        assert "flight manual and local regulations govern" in flat
        assert "Not a substitute for instruction" in flat


def test_caution_wording_fixed():
    # power-off is the stall speeds' condition, not the turn's: a level turn needs power
    assert "power-off flight" not in CAUTION_CARD
    for phrase in ("power-off stall speeds, for coordinated, level turns at the stated weight",
                   "center of gravity, power, contamination and maneuver",
                   "flight manual and local regulations govern"):
        assert phrase in CAUTION_CARD


def _render(data: bytes, page: int, dpi: int = 72):
    doc = pdfium.PdfDocument(data)
    return doc[page].render(scale=dpi / 72).to_pil().convert("L")


def _ink(image, box) -> float:
    crop = image.crop(box)
    dark = sum(1 for v in crop.tobytes() if v < 200)
    return dark / max(crop.width * crop.height, 1)


@pytest.mark.parametrize("name", ["demo_trainer", "demo_glider"])
def test_rendered_page_has_ink_and_the_chart_area_has_ink(name):
    c = card(name)
    data = pdf(name)
    for i, page in enumerate(c.pages):
        image = _render(data, i)
        assert _ink(image, (0, 0, image.width, image.height)) > 0.02  # not blank
        if "margin-chart" in page.blocks:
            xs, ys = _chart_extent(page)
            box = (int(xs[0]), int(page.height - ys[1]), int(xs[1]), int(page.height - ys[0]))
            assert _ink(image, box) > 0.03
    assert any("margin-chart" in p.blocks for p in c.pages)


def _chart_extent(page):
    """The area the chart's curves cover: thick paths are the stall curves."""
    from kneeboard.card.ops import Path

    points = [pt for op in page.ops if isinstance(op, Path) and op.width >= 2 for pt in op.points]
    xs = [p[0] for p in points]
    ys = [p[1] for p in points]
    return (min(xs), max(xs)), (min(ys), max(ys))


@pytest.mark.parametrize("name", SAMPLE_NAMES)
def test_text_stays_inside_the_safe_margin(name):
    from kneeboard.card import fonts

    for page in card(name).pages:
        for op in page.ops:
            if not isinstance(op, Text):
                continue
            w = fonts.width(op.text, op.font, op.size)
            left = {"left": op.x, "right": op.x - w, "centre": op.x - w / 2}[op.align]
            assert left >= SAFE_MARGIN - 0.01 and left + w <= page.width - SAFE_MARGIN + 0.01, op
            assert SAFE_MARGIN - 0.01 <= op.y <= page.height - SAFE_MARGIN, op
