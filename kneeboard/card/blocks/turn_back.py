"""Turn back after an engine failure (a glider: after a launch failure): for each card bank, the speed to fly in the
gliding turn, its margin over the stall speed, and the height each heading change costs, plus the straight glide
of the reaction time; the bank of least loss in bold. The figures are `aero.glide`'s, rounded toward safety
(speeds and heights up, margins down)."""

from kneeboard import printed
from kneeboard.card import fonts
from kneeboard.card.blocks.grid import NOTE_LINES, ColumnHeads, Grid, Heading, even_columns
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.blocks.table_plan import TablePlan
from kneeboard.card.draw import INK, Context, Draw, Measure, Section, fit_lines
from kneeboard.card.ops import CAUTION, LABEL, SMALL
from kneeboard.i18n import N_, Num
from kneeboard.texts import CAUTION_TURN_BACK

NAME = "turn-back"


class TurnBack(TablePlan):
    name = NAME

    def __init__(self, ctx: Context, width: float):
        t, tr = ctx.table, ctx.tr
        tb = t.turn_back
        self.ctx = ctx
        fs = ctx.secondary_figure
        su, du = t.speed_unit, t.distance_unit
        title = tr("TURN BACK AFTER A LAUNCH FAILURE") if t.category == "glider" else \
            tr("TURN BACK AFTER ENGINE FAILURE")
        self.heading = Heading(
            ctx, width, title,
            tr("best glide {speed} {unit} IAS, ratio {ratio}; {time} s of reaction: {loss} {distance_unit} first. "
               "Height lost in the turn; least at the bold bank; margin over {configuration}'s stall speed.",
               speed=tb.best_glide_speed, unit=su, ratio=tb.glide_ratio, time=tb.reaction_time,
               loss=tb.reaction_height_loss, distance_unit=du, configuration=tb.clean),
            printed.turn_back_heading(t))
        names = [tr("bank"), tr("speed {unit} IAS", unit=su), tr("margin {unit}", unit=su)] + \
            [tr("{heading}° loss {unit}", heading=Num(h), unit=du) for h in tb.headings]
        columns = even_columns(width, len(names))
        self.heads = ColumnHeads(ctx, NAME, names, columns, width)
        rows = ctx.once((NAME,), lambda: printed.turn_back_rows(t))
        self.grid = Grid(NAME, columns, rows, fs * 1.3, fs)
        cs = ctx.size(CAUTION)
        caution = tr(CAUTION_TURN_BACK)
        if any(r.past_limit for r in tb.rows):
            caution = tr("Framed rows: at or past {configuration}'s limit bank of {bank}°, a load the structure is "
                         "not built for.", configuration=tb.clean, bank=tb.limit_bank) + " " + caution
        self.caution = fit_lines(NAME, caution, fonts.REGULAR, cs, width, NOTE_LINES + 2)  # a translation: longer
        foot = ctx.size(SMALL) * 0.2 + cs * 1.2 * len(self.caution) + ctx.size(LABEL) * 0.6
        self.measure = Measure((Section(self.heads.height, (fs * 1.3,) * len(rows)),),
                               lead=self.heading.height, foot=foot, again=self.heading.again)

    def rows_drawn(self, d: Draw, top: float, start: int, stop: int) -> float:
        return self.grid.draw(d, top, start, stop)

    def foot_drawn(self, d: Draw, top: float) -> float:
        y, cs = top - self.ctx.size(SMALL) * 0.2, self.ctx.size(CAUTION)
        for line in self.caution:
            y -= cs * 1.2
            d.text(0, y, line, CAUTION, color=INK)
        return y - self.ctx.size(LABEL) * 0.6


SPEC = BlockSpec(NAME, N_("Turn back after an engine (or launch) failure"), plan=TurnBack,
                 applies=lambda table: table.turn_back is not None and bool(table.turn_back.rows))
