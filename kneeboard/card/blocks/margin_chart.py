"""The margin chart: stall speed against bank for each configuration, its pattern speed as a level
line, the margin shaded between them, the buffer and zero-margin banks marked.

Configurations differ in line pattern as well as colour, so the chart reads in black and white.
The curves are full-precision data plotted as lines; the only numbers printed beside the marks
are the table builder's rounded banks.
"""

import math

import numpy as np

from kneeboard import terms
from kneeboard.card import fonts
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import GREY, INK, RULE, WHITE, Context, DoesNotFit, Draw, figure
from kneeboard.card.ops import LOWER_IS_WORSE, SMALL

NAME = "margin-chart"

DASHES = ((), (6.0, 2.5), (1.6, 1.8), (7.0, 2.0, 1.6, 2.0))
COLOURS = (None, "#222222", "#8C4A12", "#4A4A4A")  # None: the style's accent
MIN_PLOT = 72.0  #: least height of the plotting area [pt]: one inch


def _nice_step(span: float, most: int) -> float:
    for step in (1, 2, 5, 10, 20, 25, 50, 100, 200):
        if span / step <= most:
            return float(step)
    return 500.0


def preferred_height(ctx: Context, width: float) -> float:
    return min(width * 0.62, 250.0 * ctx.scale) + _legend_height(ctx, width)


def minimum_height(ctx: Context, width: float) -> float:
    return MIN_PLOT + _axes_height(ctx) + _legend_height(ctx, width)


def _axes_height(ctx: Context) -> float:
    return ctx.size(SMALL) * 4.4


def _legend_height(ctx: Context, width: float) -> float:
    ss = ctx.size(SMALL)
    return ss * 1.4 * len(_legend_rows(ctx, width)) + ss * 2.1


def _legend_rows(ctx: Context, width: float):
    ss = ctx.size(SMALL)
    rows, x = [[]], 0.0
    for i, c in enumerate(ctx.table.configurations):
        w = ss * 3 + fonts.width(c.name, fonts.REGULAR, ss) + ss * 1.5
        if x and x + w > width:
            rows.append([])
            x = 0.0
        rows[-1].append(i)
        x += w
    return rows


