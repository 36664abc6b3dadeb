"""What the window does with a finished card: export, print, compare with the saved profile, style it.

A mixin of MainWindow (which supplies doc, style, fleet, preview and the question hooks); kept
apart so the window module holds the editing and the files, this one the card's ways out.
"""

from pathlib import Path

from PySide6.QtWidgets import QFileDialog

from kneeboard import report
from kneeboard.app.paths import ROOT, SAMPLES
from kneeboard.card import styled_profile
from kneeboard.card.style import FLEET_STYLE, load_style
from kneeboard.fileio import FileProblem, write_atomic
from kneeboard.tables import build


class CardActions:
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
