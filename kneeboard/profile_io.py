"""Profile files: the only module that reads or writes TOML for profiles.

Loading parses with the standard library's strict `tomllib`. Editing and saving go through a
`tomlkit` document, which keeps the person's comments, key order, unknown keys and every value
exactly as typed, so a save after an edit changes only the edited value.
"""

import hashlib
import json
import re
import tomllib
from dataclasses import dataclass
from pathlib import Path

import tomlkit

from kneeboard.fileio import FileProblem, read_text, write_atomic
from kneeboard.problems import Problem
from kneeboard.profile import Profile

PROFILE_SUFFIX = ".toml"
STYLE_SUFFIX = ".style.toml"  #: card styles live beside profiles but are not profiles


MAX_DEPTH = 16  #: a profile nests 5 levels deep; far deeper is an attack or an accident, refused unread


def parse_text(text: str) -> tuple[dict | None, list[Problem]]:
    """Plain data of a profile text, or None and the problem saying where the TOML is broken."""
    wanted = "a TOML file as described in the README"
    if _deepest_key(text) > MAX_DEPTH:
        # tomllib's time grows with the square of a dotted key's length: refuse before parsing
        return None, [Problem("(file)", f"has keys nested more than {MAX_DEPTH} levels deep", wanted)]
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        return None, [Problem("(file)", f"is not valid TOML: {exc}", wanted)]
    except ValueError as exc:  # e.g. an integer longer than Python converts (4300 digits)
        return None, [Problem("(file)", f"holds a value that cannot be read: {str(exc)[:80]}", wanted)]
    except RecursionError:
        return None, [Problem("(file)", "nests too deeply to be a profile", wanted)]
    if _depth(data) > MAX_DEPTH:
        return None, [Problem("(file)", f"nests more than {MAX_DEPTH} levels deep", wanted)]
    return data, []


# strings and comments, whose dots are no key's: skipped whole in one linear pass. Possessive loops and optional
# closing quotes: an unterminated string ends where its body does, and no start is ever tried twice.
_NOT_KEYS = re.compile(r'''"""(?:[^"\\]|\\.|"(?!""))*+(?:""")?|\'\'\'(?:[^']|'(?!''))*+(?:\'\'\')?'''
                       r'''|"(?:[^"\\\n]|\\[^\n])*+"?|'[^'\n]*+'?|#[^\n]*+''', re.DOTALL)
_DOTTED = re.compile(r"[A-Za-z0-9_-]+(?:[ \t]*\.[ \t]*[A-Za-z0-9_-]+)*")


def _deepest_key(text: str) -> int:
    """Most dotted parts in any key or table header of the text (a linear scan, no parsing).

    Dots in comments ("# Vr ......... 55 kt") and strings are no key's and are not counted; a float's one dot may
    count as two parts, far below the limit.
    """
    # a string becomes one bare part (it may be a quoted key: "a"."b" has two parts), a comment nothing
    bare = _NOT_KEYS.sub(lambda m: " " if m.group().startswith("#") else "s", text)
    return max((m.group().count(".") + 1 for m in _DOTTED.finditer(bare)), default=0)


def _depth(data) -> int:
    """Nesting depth of parsed data, without recursion (deep data must not crash the measuring)."""
    deepest, stack = 0, [(data, 1)]
    while stack:
        node, depth = stack.pop()
        deepest = max(deepest, depth)
        if depth > MAX_DEPTH:
            break
        children = node.values() if isinstance(node, dict) else node if isinstance(node, list) else ()
        stack.extend((child, depth + 1) for child in children if isinstance(child, (dict, list)))
    return deepest


@dataclass(frozen=True)
class ProfileFile:
    """One profile file as read: the profile (None when it has errors) and every problem found."""

    path: Path | None
    profile: Profile | None
    problems: tuple[Problem, ...]
    fingerprint: str  #: short hash of the file's data, printed on the card; "" when unreadable

    @property
    def errors(self) -> list[Problem]:
        return [p for p in self.problems if p.is_error]

    @property
    def warnings(self) -> list[Problem]:
        return [p for p in self.problems if not p.is_error]


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


