"""The one card layout: measures every block, chooses the type size and the placement, then draws each piece once.

Blocks flow in the style's order (its front list, then its back list, which begins on a back face) into one column
(portrait) or two (landscape, when each is wide enough for a table), face after face:

- a block that fits the room left goes there; one that does not moves whole to the next column or face, and every
  block after it follows it: nothing jumps ahead;
- a block too tall for a whole face continues on the next, broken between rows (or between groups of
  configurations, for a table too wide for its column) with its heads repeated, as a long table continues in a
  book;
- more than two faces make a card set ("card 1 of 2"); every face carries the registration, the card weight, the
  fingerprint, its face and the caution.

The type size is a preference: the largest that gives the fewest cards, never below the legibility floor (7 pt
for any text; table figures 10 pt on A5 and half letter, 8 pt on the smaller cards), and never above the style's
`font_scale`, which may ask for less than the floor (the floor wins). With the default style nothing is refused;
a style that caps its faces gets a LayoutError naming the blocks left out and what would fit.
"""

import math
from dataclasses import dataclass, field, replace

from kneeboard.card import blocks
from kneeboard.card.blocks.caution import caution
from kneeboard.card.blocks.header import back_header, back_header_height
from kneeboard.card.draw import BASE_SIZE, FIGURE, RULE, SECONDARY, Context, DoesNotFit, Measure, Piece, Plan
from kneeboard.card.geometry import BINDING_MARGIN, LARGE_CARDS, MM, SAFE_MARGIN, PageBox, page_box
from kneeboard.card.ops import Circle, Page, Part
from kneeboard.card.style import CardStyle
from kneeboard.i18n import Msg
from kneeboard.problems import Told
from kneeboard.tables import CardTable

#: Type scale each card size starts from, before the style's font scale.
SIZE_SCALE = {"a5": 1.0, "half-letter": 1.0, "5x8": 0.92, "4x6": 0.78}
SHRINK = 0.95
MIN_FIGURE_LARGE = 10.0
MIN_FIGURE_SMALL = 8.0
MIN_COLUMN = 220.0  #: narrowest column worth flowing into [pt]
LIGHT_BACK = 0.35  #: a back page whose blocks fill less than this share of it is worth saving
MIN_ROWS = 2  #: a table broken at the foot of a column leaves at least this many rows there
BACK = "back-header"  #: the top of every face after the first


class LayoutError(Told):
    """Content that cannot be printed legibly on the chosen card; says which blocks and why."""

    def __init__(self, block: str, message: str, left_out: tuple[str, ...] = ()):
        super().__init__(message)
        self.block = block
        self.left_out = left_out or (block,)


@dataclass(frozen=True)
class CardLayout:
    pages: tuple[Page, ...]
    scale: float  #: the type scale the content fitted at

    @property
    def faces(self) -> int:
        return len(self.pages)

    @property
    def cards(self) -> int:
        """Physical cards: two faces each."""
        return (len(self.pages) + 1) // 2


def min_figure_size(size: str) -> float:
    return MIN_FIGURE_LARGE if size in LARGE_CARDS else MIN_FIGURE_SMALL


def floor_scale(size: str) -> float:
    """The smallest type scale whose table figures are still legible on this card size."""
    return min_figure_size(size) / (BASE_SIZE[FIGURE] * SECONDARY)


def block_order(style: CardStyle) -> tuple[list[str], list[str]]:
    """The blocks of the front and of the back page, in order: the style's, or every registered block."""
    back = [b for b in style.back if b in blocks.names()]
    front = [b for b in (blocks.names() if style.front is None else style.front) if b in blocks.names()]
    return [b for b in front if b not in back], back


def scales_for(style: CardStyle) -> list[float]:
    """The type scales to try, largest first: the card size's own scale in steps of SHRINK, from the largest step
    at or under the style's `font_scale` down to the floor, the floor itself last.

    Every font_scale draws from the same steps, so a larger one can only add larger sizes to try: it never gets
    smaller type than a smaller one.
    """
    floor = floor_scale(style.size)
    k = math.ceil(math.log(style.font_scale) / math.log(SHRINK) - 1e-9)
    scale = SIZE_SCALE[style.size] * SHRINK ** k
    out = []
    while scale >= floor - 1e-9:
        out.append(scale)
        scale *= SHRINK
    if not out or out[-1] > floor + 1e-9:
        out.append(floor)
    return out


