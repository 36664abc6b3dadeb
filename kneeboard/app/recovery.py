"""Autosave for crashes: unsaved edits are copied aside every few seconds and offered back on the next start.

A recovery file is a small JSON record (the profile's path, the edited text, when, and its owner: the process
and machine that wrote it) in the application's data folder. Saving, discarding or closing normally removes it;
only a crash leaves it behind. A record is offered back only once its owner is gone, so a second window or a
second instance never takes the edits of one still running; each window writes its own record, so none
overwrites another's; a record that cannot be read is reported, never silently dropped.
"""

import contextlib
import hashlib
import itertools
import json
import os
import socket
import time
from dataclasses import dataclass
from pathlib import Path

from kneeboard.app.words import tr
from kneeboard.fileio import MAX_FILE_BYTES, FileProblem, read_text, write_atomic
from kneeboard.i18n import Msg

#: The largest record: the largest profile's text, every character escaped in the worst case, and the rest.
MAX_RECORD_BYTES = 6 * MAX_FILE_BYTES + 4096
_instances = itertools.count(1)

AUTOSAVE_MS = 4000  #: at most this much typing is lost in a crash


@dataclass(frozen=True)
class Pending:
    file: Path  #: the recovery record
    path: Path | None  #: the profile the edits belong to; None for a profile never saved
    text: str  #: the edited profile text
    when: str  #: local time of the autosave, for the question to the person
    base: str | None = None  #: SHA-256 of the file the edits started from (None: unknown, or never saved)
    host: str | None = None  #: the machine name the record was written under, when it is not this machine's


def key_for(path: Path | None, untitled_id: str) -> str:
    if path is None:
        return f"untitled-{untitled_id}"
    return hashlib.sha256(str(Path(path).resolve()).encode()).hexdigest()[:16]


def _started(pid: int) -> str:
    """When process `pid` started, as the system counts it ("" where it cannot be told): a pid reused by a new
    process after a crash is then not mistaken for the owner."""
    try:
        stat = Path(f"/proc/{pid}/stat").read_text()
        return stat.rsplit(")", 1)[1].split()[19]
    except (OSError, IndexError):
        return ""


def _alive(pid: int) -> bool:
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except (PermissionError, OSError):
        return True  # it exists, run by someone else
    return True


class Recovery:
    def __init__(self, folder: Path):
        self.folder = Path(folder)
        self.owner = {"pid": os.getpid(), "host": socket.gethostname(), "started": _started(os.getpid()),
                      "window": next(_instances)}
        self.unreadable: list[str] = []  #: what `pending()` could not read, one sentence each

    def _file(self, key: str) -> Path:
        o = self.owner
        return self.folder / f"{key}.{o['host']}-{o['pid']}-{o['window']}.json"

    def save(self, key: str, path: Path | None, text: str, base: str | None = None) -> Path:
        """Write the record of `key`; raises FileProblem (naming the folder and the reason) when it cannot."""
        try:
            self.folder.mkdir(parents=True, exist_ok=True)
        except OSError as exc:  # a read-only home, a file where the folder belongs
            raise FileProblem(Msg("{folder}: cannot be made ({reason})", folder=str(self.folder),
                                  reason=exc.strerror or str(exc)), exc.errno) from None
        record = {"path": str(path) if path else None, "text": text, "base": base,
                  "when": time.strftime("%Y-%m-%d %H:%M:%S"), "owner": self.owner}
        target = self._file(key)
        write_atomic(target, json.dumps(record, ensure_ascii=False))  # UTF-8 as typed, not escaped
        return target

    def owner_gone(self, owner) -> bool:
        """True when the process that wrote a record has ended (on another machine it cannot be told: False)."""
        if not isinstance(owner, dict):
            return True  # a record of an older version: its writer has long ended
        if owner.get("host") != self.owner["host"]:
            return False
        pid = owner.get("pid")
        if not isinstance(pid, int) or not _alive(pid):
            return True
        if pid == self.owner["pid"]:
            return False  # another window of this very process: still running
        return bool(owner.get("started")) and owner.get("started") != _started(pid)

    def discard(self, key: str) -> None:
        with contextlib.suppress(FileNotFoundError, NotADirectoryError):  # never written: a folder that cannot be
            self._file(key).unlink()

    def pending(self) -> list[Pending]:
        """Records left by a session that did not end normally (their owner is gone), oldest first. A record that
        cannot be read is named in `unreadable` and left where it is, for the person to look at.

        A record written under another machine name (this machine's previous name, or another machine sharing the
        folder) cannot be told alive or gone: it is listed with its `host`, for the person to open or discard."""
        found = []
        self.unreadable = []
        if not self.folder.is_dir():
            return found
        for file in sorted(self.folder.glob("*.json")):
            try:
                record = json.loads(read_text(file, MAX_RECORD_BYTES))
                text, path, when, owner = record["text"], record.get("path"), record.get("when", ""), record.get(
                    "owner")
                if not isinstance(text, str):
                    raise TypeError(Msg("its text is not text"))
            except (FileProblem, ValueError, KeyError, TypeError, AttributeError) as exc:
                # ours told in the app's language (a Msg); Python's own reasons (JSON's, a missing key) as they are
                reason = exc.args[0] if exc.args and isinstance(exc.args[0], Msg) else str(exc)
                self.unreadable.append(tr("{file}: unsaved edits that cannot be read back ({reason}); the file is "
                                          "kept for you to open", file=str(file), reason=reason))
                continue
            base = record.get("base")
            base = base if isinstance(base, str) else None
            host = owner.get("host") if isinstance(owner, dict) else None
            if isinstance(host, str) and host != self.owner["host"]:
                found.append(Pending(file, Path(path) if isinstance(path, str) else None, text, str(when), base,
                                     host))
            elif self.owner_gone(owner):
                found.append(Pending(file, Path(path) if isinstance(path, str) else None, text, str(when), base))
        return sorted(found, key=lambda p: p.when)

    def remove(self, pending: Pending) -> None:
        pending.file.unlink(missing_ok=True)
