"""The margin table, the card's main block: stall speed and margin from the pattern speed, by bank, per configuration.

A margin below the buffer is hatched, no margin at all is white on black, a load factor above the limit is boxed
in black: all readable in black and white.
"""

from kneeboard import terms
from kneeboard.card import fonts
from kneeboard.card.blocks.grid import BLACK, HATCHED, Cell, grid, group_headers, sub_headers
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import GREY, HATCH, INK, RULE, WHITE, Context, DoesNotFit, Draw, figure, weight_text
from kneeboard.card.ops import HIGHER_IS_WORSE, LABEL, LOWER_IS_WORSE, SMALL
from kneeboard.tables import BUFFER, STALL

NAME = "margin-table"


def draw(ctx: Context, width: float, _height=None):
    t = ctx.table
    d = Draw(ctx)
    fs, ls, ss = ctx.figure, ctx.size(LABEL), ctx.size(SMALL)
    su = t.speed_unit
    configs = t.configurations
    bank_w = max(fonts.width("88°", fonts.BOLD, fs), fonts.width("bank", fonts.REGULAR, ss)) + fs * 0.7
    n_w = max(fonts.width("5.76", fonts.BOLD, ctx.secondary_figure), fonts.width("load", fonts.REGULAR, ss)) + fs * 0.5
    group_w = (width - bank_w - n_w) / len(configs)
    if group_w < fonts.width("188", fonts.BOLD, fs) * 2 + fs:
        raise DoesNotFit(NAME, f"{len(configs)} configurations need more width")
    groups = [(c.name, bank_w + n_w + i * group_w, group_w) for i, c in enumerate(configs)]

    y = group_headers(d, 0.0, groups, ls, NAME)
    d.text(0, y + ls * 0.2, f"{su} IAS", LABEL, True, color=GREY)
    for c, (_, x, w) in zip(configs, groups):
        d.text(x + w / 2, y - ls * 1.05, f"pattern {c.pattern_speed.text}", LABEL, True, "centre",
               figures=figure(terms.label(c.name, terms.PATTERN), c.pattern_speed, su))
    y -= ls * 1.4
    labels = [("bank", 0, bank_w), ("load", bank_w, n_w)]
    for _, x, w in groups:
        labels += [("stall", x, w / 2), ("margin", x + w / 2, w / 2)]
    y = sub_headers(d, NAME, y, labels)
    d.line(0, y, width, y, INK, 0.8)

    columns = [(0, bank_w), (bank_w, n_w)]
    for _, x, w in groups:
        columns += [(x, w / 2), (x + w / 2, w / 2)]
    rows = []
    for i in range(len(configs[0].rows)):
        first = configs[0].rows[i]
        bank = terms.at_bank(first.bank_text)
        row = [Cell(f"{first.bank_text}°", bold=True),
               Cell(first.load_factor.text,
                    figure=figure(terms.label(bank, terms.LOAD_FACTOR), first.load_factor, "g"))]
        for c in configs:
            r = c.rows[i]
            mark = {BUFFER: HATCHED, STALL: BLACK}.get(r.state)
            row += [Cell(r.stall_speed.text, framed=r.over_limit,
                         figure=figure(terms.label(c.name, bank, terms.STALL), r.stall_speed, su, HIGHER_IS_WORSE)),
                    Cell(r.margin.text, bold=True, mark=mark, framed=r.over_limit,
                         figure=figure(terms.label(c.name, bank, terms.MARGIN), r.margin, su, LOWER_IS_WORSE))]
        rows.append(row)
    row_h = fs * 1.5
    top = y
    y = _grid_mixed(d, y, columns, rows, row_h, fs, ctx.secondary_figure)
    for _, x, _w in groups:
        d.line(x, top, x, y, RULE, 0.6)
    d.line(0, y, width, y, INK, 0.8)
    y = _legend(d, width, y - ss * 0.5, t, rows)
    return d.block(NAME, -y)


def _grid_mixed(d, top, columns, rows, row_h, fs, n_size):
    """The margin grid: the load-factor column in the secondary size, the rest at full figure size."""
    # Draw the load column separately so its smaller figures stay on the same rows.
    main_cols = [columns[0]] + columns[2:]
    main_rows = [[r[0]] + r[2:] for r in rows]
    bottom = grid(d, NAME, top, main_cols, main_rows, row_h, fs)
    grid(d, NAME, top, [columns[1]], [[r[1]] for r in rows], row_h, n_size, shade=False)
    return bottom


def _legend(d: Draw, width: float, top: float, t, rows) -> float:
    ss = d.ctx.size(SMALL)
    entries = [(HATCHED, f"margin under the {t.buffer.text} {t.speed_unit} buffer",
                figure(terms.BUFFER, t.buffer, t.speed_unit)),
               (BLACK, "margin 0 or less: stalls at this bank", None)]
    if any(cell.framed for r in rows for cell in r):
        entries.append(("frame", "load factor at or above that configuration's limit load", None))
    entries.append(("text", f"stall IAS at {weight_text(t)}, wings level and in the bank", None))
    x, y = 0.0, top
    box = ss * 1.2
    for kind, text, tag in entries:
        swatch = kind in (HATCHED, BLACK, "frame")
        w = (box + ss * 0.4 if swatch else 0) + fonts.width(text, fonts.REGULAR, ss)
        if x > 0 and x + w > width:
            x, y = 0.0, y - ss * 1.6
        if kind == HATCHED:
            d.rect(x, y, box, box, fill=WHITE, hatch=HATCH, stroke=INK, width=0.6)
        elif kind == BLACK:
            d.rect(x, y, box, box, fill=INK)
        elif kind == "frame":
            d.rect(x + 0.9, y - 0.9, box - 1.8, box - 1.8, stroke=INK, width=1.8)
        if swatch:
            x += box + ss * 0.4
        d.text(x, y - box + ss * 0.15, text, SMALL, color=INK, figures=tag)
        x += fonts.width(text, fonts.REGULAR, ss) + ss * 1.5
    return y - ss * 1.7


SPEC = BlockSpec(NAME, "Margin table: stall speed and margin by bank", draw, front_only=True)
