"""The app's dialogs: compare with saved, the formulas, the caution, problems of a file, and fleet export.

Thin widgets: every figure, judgement and file comes from the core (`kneeboard.compare`,
`kneeboard.problems`, `kneeboard.export`); these only show it. Nothing here rounds or computes.
"""

from __future__ import annotations

from collections.abc import Callable
from html import escape
from pathlib import Path
from typing import TYPE_CHECKING

from PySide6.QtCore import QSettings, Qt
from PySide6.QtGui import QFont, QGuiApplication
from PySide6.QtWidgets import (
    QAbstractItemView,
    QDialog,
    QDialogButtonBox,
    QHeaderView,
    QLabel,
    QMessageBox,
    QProgressDialog,
    QPushButton,
    QTableWidget,
    QTableWidgetItem,
    QTextBrowser,
    QVBoxLayout,
    QWidget,
)

from kneeboard.app.words import told, tr, translated
from kneeboard.fileio import FileProblem
from kneeboard.i18n import N_
from kneeboard.problems import Problem

if TYPE_CHECKING:  # the card machinery loads with the first card, not with the window
    from kneeboard.compare import Change
    from kneeboard.export import Export
    from kneeboard.pipeline import Styles
from kneeboard.texts import CAUTION, formulas_html

NOT_PRINTED = N_("not printed")  #: shown where a figure was not printed before, or no longer is
WORSE_MARK = N_("! less room: ")  #: leads a figure that got worse; the row is bold too, so colour is never needed
NO_CHANGE = N_("No printed figure changed")
CAUTION_KEY = "caution/acknowledged"  #: settings key recording that the caution was shown
CAUTION_TITLE = N_("Before you use these figures")
COMPARE_COLUMNS = (N_("Figure"), N_("On the printed card"), N_("Now"))
PROBLEM_COLUMNS = (N_("Severity"), N_("Field"), N_("What is wrong"), N_("Found"), N_("Expected"))
SEVERITIES = {"error": N_("ERROR"), "warning": N_("WARNING")}


def _table(columns, rows: list[tuple[str, ...]], bold_rows: set[int] = frozenset(), tips=None) -> QTableWidget:
    """A read-only table of text rows; rows in `bold_rows` are set in bold."""
    table = QTableWidget(len(rows), len(columns))
    table.setHorizontalHeaderLabels([tr(c) for c in columns])
    table.setEditTriggers(QAbstractItemView.EditTrigger.NoEditTriggers)
    table.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
    table.setWordWrap(True)
    table.verticalHeader().setVisible(False)
    header = table.horizontalHeader()
    header.setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
    header.setStretchLastSection(True)
    for i, row in enumerate(rows):
        for j, text in enumerate(row):
            item = QTableWidgetItem(text)
            if i in bold_rows:
                font = QFont(item.font())
                font.setBold(True)
                item.setFont(font)
            if tips is not None and tips[i]:
                item.setToolTip(tips[i])
            table.setItem(i, j, item)
    return table


def _cell_texts(table: QTableWidget) -> list[tuple[str, ...]]:
    return [tuple(table.item(i, j).text() for j in range(table.columnCount())) for i in range(table.rowCount())]


