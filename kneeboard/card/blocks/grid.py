"""Drawing the card's tables: cells in columns, figures right-aligned on a common edge, headers that wrap.

Each piece is measured when it is made (its text wrapped, its columns checked against their widest figure) and
drawn later at any top, so a block can say how tall it is before anything is drawn, and draw a table broken
between rows with its heads repeated.

Row states are marked so they survive black-and-white printing. Every number comes as printed text from the
table builder; nothing is re-rounded here.
"""

from functools import lru_cache

from kneeboard.card import fonts
from kneeboard.card.draw import GREY, HATCH, INK, SHADE, WHITE, DoesNotFit, Draw, baseline, fit_lines
from kneeboard.card.ops import FIGURE, HEADING, LABEL, SMALL
from kneeboard.i18n import Msg
from kneeboard.printed import BLACK, HATCHED, NO_VALUE, Cell

__all__ = ["BLACK", "HATCHED", "NO_VALUE", "Cell", "Grid"]

NAME_LINES = 3  #: a configuration's name wraps to at most this many lines
CONTINUED = "continued"
NAME_SHARE = 0.45  #: the most of a table's width its column of configuration names may take
#: a block's detail under its title, or its note, wraps to at most this many lines (English takes three at most;
#: the same words in German or Polish may take five on a small card)
NOTE_LINES = 5


class Grid:
    """Rows of cells in columns [(x, w)], numbers right-aligned on a common edge per column.

    The edges come from the widest figure of every row, so a table broken between rows keeps its columns.
    """

    def __init__(self, block: str, columns, rows, row_h: float, size: float, shade=True):
        self.columns, self.rows, self.row_h, self.size, self.shade = columns, rows, row_h, size, shade
        self.edges = []
        for j, (x, w) in enumerate(columns):
            widest = _widest(tuple(r[j].text for r in rows)) * size
            if widest > w - 2:
                raise DoesNotFit(block, Msg("column {column} needs {needs} pt, has {has}", column=str(j + 1),
                                             needs=format(widest, ".0f"), has=format(w, ".0f")))
            self.edges.append(x + (w + widest) / 2)

    def height(self, start: int = 0, stop: int | None = None) -> float:
        return self.row_h * len(self.rows[start:stop])

    def draw(self, d: Draw, top: float, start: int = 0, stop: int | None = None) -> float:
        """Rows `start:stop` from `top` down; returns the bottom. Shading follows the row's place in the table."""
        columns, row_h, size = self.columns, self.row_h, self.size
        y = top
        stop = len(self.rows) if stop is None else stop
        for i in range(start, stop):
            row = self.rows[i]
            if self.shade and i % 2 == 1:
                d.rect(columns[0][0], y, columns[-1][0] + columns[-1][1] - columns[0][0], row_h, fill=SHADE)
            for (x, w), edge, cell in zip(columns, self.edges, row):
                color = INK
                base = baseline(y, row_h, size)
                if cell.mark == HATCHED:
                    d.rect(x + 1, y - 0.5, w - 2, row_h - 1, fill=WHITE, hatch=HATCH, stroke=INK, width=0.6)
                    # a clear area behind the digits: the hatching never crosses the figure it marks
                    tw = fonts.width(cell.text, fonts.BOLD, size)
                    pad = size * 0.18
                    d.rect(edge - tw - pad, base + fonts.ascent(size) + pad, tw + 2 * pad,
                           fonts.ascent(size) + 2 * pad, fill=WHITE)
                elif cell.mark == BLACK:
                    d.rect(x + 1, y - 0.5, w - 2, row_h - 1, fill=INK)
                    color = WHITE
                if cell.framed:
                    d.rect(x + 1.6, y - 1.1, w - 3.2, row_h - 2.2, stroke=INK, width=1.8)
                d.text(edge, base, cell.text, cell.role, cell.bold, "right", color,
                       size if cell.role == FIGURE else None, cell.figure)
                if cell.note:
                    d.text(edge + 1, base + size * 0.35, cell.note, SMALL, True, color=color)
            y -= row_h
        return y


def head_width(text: str, size: float) -> float:
    """The least width a column head in SMALL type at `size` can wrap to: its widest word, or, for a word with soft
    hyphens, its widest piece with the hyphen printed [pt]."""
    widest = 0.0
    for word in text.split():
        parts = word.split(fonts.SOFT_HYPHEN)
        pieces = [p + "-" for p in parts[:-1]] + parts[-1:]
        widest = max(widest, *(fonts.width(p, fonts.REGULAR, size) for p in pieces))
    return widest


