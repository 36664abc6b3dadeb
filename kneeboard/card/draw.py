"""Shared pieces of the card blocks: the context they draw from, type sizes, and a small op collector.

Blocks draw top-down in local coordinates: the block's top edge is y = 0 and everything lies
below it (negative y); the layout then moves the block into place on the page.
"""

from dataclasses import dataclass, field

from kneeboard.card import fonts
from kneeboard.card.ops import CAUTION, FIGURE, HEADING, LABEL, SMALL, TITLE, Circle, Figure, Line, Path, Rect, Text
from kneeboard.card.style import CardStyle
from kneeboard.i18n import Msg, Translator, translator
from kneeboard.printed import figure, weight_text  # noqa: F401  (the blocks take them from here too)
from kneeboard.tables import CardTable

INK = "#111111"
GREY = "#5f5f5f"
RULE = "#9a9a9a"
SHADE = "#ececec"  #: alternate table rows: survives black-and-white printing as light grey
HATCH = "#6e6e6e"
WHITE = "#ffffff"

MIN_TEXT = 7.0  #: no text on any card is smaller [pt]
REGISTRATION = "registration"  #: not a role of its own: a TITLE at this base size

#: Base type sizes at font scale 1 on A5 [pt]; every role but FIGURE is held at MIN_TEXT or more.
BASE_SIZE = {REGISTRATION: 24.0, TITLE: 11.0, HEADING: 9.5, FIGURE: 15.0, LABEL: 8.5, SMALL: 7.5, CAUTION: 7.0}
SECONDARY = 0.8  #: figures of the smaller tables, relative to the bank table's figures


class DoesNotFit(Exception):
    """A block that cannot be laid out in the space offered; `block` names it, `reason` (a `Msg`) says why: the
    layout's refusal tells it in the user's language."""

    def __init__(self, block: str, reason: str):
        super().__init__(f"{block}: {reason}")
        self.block = block
        self.reason = reason


@dataclass(frozen=True)
class Context:
    """What every block draws from: the printed table, the style, and the type scale of this attempt."""

    table: CardTable
    style: CardStyle
    scale: float
    fingerprint: str
    made_on: str
    logo_png: bytes | None = None
    split: bool = False  #: a table too wide for its column may break into groups of configurations
    #: what a block makes the same at every type size (its cells and their figures), kept across the sizes tried
    memo: dict = field(default_factory=dict, compare=False, repr=False)

    def once(self, key, make):
        """`make()` the first time `key` is asked for in this layout, the same object after."""
        if key not in self.memo:
            self.memo[key] = make()
        return self.memo[key]

    @property
    def tr(self) -> Translator:
        """The card's words and decimal separator, in its table's language (`kneeboard.i18n`), with the soft hyphens
        its wrapping may break long words at."""
        return translator(self.table.language, soft_hyphens=True)

    def size(self, role: str) -> float:
        size = BASE_SIZE[role] * self.scale
        return size if role == FIGURE else max(size, MIN_TEXT)

    @property
    def figure(self) -> float:
        return self.size(FIGURE)

    @property
    def secondary_figure(self) -> float:
        return self.size(FIGURE) * SECONDARY


@dataclass(frozen=True)
class Block:
    name: str
    height: float
    ops: tuple


# --- measuring before drawing ----------------------------------------------------------------------------------
#
# A block is planned at a type size and width (its text wrapped, its columns sized, its rows counted) without a
# single drawing operation: the plan's `measure` says how tall each of its parts is, and where it may break. The
# layout chooses the type size and the placement from these measures alone, then asks each plan to draw the
# pieces it placed, once.


@dataclass(frozen=True)
class Section:
    """A part of a block with its own column heads: a table (or one group of a table too wide for one), a chart."""

    head: float  #: drawn atop every piece of this section [pt]; the whole section when it has no rows
    rows: tuple[float, ...] = ()  #: the rows between which the section may break, each its height [pt]
    grow: float = 0.0  #: more height the section would use where its column has room left (a chart) [pt]


@dataclass(frozen=True)
class Measure:
    """How tall a block's parts are at one type size and width, and where it may break."""

    sections: tuple[Section, ...]
    lead: float = 0.0  #: printed once, above the first section (a title and its detail), kept with the first row
    foot: float = 0.0  #: printed once, below the last row (a legend, a note), kept with the last row
    again: float = 0.0  #: the title line atop a piece that continues the block in a new column or on a new face
    gap: float = 0.0  #: between two sections that share a column

    @property
    def height(self) -> float:
        """The whole block in one piece per section, sections one under the other."""
        return (self.lead + self.foot + sum(s.head + sum(s.rows) for s in self.sections)
                + self.gap * (len(self.sections) - 1))


