"""Does the organization's name fit the header of a style's card? Measured with the card's own fonts and type.

The style reader holds the name to the text rules only (it loads no font); whatever makes a card (the card
command, compare, the app) fits the name here, so a name that cannot print in two lines beside the registration
(and the logo) on the smallest type the layout may reach is named at `organization` before any card is drawn.
"""

from pathlib import Path

from kneeboard.card import fonts
from kneeboard.card.draw import BASE_SIZE, FIGURE, LABEL, MIN_TEXT, REGISTRATION, SECONDARY
from kneeboard.card.geometry import page_box
from kneeboard.card.layout import SHRINK, card_name, min_figure_size
from kneeboard.card.style import CardStyle
from kneeboard.i18n import Msg
from kneeboard.problems import Problem

#: The registration the organization's room is measured beside: ten characters, longer than most registrations.
REGISTRATION_SAMPLE = "XX-XXXXXXX"


def organization_room(size: str, landscape: bool = False, binding: str = "none", logo: bool = False) -> float:
    """Width each of the organization's two lines may take in the header of this card [pt].

    Measured as the header places it, at the smallest type the layout may reach on this card:
    the content width, less the logo and the sample registration beside it.
    """
    scale = min_figure_size(size) / (BASE_SIZE[FIGURE] * SECONDARY) / SHRINK  # the last scale tried, or above
    reg, label = max(BASE_SIZE[REGISTRATION] * scale, MIN_TEXT), max(BASE_SIZE[LABEL] * scale, MIN_TEXT)
    width = page_box(size, landscape, binding).content_width
    if logo:
        width -= reg * 1.25 * 2 + label
    return width - fonts.width(REGISTRATION_SAMPLE, fonts.BOLD, reg) - 2 * label


def organization_problems(style: CardStyle) -> list[Problem]:
    """The problem of an organization too wide for the style's card; call it again after changing the size."""
    text = style.organization
    if not text:
        return []
    room = organization_room(style.size, style.landscape, style.binding, style.logo is not None)
    lines = fonts.wrap(text, fonts.BOLD, MIN_TEXT, max(room, 1.0), hyphenate=False)
    if len(lines) <= 2 and all(fonts.width(line, fonts.BOLD, MIN_TEXT) <= room for line in lines):
        return []
    card = card_name(style)
    if style.binding != "none":
        card = Msg("{card} (bound {binding})", card=card, binding=style.binding)  # the style's words: "left", "top"
    room_text = f"{max(room, 0):.0f}"
    if style.logo is not None:
        message = Msg("does not fit in two lines of {room} pt beside the registration and logo on a {card} card, "
                      "even at the smallest type", room=room_text, card=card)
    else:
        message = Msg("does not fit in two lines of {room} pt beside the registration on a {card} card, even at the "
                      "smallest type", room=room_text, card=card)
    return [Problem("organization", message, Msg("a shorter name, or a larger card"), text)]


def fitted(style: CardStyle | None, problems, where: str = "") -> tuple[CardStyle | None, list[Problem]]:
    """A style read for making cards: None, with the problem named in the file `where`, when its organization does
    not fit its card; otherwise as it is."""
    problems = list(problems)
    if style is None:
        return None, problems
    too_wide = [p.in_file(where) for p in organization_problems(style)] if where else organization_problems(style)
    return (None if too_wide else style), problems + too_wide


def load_card_style(path: Path | None = None) -> tuple[CardStyle | None, list[Problem]]:
    """`inputs.styles.load_style` and the organization's fit: a style file as a card will use it."""
    from kneeboard.inputs.styles import load_style

    style, problems = load_style(path)
    return fitted(style, problems, str(style.source) if style is not None and style.source else "")
