"""Cockpit cards: the table builder's figures laid out on a page and drawn into vector PDF.

`layout_card` places the blocks (one layout); `card_pdf` and `fleet_pdf` draw it (one renderer). The way from a
profile to a card is `kneeboard.pipeline`, which the command line and the app both call.
"""

from dataclasses import dataclass

from kneeboard.card.layout import CardLayout, LayoutError, layout_card
from kneeboard.card.ops import Figure, Page
from kneeboard.card.render import pdf_bytes
from kneeboard.card.style import CardStyle
from kneeboard.tables import CardTable

__all__ = ["Card", "CardStyle", "LayoutError", "card_pdf", "fleet_pdf", "layout_card"]


@dataclass(frozen=True)
class Card:
    registration: str
    table: CardTable
    layout: CardLayout
    fingerprint: str

    @property
    def pages(self) -> tuple[Page, ...]:
        return self.layout.pages

    def figures(self) -> dict[str, Figure]:
        """Every printed figure of the card by its identity, in print order (a figure printed twice: once)."""
        found: dict[str, Figure] = {}
        for page in self.pages:
            for f in page.figures():
                found.setdefault(f.identity, f)
        return found


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
