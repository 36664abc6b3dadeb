"""Fleets on sheets: the grid, the crop marks, backs behind fronts."""

import io
import re

import pytest
from card_helpers import SAMPLE_NAMES, SMALL_CARD, card
from pypdf import PdfReader

from kneeboard.card import fleet_pdf
from kneeboard.card.geometry import CARD_SIZES, SHEET_SIZES
from kneeboard.card.ops import Line, Page, Part, SideText, Text
from kneeboard.card.sheets import MARK_WIDTH, flip_instruction, grid_for, impose

POWERED = [n for n in SAMPLE_NAMES if n != "demo_glider"]


@pytest.mark.parametrize("size, sheet, per_sheet", [("4x6", "letter", 2), ("5x8", "letter", 2), ("4x6", "a4", 2),
                                                     ("a5", "a4", 1), ("a5", "letter", 1)])
def test_grid_counts(size, sheet, per_sheet):
    page = card("demo_microlight", size).pages[0]
    assert grid_for(page.width, page.height, sheet).per_sheet == per_sheet


def test_sheets_pages_and_crop_marks():
    cards = [card(n, "4x6", front=SMALL_CARD).pages for n in POWERED]
    physical = sum((len(pages) + 1) // 2 for pages in cards)  # a card set takes a slot per card
    assert all(len(pages) >= 2 for pages in cards) and physical >= 4
    sheets = impose(cards, "letter")
    # 2 cards per sheet: each front sheet followed by its back sheet
    assert len(sheets) == 2 * -(-physical // 2)
    w, h = SHEET_SIZES["letter"]
    assert {(s.width, s.height) for s in sheets} == {(h, w)}  # landscape letter
    for s in sheets:
        marks = [op for op in s.ops if isinstance(op, Line) and op.width == MARK_WIDTH]
        slots = len([b for b in s.blocks if b.startswith(("front", "back"))])
        assert len(marks) in (8 * 2, 8 * slots)  # 8 hairlines around each slot of the sheet
    data = fleet_pdf([card(n, "4x6", front=SMALL_CARD) for n in POWERED], "letter")
    assert len(PdfReader(io.BytesIO(data)).pages) == len(sheets)


def test_backs_mirror_their_fronts_for_duplex():
    cards = [card(n, "4x6", front=SMALL_CARD).pages for n in POWERED[:2]]
    front, back = impose(cards, "letter")[:2]

    def x_of(sheet, registration):
        from kneeboard.card.ops import Text

        return min(op.x for op in sheet.ops if isinstance(op, Text) and op.text.startswith(registration))

    reg_a = card(POWERED[0], "4x6", front=SMALL_CARD).registration
    reg_b = card(POWERED[1], "4x6", front=SMALL_CARD).registration
    assert x_of(front, reg_a) < x_of(front, reg_b)
    assert x_of(back, reg_a) > x_of(back, reg_b)  # turned over left to right, the back lands behind its front
    # the back of A sits where the front of B sits: exactly behind A once the sheet is turned over
    assert x_of(back, reg_a) == pytest.approx(x_of(front, reg_b))


def _fake_card(name: str, faces: int, size: str) -> tuple[Page, ...]:
    """A card of `faces` faces whose only ink is a label naming each face, 10 pt in from its lower left corner."""
    w, h = CARD_SIZES[size]
    return tuple(Page(w, h, (Part(0.0, 0.0, (Text(10.0, 10.0, f"{name}:{k}", "KbSans", 7.0),)),))
                 for k in range(faces))


def _labels(sheet: Page) -> dict[str, tuple[float, float]]:
    return {op.text: (op.x - 10.0, op.y - 10.0) for op in sheet.ops
            if isinstance(op, Text) and re.fullmatch(r"[A-E]:\d", op.text)}


@pytest.mark.parametrize("sheet", sorted(SHEET_SIZES))
@pytest.mark.parametrize("size", sorted(CARD_SIZES))
def test_turned_over_as_each_sheet_says_every_back_lands_behind_its_own_front(sheet, size):
    # cards of one, two, three and four faces: a single face, a card, and card sets of two cards
    cards = [_fake_card(name, faces, size) for name, faces in (("A", 2), ("B", 1), ("C", 4), ("D", 3), ("E", 2))]
    sheets = impose(cards, sheet)
    w, h = CARD_SIZES[size]
    grid = grid_for(w, h, sheet)
    placed = {}
    k = 0
    while k < len(sheets):
        front = sheets[k]
        fronts = _labels(front)
        has_back = k + 1 < len(sheets) and any(t.endswith((":1", ":3")) for t in _labels(sheets[k + 1]))
        if not has_back:
            k += 1
            placed.update(fronts)
            continue
        back = sheets[k + 1]
        notes = [op.text for sheet_page in (front, back) for op in sheet_page.ops
                 if isinstance(op, (Text, SideText)) and op.text.startswith("Print on both sides")]
        assert len(notes) == 2 and notes[0] == notes[1] == flip_instruction(grid)
        edge = "short" if "short edge" in notes[0] else "long"
        # the edge the sheet turns about: its short edges are vertical when it lies landscape
        axis_vertical = (edge == "short") == (front.width > front.height)
        for text, (x, y) in _labels(back).items():
            name, face = text.split(":")
            if axis_vertical:  # turned over left to right: x mirrors about the centre line, y stays
                turned = (front.width - x - w, y)
            else:  # turned over top to bottom
                turned = (x, front.height - y - h)
            behind = fronts[f"{name}:{int(face) - 1}"]
            assert turned == pytest.approx(behind), (sheet, size, text)
        placed.update(fronts)
        placed.update(_labels(back))
        k += 2
    # every face of every card was placed once
    assert sorted(placed) == sorted(f"{n}:{i}" for n, f in (("A", 2), ("B", 1), ("C", 4), ("D", 3), ("E", 2))
                                    for i in range(f))


def test_a_fleet_sheet_prints_its_flip_in_the_pdf():
    data = fleet_pdf([card(n, "4x6", front=SMALL_CARD) for n in POWERED[:2]], "letter")
    text = " ".join(" ".join(p.extract_text().split()) for p in PdfReader(io.BytesIO(data)).pages)
    assert "Print on both sides, flip on the short edge" in text


def test_mixed_sizes_refused():
    from kneeboard.card.sheets import SheetError

    with pytest.raises(SheetError):
        impose([card("demo_microlight", "4x6").pages, card("demo_microlight", "5x8").pages], "letter")