def layout_card(table: CardTable, style: CardStyle, fingerprint: str, made_on: str,
                logo_png: bytes | None = None) -> CardLayout:
    box = page_box(style.size, style.landscape, style.binding)
    front, back = block_order(style)
    front = [b for b in front if blocks.get(b).applies(table)]
    back = [b for b in back if blocks.get(b).applies(table)]
    scales = scales_for(style)
    unfit: DoesNotFit | None = None
    cap = style.max_faces
    for split in (False, True):  # groups of configurations only when a table is too wide even at the floor
        tries = _Tries(Context(table, style, 1.0, fingerprint, made_on, logo_png, split), box, front, back)
        top = tries.at(scales[0])
        if top is not None and top.cards == 1 and (cap is None or top.faces <= cap):
            chosen = 0  # one card at the largest type asked for: nothing smaller can do better
        else:
            least = tries.at(scales[-1])  # the fewest cards any legible type gives
            unfit = unfit or tries.unfit
            if least is None:
                continue
            if cap is not None and least.faces > cap:
                raise _too_many_faces(style, least, cap)

            def enough(i: int, cards: int = least.cards, tries: _Tries = tries) -> bool:
                flowed = tries.at(scales[i])
                return flowed is not None and flowed.cards <= cards and (cap is None or flowed.faces <= cap)

            # the largest type that still gives the fewest cards: halving the ladder between a size that does
            # not and one that does (more type needs more room, so the sizes that do are all below those that
            # do not)
            lo, chosen = 0, len(scales) - 1
            if enough(0):
                chosen = 0
            while chosen - lo > 1:
                mid = (lo + chosen) // 2
                if enough(mid):
                    chosen = mid
                else:
                    lo = mid
        flowed = tries.at(scales[chosen])
        # a back page that would hold little earns no paper: one page if two smaller steps of type allow it
        if flowed.faces == 2 and not back and flowed.back_fill < LIGHT_BACK:
            for smaller in scales[chosen + 1:chosen + 3]:
                one = tries.at(smaller)
                if one is not None and one.faces == 1:
                    return one.draw(smaller)
        return flowed.draw(scales[chosen])
    block = unfit.block if unfit else "card"
    raise LayoutError(
        block,
        Msg("The {block} block cannot be printed on a {card} card even at the smallest legible type ({reason}). "
            "Choose a larger card size, or a shorter text.", block=block, card=card_name(style),
            reason=unfit.reason if unfit else Msg("no room")),
    )


class _Tries:
    """The best arrangement at each type scale tried, measured once: of one and two columns (landscape), the one
    with the fewest cards, then the largest chart."""

    def __init__(self, ctx: Context, box: PageBox, front: list[str], back: list[str]):
        self.ctx, self.box, self.front, self.back = ctx, box, front, back
        self.found: dict[float, Flowed | None] = {}
        self.unfit: DoesNotFit | None = None

    def at(self, scale: float) -> "Flowed | None":
        if scale not in self.found:
            ctx = replace(self.ctx, scale=scale)
            best = None
            for two in ((True, False) if ctx.style.landscape else (False,)):
                try:
                    flowed = _flow(ctx, self.box, self.front, self.back, two_columns=two)
                except DoesNotFit as exc:
                    self.unfit = self.unfit or exc
                    continue
                if best is None or flowed.rank < best.rank:
                    best = flowed
            self.found[scale] = best
        return self.found[scale]


def card_name(style: CardStyle) -> str:
    """The card as a refusal names it: its size as the style writes it ("a5"), "a5 landscape" turned."""
    return Msg("{size} landscape", size=style.size) if style.landscape else style.size


def _too_many_faces(style: CardStyle, least: "Flowed", cap: int) -> LayoutError:
    """The style's cap on faces cannot hold the content: name the blocks left out and what would fit."""
    left_out = tuple(dict.fromkeys(name for face in least.faces_list[cap:] for name, _ in face.pieces()))
    return LayoutError(
        left_out[0] if left_out else "card",
        Msg("This card needs {faces} faces on a {card} card even at the smallest legible type; the style allows "
            "{cap}. Left out: {left_out}. Choose one: allow {faces} faces (max_faces); a larger card size; fewer bank "
            "angles; fewer blocks in the style.", faces=str(least.faces), card=card_name(style), cap=str(cap),
            left_out=", ".join(left_out)),  # the blocks' names as the style writes them
        left_out,
    )


# --- the flow ---------------------------------------------------------------------------------------------------


@dataclass
class Face:
    """One face of the card: the block across its top, and its columns of placed pieces."""

    top: str | None  #: the full-width block above the columns: a block's name (the header), BACK, or None
    column_top: float
    columns: list[list[tuple[str, Piece]]] = field(default_factory=list)
    bottom: float = 0.0  #: where its columns end, above the caution

    def pieces(self):
        return (placed for column in self.columns for placed in column)


