"""The card's tables: margin by bank (the main block), turns, circling and limits.

Row states are marked so they survive black-and-white printing: a margin below the buffer is
hatched, no margin at all is white on black, a load factor above the limit is boxed in black.
Every number comes as printed text from the table builder; nothing is re-rounded here.
"""

from dataclasses import dataclass

from kneeboard.card import fonts
from kneeboard.card.draw import (
    GREY,
    HATCH,
    INK,
    RULE,
    SHADE,
    WHITE,
    Context,
    DoesNotFit,
    Draw,
    baseline,
    fit_lines,
    weight_text,
)
from kneeboard.card.ops import FIGURE, HEADING, LABEL, SMALL
from kneeboard.tables import BUFFER, STALL

HATCHED, BLACK = "hatched", "black"
NO_VALUE = "–"  #: printed where a figure does not exist (no turn at 0 bank, stalled)


@dataclass(frozen=True)
class Cell:
    text: str
    bold: bool = False
    mark: str | None = None  #: HATCHED or BLACK background
    note: str = ""  #: a small suffix such as "*"
    role: str = FIGURE


def _grid(d: Draw, block: str, top: float, columns, rows, row_h: float, size: float, shade=True) -> float:
    """Draw rows of cells into columns [(x, w)]; numbers right-aligned on a common edge per column."""
    edges = []
    for j, (x, w) in enumerate(columns):
        widest = max((fonts.width(r[j].text, fonts.BOLD, size) for r in rows), default=0.0)
        if widest > w - 2:
            raise DoesNotFit(block, f"column {j + 1} needs {widest:.0f} pt, has {w:.0f}")
        edges.append(x + (w + widest) / 2)
    y = top
    for i, row in enumerate(rows):
        if shade and i % 2 == 1:
            d.rect(columns[0][0], y, columns[-1][0] + columns[-1][1] - columns[0][0], row_h, fill=SHADE)
        for (x, w), edge, cell in zip(columns, edges, row):
            color = INK
            if cell.mark == HATCHED:
                d.rect(x + 1, y - 0.5, w - 2, row_h - 1, fill=WHITE, hatch=HATCH, stroke=INK, width=0.6)
            elif cell.mark == BLACK:
                d.rect(x + 1, y - 0.5, w - 2, row_h - 1, fill=INK)
                color = WHITE
            base = baseline(y, row_h, size)
            d.text(edge, base, cell.text, cell.role, cell.bold, "right", color, size if cell.role == FIGURE else None)
            if cell.note:
                d.text(edge + 1, base + size * 0.35, cell.note, SMALL, True, color=color)
        y -= row_h
    return y


def _group_headers(d: Draw, top: float, groups, label_size: float, block: str) -> float:
    """Configuration names over their column groups [(name, x, w)], wrapped to two lines at most."""
    ctx = d.ctx
    hs = ctx.size(HEADING)
    wrapped = [fit_lines(block, name, fonts.BOLD, hs, w - 6, 2) for name, x, w in groups]
    n_lines = max(len(lines) for lines in wrapped)
    for (_name, x, w), lines in zip(groups, wrapped):
        for k, line in enumerate(lines):
            offset = (n_lines - len(lines) + k + 1) * hs * 1.12
            d.text(x + w / 2, top - offset, line, HEADING, True, "centre")
    return top - n_lines * hs * 1.12 - hs * 0.3


def _sub_headers(d: Draw, block: str, top: float, labels) -> float:
    """Small column labels [(text, x, w)], each wrapped to two lines at most."""
    ss = d.ctx.size(SMALL)
    wrapped = [(fit_lines(block, text, fonts.REGULAR, ss, w - 1, 2), x, w) for text, x, w in labels]
    n = max(len(lines) for lines, _, _ in wrapped)
    for lines, x, w in wrapped:
        for k, line in enumerate(lines):
            d.text(x + w / 2, top - ss * (1.05 + 1.1 * (n - len(lines) + k)), line, SMALL, False, "centre", GREY)
    return top - ss * (0.35 + 1.1 * n)


