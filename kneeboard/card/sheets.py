"""Imposition: several cards to a sheet of Letter or A4, with crop marks, backs lined up for duplex.

Cards keep their orientation; the sheet turns to whichever way holds more of them. Back pages
go on the following sheet, mirrored left to right, so that printing double-sided (flipping on
the long edge) puts each back exactly behind its front.
"""

from dataclasses import dataclass

from kneeboard.card.geometry import MM, SHEET_SIZES
from kneeboard.card.ops import Line, Page, Part

SHEET_MARGIN = 5 * MM  #: most printers print this close to the edge
GUTTER = 7 * MM  #: between cards: room for crop marks and the cut
MARK = 3 * MM  #: length of a crop mark
MARK_GAP = 1 * MM  #: crop marks stop this short of the card corner
MARK_WIDTH = 0.25  #: hairline [pt]


@dataclass(frozen=True)
class Grid:
    sheet_w: float
    sheet_h: float
    cols: int
    rows: int
    card_w: float
    card_h: float

    @property
    def per_sheet(self) -> int:
        return self.cols * self.rows

    def origin(self, slot: int, back: bool) -> tuple[float, float]:
        """Bottom-left corner of `slot` (filled row by row from the top left) [pt]."""
        row, col = divmod(slot, self.cols)
        if back:
            col = self.cols - 1 - col
        used_w = self.cols * self.card_w + (self.cols - 1) * GUTTER
        used_h = self.rows * self.card_h + (self.rows - 1) * GUTTER
        x0 = (self.sheet_w - used_w) / 2
        y_top = (self.sheet_h + used_h) / 2
        return x0 + col * (self.card_w + GUTTER), y_top - (row + 1) * self.card_h - row * GUTTER


class SheetError(ValueError):
    """Cards that cannot be imposed on the chosen sheet; the message says why."""


def grid_for(card_w: float, card_h: float, sheet: str) -> Grid:
    """The sheet orientation and grid that hold the most cards of this size."""
    w, h = SHEET_SIZES[sheet]
    best = None
    for sw, sh in ((w, h), (h, w)):
        cols = int((sw - 2 * SHEET_MARGIN + GUTTER) // (card_w + GUTTER))
        rows = int((sh - 2 * SHEET_MARGIN + GUTTER) // (card_h + GUTTER))
        if cols * rows and (best is None or cols * rows > best.per_sheet):
            best = Grid(sw, sh, cols, rows, card_w, card_h)
    if best is None:
        raise SheetError(f"a {card_w / 72:.1f} x {card_h / 72:.1f} in card does not fit on a {sheet} sheet "
                         "with room to cut it")
    return best


def crop_marks(x: float, y: float, w: float, h: float) -> list[Line]:
    """Short hairlines outside each corner, along the card's edges."""
    marks = []
    for cx, sx in ((x, -1), (x + w, 1)):
        for cy, sy in ((y, -1), (y + h, 1)):
            marks.append(Line(cx + sx * MARK_GAP, cy, cx + sx * (MARK_GAP + MARK), cy, "#000000", MARK_WIDTH))
            marks.append(Line(cx, cy + sy * MARK_GAP, cx, cy + sy * (MARK_GAP + MARK), "#000000", MARK_WIDTH))
    return marks


def impose(cards: list[tuple[Page, ...]], sheet: str) -> list[Page]:
    """Sheets for `cards` (each a tuple of front and optional back page)."""
    if not cards:
        return []
    first = cards[0][0]
    grid = grid_for(first.width, first.height, sheet)
    if any(p.width != first.width or p.height != first.height for c in cards for p in c):
        raise SheetError("all cards on a sheet must have the same size")
    sheets = []
    for start in range(0, len(cards), grid.per_sheet):
        group = cards[start:start + grid.per_sheet]
        for back in (False, True):
            if back and not any(len(c) > 1 for c in group):
                continue
            marks, parts, names = [], [], []
            for slot, card in enumerate(group):
                x, y = grid.origin(slot, back)
                marks += crop_marks(x, y, grid.card_w, grid.card_h)
                if back and len(card) < 2:
                    continue
                page = card[1] if back else card[0]
                parts += [Part(x + part.dx, y + part.dy, part.ops) for part in page.parts]
                names.append(f"{'back' if back else 'front'}:{slot}")
            sheets.append(Page(grid.sheet_w, grid.sheet_h, (Part(0.0, 0.0, tuple(marks)), *parts), tuple(names)))
    return sheets
