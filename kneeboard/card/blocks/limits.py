"""Structural limits and, per configuration, the banks where the buffer and the margin run out."""

from kneeboard import terms
from kneeboard.card import fonts
from kneeboard.card.blocks.grid import NO_VALUE, Cell, grid, heading, sub_headers
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import INK, Context, Draw, figure, fit_lines, weight_text
from kneeboard.card.ops import HIGHER_IS_WORSE, LABEL, LOWER_IS_WORSE, SMALL

NAME = "limits"


def draw(ctx: Context, width: float, _height=None):
    t = ctx.table
    d = Draw(ctx)
    fs = ctx.secondary_figure
    ls = ctx.size(LABEL)
    su = t.speed_unit
    va = f"; maneuvering speed VA {t.maneuvering_speed.text} {su}" if t.maneuvering_speed else ""
    y = heading(d, width, 0.0, f"LIMITS AT {weight_text(t)}",
                f"limit load factor {t.limit_load_factor.text} g, reached in a level turn at "
                f"{t.limit_bank.text}° bank{va}",
                (figure(terms.LIMIT_LOAD, t.limit_load_factor, "g", LOWER_IS_WORSE),
                 figure(terms.LIMIT_BANK, t.limit_bank, "°", LOWER_IS_WORSE),
                 figure(terms.VA, t.maneuvering_speed, su)))
    names = ["", "stall", "fly", f"{t.buffer.text} {su} left", f"0 {su} left", "flap limit"]
    name_w = width * 0.30
    col_w = (width - name_w) / 5
    columns = [(0, name_w)] + [(name_w + i * col_w, col_w) for i in range(5)]
    y = sub_headers(d, NAME, y, [(n, x, w) for n, (x, w) in zip(names, columns)])
    d.line(0, y, width, y, INK, 0.6)
    y_row = y
    for c in t.configurations:
        name = fit_lines(NAME, c.name, fonts.BOLD, ls, name_w - 4, 2)
        row_h = max(fs * 1.45, len(name) * ls * 1.15 + ls * 0.6)
        buffer_label = terms.label(c.name, f"{t.buffer.text} {su} {terms.BUFFER_BANK}")
        row = [
            Cell(c.stall_speed.text, figure=figure(terms.label(c.name, terms.STALL), c.stall_speed, su,
                                                   HIGHER_IS_WORSE)),
            Cell(c.pattern_speed.text, bold=True, figure=figure(terms.label(c.name, terms.PATTERN), c.pattern_speed,
                                                                su)),
            Cell(f"{c.buffer_bank.text}°", bold=True,
                 figure=figure(buffer_label, c.buffer_bank, "°", LOWER_IS_WORSE))
            if c.buffer_bank else Cell(NO_VALUE, role=LABEL),
            Cell(f"{c.zero_margin_bank.text}°", bold=True,
                 figure=figure(terms.label(c.name, terms.ZERO_MARGIN_BANK), c.zero_margin_bank, "°", LOWER_IS_WORSE)),
            Cell(c.flap_limit_speed.text, figure=figure(terms.label(c.name, terms.FLAP_LIMIT), c.flap_limit_speed,
                                                        su))
            if c.flap_limit_speed else Cell(NO_VALUE, role=LABEL),
        ]
        grid(d, NAME, y_row, columns[1:], [row], row_h, fs, shade=False)
        first = y_row - (row_h - len(name) * ls * 1.15) / 2 - ls * 0.85
        for k, line in enumerate(name):
            d.text(2, first - k * ls * 1.15, line, LABEL, True)
        y_row -= row_h
    bottom = y_row
    return d.block(NAME, -(bottom - ctx.size(SMALL) * 0.8))


SPEC = BlockSpec(NAME, "Limits: load factor, VA, buffer and zero-margin banks", draw)
