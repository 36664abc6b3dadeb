"""The margin chart: stall speed against bank for each configuration, its pattern speed as a level line, the margin
shaded between them, and each configuration's zero-margin and buffer banks marked.

Reading it at arm's length in black and white:

- every configuration has its own line pattern *and* its own marker shape (circle, square, triangle, diamond);
  a filled marker is the zero-margin bank, an open one the buffer bank;
- no number is printed inside the plot, where it could sit on a curve or another label: each configuration's
  legend row repeats its line, its marker shapes and their banks, so a figure is tied to its configuration by its
  shape and its row;
- the pattern speeds are labelled beyond the right edge, pushed apart so they never touch;
- the aircraft's limit bank is a dashed line with its label above the plot, or an edge note with an arrow when it
  lies beyond the axis.

The curves are full-precision data plotted as lines; every number printed is the table builder's rounded text.
`label_boxes(block)` returns every text box the chart placed, for the overlap test.
"""

import math

from kneeboard import printed as rows
from kneeboard.card import fonts
from kneeboard.card.blocks.grid import groups_of
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import GREY, INK, RULE, WHITE, Context, DoesNotFit, Draw, Measure, Piece, Plan, Section
from kneeboard.card.ops import SMALL, Circle, Path, Text
from kneeboard.i18n import N_, Msg

NAME = "margin-chart"

DASHES = ((), (6.0, 2.5), (1.6, 1.8), (7.0, 2.0, 1.6, 2.0))
COLOURS = (None, "#222222", "#8C4A12", "#4A4A4A")  # None: the style's accent
SHAPES = ("circle", "square", "triangle", "diamond")
MIN_PLOT = 72.0  #: least height of the plotting area [pt]: one inch
MAX_AXIS = 80.0  #: the bank axis ends at most here [deg]; a limit bank beyond gets an edge note
PLOT_TOP, PLOT_BOTTOM = 3.2, 2.6  #: room above the plot (title, limit bank) and below it (ticks, axis title) [small]


def _nice_step(span: float, most: int) -> float:
    for step in (1, 2, 5, 10, 20, 25, 50, 100, 200):
        if span / step <= most:
            return float(step)
    return 500.0


GROUP = len(SHAPES)  #: configurations per chart: each its own marker shape; more make a second chart


def _plot_preferred(ctx: Context, width: float) -> float:
    return min(width * 0.62, 250.0 * ctx.scale)


def _axes_height(ctx: Context) -> float:
    return ctx.size(SMALL) * (PLOT_TOP + PLOT_BOTTOM)


def _key_text(ctx: Context) -> str:
    t = ctx.table
    return ctx.tr("filled marker: zero-margin bank; open: buffer bank ({buffer} {unit})", buffer=t.buffer,
                  unit=t.speed_unit)


def _axis_title(ctx: Context) -> str:
    return ctx.tr("stall speed, {unit} IAS", unit=ctx.table.speed_unit)


def _legend_items(ctx: Context, i: int) -> list[tuple[str, str | None, str]]:
    """One configuration's legend row: (kind, marker fill, text) pieces."""
    c, tr = ctx.table.configurations[i], ctx.tr
    items = [("line", None, c.name), ("text", None, tr("pattern {speed}", speed=c.pattern_speed))]
    items.append(("marker", INK, f"{tr.number(c.zero_margin_bank.text)}°"))
    if c.buffer_bank is not None:
        items.append(("marker", WHITE, f"{tr.number(c.buffer_bank.text)}°"))
    items.append(("limit", None, tr("limit {bank}°", bank=c.limit_bank)))
    return items


def _piece_width(ss: float, kind: str, text: str) -> float:
    lead = ss * 3.0 if kind == "line" else ss * 1.3 if kind == "marker" else ss * 1.0 if kind == "limit" else 0.0
    return lead + fonts.width(text, fonts.BOLD if kind == "line" else fonts.REGULAR, ss) + ss * 1.2


def _legend_rows(ctx: Context, width: float, configurations) -> list[list[list[tuple]]]:
    """Per configuration, its pieces in lines: a row wraps where the width runs out, never mid-piece."""
    ss = ctx.size(SMALL)
    out = []
    for i in configurations:
        lines, x = [[]], 0.0
        for piece in _legend_items(ctx, i):
            w = _piece_width(ss, piece[0], piece[2])
            if x and x + w > width:
                lines.append([])
                x = ss * 3.0  # continued lines start under the name
            lines[-1].append(piece)
            x += w
        out.append(lines)
    return out