class Flowed:
    """One arrangement of the blocks at one type scale: faces of placed pieces, not yet drawn."""

    def __init__(self, ctx: Context, box: PageBox, faces: list[Face], plans: dict[str, Plan], col_w: float,
                 gap: float, bottoms: tuple[float, float]):
        self.ctx, self.box, self.faces_list, self.plans = ctx, box, faces, plans
        self.col_w, self.gap, self.bottoms = col_w, gap, bottoms
        self.chart_area = 0.0
        self.back_fill = 1.0
        self._grow()

    @property
    def faces(self) -> int:
        return len(self.faces_list)

    @property
    def cards(self) -> int:
        return (self.faces + 1) // 2

    @property
    def rank(self):
        """Fewer cards first, then the larger chart, then fewer faces."""
        return (self.cards, -self.chart_area, self.faces)

    def _used(self, column) -> float:
        return sum(piece.height(self.plans[name].measure) for name, piece in column) + self.gap * max(
            len(column) - 1, 0)

    def _grow(self) -> None:
        """Give the pieces that grow (the chart) the room their column has left, up to what they would use."""
        for f, face in enumerate(self.faces_list):
            room = face.column_top - face.bottom
            if f == 1:
                used = sum(piece.height(self.plans[name].measure) for c in face.columns for name, piece in c)
                self.back_fill = used / (len(face.columns) * room)
            for column in face.columns:
                spare = room - self._used(column)
                growing = [k for k, (name, p) in enumerate(column)
                           if self.plans[name].measure.sections[p.section].grow > 0]
                for k in growing:
                    name, p = column[k]
                    grow = self.plans[name].measure.sections[p.section].grow
                    extra = max(min(grow, spare / len(growing)), 0.0)
                    column[k] = (name, Piece(p.section, p.start, p.stop, p.lead, p.again, p.foot, extra))
                    self.chart_area += self.col_w * (self.plans[name].measure.sections[p.section].head + extra)

    def draw(self, scale: float) -> CardLayout:
        """Draw every placed piece once, the caution on every face."""
        ctx, box, gap = self.ctx, self.box, self.gap
        total = self.faces
        result = []
        for f, face in enumerate(self.faces_list, start=1):
            parts, placed = [], []
            if face.top == BACK:
                top = back_header(ctx, box.content_width, _card_of(f))
            elif face.top is not None:
                top = self.plans[face.top].draw(Piece(0, lead=True, foot=True))
            if face.top is not None:
                parts.append(Part(box.left, box.top, top.ops))
                placed.append(top.name)
            for c, column in enumerate(face.columns):
                y = face.column_top
                for name, piece in column:
                    b = self.plans[name].draw(piece)
                    parts.append(Part(box.left + c * (self.col_w + gap), y, b.ops))
                    placed.append(name)
                    y -= b.height + gap
            notice = caution(ctx, box.content_width, f, total)
            parts.append(Part(box.left, box.bottom + notice.height, notice.ops))
            parts.append(Part(0.0, 0.0, tuple(_binding_marks(box, ctx.style.binding))))
            result.append(Page(box.width, box.height, tuple(parts), tuple(placed) + ("caution",)))
        return CardLayout(tuple(result), scale)


def _flow(ctx: Context, box: PageBox, front: list[str], back: list[str], two_columns: bool) -> Flowed:
    """Place the blocks, measured, on as many faces as they need; raises DoesNotFit when a block cannot be printed
    in a column at all (too wide, or too tall even for an empty face)."""
    gap = 9.0 * ctx.scale
    # landscape pages flow in two columns when each is still wide enough for a table
    columns = 2 if two_columns and (box.content_width - gap) / 2 >= MIN_COLUMN else 1
    col_w = (box.content_width - (columns - 1) * gap) / columns
    order = front + back
    specs = {name: blocks.get(name) for name in dict.fromkeys(order)}
    wide = [name for name in order if specs[name].full_width]
    plans = {name: spec.planned(ctx, box.content_width if spec.full_width else col_w)
             for name, spec in specs.items()}
    faces = 2
    while True:  # the caution's footer says which face of how many: measured for the count the flow ends with
        bottoms = tuple(box.bottom + caution(ctx, box.content_width, face, faces).height + gap * 0.6
                        for face in (1, 2))
        placed = _place(ctx, box, [n for n in order if n not in wide], back, plans, wide[0] if wide else None,
                        columns, gap, bottoms)
        if len(placed) <= 2 or faces == len(placed):
            return Flowed(ctx, box, placed, plans, col_w, gap, bottoms)
        faces = len(placed)


