"""The fleet: the profiles of a folder as a Qt item model with named roles. No widget, and nothing computed here.

Rows are listed from the files at once (registration and model as written; each file read once, and its data kept
for the check). The controller checks each profile through the pipeline, one per event-loop turn, and gives the
model what it found (`set_checked`). A view shows the roles; tests read them without one.
"""

from dataclasses import dataclass
from pathlib import Path

from PySide6.QtCore import QAbstractTableModel, QModelIndex, QPersistentModelIndex, Qt

from kneeboard.app.words import told, tr
from kneeboard.i18n import N_, Msg, Word
from kneeboard.inputs.profiles import Source, profile_files, read_source
from kneeboard.registrations import duplicates, others

#: The roles a view or a test reads (every column answers every role).
REGISTRATION_ROLE = Qt.ItemDataRole.UserRole + 1  #: the registration as written (the file's name when it has none)
MODEL_ROLE = Qt.ItemDataRole.UserRole + 2  #: the aircraft's model as written
PATH_ROLE = Qt.ItemDataRole.UserRole + 3  #: the profile file (a Path)
PROBLEMS_ROLE = Qt.ItemDataRole.UserRole + 4  #: what is wrong with it, one line each (a list of str: English, each
#: a Msg the tooltip tells in the app's language)
MARK_ROLE = Qt.ItemDataRole.UserRole + 5  #: ERROR, DUPLICATE, WARNING, or "" (none, or not checked yet)
FINGERPRINT_ROLE = Qt.ItemDataRole.UserRole + 6  #: what its card prints beside the date ("" until checked)
CHECKED_ROLE = Qt.ItemDataRole.UserRole + 7  #: whether its mark is made (False from listing until its check)

COLUMNS = ("", N_("Registration"), N_("Model"))
MARK_COLUMN, REGISTRATION_COLUMN, MODEL_COLUMN = range(3)
ERROR = N_("error")
WARNING = N_("warning")
DUPLICATE = N_("duplicate registration")  #: the mark of a profile whose registration another one of the folder has
UNREADABLE = N_("cannot be read")  #: the model shown for a file that cannot be read
MOST_SHOWN = 8  #: problems named per profile; the rest are in the editor's list


@dataclass
class Row:
    path: Path
    registration: str
    model: str
    source: Source  #: the file as it was read for the list: checked from this, never read again
    duplicate: str = ""  #: why it is marked: another profile of the folder has its registration
    problems: tuple[str, ...] = ()
    mark: str = ""
    fingerprint: str = ""
    checked: bool = False


