"""Notes: the profile's own words, wrapped to the column."""

from kneeboard.card import fonts
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import Context, DoesNotFit, Draw
from kneeboard.card.ops import HEADING, LABEL

NAME = "notes"


def draw(ctx: Context, width: float, _height=None):
    d = Draw(ctx)
    hs, ls = ctx.size(HEADING), ctx.size(LABEL)
    d.text(0, -hs, "NOTES", HEADING, True, color=ctx.style.accent)
    y = -hs * 1.3
    for line in fonts.wrap(ctx.table.notes, fonts.REGULAR, ls, width):
        if fonts.width(line, fonts.REGULAR, ls) > width:
            raise DoesNotFit(NAME, "a word is wider than the card")
        y -= ls * 1.25
        d.text(0, y, line, LABEL)
    return d.block(NAME, -y + ls * 0.6)


SPEC = BlockSpec(NAME, "Notes", draw, applies=lambda table: bool(table.notes.strip()))
