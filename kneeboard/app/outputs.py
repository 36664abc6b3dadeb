"""What the app does with a finished card: export, print, compare, style it. No widget.

Part of the controller (`app.controller.Controller`, which supplies the document, the session and the person's
answers). Every card here is the pipeline's (`kneeboard.pipeline`), the one the command line makes, and what is
exported is what the preview shows. A comparison comes back as a `Comparison` for the window to show.
"""

from collections.abc import Callable
from dataclasses import dataclass
from pathlib import Path

from kneeboard.app.words import plural, tr
from kneeboard.fileio import FileProblem, write_atomic
from kneeboard.problems import printable


def _layout_error():
    """The layout's error class, imported with the layout (and reportlab) when a card is first made."""
    from kneeboard.card.layout import LayoutError

    return LayoutError


@dataclass(frozen=True)
class Comparison:
    """Printed figures that read differently, and what was compared with what."""

    changes: list  #: kneeboard.compare.Change, one per figure
    registration: str
    columns: tuple[str, str]  #: the headings of the two sides
    since: str  #: since when: "since the card was printed on ..."


@dataclass(frozen=True)
class StyleEdit:
    """The fleet's style to edit: as it stands, where it is saved, and how many faces a value makes."""

    style: object  #: kneeboard.card.style.CardStyle
    target: Path
    faces: Callable[[dict], str] | None  #: the open profile's card with a style file's values, as "1 card, 2 faces"


