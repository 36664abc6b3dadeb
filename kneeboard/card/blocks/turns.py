"""Turns at each configuration's pattern speed: radius, and time for 180 and 360 degrees, at the density altitude."""

from kneeboard import printed
from kneeboard.card import fonts
from kneeboard.card.blocks.grid import NO_VALUE, Grid, GroupHeads, Heading, SubHeads, head_width, split_configurations
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import GREY, INK, RULE, Context, Draw, Measure, Piece, Plan, Section
from kneeboard.card.ops import SMALL
from kneeboard.i18n import N_

NAME = "turns"
TITLE = N_("TURNS AT PATTERN SPEED")


class _Group:
    """The turn table of some configurations."""

    def __init__(self, ctx: Context, width: float, bank_w: float, configs):
        t = ctx.table
        fs, ss = ctx.secondary_figure, ctx.size(SMALL)
        du = t.distance_unit
        group_w = (width - bank_w) / len(configs)
        self.groups = [(c.name, bank_w + i * group_w, group_w) for i, c in enumerate(configs)]
        self.heads = GroupHeads(ctx, self.groups, NAME)
        tr = ctx.tr
        labels = [(tr("bank"), 0, bank_w)]
        for _, x, w in self.groups:
            labels += [(tr("radius {unit}", unit=du), x, w * 0.5), (tr("180°/360° s"), x + w * 0.5, w * 0.5)]
        self.subs = SubHeads(ctx, NAME, labels)
        columns = [(0, bank_w)]
        for _, x, w in self.groups:
            columns += [(x, w * 0.5), (x + w * 0.5, w * 0.5)]
        self.rows = rows = ctx.once((NAME, tuple(c.name for c in configs)), lambda: printed.turn_rows(t, configs))
        self.grid = Grid(NAME, columns, rows, fs * 1.45, fs) if rows else None
        self.stalled = any(cell.text == NO_VALUE for row in rows for cell in row)
        self.head = self.heads.height + self.subs.height if rows else ss * 1.3 + ss * 0.6
        self.row_h = fs * 1.45

    def draw(self, d: Draw, width: float, y: float, start: int, stop: int) -> float:
        ss = d.ctx.size(SMALL)
        if not self.rows:  # every bank above 0 stalls (or none was asked for): say so rather than an empty table
            y -= ss * 1.3
            d.text(0, y, d.ctx.tr("no turn figures: no bank above 0° with margin left"), SMALL, color=GREY)
            return y - ss * 0.6
        y = self.heads.draw(d, y)
        y = self.subs.draw(d, y)
        d.line(0, y, width, y, INK, 0.6)
        top = y
        y = self.grid.draw(d, y, start, stop)
        for _, x, _w in self.groups:
            d.line(x, top, x, y, RULE, 0.6)
        return y


class Turns(Plan):
    name = NAME

    def __init__(self, ctx: Context, width: float):
        t, tr = ctx.table, ctx.tr
        self.ctx, self.width = ctx, width
        fs, ss = ctx.secondary_figure, ctx.size(SMALL)
        du = t.distance_unit
        self.heading = Heading(ctx, width, tr(TITLE),
                               tr("density altitude {density} {unit} (pressure altitude {pressure} {unit}, "
                                  "{temperature} °C)", density=t.density_altitude, pressure=t.pressure_altitude,
                                  temperature=t.temperature_c, unit=du),
                               printed.turns_heading(t))
        bank_w = max(fonts.width("88°", fonts.BOLD, fs) + fs, head_width(self.ctx.tr("bank"), ss) + ss * 0.5)
        configs = t.configurations
        self.parts = split_configurations(ctx, len(configs),
                                          lambda g: _Group(ctx, width, bank_w, [configs[i] for i in g]))
        self.stalled = any(p.stalled for p in self.parts)
        foot = (ss * 1.3 if self.stalled else 0.0) + (ss * 0.6 if any(p.rows for p in self.parts) else 0.0)
        self.measure = Measure(tuple(Section(p.head, (p.row_h,) * len(p.rows)) for p in self.parts),
                               lead=self.heading.height, foot=foot, again=self.heading.again, gap=fs * 0.6)

    def draw(self, piece: Piece):
        d = Draw(self.ctx)
        ss = self.ctx.size(SMALL)
        y = 0.0
        if piece.lead:
            y = self.heading.draw(d, y)
        elif piece.again:
            y = self.heading.draw_again(d, y)
        part = self.parts[piece.section]
        y = part.draw(d, self.width, y, piece.start, piece.stop)
        if piece.foot:
            if self.stalled:
                y -= ss * 1.3
                d.text(0, y, self.ctx.tr("{none} stalled at that bank", none=NO_VALUE), SMALL, color=GREY)
            if any(p.rows for p in self.parts):
                y -= ss * 0.6
        return d.block(NAME, -y)


SPEC = BlockSpec(NAME, N_("Turns at pattern speed"), plan=Turns)
