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

from kneeboard import report
from kneeboard.app.document import ProfileDocument
from kneeboard.app.editor import ProfileEditor
from kneeboard.app.fleet import FleetPanel
from kneeboard.app.preview import CardPreview
from kneeboard.app.readout import Readout
from kneeboard.card import build_card, card_pdf, fleet_pdf
from kneeboard.card.style import FLEET_STYLE, fleet_style_path, load_style
from kneeboard.fileio import FileProblem, write_atomic
from kneeboard.tables import build
from kneeboard.texts import CAUTION

ROOT = Path(__file__).resolve().parents[2]
SAMPLES = ROOT / "sample_aircraft"
TEMPLATES = ROOT / "resources" / "templates"
MAX_RECENT = 8
DEBOUNCE_MS = 30  #: a pause in typing this long starts a new preview


class MainWindow(QMainWindow):
    def __init__(self, settings: QSettings | None = None):
        super().__init__()
        self.settings = settings or QSettings("kneeboard", "kneeboard")
        self.doc: ProfileDocument | None = None
        self.editor: ProfileEditor | None = None
        self.style, self.style_problems = load_style(None)
        self.style_path: Path | None = None
        self.last_table = None
        self.setAcceptDrops(True)
        # hooks a test replaces: the questions and file choices a person would answer
        self.ask_unsaved = self._ask_unsaved
        self.ask_save_path = self._ask_save_path
        self.show_problems = self._show_problems

        self.fleet = FleetPanel()
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
        self._menus()
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
        action.triggered.connect(slot)
        menu.addAction(action)
        return action

    def _menus(self):
        bar = self.menuBar()
        m = bar.addMenu("&File")
        new = m.addMenu("&New profile from template")
        for category in ("normal", "utility", "acrobatic", "glider"):
            self._action(new, category.capitalize(), lambda _=False, c=category: self.new_profile(c))
        self.act_open = self._action(m, "&Open profile…", self._open_dialog, QKeySequence.StandardKey.Open)
        self._action(m, "Open &folder…", self._open_folder_dialog)
        self.recent_menu = m.addMenu("Open &recent")
        m.addSeparator()
        self.act_save = self._action(m, "&Save", self.save, QKeySequence.StandardKey.Save)
        self.act_save_as = self._action(m, "Save &as…", self.save_as, QKeySequence.StandardKey.SaveAs)
        m.addSeparator()
        self.act_export = self._action(m, "&Export card as PDF…", self.export_card)
        self._action(m, "Export the &fleet…", self.export_fleet)
        self._action(m, "Export table as &CSV…", self.export_csv)
        self.act_print = self._action(m, "&Print card…", self.print_card, QKeySequence.StandardKey.Print)
        m.addSeparator()
        self._action(m, "&Quit", self.close, QKeySequence.StandardKey.Quit)
        e = bar.addMenu("&Edit")
        self.act_undo = self._action(e, "&Undo", lambda: self.doc and self.doc.undo_stack.undo(),
                                     QKeySequence.StandardKey.Undo)
        self.act_redo = self._action(e, "&Redo", lambda: self.doc and self.doc.undo_stack.redo(),
                                     QKeySequence.StandardKey.Redo)
        e.addSeparator()
        self._action(e, "&Compare with saved…", self.compare_with_saved)
        c = bar.addMenu("&Card")
        self._action(c, "Edit the fleet's card &style…", self.edit_style)
        self._action(c, "&Use another style file…", self._pick_style)
        h = bar.addMenu("&Help")
        self._action(h, "&Formulas and sources", self.show_formulas, QKeySequence.StandardKey.HelpContents)
        self._action(h, "&Caution", lambda: QMessageBox.information(self, "Caution", CAUTION))
        self._rebuild_recent()

    # --- opening -------------------------------------------------------------------------------
    def open_path(self, path: Path) -> None:
        """A profile file, or a folder (its first profile opens)."""
        path = Path(path)
        if path.is_dir():
            self.open_folder(path)
        else:
            self.open_profile(path)

    def open_folder(self, folder: Path) -> None:
        self.fleet.show_folder(folder)
        self.settings.setValue("last_folder", str(folder))
        self._use_fleet_style(folder)
        rows = self.fleet.rows()
        if rows and (self.doc is None or self.doc.path is None or self.doc.path.parent != Path(folder)):
            self.open_profile(Path(rows[0][2]))

    def open_profile(self, path: Path) -> bool:
        path = Path(path)
        if self.doc is not None and self.doc.path == path:
            return True
        if not self.maybe_save():
            return False
        try:
            doc = ProfileDocument.open(path, self)
        except FileProblem as exc:
            self.show_problems(f"Cannot open {path.name}", str(exc))
            return False
        if self.fleet.folder != path.parent:
            self.fleet.show_folder(path.parent, path)
            self._use_fleet_style(path.parent)
        else:
            self.fleet.select(path)
        self._set_document(doc)
        self._remember(path)
        if doc.loaded.errors:
            self.show_problems(f"{path.name} has problems",
                               "\n".join(str(p).removeprefix(f"{path}: ") for p in doc.loaded.errors))
        return True

    def new_profile(self, category: str) -> None:
        if not self.maybe_save():
            return
        text = (TEMPLATES / f"{category}.toml").read_text()
        self._set_document(ProfileDocument(text, None, self))

    def _set_document(self, doc: ProfileDocument) -> None:
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
        self.act_undo.setEnabled(True)
        self._update_title()
        self.schedule_preview()

    def _use_fleet_style(self, folder: Path) -> None:
        path = fleet_style_path(folder)
        style, problems = load_style(path)
        if style is None:
            self.show_problems("The fleet's card style has problems",
                               "\n".join(str(p) for p in problems) + "\nThe default style is used instead.")
            style, problems = load_style(None)
            path = None
        self.style, self.style_problems, self.style_path = style, problems, path
        self.schedule_preview()

    # --- the card --------------------------------------------------------------------------------
    def schedule_preview(self) -> None:
        self.timer.start()

    def card(self, mode: str = "card"):
        """A job for the preview: the card (or a sheet of it) as PDF bytes, from immutable inputs."""
        loaded = self.doc.loaded
        profile, style, fingerprint = loaded.profile, self.style, loaded.fingerprint

        def job() -> bytes:
            c = build_card(profile, style, fingerprint)
            return card_pdf(c) if mode == "card" else fleet_pdf([c], mode)

        return job

    def _update_card(self) -> None:
        if self.doc is None:
            return
        loaded = self.doc.loaded
        if loaded.profile is None:
            n = len(loaded.errors)
            self.preview_note.setText(f"The card is not updated: the profile has {n} error(s) (see Problems).")
            self.preview_note.show()
            self.readout.show_nothing("Fix the problems marked in the editor to see the figures.")
            self.last_table = None
            return
        self.preview_note.hide()
        from kneeboard.card import styled_profile

        self.last_table = build(styled_profile(loaded.profile, self.style))
        self.readout.show_table(self.last_table)
        self.preview.request(self.card(self.preview.mode()))

    # --- saving --------------------------------------------------------------------------------
    def save(self) -> bool:
        if self.doc is None:
            return True
        if self.doc.path is None:
            return self.save_as()
        try:
            self.doc.save()
        except FileProblem as exc:
            self.show_problems("The profile was not saved", f"{exc}\nYour changes are still here.")
            return False
        self._after_save()
        return True

    def save_as(self) -> bool:
        if self.doc is None:
            return True
        start = self.doc.path or (self.fleet.folder or SAMPLES) / "new_profile.toml"
        path = self.ask_save_path("Save profile as", str(start), "Profiles (*.toml)")
        if path is None:
            return False
        try:
            self.doc.save(path)
        except FileProblem as exc:
            self.show_problems("The profile was not saved", f"{exc}\nYour changes are still here.")
            return False
        self._after_save()
        return True

    def _after_save(self):
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
        return answer == "discard"

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

    def _show_problems(self, title: str, text: str) -> None:
        QMessageBox.warning(self, title, text)

    def closeEvent(self, event):  # noqa: N802 - Qt's name
        if self.maybe_save():
            self.settings.setValue("window/geometry", self.saveGeometry())
            event.accept()
        else:
            event.ignore()

    def _update_title(self) -> None:
        if self.doc is None:
            self.setWindowTitle("kneeboard")
            return
        name = self.doc.path.name if self.doc.path else "new profile"
        loaded = self.doc.loaded
        reg = loaded.profile.aircraft.registration if loaded.profile else ""
        self.setWindowTitle(f"{reg + ' — ' if reg else ''}{name}[*] — kneeboard")
        self.setWindowModified(self.doc.modified)

    # --- recent files and drops ---------------------------------------------------------------
    def _remember(self, path: Path) -> None:
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
        path, _ = QFileDialog.getOpenFileName(self, "Open profile", str(self.fleet.folder or SAMPLES),
                                              "Profiles (*.toml)")
        if path:
            self.open_profile(Path(path))

    def _open_folder_dialog(self):
        path = QFileDialog.getExistingDirectory(self, "Open fleet folder", str(self.fleet.folder or SAMPLES))
        if path:
            self.open_folder(Path(path))

    # --- exports -------------------------------------------------------------------------------
    def _ready(self) -> bool:
        if self.doc is None or self.doc.loaded.profile is None:
            self.show_problems("No card", "The profile has errors; fix them first (see Problems).")
            return False
        return True

    def current_pdf(self) -> bytes:
        return self.card("card")()

    def export_card(self) -> Path | None:
        if not self._ready():
            return None
        reg = self.doc.loaded.profile.aircraft.registration
        from kneeboard.export import safe_name

        start = (self.fleet.folder or SAMPLES) / f"{safe_name(reg)}.pdf"
        path = self.ask_save_path("Export card as PDF", str(start), "PDF (*.pdf)")
        if path is None:
            return None
        try:
            write_atomic(path, self.current_pdf())
        except Exception as exc:  # LayoutError or FileProblem: both are sentences for the person
            self.show_problems("The card was not exported", str(exc))
            return None
        return path

    def export_csv(self) -> Path | None:
        if not self._ready() or self.last_table is None:
            return None
        start = (self.fleet.folder or SAMPLES) / f"{self.last_table.registration}.csv"
        path = self.ask_save_path("Export table as CSV", str(start), "CSV (*.csv)")
        if path is None:
            return None
        try:
            write_atomic(path, report.to_csv(self.last_table))
        except FileProblem as exc:
            self.show_problems("The table was not exported", str(exc))
            return None
        return path

    def export_fleet(self, out: Path | None = None, each: Path | None = None, sheet: str | None = None):
        from kneeboard.app.dialogs import export_fleet
        from kneeboard.profile_io import profile_files

        folder = self.fleet.folder
        if folder is None:
            return None
        if out is None and each is None:
            path = self.ask_save_path("Export the fleet's cards", str(folder / "fleet.pdf"), "PDF (*.pdf)")
            if path is None:
                return None
            out = path
        batch = export_fleet(self, profile_files(folder), self.style, out, each, sheet)
        if batch.failures:
            self.show_problems("Some cards were not made",
                               "\n".join(line for f in batch.failures for line in f.lines))
        return batch

    def print_card(self) -> bool:
        if not self._ready():
            return False
        from kneeboard.app.printing import print_with_dialog

        try:
            pdf = self.current_pdf()
        except Exception as exc:
            self.show_problems("The card cannot be printed", str(exc))
            return False
        return print_with_dialog(self, pdf, self.windowTitle())

    # --- compare, style, help ------------------------------------------------------------------
    def compare_changes(self):
        """Printed figures that differ between the saved profile and the edited one, or None if either is unusable."""
        from kneeboard.card import styled_profile
        from kneeboard.compare import compare

        saved, now = self.doc.saved(), self.doc.loaded
        if saved.profile is None or now.profile is None:
            return None
        return compare(build(styled_profile(saved.profile, self.style)),
                       build(styled_profile(now.profile, self.style)))

    def compare_with_saved(self):
        if self.doc is None:
            return None
        from kneeboard.app.dialogs import CompareDialog

        changes = self.compare_changes()
        if changes is None:
            self.show_problems("Nothing to compare", "The saved or the edited profile has errors.")
            return None
        dialog = CompareDialog(changes, self.doc.loaded.profile.aircraft.registration, self)
        dialog.show()
        return dialog

    def edit_style(self):
        from kneeboard.app.style_dialog import StyleDialog

        folder = self.fleet.folder
        if folder is None:
            return
        dialog = StyleDialog(self.style, self)
        if dialog.exec():
            style, problems = dialog.save(folder / FLEET_STYLE)
            if style is None:
                self.show_problems("The style has problems", "\n".join(str(p) for p in problems))
                return
            self.style, self.style_path = style, folder / FLEET_STYLE
            self.schedule_preview()

    def _pick_style(self):
        path, _ = QFileDialog.getOpenFileName(self, "Card style", str(self.fleet.folder or ROOT),
                                              "Card styles (*.style.toml)")
        if path:
            style, problems = load_style(Path(path))
            if style is None:
                self.show_problems("The style has problems", "\n".join(str(p) for p in problems))
                return
            self.style, self.style_path = style, Path(path)
            self.schedule_preview()

    def show_formulas(self):
        from kneeboard.app.dialogs import FormulaHelpDialog

        dialog = FormulaHelpDialog(self)
        dialog.show()
        return dialog