class CompareDialog(QDialog):
    """The printed figures that a change would alter: what the card prints now, and what it would print."""

    def __init__(self, changes: list[Change], registration: str, parent: QWidget | None = None,
                 columns: tuple[str, str] = COMPARE_COLUMNS[1:], since: str = ""):
        super().__init__(parent)
        self.setWindowTitle(tr("Compare: {registration}", registration=registration))
        self._changes = list(changes)
        self._registration = registration
        self._columns = (COMPARE_COLUMNS[0],) + tuple(columns)
        self._since = since
        worse = {i for i, c in enumerate(self._changes) if c.worse}
        label = translated().label  # a figure's label in the app's language (its identity stays the English)
        rows = [(f"{tr(WORSE_MARK)}{label(c.label)}" if i in worse else label(c.label), c.old or tr(NOT_PRINTED),
                 c.new or tr(NOT_PRINTED)) for i, c in enumerate(self._changes)]
        tips = [tr("Less room before the stall than the card printed now") if i in worse else ""
                for i in range(len(rows))]

        layout = QVBoxLayout(self)
        self.summary = QLabel(self._summary(len(worse)))
        self.summary.setWordWrap(True)
        layout.addWidget(self.summary)
        self.table = _table(self._columns, rows, worse, tips)
        self.table.setAccessibleName(tr("Printed figures that change"))
        self.table.setVisible(bool(rows))
        layout.addWidget(self.table)

        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Close)
        self.copy_button = QPushButton(tr("Copy as text"))
        buttons.addButton(self.copy_button, QDialogButtonBox.ButtonRole.ActionRole)
        self.copy_button.clicked.connect(self.copy_to_clipboard)
        buttons.rejected.connect(self.reject)
        layout.addWidget(buttons)
        self.resize(640, 420 if rows else 160)

    def _summary(self, n_worse: int) -> str:
        since = f" {self._since}" if self._since else ""
        if not self._changes:
            return tr("No printed figure changed on the card of {registration}{since}.",
                      registration=self._registration, since=since)
        text = tr("{n} printed figure(s) on the card of {registration} read differently{since}: print a new card.",
                  n=len(self._changes), registration=self._registration, since=since)
        if n_worse:
            text += " " + tr("Less room before the stall ({n}): a smaller margin or bank, or a higher stall speed; "
                             "those rows are in bold and begin with \u201c{mark}\u201d.", n=n_worse,
                             mark=tr(WORSE_MARK).strip())
        return text

    def row_count(self) -> int:
        return self.table.rowCount()

    def rows(self) -> list[tuple[str, str, str]]:
        """The table's cells as shown, row by row."""
        return _cell_texts(self.table)

    def as_text(self) -> str:
        """The plain-text list the copy button puts on the clipboard."""
        if not self._changes:
            return f"{self._registration}: {tr(NO_CHANGE)}\n"
        lines = [tr("{registration}: printed figures that change ({old} -> {new})", registration=self._registration,
                    old=tr(self._columns[1]), new=tr(self._columns[2]))]
        lines += [f"{figure}: {old} -> {new}" for figure, old, new in self.rows()]
        return "\n".join(lines) + "\n"

    def copy_to_clipboard(self) -> None:
        QGuiApplication.clipboard().setText(self.as_text())


class FormulaHelpDialog(QDialog):
    """The formulas behind every figure and their sources, under the caution."""

    def __init__(self, parent: QWidget | None = None):
        super().__init__(parent)
        self.setWindowTitle(tr("How the figures are computed"))
        layout = QVBoxLayout(self)
        self.browser = QTextBrowser()
        self.browser.setOpenExternalLinks(False)  # the app never goes online
        # the page in the app's language: the formulas, the regulations' numbers and the sources' titles as written
        self.browser.setHtml(f"<p><b>{escape(tr(CAUTION))}</b></p>{formulas_html(translated())}")
        layout.addWidget(self.browser)
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Close)
        buttons.rejected.connect(self.reject)
        layout.addWidget(buttons)
        self.resize(760, 560)


def _message_box(parent: QWidget | None, title: str, text: str) -> None:
    QMessageBox.warning(parent, title, text)


def show_caution_once(parent: QWidget | None, settings: QSettings,
                      ask: Callable[[QWidget | None, str, str], None] | None = None) -> bool:
    """Show the caution on first start and record it in `settings`; True if it was shown now.

    `ask(parent, title, text)` replaces the message box (tests pass a recorder).
    """
    if settings.value(CAUTION_KEY, False, type=bool):
        return False
    (ask or _message_box)(parent, tr(CAUTION_TITLE), tr(CAUTION))
    settings.setValue(CAUTION_KEY, True)
    settings.sync()
    return True