def draw(ctx: Context, width: float, height: float | None = None):
    if height is None:
        height = preferred_height(ctx, width)
    t = ctx.table
    curves = t.curves
    d = Draw(ctx)
    ss = ctx.size(SMALL)
    accent = ctx.style.accent
    plot_h = height - _legend_height(ctx, width)

    banks_max = max(max(r.bank_deg for r in t.configurations[0].rows), max(c.zero_margin_bank_deg for c in curves))
    x_max = float(min(85, max(40, math.ceil((banks_max + 5) / 10) * 10)))
    top_speed = max(c.pattern_speed for c in curves)
    y_lo = min(c.stall_speed[0] for c in curves) * 0.85
    y_hi = top_speed * 1.12
    step = _nice_step(y_hi - y_lo, 6)
    y_lo = math.floor(y_lo / step) * step
    y_hi = math.ceil(y_hi / step) * step

    label_w = fonts.width(f"{y_hi:.0f}", fonts.REGULAR, ss) + ss * 0.6
    fly_w = max(fonts.width(f"fly {c.pattern_speed.text}", fonts.BOLD, ss) for c in t.configurations) + ss * 0.6
    px0, px1 = label_w, width - fly_w
    py1, py0 = -ss * 1.8, -plot_h + ss * 2.6  # top and bottom of the plot area
    if px1 - px0 < 80 or py1 - py0 < MIN_PLOT - 0.01:
        raise DoesNotFit(NAME, "too little room for a readable chart")

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
        d.text(X(b), py0 - ss * 1.2, f"{b}°", SMALL, align="centre", color=GREY)
    d.line(px0, py0, px1, py0, INK, 0.8)
    d.line(px0, py0, px0, py1, INK, 0.8)
    d.text(0, py1 + ss * 0.6, f"stall speed, {t.speed_unit} IAS", SMALL, True)
    d.text(px1, py0 - ss * 2.3, "bank angle", SMALL, True, "right")

    limit = math.degrees(t.results.limit_bank)
    if limit <= x_max:
        d.line(X(limit), py0, X(limit), py1, INK, 0.8, (3, 2))
        d.text(X(limit) - ss * 0.3, py1 - ss, f"limit {t.limit_load_factor.text} g", SMALL, True, "right")

    labels = _Labels(px0, px1, py0, py1)
    marks = []  # (x, y, fill, stroke, label): drawn after every curve, so they sit on top
    fly_ys = _spread([Y(c.pattern_speed) for c in curves], ss * 1.15, py0 + ss, py1)
    for i, c in enumerate(curves):
        colour = COLOURS[i % len(COLOURS)] or accent
        dash = DASHES[i % len(DASHES)]
        stall = _clip(c.bank_deg, c.stall_speed, x_max, y_hi)
        zero = c.zero_margin_bank_deg
        # the margin: between the pattern-speed line and the stall curve, up to the zero-margin bank
        inside = [(b, s) for b, s in zip(c.bank_deg, c.stall_speed) if b <= zero]
        shade = [(X(0), Y(c.pattern_speed)), (X(min(zero, x_max)), Y(c.pattern_speed))]
        shade += [(X(b), Y(s)) for b, s in reversed(inside) if b <= x_max]
        d.path(shade, color=None, closed=True, fill=colour, fill_alpha=0.08 if i == 0 else 0.05)
        d.line(X(0), Y(c.pattern_speed), px1, Y(c.pattern_speed), colour, 0.9, dash)
        d.path([(X(b), Y(s)) for b, s in stall], colour, 2.0, dash)
        printed = t.configurations[i]
        d.line(px1, Y(c.pattern_speed), px1 + ss * 0.3, fly_ys[i] + ss * 0.35, colour, 0.6)
        d.text(px1 + ss * 0.4, fly_ys[i], f"fly {printed.pattern_speed.text}", SMALL, True, color=colour,
               figures=figure(terms.label(c.name, terms.PATTERN), printed.pattern_speed, t.speed_unit))
        if zero <= x_max:
            marks.append((X(zero), Y(c.pattern_speed), INK, None, f"{printed.zero_margin_bank.text}°",
                          figure(terms.label(c.name, terms.ZERO_MARGIN_BANK), printed.zero_margin_bank, "°",
                                 LOWER_IS_WORSE)))
        if c.buffer_bank_deg is not None and c.buffer_bank_deg <= x_max and printed.buffer_bank is not None:
            yb = Y(float(np.interp(c.buffer_bank_deg, c.bank_deg, c.stall_speed)))
            marks.append((X(c.buffer_bank_deg), yb, WHITE, INK, f"{printed.buffer_bank.text}°",
                          figure(terms.label(c.name, f"{t.buffer.text} {t.speed_unit} {terms.BUFFER_BANK}"),
                                 printed.buffer_bank, "°", LOWER_IS_WORSE)))
    r = ss * 0.42
    for x, y, fill, stroke, _, _ in marks:
        d.circle(x, y, r, fill=fill, stroke=stroke, width=0.9)
        labels.boxes.append((x - r, y - r, x + r, y + r))
    for x, y, _, _, text, tag in marks:
        labels.place(d, x, y, text, ss, tag)

    y = -plot_h
    for row in _legend_rows(ctx, width):
        x = 0.0
        y -= ss * 1.4
        for i in row:
            colour = COLOURS[i % len(COLOURS)] or accent
            d.line(x, y + ss * 0.3, x + ss * 2.4, y + ss * 0.3, colour, 2.0, DASHES[i % len(DASHES)])
            name = t.configurations[i].name
            d.text(x + ss * 3, y, name, SMALL)
            x += ss * 3 + fonts.width(name, fonts.REGULAR, ss) + ss * 1.5
    y -= ss * 1.5
    key = [(INK, None, "no margin left"), (WHITE, INK, f"{t.buffer.text} {t.speed_unit} buffer left")]
    x = 0.0
    for fill, stroke, text in key:
        d.circle(x + ss * 0.45, y + ss * 0.35, ss * 0.4, fill=fill, stroke=stroke, width=0.9)
        d.text(x + ss * 1.2, y, text, SMALL, color=GREY)
        x += ss * 2.2 + fonts.width(text, fonts.REGULAR, ss)
    return d.block(NAME, -(y - ss * 0.6))


def _spread(ys, spacing, low, high):
    """Label baselines near `ys`, pushed apart to at least `spacing` and kept within [low, high]."""
    order = sorted(range(len(ys)), key=lambda i: ys[i])
    placed = {}
    last = -1e9
    for i in order:
        y = max(ys[i] - spacing * 0.35, last + spacing, low)
        placed[i] = y
        last = y
    overshoot = last - high
    if overshoot > 0:
        for i in placed:
            placed[i] -= overshoot
    return [placed[i] for i in range(len(ys))]


class _Labels:
    """Places small labels next to chart marks without overlapping each other."""

    def __init__(self, x0, x1, y0, y1):
        self.bounds = (x0, x1, y0, y1)
        self.boxes = []

    def place(self, d, x, y, text, size, tag=None):
        w = fonts.width(text, fonts.BOLD, size)
        h = size * 0.8
        r = size * 0.6
        candidates = [(x + r, y - r - h), (x - r - w, y + r), (x + r, y + r), (x - r - w, y - r - h),
                      (x - w / 2, y + r * 1.8), (x - w / 2, y - r * 1.8 - h)]
        x0, x1, y0, y1 = self.bounds
        inside = [(cx, cy) for cx, cy in candidates if x0 <= cx and cx + w <= x1 and y0 <= cy and cy + h <= y1]
        for cx, cy in inside + candidates:
            box = (cx - 1, cy - 1, cx + w + 1, cy + h + 1)
            if not any(_overlap(box, other) for other in self.boxes):
                break
        self.boxes.append(box)
        d.text(cx, cy, text, SMALL, True, figures=tag)


def _overlap(a, b):
    return a[0] < b[2] and b[0] < a[2] and a[1] < b[3] and b[1] < a[3]


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


def sizes(ctx: Context, width: float) -> tuple[float, float]:
    return minimum_height(ctx, width), preferred_height(ctx, width)


SPEC = BlockSpec(NAME, "Margin chart", draw, sizes=sizes)