class CardOutputs:
    def __init__(self, controller):
        self.c = controller

    # --- the card as it prints ---------------------------------------------------------------
    def ready(self) -> bool:
        doc = self.c.doc
        if doc is None:
            self.c.ui.show_problems(tr("No card"), tr("No profile is open."))
            return False
        if doc.loaded.table is None:
            errors = doc.loaded.errors
            self.c.ui.show_problems(tr("No card"), tr("The profile has {n} error(s); fix them first (see Problems):",
                                                      n=len(errors)) + "\n" + "\n".join(str(p) for p in errors[:8]))
            return False
        return True

    def _card_out(self, title: str) -> bytes | None:
        """The card's PDF; None, and `title` (what could not be done) with the reason, when it cannot be made."""
        try:
            return self.c.current_pdf()
        except _layout_error() as exc:
            self.c.ui.show_problems(title, str(exc))
            return None

    def _printed(self, pdf: bytes, where: str) -> None:
        """Remember what this card printed, for Compare with the printed card."""
        from kneeboard.card.data import read_card_data

        for data in read_card_data(pdf):
            self.c.session.remember_printed_data(data, where)

    # --- exports -------------------------------------------------------------------------------
    def export_card(self) -> Path | None:
        if not self.ready():
            return None
        from kneeboard.export import safe_name

        reg = self.c.doc.loaded.table.registration
        start = self.c.start_folder() / f"{safe_name(reg)}.pdf"
        path = self.c.ui.ask_save_path(tr("Export card as PDF"), str(start), tr("PDF ({pattern})", pattern="*.pdf"))
        if path is None:
            return None
        pdf = self._card_out(tr("The card cannot be exported"))
        if pdf is None:
            return None
        try:
            self._refuse_inputs(path)
            write_atomic(path, pdf)
        except FileProblem as exc:
            self.c.ui.show_problems(tr("The card was not exported"), f"{exc}\n" + tr("Nothing was written."))
            return None
        self._printed(pdf, str(path))
        self.c.exported.emit(tr("the card of {registration}", registration=reg), Path(path))
        return path

    def _refuse_inputs(self, path: Path) -> None:
        """An export never replaces the open profile, a profile of the fleet, or a style or logo it uses."""
        from kneeboard.fileio import refuse_overwrite_of_inputs
        from kneeboard.inputs.profiles import profile_files

        session = self.c.session
        inputs = [p for p in (self.c.doc.path if self.c.doc else None,) if p is not None]
        if session.folder is not None:
            inputs += profile_files(session.folder)
        refuse_overwrite_of_inputs(Path(path), inputs + session.styles.inputs())

    def export_csv(self) -> Path | None:
        if not self.ready():
            return None
        prepared = self.c.doc.loaded
        table = prepared.table
        from kneeboard.export import safe_name

        start = self.c.start_folder() / f"{safe_name(table.registration)}.csv"
        path = self.c.ui.ask_save_path(tr("Export table as CSV"), str(start), tr("CSV ({pattern})", pattern="*.csv"))
        if path is None:
            return None
        try:
            self._refuse_inputs(path)
            from kneeboard import report
            from kneeboard.pipeline import today

            write_atomic(path, report.csv_file(table, prepared.fingerprint, today()))
        except FileProblem as exc:
            self.c.ui.show_problems(tr("The table was not exported"), f"{exc}\n" + tr("Nothing was written."))
            return None
        self.c.exported.emit(tr("the table of {registration}", registration=table.registration), Path(path))
        return path

    def export_fleet(self):
        """Every card of the open folder in one PDF, as `kneeboard card FOLDER -o FILE` makes it."""
        from kneeboard.app.dialogs import export_fleet
        from kneeboard.inputs.profiles import profile_files

        c = self.c
        folder = c.fleet.folder
        if folder is None:
            c.ui.show_problems(tr("No fleet"), tr("Open a folder of profiles first (File › Open folder)."))
            return None
        if c.doc is not None and c.doc.modified and c.doc.path is not None \
                and c.doc.path.parent == folder and not c.maybe_save():
            return None  # the fleet's cards are made from the files: unsaved edits would be missing
        path = c.ui.ask_save_path(tr("Export the fleet's cards"), str(folder / "fleet.pdf"),
                                  tr("PDF ({pattern})", pattern="*.pdf"))
        if path is None:
            return None
        result = export_fleet(None, profile_files(folder), c.session.styles, path,
                              progress_factory=lambda _parent, total: c.ui.progress(total))
        if result.failures:
            c.ui.show_problems(tr("Some cards were not made"),
                               "\n".join(line for f in result.failures for line in f.lines))
        if result.cards and not result.cancelled and path in result.written:
            self._printed(Path(path).read_bytes(), str(path))
            c.exported.emit(plural("{n} card", "{n} cards", result.cards), Path(path))
        return result

    def print_card(self) -> bool:
        if not self.ready():
            return False
        pdf = self._card_out(tr("The card cannot be printed"))
        if pdf is None:
            return False
        from kneeboard.export import safe_name

        # the document's name, which print-to-file proposes as the file name: the registration, as exports name it
        try:
            done = self.c.ui.print_pdf(pdf, f"{safe_name(self.c.doc.loaded.table.registration)}_card")
        except (OSError, ValueError) as exc:  # the printer refused to start or a page (printing.PrinterProblem)
            self.c.ui.show_problems(tr("The card was not printed"), str(exc))
            return False
        if done:
            self._printed(pdf, tr("the printer"))
        return done

    # --- compare ---------------------------------------------------------------------------------
    def compare_changes(self):
        """Printed figures that differ between the saved profile's card and the edited one's (None: unusable)."""
        from kneeboard.compare import compare

        session, doc = self.c.session, self.c.doc
        saved, now = doc.saved(), doc.loaded
        if saved.table is None or now.table is None:
            return None
        try:
            return compare(session.card(saved), session.card(now))
        except _layout_error():
            return None

    def compare_with_saved(self) -> Comparison | None:
        if self.c.doc is None:
            return None
        changes = self.compare_changes()
        if changes is None:
            self.c.ui.show_problems(tr("Nothing to compare"), tr("The saved or the edited profile has errors."))
            return None
        return Comparison(changes, self.c.doc.loaded.table.registration,
                          (tr("In the saved file"), tr("With your edits")),
                          tr("since the profile was last saved (the printed card may be older: compare with the "
                             "printed card to know)"))

    def compare_with_printed(self) -> Comparison | None:
        """The card as printed (exported or printed in this session, else a card PDF the person picks)
        against the card the profile makes now."""
        if not self.ready():
            return None
        c = self.c
        reg = c.doc.loaded.table.registration
        printed = c.session.last_printed(reg)
        if printed is None:
            printed = self._pick_printed(reg)
            if printed is None:
                return None
        now, weight = c.doc.loaded, ""
        if printed.weight_given:  # made for a weight given for it: made again at that weight, and said so
            now = c.session.prepare_plain(c.doc.plain(), c.doc.path, printed.weight_given)
            weight = tr(", at {weight}, the weight it was made for", weight=printable(printed.weight_given))
            if now.table is None:
                c.ui.show_problems(tr("Nothing to compare"), "\n".join(str(p) for p in now.errors[:8]))
                return None
        try:
            changes = c.session.changes_since_printed(printed, now)
        except _layout_error() as exc:
            c.ui.show_problems(tr("Nothing to compare"), str(exc))
            return None
        where = printable(printed.where)
        since = (tr("since the card was printed on {date} ({where})", date=printed.made_on, where=where)
                 if printed.made_on else tr("since the card was printed ({where})", where=where))
        return Comparison(changes, reg, (tr("On the printed card"), tr("Now")), since + weight)

    def _pick_printed(self, registration: str):
        from kneeboard.card.data import CardDataProblem, read_card_data
        from kneeboard.fileio import read_bytes

        ui = self.c.ui
        path = ui.ask_open_path(tr("The printed card of {registration}", registration=registration),
                                str(self.c.start_folder()), tr("Cards ({pattern})", pattern="*.pdf"))
        if path is None:
            return None
        try:
            found = read_card_data(read_bytes(Path(path), 200 * 1024 * 1024))
        except FileProblem as exc:
            ui.show_problems(tr("Cannot read the card"), str(exc))
            return None
        except CardDataProblem as exc:
            ui.show_problems(tr("Cannot read the card"), printable(f"{path}: {exc}"))
            return None
        from kneeboard.registrations import key

        mine = [d for d in found if key(str(d.get("registration", ""))) == key(registration)]
        if not mine:
            ui.show_problems(tr("Not this aircraft's card"),
                             tr("{file} holds no kneeboard card of {registration} (it holds {others}).",
                                file=printable(path), registration=registration,
                                others=", ".join(str(d.get("registration")) for d in found)) if found else
                             tr("{file} holds no kneeboard card of {registration} (it carries no printed figures: "
                                "not a kneeboard card).", file=printable(path), registration=registration))
            return None
        return self.c.session.remember_printed_data(mine[0], str(path))

    # --- style ------------------------------------------------------------------------------------
    def style_to_edit(self) -> StyleEdit | None:
        """Card › Edit the fleet's card style: the style the open profile's card uses now, saved beside the fleet."""
        c = self.c
        target = c.session.fleet_style_file()
        if target is None:
            c.ui.show_problems(tr("No fleet"), tr("Open a folder of profiles first: its style is saved beside them."))
            return None
        from kneeboard.inputs.styles import load_style

        style, _problems = c.session.style_for(c.doc.path if c.doc is not None else None)
        if style is None:
            style, _ = load_style(None)
        return StyleEdit(style, target, self.faces_with(style, target.parent))

    def save_style(self, save: Callable[[Path], tuple], target: Path) -> bool:
        """`save(target)` writes the style (the dialog's); False, said, when the file cannot be read or written:
        the entries are kept for the person to save again or cancel."""
        try:
            style, problems = save(target)
        except FileProblem as exc:
            self.c.ui.show_problems(tr("The style was not saved"), f"{exc}\n" + tr(
                "Nothing was written. Your entries are kept: mend or move the file, then save again, or cancel."))
            return False
        if style is None:
            self.c.ui.show_problems(tr("The style has problems"), "\n".join(str(p) for p in problems))
        self.c.restyle()
        return True

    def faces_with(self, style, folder: Path):
        """For the style dialog: the open profile's card with the dialog's values, as "1 card, 2 faces"."""
        doc = self.c.doc
        prepared = doc.loaded if doc is not None else None
        if prepared is None or prepared.table is None:
            return None

        def faces(values: dict) -> str:
            from kneeboard.card import LayoutError, layout_card
            from kneeboard.card.organization import fitted
            from kneeboard.inputs.styles import style_from_data
            from kneeboard.pipeline import card_logo, today

            trial, problems = fitted(*style_from_data({**values, "back": list(style.back), "logo": ""}, folder))
            if trial is None or any(p.is_error for p in problems):
                return tr("not known: {problems}", problems="; ".join(str(p) for p in problems if p.is_error))
            try:
                layout = layout_card(prepared.table, trial, prepared.fingerprint, today(), card_logo(style))
            except LayoutError as exc:
                return tr("cannot be made: {reason}", reason=str(exc))
            return tr("{cards}, {faces} ({registration})", cards=plural("{n} card", "{n} cards", layout.cards),
                      faces=plural("{n} face", "{n} faces", layout.faces), registration=prepared.table.registration)

        return faces

    def pick_style(self) -> Path | None:
        """Card › Use another style file: one the person picks, for every card, once it reads without errors."""
        ui = self.c.ui
        path = ui.ask_open_path(tr("Card style"), str(self.c.start_folder()),
                                tr("Card styles ({pattern})", pattern="*.style.toml"))
        if path is None:
            return None
        from kneeboard.card.organization import load_card_style

        style, problems = load_card_style(Path(path))
        if style is None:
            ui.show_problems(tr("The style has problems"), "\n".join(str(p) for p in problems))
            return None
        self.c.use_style_file(Path(path))
        return path
