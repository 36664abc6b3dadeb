"""CardStyle: how a school's cards look, as a plain value.

A style file is read by `kneeboard.inputs.styles` (its keys declared in `kneeboard.inputs.style_keys`); the name
of the organization is fitted to the card by `kneeboard.card.organization`, the logo drawn by
`kneeboard.card.logo` when a card is drawn. This module imports none of them: a check or a table that reads a style
loads no block, no font, no reportlab and no Qt.
"""

from dataclasses import dataclass, field, replace
from pathlib import Path


@dataclass(frozen=True)
class CardStyle:
    organization: str = ""
    logo: Path | None = None  #: resolved path of a PNG or SVG inside the style's folder
    accent: str = "#1B5E8C"  #: "#RRGGBB"
    font_scale: float = 1.0
    size: str = "a5"
    landscape: bool = False
    binding: str = "none"  #: "none" | "left" | "top": a wider edge for a punch or ring binder
    front: tuple[str, ...] | None = None  #: blocks in order (None: every registered block); overflow goes back
    back: tuple[str, ...] = ()  #: blocks always printed on a back page
    max_faces: int | None = None  #: the most faces a card may take (two a card); None: as many as it needs
    bank_angles_deg: tuple[float, ...] | None = None  #: overrides the profiles' when set
    speed_unit: str | None = None
    distance_unit: str | None = None
    language: str | None = None  #: the language of the cards' words (`kneeboard.i18n.LANGUAGES`); overrides the
    #: profiles' when set
    source: Path | None = field(default=None, compare=False)
    #: the logo file's bytes as read and checked with the style (`kneeboard.card.logocheck`); a card draws them
    #: (`kneeboard.card.logo.drawn_logo`), never the file again. None without a logo, or for a style built in code
    #: (whose `logo` is then read when a card is drawn)
    logo_bytes: bytes | None = field(default=None, compare=False, repr=False)

    def with_changes(self, **changes) -> "CardStyle":
        return replace(self, **changes)