def _place(ctx, box, order, back, plans, header, columns, gap, bottoms) -> list[Face]:
    """Faces of placed pieces; `bottoms`: where the columns of the first face and of every later one end."""
    faces: list[Face] = []
    state = {}

    def top_height(top) -> float:
        if top is None:
            return 0.0
        return (back_header_height(ctx) if top == BACK else plans[top].measure.height) + gap * 0.8

    def new_face():
        top = header if not faces else BACK
        bottom = bottoms[min(len(faces), 1)]
        faces.append(Face(top, box.top - top_height(top), [[] for _ in range(columns)], bottom))
        state.update(face=len(faces) - 1, col=0, room=faces[-1].column_top - bottom)

    def advance():
        if state["col"] + 1 < columns:
            face = faces[state["face"]]
            state.update(col=state["col"] + 1, room=face.column_top - face.bottom)
        else:
            new_face()

    def empty_room() -> float:
        """The room of an empty column after this one."""
        if state["col"] + 1 < columns:
            face = faces[state["face"]]
            return face.column_top - face.bottom
        return box.top - top_height(BACK) - bottoms[1]

    def column():
        return faces[state["face"]].columns[state["col"]]

    def put(name, piece, m, spacing):
        column().append((name, piece))
        state["room"] -= piece.height(m) + spacing

    new_face()
    first_back = back[0] if back else None
    for name in order:
        if name == first_back and state["face"] == 0:
            new_face()  # the back list begins on a back face
        m = plans[name].measure
        spacing = gap if column() else 0.0
        whole = Piece.whole(m)
        if m.height + spacing <= state["room"] + 1e-6:
            _put_whole(put, name, whole, m, spacing)
            continue
        # moved whole to the next column when it fits there: from a column that holds something, or from one with
        # less room than an empty one (the first face, under the header and its warnings)
        if (column() or state["room"] < empty_room() - 1e-6) and m.height <= empty_room() + 1e-6:
            advance()
            _put_whole(put, name, whole, m, 0.0)
            continue
        _split(name, m, put, advance, empty_room, column, state, gap)
    return faces


def _put_whole(put, name, whole, m: Measure, spacing: float) -> None:
    for k, piece in enumerate(whole):
        put(name, piece, m, spacing if k == 0 else m.gap)


def _split(name, m: Measure, put, advance, empty_room, column, state, gap) -> None:
    """Place a block too tall for the room it meets: section by section, each whole where it fits a column, else
    broken between rows with its heads repeated."""
    first = True
    last = len(m.sections) - 1
    for s, section in enumerate(m.sections):
        n = len(section.rows)
        i = 0
        while True:
            here = column()
            fresh = not here
            mine = bool(here) and here[-1][0] == name
            spacing = 0.0 if fresh else (m.gap if mine else gap)

            def piece(j, s=s, i=i, n=n, fresh=fresh, first=first):
                return Piece(s, i, j, lead=first, again=not first and fresh, foot=j == n and s == last)

            rest = piece(n)
            if rest.height(m) + spacing <= state["room"] + 1e-6:
                put(name, rest, m, spacing)
                first = False
                break
            if not fresh and (i == 0 or n == 0):
                moved = Piece(s, i, n, lead=first, again=not first, foot=s == last)
                if n == 0 or moved.height(m) <= empty_room() + 1e-6:
                    advance()  # the section fits whole in the next column: it goes there, unbroken
                    continue
            smaller = state["room"] < empty_room() - 1e-6  # the next column is an empty one with more room
            if n == 0:
                if smaller:
                    advance()
                    continue
                raise DoesNotFit(name, Msg("taller than a whole face even at this type size"))
            fit = [j for j in range(i + 1, n) if piece(j).height(m) + spacing <= state["room"] + 1e-6]
            least = min(MIN_ROWS, n - i)
            if fit and (fit[-1] - i >= least or fresh and not smaller):
                put(name, piece(fit[-1]), m, spacing)
                first = False
                i = fit[-1]
                advance()
                continue
            if fresh and not smaller:
                raise DoesNotFit(name, Msg("its heads and one row are taller than a whole face at this type size"))
            advance()


def _card_of(face: int) -> str:
    """What the top of a face after the first says: the card of a set it begins, or that it continues."""
    return Msg("continued, card {n}", n=(face + 1) // 2) if face % 2 == 1 else ""


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
