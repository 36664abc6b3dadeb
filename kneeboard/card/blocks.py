"""The card's text blocks: header, notes, and the caution that closes every page."""

from datetime import date

from kneeboard.card import fonts
from kneeboard.card.draw import GREY, INK, WHITE, Context, DoesNotFit, Draw, fit_lines, weight_text
from kneeboard.card.ops import CAUTION, HEADING, LABEL, SMALL, TITLE, Image
from kneeboard.texts import CAUTION_CARD


def header(ctx: Context, width: float):
    """Registration, model, the weight the card is for, and where the card came from."""
    t = ctx.table
    d = Draw(ctx)
    reg = ctx.size("registration")
    ls, ss, ts = ctx.size(LABEL), ctx.size(SMALL), ctx.size(TITLE)
    right = width
    if ctx.logo_png is not None:
        logo_h = reg * 1.25
        d.ops.append(Image(width - logo_h * 2, -logo_h, logo_h * 2, logo_h, ctx.logo_png))
        right = width - logo_h * 2 - ls
    reg_w = fonts.width(t.registration, fonts.BOLD, reg)
    org = ctx.style.organisation
    if org:
        org_lines = fit_lines("header", org, fonts.BOLD, ls, max(right - reg_w - ls * 2, 1), 2)
        for k, line in enumerate(org_lines):
            d.text(right, -ls * (1.1 + 1.15 * k), line, LABEL, True, "right", GREY)
    elif reg_w > right:
        raise DoesNotFit("header", "the registration is wider than the card")
    d.text(0, -reg * 0.9, t.registration, "registration", True, size=reg)
    y = -reg * 1.15
    for line in fit_lines("header", t.model, fonts.REGULAR, ts, width, 2):
        y -= ts * 1.2
        d.text(0, y, line, TITLE)
    y -= ls * 1.55
    lead = "Computed for "
    d.text(0, y, lead, LABEL)
    x = fonts.width(lead, fonts.REGULAR, ls)
    d.text(x, y, weight_text(t), LABEL, True)
    x += fonts.width(weight_text(t), fonts.BOLD, ls)
    rest = f"  ·  speeds published at {t.reference_weight.text} {t.weight_unit}"
    d.text(x, y, rest, LABEL)
    x += fonts.width(rest, fonts.REGULAR, ls)
    stamp = f"made {ctx.made_on}  ·  profile {ctx.fingerprint}"
    if x + fonts.width(stamp, fonts.REGULAR, ss) + ls > width:
        y -= ss * 1.35
    d.text(width, y, stamp, SMALL, align="right", color=GREY)
    if t.over_max_weight:
        y -= ls * 0.7
        h = ls * 1.6
        d.rect(0, y, width, h, fill=INK)
        d.text(width / 2, y - h + ls * 0.45, f"ABOVE THE MAXIMUM WEIGHT OF {t.max_weight.text} {t.weight_unit}",
               LABEL, True, "centre", WHITE)
        y -= h
    y -= ls * 0.6
    d.line(0, y, width, y, ctx.style.accent, 2.2)
    return d.block("header", -y + ls * 0.6)


def back_header(ctx: Context, width: float):
    """The top of a back page: enough to match it to its front."""
    t = ctx.table
    d = Draw(ctx)
    hs = ctx.size(HEADING)
    d.text(0, -hs * 1.1, f"{t.registration}  ·  {weight_text(t)}  ·  continued", HEADING, True)
    d.line(0, -hs * 1.6, width, -hs * 1.6, ctx.style.accent, 1.5)
    return d.block("back-header", hs * 2.2)


def notes(ctx: Context, width: float):
    d = Draw(ctx)
    hs, ls = ctx.size(HEADING), ctx.size(LABEL)
    d.text(0, -hs, "NOTES", HEADING, True, color=ctx.style.accent)
    y = -hs * 1.3
    for line in fonts.wrap(ctx.table.notes, fonts.REGULAR, ls, width):
        if fonts.width(line, fonts.REGULAR, ls) > width:
            raise DoesNotFit("notes", "a word is wider than the card")
        y -= ls * 1.25
        d.text(0, y, line, LABEL)
    return d.block("notes", -y + ls * 0.6)


def caution(ctx: Context, width: float, page: int, pages: int):
    """The caution, on every page, with a footer line naming the card."""
    t = ctx.table
    d = Draw(ctx)
    cs, ss = ctx.size(CAUTION), ctx.size(SMALL)
    bar = 2.5
    lines = fonts.wrap("CAUTION. " + CAUTION_CARD, fonts.REGULAR, cs, width - bar - 4)
    y = -cs * 0.3
    top = y
    for i, line in enumerate(lines):
        y -= cs * 1.2
        if i == 0:
            d.text(bar + 4, y, "CAUTION.", CAUTION, True)
            d.text(bar + 4 + fonts.width("CAUTION. ", fonts.BOLD, cs), y, line.removeprefix("CAUTION. "), CAUTION)
        else:
            d.text(bar + 4, y, line, CAUTION)
    d.rect(0, top, bar, top - y + cs * 0.35, fill=INK)
    items = [t.registration, weight_text(t), f"profile {ctx.fingerprint}", ctx.made_on]
    side = f"{'front' if page == 1 else 'back'} {page}/{pages}" if pages > 1 else ""
    room = width - (fonts.width(side, fonts.BOLD, ss) + ss if side else 0)
    lines = [""]
    for item in items:
        candidate = f"{lines[-1]}  ·  {item}" if lines[-1] else item
        if lines[-1] and fonts.width(candidate, fonts.REGULAR, ss) > room:
            lines.append(item)
        else:
            lines[-1] = candidate
    if len(lines) > 2 or any(fonts.width(line, fonts.REGULAR, ss) > room for line in lines):
        raise DoesNotFit("caution", "the footer line is wider than the card")
    y -= ss * 0.3
    for k, line in enumerate(lines):
        y -= ss * 1.2
        d.text(0, y, line, SMALL, color=GREY)
        if k == 0 and side:
            d.text(width, y, side, SMALL, True, "right")
    return d.block("caution", -y + ss * 0.3)


def today() -> str:
    return date.today().isoformat()