def _heading(d: Draw, width: float, top: float, title: str, detail: str = "") -> float:
    ctx = d.ctx
    hs = ctx.size(HEADING)
    d.text(0, top - hs, title, HEADING, True, color=ctx.style.accent)
    y = top - hs * 1.35
    if detail:
        for line in fit_lines(title, detail, fonts.REGULAR, ctx.size(LABEL), width, 3):
            y -= ctx.size(LABEL) * 1.2
            d.text(0, y + ctx.size(LABEL) * 0.25, line, LABEL, color=GREY)
        y -= ctx.size(LABEL) * 0.2
    return y


def margin_table(ctx: Context, width: float):
    """Stall speed and margin from the pattern speed, by bank, for every configuration."""
    t = ctx.table
    d = Draw(ctx)
    fs, ls, ss = ctx.figure, ctx.size(LABEL), ctx.size(SMALL)
    configs = t.configurations
    bank_w = max(fonts.width("88°", fonts.BOLD, fs), fonts.width("bank", fonts.REGULAR, ss)) + fs * 0.7
    n_w = max(fonts.width("5.76", fonts.BOLD, ctx.secondary_figure), fonts.width("load", fonts.REGULAR, ss)) + fs * 0.5
    group_w = (width - bank_w - n_w) / len(configs)
    if group_w < fonts.width("188", fonts.BOLD, fs) * 2 + fs:
        raise DoesNotFit("margin-table", f"{len(configs)} configurations need more width")
    groups = [(c.name, bank_w + n_w + i * group_w, group_w) for i, c in enumerate(configs)]

    y = _group_headers(d, 0.0, groups, ls, "margin-table")
    d.text(0, y + ls * 0.2, f"{t.speed_unit} IAS", LABEL, True, color=GREY)
    for c, (_, x, w) in zip(configs, groups):
        d.text(x + w / 2, y - ls * 1.05, f"fly {c.pattern_speed.text}", LABEL, True, "centre")
    y -= ls * 1.4
    labels = [("bank", 0, bank_w), ("load", bank_w, n_w)]
    for _, x, w in groups:
        labels += [("stall", x, w / 2), ("margin", x + w / 2, w / 2)]
    y = _sub_headers(d, "margin-table", y, labels)
    d.line(0, y, width, y, INK, 0.8)

    columns = [(0, bank_w), (bank_w, n_w)]
    for _, x, w in groups:
        columns += [(x, w / 2), (x + w / 2, w / 2)]
    rows = []
    for i in range(len(configs[0].rows)):
        first = configs[0].rows[i]
        row = [Cell(f"{first.bank_text}°", bold=True),
               Cell(first.load_factor.text, mark=BLACK if first.over_limit else None)]
        for c in configs:
            r = c.rows[i]
            mark = {BUFFER: HATCHED, STALL: BLACK}.get(r.state)
            row += [Cell(r.stall_speed.text, note="*" if r.extrapolated else ""),
                    Cell(r.margin.text, bold=True, mark=mark)]
        rows.append(row)
    row_h = fs * 1.5
    top = y
    y = _grid_mixed(d, y, columns, rows, row_h, fs, ctx.secondary_figure)
    for _, x, _w in groups:
        d.line(x, top, x, y, RULE, 0.6)
    d.line(0, y, width, y, INK, 0.8)
    y = _legend(d, width, y - ss * 0.5, t, rows)
    return d.block("margin-table", -y)


def _grid_mixed(d, top, columns, rows, row_h, fs, n_size):
    """The margin grid: the load-factor column in the secondary size, the rest at full figure size."""
    # Draw the load column separately so its smaller figures stay on the same rows.
    main_cols = [columns[0]] + columns[2:]
    main_rows = [[r[0]] + r[2:] for r in rows]
    bottom = _grid(d, "margin-table", top, main_cols, main_rows, row_h, fs)
    _grid(d, "margin-table", top, [columns[1]], [[r[1]] for r in rows], row_h, n_size, shade=False)
    return bottom


