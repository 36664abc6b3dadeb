"""The one card layout: places blocks on pages from the table builder's output and a style.

Blocks flow in the style's order into one column (portrait) or two (landscape). What does not
fit on the front moves to a back page; if even that is not enough, the type shrinks step by
step, never below the legibility floor (7 pt for any text; table figures 10 pt on A5 and half
letter, 8 pt on the smaller cards). When nothing helps, LayoutError names the block. Nothing is
ever cut silently.
"""

from dataclasses import dataclass

from kneeboard.card import blocks
from kneeboard.card.blocks.caution import caution
from kneeboard.card.blocks.header import back_header
from kneeboard.card.draw import BASE_SIZE, FIGURE, RULE, SECONDARY, Context, DoesNotFit
from kneeboard.card.geometry import BINDING_MARGIN, LARGE_CARDS, MM, SAFE_MARGIN, PageBox, page_box
from kneeboard.card.ops import Circle, Page, Part
from kneeboard.card.style import CardStyle
from kneeboard.tables import CardTable

#: Type scale each card size starts from, before the style's font scale.
SIZE_SCALE = {"a5": 1.0, "half-letter": 1.0, "5x8": 0.92, "4x6": 0.78}
SHRINK = 0.95
MIN_FIGURE_LARGE = 10.0
MIN_FIGURE_SMALL = 8.0
MIN_COLUMN = 220.0  #: narrowest column worth flowing into [pt]
LIGHT_BACK = 0.35  #: a back page whose blocks fill less than this share of it is worth saving


class LayoutError(Exception):
    """Content that cannot be printed legibly on the chosen card; says which block and why."""

    def __init__(self, block: str, message: str):
        super().__init__(message)
        self.block = block


@dataclass(frozen=True)
class CardLayout:
    pages: tuple[Page, ...]
    scale: float  #: the type scale the content fitted at


def min_figure_size(size: str) -> float:
    return MIN_FIGURE_LARGE if size in LARGE_CARDS else MIN_FIGURE_SMALL


def block_order(style: CardStyle) -> tuple[list[str], list[str]]:
    """The blocks of the front and of the back page, in order: the style's, or every registered block."""
    back = [b for b in style.back if b in blocks.names()]
    front = [b for b in (blocks.names() if style.front is None else style.front) if b in blocks.names()]
    return [b for b in front if b not in back], back


def layout_card(table: CardTable, style: CardStyle, fingerprint: str, made_on: str,
                logo_png: bytes | None = None) -> CardLayout:
    box = page_box(style.size, style.landscape, style.binding)
    front, back = block_order(style)
    front = [b for b in front if blocks.get(b).applies(table)]
    back = [b for b in back if blocks.get(b).applies(table)]
    floor = min_figure_size(style.size)
    scale = style.font_scale * SIZE_SCALE[style.size]
    last: DoesNotFit | None = None

    memo: dict = {}  # blocks drawn once per type scale and width, whichever arrangements try them

    def attempt(scale: float) -> Flowed | None:
        """The best arrangement at this type scale: of one and two columns (landscape), the one that gives the
        chart the most room; None when none fits."""
        nonlocal last
        ctx = Context(table, style, scale, fingerprint, made_on, logo_png)
        found = []
        # the style's order, and the same with the blocks that grow (the chart) last: fixed blocks then fill the
        # front, and the chart takes what room the back has left
        growing = [b for b in front if blocks.get(b).sizes is not None]
        orders = [front] + ([[b for b in front if b not in growing] + growing] if growing else [])
        first_error = None
        for two in ((True, False) if style.landscape else (False,)):
            for order in orders:
                try:
                    found.append(_flow(ctx, box, order, back, two_columns=two, memo=memo))
                except DoesNotFit as exc:
                    first_error = first_error or exc  # the style's own order names the block that does not fit
        last = first_error or last
        return max(found, key=lambda f: (f.chart_area, -len(f.pages))) if found else None

    def legible(scale: float) -> bool:
        return BASE_SIZE[FIGURE] * scale * SECONDARY >= floor - 1e-9

    while legible(scale):
        flowed = attempt(scale)
        if flowed is not None:
            # a back page that would hold little earns no paper: one page if two smaller steps of type allow it
            if len(flowed.pages) == 2 and not back and flowed.back_fill < LIGHT_BACK:
                for smaller in (scale * SHRINK, scale * SHRINK**2):
                    one = attempt(smaller) if legible(smaller) else None
                    if one is not None and len(one.pages) == 1:
                        return CardLayout(one.pages, smaller)
            return CardLayout(flowed.pages, scale)
        scale *= SHRINK
    block = last.block if last else "card"
    raise LayoutError(
        block,
        f"The {block} block does not fit on a {style.size}{' landscape' if style.landscape else ''} card, even "
        f"with a back page and the smallest legible type ({last.reason if last else 'no room'}). Choose a larger "
        "size, fewer bank angles or configurations, or turn blocks off in the style.",
    )


