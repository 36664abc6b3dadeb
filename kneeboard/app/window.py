"""The main window: the fleet on the left, the open profile's editor in the middle, and on the right the key figures
and the card exactly as it will print.

The window builds the menus and the widgets and wires them to the controller (`app.controller.Controller`), which
owns every flow: opening, saving, changes on disk, crash recovery, exports, compare and the card's renders. The
window answers the controller's questions with dialogs (`ask_unsaved`, `ask_conflict`, `ask_save_path`,
`ask_open_path`, `ask_folder`, `ask_category`, `ask_restore`, `ask_restore_changed`, `ask_style`, `show_problems`);
a test replaces them with its answers.
"""

from pathlib import Path

from PySide6.QtCore import QSettings, Qt
from PySide6.QtGui import QAction, QActionGroup, QKeySequence
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
from kneeboard.app.controller import Controller
from kneeboard.app.fleet import home_relative
from kneeboard.app.fleet_panel import FleetPanel
from kneeboard.app.preview import CardPreview
from kneeboard.app.readout import Readout
from kneeboard.app.words import CATEGORY_NAMES, SYSTEM, Texts, tr
from kneeboard.i18n import LANGUAGES, N_
from kneeboard.problems import printable
from kneeboard.texts import CAUTION, CAUTION_SHORT


