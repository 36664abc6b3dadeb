"""Structural limits and, per configuration, the banks where the buffer and the margin run out.

The limit bank is printed as what it is: the bank at which a level turn loads the structure to its limit, a
structural figure, not a bank to fly. A normal-category card says that the category's operations end at 60 degrees
of bank (14 CFR 23.3(a) before amendment 23-64, steep turns of not more than 60 degrees; secondary sources, the
text itself not retrieved).
"""

from kneeboard import terms
from kneeboard.card.blocks.grid import NO_VALUE, Cell, ColumnHeads, Heading, NamedRow
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import Context, Draw, Measure, Piece, Plan, Section, figure, weight_text
from kneeboard.card.ops import HIGHER_IS_WORSE, LABEL, LOWER_IS_WORSE, SMALL

NAME = "limits"
NORMAL_CATEGORY_BANK = 60  #: [deg] 14 CFR 23.3(a) before amendment 23-64


class Limits(Plan):
    name = NAME

    def __init__(self, ctx: Context, width: float):
        t = ctx.table
        self.ctx = ctx
        su = t.speed_unit
        detail = (f"Structure: limit load factor {t.limit_load_factor.text} g; a level turn reaches it at "
                  f"{t.limit_bank.text}° (limit bank: a structural figure, not a bank to fly).")
        if t.category == "normal":
            detail += f" Normal category: no bank beyond {NORMAL_CATEGORY_BANK}°."
        if t.maneuvering_speed:
            detail += f" VA at this weight {t.maneuvering_speed.text} {su} IAS."
        self.heading = Heading(ctx, width, f"LIMITS AT {weight_text(t)}", detail,
                               (figure(terms.LIMIT_LOAD, t.limit_load_factor, "g", LOWER_IS_WORSE),
                                figure(terms.LIMIT_BANK, t.limit_bank, "°", LOWER_IS_WORSE),
                                figure(terms.VA, t.maneuvering_speed, su)))
        names = ["", f"stall {su} IAS", f"pattern {su} IAS", "buffer bank", "zero-margin bank", f"VFE {su} IAS",
                 "limit g / bank"]
        name_w = width * 0.2
        weights = (1.0, 1.0, 1.0, 1.0, 1.0, 1.45)  # the limit column holds "2.0/60°"
        unit = (width - name_w) / sum(weights)
        columns, x = [(0, name_w)], name_w
        for weight in weights:
            columns.append((x, unit * weight))
            x += unit * weight
        self.heads = ColumnHeads(ctx, NAME, names, columns, width)
        def cells():  # the same at every type size
            out = []
            for c in t.configurations:
                limit = f"{c.limit_load_factor.text}/{c.limit_bank.text}°"
                row = [
                    Cell(c.stall_speed.text, figure=figure(terms.label(c.name, terms.STALL), c.stall_speed, su,
                                                           HIGHER_IS_WORSE)),
                    Cell(c.pattern_speed.text, bold=True,
                         figure=figure(terms.label(c.name, terms.PATTERN), c.pattern_speed, su)),
                    Cell(f"{c.buffer_bank.text}°", bold=True,
                         figure=figure(terms.label(c.name, terms.BUFFER_BANK), c.buffer_bank, "°", LOWER_IS_WORSE))
                    if c.buffer_bank else Cell(NO_VALUE, role=LABEL),
                    Cell(f"{c.zero_margin_bank.text}°", bold=True,
                         figure=figure(terms.label(c.name, terms.ZERO_MARGIN_BANK), c.zero_margin_bank, "°",
                                       LOWER_IS_WORSE)),
                    Cell(c.flap_limit_speed.text,
                         figure=figure(terms.label(c.name, terms.FLAP_LIMIT), c.flap_limit_speed, su))
                    if c.flap_limit_speed else Cell(NO_VALUE, role=LABEL),
                    Cell(limit, figure=figure(terms.label(c.name, terms.LIMIT_LOAD), f"{c.limit_load_factor.text} g / "
                                              f"{c.limit_bank.text}°", worse=None)),
                ]
                out.append(row)
            return out

        self.rows = [NamedRow(ctx, NAME, c.name, name_w, columns[1:], row)
                     for c, row in zip(t.configurations, ctx.once((NAME,), cells))]
        self.measure = Measure((Section(self.heads.height, tuple(r.height for r in self.rows)),),
                               lead=self.heading.height, foot=ctx.size(SMALL) * 0.8, again=self.heading.again)

    def draw(self, piece: Piece):
        d = Draw(self.ctx)
        y = self.heading.draw(d, 0.0) if piece.lead else self.heading.draw_again(d, 0.0) if piece.again else 0.0
        y = self.heads.draw(d, y)
        for row in self.rows[piece.start:piece.stop]:
            y = row.draw(d, y)
        if piece.foot:
            y -= self.ctx.size(SMALL) * 0.8
        return d.block(NAME, -y)


SPEC = BlockSpec(NAME, "Limits: load factor, VA, buffer and zero-margin banks", plan=Limits)
