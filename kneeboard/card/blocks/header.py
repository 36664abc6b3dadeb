"""The header: registration, model, the weight the card is for, and where the card came from; and the top of a
back page, enough to match it to its front."""

from kneeboard import printed, terms
from kneeboard.card import fonts
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import GREY, INK, WHITE, Context, DoesNotFit, Draw, Measure, Piece, Plan, Section, fit_lines
from kneeboard.card.ops import HEADING, LABEL, SMALL, TITLE, Image
from kneeboard.i18n import N_, Msg
from kneeboard.printed import weight_text

NAME = "header"


class Header(Plan):
    """The header planned: the registration's size (smaller only when it would not fit), the organization beside it
    (or above it when there is no room beside), the model's lines, and where the date and fingerprint go."""

    name = NAME

    def __init__(self, ctx: Context, width: float):
        t = ctx.table
        self.ctx, self.width = ctx, width
        ls, ss, ts = ctx.size(LABEL), ctx.size(SMALL), ctx.size(TITLE)
        reg = ctx.size("registration")
        self.logo_h = reg * 1.25 if ctx.logo_png is not None else 0.0
        right = width - self.logo_h * 2 - ls if ctx.logo_png is not None else width
        org = ctx.style.organization
        self.org_lines, self.org_above = [], []
        while True:  # the registration at its size, smaller only when it and the organization do not fit
            reg_w = fonts.width(t.registration, fonts.BOLD, reg)
            try:
                if org:
                    self.org_lines = fit_lines("header", org, fonts.BOLD, ls, max(right - reg_w - ls * 2, 1), 2)
                elif reg_w > right:
                    raise DoesNotFit("header", Msg("the registration is wider than the card"))
                break
            except DoesNotFit:
                if reg * 0.9 >= ts:
                    reg *= 0.9
                    continue
                if org:  # no room beside the registration even so: the organization goes above it
                    self.org_lines, self.org_above = [], fit_lines("header", org, fonts.BOLD, ls, right, 2)
                if fonts.width(t.registration, fonts.BOLD, reg) > width:
                    raise DoesNotFit("header", Msg("the registration is wider than the card")) from None
                break
        self.reg, self.right = reg, right
        self.top = ls * 1.15 * len(self.org_above)  # room above the registration for an organization placed there
        y = -self.top - reg * 1.15
        self.model = fit_lines("header", t.model, fonts.REGULAR, ts, width, 3)
        y -= ts * 1.2 * len(self.model)
        y -= ls * 1.55
        self.weight_y = y
        x = fonts.width(self._lead(), fonts.REGULAR, ls) + fonts.width(weight_text(t), fonts.BOLD, ls)
        x += fonts.width(self._reference(), fonts.REGULAR, ls)
        if x + fonts.width(self._stamp(), fonts.REGULAR, ss) + ls > width:
            y -= ss * 1.35
        self.stamp_y = y
        if t.over_max_weight:
            y -= ls * 0.7 + ls * 1.6
        y -= ls * 0.6
        self.rule_y = y
        self.measure = Measure((Section(-y + ls * 0.6),))

    def _lead(self) -> str:
        return self.ctx.tr(terms.CARD_WEIGHT) + " "

    def _reference(self) -> str:
        t, tr = self.ctx.table, self.ctx.tr
        return f"  ·  {tr(terms.REFERENCE_WEIGHT)} {tr.number(t.reference_weight.text)} {t.weight_unit}"

    def _stamp(self) -> str:
        tr = self.ctx.tr
        made = tr("made {date}", date=self.ctx.made_on)  # ISO 8601 in every language
        return f"{made}  ·  {tr(terms.FINGERPRINT)} {self.ctx.fingerprint}"

    def draw(self, piece: Piece):
        ctx, width = self.ctx, self.width
        t = ctx.table
        d = Draw(ctx)
        ls, ts = ctx.size(LABEL), ctx.size(TITLE)
        reg, right, top = self.reg, self.right, -self.top
        if ctx.logo_png is not None:
            logo_h = self.logo_h
            d.ops.append(Image(width - logo_h * 2, -logo_h, logo_h * 2, logo_h, ctx.logo_png))
        for k, line in enumerate(self.org_above):
            d.text(right, -ls * (1.1 + 1.15 * k), line, LABEL, True, "right", GREY)
        for k, line in enumerate(self.org_lines):
            d.text(right, top - ls * (1.1 + 1.15 * k), line, LABEL, True, "right", GREY)
        d.text(0, top - reg * 0.9, t.registration, "registration", True, size=reg)
        y = top - reg * 1.15
        for line in self.model:
            y -= ts * 1.2
            d.text(0, y, line, TITLE)
        y = self.weight_y
        lead = self._lead()
        d.text(0, y, lead, LABEL)
        x = fonts.width(lead, fonts.REGULAR, ls)
        tags = printed.header(t)
        d.text(x, y, weight_text(t), LABEL, True, figures=tags["weight"])
        x += fonts.width(weight_text(t), fonts.BOLD, ls)
        rest = self._reference()
        d.text(x, y, rest, LABEL, figures=tags["reference"])
        y = self.stamp_y
        d.text(width, y, self._stamp(), SMALL, align="right", color=GREY)
        if t.over_max_weight:
            y -= ls * 0.7
            h = ls * 1.6
            d.rect(0, y, width, h, fill=INK)
            most = f"{ctx.tr.number(t.max_weight.text)} {t.weight_unit}"
            above = ctx.tr("ABOVE THE MAXIMUM WEIGHT OF {weight}", weight=most)
            d.text(width / 2, y - h + ls * 0.45, above, LABEL, True, "centre", WHITE, figures=tags["over"])
        d.line(0, self.rule_y, width, self.rule_y, ctx.style.accent, 2.2)
        return d.block(NAME, -self.rule_y + ls * 0.6)


def back_header_height(ctx: Context) -> float:
    return ctx.size(HEADING) * 2.2


def back_header(ctx: Context, width: float, card: str = ""):
    """The top of a face after the first: enough to match it to its front (`card`: "card 2 of 2" in a set)."""
    t = ctx.table
    d = Draw(ctx)
    hs = ctx.size(HEADING)
    card = ctx.tr(card) if card else ctx.tr("continued")
    text = f"{t.registration}  ·  {weight_text(t)}  ·  {card}"
    if fonts.width(text, fonts.BOLD, hs) > width:
        text = f"{t.registration}  ·  {card}"
    d.text(0, -hs * 1.1, text, HEADING, True)
    d.line(0, -hs * 1.6, width, -hs * 1.6, ctx.style.accent, 1.5)
    return d.block("back-header", back_header_height(ctx))


SPEC = BlockSpec(NAME, N_("Header: registration, model, weights, date, fingerprint"), plan=Header,
                 full_width=True)
