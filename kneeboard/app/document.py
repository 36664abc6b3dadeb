"""An open profile: the file's TOML document, its undo history, and the profile read from it.

The document is the one truth the editor edits: values are stored exactly as typed (a wrong
entry stays in the document, and the problem it causes is shown), comments and unknown keys
survive, and every edit goes through Qt's undo stack as a before/after snapshot of the whole
text, so undoing back to the start gives the original file byte for byte.

The document also remembers what it read from disk (a hash of the bytes, their time and size)
at opening and at every save. A save checks the file again just before writing and raises
SaveConflict when someone else changed it meanwhile (another program, a second window), and a
file watcher tells the window as soon as that happens, so no one's change is overwritten unseen.
"""

import copy
import hashlib
import os
import uuid
from dataclasses import dataclass
from pathlib import Path

from PySide6.QtCore import QFileSystemWatcher, QObject, Signal
from PySide6.QtGui import QUndoCommand, QUndoStack

from kneeboard.fileio import (
    MAX_FILE_BYTES,
    FileProblem,
    decode_text,
    folder_lock,
    read_bytes,
    same_file,
    write_atomic,
)
from kneeboard.i18n import Msg
from kneeboard.inputs import toml
from kneeboard.inputs.migration import backup_path, file_format, migrate_text
from kneeboard.inputs.toml import document_from_text
from kneeboard.pipeline import Prepared

Key = tuple  #: a path into the document: ("configuration", 0, "stall_speed")


class SaveConflict(FileProblem):
    """The file changed on disk since it was opened or last saved; saving would overwrite that change."""


@dataclass(frozen=True)
class DiskState:
    """What a file held when it was read or written: enough to tell whether it differs now."""

    sha256: str  #: hash of the file's bytes
    mtime_ns: int
    size: int  #: [bytes]


def disk_state(path: Path) -> tuple[bytes, DiskState]:
    """The bytes of a profile file and their state; raises FileProblem as reading does."""
    data = read_bytes(Path(path), MAX_FILE_BYTES, "a profile is a few KiB")
    try:
        info = os.stat(path)
    except OSError as exc:
        raise FileProblem(Msg("{path}: cannot be read ({reason})", path=str(path), reason=exc.strerror or str(exc))) \
            from None
    return data, DiskState(hashlib.sha256(data).hexdigest(), info.st_mtime_ns, info.st_size)


class _Edit(QUndoCommand):
    """One edit as before/after text; consecutive edits of one field merge into one step."""

    def __init__(self, doc: "ProfileDocument", before: str, after: str, label: str, merge_id: int,
                 after_doc=None):
        super().__init__(label)
        self.doc, self.before, self.after, self.merge_id = doc, before, after, merge_id
        self.after_doc = after_doc  # the edited document itself, used once so the first redo need not parse

    def id(self) -> int:  # noqa: A003 - Qt's name
        return self.merge_id

    def mergeWith(self, other) -> bool:  # noqa: N802 - Qt's name
        if other.id() != self.merge_id or self.merge_id < 0:
            return False
        self.after = other.after
        return True

    def redo(self):
        parsed, self.after_doc = self.after_doc, None
        self.doc._load_text(self.after, parsed)

    def undo(self):
        self.doc._load_text(self.before)


def key_text(key: Key) -> str:
    """The field path of problems for a document key: ("configuration", 1, "name") -> "configuration[2].name"."""
    out = ""
    for part in key:
        out += f"[{part + 1}]" if isinstance(part, int) else (f".{part}" if out else part)
    return out


