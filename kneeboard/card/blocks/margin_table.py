"""The margin table, the card's main block: stall speed and margin from the pattern speed, by bank, per configuration.

A margin below the buffer is hatched, no margin at all is white on black, a load factor above the limit is boxed
in black: all readable in black and white. A table with more configurations than its column is wide enough for
breaks into groups of configurations, each with the bank and load columns; a long one breaks between banks with
its heads repeated.
"""

from kneeboard import printed
from kneeboard.card import fonts
from kneeboard.card.blocks.grid import BLACK, HATCHED, Grid, GroupHeads, SubHeads, head_width, split_configurations
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import GREY, HATCH, INK, RULE, WHITE, Context, DoesNotFit, Draw, Measure, Piece, Plan, Section
from kneeboard.card.ops import LABEL, SMALL
from kneeboard.i18n import N_, Msg
from kneeboard.printed import weight_text

NAME = "margin-table"


class _Group:
    """The table of some configurations: its heads, its grids, its rows."""

    def __init__(self, ctx: Context, width: float, bank_w: float, n_w: float, configs):
        t = ctx.table
        fs, ls = ctx.figure, ctx.size(LABEL)
        group_w = (width - bank_w - n_w) / len(configs)
        if group_w < fonts.width("188", fonts.BOLD, fs) * 2 + fs:
            raise DoesNotFit(NAME, Msg("{count} configurations need more width", count=str(len(configs))))
        self.configs = configs
        self.groups = [(c.name, bank_w + n_w + i * group_w, group_w) for i, c in enumerate(configs)]
        self.heads = GroupHeads(ctx, self.groups, NAME)
        tr = ctx.tr
        labels = [(tr("bank"), 0, bank_w), (tr("load"), bank_w, n_w)]
        for _, x, w in self.groups:
            labels += [(tr("stall"), x, w / 2), (tr("margin"), x + w / 2, w / 2)]
        self.subs = SubHeads(ctx, NAME, labels)
        self.head = self.heads.height + ls * 1.4 + self.subs.height
        columns = [(0, bank_w), (bank_w, n_w)]
        for _, x, w in self.groups:
            columns += [(x, w / 2), (x + w / 2, w / 2)]
        rows = ctx.once((NAME, tuple(c.name for c in configs)), lambda: printed.margin_rows(t, configs))
        self.rows = rows
        row_h = fs * 1.5
        # the load-factor column in the secondary size, the rest at full figure size, on the same rows
        self.main = Grid(NAME, [columns[0]] + columns[2:], [[r[0]] + r[2:] for r in rows], row_h, fs)
        self.load = Grid(NAME, [columns[1]], [[r[1]] for r in rows], row_h, ctx.secondary_figure, shade=False)
        self.row_h = row_h

    def draw(self, d: Draw, width: float, y: float, start: int, stop: int) -> float:
        ctx = d.ctx
        ls, su = ctx.size(LABEL), ctx.table.speed_unit
        y = self.heads.draw(d, y)
        d.text(0, y + ls * 0.2, ctx.tr("{unit} IAS", unit=su), LABEL, True, color=GREY)
        for c, (_, x, w) in zip(self.configs, self.groups):
            d.text(x + w / 2, y - ls * 1.05, ctx.tr("pattern {speed}", speed=c.pattern_speed), LABEL, True, "centre",
                   figures=printed.pattern(c, su))
        y -= ls * 1.4
        y = self.subs.draw(d, y)
        d.line(0, y, width, y, INK, 0.8)
        top = y
        y = self.main.draw(d, y, start, stop)
        self.load.draw(d, top, start, stop)
        for _, x, _w in self.groups:
            d.line(x, top, x, y, RULE, 0.6)
        d.line(0, y, width, y, INK, 0.8)
        return y


class MarginTable(Plan):
    name = NAME

    def __init__(self, ctx: Context, width: float):
        t = ctx.table
        self.ctx, self.width = ctx, width
        fs, ss, tr = ctx.figure, ctx.size(SMALL), ctx.tr
        bank_w = max(fonts.width("88°", fonts.BOLD, fs), head_width(tr("bank"), ss)) + fs * 0.7
        widest_load = max((r.load_factor.text for r in t.configurations[0].rows), key=len, default="5.76")
        n_w = max(fonts.width(tr.number(max(widest_load, "5.76", key=len)), fonts.BOLD, ctx.secondary_figure),
                  head_width(tr("load"), ss)) + fs * 0.5
        configs = t.configurations
        self.parts = split_configurations(ctx, len(configs), lambda g: _Group(ctx, width, bank_w, n_w,
                                                                              [configs[i] for i in g]))
        framed = any(cell.framed for part in self.parts for r in part.rows for cell in r)
        self.legend = _legend_layout(ctx, width, framed)
        self.measure = Measure(tuple(Section(p.head, (p.row_h,) * len(p.rows)) for p in self.parts),
                               foot=self.legend[1], gap=fs * 0.6)

    def draw(self, piece: Piece):
        d = Draw(self.ctx)
        y = self.parts[piece.section].draw(d, self.width, 0.0, piece.start, piece.stop)
        if piece.foot:
            y = _draw_legend(d, y, self.legend[0], self.legend[1])
        return d.block(NAME, -y)


def _legend_layout(ctx: Context, width: float, framed: bool):
    """The legend's entries placed in lines: ([(kind, text, tag, x, y)], height), y from the legend's top."""
    t, tr = ctx.table, ctx.tr
    ss = ctx.size(SMALL)
    entries = [(HATCHED, tr("margin under the {buffer} {unit} buffer", buffer=t.buffer, unit=t.speed_unit),
                printed.buffer(t)),
               (BLACK, tr("margin 0 or less: stalls at this bank"), None)]
    if framed:
        entries.append(("frame", tr("load factor at or above that configuration's limit load"), None))
    entries.append(("text", tr("stall IAS at {weight}, wings level and in the bank", weight=weight_text(t)), None))
    top = -ss * 0.5
    x, y = 0.0, top
    box = ss * 1.2
    placed = []
    for kind, text, tag in entries:
        swatch = kind in (HATCHED, BLACK, "frame")
        w = (box + ss * 0.4 if swatch else 0) + fonts.width(text, fonts.REGULAR, ss)
        if x > 0 and x + w > width:
            x, y = 0.0, y - ss * 1.6
        placed.append((kind, text, tag, x, y))
        x += w + ss * 1.5
    return placed, -(y - ss * 1.7)


def _draw_legend(d: Draw, top: float, placed, height: float) -> float:
    ss = d.ctx.size(SMALL)
    box = ss * 1.2
    for kind, text, tag, x, y in placed:
        y += top
        if kind == HATCHED:
            d.rect(x, y, box, box, fill=WHITE, hatch=HATCH, stroke=INK, width=0.6)
        elif kind == BLACK:
            d.rect(x, y, box, box, fill=INK)
        elif kind == "frame":
            d.rect(x + 0.9, y - 0.9, box - 1.8, box - 1.8, stroke=INK, width=1.8)
        if kind in (HATCHED, BLACK, "frame"):
            x += box + ss * 0.4
        d.text(x, y - box + ss * 0.15, text, SMALL, color=INK, figures=tag)
    return top - height


SPEC = BlockSpec(NAME, N_("Margin table: stall speed and margin by bank"), plan=MarginTable)