def _legend(d: Draw, width: float, top: float, t, rows) -> float:
    ss = d.ctx.size(SMALL)
    entries = [(HATCHED, f"margin under the {t.buffer.text} {t.speed_unit} buffer"),
               (BLACK, "no margin: stalls at this bank")]
    if any(r[1].mark == BLACK for r in rows):
        entries.append(("load", f"load factor above the {t.limit_load_factor.text} limit"))
    if any(cell.note for r in rows for cell in r):
        entries.append(("*", "* calibration table extrapolated"))
    entries.append(("text", f"stall IAS at {weight_text(t)}, wings level and in the bank"))
    x, y = 0.0, top
    box = ss * 1.2
    for kind, text in entries:
        w = (box + ss * 0.4 if kind in (HATCHED, BLACK, "load") else 0) + fonts.width(text, fonts.REGULAR, ss)
        if x > 0 and x + w > width:
            x, y = 0.0, y - ss * 1.6
        if kind == HATCHED:
            d.rect(x, y, box, box, fill=WHITE, hatch=HATCH, stroke=INK, width=0.6)
        elif kind in (BLACK, "load"):
            d.rect(x, y, box, box, fill=INK)
        if kind in (HATCHED, BLACK, "load"):
            x += box + ss * 0.4
        d.text(x, y - box + ss * 0.15, text, SMALL, color=INK)
        x += fonts.width(text, fonts.REGULAR, ss) + ss * 1.5
    return y - ss * 1.7


def turns_table(ctx: Context, width: float):
    """Turn radius and time for 180 and 360 degrees at each configuration's pattern speed."""
    t = ctx.table
    d = Draw(ctx)
    fs = ctx.secondary_figure
    y = _heading(d, width, 0.0, "TURNS AT PATTERN SPEED",
                 f"density altitude {t.density_altitude.text} {t.distance_unit} (pressure altitude "
                 f"{t.pressure_altitude.text} {t.distance_unit}, {t.temperature_c.text} °C)")
    configs = t.configurations
    bank_w = fonts.width("88°", fonts.BOLD, fs) + fs
    group_w = (width - bank_w) / len(configs)
    groups = [(c.name, bank_w + i * group_w, group_w) for i, c in enumerate(configs)]
    y = _group_headers(d, y, groups, ctx.size(LABEL), "turns")
    labels = [("bank", 0, bank_w)]
    for _, x, w in groups:
        labels += [(f"radius {t.distance_unit}", x, w * 0.5), ("180°/360° s", x + w * 0.5, w * 0.5)]
    y = _sub_headers(d, "turns", y, labels)
    d.line(0, y, width, y, INK, 0.6)
    columns = [(0, bank_w)]
    for _, x, w in groups:
        columns += [(x, w * 0.5), (x + w * 0.5, w * 0.5)]
    rows = []
    for i, first in enumerate(configs[0].rows):
        if first.turn_radius is None or all(c.rows[i].state == STALL for c in configs):
            continue
        row = [Cell(f"{first.bank_text}°", bold=True)]
        for c in configs:
            r = c.rows[i]
            if r.state == STALL:
                row += [Cell(NO_VALUE, role=LABEL), Cell(NO_VALUE, role=LABEL)]
            else:
                row += [Cell(r.turn_radius.text), Cell(f"{r.time_180.text}/{r.time_360.text}")]
        rows.append(row)
    if not rows:
        raise DoesNotFit("turns", "no bank above 0 degrees to show")
    top = y
    y = _grid(d, "turns", y, columns, rows, fs * 1.45, fs)
    for _, x, _w in groups:
        d.line(x, top, x, y, RULE, 0.6)
    if any(cell.text == NO_VALUE for row in rows for cell in row):
        y -= ctx.size(SMALL) * 1.3
        d.text(0, y, f"{NO_VALUE} stalled at that bank", SMALL, color=GREY)
    return d.block("turns", -(y - ctx.size(SMALL) * 0.6))


