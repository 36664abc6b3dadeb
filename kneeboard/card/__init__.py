"""Cockpit cards: the table builder's figures laid out on a page and drawn into vector PDF.

`layout_card` places the blocks (one layout); `card_pdf` and `fleet_pdf` draw it (one renderer). The way from a
profile to a card is `kneeboard.pipeline`, which the command line and the app both call.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING

if TYPE_CHECKING:
    from kneeboard.card.layout import CardLayout
    from kneeboard.card.ops import Figure, Page
    from kneeboard.tables import CardTable

__all__ = ["Card", "CardStyle", "LayoutError", "card_pdf", "fleet_pdf", "layout_card"]

#: Names this package offers, each imported at first use: importing `kneeboard.card.style` or `.ops` (a check,
#: a table, the app's first frame) must not load the layout, every block and reportlab.
_LAZY = {"CardLayout": "layout", "LayoutError": "layout", "layout_card": "layout", "Figure": "ops", "Page": "ops",
         "pdf_bytes": "render", "CardStyle": "style"}


def __getattr__(name: str):
    if name in _LAZY:
        import importlib

        return getattr(importlib.import_module(f"kneeboard.card.{_LAZY[name]}"), name)
    raise AttributeError(f"module 'kneeboard.card' has no attribute {name!r}")


@dataclass(frozen=True)
class Card:
    registration: str
    table: CardTable
    layout: CardLayout
    fingerprint: str
    made_on: str = ""
    weight_given: str | None = None  #: the weight this card was made for when given for it ("1985 lb"), not the
    #: profile's own: `compare` makes the card again at that weight

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
    from kneeboard.card.render import pdf_bytes

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
    from kneeboard.card.render import pdf_bytes

    attachments = [attachment(card) for card in cards]
    if sheet is None:
        pages = [page for card in cards for page in card.pages]
        return pdf_bytes(pages, title=f"kneeboard cards ({len(cards)} aircraft)", attachments=attachments)
    from kneeboard.card.sheets import impose

    return pdf_bytes(impose([card.pages for card in cards], sheet, cards[0].table.language),
                     title=f"kneeboard cards ({len(cards)} aircraft) on {sheet} sheets", attachments=attachments)