class MainWindow(QMainWindow):
    def __init__(self, settings: QSettings | None = None, recovery_dir: Path | None = None):
        super().__init__()
        self.controller = c = Controller(self, settings, recovery_dir, self)
        self.editor = None  #: the open profile's editor (app.editor.ProfileEditor)
        self.texts = Texts()  #: the window's own words, shown again when the language changes
        self.setAcceptDrops(True)
        self.fleet = FleetPanel(c.fleet)
        self.fleet.opened.connect(c.open_profile)
        self.fleet.open_folder.clicked.connect(c.open_folder_asked)
        self.fleet.reload.clicked.connect(c.reload_fleet)
        self.editor_holder = QWidget()
        QVBoxLayout(self.editor_holder).setContentsMargins(0, 0, 0, 0)
        self.readout = Readout()
        self.preview = CardPreview()
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
        self._menus()
        # the caution is always on screen, not only on first start and in Help
        self.caution = QLabel()
        self.texts.set(self.caution.setText, CAUTION_SHORT)
        self.texts.set(self.caution.setToolTip, CAUTION)
        self.caution.setStyleSheet("color: #5a3b00;")
        # at the right, its natural width: the left keeps room for confirmations ("... exported to PATH")
        self.statusBar().addPermanentWidget(self.caution)
        self.recovery_note = QLabel()  # shown while unsaved edits cannot be copied aside
        self.recovery_note.setStyleSheet("color: #A11D1D; font-weight: bold;")
        self.recovery_note.hide()
        self.statusBar().addPermanentWidget(self.recovery_note)
        self._wire()
        self.resize(1400, 900)
        geometry = c.settings.value("window/geometry")
        if geometry is not None:
            self.restoreGeometry(geometry)
        self._show_title("kneeboard", False)

    def _wire(self) -> None:
        c, preview = self.controller, self.preview
        c.documentChanged.connect(self._edit)
        c.restyled.connect(lambda: self.editor is not None and self.editor.refresh())
        c.titleChanged.connect(self._show_title)
        c.highlight.connect(self.fleet.select)
        c.figuresShown.connect(self._show_figures)
        c.figuresWithheld.connect(self.readout.show_nothing)
        c.cardReady.connect(lambda _generation, pdf, _ms: preview.show_pdf(pdf))
        c.cardFailed.connect(preview.show_error)
        c.cardStale.connect(self._card_stale)
        c.cardCleared.connect(preview.clear)
        c.renders.busyChanged.connect(preview.set_busy)
        preview.modeChanged.connect(c.set_preview_mode)
        c.status.connect(self.statusBar().showMessage)
        c.exported.connect(self.confirm_export)
        c.recoveryNote.connect(self._recovery_note)
        c.recentChanged.connect(self._rebuild_recent)
        c.languageChanged.connect(self._retranslate)

    # --- menus ---------------------------------------------------------------------------------
    def _action(self, menu, text, slot, shortcut=None, translate=True) -> QAction:
        action = QAction(self)
        if translate:
            self.texts.set(action.setText, text)
        else:  # a file's path, a language's own name: the same in every language
            action.setText(text)
        if shortcut is not None:
            action.setShortcut(shortcut)
        action.triggered.connect(lambda _checked=False: slot())  # a slot never gets `checked` as an argument
        menu.addAction(action)
        return action

    def _menu(self, parent, title):
        menu = parent.addMenu("")
        self.texts.set(menu.setTitle, title)
        return menu

    def _menus(self):
        c, out, keys = self.controller, self.controller.outputs, QKeySequence.StandardKey
        bar = self.menuBar()
        m = self._menu(bar, N_("&File"))
        self.act_new_profile = self._action(m, N_("&New profile…"), c.new_profile_asked, keys.New)
        new = self._menu(m, N_("New profile from &template"))
        self.act_new = {}
        for category in shipped.CATEGORIES_WITH_TEMPLATES:
            self.act_new[category] = self._action(new, CATEGORY_NAMES.get(category, category.capitalize()),
                                                  lambda x=category: c.new_profile(x))
        self.act_open = self._action(m, N_("&Open profile…"), c.open_asked, keys.Open)
        self.act_open_folder = self._action(m, N_("Open &folder…"), c.open_folder_asked)
        self.recent_menu = self._menu(m, N_("Open &recent"))
        m.addSeparator()
        self.act_save = self._action(m, N_("&Save"), c.save, keys.Save)
        self.act_save_as = self._action(m, N_("Save &as…"), c.save_as, keys.SaveAs)
        m.addSeparator()
        self.act_export = self._action(m, N_("&Export card as PDF…"), out.export_card)
        self.act_export_fleet = self._action(m, N_("Export the &fleet…"), out.export_fleet)
        self.act_export_csv = self._action(m, N_("Export table as &CSV…"), out.export_csv)
        self.act_print = self._action(m, N_("&Print card…"), out.print_card, keys.Print)
        m.addSeparator()
        self.act_quit = self._action(m, N_("&Quit"), self.close, keys.Quit)
        e = self._menu(bar, N_("&Edit"))
        self.act_undo = self._action(e, N_("&Undo"), lambda: c.doc and c.doc.undo_stack.undo(), keys.Undo)
        self.act_redo = self._action(e, N_("&Redo"), lambda: c.doc and c.doc.undo_stack.redo(), keys.Redo)
        e.addSeparator()
        self.act_compare_saved = self._action(e, N_("Changes since &saved…"),
                                              lambda: self._compare(out.compare_with_saved()))
        k = self._menu(bar, N_("&Card"))
        self.act_compare_printed = self._action(k, N_("&Compare with the printed card…"),
                                                lambda: self._compare(out.compare_with_printed()))
        k.addSeparator()
        self.act_edit_style = self._action(k, N_("Edit the fleet's card &style…"), self.edit_style)
        self.act_pick_style = self._action(k, N_("&Use another style file…"), out.pick_style)
        self.act_folder_style = self._action(k, N_("Use the &folder's style"), lambda: c.use_style_file(None))
        s = self._menu(bar, N_("&Settings"))
        self.language_menu = self._menu(s, N_("&Language"))
        self.act_language, group = {}, QActionGroup(self)
        for code, name in {"": SYSTEM, **LANGUAGES}.items():  # each language named in its own words
            action = self._action(self.language_menu, name, lambda x=code: c.set_language(x), translate=not code)
            action.setCheckable(True)
            action.setChecked(code == c.chosen_language())
            group.addAction(action)
            self.act_language[code] = action
        h = self._menu(bar, N_("&Help"))
        self.act_formulas = self._action(h, N_("&Formulas and sources"), self.show_formulas, keys.HelpContents)
        self.act_caution = self._action(h, N_("&Caution"), self.show_caution)
        self._rebuild_recent()

    def _rebuild_recent(self) -> None:
        self.recent_menu.clear()
        recent = self.controller.recent()
        for p in recent:
            self._action(self.recent_menu, p, lambda p=p: self.controller.open_path(Path(p)), translate=False)
        self.recent_menu.setEnabled(bool(recent))

    # --- what the controller shows ---------------------------------------------------------------
    @property
    def doc(self):
        """The open profile (app.document.ProfileDocument), or None."""
        return self.controller.doc

    @property
    def session(self):
        return self.controller.session

    def _edit(self, doc) -> None:
        """A new profile to edit (None: none): its editor replaces the one before."""
        old, self.editor = self.editor, None
        if doc is not None:
            from kneeboard.app.editor import ProfileEditor

            self.editor = ProfileEditor(doc)  # its words in the app's language: built again when that changes
            self.editor_holder.layout().addWidget(self.editor)
        if old is not None:
            old.setParent(None)
            old.deleteLater()

    def _show_title(self, title: str, modified: bool) -> None:
        self.setWindowTitle(title)
        self.setWindowModified(modified)

    def _show_figures(self, table, fingerprint: str) -> None:
        self.preview_note.hide()
        self.readout.show_table(table, fingerprint)

    def _card_stale(self, note: str, over: str) -> None:
        self.preview_note.setText(note)
        self.preview_note.show()
        self.preview.mark_stale(over)

    def _recovery_note(self, text: str, tip: str) -> None:
        self.recovery_note.setText(text)
        self.recovery_note.setToolTip(tip)
        self.recovery_note.setVisible(bool(text))

    def confirm_export(self, what: str, path: Path) -> None:
        """"Exported WHAT: NAME in FOLDER" in the status bar, whole: left of the caution, the folder shortened in
        its middle when the room is short, so the name of the file written is always on screen."""
        bar, path = self.statusBar(), Path(path)
        head = tr("Exported {what}: {name}", what=what, name=printable(path.name))
        metrics = bar.fontMetrics()
        room = self.caution.geometry().left() - metrics.horizontalAdvance(tr("{head} in {folder}", head=head,
                                                                                  folder=""))
        room -= 3 * metrics.averageCharWidth()  # the status bar's own margins
        folder = metrics.elidedText(printable(home_relative(path.parent)),
                                    Qt.TextElideMode.ElideMiddle, max(room, 0))
        bar.showMessage(tr("{head} in {folder}", head=head, folder=folder) if len(folder) > 2 else head, 15000)

    def _compare(self, comparison):
        if comparison is None:
            return None
        from kneeboard.app.dialogs import CompareDialog

        dialog = CompareDialog(comparison.changes, comparison.registration, self, columns=comparison.columns,
                               since=comparison.since)
        dialog.show()
        return dialog

    def edit_style(self):
        """Card › Edit the fleet's card style: the dialog comes back with the entries while the file cannot be
        written, until the person saves or cancels."""
        out = self.controller.outputs
        edit = out.style_to_edit()
        if edit is None:
            return None
        from kneeboard.app.style_dialog import StyleDialog

        dialog = StyleDialog(edit.style, self, faces=edit.faces)
        while True:
            if not self.ask_style(dialog):
                return None
            if out.save_style(dialog.save, edit.target):
                return edit.target

    def show_caution(self) -> None:
        """Help › Caution: the caution in full, in the app's language."""
        QMessageBox.information(self, tr("Caution"), tr(CAUTION))

    def _retranslate(self, _language: str = "") -> None:
        """The app's language changed: every menu, label and panel shows its words again in it, at once."""
        self.texts.again()
        for code, action in self.act_language.items():
            action.setChecked(code == self.controller.chosen_language())
        self.fleet.retranslate()
        self.preview.retranslate()
        self.readout.retranslate()
        if self.editor is not None:  # built again from the same document: its labels in the new language
            self._edit(self.controller.doc)

    def show_formulas(self):
        from kneeboard.app.dialogs import FormulaHelpDialog

        dialog = FormulaHelpDialog(self)
        dialog.show()
        return dialog

    # --- the questions: the controller's `ui` ---------------------------------------------------------
    def ask_unsaved(self) -> str:
        doc = self.controller.doc
        name = doc.path.name if doc.path else tr("the new profile")
        box = QMessageBox.question(
            self, tr("Unsaved changes"), tr("Save the changes to {name}?", name=name),
            QMessageBox.StandardButton.Save | QMessageBox.StandardButton.Discard | QMessageBox.StandardButton.Cancel,
        )
        return {QMessageBox.StandardButton.Save: "save", QMessageBox.StandardButton.Discard: "discard"}.get(
            box, "cancel")

    def ask_conflict(self) -> str:
        doc = self.controller.doc
        name = doc.path.name if doc.path else tr("the profile")
        box = QMessageBox(QMessageBox.Icon.Warning, tr("Changed on disk"),
                          tr("{name} was changed on disk by someone else since you opened it.", name=name),
                          parent=self)
        choices = {box.addButton(tr("Reload theirs"), QMessageBox.ButtonRole.DestructiveRole): "reload",
                   box.addButton(tr("Keep mine (overwrite)"), QMessageBox.ButtonRole.AcceptRole): "overwrite",
                   box.addButton(tr("Save mine as…"), QMessageBox.ButtonRole.ActionRole): "save-as"}
        box.setDefaultButton(box.addButton(QMessageBox.StandardButton.Cancel))
        box.exec()
        return choices.get(box.clickedButton(), "cancel")

    def ask_save_path(self, title: str, start: str, filters: str) -> Path | None:
        path, _ = QFileDialog.getSaveFileName(self, title, start, filters)
        return Path(path) if path else None

    def ask_open_path(self, title: str, start: str, filters: str) -> Path | None:
        path, _ = QFileDialog.getOpenFileName(self, title, start, filters)
        return Path(path) if path else None

    def ask_folder(self, title: str, start: str) -> Path | None:
        path = QFileDialog.getExistingDirectory(self, title, start)
        return Path(path) if path else None

    def ask_category(self, current: str) -> str | None:
        from PySide6.QtWidgets import QInputDialog

        names = list(shipped.CATEGORIES_WITH_TEMPLATES)
        labels = [tr(CATEGORY_NAMES[name]) if name in CATEGORY_NAMES else name.capitalize() for name in names]
        dialog = QInputDialog(self)
        dialog.setWindowTitle(tr("New profile"))
        dialog.setLabelText(tr("The aircraft's category (its template's figures are placeholders to replace):"))
        dialog.setComboBoxItems(labels)
        dialog.setComboBoxEditable(False)
        dialog.setTextValue(labels[names.index(current)] if current in names else labels[0])
        return names[labels.index(dialog.textValue())] if dialog.exec() else None

    def ask_restore(self, pending) -> bool:
        name = pending.path.name if pending.path else tr("a new profile")
        text = tr("kneeboard stopped at {when} with unsaved changes to {name}.", when=pending.when, name=name)
        if pending.host:
            text += " " + tr("It was written on the machine named {host} (this machine under an earlier name, or "
                             "another one sharing this folder); if kneeboard still runs there, its edits are that "
                             "window's.", host=repr(pending.host))
        answer = QMessageBox.question(self, tr("Restore unsaved changes?"),
                                      text + " " + tr("Restore them? (No discards them.)"))
        return answer == QMessageBox.StandardButton.Yes

    def ask_restore_changed(self, pending) -> str:
        """The file changed since the edits began: -> "restore" (mine over theirs) | "theirs" | "later"."""
        box = QMessageBox(QMessageBox.Icon.Warning, tr("Changed since the crash"),
                          tr("{name} was changed by another program after kneeboard stopped. Restoring your unsaved "
                             "changes would replace that change.", name=pending.path.name), parent=self)
        choices = {box.addButton(tr("Restore mine (replace theirs)"), QMessageBox.ButtonRole.DestructiveRole):
                   "restore",
                   box.addButton(tr("Keep theirs, discard mine"), QMessageBox.ButtonRole.RejectRole): "theirs"}
        box.setDefaultButton(box.addButton(tr("Decide later"), QMessageBox.ButtonRole.ActionRole))
        box.exec()
        return choices.get(box.clickedButton(), "later")

    def ask_style(self, dialog) -> bool:
        """Show the style dialog; True when the person saved it."""
        return bool(dialog.exec())

    def show_problems(self, title: str, text: str) -> None:
        QMessageBox.warning(self, title, text)

    def progress(self, total: int):
        """The fleet export's progress: a dialog with Cancel."""
        from kneeboard.app.dialogs import progress_dialog

        return progress_dialog(self, total)

    def print_pdf(self, pdf: bytes, name: str) -> bool:
        from kneeboard.app import printing

        return printing.print_with_dialog(self, pdf, name)

    # --- the window itself ----------------------------------------------------------------------------
    def closeEvent(self, event):  # noqa: N802 - Qt's name
        if self.controller.close():
            self.controller.settings.setValue("window/geometry", self.saveGeometry())
            event.accept()
        else:
            event.ignore()

    def dragEnterEvent(self, event):  # noqa: N802 - Qt's name
        if any(u.isLocalFile() for u in event.mimeData().urls()):
            event.acceptProposedAction()

    def dropEvent(self, event):  # noqa: N802 - Qt's name
        for url in event.mimeData().urls():
            if url.isLocalFile():
                self.controller.open_path(Path(url.toLocalFile()))
                event.acceptProposedAction()
                return
