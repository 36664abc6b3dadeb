"""Card styles: a small TOML file a school applies to its whole fleet.

Like profiles, a style is data read through the profile reader's guards (size, nesting, huge
numbers, text rules): every bad value becomes a Problem naming the field, never an exception. A
logo path may not leave the style's own folder, and the logo is checked and drawn into PNG bytes
when the style is loaded (`CardStyle.logo_png`), so drawing a card never meets a broken logo.
"""

import re
from dataclasses import dataclass, field, replace
from pathlib import Path

from kneeboard import units
from kneeboard.card.geometry import CARD_SIZES, page_box
from kneeboard.fields import MAX_BANK_DEG
from kneeboard.fileio import FileProblem, read_text
from kneeboard.i18n import LANGUAGES
from kneeboard.problems import WARNING, Problem
from kneeboard.profile_io import parse_text
from kneeboard.shipped import default_style_path

# the profile's own text rules, so a style's text is held to the same (controls, bidi and zero-width marks)
from kneeboard.values import first_non_text, key_text

STYLE_VERSION = 1
BINDINGS = ("none", "left", "top")
STYLE_SUFFIX = ".style.toml"  #: style files end so, which keeps them out of a folder's profiles
FLEET_STYLE = "fleet.style.toml"  #: the style a fleet folder's cards use, when it has one


def fleet_style_path(folder: Path) -> Path | None:
    """The fleet's own style file in `folder`, or None when it uses the default."""
    path = Path(folder) / FLEET_STYLE
    return path if path.is_file() else None

_COLOUR = re.compile(r"#[0-9A-Fa-f]{6}\Z")
MAX_ORGANIZATION = 60  #: characters
LEGACY_ORGANIZATION = "organisation"  #: the key's British spelling, accepted with a warning
MAX_LOGO_NAME = 200  #: characters of the logo's file name as written
MAX_FACES = 24  #: the most faces a style may allow (twelve cards)


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
    #: the logo as checked PNG bytes, made when the style is loaded; None without a logo (or for a style
    #: built in code, whose `logo` is then read when a card is drawn)
    logo_png: bytes | None = field(default=None, compare=False, repr=False)

    def with_changes(self, **changes) -> "CardStyle":
        return replace(self, **changes)


def load_style(path: Path | None = None) -> tuple[CardStyle | None, list[Problem]]:
    """Read a style file (default: the shipped one); None and the problems when it has errors.

    Never raises for anything the file (or its logo) contains: a special file, a link loop, a
    huge or deeply nested file, a broken logo are each a Problem naming the field or "(file)".
    """
    path = Path(path) if path is not None else default_style_path()
    try:
        text = read_text(path)
    except FileProblem as exc:
        return None, [Problem("(file)", str(exc).removeprefix(f"{path}: "), file=str(path))]
    data, problems = parse_text(text)
    if data is None:
        wanted = "a card style file as described in the README"
        return None, [Problem(p.path, p.message.replace("to be a profile", "to be a style"), wanted, file=str(path))
                      for p in problems]
    style, problems = style_from_data(data, path.parent)
    problems = [p.in_file(str(path)) for p in problems]
    return (None if any(p.is_error for p in problems) else replace(style, source=path)), problems