@dataclass(frozen=True)
class Piece:
    """The part of a block placed in one column: rows `start:stop` of one section, with what surrounds them."""

    section: int
    start: int = 0
    stop: int = 0
    lead: bool = False  #: the block's first piece: its title and detail above
    again: bool = False  #: continues the block at the top of a column: its title line, "continued"
    foot: bool = False  #: the block's last piece: its legend or note below
    extra: float = 0.0  #: room given to a section that grows [pt]

    def height(self, m: Measure) -> float:
        s = m.sections[self.section]
        return ((m.lead if self.lead else 0.0) + (m.again if self.again else 0.0) + s.head
                + sum(s.rows[self.start:self.stop]) + (m.foot if self.foot else 0.0) + self.extra)

    @staticmethod
    def whole(m: Measure) -> list["Piece"]:
        """The block unbroken: one piece per section."""
        last = len(m.sections) - 1
        return [Piece(i, 0, len(s.rows), lead=i == 0, foot=i == last) for i, s in enumerate(m.sections)]


class Plan:
    """A block planned at one type size and width: `measure` without drawing, then `draw(piece)` for each piece.

    A plan that cannot break is one section without rows; `draw` ignores the piece's rows.
    """

    name: str
    measure: Measure

    def draw(self, piece: Piece) -> Block:
        raise NotImplementedError


class Whole(Plan):
    """A block drawn in one piece by a plain `draw(ctx, width)` (a block that declares no plan of its own)."""

    def __init__(self, block: Block):
        self.name, self.block = block.name, block
        self.measure = Measure((Section(block.height),))

    def draw(self, piece: Piece) -> Block:
        return self.block


class Draw:
    """Collects the ops of one block."""

    def __init__(self, ctx: Context):
        self.ctx = ctx
        self.ops: list = []

    def text(self, x, y, s, role=LABEL, bold=False, align="left", color=INK, size=None, figures=()):
        """A line of text; `figures` tags it with the printed figures it shows (`ops.Figure`, one or several)."""
        if size is None:
            size = self.ctx.size(role)
        if not figures:
            tags = ()
        elif type(figures) is Figure:
            tags = (figures,)
        else:
            tags = tuple(f for f in figures if f is not None)
        self.ops.append(Text(x, y, s, fonts.BOLD if bold else fonts.REGULAR, size, color, align, role, tags))

    def line(self, x1, y1, x2, y2, color=INK, width=0.5, dash=()):
        self.ops.append(Line(x1, y1, x2, y2, color, width, tuple(dash)))

    def rect(self, x, top, w, h, fill=None, stroke=None, width=0.5, hatch=None):
        self.ops.append(Rect(x, top - h, w, h, fill, stroke, width, hatch))

    def path(self, points, color=INK, width=0.75, dash=(), closed=False, fill=None, fill_alpha=1.0):
        self.ops.append(Path(tuple(points), color, width, tuple(dash), closed, fill, fill_alpha))

    def circle(self, x, y, r, fill=INK, stroke=None, width=0.75):
        self.ops.append(Circle(x, y, r, fill, stroke, width))

    def block(self, name: str, height: float) -> Block:
        return Block(name, height, tuple(self.ops))


def baseline(top: float, row_height: float, size: float) -> float:
    """Baseline that centres capitals of `size` in a row whose top edge is at `top`."""
    return top - (row_height + fonts.ascent(size)) / 2


def fit_lines(block: str, text: str, font: str, size: float, max_width: float, max_lines: int,
              hyphenate: bool = False) -> list[str]:
    """Wrap `text`; raise DoesNotFit when it needs more lines, or a word is wider, than allowed (with `hyphenate`, a
    word wider than the line is broken with a hyphen instead)."""
    lines = fonts.wrap(text, font, size, max_width, hyphenate=hyphenate)
    if len(lines) > max_lines or any(fonts.width(line, font, size) > max_width + 0.01 for line in lines):
        raise DoesNotFit(block, Msg("{text} does not fit in {width} pt", text=repr(text),
                                    width=format(max_width, ".0f")))
    return lines
