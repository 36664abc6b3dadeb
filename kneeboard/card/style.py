"""Card styles: a small TOML file a school applies to its whole fleet.

Like profiles, a style is data: every bad value becomes a Problem naming the field, and a logo
path may not leave the style's own folder.
"""

import re
import tomllib
from dataclasses import dataclass, field, replace
from pathlib import Path

from kneeboard import units
from kneeboard.card.geometry import CARD_SIZES
from kneeboard.fields import MAX_BANK_DEG
from kneeboard.fileio import FileProblem, read_text
from kneeboard.problems import WARNING, Problem
from kneeboard.shipped import default_style_path

STYLE_VERSION = 1
BINDINGS = ("none", "left", "top")
STYLE_SUFFIX = ".style.toml"  #: style files end so, which keeps them out of a folder's profiles
FLEET_STYLE = "fleet.style.toml"  #: the style a fleet folder's cards use, when it has one


def fleet_style_path(folder: Path) -> Path | None:
    """The fleet's own style file in `folder`, or None when it uses the default."""
    path = Path(folder) / FLEET_STYLE
    return path if path.is_file() else None
_COLOUR = re.compile(r"#[0-9A-Fa-f]{6}\Z")
MAX_LOGO_BYTES = 2 * 1024 * 1024


@dataclass(frozen=True)
class CardStyle:
    organisation: str = ""
    logo: Path | None = None  #: resolved path of a PNG or SVG inside the style's folder
    accent: str = "#1B5E8C"  #: "#RRGGBB"
    font_scale: float = 1.0
    size: str = "a5"
    landscape: bool = False
    binding: str = "none"  #: "none" | "left" | "top": a wider edge for a punch or ring binder
    front: tuple[str, ...] | None = None  #: blocks in order (None: every registered block); overflow goes back
    back: tuple[str, ...] = ()  #: blocks always printed on a back page
    bank_angles_deg: tuple[float, ...] | None = None  #: overrides the profiles' when set
    speed_unit: str | None = None
    distance_unit: str | None = None
    source: Path | None = field(default=None, compare=False)

    def with_changes(self, **changes) -> "CardStyle":
        return replace(self, **changes)


def load_style(path: Path | None = None) -> tuple[CardStyle | None, list[Problem]]:
    """Read a style file (default: the shipped one); None and the problems when it has errors."""
    path = Path(path) if path is not None else default_style_path()
    try:
        data = tomllib.loads(read_text(path))
    except FileProblem as exc:
        return None, [Problem("(file)", str(exc).removeprefix(f"{path}: "), file=str(path))]
    except tomllib.TOMLDecodeError as exc:
        return None, [Problem("(file)", f"is not valid TOML: {exc}", file=str(path))]
    style, problems = style_from_data(data, path.parent)
    problems = [p.in_file(str(path)) for p in problems]
    return (None if any(p.is_error for p in problems) else replace(style, source=path)), problems


def style_from_data(data: dict, folder: Path) -> tuple[CardStyle, list[Problem]]:
    found: list[Problem] = []
    default = CardStyle()

    def bad(key, message, expected, value=None, severity="error"):
        found.append(Problem(key, message, expected, value, severity))

    known = {"style", "organisation", "logo", "accent", "font_scale", "size", "orientation", "binding", "front",
             "back", "bank_angles", "speed_unit", "distance_unit"}
    for key in data:
        if key not in known:
            bad(key, "unknown key, not used", "", data[key], WARNING)
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

    organisation = text("organisation", "")
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
    logo = _logo(data.get("logo"), folder, bad)
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
    return CardStyle(
        organisation=organisation,
        logo=logo,
        accent=accent,
        font_scale=float(scale),
        size=size,
        landscape=orientation == "landscape",
        binding=binding,
        front=front,
        back=back,
        bank_angles_deg=None if banks is None else tuple(sorted({float(b) for b in banks})),
        speed_unit=speed_unit,
        distance_unit=distance_unit,
    ), found


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


def _logo(value, folder: Path, bad) -> Path | None:
    if value in (None, ""):
        return None
    expected = "a PNG or SVG file in the style's folder or below it"
    if not isinstance(value, str) or len(value) > 200:
        bad("logo", "is not a file name", expected, value)
        return None
    base = folder.resolve()
    path = (base / value).resolve()
    if Path(value).is_absolute() or not path.is_relative_to(base):
        bad("logo", "points outside the style's folder; refused", expected, value)
        return None
    if path.suffix.lower() not in (".png", ".svg"):
        bad("logo", "is not a PNG or SVG file", expected, value)
        return None
    if not path.is_file():
        bad("logo", "no such file", expected, value)
        return None
    if path.stat().st_size > MAX_LOGO_BYTES:
        bad("logo", "is larger than 2 MiB", "a logo file under 2 MiB", value)
        return None
    return path