def style_from_data(data: dict, folder: Path) -> tuple[CardStyle, list[Problem]]:
    found: list[Problem] = []
    default = CardStyle()

    def bad(key, message, expected, value=None, severity="error"):
        found.append(Problem(key, message, expected, value, severity))

    if LEGACY_ORGANIZATION in data:  # the British spelling of the key, read as before: nothing a file holds is lost
        if "organization" in data:
            bad(LEGACY_ORGANIZATION, "is given as well as organization; organization is used", "one of them",
                data[LEGACY_ORGANIZATION], WARNING)
        else:
            bad(LEGACY_ORGANIZATION, "is the older spelling of this key; it is read, but write organization",
                "organization", data[LEGACY_ORGANIZATION], WARNING)
            data = {**data, "organization": data[LEGACY_ORGANIZATION]}
        data = {k: v for k, v in data.items() if k != LEGACY_ORGANIZATION}
    known = {"style", "organization", "logo", "accent", "font_scale", "size", "orientation", "binding", "front",
             "back", "max_faces", "bank_angles", "speed_unit", "distance_unit", "language"}
    for key in data:
        if key not in known:
            bad(key_text(key), "unknown key, not used", "", data[key], WARNING)
    version = data.get("style", STYLE_VERSION)
    if not isinstance(version, int) or isinstance(version, bool) or version > STYLE_VERSION or version < 1:
        bad("style", "is not a style format this kneeboard reads", f"style = {STYLE_VERSION}", version)

    def text(key, default_value, options=None, limit=60):
        value = data.get(key, default_value)
        if not isinstance(value, str) or len(value) > limit or (options and value not in options):
            expected = " | ".join(options) if options else f"text of up to {limit} characters"
            bad(key, "is not accepted", expected, value)
            return default_value
        return value

    organization = _organization(data, bad)
    accent = text("accent", default.accent)
    if not _COLOUR.match(accent):
        bad("accent", "is not a colour", 'a colour as "#RRGGBB", e.g. "#1B5E8C"', accent)
        accent = default.accent
    size = text("size", default.size, tuple(CARD_SIZES))
    orientation = text("orientation", "portrait", ("portrait", "landscape"))
    binding = text("binding", "none", BINDINGS)
    scale = data.get("font_scale", 1.0)
    if isinstance(scale, bool) or not isinstance(scale, (int, float)) or not 0.7 <= scale <= 1.6:
        bad("font_scale", "is out of range", "a number from 0.7 to 1.6", scale)
        scale = 1.0
    front = _blocks(data, "front", None, bad)
    back = _blocks(data, "back", (), bad) or ()
    for name in set(front or ()) & set(back):
        bad("back", f"{name!r} is listed on both the front and the back", "each block once", name)
    max_faces = data.get("max_faces")
    if max_faces is not None and (isinstance(max_faces, bool) or not isinstance(max_faces, int)
                                  or not 1 <= max_faces <= MAX_FACES):
        bad("max_faces", "is not accepted", f"a whole number of faces from 1 to {MAX_FACES} (two to a card)",
            max_faces)
        max_faces = None
    if front is not None and not front and not back:
        # the card would print its caution and footer alone: no registration heading, no figure
        bad("front", "shows no block: the card would print no figure", "at least one block, e.g. \"header\", "
            "\"margin-table\"", data.get("front"))
    logo, logo_bytes = _logo(data.get("logo"), folder, bad)
    banks = data.get("bank_angles")
    if banks is not None and not (
        isinstance(banks, list) and 1 <= len(banks) <= 24
        and all(isinstance(b, (int, float)) and not isinstance(b, bool) and 0 <= b <= MAX_BANK_DEG for b in banks)
    ):
        bad("bank_angles", "must be a list of banks in degrees", f"1 to 24 numbers, each from 0 to {MAX_BANK_DEG:g}",
            banks)
        banks = None
    speed_unit = data.get("speed_unit")
    if speed_unit is not None and speed_unit not in units.SPEED_UNITS:
        bad("speed_unit", "is not accepted", " | ".join(units.SPEED_UNITS), speed_unit)
        speed_unit = None
    distance_unit = data.get("distance_unit")
    if distance_unit is not None and distance_unit not in units.DISTANCE_UNITS:
        bad("distance_unit", "is not accepted", " | ".join(units.DISTANCE_UNITS), distance_unit)
        distance_unit = None
    language = data.get("language")
    if language is not None and language not in LANGUAGES:
        bad("language", "is not a language kneeboard prints", " | ".join(LANGUAGES), language)
        language = None
    style = CardStyle(
        organization=organization,
        logo=logo,
        accent=accent,
        font_scale=float(scale),
        size=size,
        landscape=orientation == "landscape",
        binding=binding,
        front=front,
        back=back,
        max_faces=max_faces,
        bank_angles_deg=None if banks is None else tuple(sorted({float(b) for b in banks})),
        speed_unit=speed_unit,
        distance_unit=distance_unit,
        language=language,
        logo_png=logo_bytes,
    )
    too_wide = organization_problems(style)
    found.extend(too_wide)
    return (style.with_changes(organization="") if too_wide else style), found


def _blocks(data, key, default, bad):
    """A list of block names, checked against the registered blocks; `default` when the key is absent."""
    from kneeboard.card.blocks import names

    known = names()
    if key not in data:
        return default
    value = data[key]
    if not isinstance(value, list) or not all(isinstance(v, str) for v in value):
        bad(key, "must be a list of block names", ", ".join(known), value)
        return default
    unknown = [v for v in value if v not in known]
    if unknown:
        bad(key, f"names unknown blocks: {', '.join(map(str, unknown))}", ", ".join(known), value)
    if len(set(value)) != len(value):
        bad(key, "lists a block twice", "each block once", value)
    return tuple(dict.fromkeys(v for v in value if v in known))


