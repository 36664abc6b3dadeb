"""A glider's circling figures at minimum-sink angle of attack, at the card weight with ballast."""

from kneeboard import printed
from kneeboard.card.blocks.grid import ColumnHeads, Grid, Heading, even_columns
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.blocks.table_plan import TablePlan
from kneeboard.card.draw import Context, Draw, Measure, Section, weight_text
from kneeboard.card.ops import SMALL
from kneeboard.i18n import N_

NAME = "circling"


class Circling(TablePlan):
    name = NAME

    def __init__(self, ctx: Context, width: float):
        t, tr = ctx.table, ctx.tr
        g = t.glider
        self.ctx = ctx
        fs = ctx.secondary_figure
        su, du, sink = t.speed_unit, t.distance_unit, t.sink_unit

        self.heading = Heading(ctx, width, tr("CIRCLING AT MINIMUM SINK, {weight}", weight=weight_text(t)),
                               tr("straight flight: {speed} {unit}, sink {sink} {sink_unit}; 180° loss is the height "
                                  "lost in a 180° turn", speed=g.min_sink_speed, unit=su, sink=g.min_sink_rate,
                                  sink_unit=sink),
                               printed.circling_heading(t))
        names = [tr("bank"), tr("{unit} IAS", unit=su), tr("sink {unit}", unit=sink), tr("radius {unit}", unit=du),
                 tr("circle s"), tr("180° loss {unit}", unit=du)]
        columns = even_columns(width, len(names))
        self.heads = ColumnHeads(ctx, NAME, names, columns, width)
        rows = ctx.once((NAME,), lambda: printed.circling_rows(t))
        self.grid = Grid(NAME, columns, rows, fs * 1.45, fs)
        self.measure = Measure((Section(self.heads.height, (fs * 1.45,) * len(rows)),),
                               lead=self.heading.height, foot=ctx.size(SMALL), again=self.heading.again)

    def rows_drawn(self, d: Draw, top: float, start: int, stop: int) -> float:
        return self.grid.draw(d, top, start, stop)

    def foot_drawn(self, d: Draw, top: float) -> float:
        return top - self.ctx.size(SMALL)


SPEC = BlockSpec(NAME, N_("Circling at minimum sink (gliders)"), plan=Circling,
                 applies=lambda table: table.glider is not None)