def read_source(path: Path) -> Source:
    """Read and parse one profile file; never raises for anything the file contains."""
    path = Path(path)
    try:
        text = read_text(path)
    except FileProblem as exc:
        return Source(path, None, (Problem("(file)", str(exc).removeprefix(f"{path}: "), file=str(path)),), "")
    return source_from_text(text, path)


def source_from_text(text: str, path: Path | None = None) -> Source:
    data, problems = parse_text(text)
    if data is None:
        return Source(path, None, tuple(p.in_file(str(path or "")) for p in problems), "")
    return source_from_plain(data, path)


def source_from_plain(data: dict, path: Path | None = None) -> Source:
    """Already parsed data (from tomllib, or a tomlkit document's unwrap())."""
    return Source(path, data, (), fingerprint(data))


def load_profile(path: Path) -> ProfileFile:
    """Read and validate one profile file as it stands (no style, no physics); never raises for its contents."""
    return _validated(read_source(path))


def profile_from_text(text: str, path: Path | None = None) -> ProfileFile:
    return _validated(source_from_text(text, path))


def profile_from_plain(data: dict, path: Path | None = None) -> ProfileFile:
    """Validate already parsed data (from tomllib, or a tomlkit document's unwrap())."""
    return _validated(source_from_plain(data, path))


def _validated(source: Source) -> ProfileFile:
    if source.data is None:
        return ProfileFile(source.path, None, source.problems, "")
    from kneeboard.schema import profile_from_data  # the reader loads the units library: only when validating

    profile, problems = profile_from_data(source.data)
    return ProfileFile(source.path, profile, tuple(p.in_file(str(source.path or "")) for p in problems),
                       source.fingerprint)


FORMAT_0 = 0  #: files written before profiles carried a format number (no `schema` key)


def file_format(text: str) -> int | None:
    """The format number a profile text declares: 0 when it has none, None when it cannot be read."""
    data, _ = parse_text(text)
    if data is None:
        return None
    version = data.get("schema", FORMAT_0)
    return version if isinstance(version, int) and not isinstance(version, bool) else None


def migrate_text(text: str) -> tuple[str, int | None]:
    """Bring an older profile text up to the current format; returns (text, the old format or None).

    Format 0 is format 1 without its number: migrating adds `schema = 1` after the leading comments.
    """
    if file_format(text) != FORMAT_0:
        return text, None
    lines = text.splitlines(keepends=True)
    at = 0
    while at < len(lines) and lines[at].lstrip().startswith("#"):
        at += 1
    gap = [] if at < len(lines) and not lines[at].strip() else ["\n"]
    from kneeboard.schema import SCHEMA_VERSION

    return "".join(lines[:at] + [f"schema = {SCHEMA_VERSION}\n"] + gap + lines[at:]), FORMAT_0


def backup_path(path: Path, old_format: int) -> Path:
    """Where the original of a migrated file is kept when it is first saved over."""
    return path.with_name(f"{path.name}.format{old_format}.bak")


def load_document(path: Path) -> tomlkit.TOMLDocument:
    """The editable document of a profile file; raises FileProblem when it cannot be parsed."""
    return document_from_text(read_text(Path(path)), str(path))


def document_from_text(text: str, file: str = "") -> tomlkit.TOMLDocument:
    try:
        return tomlkit.parse(text)
    except Exception as exc:  # tomlkit raises its own ParseError family and occasionally others
        raise FileProblem(f"{file}: is not valid TOML: {exc}") from None


def save_document(document: tomlkit.TOMLDocument, path: Path) -> None:
    """Write an edited document back, atomically."""
    write_atomic(Path(path), tomlkit.dumps(document))


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