class MarginChart(Plan):
    """The chart planned: one chart per group of at most four configurations (one marker shape each), each with
    its legend rows; the key to the markers once, under the last."""

    name = NAME

    def __init__(self, ctx: Context, width: float):
        self.ctx, self.width = ctx, width
        ss = ctx.size(SMALL)
        n = len(ctx.table.configurations)
        self.groups = groups_of(n, GROUP)
        self.legends = [_legend_rows(ctx, width, g) for g in self.groups]
        self.key = fonts.wrap(_key_text(ctx), fonts.REGULAR, ss, width)
        sections = []
        for legend in self.legends:
            rows_h = ss * 1.45 * sum(len(lines) for lines in legend)
            least = MIN_PLOT + _axes_height(ctx) + rows_h
            sections.append(Section(least, grow=max(_plot_preferred(ctx, width) + rows_h - least, 0.0)))
        self.measure = Measure(tuple(sections), foot=ss * 1.45 * len(self.key) + ss * 0.9, gap=ss)

    def draw(self, piece: Piece):
        height = self.measure.sections[piece.section].head + piece.extra
        return _draw(self.ctx, self.width, height, self.groups[piece.section], self.legends[piece.section],
                     self.key if piece.foot else ())


def marker(d: Draw, shape: str, x: float, y: float, r: float, fill: str | None, stroke: str | None = INK) -> None:
    """A marker of `shape` centred on (x, y): filled with `fill`, outlined with `stroke`."""
    if shape == "circle":
        d.circle(x, y, r, fill=fill, stroke=stroke, width=0.9)
        return
    if shape == "square":
        s = r * 0.9
        pts = [(x - s, y - s), (x + s, y - s), (x + s, y + s), (x - s, y + s)]
    elif shape == "triangle":
        pts = [(x, y + r * 1.15), (x + r * 1.05, y - r * 0.75), (x - r * 1.05, y - r * 0.75)]
    else:
        pts = [(x, y + r * 1.2), (x + r * 1.05, y), (x, y - r * 1.2), (x - r * 1.05, y)]
    d.path(pts, color=stroke, width=0.9, closed=True, fill=fill)


