"""Nothing a person typed is lost: another program's change to the open file, and a crash.

A mixin of MainWindow (which supplies doc, session, recovery and the question hooks). When the open file changes
on disk, a window without unsaved edits takes the change (one undoable step) and one with edits asks; after a
crash, the edits copied aside every few seconds are offered back on the next start.
"""

from pathlib import Path

from PySide6.QtWidgets import QMessageBox

from kneeboard.app.recovery import Pending, key_for
from kneeboard.fileio import FileProblem
from kneeboard.problems import printable


class Safekeeping:
    # --- someone else changed the open file ------------------------------------------------------
    def _changed_on_disk(self) -> None:
        """The watcher saw the file change: without unsaved edits take theirs (undoable), else ask."""
        if self._asking_conflict or self.doc is None:
            return
        if not self.doc.modified:  # nothing of this window's would be lost
            try:
                self.doc.reload_from_disk()
                note = "changed on disk and was reloaded (Undo brings back the earlier text)"
            except FileProblem:
                note = "changed on disk and cannot be read now; saving will ask first"
            self.statusBar().showMessage(f"{self.doc.path.name} {note}", 8000)
            return
        self._settle_conflict()

    def _settle_conflict(self, answer: str | None = None) -> bool:
        """Ask (unless answered) what to do about the file's change on disk; True when the edits are now saved."""
        if answer is None:
            self._asking_conflict = True
            try:
                answer = self.ask_conflict()
            finally:
                self._asking_conflict = False
        try:
            if answer == "reload":
                self.doc.reload_from_disk()
                self._forget_autosave()
                return False
            if answer == "overwrite":
                self.doc.save(force=True)
                self._after_save()
                return True
        except FileProblem as exc:
            self.show_problems("The profile was not saved" if answer == "overwrite" else "The file cannot be read",
                               f"{exc}\nYour changes are still here.")
            return False
        return self.save_as() if answer == "save-as" else False

    def _ask_conflict(self) -> str:
        name = self.doc.path.name if self.doc.path else "the profile"
        box = QMessageBox(QMessageBox.Icon.Warning, "Changed on disk",
                          f"{name} was changed on disk by someone else since you opened it.", parent=self)
        choices = {box.addButton("Reload theirs", QMessageBox.ButtonRole.DestructiveRole): "reload",
                   box.addButton("Keep mine (overwrite)", QMessageBox.ButtonRole.AcceptRole): "overwrite",
                   box.addButton("Save mine as…", QMessageBox.ButtonRole.ActionRole): "save-as"}
        box.setDefaultButton(box.addButton(QMessageBox.StandardButton.Cancel))
        box.exec()
        return choices.get(box.clickedButton(), "cancel")

    # --- crash recovery ------------------------------------------------------------------------
    def _recovery_key(self) -> str:
        return key_for(self.doc.path, self.doc.untitled_id)

    def autosave(self) -> Path | None:
        """Copy unsaved edits aside (every AUTOSAVE_MS); nothing is written when nothing changed."""
        if self.doc is None or not self.doc.modified:
            return None
        key, text = self._recovery_key(), self.doc.text()
        if self._autosaved == (key, text):
            return None
        if self._autosaved is not None and self._autosaved[0] != key:
            self.recovery.discard(self._autosaved[0])
        base = self.doc.disk.sha256 if self.doc.disk is not None else None  # what the edits started from
        try:
            path = self.recovery.save(key, self.doc.path, text, base)
        except FileProblem as exc:
            # a full or read-only disk must not interrupt the editing itself, but the person must know that a crash
            # would now lose the edits: said once in the window, retried quietly at every tick
            self._recovery_failed(str(exc))
            return None
        self._autosaved = (key, text)
        if not self.recovery_note.isHidden():
            self.recovery_note.hide()
            self.statusBar().showMessage("Unsaved edits are copied aside again for crash recovery.", 8000)
        return path

    def _recovery_failed(self, reason: str) -> None:
        if not self.recovery_note.isHidden():
            return
        self.recovery_note.setText(f"Crash recovery is off, save often: {printable(reason)}")
        self.recovery_note.setToolTip(f"Unsaved edits cannot be copied aside into {self.recovery.folder}, so a "
                                      "crash would lose them. kneeboard tries again every few seconds.")
        self.recovery_note.show()

    def _forget_autosave(self) -> None:
        if self._autosaved is not None:
            self.recovery.discard(self._autosaved[0])
            self._autosaved = None
        if self.doc is not None:
            self.recovery.discard(self._recovery_key())

    def offer_recovery(self) -> int:
        """After a crash: offer each autosaved set of edits back; returns how many were restored."""
        restored = 0
        for pending in self.recovery.pending():
            if not self.ask_restore(pending):
                self.recovery.remove(pending)  # declined: forgotten
                continue
            outcome = self._restore(pending)
            if outcome == "restored":
                restored += 1
            if outcome in ("restored", "theirs"):
                self.recovery.remove(pending)  # the edits are in the window now, and autosaved from there
            # a restore that failed or was put off keeps its record: offered again at the next start, never lost
        if self.recovery.unreadable:
            self.show_problems("Unsaved edits that cannot be read", "\n".join(self.recovery.unreadable))
        return restored

    def _restore(self, pending: Pending) -> str:
        """"restored", "theirs" (the file changed and the person kept it), or "failed" / "later" (record kept)."""
        if pending.path is not None and pending.path.is_file():
            if not self.open_profile(pending.path):
                return "failed"
            # the edits were made to the file as it was then: another program may have changed it since, and
            # putting the edits back would silently revert that change
            if pending.base is not None and self.doc.disk is not None and self.doc.disk.sha256 != pending.base:
                answer = self.ask_restore_changed(pending)
                if answer != "restore":
                    return answer if answer == "theirs" else "later"
        else:
            try:
                from kneeboard.app.document import ProfileDocument

                self._set_document(ProfileDocument(pending.text, None, self, session=self.session))
            except FileProblem:
                return "failed"
            self.doc.undo_stack.resetClean()
            return "restored"
        try:
            self.doc.replace_text(pending.text, "Restore unsaved changes")
        except FileProblem:
            return "failed"
        return "restored"

    def _ask_restore(self, pending: Pending) -> bool:
        name = pending.path.name if pending.path else "a new profile"
        where = (f" It was written on the machine named {pending.host!r} (this machine under an earlier name, or "
                 "another one sharing this folder); if kneeboard still runs there, its edits are that window's."
                 if pending.host else "")
        answer = QMessageBox.question(
            self, "Restore unsaved changes?",
            f"kneeboard stopped at {pending.when} with unsaved changes to {name}.{where} Restore them? "
            "(No discards them.)",
        )
        return answer == QMessageBox.StandardButton.Yes

    def _ask_restore_changed(self, pending: Pending) -> str:
        """The file changed since the edits began: -> "restore" (mine over theirs) | "theirs" | "later"."""
        box = QMessageBox(QMessageBox.Icon.Warning, "Changed since the crash",
                          f"{pending.path.name} was changed by another program after kneeboard stopped. Restoring "
                          "your unsaved changes would replace that change.", parent=self)
        choices = {box.addButton("Restore mine (replace theirs)", QMessageBox.ButtonRole.DestructiveRole): "restore",
                   box.addButton("Keep theirs, discard mine", QMessageBox.ButtonRole.RejectRole): "theirs"}
        box.setDefaultButton(box.addButton("Decide later", QMessageBox.ButtonRole.ActionRole))
        box.exec()
        return choices.get(box.clickedButton(), "later")

    def _update_title(self) -> None:
        if self.doc is None:
            self.setWindowTitle("kneeboard")
            return
        name = self.doc.path.name if self.doc.path else "new profile"
        loaded = self.doc.loaded
        reg = loaded.profile.aircraft.registration if loaded.profile else ""
        self.setWindowTitle(f"{reg + ' — ' if reg else ''}{name}[*] — kneeboard")
        self.setWindowModified(self.doc.modified)

