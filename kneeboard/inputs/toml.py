"""TOML, the one way in and out: the only module of kneeboard that imports `tomllib` or `tomlkit`.

Reading for a card parses with the standard library's strict `tomllib` (`parse_text`). Editing and saving go through
a `tomlkit` document (`document_from_text`, `save_document`), which keeps the person's comments, key order, unknown
keys and every value exactly as typed, so a save after an edit changes only the edited value.

Both ways are guarded the same: a text larger than a profile could be, or nested far deeper than one, is refused
before it is parsed (tomllib's time grows with the square of a dotted key's length), and the parsed data is
measured again. Whatever the parsers raise becomes the project's own `Problem` (reading) or `FileProblem` (a
document), naming the file.
"""

import re
import tomllib
from pathlib import Path

import tomlkit

from kneeboard.fileio import MAX_FILE_BYTES, FileProblem, read_text, write_atomic
from kneeboard.i18n import Msg
from kneeboard.problems import Problem

Document = tomlkit.TOMLDocument  #: an editable TOML file: a dict that keeps comments and layout

MAX_DEPTH = 16  #: a profile nests 5 levels deep; far deeper is an attack or an accident, refused unread
MAX_CHARACTERS = MAX_FILE_BYTES  #: a text no file read from disk could hold (a character is at least a byte)
WANTED = Msg("a TOML file as described in the README")
#: what a text nested too deeply for the parser is told (a style's reader says "a style")
TOO_DEEP = Msg("nests too deeply to be a profile")


def parse_text(text: str) -> tuple[dict | None, list[Problem]]:
    """Plain data of a TOML text, or None and the problem saying where it is broken (field "(file)")."""
    refused = _refused(text)
    if refused:
        return None, [Problem("(file)", refused, WANTED)]
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        return None, [Problem("(file)", Msg("is not valid TOML: {detail}", detail=str(exc)), WANTED)]
    except ValueError as exc:  # e.g. an integer longer than Python converts (4300 digits)
        return None, [Problem("(file)", Msg("holds a value that cannot be read: {detail}", detail=str(exc)[:80]),
                              WANTED)]
    except RecursionError:
        return None, [Problem("(file)", TOO_DEEP, WANTED)]
    if _depth(data) > MAX_DEPTH:
        return None, [Problem("(file)", _nests_deeper(), WANTED)]
    return data, []


def document_from_text(text: str, file: str = "") -> Document:
    """The editable document of a TOML text; raises FileProblem (naming `file`) when it cannot be one."""
    refused = _refused(text)
    if refused:
        raise FileProblem(Msg("{file}: {problem}", file=file, problem=refused))
    try:
        document = tomlkit.parse(text)
    except Exception as exc:  # tomlkit raises its own ParseError family and occasionally others
        raise FileProblem(Msg("{file}: is not valid TOML: {detail}", file=file, detail=str(exc))) from None
    if _depth(document) > MAX_DEPTH:
        raise FileProblem(Msg("{file}: {problem}", file=file, problem=_nests_deeper()))
    return document


def load_document(path: Path) -> Document:
    """The editable document of a file; raises FileProblem when it cannot be read or parsed."""
    return document_from_text(read_text(Path(path)), str(path))


def dumps(document: Document) -> str:
    """The text of a document, every comment and value as it was read or typed."""
    return tomlkit.dumps(document)


def save_document(document: Document, path: Path) -> None:
    """Write an edited document back, atomically."""
    write_atomic(Path(path), dumps(document))


def new_table():
    """An empty table to put into a document (`[section]`)."""
    return tomlkit.table()


def new_array_of_tables():
    """An empty array of tables to put into a document (`[[section]]`)."""
    return tomlkit.aot()


def unreadable(exc: FileProblem, path) -> Problem:
    """The problem of a file that cannot be read (field "(file)", naming the file): what `exc` says after the file's
    name, as a `Msg` where it was made as one "{file}: {problem}", so the problem tells it in any language; else its
    text in the user's language."""
    message, prefix = (exc.args[0] if exc.args else ""), f"{path}: "
    said = re.fullmatch(r"\{(\w+)\}: \{(\w+)\}", getattr(message, "template", ""))
    if isinstance(message, Msg) and said and str(message).startswith(prefix) \
            and str(message.params.get(said[1])) == str(path):
        return Problem("(file)", message.params[said[2]], file=str(path))
    return Problem("(file)", str(exc).removeprefix(prefix), file=str(path))


def _refused(text: str) -> str:
    """Why a text is refused before any parsing, or ""."""
    if len(text) > MAX_CHARACTERS:
        return Msg("is larger than {size} KiB: far larger than a profile or a style could be",
                   size=str(MAX_CHARACTERS // 1024))
    if _deepest_key(text) > MAX_DEPTH:
        return Msg("has keys nested more than {depth} levels deep", depth=str(MAX_DEPTH))
    return ""


def _nests_deeper() -> Msg:
    return Msg("nests more than {depth} levels deep", depth=str(MAX_DEPTH))


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
    """Nesting depth of parsed data (plain or a tomlkit document), without recursion: deep data must not crash the
    measuring."""
    deepest, stack = 0, [(data, 1)]
    while stack:
        node, depth = stack.pop()
        deepest = max(deepest, depth)
        if depth > MAX_DEPTH:
            break
        children = node.values() if isinstance(node, dict) else node if isinstance(node, list) else ()
        stack.extend((child, depth + 1) for child in children if isinstance(child, (dict, list)))
    return deepest
