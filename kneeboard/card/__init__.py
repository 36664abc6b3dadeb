"""Cockpit cards: the table builder's figures laid out on a page and drawn into vector PDF.

`build_card` makes the layout of one aircraft; `card_pdf` and `fleet_pdf` draw it. The command
line and the app both call these, so there is one layout and one renderer.
"""

from dataclasses import dataclass

from kneeboard.card.layout import CardLayout, LayoutError, layout_card
from kneeboard.card.logo import logo_png
from kneeboard.card.ops import Page
from kneeboard.card.render import pdf_bytes
from kneeboard.card.style import CardStyle
from kneeboard.profile import Profile
from kneeboard.tables import CardTable, build

__all__ = ["Card", "CardStyle", "LayoutError", "build_card", "card_pdf", "fleet_pdf"]


@dataclass(frozen=True)
class Card:
    registration: str
    table: CardTable
    layout: CardLayout
    fingerprint: str

    @property
    def pages(self) -> tuple[Page, ...]:
        return self.layout.pages


def styled_profile(profile: Profile, style: CardStyle) -> Profile:
    """The profile with the style's overrides of bank angles and units applied."""
    changes = {}
    if style.bank_angles_deg is not None:
        changes["bank_angles_deg"] = style.bank_angles_deg
    if style.speed_unit is not None:
        changes["speed_unit"] = style.speed_unit
        if style.distance_unit is None and style.speed_unit == "km/h":
            changes["distance_unit"] = "m"
    if style.distance_unit is not None:
        changes["distance_unit"] = style.distance_unit
    return profile.with_card(**changes) if changes else profile


def build_card(profile: Profile, style: CardStyle, fingerprint: str, weight: float | None = None,
               made_on: str | None = None, table: CardTable | None = None) -> Card:
    """Lay out the card of `profile` at `weight` [kg] (default the profile's); raises LayoutError.

    `table` may be passed when the caller already built it for this profile, style and weight.
    """
    from kneeboard.card.blocks import today

    if table is None:
        table = build(styled_profile(profile, style), weight)
    logo = style.logo_png if style.logo_png is not None else logo_png(style.logo)  # checked when the style loaded
    layout = layout_card(table, style, fingerprint, made_on or today(), logo)
    return Card(table.registration, table, layout, fingerprint)


def card_pdf(card: Card) -> bytes:
    return pdf_bytes(card.pages, title=f"kneeboard card {card.registration}",
                     subject=f"{card.registration}, profile {card.fingerprint}")


def fleet_pdf(cards: list[Card], sheet: str | None = None) -> bytes:
    """All cards in one PDF: one card page per PDF page, or imposed on `sheet` ("letter" | "a4")."""
    if sheet is None:
        pages = [page for card in cards for page in card.pages]
        return pdf_bytes(pages, title=f"kneeboard cards ({len(cards)} aircraft)")
    from kneeboard.card.sheets import impose

    return pdf_bytes(impose([card.pages for card in cards], sheet),
                     title=f"kneeboard cards ({len(cards)} aircraft) on {sheet} sheets")

