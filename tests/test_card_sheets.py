"""Fleets on sheets: the grid, the crop marks, backs behind fronts."""

import io

import pytest
from card_helpers import SAMPLE_NAMES, SMALL_CARD, card
from pypdf import PdfReader

from kneeboard.card import fleet_pdf
from kneeboard.card.geometry import SHEET_SIZES
from kneeboard.card.ops import Line
from kneeboard.card.sheets import MARK_WIDTH, grid_for, impose

POWERED = [n for n in SAMPLE_NAMES if n != "demo_glider"]


@pytest.mark.parametrize("size, sheet, per_sheet", [("4x6", "letter", 2), ("5x8", "letter", 2), ("4x6", "a4", 2),
                                                     ("a5", "a4", 1), ("a5", "letter", 1)])
def test_grid_counts(size, sheet, per_sheet):
    page = card("demo_microlight", size).pages[0]
    assert grid_for(page.width, page.height, sheet).per_sheet == per_sheet


def test_sheets_pages_and_crop_marks():
    cards = [card(n, "4x6", front=SMALL_CARD).pages for n in POWERED]  # 4 cards, each with a back
    sheets = impose(cards, "letter")
    assert len(sheets) == 4  # 2 cards per sheet: 2 front sheets, each followed by its back sheet
    w, h = SHEET_SIZES["letter"]
    assert {(s.width, s.height) for s in sheets} == {(h, w)}  # landscape letter
    for s in sheets:
        marks = [op for op in s.ops if isinstance(op, Line) and op.width == MARK_WIDTH]
        assert len(marks) == 8 * 2  # 8 hairlines around each of the 2 slots
    data = fleet_pdf([card(n, "4x6", front=SMALL_CARD) for n in POWERED], "letter")
    assert len(PdfReader(io.BytesIO(data)).pages) == 4


def test_backs_mirror_their_fronts_for_duplex():
    cards = [card(n, "4x6", front=SMALL_CARD).pages for n in POWERED[:2]]
    front, back = impose(cards, "letter")[:2]

    def x_of(sheet, registration):
        from kneeboard.card.ops import Text

        return min(op.x for op in sheet.ops if isinstance(op, Text) and op.text.startswith(registration))

    reg_a = card(POWERED[0], "4x6", front=SMALL_CARD).registration
    reg_b = card(POWERED[1], "4x6", front=SMALL_CARD).registration
    assert x_of(front, reg_a) < x_of(front, reg_b)
    assert x_of(back, reg_a) > x_of(back, reg_b)  # flipped on the long edge, the back lands behind its front
    # the back of A sits where the front of B sits: exactly behind A once the sheet is turned over
    assert x_of(back, reg_a) == pytest.approx(x_of(front, reg_b))


def test_mixed_sizes_refused():
    from kneeboard.card.sheets import SheetError

    with pytest.raises(SheetError):
        impose([card("demo_microlight", "4x6").pages, card("demo_microlight", "5x8").pages], "letter")