def _found(value: object, limit: int = 60) -> str:
    """A value as written in the file, quoted like the command line quotes it."""
    if value is None:
        return ""
    text = repr(value)
    return text if len(text) <= limit else text[: limit - 3] + "..."


class ProblemsDialog(QDialog):
    """Every problem of a profile or style file, one per row, errors before warnings."""

    def __init__(self, title: str, problems: list[Problem], parent: QWidget | None = None):
        super().__init__(parent)
        self.setWindowTitle(title)
        ordered = sorted(problems, key=lambda p: not p.is_error)  # stable: file order within each severity
        # what is wrong and what would do in the app's language (made as Msg); the path and the value as written
        rows = [(tr(SEVERITIES.get(p.severity, p.severity.upper())), p.path, told(p.message), _found(p.value),
                 told(p.expected)) for p in ordered]
        errors = sum(p.is_error for p in ordered)
        layout = QVBoxLayout(self)
        summary = tr("{errors} error(s), {warnings} warning(s).", errors=errors, warnings=len(ordered) - errors)
        if errors:
            summary += " " + tr("No card can be made until every error is corrected; warnings are shown on the way.")
        self.summary = QLabel(summary)
        self.summary.setWordWrap(True)
        layout.addWidget(self.summary)
        self.table = _table(PROBLEM_COLUMNS, rows, {i for i, p in enumerate(ordered) if p.is_error},
                            [str(p) for p in ordered])
        self.table.setAccessibleName(tr("Problems"))
        layout.addWidget(self.table)
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Close)
        buttons.rejected.connect(self.reject)
        layout.addWidget(buttons)
        self.resize(760, 360)

    def rows(self) -> list[tuple[str, str, str, str, str]]:
        return _cell_texts(self.table)


def progress_dialog(parent: QWidget | None, total: int) -> QProgressDialog:
    dialog = QProgressDialog(tr("Making cards"), tr("Cancel"), 0, total, parent)
    dialog.setWindowTitle(tr("Making cards"))
    # Window-modal: setValue then processes events, so Cancel answers while cards are being made.
    dialog.setWindowModality(Qt.WindowModality.WindowModal)
    dialog.setMinimumDuration(0)
    dialog.setAutoClose(False)
    return dialog


def export_fleet(parent: QWidget | None, paths: list[Path], styles: Styles, out: Path | None = None,
                 sheet: str | None = None, each: Path | None = None, progress_factory=None) -> Export:
    """Make and write the cards of `paths` as `kneeboard card` does (`export.export_cards`), with a cancellable
    progress dialog: one PDF `out` (imposed on `sheet` if given) and/or one PDF per aircraft in `each`.

    Profiles that fail and files that cannot be written are in the returned export's failures; when cancelled
    the one PDF is not written. `progress_factory(parent, total)` replaces the QProgressDialog (it needs
    setValue, setLabelText, wasCanceled and close).
    """
    from kneeboard.export import Export, Failure, export_cards

    if out is None and each is None:
        raise ValueError("export_fleet needs out, each, or both")
    dialog = (progress_factory or progress_dialog)(parent, len(paths))

    def progress(done: int, total: int, name: str) -> bool:
        if name:
            dialog.setLabelText(tr("Card {n} of {total}: {name}", n=done + 1, total=total, name=name))
        dialog.setValue(done)
        return not dialog.wasCanceled()

    try:
        return export_cards(list(paths), styles, out, sheet, each, progress=progress)
    except FileProblem as exc:  # as on the command line: the first file that cannot be written stops the writing
        result = Export()
        result.failures.append(Failure(Path(out or each), [str(exc)]))
        return result
    finally:
        dialog.close()
        if hasattr(dialog, "deleteLater"):
            dialog.deleteLater()  # one dialog per export: none piles up under the window