@lru_cache(maxsize=1024)
def _widest(texts: tuple[str, ...]) -> float:
    """The widest of `texts` in bold at 1 pt (widths are proportional to the size)."""
    return max((fonts.width(text, fonts.BOLD, 1.0) for text in texts), default=0.0)


def grid(d: Draw, block: str, top: float, columns, rows, row_h: float, size: float, shade=True) -> float:
    """Draw rows of cells into columns [(x, w)] at once; returns the bottom."""
    return Grid(block, columns, rows, row_h, size, shade).draw(d, top)


class GroupHeads:
    """Configuration names over their column groups [(name, x, w)], each wrapped at words to three lines at most."""

    def __init__(self, ctx, groups, block: str):
        self.hs = hs = ctx.size(HEADING)
        self.groups = groups
        self.wrapped = [fit_lines(block, name, fonts.BOLD, hs, w - 6, NAME_LINES) for name, x, w in groups]
        self.n_lines = max(len(lines) for lines in self.wrapped)
        self.height = self.n_lines * hs * 1.12 + hs * 0.3

    def draw(self, d: Draw, top: float) -> float:
        hs = self.hs
        for (_name, x, w), lines in zip(self.groups, self.wrapped):
            for k, line in enumerate(lines):
                offset = (self.n_lines - len(lines) + k + 1) * hs * 1.12
                d.text(x + w / 2, top - offset, line, HEADING, True, "centre")
        return top - self.height


def group_headers(d: Draw, top: float, groups, label_size: float, block: str) -> float:
    return GroupHeads(d.ctx, groups, block).draw(d, top)


class SubHeads:
    """Small column labels [(text, x, w)], each wrapped to two lines, or three breaking after a hyphen, or four
    where a translation marks its long words' syllables with soft hyphens (a German compound)."""

    def __init__(self, ctx, block: str, labels):
        self.ss = ss = ctx.size(SMALL)

        def fitted(text, w):
            try:
                return fit_lines(block, text, fonts.REGULAR, ss, w - 1, 2)
            except DoesNotFit:
                if fonts.SOFT_HYPHEN in text:
                    return fit_lines(block, text, fonts.REGULAR, ss, w - 1, 4)
                if "-" not in text:
                    return fit_lines(block, text, fonts.REGULAR, ss, w - 1, 3)
                return fit_lines(block, text.replace("-", "- "), fonts.REGULAR, ss, w - 1, 3)

        self.wrapped = [(fitted(text, w), x, w) for text, x, w in labels]
        self.n = max(len(lines) for lines, _, _ in self.wrapped)
        self.height = ss * (0.35 + 1.1 * self.n)

    def draw(self, d: Draw, top: float) -> float:
        ss, n = self.ss, self.n
        for lines, x, w in self.wrapped:
            for k, line in enumerate(lines):
                d.text(x + w / 2, top - ss * (1.05 + 1.1 * (n - len(lines) + k)), line, SMALL, False, "centre", GREY)
        return top - self.height


def sub_headers(d: Draw, block: str, top: float, labels) -> float:
    return SubHeads(d.ctx, block, labels).draw(d, top)


class Heading:
    """A block's title and up to three wrapped lines of detail under it; `figures`: those the detail shows."""

    def __init__(self, ctx, width: float, title: str, detail: str = "", figures=()):
        self.ctx, self.title, self.figures = ctx, title, figures
        self.hs, self.ls = ctx.size(HEADING), ctx.size(LABEL)
        self.lines = fit_lines(title, detail, fonts.REGULAR, self.ls, width, NOTE_LINES) if detail else []
        self.height = self.hs * 1.35 + (len(self.lines) * self.ls * 1.2 + self.ls * 0.2 if self.lines else 0.0)
        self.again = self.hs * 1.35  #: the title alone, atop a continued piece

    def draw(self, d: Draw, top: float) -> float:
        ctx, ls = self.ctx, self.ls
        d.text(0, top - self.hs, self.title, HEADING, True, color=ctx.style.accent)
        y = top - self.hs * 1.35
        for k, line in enumerate(self.lines):
            y -= ls * 1.2
            d.text(0, y + ls * 0.25, line, LABEL, color=GREY, figures=self.figures if k == 0 else ())
        if self.lines:
            y -= ls * 0.2
        return y

    def draw_again(self, d: Draw, top: float) -> float:
        """The title of a piece that continues the block: "TITLE (continued)"; the figures stay with the first."""
        d.text(0, top - self.hs, self.ctx.tr("{title} (continued)", title=self.title), HEADING, True,
               color=self.ctx.style.accent)
        return top - self.again


