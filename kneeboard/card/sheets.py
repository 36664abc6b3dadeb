"""Imposition: several cards to a sheet of Letter or A4, with crop marks, backs lined up for duplex.

Cards keep their orientation; the sheet turns to whichever way holds more of them. A card set (a card of more
than two faces) is cut into its physical cards, each a slot of its own, in order. Back pages go on the following
sheet, mirrored left to right: turning that sheet over left to right (about its vertical centre line) puts each
back exactly behind its own front. That turn is a flip on the sheet's short edge when the sheet lies landscape and
on its long edge when it stands portrait; every sheet with backs prints which, in its margin outside the crop
marks (`flip_instruction`).
"""

from dataclasses import dataclass

from kneeboard.card import fonts
from kneeboard.card.geometry import MM, SHEET_SIZES
from kneeboard.card.ops import SMALL, Line, Page, Part, SideText, Text
from kneeboard.i18n import ENGLISH, Msg, Num, translator
from kneeboard.problems import Told

SHEET_MARGIN = 5 * MM  #: most printers print this close to the edge
GUTTER = 7 * MM  #: between cards: room for crop marks and the cut
MARK = 3 * MM  #: length of a crop mark
MARK_GAP = 1 * MM  #: crop marks stop this short of the card corner
MARK_WIDTH = 0.25  #: hairline [pt]
NOTE_SIZE = 7.0  #: the sheet's printing note [pt]
PRINTABLE = 5 * MM  #: most printers print no closer to the sheet's edge


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


class SheetError(Told, ValueError):
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
        raise SheetError(Msg("a {width} x {height} in card does not fit on a {sheet} sheet with room to cut it",
                             width=Num(f"{card_w / 72:.1f}"), height=Num(f"{card_h / 72:.1f}"), sheet=sheet))
    return best


def crop_marks(x: float, y: float, w: float, h: float) -> list[Line]:
    """Short hairlines outside each corner, along the card's edges."""
    marks = []
    for cx, sx in ((x, -1), (x + w, 1)):
        for cy, sy in ((y, -1), (y + h, 1)):
            marks.append(Line(cx + sx * MARK_GAP, cy, cx + sx * (MARK_GAP + MARK), cy, "#000000", MARK_WIDTH))
            marks.append(Line(cx, cy + sy * MARK_GAP, cx, cy + sy * (MARK_GAP + MARK), "#000000", MARK_WIDTH))
    return marks


def flip_instruction(grid: Grid, language: str = ENGLISH) -> str:
    """How to print a sheet and its backs so each back lands behind its own front (see the module's docstring)."""
    tr = translator(language)
    if grid.sheet_w > grid.sheet_h:
        return tr("Print on both sides, flip on the short edge (turn the sheet over left to right): each back lands "
                  "behind its own front.")
    return tr("Print on both sides, flip on the long edge (turn the sheet over left to right): each back lands "
              "behind its own front.")


def _note(grid: Grid, text: str) -> list:
    """The sheet's note where it fits outside the crop marks: above the cards, below them, or turned in the
    gutter between two columns (or the left margin)."""
    used_h = grid.rows * grid.card_h + (grid.rows - 1) * GUTTER
    top = (grid.sheet_h + used_h) / 2 + MARK_GAP + MARK  # above the highest crop mark
    w = fonts.width(text, fonts.REGULAR, NOTE_SIZE)
    if grid.sheet_h - PRINTABLE - top >= NOTE_SIZE * 1.3 and w <= grid.sheet_w - 2 * PRINTABLE:
        return [Text(grid.sheet_w / 2, top + NOTE_SIZE * 0.5, text, fonts.REGULAR, NOTE_SIZE, "#000000", "centre",
                     SMALL)]
    x0, _ = grid.origin(0, back=False)
    if grid.cols > 1:  # the middle of the first gutter is clear of every crop mark, which sit at the corners
        x = x0 + grid.card_w + GUTTER / 2 + NOTE_SIZE * 0.35
    else:
        x = max(x0 - MARK_GAP - MARK - NOTE_SIZE * 0.3, PRINTABLE + NOTE_SIZE)
    return [SideText(x, (grid.sheet_h - w) / 2, text, fonts.REGULAR, NOTE_SIZE)]


def physical_cards(cards: list[tuple[Page, ...]]) -> list[tuple[Page, ...]]:
    """Each card (a set of any number of faces) as its physical cards: a front and, where it has one, its back."""
    return [tuple(pages[i:i + 2]) for pages in cards for i in range(0, len(pages), 2)]


def impose(cards: list[tuple[Page, ...]], sheet: str, language: str = ENGLISH) -> list[Page]:
    """Sheets for `cards` (each a tuple of its faces: front, back, and in a card set the next cards' faces); the
    flip instruction in `language` (the first card's: a fleet's cards share their style's language)."""
    if not cards:
        return []
    cards = physical_cards(cards)
    first = cards[0][0]
    grid = grid_for(first.width, first.height, sheet)
    if any(p.width != first.width or p.height != first.height for c in cards for p in c):
        raise SheetError(Msg("all cards on a sheet must have the same size"))
    note = _note(grid, flip_instruction(grid, language))
    sheets = []
    for start in range(0, len(cards), grid.per_sheet):
        group = cards[start:start + grid.per_sheet]
        duplex = any(len(c) > 1 for c in group)
        for back in (False, True):
            if back and not duplex:
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
            if duplex:
                marks += note
            sheets.append(Page(grid.sheet_w, grid.sheet_h, (Part(0.0, 0.0, tuple(marks)), *parts), tuple(names)))
    return sheets