def _organization(data, bad) -> str:
    """The organization's name, held to the profile's text rules (its width is checked once the card is known)."""
    value = data.get("organization", "")
    expected = f"text on one line of up to {MAX_ORGANIZATION} characters"
    if not isinstance(value, str):
        bad("organization", "must be text in quotes", expected, value)
        return ""
    if len(value) > MAX_ORGANIZATION:
        bad("organization", f"is {len(value)} characters long", expected, value)
        return ""
    odd = first_non_text(value)
    if odd is not None:
        bad("organization", f"contains the control character U+{ord(odd):04X}", "printable text on one line", value)
        return ""
    return value


#: The registration the organization's room is measured beside: ten characters, longer than most registrations.
REGISTRATION_SAMPLE = "XX-XXXXXXX"


def organization_room(size: str, landscape: bool = False, binding: str = "none", logo: bool = False) -> float:
    """Width each of the organization's two lines may take in the header of this card [pt].

    Measured as the header places it, at the smallest type the layout may reach on this card:
    the content width, less the logo and the sample registration beside it.
    """
    from kneeboard.card import fonts
    from kneeboard.card.draw import BASE_SIZE, FIGURE, LABEL, MIN_TEXT, REGISTRATION, SECONDARY
    from kneeboard.card.layout import SHRINK, min_figure_size

    scale = min_figure_size(size) / (BASE_SIZE[FIGURE] * SECONDARY) / SHRINK  # the last scale tried, or above
    reg, label = max(BASE_SIZE[REGISTRATION] * scale, MIN_TEXT), max(BASE_SIZE[LABEL] * scale, MIN_TEXT)
    width = page_box(size, landscape, binding).content_width
    if logo:
        width -= reg * 1.25 * 2 + label
    return width - fonts.width(REGISTRATION_SAMPLE, fonts.BOLD, reg) - 2 * label


def organization_problems(style: CardStyle) -> list[Problem]:
    """The problem of an organization too wide for the style's card; call it again after changing the size."""
    from kneeboard.card import fonts
    from kneeboard.card.draw import MIN_TEXT

    text = style.organization
    if not text:
        return []
    room = organization_room(style.size, style.landscape, style.binding, style.logo is not None)
    lines = fonts.wrap(text, fonts.BOLD, MIN_TEXT, max(room, 1.0), hyphenate=False)
    if len(lines) <= 2 and all(fonts.width(line, fonts.BOLD, MIN_TEXT) <= room for line in lines):
        return []
    card = style.size + (" landscape" if style.landscape else "")
    card += f" (bound {style.binding})" if style.binding != "none" else ""
    beside = "registration and logo" if style.logo is not None else "registration"
    return [Problem("organization", f"does not fit in two lines of {max(room, 0):.0f} pt beside the {beside} "
                    f"on a {card} card, even at the smallest type", "a shorter name, or a larger card", text)]


def _logo(value, folder: Path, bad) -> tuple[Path | None, bytes | None]:
    """The logo's resolved path inside the style's folder and its checked PNG bytes; (None, None) and a problem."""
    from kneeboard.card.logo import LogoProblem, load_logo

    if value in (None, ""):
        return None, None
    expected = "a PNG or SVG file in the style's folder or below it"
    if not isinstance(value, str) or len(value) > MAX_LOGO_NAME:
        bad("logo", "is not a file name", expected, value)
        return None, None
    if first_non_text(value) is not None:  # a NUL too: no file is named so
        bad("logo", "holds a control character; no file is named so", expected, value)
        return None, None
    try:
        base = folder.resolve()
        path = (base / value).resolve()
    except (OSError, RuntimeError, ValueError):  # a symbolic link loop (RuntimeError until Python 3.13)
        bad("logo", "its symbolic links form a loop; refused", expected, value)
        return None, None
    if Path(value).is_absolute() or not path.is_relative_to(base):
        bad("logo", "points outside the style's folder; refused", expected, value)
        return None, None
    if path.suffix.lower() not in (".png", ".svg"):
        bad("logo", "is not a PNG or SVG file", expected, value)
        return None, None
    try:
        return path, load_logo(path)
    except LogoProblem as exc:
        bad("logo", str(exc), "a PNG or SVG logo (see the README)" if "no such file" not in str(exc) else expected,
            value)
        return None, None
