"""What a card page is made of: drawing operations in PDF points, origin at the bottom left.

The layout produces these; the renderer draws them. They carry no behaviour beyond moving,
so the same page can be drawn alone or imposed on a sheet.

The drawing operations are named tuples, as immutable as frozen dataclasses: a card makes hundreds of them at each
type size the layout tries, and a tuple is made about four times faster.
"""

from dataclasses import dataclass
from typing import NamedTuple

# Roles of text, for the legibility rules: figures are the numbers a pilot reads off a table.
FIGURE, LABEL, HEADING, TITLE, SMALL, CAUTION = "figure", "label", "heading", "title", "small", "caution"

#: Which way a printed figure leaves the pilot less room: a higher number (a stall speed), or a lower one (a margin,
#: a bank). Figures that are neither (a turn radius, the weight) are compared but never judged.
HIGHER_IS_WORSE, LOWER_IS_WORSE = "higher", "lower"


def _moved_at(op, dx, dy):
    """An op placed at (x, y), shifted: the one `moved` of every op with an anchor point."""
    return op._replace(x=op.x + dx, y=op.y + dy)


@dataclass(frozen=True)
class Figure:
    """A printed figure carried by the text that shows it: what it is, how it reads, which way is worse.

    The card knows every figure it printed from these tags, so comparing two cards (or a card with its PDF) reads
    the laid-out card itself, never a second list that could forget a block.
    """

    label: str  #: what the figure is, as a person reads it: "Flaps up · 30° · margin"
    text: str  #: the printed figure with its unit: "15 kt", "53°", "1.16 g"
    worse: str | None = None  #: HIGHER_IS_WORSE, LOWER_IS_WORSE or None
    key: str = ""  #: what makes it the same figure on two cards; the label unless a label could be ambiguous
    past_limit: bool = False  #: at or past its configuration's limit (`tables.Printed.past_limit`), marked so

    @property
    def identity(self) -> str:
        return self.key or self.label


class Text(NamedTuple):
    x: float
    y: float  #: baseline
    text: str
    font: str  #: registered font name
    size: float  #: [pt]
    color: str = "#000000"
    align: str = "left"  #: left | right | centre
    role: str = LABEL
    figures: tuple[Figure, ...] = ()  #: the printed figures this text shows (a line may carry several)

    moved = _moved_at


class SideText(NamedTuple):
    """A line of text turned a quarter to the left (read from bottom to top): a sheet's note in a narrow margin."""

    x: float
    y: float  #: the start of its baseline
    text: str
    font: str
    size: float
    color: str = "#000000"

    moved = _moved_at


class Line(NamedTuple):
    x1: float
    y1: float
    x2: float
    y2: float
    color: str = "#000000"
    width: float = 0.5
    dash: tuple[float, ...] = ()

    def moved(self, dx, dy):
        return self._replace(x1=self.x1 + dx, y1=self.y1 + dy, x2=self.x2 + dx, y2=self.y2 + dy)


class Rect(NamedTuple):
    x: float
    y: float  #: bottom
    w: float
    h: float
    fill: str | None = None
    stroke: str | None = None
    width: float = 0.5
    hatch: str | None = None  #: colour of diagonal hatching inside, for black-and-white marking

    moved = _moved_at


class Path(NamedTuple):
    points: tuple[tuple[float, float], ...]
    color: str | None = "#000000"
    width: float = 0.75
    dash: tuple[float, ...] = ()
    closed: bool = False
    fill: str | None = None
    fill_alpha: float = 1.0

    def moved(self, dx, dy):
        return self._replace(points=tuple((x + dx, y + dy) for x, y in self.points))


class Circle(NamedTuple):
    x: float
    y: float
    r: float
    fill: str | None = "#000000"
    stroke: str | None = None
    width: float = 0.75

    moved = _moved_at


class Image(NamedTuple):
    x: float
    y: float
    w: float
    h: float
    png: bytes  #: PNG data (SVG logos are converted before they get here)

    moved = _moved_at


@dataclass(frozen=True)
class Part:
    """Ops placed on a page by a shift: a block is laid out once and moved by the renderer, not copied."""

    dx: float
    dy: float
    ops: tuple


@dataclass(frozen=True)
class Page:
    width: float
    height: float
    parts: tuple[Part, ...]
    blocks: tuple[str, ...] = ()  #: names of the blocks on this page, in order

    @property
    def ops(self) -> tuple:
        """Every op at its place on the page (for inspection; the renderer draws the parts)."""
        return tuple(op.moved(part.dx, part.dy) for part in self.parts for op in part.ops)

    def figures(self):
        """The printed figures on this page, in drawing order."""
        return (f for part in self.parts for op in part.ops if type(op) is Text for f in op.figures)