def _draw(ctx: Context, width: float, height: float, group, legend, key):
    """One chart of the configurations in `group` in `height` (plot and legend rows), then the `key` lines."""
    t = ctx.table
    curves = [t.curves[i] for i in group]
    printed_configurations = [t.configurations[i] for i in group]
    d = Draw(ctx)
    ss = ctx.size(SMALL)
    accent = ctx.style.accent
    su = t.speed_unit
    plot_h = height - ss * 1.45 * sum(len(lines) for lines in legend)

    limits = [c.limit_bank.value for c in printed_configurations]  # each configuration's own, as printed
    banks_max = max(max(r.bank_deg for r in t.configurations[0].rows),
                    max(c.zero_margin_bank.value for c in printed_configurations),
                    max((b for b in limits if b <= MAX_AXIS), default=0.0))
    x_max = float(min(MAX_AXIS, max(40, math.ceil((banks_max + 3) / 10) * 10)))
    top_speed = max(c.pattern_speed.value for c in printed_configurations)
    y_lo = min(c.stall_speed[0] for c in curves) * 0.85
    y_hi = top_speed * 1.12
    step = _nice_step(y_hi - y_lo, 6)
    y_lo = math.floor(y_lo / step) * step
    y_hi = math.ceil(y_hi / step) * step

    tr = ctx.tr
    label_w = fonts.width(f"{y_hi:.0f}", fonts.REGULAR, ss) + ss * 0.6
    pattern_w = max(fonts.width(tr("pattern {speed}", speed=c.pattern_speed), fonts.BOLD, ss)
                    for c in printed_configurations)
    px0, px1 = label_w, width - pattern_w - ss * 0.6
    py1, py0 = -ss * PLOT_TOP, -plot_h + ss * PLOT_BOTTOM  # top and bottom of the plot area
    if px1 - px0 < 80 or py1 - py0 < MIN_PLOT - 0.01:
        raise DoesNotFit(NAME, Msg("too little room for a readable chart"))

    def X(b):
        return px0 + b / x_max * (px1 - px0)

    def Y(v):
        return py0 + (v - y_lo) / (y_hi - y_lo) * (py1 - py0)

    # grid, ticks and axis labels
    v = y_lo
    while v <= y_hi + 1e-9:
        d.line(px0, Y(v), px1, Y(v), RULE, 0.3)
        d.text(px0 - ss * 0.4, Y(v) - ss * 0.35, f"{v:.0f}", SMALL, align="right", color=GREY)
        v += step
    for b in range(0, int(x_max) + 1, 10):
        d.line(X(b), py0, X(b), py1, RULE, 0.3)
        # the 0 tick starts at the axis, clear of the speed scale's lowest figure beside it
        d.text(X(b), py0 - ss * 1.2, f"{b}°", SMALL, align="left" if b == 0 else "centre", color=GREY)
    d.line(px0, py0, px1, py0, INK, 0.8)
    d.line(px0, py0, px0, py1, INK, 0.8)
    d.text(0, py1 + ss * 1.85, _axis_title(ctx), SMALL, True)
    d.text(px1, py0 - ss * 2.3, tr("bank angle"), SMALL, True, "right")

    _limit_lines(d, ctx, printed_configurations, X, x_max, px1, py0, py1, width)

    markers = []  # drawn after every curve, so they sit on top
    # lines and markers at the printed figures (the table's rounded pattern speeds and banks); the curves are the
    # full-precision stall speeds
    pattern = [Y(p.pattern_speed.value) for p in printed_configurations]
    pattern_ys = _spread([y - ss * 0.35 for y in pattern], ss * 1.2, py0, py1 - ss * 0.8)
    for i, c in enumerate(curves):
        printed = printed_configurations[i]
        colour = COLOURS[i % len(COLOURS)] or accent
        dash = DASHES[i % len(DASHES)]
        stall = _clip(c.bank_deg, c.stall_speed, x_max, y_hi)
        zero = printed.zero_margin_bank.value
        # the margin: between the pattern-speed line and the stall curve, up to the zero-margin bank
        inside = [(b, s) for b, s in zip(c.bank_deg, c.stall_speed) if b <= zero]
        shade = [(X(0), pattern[i]), (X(min(zero, x_max)), pattern[i])]
        shade += [(X(b), Y(s)) for b, s in reversed(inside) if b <= x_max]
        d.path(shade, color=None, closed=True, fill=colour, fill_alpha=0.08 if i == 0 else 0.05)
        d.line(X(0), pattern[i], px1, pattern[i], colour, 0.9, dash)
        d.path([(X(b), Y(s)) for b, s in stall], colour, 2.0, dash)
        d.line(px1, pattern[i], px1 + ss * 0.25, pattern_ys[i] + ss * 0.35, colour, 0.6)
        d.text(px1 + ss * 0.3, pattern_ys[i], tr("pattern {speed}", speed=printed.pattern_speed), SMALL, True,
               color=colour,
               figures=rows.pattern(printed, su))
        shape = SHAPES[i % len(SHAPES)]
        limit = printed.limit_bank.value  # no marker at or past the configuration's own limit bank
        if zero <= x_max and zero < limit:
            markers.append((shape, X(zero), pattern[i], INK))
        buffer = printed.buffer_bank
        if buffer is not None and buffer.value <= x_max and buffer.value < limit:
            markers.append((shape, X(buffer.value), Y(printed.pattern_speed.value - t.buffer.value), WHITE))
    r = ss * 0.45
    for shape, x, y, fill, (mx, my) in _apart(markers, r, py0, py1):
        if (mx, my) != (x, y):  # moved off a marker it would merge with: a leader back to the point it marks
            d.line(x, y, mx, my, INK, 0.5)
            d.circle(x, y, 0.9, fill=INK)
        marker(d, shape, mx, my, r, fill)

    y = -plot_h
    for i, lines in enumerate(legend):
        printed = printed_configurations[i]
        colour = COLOURS[i % len(COLOURS)] or accent
        shape = SHAPES[i % len(SHAPES)]
        for k, line in enumerate(lines):
            y -= ss * 1.45
            x = 0.0 if k == 0 else ss * 3.0
            for kind, fill, text in line:
                tag = None
                if kind == "line":
                    d.line(x, y + ss * 0.3, x + ss * 2.4, y + ss * 0.3, colour, 2.0, DASHES[i % len(DASHES)])
                    x += ss * 3.0
                elif kind == "limit":  # a short upright stroke in the configuration's line, as its limit is drawn
                    d.line(x + ss * 0.4, y - ss * 0.15, x + ss * 0.4, y + ss * 0.85, colour, 1.0,
                           DASHES[i % len(DASHES)] and (2, 1.2))
                    x += ss * 1.0
                    tag = rows.chart_legend(printed)["limit"]
                elif kind == "marker":
                    marker(d, shape, x + ss * 0.45, y + ss * 0.33, ss * 0.42, fill)
                    x += ss * 1.3
                    tag = rows.chart_legend(printed)["zero" if fill == INK else "buffer"]
                bold = kind == "line"
                d.text(x, y, text, SMALL, bold, color=INK if kind != "text" else GREY, figures=tag)
                x += fonts.width(text, fonts.BOLD if bold else fonts.REGULAR, ss) + ss * 1.2
    for line in key:
        y -= ss * 1.45
        d.text(0, y, line, SMALL, color=GREY)
    return d.block(NAME, height + (ss * 1.45 * len(key) + ss * 0.9 if key else 0.0))


