"""The pull that stalls the wing at the pattern speed, wings level: (Vp / Vs)^2 (FAA-H-8083-25, "Load Factors and
Stalling Speeds"; 1.96 g at 1.4 Vs), and the stall speed at a few load factors. A go-around pull or a gust beyond it
stalls the wing in any attitude. Marked where the structure's limit load comes before the stall."""

from kneeboard import terms
from kneeboard.card import fonts
from kneeboard.card.blocks.grid import Cell, column_headers, heading, named_row
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import GREY, Context, Draw, figure, fit_lines
from kneeboard.card.ops import HIGHER_IS_WORSE, SMALL

NAME = "pull"


def draw(ctx: Context, width: float, _height=None):
    t = ctx.table
    d = Draw(ctx)
    su = t.speed_unit
    loads = [n for n, _ in t.configurations[0].stall_at_load]
    names = ["", "pattern stalls at"] + [f"stall {n} g" for n in loads]
    name_w = width * 0.2
    col_w = (width - name_w) / (len(names) - 1)
    columns = [(0, name_w)] + [(name_w + i * col_w, col_w) for i in range(len(names) - 1)]
    y = heading(d, width, 0.0, "PULL AT THE PATTERN SPEED")
    y = column_headers(d, NAME, y, names, columns, width)
    first_limit = False
    for c in t.configurations:
        structure_first = not c.stalls_before_limit
        first_limit |= structure_first
        row = [Cell(f"{c.available_load_factor.text} g", bold=True, note="!" if structure_first else "",
                    figure=figure(terms.label(c.name, terms.AVAILABLE_LOAD), c.available_load_factor, "g"))]
        row += [Cell(v.text, figure=figure(terms.label(c.name, f"{n} g", terms.STALL), v, su, HIGHER_IS_WORSE))
                for n, v in c.stall_at_load]
        y -= named_row(d, NAME, y, c.name, name_w, columns[1:], row)
    note = (f"pattern stalls at: the load factor that stalls the wing at the pattern speed, wings level; stall "
            f"speeds {su} IAS." + (" ! the structure's limit load comes before the stall." if first_limit else ""))
    ss = ctx.size(SMALL)
    for line in fit_lines(NAME, note, fonts.REGULAR, ss, width, 3):
        y -= ss * 1.2
        d.text(0, y, line, SMALL, color=GREY)
    return d.block(NAME, -(y - ss * 0.8))


SPEC = BlockSpec(NAME, "Pull at the pattern speed: the load factor that stalls the wing", draw)
