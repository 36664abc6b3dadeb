"""Turn back after an engine failure (a glider: after a launch failure): for each card bank, the speed to fly in the
gliding turn, its margin over the stall speed, and the height each heading change costs, plus the straight glide
of the reaction time; the bank of least loss in bold. The figures are `aero.glide`'s, rounded toward safety
(speeds and heights up, margins down)."""

from kneeboard import terms
from kneeboard.card import fonts
from kneeboard.card.blocks.grid import Cell, column_headers, even_columns, grid, heading
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import INK, Context, Draw, figure, fit_lines
from kneeboard.card.ops import CAUTION, HIGHER_IS_WORSE, LABEL, LOWER_IS_WORSE, SMALL
from kneeboard.texts import CAUTION_TURN_BACK

NAME = "turn-back"


def draw(ctx: Context, width: float, _height=None):
    t = ctx.table
    tb = t.turn_back
    d = Draw(ctx)
    fs = ctx.secondary_figure
    su, du = t.speed_unit, t.distance_unit
    what = "A LAUNCH FAILURE" if t.category == "glider" else "ENGINE FAILURE"
    at = terms.TURN_BACK
    y = heading(d, width, 0.0, f"TURN BACK AFTER {what}",
                f"best glide {tb.best_glide_speed.text} {su} IAS, ratio {tb.glide_ratio.text}; "
                f"{tb.reaction_time.text} s of reaction: {tb.reaction_height_loss.text} {du} first. Height lost in "
                f"the turn; least at the bold bank; margin over {tb.clean}'s stall speed.",
                (figure(terms.label(at, "best glide speed"), tb.best_glide_speed, su),
                 figure(terms.label(at, "glide ratio"), tb.glide_ratio, "", LOWER_IS_WORSE),
                 figure(terms.label(at, terms.REACTION, terms.HEIGHT_LOSS), tb.reaction_height_loss, du,
                        HIGHER_IS_WORSE)))
    names = ["bank", f"speed {su} IAS", f"margin {su}"] + [f"{h}° loss {du}" for h in tb.headings]
    columns = even_columns(width, len(names))
    y = column_headers(d, NAME, y, names, columns, width)
    rows = []
    for r in tb.rows:
        bank = terms.at_bank(r.bank_text)
        row = [Cell(f"{r.bank_text}°", bold=True),
               Cell(r.speed.text, bold=r.least, figure=figure(terms.label(at, bank, terms.SPEED), r.speed, su)),
               Cell(r.margin.text, bold=r.least,
                    figure=figure(terms.label(at, bank, terms.MARGIN), r.margin, su, LOWER_IS_WORSE))]
        for h, loss in zip(tb.headings, r.height_loss):
            row.append(Cell(loss.text, bold=r.least,
                            figure=figure(terms.label(at, bank, f"{h}° {terms.HEIGHT_LOSS}"), loss, du,
                                          HIGHER_IS_WORSE)))
        rows.append(row)
    y = grid(d, NAME, y, columns, rows, fs * 1.3, fs)
    y -= ctx.size(SMALL) * 0.2
    cs = ctx.size(CAUTION)
    for line in fit_lines(NAME, CAUTION_TURN_BACK, fonts.REGULAR, cs, width, 4):
        y -= cs * 1.2
        d.text(0, y, line, CAUTION, color=INK)
    return d.block(NAME, -(y - ctx.size(LABEL) * 0.6))


SPEC = BlockSpec(NAME, "Turn back after an engine (or launch) failure", draw,
                 applies=lambda table: table.turn_back is not None and bool(table.turn_back.rows))