@dataclass(frozen=True)
class Flowed:
    """One arrangement of the blocks: its pages, and what chooses between arrangements."""

    pages: tuple[Page, ...]
    chart_area: float  #: the chart's plot room [pt^2]; 0 without a chart
    back_fill: float  #: the share of the back page's columns its blocks take; 1 without a back page


def _flow(ctx: Context, box: PageBox, front: list[str], back: list[str], two_columns: bool,
          memo: dict | None = None) -> Flowed:
    """Assign blocks to the columns of the front and back pages, then place them.

    Fixed blocks are measured once; the chart is assigned at its least readable height and then
    grows into whatever room its column has left, up to its preferred height.
    """
    gap = 9.0 * ctx.scale
    # landscape pages flow in two columns when each is still wide enough for a table
    columns = 2 if two_columns and (box.content_width - gap) / 2 >= MIN_COLUMN else 1
    col_w = (box.content_width - (columns - 1) * gap) / columns
    specs = {name: blocks.get(name) for name in dict.fromkeys(front + back)}
    # blocks of natural height are drawn once here; blocks that grow are drawn once their room is known
    memo = {} if memo is None else memo

    def once(key, make):
        if key not in memo:
            memo[key] = make()
        return memo[key]

    def closing(side: int, total: int):
        return once(("caution", ctx.scale, box.content_width, side, total),
                    lambda: caution(ctx, box.content_width, side, total))

    bottom = box.bottom + closing(1, 2).height + gap * 0.6

    def drawn(name, width, height=None):
        return once((name, ctx.scale, width, height), lambda: specs[name].draw(ctx, width, height))

    built = {name: drawn(name, box.content_width if spec.full_width else col_w)
             for name, spec in specs.items() if spec.sizes is None}
    wide = [name for name, spec in specs.items() if spec.full_width]

    def height(name):
        spec = specs[name]
        return spec.sizes(ctx, col_w)[0] if spec.sizes is not None else built[name].height

    pages = []  # per page: (top block, [column: [names]])
    queue = list(front)
    overflow: list[str] = []
    for side in (1, 2):
        if side == 2:
            queue = overflow + list(back)
            if not queue:
                break
        top_block = next((built[n] for n in wide if n in queue), None) if side == 1 else None
        if side == 2:
            top_block = back_header(ctx, box.content_width)
        queue = [n for n in queue if n not in wide]
        column_top = box.top - (top_block.height + gap * 0.8 if top_block else 0.0)
        cols: list[list[str]] = [[] for _ in range(columns)]
        rooms = [column_top - bottom] * columns
        overflow = []
        for name in queue:
            # first fit: the first column with room, so a small block may fill a gap a big one left
            for c in range(columns):
                need = height(name) + (gap if cols[c] else 0.0)
                if need <= rooms[c]:
                    cols[c].append(name)
                    rooms[c] -= need
                    break
            else:
                if side == 2 or specs[name].front_only:
                    raise DoesNotFit(name, "not enough room on the " + ("back" if side == 2 else "front"))
                overflow.append(name)
        pages.append((top_block, cols, column_top))
    total = len(pages)
    result = []
    chart_area, back_fill = 0.0, 1.0
    for side, (top_block, cols, column_top) in enumerate(pages, start=1):
        parts, placed = [], []
        if top_block is not None:
            parts.append(Part(box.left, box.top, top_block.ops))
            placed.append(top_block.name)
        if side == 2:
            back_fill = sum(sum(height(n) for n in names) for names in cols) / (len(cols) * (column_top - bottom))
        for c, names in enumerate(cols):
            used = sum(height(n) for n in names) + gap * max(len(names) - 1, 0)
            spare = column_top - bottom - used
            y = column_top
            for name in names:
                spec = specs[name]
                if spec.sizes is not None:  # a block that grows takes the room its column has left
                    least, preferred = spec.sizes(ctx, col_w)
                    b = drawn(name, col_w, min(preferred, least + spare))
                    chart_area += col_w * b.height
                else:
                    b = built[name]
                parts.append(Part(box.left + c * (col_w + gap), y, b.ops))
                placed.append(name)
                y -= b.height + gap
        notice = closing(side, total)
        parts.append(Part(box.left, box.bottom + notice.height, notice.ops))
        parts.append(Part(0.0, 0.0, tuple(_binding_marks(box, ctx.style.binding))))
        result.append(Page(box.width, box.height, tuple(parts), tuple(placed) + ("caution",)))
    return Flowed(tuple(result), chart_area, back_fill)


def _binding_marks(box: PageBox, binding: str) -> list:
    """Punch guides: two holes 80 mm apart (ISO 838), centred in the binding edge."""
    if binding == "none":
        return []
    offset = (SAFE_MARGIN + BINDING_MARGIN) / 2
    if binding == "left":
        centres = [(offset, box.height / 2 - 40 * MM), (offset, box.height / 2 + 40 * MM)]
    else:
        centres = [(box.width / 2 - 40 * MM, box.height - offset), (box.width / 2 + 40 * MM, box.height - offset)]
    return [Circle(x, y, 2.75 * MM, fill=None, stroke=RULE, width=0.5) for x, y in centres]
