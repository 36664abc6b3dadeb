"""Every key of a card style file (`*.style.toml`), declared once.

One row per key: its kind, unit, bounds or options, default and where the default comes from, and the label and
help the style dialog shows. The reader (`kneeboard.inputs.styles`), the style dialog's inputs and the command
line's choices that mirror a style key (`--size`, `--speed-unit`, `--language`...) are all made from these rows.

Nothing here loads the units library, the fonts, reportlab or Qt: the command line builds its choices from it.
"""

from dataclasses import dataclass

from kneeboard.card.geometry import CARD_SIZES
from kneeboard.i18n import LANGUAGES, Msg, Num
from kneeboard.unit_names import DISTANCE_UNITS, SPEED_UNITS

# kinds of value
VERSION = "version"  #: the style format's version, a whole number
TEXT = "text"  #: one line of text, held to the profile's text rules
FILE = "file"  #: a file name in the style's folder (the logo)
COLOUR = "colour"  #: "#RRGGBB"
NUMBER = "number"  #: a number within `bounds`
COUNT = "count"  #: a whole number within `bounds`, or absent
CHOICE = "choice"  #: one of `options`
BLOCKS = "blocks"  #: a list of block names (`kneeboard.card.block_names`)
BANKS = "banks"  #: a list of bank angles (`kneeboard.inputs.banks`)

STYLE_VERSION = 1
MAX_FACES = 24  #: the most faces a style may allow (twelve cards)
MAX_ORGANIZATION = 60  #: characters
MAX_LOGO_NAME = 200  #: characters of the logo's file name as written
LEGACY_ORGANIZATION = "organisation"  #: the key's British spelling, accepted with a warning
BINDINGS = ("none", "left", "top")
ORIENTATIONS = ("portrait", "landscape")


@dataclass(frozen=True)
class StyleKey:
    """One key of a style file."""

    key: str  #: as the file writes it
    kind: str
    default: object  #: what a file without the key gets (None: the profiles' own setting, or nothing)
    source: str  #: where the default comes from
    label: str = ""  #: the style dialog's label ("" : not edited in the dialog)
    help: str = ""  #: what the key does, for the dialog's tooltip and the messages
    options: tuple[str, ...] = ()  #: CHOICE: the values accepted
    option_labels: tuple[tuple[str, str], ...] = ()  #: CHOICE: how the dialog shows an option, when not as written
    bounds: tuple[float, float] | None = None  #: NUMBER, COUNT: least and greatest
    step: float = 0.0  #: NUMBER: the dialog's step
    unit: str = ""  #: the unit of a number or of a list's numbers
    limit: int = 0  #: TEXT, FILE: characters
    refusal: str = Msg("is not accepted")  #: CHOICE: what a value outside the options is told (a Msg)

    def shown(self, option: str) -> str:
        """An option as the dialog shows it."""
        return dict(self.option_labels).get(option, option)

    @property
    def expected(self) -> str:
        """What would do, as a problem says it (a `Msg`, told in the user's language; a choice's options and the
        format's key as the file writes them)."""
        if self.kind == CHOICE:
            return " | ".join(self.options)
        least, most = (f"{b:g}" for b in self.bounds) if self.bounds else ("", "")
        if self.kind == NUMBER:
            return Msg("a number from {least} to {most}", least=Num(least), most=Num(most))
        if self.kind == COUNT:
            return Msg("a whole number of faces from {least} to {most} (two to a card)", least=least, most=most)
        if self.kind == TEXT:
            return Msg("text on one line of up to {limit} characters", limit=str(self.limit))
        if self.kind == COLOUR:
            return Msg('a colour as "#RRGGBB", e.g. "#1B5E8C"')
        if self.kind == FILE:
            return Msg("a PNG or SVG file in the style's folder or below it")
        if self.kind == VERSION:
            return f"style = {STYLE_VERSION}"
        return ""


KEYS = (
    StyleKey("style", VERSION, STYLE_VERSION, "kneeboard's style format",
             help="the style format this file is written in"),
    StyleKey("organization", TEXT, "", "none: a card names no organization unless a style says so",
             "Organization", "printed at the top right of every card, on at most two lines beside the registration",
             limit=MAX_ORGANIZATION),
    StyleKey("logo", FILE, None, "none", "Logo",
             "a PNG or SVG file in the fleet folder, e.g. logo.png, printed beside the organization",
             limit=MAX_LOGO_NAME),
    StyleKey("accent", COLOUR, "#1B5E8C", "kneeboard's own colour (every mark also differs in shape or pattern, for "
             "black-and-white printing)", "Accent colour", "the colour of headings and marks"),
    StyleKey("font_scale", NUMBER, 1.0, "the card size's own type", "Type size",
             "larger or smaller type; the layout never goes below 7 pt, nor table figures below 10 pt on A5",
             bounds=(0.7, 1.6), step=0.05),
    StyleKey("size", CHOICE, "a5", "common practice: A5 fits a kneeboard clip", "Card size",
             "the card's paper size, portrait", options=tuple(CARD_SIZES),
             option_labels=(("a5", "A5 (148 x 210 mm)"), ("half-letter", "Half letter (5.5 x 8.5 in)"),
                            ("5x8", "5 x 8 in"), ("4x6", "4 x 6 in"))),
    StyleKey("orientation", CHOICE, "portrait", "common practice", "Orientation", "landscape turns the card sideways",
             options=ORIENTATIONS),
    StyleKey("binding", CHOICE, "none", "none: no edge kept for a binder", "Binding edge",
             "a wider edge for a punch or ring binder", options=BINDINGS),
    StyleKey("front", BLOCKS, None, "every block kneeboard has, in its own order", "Blocks, in order",
             "the blocks to show, in the order they print; what does not fit a face moves to the next"),
    StyleKey("back", BLOCKS, (), "none", help="blocks that always begin on a back face"),
    StyleKey("max_faces", COUNT, None, "as many faces as the card needs",
             help="the most faces a card may take (two to a card)", bounds=(1, MAX_FACES)),
    StyleKey("bank_angles", BANKS, None, "each profile's own", help="the banks of every card, overriding the "
             "profiles'", unit="deg"),
    StyleKey("speed_unit", CHOICE, None, "each profile's own", help="the speed unit of every card",
             options=SPEED_UNITS),
    StyleKey("distance_unit", CHOICE, None, "each profile's own", help="the distance unit of every card",
             options=DISTANCE_UNITS),
    StyleKey("language", CHOICE, None, "each profile's own (English when it names none)",
             help="the language of every card's words", options=tuple(LANGUAGES),
             refusal=Msg("is not a language kneeboard prints")),
)
BY_KEY = {k.key: k for k in KEYS}