class ProfileDocument(QObject):
    changed = Signal()  #: after every edit, undo and redo
    modifiedChanged = Signal(bool)
    changedOnDisk = Signal()  #: the file now differs from what this document read or wrote  # noqa: N815

    def __init__(self, text: str, path: Path | None = None, parent=None, disk: DiskState | None = None,
                 session=None):
        super().__init__(parent)
        if session is None:
            from kneeboard.app.session import Session

            session = Session()
        self.session = session  #: how the text becomes a card: the window's session, with its style
        self.path = Path(path) if path is not None else None
        self.disk = disk  #: what the file held when last read or written here; None: not read from a file
        self._told: str | None = None  # the change on disk last signalled
        self._watcher = QFileSystemWatcher(self)
        self._watcher.fileChanged.connect(self._disk_event)
        self._watcher.directoryChanged.connect(self._disk_event)
        self._watch()
        self.untitled_id = uuid.uuid4().hex[:12]  #: names the crash-recovery copy until the profile has a file
        self.undo_stack = QUndoStack(self)
        # a bound method, not a lambda: Qt drops the connection when this object goes away
        self.undo_stack.cleanChanged.connect(self._clean_changed)
        self.saved_text = text
        self._doc = document_from_text(text, str(path or ""))
        self._text = text
        self._loaded: Prepared | None = None
        self._plain: dict | None = None
        migrated, self.migrated_from = migrate_text(text)
        if self.migrated_from is not None:  # an older format: updating it is the first, undoable edit
            self.undo_stack.push(_Edit(self, text, migrated, "Update the file format", -1))

    def _clean_changed(self, clean: bool) -> None:
        self.modifiedChanged.emit(not clean)

    # --- reading -------------------------------------------------------------------------------
    @classmethod
    def open(cls, path: Path, parent=None, session=None) -> "ProfileDocument":
        """Raises FileProblem when the file cannot be read or is not TOML at all."""
        data, state = disk_state(Path(path))
        return cls(decode_text(data, Path(path)), path, parent, state, session)

    def text(self) -> str:
        return self._text

    @property
    def modified(self) -> bool:
        return not self.undo_stack.isClean()

    @property
    def loaded(self) -> Prepared:
        """The current text through the pipeline with the session's style (profile, table, every problem);
        cached until the next edit or `forget()`."""
        if self._loaded is None:
            self._loaded = self.session.prepare_plain(self.plain(), self.path)
        return self._loaded

    def forget(self) -> None:
        """Prepare the text again at next use (the card style changed)."""
        self._loaded = None

    def plain(self) -> dict:
        """The document as plain Python data (cached until the next edit); read it, never change it."""
        if self._plain is None:
            if self._doc is not None:
                self._plain = self._doc.unwrap()
            else:  # after undo or redo only the text is known; the plain reader is several times faster
                data, _problems = toml.parse_text(self._text)
                self._plain = data if data is not None else self.editable().unwrap()
        return self._plain

    def editable(self) -> toml.Document:
        """The editable document, parsed from the text when an edit first needs it."""
        if self._doc is None:
            self._doc = document_from_text(self._text, str(self.path or ""))
        return self._doc

    def saved(self) -> Prepared:
        """The profile as last saved (or as opened), through the same pipeline."""
        return self.session.prepare_text(self.saved_text, self.path)

    def get(self, key: Key, default=None):
        """The value at `key` (a copy of a table or list, which the caller may change), else `default`."""
        node = self.peek(key, default)
        return copy.deepcopy(node) if isinstance(node, (dict, list)) else node

    def count(self, key: Key) -> int:
        value = self.peek(key)  # only counted: not copied (the editor counts every list on every edit)
        return len(value) if isinstance(value, list) else 0

    def peek(self, key: Key, default=None):
        """The value at `key` itself, not a copy, else `default`: read it, never change it (as `plain`)."""
        node = self.plain()
        for part in key:
            try:
                node = node[part]
            except (KeyError, IndexError, TypeError):
                return default
        return node

    # --- editing -------------------------------------------------------------------------------
    def set(self, key: Key, value, label: str | None = None, merge: bool = True) -> None:
        """Set the value at `key` (creating tables on the way); None or "" removes an optional key."""
        def change(doc):
            parent = _walk(doc, key[:-1], create=True)
            if value is None or value == "":
                if isinstance(parent, dict) and key[-1] in parent:
                    del parent[key[-1]]
            else:
                parent[key[-1]] = value

        self.apply(change, label or f"Edit {key_text(key)}", hash(key) & 0x3FFFFFFF if merge else -1)

    def remove(self, key: Key, label: str | None = None) -> None:
        def change(doc):
            parent = _walk(doc, key[:-1])
            if parent is not None:
                del parent[key[-1]]

        self.apply(change, label or f"Remove {key_text(key)}")

    def apply(self, change, label: str, merge_id: int = -1) -> None:
        """Run `change(document)`; if the text changed, push it as one undoable step.

        The document is changed in place (copying a TOML document costs more than the whole
        edit); the text before is the snapshot, so a change that fails halfway is undone by
        reading that text back.
        """
        doc = self.editable()
        try:
            change(doc)
            after = toml.dumps(doc)
        except (KeyError, IndexError, TypeError, ValueError):
            self._doc = document_from_text(self._text, str(self.path or ""))
            return  # the edit does not apply to this document's shape: nothing happens
        if after != self._text:
            self.undo_stack.push(_Edit(self, self._text, after, label, merge_id, doc))

    def replace_text(self, text: str, label: str) -> None:
        """Replace the whole text as one undoable edit (restoring autosaved work)."""
        document_from_text(text, str(self.path or ""))  # raises FileProblem before anything changes
        if text != self._text:
            self.undo_stack.push(_Edit(self, self._text, text, label, -1))

    # --- structure ----------------------------------------------------------------------------
    def add_table(self, key: Key, values: dict, label: str, index: int | None = None) -> None:
        """Append (or insert at `index`) a table to the array of tables at `key`."""
        def change(doc):
            parent = _walk(doc, key[:-1], create=True)
            if key[-1] not in parent:
                parent[key[-1]] = toml.new_array_of_tables()
            table = toml.new_table()
            for k, v in values.items():
                table[k] = v
            aot = parent[key[-1]]
            aot.insert(len(aot) if index is None else index, table)

        self.apply(change, label)

    def duplicate_table(self, key: Key, index: int, rename: str, label: str) -> None:
        def change(doc):
            aot = _walk(doc, key)
            table = copy.deepcopy(aot[index])
            table["name"] = rename
            aot.insert(index + 1, table)

        self.apply(change, label)

    def move_table(self, key: Key, index: int, delta: int, label: str) -> None:
        def change(doc):
            aot = _walk(doc, key)
            target = index + delta
            if not 0 <= target < len(aot):
                raise IndexError(target)
            aot.insert(target, aot.pop(index))

        self.apply(change, label)

    # --- saving --------------------------------------------------------------------------------
    def save(self, path: Path | None = None, force: bool = False) -> None:
        """Write the document atomically; raises FileProblem and keeps the edits when it fails.

        Saving over its own file raises SaveConflict when that file changed on disk since this
        document read or wrote it, unless `force` (the person chose to overwrite that change).
        """
        target = Path(path) if path is not None else self.path
        if target is None:
            raise FileProblem(Msg("the profile has no file yet; choose where to save it"))
        # its own file by identity (device and inode), not by the path's text: Save as through a linked folder
        # onto the open file is a save over it, and checked as one
        own = self.path is not None and (target == self.path or same_file(target, self.path))
        # the check and the write under one lock: a save a few milliseconds later checks after this one has written
        with folder_lock(target):
            if not force and own and self.changed_on_disk():
                raise SaveConflict(Msg("{path}: was changed on disk since it was opened; saving would overwrite "
                                       "that change", path=str(target)))
            if self.migrated_from is not None and own and target.is_file():
                backup = backup_path(target, self.migrated_from)
                if not backup.exists():  # the first save over an older file keeps that file
                    write_atomic(backup, read_bytes(target))
            write_atomic(target, self._text)
            written = self._text.encode("utf-8")
            try:
                info = os.stat(target)
                self.disk = DiskState(hashlib.sha256(written).hexdigest(), info.st_mtime_ns, info.st_size)
            except OSError:
                self.disk = None
        self.migrated_from = None if file_format(self._text) != 0 else self.migrated_from
        self.path = target
        self._told = None
        self._watch()
        self.saved_text = self._text
        self._loaded = None
        self._plain = None
        self.undo_stack.setClean()
        self.changed.emit()

    # --- the file on disk ------------------------------------------------------------------------
    def changed_on_disk(self) -> bool:
        """Whether the file now holds other bytes than this document read or wrote (or is gone)."""
        return self._sha_on_disk() is not None

    def _sha_on_disk(self) -> str | None:
        """The hash of what the file holds now when it differs from what was read or written ("" gone), else None."""
        if self.path is None or self.disk is None:
            return None
        try:
            _data, now = disk_state(self.path)
        except FileProblem:
            return ""  # deleted, or replaced by something unreadable: not what we read
        return None if now.sha256 == self.disk.sha256 else now.sha256

    def reload_from_disk(self) -> None:
        """Replace the text with the file's, as one undoable edit; the document is then clean (as saved)."""
        data, state = disk_state(self.path)
        text = decode_text(data, self.path)
        document_from_text(text, str(self.path))  # raises FileProblem before anything changes
        if text != self._text:
            self.undo_stack.push(_Edit(self, self._text, text, "Reload from disk", -1))
        self.disk = state
        self._told = None
        self.saved_text = text
        self.undo_stack.setClean()
        self._watch()

    def _watch(self) -> None:
        """Watch the file and its folder; an atomic replace drops the file's watch, so it is added again."""
        if self.path is None:
            return
        real = Path(os.path.realpath(self.path))
        wanted = [str(p) for p in (real, real.parent) if p.exists()]
        stale = [p for p in self._watcher.files() + self._watcher.directories() if p not in wanted]
        if stale:
            self._watcher.removePaths(stale)
        missing = [p for p in wanted if p not in self._watcher.files() + self._watcher.directories()]
        if missing:
            self._watcher.addPaths(missing)

    def _disk_event(self, _path: str) -> None:
        self._watch()
        now = self._sha_on_disk()
        if now is not None and now != self._told:  # one signal per change, however many events it makes
            self._told = now
            self.changedOnDisk.emit()

    def _load_text(self, text: str, parsed=None) -> None:
        self._doc = parsed  # None: parsed again only if another edit comes (undo and redo need just the text)
        self._text = text
        self._loaded = None
        self._plain = None
        self.changed.emit()


def _walk(doc, key: Key, create: bool = False):
    node = doc
    for part in key:
        if isinstance(part, str) and create and part not in node:
            node[part] = toml.new_table()
        node = node[part]
    return node