class FleetModel(QAbstractTableModel):
    def __init__(self, parent=None):
        super().__init__(parent)
        self.folder: Path | None = None
        self._rows: list[Row] = []

    # --- listing ---------------------------------------------------------------------------------
    def list_folder(self, folder: Path) -> None:
        """The folder's profiles, sorted by registration, unchecked (a duplicate registration is marked at once)."""
        self.beginResetModel()
        self.folder = Path(folder)
        rows, written = [], []
        for path in profile_files(self.folder):
            source = read_source(path)
            aircraft = (source.data or {}).get("aircraft")
            aircraft = aircraft if isinstance(aircraft, dict) else {}
            registration, model = aircraft.get("registration"), aircraft.get("model")
            rows.append(Row(path, registration if isinstance(registration, str) else path.stem,
                            model if isinstance(model, str) else UNREADABLE, source))
            written.append((registration if isinstance(registration, str) and registration.strip() else None, path))
        why = {path: tr("{registration} is also the registration of {others}: compare and one card per aircraft "
                        "cannot tell them apart", registration=registration, others=others(path, files))
               for registration, files in duplicates(written).items() for path in files}
        for row in rows:
            row.duplicate = why.get(row.path, "")
            row.mark = DUPLICATE if row.duplicate else ""
        self._rows = sorted(rows, key=lambda r: (r.registration, str(r.path)))
        self.endResetModel()

    def forget_checks(self) -> None:
        """Every mark is to be made again (the card style changed, and with it what a profile's card can be)."""
        for row in self._rows:
            row.problems, row.fingerprint, row.checked = (), "", False
            row.mark = DUPLICATE if row.duplicate else ""
        self._changed(0, len(self._rows) - 1)

    def set_checked(self, path: Path, prepared) -> None:
        """What the pipeline found for `path` (a `pipeline.Prepared`): its mark, the reasons and its fingerprint."""
        i = self.row_of(path)
        if i < 0:
            return
        row = self._rows[i]
        duplicate = [row.duplicate] if row.duplicate else []
        if prepared.errors:
            row.mark = ERROR
            row.problems = tuple(duplicate + [_line(p) for p in prepared.errors[:MOST_SHOWN]])
        else:  # a warning in the words the card prints it in (`Problem.plain`), as a pilot reads it
            row.mark = DUPLICATE if duplicate else (WARNING if prepared.warnings else "")
            row.problems = tuple(duplicate + [p.plain or _line(p) for p in prepared.warnings[:MOST_SHOWN]])
        row.fingerprint, row.checked = prepared.fingerprint, True
        self._changed(i, i)

    # --- reading ---------------------------------------------------------------------------------
    def paths(self) -> list[Path]:
        return [row.path for row in self._rows]

    def row_of(self, path: Path | None) -> int:
        """The row of the profile at `path`; -1 when it is not listed."""
        if path is None:
            return -1
        return next((i for i, row in enumerate(self._rows) if row.path == Path(path)), -1)

    def source(self, path: Path) -> Source | None:
        """The file as it was read for the list."""
        i = self.row_of(path)
        return self._rows[i].source if i >= 0 else None

    # --- the model -------------------------------------------------------------------------------
    def rowCount(self, parent=QModelIndex()) -> int:  # noqa: N802, B008 - Qt's name and signature
        return 0 if parent.isValid() else len(self._rows)

    def columnCount(self, parent=QModelIndex()) -> int:  # noqa: N802, B008 - Qt's name and signature
        return 0 if parent.isValid() else len(COLUMNS)

    def headerData(self, section, orientation, role=Qt.ItemDataRole.DisplayRole):  # noqa: N802 - Qt's name
        if orientation == Qt.Orientation.Horizontal and role == Qt.ItemDataRole.DisplayRole:
            return tr(COLUMNS[section]) if COLUMNS[section] else ""
        return None

    def data(self, index: QModelIndex | QPersistentModelIndex, role=Qt.ItemDataRole.DisplayRole):
        if not index.isValid() or not 0 <= index.row() < len(self._rows):
            return None
        row, column = self._rows[index.row()], index.column()
        named = {REGISTRATION_ROLE: row.registration, MODEL_ROLE: row.model, PATH_ROLE: row.path,
                 PROBLEMS_ROLE: list(row.problems), MARK_ROLE: row.mark, FINGERPRINT_ROLE: row.fingerprint,
                 CHECKED_ROLE: row.checked}
        if role in named:
            return named[role]
        if role == Qt.ItemDataRole.DisplayRole:
            model = tr(row.model) if isinstance(row.model, Word) else row.model  # UNREADABLE: ours, said in words
            return {REGISTRATION_COLUMN: row.registration, MODEL_COLUMN: model}.get(column, "")
        if role == Qt.ItemDataRole.ToolTipRole:
            if column == MARK_COLUMN:
                return "\n".join(told(line) for line in row.problems or ([row.duplicate] if row.duplicate else []))
            if column == REGISTRATION_COLUMN:  # the fingerprint: what a printed card of this aircraft carries
                return (f"{row.path}\n{tr(N_('fingerprint'))} {row.fingerprint}" if row.fingerprint
                        else str(row.path))
            return row.model
        if role == Qt.ItemDataRole.AccessibleDescriptionRole and column == MARK_COLUMN:
            return tr(row.mark) if row.mark else ""  # what a screen reader says for the mark's icon
        return None

    def _changed(self, first: int, last: int) -> None:
        if last >= first:
            self.dataChanged.emit(self.index(first, 0), self.index(last, len(COLUMNS) - 1))


def _line(problem) -> Msg:
    """A problem's line in the fleet's tooltip: its field and what is wrong, told in the app's language when shown
    (the field's path as the file has it)."""
    return Msg("{path}: {message}", path=problem.path, message=problem.message)


def shown_folder(folder: Path) -> str:
    """`folder` as a person reads it: "in ~/.local/share/kneeboard" (the home folder as ~)."""
    return tr("in {folder}", folder=home_relative(folder))


def home_relative(folder: Path) -> str:
    """`folder` with the home folder written as ~."""
    home = Path.home()
    try:
        return f"~/{folder.relative_to(home).as_posix()}" if folder != home else "~"
    except ValueError:
        return str(folder)
