"""Drawing the card's tables: cells in columns, figures right-aligned on a common edge, headers that wrap.

Row states are marked so they survive black-and-white printing. Every number comes as printed text from the
table builder; nothing is re-rounded here.
"""

from dataclasses import dataclass

from kneeboard.card import fonts
from kneeboard.card.draw import GREY, HATCH, INK, SHADE, WHITE, DoesNotFit, Draw, baseline, fit_lines
from kneeboard.card.ops import FIGURE, HEADING, LABEL, SMALL, Figure

HATCHED, BLACK = "hatched", "black"
NO_VALUE = "–"  #: printed where a figure does not exist (no turn at 0 bank, stalled)


@dataclass(frozen=True)
class Cell:
    text: str
    bold: bool = False
    mark: str | None = None  #: HATCHED or BLACK background
    note: str = ""  #: a small suffix such as "*"
    role: str = FIGURE
    figure: Figure | None = None  #: the printed figure the cell shows
    framed: bool = False  #: a heavy frame: a mark of its own (the structure's limit), combinable with the others


def grid(d: Draw, block: str, top: float, columns, rows, row_h: float, size: float, shade=True) -> float:
    """Draw rows of cells into columns [(x, w)]; numbers right-aligned on a common edge per column."""
    edges = []
    for j, (x, w) in enumerate(columns):
        widest = max((fonts.width(r[j].text, fonts.BOLD, size) for r in rows), default=0.0)
        if widest > w - 2:
            raise DoesNotFit(block, f"column {j + 1} needs {widest:.0f} pt, has {w:.0f}")
        edges.append(x + (w + widest) / 2)
    y = top
    for i, row in enumerate(rows):
        if shade and i % 2 == 1:
            d.rect(columns[0][0], y, columns[-1][0] + columns[-1][1] - columns[0][0], row_h, fill=SHADE)
        for (x, w), edge, cell in zip(columns, edges, row):
            color = INK
            base = baseline(y, row_h, size)
            if cell.mark == HATCHED:
                d.rect(x + 1, y - 0.5, w - 2, row_h - 1, fill=WHITE, hatch=HATCH, stroke=INK, width=0.6)
                # a clear area behind the digits: the hatching never crosses the figure it marks
                tw = fonts.width(cell.text, fonts.BOLD, size)
                pad = size * 0.18
                d.rect(edge - tw - pad, base + fonts.ascent(size) + pad, tw + 2 * pad, fonts.ascent(size) + 2 * pad,
                       fill=WHITE)
            elif cell.mark == BLACK:
                d.rect(x + 1, y - 0.5, w - 2, row_h - 1, fill=INK)
                color = WHITE
            if cell.framed:
                d.rect(x + 1.6, y - 1.1, w - 3.2, row_h - 2.2, stroke=INK, width=1.8)
            d.text(edge, base, cell.text, cell.role, cell.bold, "right", color, size if cell.role == FIGURE else None,
                   cell.figure)
            if cell.note:
                d.text(edge + 1, base + size * 0.35, cell.note, SMALL, True, color=color)
        y -= row_h
    return y


def group_headers(d: Draw, top: float, groups, label_size: float, block: str) -> float:
    """Configuration names over their column groups [(name, x, w)], wrapped to two lines at most."""
    ctx = d.ctx
    hs = ctx.size(HEADING)
    wrapped = [fit_lines(block, name, fonts.BOLD, hs, w - 6, 2) for name, x, w in groups]
    n_lines = max(len(lines) for lines in wrapped)
    for (_name, x, w), lines in zip(groups, wrapped):
        for k, line in enumerate(lines):
            offset = (n_lines - len(lines) + k + 1) * hs * 1.12
            d.text(x + w / 2, top - offset, line, HEADING, True, "centre")
    return top - n_lines * hs * 1.12 - hs * 0.3


def sub_headers(d: Draw, block: str, top: float, labels) -> float:
    """Small column labels [(text, x, w)], each wrapped to two lines, or three breaking after a hyphen."""
    ss = d.ctx.size(SMALL)

    def fitted(text, w):
        try:
            return fit_lines(block, text, fonts.REGULAR, ss, w - 1, 2)
        except DoesNotFit:
            if "-" not in text:
                raise
            return fit_lines(block, text.replace("-", "- "), fonts.REGULAR, ss, w - 1, 3)

    wrapped = [(fitted(text, w), x, w) for text, x, w in labels]
    n = max(len(lines) for lines, _, _ in wrapped)
    for lines, x, w in wrapped:
        for k, line in enumerate(lines):
            d.text(x + w / 2, top - ss * (1.05 + 1.1 * (n - len(lines) + k)), line, SMALL, False, "centre", GREY)
    return top - ss * (0.35 + 1.1 * n)


def heading(d: Draw, width: float, top: float, title: str, detail: str = "", figures=()) -> float:
    """A block's title and a wrapped line of detail under it; `figures` are the printed figures the detail shows."""
    ctx = d.ctx
    hs = ctx.size(HEADING)
    d.text(0, top - hs, title, HEADING, True, color=ctx.style.accent)
    y = top - hs * 1.35
    if detail:
        for k, line in enumerate(fit_lines(title, detail, fonts.REGULAR, ctx.size(LABEL), width, 3)):
            y -= ctx.size(LABEL) * 1.2
            d.text(0, y + ctx.size(LABEL) * 0.25, line, LABEL, color=GREY, figures=figures if k == 0 else ())
        y -= ctx.size(LABEL) * 0.2
    return y


def even_columns(width: float, count: int) -> list[tuple[float, float]]:
    """`count` columns of equal width across `width` [(x, w)]."""
    w = width / count
    return [(i * w, w) for i in range(count)]


def column_headers(d: Draw, block: str, top: float, names, columns, width: float) -> float:
    """The columns' small labels (`sub_headers`) over a rule across `width`; returns the rule's height."""
    y = sub_headers(d, block, top, [(n, x, w) for n, (x, w) in zip(names, columns)])
    d.line(0, y, width, y, INK, 0.6)
    return y


def named_row(d: Draw, block: str, top: float, name: str, name_w: float, columns, cells) -> float:
    """One configuration's row: its name (up to two lines) in the first `name_w` and `cells` in `columns`, as one
    grid row tall enough for both; returns the row's height."""
    fs, ls = d.ctx.secondary_figure, d.ctx.size(LABEL)
    lines = fit_lines(block, name, fonts.BOLD, ls, name_w - 4, 2)
    row_h = max(fs * 1.45, len(lines) * ls * 1.15 + ls * 0.6)
    grid(d, block, top, columns, [cells], row_h, fs, shade=False)
    first = top - (row_h - len(lines) * ls * 1.15) / 2 - ls * 0.85
    for k, line in enumerate(lines):
        d.text(2, first - k * ls * 1.15, line, LABEL, True)
    return row_h
