"""Autosave for crashes: unsaved edits are copied aside every few seconds and offered back on the next start.

A recovery file is a small JSON record (the profile's path, the edited text, when) in the
application's data folder. Saving, discarding or closing normally removes it; only a crash
leaves it behind.
"""

import hashlib
import json
import time
from dataclasses import dataclass
from pathlib import Path

from kneeboard.fileio import FileProblem, read_text, write_atomic

AUTOSAVE_MS = 4000  #: at most this much typing is lost in a crash


@dataclass(frozen=True)
class Pending:
    file: Path  #: the recovery record
    path: Path | None  #: the profile the edits belong to; None for a profile never saved
    text: str  #: the edited profile text
    when: str  #: local time of the autosave, for the question to the person


def key_for(path: Path | None, untitled_id: str) -> str:
    if path is None:
        return f"untitled-{untitled_id}"
    return hashlib.sha256(str(Path(path).resolve()).encode()).hexdigest()[:16]


class Recovery:
    def __init__(self, folder: Path):
        self.folder = Path(folder)

    def _file(self, key: str) -> Path:
        return self.folder / f"{key}.json"

    def save(self, key: str, path: Path | None, text: str) -> Path:
        self.folder.mkdir(parents=True, exist_ok=True)
        record = {"path": str(path) if path else None, "text": text,
                  "when": time.strftime("%Y-%m-%d %H:%M:%S")}
        target = self._file(key)
        write_atomic(target, json.dumps(record))
        return target

    def discard(self, key: str) -> None:
        self._file(key).unlink(missing_ok=True)

    def pending(self) -> list[Pending]:
        """Records left by a session that did not end normally, oldest first; unreadable ones are skipped."""
        found = []
        if not self.folder.is_dir():
            return found
        for file in sorted(self.folder.glob("*.json")):
            try:
                record = json.loads(read_text(file))
                text, path, when = record["text"], record.get("path"), record.get("when", "")
            except (FileProblem, ValueError, KeyError, TypeError):
                continue
            if isinstance(text, str):
                found.append(Pending(file, Path(path) if isinstance(path, str) else None, text, str(when)))
        return sorted(found, key=lambda p: p.when)

    def remove(self, pending: Pending) -> None:
        pending.file.unlink(missing_ok=True)