def circling_table(ctx: Context, width: float):
    """A glider's circling figures at minimum-sink angle of attack, at the card weight with ballast."""
    t = ctx.table
    g = t.glider
    d = Draw(ctx)
    fs = ctx.secondary_figure
    y = _heading(d, width, 0.0, f"CIRCLING AT MINIMUM SINK, {weight_text(t)}",
                 f"straight flight: {g.min_sink_speed.text} {t.speed_unit}, sink {g.min_sink_rate.text} "
                 f"{t.sink_unit}; turn-back loss is the height lost in a 180° turn")
    names = ["bank", f"{t.speed_unit} IAS", f"sink {t.sink_unit}", f"radius {t.distance_unit}", "circle s",
             f"180° loss {t.distance_unit}"]
    col_w = width / len(names)
    columns = [(i * col_w, col_w) for i in range(len(names))]
    y = _sub_headers(d, "circling", y, [(n, x, w) for n, (x, w) in zip(names, columns)])
    d.line(0, y, width, y, INK, 0.6)
    rows = [
        [Cell(f"{r.bank_text}°", bold=True), Cell(r.speed.text, bold=True), Cell(r.sink_rate.text),
         Cell(r.turn_radius.text), Cell(r.circle_time.text), Cell(r.height_loss_180.text)]
        for r in g.rows if r.turn_radius is not None
    ]
    y = _grid(d, "circling", y, columns, rows, fs * 1.45, fs)
    return d.block("circling", -(y - ctx.size(SMALL)))


def limits_table(ctx: Context, width: float):
    """Structural limits and, per configuration, the banks where the buffer and the margin run out."""
    t = ctx.table
    d = Draw(ctx)
    fs = ctx.secondary_figure
    ls = ctx.size(LABEL)
    va = f"; maneuvering speed VA {t.maneuvering_speed.text} {t.speed_unit}" if t.maneuvering_speed else ""
    y = _heading(d, width, 0.0, f"LIMITS AT {weight_text(t)}",
                 f"limit load factor {t.limit_load_factor.text} g, reached in a level turn at "
                 f"{t.limit_bank.text}° bank{va}")
    names = ["", "stall", "fly", f"{t.buffer.text} {t.speed_unit} left", f"0 {t.speed_unit} left", "flap limit"]
    name_w = width * 0.30
    col_w = (width - name_w) / 5
    columns = [(0, name_w)] + [(name_w + i * col_w, col_w) for i in range(5)]
    y = _sub_headers(d, "limits", y, [(n, x, w) for n, (x, w) in zip(names, columns)])
    d.line(0, y, width, y, INK, 0.6)
    y_row = y
    for c in t.configurations:
        name = fit_lines("limits", c.name, fonts.BOLD, ls, name_w - 4, 2)
        row_h = max(fs * 1.45, len(name) * ls * 1.15 + ls * 0.6)
        row = [
            Cell(c.stall_speed.text),
            Cell(c.pattern_speed.text, bold=True),
            Cell(f"{c.buffer_bank.text}°", bold=True) if c.buffer_bank else Cell(NO_VALUE, role=LABEL),
            Cell(f"{c.zero_margin_bank.text}°", bold=True),
            Cell(c.flap_limit_speed.text) if c.flap_limit_speed else Cell(NO_VALUE, role=LABEL),
        ]
        _grid(d, "limits", y_row, columns[1:], [row], row_h, fs, shade=False)
        first = y_row - (row_h - len(name) * ls * 1.15) / 2 - ls * 0.85
        for k, line in enumerate(name):
            d.text(2, first - k * ls * 1.15, line, LABEL, True)
        y_row -= row_h
    bottom = y_row
    return d.block("limits", -(bottom - ctx.size(SMALL) * 0.8))
