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
    made_on: str = ""

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
    """The card's PDF, carrying its printed figures (`card.data`) and its fingerprint in the metadata."""
    return pdf_bytes(card.pages, title=f"kneeboard card {card.registration}",
                     subject=f"{card.registration}, fingerprint {card.fingerprint}", attachments=[attachment(card)],
                     keywords=f"kneeboard card, fingerprint {card.fingerprint}")


def attachment(card: Card) -> tuple[str, bytes, str]:
    """The embedded file that carries a card's printed figures."""
    from kneeboard.card.data import card_json

    return (f"{card.registration}.kneeboard.json", card_json(card),
            f"the figures printed on the card of {card.registration}")


def fleet_pdf(cards: list[Card], sheet: str | None = None) -> bytes:
    """All cards in one PDF: one card page per PDF page, or imposed on `sheet` ("letter" | "a4")."""
    attachments = [attachment(card) for card in cards]
    if sheet is None:
        pages = [page for card in cards for page in card.pages]
        return pdf_bytes(pages, title=f"kneeboard cards ({len(cards)} aircraft)", attachments=attachments)
    from kneeboard.card.sheets import impose

    return pdf_bytes(impose([card.pages for card in cards], sheet),
                     title=f"kneeboard cards ({len(cards)} aircraft) on {sheet} sheets", attachments=attachments)
