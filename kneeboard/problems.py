"""One error model for profiles and styles: every problem says where, what, and what would do."""

import reprlib
import unicodedata
from dataclasses import dataclass, replace
from typing import Literal

from kneeboard.i18n import N_, USER, Msg

ERROR: Literal["error"] = "error"
WARNING: Literal["warning"] = "warning"
SEVERITY_WORDS = {ERROR: N_("error"), WARNING: N_("warning")}  #: as a problem's line says them


@dataclass(frozen=True)
class Problem:
    """Something wrong with one field of a profile or style file.

    `path` names the field the way the file is organised, with 1-based indexes for repeated
    tables ("configuration[2].stall_speed" is the second [[configuration]] table).
    """

    path: str  #: field path in the file
    message: str  #: what is wrong
    expected: str = ""  #: what would be accepted
    value: object = None  #: the value as written, None when absent
    severity: Literal["error", "warning"] = ERROR
    file: str = ""  #: file the value came from
    plain: str = ""  #: the warning as a pilot reads it on the card and in the app: the figure, what it means and
    #: what to check in the flight manual, in the trade's words; no field path, no option name

    @property
    def is_error(self) -> bool:
        return self.severity == ERROR

    def in_file(self, file: str) -> "Problem":
        return replace(self, file=file)

    def __str__(self) -> str:
        return self.told()

    def told(self, tr=None) -> str:
        """The problem's line in the language of `tr` (an `i18n.Translator`; the user's, `i18n.USER`, when None):
        its message and what would do translated where they were made as `Msg`; the file, the field's path and
        the value as written stay as they are."""
        tr = tr or USER.translator
        where = f"{printable(self.file)}: " if self.file else ""
        found = tr(" (found {value})", value=_show(self.value)) if self.value is not None else ""
        wanted = tr("; expected {expected}", expected=self.expected) if self.expected else ""
        message = tr(self.message) if isinstance(self.message, Msg) else self.message
        return printable(f"{where}{tr(SEVERITY_WORDS[self.severity])}: {self.path}: {message}{found}{wanted}")


class Told(Exception):
    """An exception whose message, made as a `Msg`, is told in the user's language (`i18n.USER`) wherever it is
    shown; as any exception, its first argument is the message. Mixed into every refusal kneeboard raises."""

    def __str__(self) -> str:
        message = self.args[0] if self.args else ""
        return USER.translator(message) if isinstance(message, Msg) else super().__str__()


_REPR = reprlib.Repr()  # keyword arguments need Python 3.12
_REPR.maxlevel, _REPR.maxstring, _REPR.maxother, _REPR.maxlist, _REPR.maxdict = 3, 60, 60, 6, 6


def _show(value: object, limit: int = 40) -> str:
    text = _REPR.repr(value)  # bounded: a deep or huge value must not be rendered in full to be cut
    return text if len(text) <= limit else text[: limit - 3] + "..."


def printable(text) -> str:
    """`text` (a message, a file name) safe to show on a terminal: control, format and separator characters
    (newlines, escape sequences, bidirectional overrides) written as escapes, everything else as it is."""
    text = str(text)
    if text.isprintable():
        return text
    return "".join(ch if ch.isprintable() or unicodedata.category(ch) == "Zs" else _escape(ch) for ch in text)


def _escape(ch: str) -> str:
    code = ord(ch)
    return f"\\x{code:02x}" if code < 0x100 else f"\\u{code:04x}" if code < 0x10000 else f"\\U{code:08x}"
