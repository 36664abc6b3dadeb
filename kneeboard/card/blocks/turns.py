"""Turns at each configuration's pattern speed: radius, and time for 180 and 360 degrees, at the density altitude."""

from kneeboard import terms
from kneeboard.card import fonts
from kneeboard.card.blocks.grid import NO_VALUE, Cell, grid, group_headers, heading, sub_headers
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import GREY, INK, RULE, Context, Draw, figure
from kneeboard.card.ops import LABEL, SMALL
from kneeboard.tables import STALL

NAME = "turns"


def draw(ctx: Context, width: float, _height=None):
    t = ctx.table
    d = Draw(ctx)
    fs = ctx.secondary_figure
    du = t.distance_unit
    y = heading(d, width, 0.0, "TURNS AT PATTERN SPEED",
                f"density altitude {t.density_altitude.text} {du} (pressure altitude "
                f"{t.pressure_altitude.text} {du}, {t.temperature_c.text} °C)",
                (figure(terms.DENSITY_ALTITUDE, t.density_altitude, du),
                 figure(terms.PRESSURE_ALTITUDE, t.pressure_altitude, du),
                 figure(terms.TEMPERATURE, t.temperature_c, "°C")))
    configs = t.configurations
    bank_w = fonts.width("88°", fonts.BOLD, fs) + fs
    group_w = (width - bank_w) / len(configs)
    groups = [(c.name, bank_w + i * group_w, group_w) for i, c in enumerate(configs)]
    y = group_headers(d, y, groups, ctx.size(LABEL), NAME)
    labels = [("bank", 0, bank_w)]
    for _, x, w in groups:
        labels += [(f"radius {du}", x, w * 0.5), ("180°/360° s", x + w * 0.5, w * 0.5)]
    y = sub_headers(d, NAME, y, labels)
    d.line(0, y, width, y, INK, 0.6)
    columns = [(0, bank_w)]
    for _, x, w in groups:
        columns += [(x, w * 0.5), (x + w * 0.5, w * 0.5)]
    rows = []
    for i, first in enumerate(configs[0].rows):
        if first.turn_radius is None or all(c.rows[i].state == STALL for c in configs):
            continue
        bank = terms.at_bank(first.bank_text)
        row = [Cell(f"{first.bank_text}°", bold=True)]
        for c in configs:
            r = c.rows[i]
            if r.state == STALL:
                row += [Cell(NO_VALUE, role=LABEL), Cell(NO_VALUE, role=LABEL)]
            else:
                times = f"{r.time_180.text}/{r.time_360.text}"
                row += [Cell(r.turn_radius.text, figure=figure(terms.label(c.name, bank, terms.TURN_RADIUS),
                                                               r.turn_radius, du)),
                        Cell(times, figure=figure(terms.label(c.name, bank, terms.TURN_TIMES), times, "s"))]
        rows.append(row)
    if not rows:  # every bank above 0 stalls (or none was asked for): say so rather than show an empty table
        y -= ctx.size(SMALL) * 1.3
        d.text(0, y, "no turn figures: no bank above 0° with margin left", SMALL, color=GREY)
        return d.block(NAME, -(y - ctx.size(SMALL) * 0.6))
    top = y
    y = grid(d, NAME, y, columns, rows, fs * 1.45, fs)
    for _, x, _w in groups:
        d.line(x, top, x, y, RULE, 0.6)
    if any(cell.text == NO_VALUE for row in rows for cell in row):
        y -= ctx.size(SMALL) * 1.3
        d.text(0, y, f"{NO_VALUE} stalled at that bank", SMALL, color=GREY)
    return d.block(NAME, -(y - ctx.size(SMALL) * 0.6))


SPEC = BlockSpec(NAME, "Turns at pattern speed", draw)
