"""The caution that closes every page, with a footer line naming the card. It is not a block a style can turn
off: the layout prints it on every page."""

from kneeboard import terms
from kneeboard.card import fonts
from kneeboard.card.draw import GREY, INK, WHITE, Context, DoesNotFit, Draw, weight_text
from kneeboard.card.ops import CAUTION, SMALL
from kneeboard.i18n import Msg, Translator, translator
from kneeboard.texts import CAUTION_CARD

SHORT_WARNINGS = 2  #: warnings of at most this many lines are printed in full on every face, more on the first


def face_label(face: int, faces: int, tr: Translator | None = None) -> str:
    """Which face of the card (or of the card set) this is, as its footer says: "" for a one-face card."""
    tr = tr or translator()
    if faces <= 1:
        return ""
    side = tr("front") if face % 2 == 1 else tr("back")
    if faces <= 2:
        return tr("{side} {face}/{faces}", side=side, face=face, faces=faces)
    return tr("card {card} of {cards} · {side}", card=(face + 1) // 2, cards=(faces + 1) // 2, side=side)


def caution(ctx: Context, width: float, page: int, pages: int):
    """The closing block of face `page` of `pages` (see `_caution`), made once per type size and footer."""
    return ctx.once(("caution", ctx.scale, width, page == 1, face_label(page, pages, ctx.tr)),
                    lambda: _caution(ctx, width, page, pages))


def _caution(ctx: Context, width: float, page: int, pages: int):
    """Every warning about this card, then the caution, on every face, with a footer line naming the card.

    A card never prints silently under a warning: each one is a line beginning with WARNING, in bold, on a
    white-on-black lead so it is not mistaken for a note. The first face carries every warning in full; a later
    face too when they take at most SHORT_WARNINGS lines, else one WARNING line saying how many and where.
    """
    t, tr = ctx.table, ctx.tr
    d = Draw(ctx)
    cs, ss = ctx.size(CAUTION), ctx.size(SMALL)
    bar = 2.5
    y = -cs * 0.3
    lead = tr("WARNING")
    lead_w = fonts.width(lead, fonts.BOLD, cs) + cs * 0.6
    # each line is "WARNING ..." in the card's language (`pipeline.card_warnings`): the lead is drawn apart
    warnings = [fonts.wrap(tr(w).removeprefix(lead).strip(), fonts.BOLD, cs, width - lead_w - cs * 0.4)
                for w in t.warnings]
    if page > 1 and sum(len(lines) for lines in warnings) > SHORT_WARNINGS:
        # the first face carries every warning in full; the others say how many and where, in the same black lead
        where = tr.plural("this card carries a warning: read it on the front of card 1",
                          "this card carries {n} warnings: read them on the front of card 1", len(warnings))
        warnings = [fonts.wrap(where, fonts.BOLD, cs, width - lead_w - cs * 0.4)]
    for wrapped in warnings:
        for k, line in enumerate(wrapped):
            y -= cs * 1.2
            if k == 0:
                d.rect(0, y + cs * 0.95, lead_w, cs * 1.2, fill=INK)
                d.text(cs * 0.3, y, lead, CAUTION, True, color=WHITE)
            d.text(lead_w + cs * 0.4, y, line, CAUTION, True)
        y -= cs * 0.25
    head = tr("CAUTION.")
    lines = fonts.wrap(f"{head} {tr(CAUTION_CARD)}", fonts.REGULAR, cs, width - bar - 4)
    top = y
    for i, line in enumerate(lines):
        y -= cs * 1.2
        if i == 0:
            d.text(bar + 4, y, head, CAUTION, True)
            d.text(bar + 4 + fonts.width(head + " ", fonts.BOLD, cs), y, line.removeprefix(head + " "), CAUTION)
        else:
            d.text(bar + 4, y, line, CAUTION)
    d.rect(0, top, bar, top - y + cs * 0.35, fill=INK)
    items = [t.registration, weight_text(t), f"{tr(terms.FINGERPRINT)} {ctx.fingerprint}", ctx.made_on]
    side = face_label(page, pages, tr)
    room = width - (fonts.width(side, fonts.BOLD, ss) + ss if side else 0)
    lines = [""]
    for item in items:
        candidate = f"{lines[-1]}  ·  {item}" if lines[-1] else item
        if lines[-1] and fonts.width(candidate, fonts.REGULAR, ss) > room:
            lines.append(item)
        else:
            lines[-1] = candidate
    if len(lines) > 3 or any(fonts.width(line, fonts.REGULAR, ss) > room for line in lines):
        raise DoesNotFit("caution", Msg("the footer line is wider than the card"))
    y -= ss * 0.3
    for k, line in enumerate(lines):
        y -= ss * 1.2
        d.text(0, y, line, SMALL, color=GREY)
        if k == 0 and side:
            d.text(width, y, side, SMALL, True, "right")
    return d.block("caution", -y + ss * 0.3)
