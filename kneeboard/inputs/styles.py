"""Card style files -> CardStyle + problems, key by key through the declarations of `style_keys`.

Like profiles, a style is data read through the profile reader's guards (size, nesting, huge numbers, text rules):
every bad value becomes a Problem naming its key, never an exception, and a key nothing reads is kept in the file
with a warning. A logo may not leave the style's own folder; it is checked here without being drawn
(`kneeboard.card.logocheck`: no Qt) and its checked bytes kept for the card to draw. Nothing here loads a block, a
font, reportlab or Qt: whether the organization's name fits the card is `kneeboard.card.organization`'s question,
asked where cards are made.
"""

import re
from dataclasses import replace
from pathlib import Path

from kneeboard.card.block_names import known as known_blocks
from kneeboard.card.logocheck import LogoProblem, read_logo
from kneeboard.card.style import CardStyle
from kneeboard.fileio import FileProblem, read_text
from kneeboard.i18n import Msg
from kneeboard.inputs import style_keys as sk
from kneeboard.inputs.banks import read_banks
from kneeboard.inputs.toml import TOO_DEEP, parse_text, unreadable

# the profile's own text rules, so a style's text is held to the same (controls, bidi and zero-width marks)
from kneeboard.inputs.values import (
    MUST_BE_TEXT,
    ONE_LINE,
    OUT_OF_RANGE,
    control_character,
    first_non_text,
    key_text,
    told,
    too_long,
)
from kneeboard.problems import ERROR, WARNING, Problem
from kneeboard.shipped import FLEET_STYLE, default_style_path  # noqa: F401  (FLEET_STYLE: the style of a fleet)

_COLOUR = re.compile(r"#[0-9A-Fa-f]{6}\Z")
EACH_BLOCK_ONCE = Msg("each block once")


def fleet_style_path(folder: Path) -> Path | None:
    """The fleet's own style file in `folder`, or None when it uses the default."""
    path = Path(folder) / FLEET_STYLE
    return path if path.is_file() else None


def load_style(path: Path | None = None) -> tuple[CardStyle | None, list[Problem]]:
    """Read a style file (default: the shipped one); None and the problems when it has errors.

    Never raises for anything the file (or its logo) contains: a special file, a link loop, a
    huge or deeply nested file, a broken logo are each a Problem naming the key or "(file)".
    """
    path = Path(path) if path is not None else default_style_path()
    try:
        text = read_text(path)
    except FileProblem as exc:
        return None, [unreadable(exc, path)]
    data, problems = parse_text(text)
    if data is None:
        wanted = Msg("a card style file as described in the README")
        return None, [Problem(p.path, Msg("nests too deeply to be a style") if p.message == TOO_DEEP else p.message,
                              wanted, file=str(path)) for p in problems]
    style, problems = style_from_data(data, path.parent)
    problems = [p.in_file(str(path)) for p in problems]
    return (None if any(p.is_error for p in problems) else replace(style, source=path)), problems


class _Found:
    """The problems of one style, as `values.Reader.problem` takes them (the bank rule reports through it)."""

    def __init__(self):
        self.problems: list[Problem] = []

    def __call__(self, key, message, expected="", value=None, severity=ERROR, plain=""):
        self.problems.append(Problem(key, message, expected, value, severity, plain=plain))


def style_from_data(data: dict, folder: Path) -> tuple[CardStyle, list[Problem]]:
    """A style from a style file's plain data; `folder` is where its logo is looked for. Every bad value is a
    problem naming its key and leaves that key's default."""
    bad = _Found()
    data = _spelling(data, bad)
    for key in data:
        if key not in sk.BY_KEY:
            bad(key_text(key), Msg("unknown key, not used"), "", data[key], WARNING)
    values = {}
    for decl in sk.KEYS:
        values[decl.key] = _READERS[decl.kind](decl, data, bad, folder) if decl.key in data else decl.default
    _cross_checks(values, data, bad)
    logo = values["logo"]
    style = CardStyle(
        organization=values["organization"],
        logo=logo[0] if logo else None,
        accent=values["accent"],
        font_scale=float(values["font_scale"]),
        size=values["size"],
        landscape=values["orientation"] == "landscape",
        binding=values["binding"],
        front=values["front"],
        back=values["back"],
        max_faces=values["max_faces"],
        bank_angles_deg=values["bank_angles"],
        speed_unit=values["speed_unit"],
        distance_unit=values["distance_unit"],
        language=values["language"],
        logo_bytes=logo[1] if logo else None,
    )
    return style, bad.problems


def _spelling(data: dict, bad) -> dict:
    """The British spelling of `organization`, read as before: nothing a file holds is lost."""
    old = sk.LEGACY_ORGANIZATION
    if old not in data:
        return data
    if "organization" in data:
        bad(old, Msg("is given as well as organization; organization is used"), Msg("one of them"), data[old],
            WARNING)
    else:
        bad(old, Msg("is the older spelling of this key; it is read, but write organization"), "organization",
            data[old], WARNING)
        data = {**data, "organization": data[old]}
    return {k: v for k, v in data.items() if k != old}


