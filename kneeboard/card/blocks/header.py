"""The header: registration, model, the weight the card is for, and where the card came from; and the top of a
back page, enough to match it to its front."""

from kneeboard import terms
from kneeboard.card import fonts
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import GREY, INK, WHITE, Context, DoesNotFit, Draw, figure, fit_lines, weight_text
from kneeboard.card.ops import HEADING, LABEL, SMALL, TITLE, Image

NAME = "header"


def draw(ctx: Context, width: float, _height=None):
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
    org = ctx.style.organization
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
    lead = "card weight "
    d.text(0, y, lead, LABEL)
    x = fonts.width(lead, fonts.REGULAR, ls)
    d.text(x, y, weight_text(t), LABEL, True, figures=figure(terms.CARD_WEIGHT, weight_text(t)))
    x += fonts.width(weight_text(t), fonts.BOLD, ls)
    rest = f"  ·  reference weight {t.reference_weight.text} {t.weight_unit}"
    d.text(x, y, rest, LABEL, figures=figure(terms.REFERENCE_WEIGHT, t.reference_weight, t.weight_unit))
    x += fonts.width(rest, fonts.REGULAR, ls)
    stamp = f"made {ctx.made_on}  ·  fingerprint {ctx.fingerprint}"
    if x + fonts.width(stamp, fonts.REGULAR, ss) + ls > width:
        y -= ss * 1.35
    d.text(width, y, stamp, SMALL, align="right", color=GREY)
    if t.over_max_weight:
        y -= ls * 0.7
        h = ls * 1.6
        d.rect(0, y, width, h, fill=INK)
        d.text(width / 2, y - h + ls * 0.45, f"ABOVE THE MAXIMUM WEIGHT OF {t.max_weight.text} {t.weight_unit}",
               LABEL, True, "centre", WHITE,
               figures=figure(terms.MAX_WEIGHT_EXCEEDED, t.max_weight, t.weight_unit))
        y -= h
    y -= ls * 0.6
    d.line(0, y, width, y, ctx.style.accent, 2.2)
    return d.block(NAME, -y + ls * 0.6)


def back_header(ctx: Context, width: float):
    """The top of a back page: enough to match it to its front."""
    t = ctx.table
    d = Draw(ctx)
    hs = ctx.size(HEADING)
    d.text(0, -hs * 1.1, f"{t.registration}  ·  {weight_text(t)}  ·  continued", HEADING, True)
    d.line(0, -hs * 1.6, width, -hs * 1.6, ctx.style.accent, 1.5)
    return d.block("back-header", hs * 2.2)


SPEC = BlockSpec(NAME, "Header: registration, model, weights, date, fingerprint", draw, front_only=True,
                   full_width=True)
