"""What the window does with a finished card: export, print, compare, style it.

A mixin of MainWindow (which supplies doc, session, fleet, preview and the question hooks); kept apart so the
window module holds the editing and the files, this one the card's ways out. Every card here is the pipeline's
(`kneeboard.pipeline`), the one the command line makes, and what is exported is what the preview shows.
"""

from pathlib import Path

from kneeboard.fileio import FileProblem, write_atomic
from kneeboard.problems import printable


class _LayoutError:
    """`except self.LayoutError` without importing the layout (and reportlab) before the first card is made."""

    def __get__(self, _obj, _owner=None):
        from kneeboard.card.layout import LayoutError

        return LayoutError


class CardActions:
    LayoutError = _LayoutError()  #: the layout's error, loaded with the layout

    # --- the card as it prints ---------------------------------------------------------------
    def _ready(self) -> bool:
        if self.doc is None:
            self.show_problems("No card", "No profile is open.")
            return False
        if self.doc.loaded.table is None:
            errors = self.doc.loaded.errors
            self.show_problems("No card", f"The profile has {len(errors)} error(s); fix them first (see Problems):\n"
                               + "\n".join(str(p) for p in errors[:8]))
            return False
        return True

    def current_pdf(self) -> bytes:
        """The open profile's card PDF: the very bytes the preview shows when it shows the current card."""
        preview = self.preview
        if (self._card_request and preview.shown_generation == self._card_request and not preview.error_text()
                and preview.pdf_bytes() is not None):
            return preview.pdf_bytes()
        from kneeboard.pipeline import card_pdf

        return card_pdf(self.session.card(self.doc.loaded))

    def _card_out(self, what: str) -> bytes | None:
        try:
            return self.current_pdf()
        except self.LayoutError as exc:
            self.show_problems(f"The card cannot be {what}", str(exc))
            return None

    def _printed(self, pdf: bytes, where: str) -> None:
        """Remember what this card printed, for Compare with the printed card."""
        from kneeboard.card.data import read_card_data

        for data in read_card_data(pdf):
            self.session.remember_printed_data(data, where)

    # --- exports -------------------------------------------------------------------------------
    def export_card(self) -> Path | None:
        if not self._ready():
            return None
        from kneeboard.export import safe_name

        reg = self.doc.loaded.table.registration
        start = self._folder() / f"{safe_name(reg)}.pdf"
        path = self.ask_save_path("Export card as PDF", str(start), "PDF (*.pdf)")
        if path is None:
            return None
        pdf = self._card_out("exported")
        if pdf is None:
            return None
        try:
            self._refuse_inputs(path)
            write_atomic(path, pdf)
        except FileProblem as exc:
            self.show_problems("The card was not exported", f"{exc}\nNothing was written.")
            return None
        self._printed(pdf, str(path))
        self.confirm_export(f"the card of {reg}", path)
        return path

    def confirm_export(self, what: str, path: Path) -> None:
        """"Exported WHAT: NAME in FOLDER" in the status bar, whole: left of the caution, the folder shortened in
        its middle when the room is short, so the name of the file written is always on screen."""
        from PySide6.QtCore import Qt

        bar, path = self.statusBar(), Path(path)
        head = f"Exported {what}: {printable(path.name)}"
        metrics = bar.fontMetrics()
        room = self.caution.geometry().left() - metrics.horizontalAdvance(f"{head} in ")
        room -= 3 * metrics.averageCharWidth()  # the status bar's own margins
        from kneeboard.app.fleet import shown_folder

        folder = metrics.elidedText(printable(shown_folder(path.parent).removeprefix("in ")),
                                    Qt.TextElideMode.ElideMiddle, max(room, 0))
        bar.showMessage(f"{head} in {folder}" if len(folder) > 2 else head, 15000)

    def _refuse_inputs(self, path: Path) -> None:
        """An export never replaces the open profile, a profile of the fleet, or a style or logo it uses."""
        from kneeboard.fileio import refuse_overwrite_of_inputs
        from kneeboard.profile_io import profile_files

        inputs = [p for p in (self.doc.path if self.doc else None,) if p is not None]
        if self.session.folder is not None:
            inputs += profile_files(self.session.folder)
        refuse_overwrite_of_inputs(Path(path), inputs + self.session.styles.inputs())

    def export_csv(self) -> Path | None:
        if not self._ready():
            return None
        table = self.doc.loaded.table
        from kneeboard.export import safe_name

        start = self._folder() / f"{safe_name(table.registration)}.csv"
        path = self.ask_save_path("Export table as CSV", str(start), "CSV (*.csv)")
        if path is None:
            return None
        try:
            self._refuse_inputs(path)
            from kneeboard import report
            from kneeboard.pipeline import today

            write_atomic(path, report.csv_file(table, self.doc.loaded.fingerprint, today()))
        except FileProblem as exc:
            self.show_problems("The table was not exported", f"{exc}\nNothing was written.")
            return None
        self.confirm_export(f"the table of {table.registration}", path)
        return path

    def export_fleet(self):
        """Every card of the open folder in one PDF, as `kneeboard card FOLDER -o FILE` makes it."""
        from kneeboard.app.dialogs import export_fleet
        from kneeboard.profile_io import profile_files

        folder = self.fleet.folder
        if folder is None:
            self.show_problems("No fleet", "Open a folder of profiles first (File › Open folder).")
            return None
        if self.doc is not None and self.doc.modified and self.doc.path is not None \
                and self.doc.path.parent == folder and not self.maybe_save():
            return None  # the fleet's cards are made from the files: unsaved edits would be missing
        path = self.ask_save_path("Export the fleet's cards", str(folder / "fleet.pdf"), "PDF (*.pdf)")
        if path is None:
            return None
        result = export_fleet(self, profile_files(folder), self.session.styles, path)
        if result.failures:
            self.show_problems("Some cards were not made",
                               "\n".join(line for f in result.failures for line in f.lines))
        if result.cards and not result.cancelled and path in result.written:
            self._printed(Path(path).read_bytes(), str(path))
            self.confirm_export(f"{result.cards} card(s)", path)
        return result

    def print_card(self) -> bool:
        if not self._ready():
            return False
        from kneeboard.app.printing import print_with_dialog

        pdf = self._card_out("printed")
        if pdf is None:
            return False
        from kneeboard.export import safe_name

        # the document's name, which print-to-file proposes as the file name: the registration, as exports name it
        done = print_with_dialog(self, pdf, f"{safe_name(self.doc.loaded.table.registration)}_card")
        if done:
            self._printed(pdf, "the printer")
        return done

    # --- compare ---------------------------------------------------------------------------------
    def compare_changes(self):
        """Printed figures that differ between the saved profile's card and the edited one's (None: unusable)."""
        from kneeboard.compare import compare

        saved, now = self.doc.saved(), self.doc.loaded
        if saved.table is None or now.table is None:
            return None
        try:
            return compare(self.session.card(saved), self.session.card(now))
        except self.LayoutError:
            return None

    def compare_with_saved(self):
        if self.doc is None:
            return None
        from kneeboard.app.dialogs import CompareDialog

        changes = self.compare_changes()
        if changes is None:
            self.show_problems("Nothing to compare", "The saved or the edited profile has errors.")
            return None
        dialog = CompareDialog(changes, self.doc.loaded.table.registration, self,
                               columns=("In the saved file", "With your edits"),
                               since="since the profile was last saved (the printed card may be older: "
                                     "compare with the printed card to know)")
        dialog.show()
        return dialog

    def compare_with_printed(self):
        """The card as printed (exported or printed in this session, else a card PDF the person picks)
        against the card the profile makes now."""
        if not self._ready():
            return None
        from kneeboard.app.dialogs import CompareDialog

        reg = self.doc.loaded.table.registration
        printed = self.session.last_printed(reg)
        if printed is None:
            printed = self._pick_printed(reg)
            if printed is None:
                return None
        now, weight = self.doc.loaded, ""
        if printed.weight_given:  # made for a weight given for it: made again at that weight, and said so
            now = self.session.prepare_plain(self.doc.plain(), self.doc.path, printed.weight_given)
            weight = f", at {printable(printed.weight_given)}, the weight it was made for"
            if now.table is None:
                self.show_problems("Nothing to compare", "\n".join(str(p) for p in now.errors[:8]))
                return None
        try:
            changes = self.session.changes_since_printed(printed, now)
        except self.LayoutError as exc:
            self.show_problems("Nothing to compare", str(exc))
            return None
        made = f" on {printed.made_on}" if printed.made_on else ""
        dialog = CompareDialog(changes, reg, self, columns=("On the printed card", "Now"),
                               since=f"since the card was printed{made} ({printable(printed.where)}){weight}")
        dialog.show()
        return dialog

    def _pick_printed(self, registration: str):
        from kneeboard.card.data import CardDataProblem, read_card_data
        from kneeboard.fileio import read_bytes

        path = self.ask_open_path(f"The printed card of {registration}", str(self._folder()), "Cards (*.pdf)")
        if path is None:
            return None
        try:
            found = read_card_data(read_bytes(Path(path), 200 * 1024 * 1024))
        except FileProblem as exc:
            self.show_problems("Cannot read the card", str(exc))
            return None
        except CardDataProblem as exc:
            self.show_problems("Cannot read the card", printable(f"{path}: {exc}"))
            return None
        from kneeboard.registrations import key

        mine = [d for d in found if key(str(d.get("registration", ""))) == key(registration)]
        if not mine:
            self.show_problems("Not this aircraft's card",
                               f"{printable(path)} holds no kneeboard card of {registration}"
                               + (f" (it holds {', '.join(str(d.get('registration')) for d in found)})."
                                  if found else " (it carries no printed figures: not a kneeboard card)."))
            return None
        return self.session.remember_printed_data(mine[0], str(path))

    # --- style, help ------------------------------------------------------------------------------
    def edit_style(self):
        from kneeboard.app.style_dialog import StyleDialog

        target = self.session.fleet_style_file()
        if target is None:
            self.show_problems("No fleet", "Open a folder of profiles first: its style is saved beside them.")
            return None
        from kneeboard.card.style import load_style

        style, problems = self.session.style_for(self.doc.path if self.doc is not None else None)
        if style is None:
            style, _ = load_style(None)
        dialog = StyleDialog(style, self, faces=self._faces_with(style, target.parent))
        while True:  # a style file that cannot be read or written: said, and the dialog comes back with the entries
            if not self.ask_style(dialog):
                return None
            try:
                style, problems = dialog.save(target)
                break
            except FileProblem as exc:
                self.show_problems("The style was not saved", f"{exc}\nNothing was written. Your entries are kept: "
                                   "mend or move the file, then save again, or cancel.")
        if style is None:
            self.show_problems("The style has problems", "\n".join(str(p) for p in problems))
        self.session.reload_styles()
        self._forget_prepared()
        return target

    def _faces_with(self, style, folder: Path):
        """For the style dialog: the open profile's card with the dialog's values, as "1 card, 2 faces"."""
        prepared = self.doc.loaded if self.doc is not None else None
        if prepared is None or prepared.table is None:
            return None

        def faces(values: dict) -> str:
            from kneeboard.card import LayoutError, layout_card
            from kneeboard.card.style import style_from_data
            from kneeboard.pipeline import today

            trial, problems = style_from_data({**values, "back": list(style.back), "logo": ""}, folder)
            if any(p.is_error for p in problems):
                return "not known: " + "; ".join(str(p) for p in problems if p.is_error)
            try:
                layout = layout_card(prepared.table, trial, prepared.fingerprint, today(), style.logo_png)
            except LayoutError as exc:
                return f"cannot be made: {exc}"
            n, f = layout.cards, layout.faces
            return f"{n} card{'s' if n != 1 else ''}, {f} face{'s' if f != 1 else ''} ({prepared.table.registration})"

        return faces

    def ask_style(self, dialog) -> bool:
        """Show the style dialog; True when the person saved it (a test replaces this)."""
        return bool(dialog.exec())

    def _pick_style(self):
        path = self.ask_open_path("Card style", str(self._folder()), "Card styles (*.style.toml)")
        if path is None:
            return None
        from kneeboard.card.style import load_style

        style, problems = load_style(Path(path))
        if style is None:
            self.show_problems("The style has problems", "\n".join(str(p) for p in problems))
            return None
        self.session.use_style_file(Path(path))
        self._forget_prepared()
        self.statusBar().showMessage(f"Every card now uses the style {Path(path).name}.", 6000)
        return path

    def show_formulas(self):
        from kneeboard.app.dialogs import FormulaHelpDialog

        dialog = FormulaHelpDialog(self)
        dialog.show()
        return dialog