def _cross_checks(values: dict, data: dict, bad) -> None:
    """The checks of more than one key, all here."""
    front, back = values["front"], values["back"]
    for name in set(front or ()) & set(back):
        bad("back", Msg("{name} is listed on both the front and the back", name=repr(name)), EACH_BLOCK_ONCE, name)
    if front is not None and not front and not back:
        # the card would print its caution and footer alone: no registration heading, no figure
        bad("front", Msg("shows no block: the card would print no figure"),
            Msg('at least one block, e.g. "header", "margin-table"'), data.get("front"))


# --- one reader per kind of key; each is called only for a key the file holds -------------------------------------


def _version(decl, data, bad, _folder):
    value = data[decl.key]
    if not isinstance(value, int) or isinstance(value, bool) or not 1 <= value <= sk.STYLE_VERSION:
        bad(decl.key, Msg("is not a style format this kneeboard reads"), decl.expected, value)
    return value


def _text(decl, data, bad, _folder) -> str:
    """One line of text held to the profile's text rules (its width on the card is checked where cards are made)."""
    value = data[decl.key]
    if not isinstance(value, str):
        bad(decl.key, MUST_BE_TEXT, decl.expected, value)
        return decl.default
    if len(value) > decl.limit:
        bad(decl.key, too_long(value), decl.expected, value)
        return decl.default
    odd = first_non_text(value)
    if odd is not None:
        bad(decl.key, control_character(odd), ONE_LINE, value)
        return decl.default
    return value


def _choice(decl, data, bad, _folder):
    value = data[decl.key]
    if not isinstance(value, str) or value not in decl.options:
        bad(decl.key, decl.refusal, decl.expected, value)
        return decl.default
    return value


def _colour(decl, data, bad, _folder) -> str:
    value = data[decl.key]
    if not isinstance(value, str) or not _COLOUR.match(value):
        bad(decl.key, Msg("is not a colour"), decl.expected, value)
        return decl.default
    return value


def _number(decl, data, bad, _folder) -> float:
    value = data[decl.key]
    low, high = decl.bounds
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not low <= value <= high:
        bad(decl.key, OUT_OF_RANGE, decl.expected, value)
        return decl.default
    return float(value)


def _count(decl, data, bad, _folder) -> int | None:
    value = data[decl.key]
    low, high = decl.bounds
    if isinstance(value, bool) or not isinstance(value, int) or not low <= value <= high:
        bad(decl.key, Msg("is not accepted"), decl.expected, value)
        return decl.default
    return value


def _blocks(decl, data, bad, _folder):
    """A list of block names, checked against the blocks a card knows."""
    known = known_blocks()
    value = data[decl.key]
    if not isinstance(value, list) or not all(isinstance(v, str) for v in value):
        bad(decl.key, Msg("must be a list of block names"), ", ".join(known), value)
        return decl.default
    unknown = [v for v in value if v not in known]
    if unknown:
        bad(decl.key, Msg("names unknown blocks: {blocks}", blocks=", ".join(map(str, unknown))), ", ".join(known),
            value)
    if len(set(value)) != len(value):
        bad(decl.key, Msg("lists a block twice"), EACH_BLOCK_ONCE, value)
    return tuple(dict.fromkeys(v for v in value if v in known))


def _banks(decl, data, bad, _folder):
    return read_banks(data[decl.key], decl.key, bad)


def _logo(decl, data, bad, folder: Path) -> tuple[Path, bytes] | None:
    """The logo's resolved path inside the style's folder and its checked bytes; None, and a problem, else."""
    value = data[decl.key]
    if value == "":
        return None
    expected = decl.expected
    if not isinstance(value, str) or len(value) > decl.limit:
        bad(decl.key, Msg("is not a file name"), expected, value)
        return None
    if first_non_text(value) is not None:  # a NUL too: no file is named so
        bad(decl.key, Msg("holds a control character; no file is named so"), expected, value)
        return None
    try:
        base = Path(folder).resolve()
        path = (base / value).resolve()
    except (OSError, RuntimeError, ValueError):  # a symbolic link loop (RuntimeError until Python 3.13)
        bad(decl.key, Msg("its symbolic links form a loop; refused"), expected, value)
        return None
    if Path(value).is_absolute() or not path.is_relative_to(base):
        bad(decl.key, Msg("points outside the style's folder; refused"), expected, value)
        return None
    if path.suffix.lower() not in (".png", ".svg"):
        bad(decl.key, Msg("is not a PNG or SVG file"), expected, value)
        return None
    try:
        return path, read_logo(path).data
    except LogoProblem as exc:
        missing = "no such file" in str(exc.args[0] if exc.args else exc)  # in English, whatever the user reads
        bad(decl.key, told(exc), expected if missing else Msg("a PNG or SVG logo (see the README)"), value)
        return None


_READERS = {sk.VERSION: _version, sk.TEXT: _text, sk.FILE: _logo, sk.COLOUR: _colour, sk.NUMBER: _number,
            sk.COUNT: _count, sk.CHOICE: _choice, sk.BLOCKS: _blocks, sk.BANKS: _banks}
