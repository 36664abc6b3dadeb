"""The main window: the fleet on the left, the open profile's editor in the middle, and on the right
the key figures and the card exactly as it will print.
"""

from pathlib import Path

from PySide6.QtCore import QSettings, Qt, QTimer
from PySide6.QtGui import QAction, QKeySequence
from PySide6.QtWidgets import (
    QFileDialog,
    QLabel,
    QMainWindow,
    QMessageBox,
    QSplitter,
    QVBoxLayout,
    QWidget,
)

from kneeboard import shipped
from kneeboard.app.actions import CardActions
from kneeboard.app.fleet import FleetPanel
from kneeboard.app.preview import CardPreview
from kneeboard.app.readout import Readout
from kneeboard.app.recovery import AUTOSAVE_MS, Recovery
from kneeboard.app.safekeeping import Safekeeping
from kneeboard.app.session import Session
from kneeboard.fileio import FileProblem
from kneeboard.texts import CAUTION, CAUTION_SHORT

MAX_RECENT = 8
DEBOUNCE_MS = 0  #: edits of one event-loop turn share a render; the preview drops stale renders itself


class MainWindow(CardActions, Safekeeping, QMainWindow):
    def __init__(self, settings: QSettings | None = None, recovery_dir: Path | None = None):
        super().__init__()
        self.settings = settings or QSettings("kneeboard", "kneeboard")
        if recovery_dir is None:
            from kneeboard.app.main import data_folder

            recovery_dir = data_folder() / "recovery"
        self.recovery = Recovery(recovery_dir)
        self._autosaved: tuple[str, str] | None = None  # (recovery key, text) last copied aside
        self.doc = None  #: the open profile (app.document.ProfileDocument), or None
        self.editor = None  #: its editor (app.editor.ProfileEditor)
        self.session = Session()  #: the folder, the style, what was printed: everything but the widgets
        self._card_request = 0  #: the preview generation of the open profile's card as it prints
        self._requested = None  #: what the newest preview request draws: (fingerprint, style, logo, mode, date)
        self.setAcceptDrops(True)
        # hooks a test replaces: the questions and file choices a person would answer
        self.ask_unsaved = self._ask_unsaved
        self.ask_restore = self._ask_restore
        self.ask_restore_changed = self._ask_restore_changed  # -> "restore" | "theirs" | "later"
        self.ask_save_path = self._ask_save_path
        self.show_problems = self._show_problems
        self.ask_conflict = self._ask_conflict  # -> "reload" | "overwrite" | "save-as" | "cancel"
        self._asking_conflict = False

        self.ask_open_path = self._ask_open_path
        self.ask_category = self._ask_category  # -> "normal" | "utility" | "acrobatic" | "glider" | None
        self.fleet = FleetPanel(self.session.prepare_source)
        self.fleet.opened.connect(self.open_profile)
        self.fleet.open_folder.clicked.connect(self._open_folder_dialog)
        self.editor_holder = QWidget()
        QVBoxLayout(self.editor_holder).setContentsMargins(0, 0, 0, 0)
        self.readout = Readout()
        self.preview = CardPreview()
        self.preview.modeChanged.connect(lambda _mode: self.schedule_preview())
        self.preview_note = QLabel()
        self.preview_note.setWordWrap(True)
        self.preview_note.setStyleSheet("color: #A11D1D;")
        self.preview_note.hide()
        right = QWidget()
        rbox = QVBoxLayout(right)
        rbox.setContentsMargins(0, 0, 0, 0)
        rbox.addWidget(self.readout)
        rbox.addWidget(self.preview_note)
        rbox.addWidget(self.preview, 1)
        split = QSplitter(Qt.Orientation.Horizontal)
        split.addWidget(self.fleet)
        split.addWidget(self.editor_holder)
        split.addWidget(right)
        split.setStretchFactor(0, 0)
        split.setStretchFactor(1, 2)
        split.setStretchFactor(2, 3)
        split.setSizes([230, 520, 650])
        self.setCentralWidget(split)
        self.timer = QTimer(self)
        self.timer.setSingleShot(True)
        self.timer.setInterval(DEBOUNCE_MS)
        self.timer.timeout.connect(self._update_card)
        self.autosave_timer = QTimer(self)
        self.autosave_timer.setInterval(AUTOSAVE_MS)
        self.autosave_timer.timeout.connect(self.autosave)
        self.autosave_timer.start()
        self._menus()
        # the caution is always on screen, not only on first start and in Help
        self.caution = QLabel(CAUTION_SHORT)
        self.caution.setToolTip(CAUTION)
        self.caution.setStyleSheet("color: #5a3b00;")
        # at the right, its natural width: the left keeps room for confirmations ("... exported to PATH")
        self.statusBar().addPermanentWidget(self.caution)
        self.recovery_note = QLabel()  # shown while unsaved edits cannot be copied aside (safekeeping.py)
        self.recovery_note.setStyleSheet("color: #A11D1D; font-weight: bold;")
        self.recovery_note.hide()
        self.statusBar().addPermanentWidget(self.recovery_note)
        self.resize(1400, 900)
        geometry = self.settings.value("window/geometry")
        if geometry is not None:
            self.restoreGeometry(geometry)
        self._update_title()

    # --- menus ---------------------------------------------------------------------------------
    def _action(self, menu, text, slot, shortcut=None) -> QAction:
        action = QAction(text, self)
        if shortcut is not None:
            action.setShortcut(shortcut)
        action.triggered.connect(lambda _checked=False: slot())  # a slot never gets `checked` as an argument
        menu.addAction(action)
        return action

    def _menus(self):
        bar = self.menuBar()
        m = bar.addMenu("&File")
        self.act_new_profile = self._action(m, "&New profile…", self._new_profile_dialog, QKeySequence.StandardKey.New)
        new = m.addMenu("New profile from &template")
        self.act_new = {}
        for category in shipped.CATEGORIES_WITH_TEMPLATES:
            self.act_new[category] = self._action(new, category.capitalize(),
                                                  lambda c=category: self.new_profile(c))
        self.act_open = self._action(m, "&Open profile…", self._open_dialog, QKeySequence.StandardKey.Open)
        self.act_open_folder = self._action(m, "Open &folder…", self._open_folder_dialog)
        self.recent_menu = m.addMenu("Open &recent")
        m.addSeparator()
        self.act_save = self._action(m, "&Save", self.save, QKeySequence.StandardKey.Save)
        self.act_save_as = self._action(m, "Save &as…", self.save_as, QKeySequence.StandardKey.SaveAs)
        m.addSeparator()
        self.act_export = self._action(m, "&Export card as PDF…", self.export_card)
        self.act_export_fleet = self._action(m, "Export the &fleet…", self.export_fleet)
        self.act_export_csv = self._action(m, "Export table as &CSV…", self.export_csv)
        self.act_print = self._action(m, "&Print card…", self.print_card, QKeySequence.StandardKey.Print)
        m.addSeparator()
        self.act_quit = self._action(m, "&Quit", self.close, QKeySequence.StandardKey.Quit)
        e = bar.addMenu("&Edit")
        self.act_undo = self._action(e, "&Undo", lambda: self.doc and self.doc.undo_stack.undo(),
                                     QKeySequence.StandardKey.Undo)
        self.act_redo = self._action(e, "&Redo", lambda: self.doc and self.doc.undo_stack.redo(),
                                     QKeySequence.StandardKey.Redo)
        e.addSeparator()
        self.act_compare_saved = self._action(e, "Changes since &saved…", self.compare_with_saved)
        c = bar.addMenu("&Card")
        self.act_compare_printed = self._action(c, "&Compare with the printed card…", self.compare_with_printed)
        c.addSeparator()
        self.act_edit_style = self._action(c, "Edit the fleet's card &style…", self.edit_style)
        self.act_pick_style = self._action(c, "&Use another style file…", self._pick_style)
        self.act_folder_style = self._action(c, "Use the &folder's style", self.use_folder_style)
        h = bar.addMenu("&Help")
        self.act_formulas = self._action(h, "&Formulas and sources", self.show_formulas,
                                         QKeySequence.StandardKey.HelpContents)
        self.act_caution = self._action(h, "&Caution", lambda: QMessageBox.information(self, "Caution", CAUTION))
        self._rebuild_recent()

    # --- opening -------------------------------------------------------------------------------
    def open_path(self, path: Path) -> None:
        """A profile file, or a folder (its first profile opens)."""
        path = Path(path)
        if path.is_dir():
            self.open_folder(path)
        else:
            self.open_profile(path)

    def show_fleet(self, path: Path) -> None:
        """List the fleet of `path` (a folder, or a profile's folder) without reading any profile's figures:
        what the first frame shows, before the units library and the card machinery are loaded."""
        path = Path(path).resolve()
        self.fleet.show_folder(path if path.is_dir() else path.parent, None if path.is_dir() else path)

    def open_folder(self, folder: Path) -> None:
        folder = Path(folder).resolve()
        self.session.use_folder(folder)
        self._forget_prepared()
        if self.fleet.folder != folder:  # listed already when the window first showed it
            self.fleet.show_folder(folder, self.doc.path if self.doc is not None else None)
        self.settings.setValue("last_folder", str(folder))
        rows = self.fleet.rows()
        if self.doc is not None and self.doc.path is not None and self.doc.path.parent == folder:
            return
        if rows:
            self.open_profile(Path(rows[0][2]))
        elif self.doc is not None and self.maybe_save():
            self._close_document()  # the aircraft of another folder must not look like one of this fleet

    def open_profile(self, path: Path) -> bool:
        path = Path(path).resolve()
        if self.doc is not None and self.doc.path == path:
            return True
        if not self.maybe_save():
            self._show_open_in_fleet()  # the click is undone: the profile still edited stays highlighted
            return False
        if self.session.folder != path.parent:
            self.session.use_folder(path.parent)
        from kneeboard.app.document import ProfileDocument

        try:
            doc = ProfileDocument.open(path, self, self.session)
        except FileProblem as exc:
            self.show_problems(f"Cannot open {path.name}", str(exc))
            self._show_open_in_fleet()
            return False
        if self.fleet.folder != path.parent:
            self.fleet.show_folder(path.parent, path)
            self.settings.setValue("last_folder", str(path.parent))
        else:
            self.fleet.select(path)
        self._set_document(doc)
        self._remember(path)
        if doc.loaded.errors:
            self.show_problems(f"{path.name} has problems",
                               "\n".join(str(p).removeprefix(f"{path}: ") for p in doc.loaded.errors))
        return True

    def _show_open_in_fleet(self) -> None:
        """The fleet highlights the profile being edited; a new one, not yet saved in the fleet, highlights none."""
        self.fleet.select(self.doc.path if self.doc is not None else None)

    def _new_profile_dialog(self) -> None:
        """File › New profile (Ctrl+N): a template of the category asked for, the open profile's by default."""
        current = self.doc.loaded.profile.aircraft.category if self.doc is not None and \
            self.doc.loaded.profile is not None else "normal"
        category = self.ask_category(current)
        if category is not None:
            self.new_profile(category)

    def _ask_category(self, current: str) -> str | None:
        from PySide6.QtWidgets import QInputDialog

        names = list(shipped.CATEGORIES_WITH_TEMPLATES)
        labels = [name.capitalize() for name in names]
        dialog = QInputDialog(self)
        dialog.setWindowTitle("New profile")
        dialog.setLabelText("The aircraft's category (its template's figures are placeholders to replace):")
        dialog.setComboBoxItems(labels)
        dialog.setComboBoxEditable(False)
        dialog.setTextValue(labels[names.index(current)] if current in names else labels[0])
        return names[labels.index(dialog.textValue())] if dialog.exec() else None

    def new_profile(self, category: str) -> None:
        if not self.maybe_save():
            return
        from kneeboard.app.document import ProfileDocument

        text = shipped.template_path(category).read_text(encoding="utf-8")
        self._set_document(ProfileDocument(text, None, self, session=self.session))
        self.fleet.select(None)  # the new profile is none of the fleet's aircraft
        self.statusBar().showMessage(
            f"A new {category} profile: type your aircraft's flight-manual figures over its placeholders.", 12000)

    def _set_document(self, doc) -> None:
        from kneeboard.app.editor import ProfileEditor

        if self.doc is not None:
            self.doc.deleteLater()
        old = self.editor
        self.doc = doc
        self.editor = ProfileEditor(doc)
        self.editor_holder.layout().addWidget(self.editor)
        if old is not None:
            old.setParent(None)
            old.deleteLater()
        doc.changed.connect(self.schedule_preview)
        doc.changed.connect(self._update_title)
        doc.modifiedChanged.connect(lambda _m: self._update_title())
        doc.changedOnDisk.connect(self._changed_on_disk)
        self.act_undo.setEnabled(True)
        self._update_title()
        self.schedule_preview()

    def _close_document(self) -> None:
        """No profile open: an empty editor, no figures, no card."""
        if self.editor is not None:
            self.editor.setParent(None)
            self.editor.deleteLater()
        if self.doc is not None:
            self.doc.deleteLater()
        self.doc = self.editor = None
        self.preview.clear()
        self._requested = None
        self.readout.show_nothing("No profile open: choose one in the fleet, or make one with File › New profile.")
        self._update_title()

    def _forget_prepared(self) -> None:
        """The style may have changed: every figure is prepared again, and every profile of the fleet checked."""
        self.fleet.recheck()
        if self.doc is not None:
            self.doc.forget()
            if self.editor is not None:
                self.editor.refresh()
        self.schedule_preview()

    def use_folder_style(self) -> None:
        """Back to the one rule: the folder's fleet.style.toml, else the shipped default."""
        self.session.use_style_file(None)
        self._forget_prepared()
        self.statusBar().showMessage(f"The cards use {self._style_name()}.", 6000)

    def _style_name(self) -> str:
        path = self.session.style_path(self.doc.path if self.doc is not None else None)
        return f"the style {path.name}" if path is not None else "the default style"

    # --- the card --------------------------------------------------------------------------------
    def schedule_preview(self) -> None:
        self.timer.start()

    def card(self, mode: str = "card"):
        """A job for the preview: the open profile's card (or a sheet of it) as PDF bytes, from immutable inputs."""
        prepared, session = self.doc.loaded, self.session

        def job() -> bytes:
            from kneeboard.pipeline import card_pdf, fleet_pdf

            c = session.card(prepared)
            return card_pdf(c) if mode == "card" else fleet_pdf([c], mode)

        return job

    def _update_card(self) -> None:
        if self.doc is None:
            return
        prepared = self.doc.loaded
        if prepared.table is None:
            n = len(prepared.errors)
            self.preview_note.setText(f"The card is not updated: the profile has {n} error(s) (see Problems).")
            self.preview_note.show()
            # the card on show was made before the error: greyed and named as not current, never left as if it were
            before = ("This is the card as it was before them; it is neither exported nor printed."
                      if self.preview.page_count() else "No card until they are fixed.")
            self.preview.mark_stale(f"NOT CURRENT: the profile has {n} error(s) (see Problems). {before}")
            self._requested = None
            self.readout.show_nothing("Fix the problems marked in the editor to see the figures.")
            return
        self.preview_note.hide()
        self.readout.show_table(prepared.table, prepared.fingerprint)
        mode = self.preview.mode()
        from kneeboard.pipeline import today

        # the card is a function of the data (its fingerprint), the style, the sheet and the date: an edit that
        # changes none of them ("1182.0 kg" for "1182 kg") prints the very same card, so nothing is drawn
        style = prepared.style
        key = (prepared.fingerprint, style, hash(style.logo_png), mode, today())
        if key == self._requested and not self.preview.error_text():
            return
        self._requested = key
        generation = self.preview.request(self.card(mode))
        self._card_request = generation if mode == "card" else 0

    # --- saving --------------------------------------------------------------------------------
    def save(self) -> bool:
        if self.doc is None:
            return True
        if self.doc.path is None:
            return self.save_as()
        from kneeboard.app.document import SaveConflict

        try:
            self.doc.save()
        except SaveConflict:
            return self._settle_conflict()
        except FileProblem as exc:
            self.show_problems("The profile was not saved", f"{exc}\nYour changes are still here.")
            return False
        self._after_save()
        return True

    def save_as(self) -> bool:
        if self.doc is None:
            return True
        start = self.doc.path or self._folder() / "new_profile.toml"
        path = self.ask_save_path("Save profile as", str(start), "Profiles (*.toml)")
        if path is None:
            return False
        from kneeboard.app.document import SaveConflict

        try:
            self.doc.save(path)
        except SaveConflict:  # the open file itself, reached by another path, changed on disk: asked as Save is
            return self._settle_conflict()
        except FileProblem as exc:
            self.show_problems("The profile was not saved", f"{exc}\nYour changes are still here.")
            return False
        self._after_save()
        return True

    def _folder(self) -> Path:
        """Where file dialogs start: the open fleet's folder, else the home folder."""
        return self.fleet.folder or Path.home()

    def _after_save(self):
        self._forget_autosave()
        self._remember(self.doc.path)
        self.fleet.show_folder(self.doc.path.parent, self.doc.path)
        self._update_title()

    def maybe_save(self) -> bool:
        """True when it is fine to drop the open document (saved, discarded, or nothing to save)."""
        if self.doc is None or not self.doc.modified:
            return True
        answer = self.ask_unsaved()
        if answer == "save":
            return self.save()
        if answer == "discard":
            self._forget_autosave()
            return True
        return False

    def _ask_unsaved(self) -> str:
        name = self.doc.path.name if self.doc.path else "the new profile"
        box = QMessageBox.question(
            self, "Unsaved changes", f"Save the changes to {name}?",
            QMessageBox.StandardButton.Save | QMessageBox.StandardButton.Discard | QMessageBox.StandardButton.Cancel,
        )
        return {QMessageBox.StandardButton.Save: "save", QMessageBox.StandardButton.Discard: "discard"}.get(
            box, "cancel")

    def _ask_save_path(self, title: str, start: str, filters: str) -> Path | None:
        path, _ = QFileDialog.getSaveFileName(self, title, start, filters)
        return Path(path) if path else None

    def _ask_open_path(self, title: str, start: str, filters: str) -> Path | None:
        path, _ = QFileDialog.getOpenFileName(self, title, start, filters)
        return Path(path) if path else None

    def _show_problems(self, title: str, text: str) -> None:
        QMessageBox.warning(self, title, text)

    def closeEvent(self, event):  # noqa: N802 - Qt's name
        if self.maybe_save():
            self.settings.setValue("window/geometry", self.saveGeometry())
            self._forget_autosave()
            self.autosave_timer.stop()
            self.timer.stop()
            event.accept()
        else:
            event.ignore()

    # --- recent files and drops ---------------------------------------------------------------
    def _remember(self, path: Path) -> None:
        path = Path(path).resolve()  # absolute: Open recent works from any folder the app is started in
        recent = [p for p in self.recent() if p != str(path)]
        self.settings.setValue("recent", [str(path)] + recent[: MAX_RECENT - 1])
        self._rebuild_recent()

    def recent(self) -> list[str]:
        value = self.settings.value("recent") or []
        return [value] if isinstance(value, str) else list(value)

    def _rebuild_recent(self) -> None:
        self.recent_menu.clear()
        for p in self.recent():
            self._action(self.recent_menu, p, lambda _=False, p=p: self.open_path(Path(p)))
        self.recent_menu.setEnabled(bool(self.recent()))

    def dragEnterEvent(self, event):  # noqa: N802 - Qt's name
        if any(u.isLocalFile() for u in event.mimeData().urls()):
            event.acceptProposedAction()

    def dropEvent(self, event):  # noqa: N802 - Qt's name
        for url in event.mimeData().urls():
            if url.isLocalFile():
                self.open_path(Path(url.toLocalFile()))
                event.acceptProposedAction()
                return

    def _open_dialog(self):
        path = self.ask_open_path("Open profile", str(self._folder()), "Profiles (*.toml)")
        if path is not None:
            self.open_profile(path)

    def _open_folder_dialog(self):
        path = self.ask_folder("Open fleet folder", str(self._folder()))
        if path is not None:
            self.open_folder(path)

    def ask_folder(self, title: str, start: str) -> Path | None:
        path = QFileDialog.getExistingDirectory(self, title, start)
        return Path(path) if path else None