def heading(d: Draw, width: float, top: float, title: str, detail: str = "", figures=()) -> float:
    """A block's title and a wrapped line of detail under it; `figures` are the printed figures the detail shows."""
    return Heading(d.ctx, width, title, detail, figures).draw(d, top)


def even_columns(width: float, count: int) -> list[tuple[float, float]]:
    """`count` columns of equal width across `width` [(x, w)]."""
    w = width / count
    return [(i * w, w) for i in range(count)]


class ColumnHeads:
    """The columns' small labels (`SubHeads`) over a rule across `width`."""

    def __init__(self, ctx, block: str, names, columns, width: float):
        self.subs = SubHeads(ctx, block, [(n, x, w) for n, (x, w) in zip(names, columns)])
        self.width = width
        self.height = self.subs.height

    def draw(self, d: Draw, top: float) -> float:
        y = self.subs.draw(d, top)
        d.line(0, y, self.width, y, INK, 0.6)
        return y


def column_headers(d: Draw, block: str, top: float, names, columns, width: float) -> float:
    """The columns' small labels (`sub_headers`) over a rule across `width`; returns the rule's height."""
    return ColumnHeads(d.ctx, block, names, columns, width).draw(d, top)


def name_column(ctx, width: float, configurations) -> float:
    """The width of a table's column of configuration names: a fifth of the table, wider where a name holds a word
    too long for that (a name breaks only between words), at most NAME_SHARE of it."""
    ls = ctx.size(LABEL)
    longest = max((fonts.width(word, fonts.BOLD, ls) for c in configurations for word in c.name.split()),
                  default=0.0)
    return min(max(width * 0.2, longest + 6), width * NAME_SHARE)


def name_widths(ctx, width: float, configurations) -> list[float]:
    """The widths to try for a table's column of names, widest first: `name_column`'s, then narrower, down to a
    fifth of the table, so the other columns' heads (longer in some languages) get room when names need less."""
    widest, least = name_column(ctx, width, configurations), width * 0.2
    return [widest - (widest - least) * k / 4 for k in range(5)] if widest > least + 1 else [least]


class NamedRow:
    """One configuration's row: its name (wrapped at words) in the first `name_w` and `cells` in `columns`, as one
    grid row tall enough for both."""

    def __init__(self, ctx, block: str, name: str, name_w: float, columns, cells, hyphenate: bool = False):
        fs, self.ls = ctx.secondary_figure, ctx.size(LABEL)
        self.lines = fit_lines(block, name, fonts.BOLD, self.ls, name_w - 4, NAME_LINES, hyphenate)
        self.height = max(fs * 1.45, len(self.lines) * self.ls * 1.15 + self.ls * 0.6)
        self.grid = Grid(block, columns, [cells], self.height, fs, shade=False)

    def draw(self, d: Draw, top: float) -> float:
        ls = self.ls
        self.grid.draw(d, top)
        first = top - (self.height - len(self.lines) * ls * 1.15) / 2 - ls * 0.85
        for k, line in enumerate(self.lines):
            d.text(2, first - k * ls * 1.15, line, LABEL, True)
        return top - self.height


def named_row(d: Draw, block: str, top: float, name: str, name_w: float, columns, cells) -> float:
    """One configuration's row drawn at once; returns the row's height."""
    row = NamedRow(d.ctx, block, name, name_w, columns, cells)
    row.draw(d, top)
    return row.height


def groups_of(count: int, most: int) -> list[range]:
    """`count` configurations in as few groups of at most `most` as will do, as even as they can be."""
    n = -(-count // max(most, 1))
    size, extra = divmod(count, n)
    out, start = [], 0
    for i in range(n):
        stop = start + size + (1 if i < extra else 0)
        out.append(range(start, stop))
        start = stop
    return out


def split_configurations(ctx, count: int, make):
    """The sections of a table of `count` configurations: `make(group)` for one group (a range), raising
    DoesNotFit when the group is too wide. Without `ctx.split` there is one group; with it, as few as fit."""
    if not ctx.split:
        return [make(range(count))]
    last = None
    for most in range(count, 0, -1):
        try:
            return [make(group) for group in groups_of(count, most)]
        except DoesNotFit as exc:
            last = exc
    raise last
