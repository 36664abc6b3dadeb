"""A glider's circling figures at minimum-sink angle of attack, at the card weight with ballast."""

from kneeboard import terms
from kneeboard.card.blocks.grid import Cell, ColumnHeads, Grid, Heading, even_columns
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import Context, Draw, Measure, Piece, Plan, Section, figure, weight_text
from kneeboard.card.ops import HIGHER_IS_WORSE, SMALL

NAME = "circling"


class Circling(Plan):
    name = NAME

    def __init__(self, ctx: Context, width: float):
        t = ctx.table
        g = t.glider
        self.ctx = ctx
        fs = ctx.secondary_figure
        su, du, sink = t.speed_unit, t.distance_unit, t.sink_unit
        straight = terms.label(terms.CIRCLING, terms.STRAIGHT)

        def tag(label, printed, unit, worse=None):
            # a configuration may be named "circling": the block's own figures get a key no configuration can have
            return figure(label, printed, unit, worse, key=f"{NAME}\n{label}")

        self.heading = Heading(ctx, width, f"CIRCLING AT MINIMUM SINK, {weight_text(t)}",
                               f"straight flight: {g.min_sink_speed.text} {su}, sink {g.min_sink_rate.text} "
                               f"{sink}; 180° loss is the height lost in a 180° turn",
                               (tag(terms.label(straight, terms.SPEED), g.min_sink_speed, su),
                                tag(terms.label(straight, terms.SINK), g.min_sink_rate, sink, HIGHER_IS_WORSE)))
        names = ["bank", f"{su} IAS", f"sink {sink}", f"radius {du}", "circle s", f"180° loss {du}"]
        columns = even_columns(width, len(names))
        self.heads = ColumnHeads(ctx, NAME, names, columns, width)
        def cells():  # the same at every type size
            out = []
            for r in g.rows:
                if r.turn_radius is None:
                    continue  # wings level: printed above as the straight-flight figures
                at = terms.label(terms.CIRCLING, terms.at_bank(r.bank_text))
                out.append([
                    Cell(f"{r.bank_text}°", bold=True),
                    Cell(r.speed.text, bold=True, figure=tag(terms.label(at, terms.SPEED), r.speed, su)),
                    Cell(r.sink_rate.text, figure=tag(terms.label(at, terms.SINK), r.sink_rate, sink, HIGHER_IS_WORSE)),
                    Cell(r.turn_radius.text, figure=tag(terms.label(at, terms.TURN_RADIUS), r.turn_radius, du)),
                    Cell(r.circle_time.text, figure=tag(terms.label(at, terms.CIRCLE_TIME), r.circle_time, "s")),
                    Cell(r.height_loss_180.text, figure=tag(terms.label(at, terms.LOSS_180), r.height_loss_180, du,
                                                            HIGHER_IS_WORSE)),
                ])
            return out

        rows = ctx.once((NAME,), cells)
        self.grid = Grid(NAME, columns, rows, fs * 1.45, fs)
        self.measure = Measure((Section(self.heads.height, (fs * 1.45,) * len(rows)),),
                               lead=self.heading.height, foot=ctx.size(SMALL), again=self.heading.again)

    def draw(self, piece: Piece):
        d = Draw(self.ctx)
        y = self.heading.draw(d, 0.0) if piece.lead else self.heading.draw_again(d, 0.0) if piece.again else 0.0
        y = self.heads.draw(d, y)
        y = self.grid.draw(d, y, piece.start, piece.stop)
        if piece.foot:
            y -= self.ctx.size(SMALL)
        return d.block(NAME, -y)


SPEC = BlockSpec(NAME, "Circling at minimum sink (gliders)", plan=Circling,
                 applies=lambda table: table.glider is not None)
