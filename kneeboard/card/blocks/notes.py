"""Notes: the profile's own words, wrapped to the column; a long note continues line by line on the next face."""

from kneeboard.card import fonts
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import Context, DoesNotFit, Draw, Measure, Piece, Plan, Section
from kneeboard.card.ops import HEADING, LABEL
from kneeboard.i18n import N_, Msg

NAME = "notes"
TITLE = N_("NOTES")


class Notes(Plan):
    name = NAME

    def __init__(self, ctx: Context, width: float):
        self.ctx = ctx
        self.hs, self.ls = hs, ls = ctx.size(HEADING), ctx.size(LABEL)
        self.lines = fonts.wrap(ctx.table.notes, fonts.REGULAR, ls, width)
        if any(fonts.width(line, fonts.REGULAR, ls) > width for line in self.lines):
            raise DoesNotFit(NAME, Msg("a word is wider than the card"))
        self.measure = Measure((Section(0.0, (ls * 1.25,) * len(self.lines)),), lead=hs * 1.3, foot=ls * 0.6,
                               again=hs * 1.3)

    def draw(self, piece: Piece):
        d = Draw(self.ctx)
        hs, ls = self.hs, self.ls
        y = 0.0
        if piece.lead or piece.again:
            tr = self.ctx.tr
            d.text(0, -hs, tr(TITLE) if piece.lead else tr("{title} (continued)", title=tr(TITLE)), HEADING, True,
                   color=self.ctx.style.accent)
            y = -hs * 1.3
        for line in self.lines[piece.start:piece.stop]:
            y -= ls * 1.25
            d.text(0, y, line, LABEL)
        if piece.foot:
            y -= ls * 0.6
        return d.block(NAME, -y)


SPEC = BlockSpec(NAME, N_("Notes"), plan=Notes, applies=lambda table: bool(table.notes.strip()))
