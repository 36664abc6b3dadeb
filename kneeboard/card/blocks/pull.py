"""The pull that stalls the wing at the pattern speed, wings level: (Vp / Vs)^2 (FAA-H-8083-25, "Load Factors and
Stalling Speeds"; 1.96 g at 1.4 Vs), and the stall speed at a few load factors. A go-around pull or a gust beyond it
stalls the wing in any attitude. Marked where the structure's limit load comes before the stall."""

from kneeboard import printed
from kneeboard.card import fonts
from kneeboard.card.blocks.grid import NOTE_LINES, ColumnHeads, Heading, NamedRow, name_column
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.blocks.table_plan import NamedTable
from kneeboard.card.draw import Context, fit_lines
from kneeboard.card.ops import SMALL
from kneeboard.i18n import N_, Num

NAME = "pull"
TITLE = N_("PULL AT THE PATTERN SPEED")


class Pull(NamedTable):
    name = NAME

    def __init__(self, ctx: Context, width: float):
        t, tr = ctx.table, ctx.tr
        self.ctx = ctx
        su = t.speed_unit
        loads = [n for n, _ in t.configurations[0].stall_at_load]
        names = ["", tr("pattern stalls at")] + [tr("stall {load} g", load=Num(n)) for n in loads]
        name_w = name_column(ctx, width, t.configurations)
        col_w = (width - name_w) / (len(names) - 1)
        columns = [(0, name_w)] + [(name_w + i * col_w, col_w) for i in range(len(names) - 1)]
        self.heading = Heading(ctx, width, tr(TITLE))
        self.heads = ColumnHeads(ctx, NAME, names, columns, width)
        self.rows = [NamedRow(ctx, NAME, c.name, name_w, columns[1:], row)
                     for c, row in zip(t.configurations, ctx.once((NAME,), lambda: printed.pull_rows(t)))]
        first_limit = any(not c.stalls_before_limit for c in t.configurations)
        framed = any(v.past_limit for c in t.configurations for _, v in c.stall_at_load)
        note = tr("pattern stalls at: the load factor that stalls the wing at the pattern speed, wings level; stall "
                  "speeds {unit} IAS.", unit=su)
        if first_limit:
            note += " " + tr("! the structure's limit load comes before the stall.")
        if framed:
            note += " " + tr("Framed: a load factor above that configuration's limit load factor.")
        ss = ctx.size(SMALL)
        self.note = fit_lines(NAME, note, fonts.REGULAR, ss, width, NOTE_LINES)
        self.measure = self.measured()


SPEC = BlockSpec(NAME, N_("Pull at the pattern speed: the load factor that stalls the wing"), plan=Pull)