def _limit_lines(d: Draw, ctx: Context, configurations, X, x_max: float, px1: float, py0: float, py1: float,
                 width: float) -> None:
    """Each configuration's limit bank: a vertical line in that configuration's colour and dash (one line for
    configurations that share it), labelled above the plot; an edge note with an arrow when it lies beyond the
    axis. Labels that would touch go to a second line above, or, with no room there either, are left to the
    legend, which gives every configuration's limit beside its name."""
    t = ctx.table
    ss = ctx.size(SMALL)
    shared: dict[float, list[int]] = {}
    for i, c in enumerate(configurations):
        shared.setdefault(c.limit_bank.value, []).append(i)
    tr = ctx.tr
    title = (0.0, fonts.width(_axis_title(ctx), fonts.BOLD, ss) + ss)  # on the second line
    taken: list[list[tuple[float, float]]] = [[], [title]]
    for bank, members in sorted(shared.items(), reverse=True):
        first = configurations[members[0]]
        i = members[0]
        colour = COLOURS[i % len(COLOURS)] or ctx.style.accent
        everyone = len(members) == len(configurations)
        text = (tr("limit bank {bank}° ({load} g)", bank=first.limit_bank, load=first.limit_load_factor)
                if everyone else tr("limit {bank}° ({load} g)", bank=first.limit_bank, load=first.limit_load_factor))
        tag = rows.aircraft_limit_bank(t) if everyone and \
            first.limit_bank.text == t.limit_bank.text else None
        if bank <= x_max:
            d.line(X(bank), py0, X(bank), py1, colour if not everyone else INK, 0.8,
                   (3, 2) if everyone else (DASHES[i % len(DASHES)] or (3, 2)))
            right = min(X(bank) + ss * 0.3, width)
        else:  # beyond the axis: an edge note with an arrow, so the limit is never silently off the chart
            text += " \u2192"
            right = px1
        span = (right - fonts.width(text, fonts.BOLD, ss), right)
        for row, y in ((0, py1 + ss * 0.6), (1, py1 + ss * 1.85)):
            if span[0] >= 0 and all(span[1] + ss * 0.5 <= a or b + ss * 0.5 <= span[0] for a, b in taken[row]):
                taken[row].append(span)
                d.text(right, y, text, SMALL, True, "right", INK if everyone else colour, figures=tag)
                break


def _apart(markers, r: float, low: float, high: float):
    """Each marker with where it is drawn: at its point, or, where it would touch a marker already placed, the
    nearest place above or below that touches none (the chart's legend repeats every bank in figures)."""
    reach = r * 1.25  # half the size of the largest shape
    step = reach * 2 + 1.0
    placed, out = [], []
    for shape, x, y, fill in markers:
        spot = (x, y)
        for k in range(0, 12):
            dy = (k + 1) // 2 * step * (1 if k % 2 else -1)
            candidate = (x, min(max(y + dy, low + reach), high - reach))
            if all(abs(candidate[0] - px) >= step or abs(candidate[1] - py) >= step for px, py in placed):
                spot = candidate
                break
        placed.append(spot)
        out.append((shape, x, y, fill, spot))
    return out


def label_boxes(block) -> list[tuple[float, float, float, float]]:
    """Every text the chart placed, as (x0, y0, x1, y1) in the block's coordinates [pt]."""
    boxes = []
    for op in block.ops:
        if type(op) is Text:
            w = fonts.width(op.text, op.font, op.size)
            x0 = op.x - (w if op.align == "right" else w / 2 if op.align == "centre" else 0.0)
            boxes.append((x0, op.y - op.size * 0.22, x0 + w, op.y + fonts.ascent(op.size)))
    return boxes


def ink_outside_text(block) -> list:
    """Curves and markers: what a label must not touch (grid lines and the margin shading may pass under text)."""
    return [op for op in block.ops if (type(op) is Path and op.color is not None and op.width >= 0.9)
            or type(op) is Circle]


def _spread(ys, spacing, low, high):
    """Label baselines near `ys`, pushed apart to at least `spacing` and kept within [low, high]."""
    order = sorted(range(len(ys)), key=lambda i: ys[i])
    placed = {}
    last = -1e9
    for i in order:
        y = max(ys[i], last + spacing, low)
        placed[i] = y
        last = y
    overshoot = last - high
    if overshoot > 0:
        for i in placed:
            placed[i] -= overshoot
    return [placed[i] for i in range(len(ys))]


def _clip(banks, speeds, x_max, y_hi):
    """Curve points up to the plot's right edge and top, ending exactly on the edge."""
    points = []
    for b, s in zip(banks, speeds):
        if b > x_max:
            break
        if s > y_hi:
            if points:
                b0, s0 = points[-1]
                points.append((b0 + (b - b0) * (y_hi - s0) / (s - s0), y_hi))
            break
        points.append((float(b), float(s)))
    return points


SPEC = BlockSpec(NAME, N_("Margin chart"), plan=MarginChart)
