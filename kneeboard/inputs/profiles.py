"""Profile files as read: where a folder's profiles are, their plain data (`Source`) and its fingerprint.

Parsing is `kneeboard.inputs.toml`'s; validating the data into a `Profile` is `kneeboard.inputs.schema`'s, through
`kneeboard.pipeline`. Nothing here loads the units library, numpy or Qt: the app lists a fleet with it before its
first frame.
"""

import hashlib
import json
import re
from dataclasses import dataclass
from pathlib import Path

from kneeboard.fileio import FileProblem, read_text
from kneeboard.inputs.toml import parse_text, unreadable
from kneeboard.problems import Problem

PROFILE_SUFFIX = ".toml"
STYLE_SUFFIX = ".style.toml"  #: card styles live beside profiles but are not profiles

_QUANTITY = re.compile(r"\s*([-+]?(?:\d+\.?\d*|\.\d+))\s*([^\d\s].*?)?\s*\Z", re.DOTALL)


def _canonical(value):
    """The data with each number-and-unit text written one way ("1182.0 kg", " 1182 kg" -> "1182.0 kg")."""
    if isinstance(value, dict):
        return {k: _canonical(v) for k, v in value.items()}
    if isinstance(value, list):
        return [_canonical(v) for v in value]
    if isinstance(value, str) and (match := _QUANTITY.match(value)):
        number, unit = match.groups()
        return f"{float(number)!r} {unit}" if unit else repr(float(number))
    return value


def figure_data(data: dict) -> dict:
    """A profile's data without what changes no figure of its card: the card's language."""
    card = data.get("card")
    if isinstance(card, dict) and "language" in card:
        return {**data, "card": {k: v for k, v in card.items() if k != "language"}}
    return data


def fingerprint(data: dict) -> str:
    """Eight hex digits identifying a profile's data (not its comments, layout, or how a number is written).

    A card shows it so a pilot can tell whether the card was printed from the current profile. The same
    figures written another way ("1182.0 kg" for "1182 kg") are the same data and make the same card. The card's
    language (`card.language`) is left out: it changes the card's words, never a figure.
    """
    canonical = json.dumps(_canonical(figure_data(data)), sort_keys=True, ensure_ascii=True, separators=(",", ":"),
                           default=str)
    return hashlib.sha256(canonical.encode()).hexdigest()[:8].upper()


@dataclass(frozen=True)
class Source:
    """A profile file as parsed, not yet validated: its plain data (None when it cannot be read)."""

    path: Path | None
    data: dict | None
    problems: tuple[Problem, ...]  #: why the file could not be read, when it could not
    fingerprint: str  #: of the data; "" when unreadable

    @property
    def registration(self) -> str | None:
        """The registration the data gives, as written (no validation); None when it gives none."""
        aircraft = (self.data or {}).get("aircraft")
        registration = aircraft.get("registration") if isinstance(aircraft, dict) else None
        return registration if isinstance(registration, str) and registration.strip() else None


def read_source(path: Path) -> Source:
    """Read and parse one profile file; never raises for anything the file contains."""
    return read_text_once(path).source()


def source_from_text(text: str, path: Path | None = None) -> Source:
    data, problems = parse_text(text)
    if data is None:
        return Source(path, None, tuple(p.in_file(str(path or "")) for p in problems), "")
    return source_from_plain(data, path)


def source_from_plain(data: dict, path: Path | None = None) -> Source:
    """Already parsed data (from `parse_text`, or a document's unwrap())."""
    return Source(path, data, (), fingerprint(data))


@dataclass(frozen=True)
class Unparsed:
    """A profile file's text as read, once: what a fleet keeps of each file between ordering it and making its card
    (a text is a few KiB; its parsed data several times that, its prepared card far more)."""

    path: Path
    text: str | None  #: None when the file could not be read
    unreadable: Problem | None = None  #: why it could not

    def source(self) -> Source:
        """The file's data, parsed from the text kept (the file is not read again)."""
        if self.text is None:
            return Source(self.path, None, (self.unreadable,), "")
        return source_from_text(self.text, self.path)


def read_text_once(path: Path) -> Unparsed:
    """The text of one profile file, or why it cannot be read; never raises for anything the file is."""
    path = Path(path)
    try:
        return Unparsed(path, read_text(path))
    except FileProblem as exc:
        return Unparsed(path, None, unreadable(exc, path))


def profile_files(folder: Path) -> list[Path]:
    """The profile files of a folder (not its sub-folders), sorted by file name."""
    return sorted(p for p in Path(folder).iterdir() if p.suffix == PROFILE_SUFFIX and p.is_file()
                  and not p.name.startswith(".") and not p.name.endswith(STYLE_SUFFIX))


def expand_paths(paths) -> list[Path]:
    """Profile files named on a command line: files as given, folders expanded to their profiles."""
    result = []
    for p in map(Path, paths):
        result.extend(profile_files(p) if p.is_dir() else [p])
    return result
