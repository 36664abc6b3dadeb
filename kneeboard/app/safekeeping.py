"""Nothing a person typed is lost: another program's change to the open file, and a crash.

Part of the controller (`app.controller.Controller`, which supplies the document, the recovery folder and the
person's answers); no widget. When the open file changes on disk, a profile without unsaved edits takes the change
(one undoable step) and one with edits asks; after a crash, the edits copied aside every few seconds are offered
back on the next start.
"""

from pathlib import Path

from kneeboard.app.recovery import Pending, key_for
from kneeboard.app.words import tr
from kneeboard.fileio import FileProblem
from kneeboard.problems import printable


class Safekeeping:
    def __init__(self, controller):
        self.c = controller
        self._autosaved: tuple[str, str] | None = None  # (recovery key, text) last copied aside
        self._asking_conflict = False
        self.recovery_off = False  #: the last copy could not be written (said once, until one can be again)

    # --- someone else changed the open file ------------------------------------------------------
    def changed_on_disk(self) -> None:
        """The watcher saw the file change: without unsaved edits take theirs (undoable), else ask."""
        doc = self.c.doc
        if self._asking_conflict or doc is None:
            return
        if not doc.modified:  # nothing of this window's would be lost
            try:
                doc.reload_from_disk()
                note = tr("{name} changed on disk and was reloaded (Undo brings back the earlier text)",
                          name=doc.path.name)
            except FileProblem:
                note = tr("{name} changed on disk and cannot be read now; saving will ask first", name=doc.path.name)
            self.c.status.emit(note, 8000)
            return
        self.settle_conflict()

    def settle_conflict(self, answer: str | None = None) -> bool:
        """Ask (unless answered) what to do about the file's change on disk; True when the edits are now saved."""
        if answer is None:
            self._asking_conflict = True
            try:
                answer = self.c.ui.ask_conflict()
            finally:
                self._asking_conflict = False
        try:
            if answer == "reload":
                self.c.doc.reload_from_disk()
                self.forget_autosave()
                return False
            if answer == "overwrite":
                self.c.doc.save(force=True)
                self.c.after_save()
                return True
        except FileProblem as exc:
            self.c.ui.show_problems(tr("The profile was not saved") if answer == "overwrite" else
                                    tr("The file cannot be read"), f"{exc}\n" + tr("Your changes are still here."))
            return False
        return self.c.save_as() if answer == "save-as" else False

    # --- crash recovery ------------------------------------------------------------------------
    def _recovery_key(self) -> str:
        return key_for(self.c.doc.path, self.c.doc.untitled_id)

    def autosave(self) -> Path | None:
        """Copy unsaved edits aside (every AUTOSAVE_MS); nothing is written when nothing changed."""
        doc, recovery = self.c.doc, self.c.recovery
        if doc is None or not doc.modified:
            return None
        key, text = self._recovery_key(), doc.text()
        if self._autosaved == (key, text):
            return None
        if self._autosaved is not None and self._autosaved[0] != key:
            recovery.discard(self._autosaved[0])
        base = doc.disk.sha256 if doc.disk is not None else None  # what the edits started from
        try:
            path = recovery.save(key, doc.path, text, base)
        except FileProblem as exc:
            # a full or read-only disk must not interrupt the editing itself, but the person must know that a crash
            # would now lose the edits: said once in the window, retried quietly at every tick
            self._recovery_failed(str(exc))
            return None
        self._autosaved = (key, text)
        if self.recovery_off:
            self.recovery_off = False
            self.c.recoveryNote.emit("", "")
            self.c.status.emit(tr("Unsaved edits are copied aside again for crash recovery."), 8000)
        return path

    def _recovery_failed(self, reason: str) -> None:
        if self.recovery_off:
            return
        self.recovery_off = True
        self.c.recoveryNote.emit(tr("Crash recovery is off, save often: {reason}", reason=printable(reason)),
                                 tr("Unsaved edits cannot be copied aside into {folder}, so a crash would lose them. "
                                    "kneeboard tries again every few seconds.", folder=str(self.c.recovery.folder)))

    def forget_autosave(self) -> None:
        if self._autosaved is not None:
            self.c.recovery.discard(self._autosaved[0])
            self._autosaved = None
        if self.c.doc is not None:
            self.c.recovery.discard(self._recovery_key())

    def offer_recovery(self) -> int:
        """After a crash: offer each autosaved set of edits back; returns how many were restored."""
        restored, recovery = 0, self.c.recovery
        for pending in recovery.pending():
            if not self.c.ui.ask_restore(pending):
                recovery.remove(pending)  # declined: forgotten
                continue
            outcome = self.restore(pending)
            if outcome == "restored":
                restored += 1
            if outcome in ("restored", "theirs"):
                recovery.remove(pending)  # the edits are in the window now, and autosaved from there
            # a restore that failed or was put off keeps its record: offered again at the next start, never lost
        if recovery.unreadable:
            self.c.ui.show_problems(tr("Unsaved edits that cannot be read"), "\n".join(recovery.unreadable))
        return restored

    def restore(self, pending: Pending) -> str:
        """"restored", "theirs" (the file changed and the person kept it), or "failed" / "later" (record kept)."""
        c = self.c
        if pending.path is not None and pending.path.is_file():
            if not c.open_profile(pending.path):
                return "failed"
            # the edits were made to the file as it was then: another program may have changed it since, and
            # putting the edits back would silently revert that change
            if pending.base is not None and c.doc.disk is not None and c.doc.disk.sha256 != pending.base:
                answer = c.ui.ask_restore_changed(pending)
                if answer != "restore":
                    return answer if answer == "theirs" else "later"
        else:
            try:
                from kneeboard.app.document import ProfileDocument

                c.set_document(ProfileDocument(pending.text, None, c, session=c.session))
            except FileProblem:
                return "failed"
            c.doc.undo_stack.resetClean()
            return "restored"
        try:
            c.doc.replace_text(pending.text, tr("Restore unsaved changes"))
        except FileProblem:
            return "failed"
        return "restored"
