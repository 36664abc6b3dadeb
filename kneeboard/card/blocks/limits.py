"""Structural limits and, per configuration, the banks where the buffer and the margin run out.

The limit bank is printed as what it is: the bank at which a level turn loads the structure to its limit, a
structural figure, not a bank to fly. A normal-category card says that the category's operations end at 60 degrees
of bank (14 CFR 23.3(a) before amendment 23-64, steep turns of not more than 60 degrees; secondary sources, the
text itself not retrieved).
"""

from kneeboard import printed
from kneeboard.card import fonts
from kneeboard.card.blocks.grid import NOTE_LINES, ColumnHeads, Heading, NamedRow, name_widths
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.blocks.table_plan import NamedTable
from kneeboard.card.draw import INK, Context, DoesNotFit, fit_lines, weight_text
from kneeboard.card.ops import SMALL
from kneeboard.i18n import N_, Msg
from kneeboard.tables import LIMIT_MARK

NAME = "limits"
PAST_NOTE = Msg("{mark}60° framed: the bank lies at or past that configuration's own limit bank; its limit is "
                "printed in its place, a structural figure, not a bank to fly.", mark=LIMIT_MARK)
NORMAL_CATEGORY_BANK = 60  #: [deg] 14 CFR 23.3(a) before amendment 23-64


class Limits(NamedTable):
    name = NAME
    note_color = INK

    def __init__(self, ctx: Context, width: float):
        t, tr = ctx.table, ctx.tr
        self.ctx = ctx
        su = t.speed_unit
        detail = tr("Structure: limit load factor {load} g; a level turn reaches it at {bank}° (limit bank: a "
                    "structural figure, not a bank to fly).", load=t.limit_load_factor, bank=t.limit_bank)
        if t.category == "normal":
            detail += " " + tr("Normal category: no bank beyond {bank}°.", bank=NORMAL_CATEGORY_BANK)
        if t.maneuvering_speed:
            detail += " " + tr("VA at this weight {speed} {unit} IAS.", speed=t.maneuvering_speed, unit=su)
        self.heading = Heading(ctx, width, tr("LIMITS AT {weight}", weight=weight_text(t)), detail,
                               printed.limits_heading(t))
        # the heads of narrow columns: the terms' words in English, a language may abbreviate them there
        names = ["", tr("stall {unit} IAS", unit=su), tr("pattern {unit} IAS", unit=su),
                 tr.pgettext("column head", "buffer bank"), tr.pgettext("column head", "zero-margin bank"),
                 tr("VFE {unit} IAS", unit=su), tr("limit g / bank")]
        cells = ctx.once((NAME,), lambda: printed.limit_rows(t))
        widths = name_widths(ctx, width, t.configurations)
        for k, name_w in enumerate(widths):
            # names as wide as their longest word where the heads leave room; at a fifth of the table at last,
            # where a word longer than that breaks with a hyphen rather than leave the card unmade
            try:
                self.heads, self.rows = self._table(ctx, width, names, name_w, cells, k == len(widths) - 1)
                break
            except DoesNotFit:
                if k == len(widths) - 1:
                    raise
        ss = ctx.size(SMALL)
        past = any(b is not None and b.past_limit
                   for c in t.configurations for b in (c.buffer_bank, c.zero_margin_bank))
        self.note = fit_lines(NAME, tr(PAST_NOTE), fonts.REGULAR, ss, width, NOTE_LINES) if past else []
        self.measure = self.measured()

    @staticmethod
    def _table(ctx, width: float, names, name_w: float, cells, last: bool):
        weights = (1.0, 1.0, 1.0, 1.0, 1.0, 1.45)  # the limit column holds "2.0/60°"
        unit = (width - name_w) / sum(weights)
        columns, x = [(0, name_w)], name_w
        for weight in weights:
            columns.append((x, unit * weight))
            x += unit * weight
        heads = ColumnHeads(ctx, NAME, names, columns, width)
        rows = [NamedRow(ctx, NAME, c.name, name_w, columns[1:], row, hyphenate=last)
                for c, row in zip(ctx.table.configurations, cells)]
        return heads, rows


SPEC = BlockSpec(NAME, N_("Limits: load factor, VA, buffer and zero-margin banks"), plan=Limits)
