"""The fleet panel: the profiles of a folder, with a mark on the ones that have problems."""

from pathlib import Path

from PySide6.QtCore import Qt, QTimer, Signal
from PySide6.QtGui import QIcon
from PySide6.QtWidgets import (
    QHBoxLayout,
    QLabel,
    QPushButton,
    QStyle,
    QTreeWidget,
    QTreeWidgetItem,
    QVBoxLayout,
    QWidget,
)

from kneeboard.profile_io import profile_files, read_source
from kneeboard.registrations import duplicates, others

PATH_ROLE = Qt.ItemDataRole.UserRole
CHECK_DELAY_MS = 50  #: [ms] from listing a folder to checking its first profile, so the list is drawn first
COLUMNS = ("", "Registration", "Model")
DUPLICATE = "duplicate registration"  #: the mark of a profile whose registration another one of the folder has
EMPTY_HINT = ("No profiles (*.toml) in this folder. File › New profile from template makes one; "
              "save it here and it appears in this list.")


class FleetPanel(QWidget):
    opened = Signal(Path)  #: the person chose a profile
    checked = Signal()  #: every profile of the folder has its mark

    def __init__(self, prepare=None, parent=None):
        """`prepare(source)` takes a profile to its problems the way its card is made (the session's)."""
        super().__init__(parent)
        if prepare is None:
            from kneeboard.app.session import Session

            prepare = Session().prepare_source
        self._prepare = prepare
        self.folder: Path | None = None
        self._items: dict[str, QTreeWidgetItem] = {}
        self._duplicates: dict[str, str] = {}  #: path -> why it is marked: another profile has its registration
        self._unchecked: list[str] = []  #: paths of the listed profiles not yet marked
        self._check_timer = QTimer(self, singleShot=True, interval=0)
        self._check_timer.timeout.connect(self._check_next)
        self.tree = QTreeWidget()
        self.tree.setHeaderLabels(list(COLUMNS))
        self.tree.setRootIsDecorated(False)
        self.tree.setColumnWidth(0, 28)
        self.tree.setColumnWidth(1, 110)
        self.tree.itemActivated.connect(self._chosen)
        self.tree.itemClicked.connect(self._chosen)
        self.hint = QLabel(EMPTY_HINT)
        self.hint.setWordWrap(True)
        self.hint.hide()
        self.title = QLabel("No folder open")
        self.title.setStyleSheet("font-weight: bold;")
        self.title.setWordWrap(True)
        self.where = QLabel()  #: where the folder is (the sample fleet's copy lives in the app's data folder)
        self.where.setStyleSheet("color: #555;")
        self.where.setWordWrap(True)
        self.where.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        self.where.hide()
        self._current: Path | None = None  #: the profile highlighted: the one being edited
        self.open_folder = QPushButton("Open folder…")
        self.reload = QPushButton("Reload")
        self.reload.clicked.connect(lambda: self.folder and self.show_folder(self.folder, self._current))
        buttons = QHBoxLayout()
        buttons.addWidget(self.open_folder)
        buttons.addWidget(self.reload)
        box = QVBoxLayout(self)
        box.setContentsMargins(0, 0, 0, 0)
        box.addWidget(self.title)
        box.addWidget(self.where)
        box.addWidget(self.hint)
        box.addWidget(self.tree)
        box.addLayout(buttons)

    def show_folder(self, folder: Path, current: Path | None = None) -> None:
        """List the folder's profiles at once (registration and model as written); their marks follow, one
        profile checked per event-loop turn, so a large fleet never holds the window up."""
        self.folder = Path(folder)
        self._current = Path(current) if current is not None else None
        self.title.setText(f"Fleet: {self.folder.name}")
        self.title.setToolTip(str(self.folder))
        self.where.setText(shown_folder(self.folder.parent))
        self.where.setToolTip(str(self.folder))
        self.where.show()
        self._items: dict[str, QTreeWidgetItem] = {}  # emptied with the tree, whose clear() deletes the items
        self._unchecked = []
        self.tree.clear()
        written = []
        for path in profile_files(self.folder):
            source = read_source(path)
            aircraft = (source.data or {}).get("aircraft")
            aircraft = aircraft if isinstance(aircraft, dict) else {}
            registration, model = aircraft.get("registration"), aircraft.get("model")
            item = QTreeWidgetItem(["", registration if isinstance(registration, str) else path.stem,
                                    model if isinstance(model, str) else "cannot be read"])
            item.setData(0, PATH_ROLE, str(path))
            written.append((registration if isinstance(registration, str) and registration.strip() else None, path))
            item.setToolTip(1, str(path))
            item.setToolTip(2, item.text(2))
            self.tree.addTopLevelItem(item)
            self._unchecked.append(str(path))
            self._items[str(path)] = item
            if current is not None and Path(current) == path:
                self.tree.setCurrentItem(item)
        self._duplicates = {str(path): f"{registration} is also the registration of {others(path, files)}: "
                            "compare and one card per aircraft cannot tell them apart"
                            for registration, files in duplicates(written).items() for path in files}
        for path, why in self._duplicates.items():
            self._mark_duplicate(self._items[path], why)
        self.tree.sortItems(1, Qt.SortOrder.AscendingOrder)
        self.tree.resizeColumnToContents(1)
        self.hint.setVisible(not self._unchecked)
        self.tree.setVisible(bool(self._unchecked))
        self._check_timer.start(CHECK_DELAY_MS)  # the list paints first; then one profile per turn

    def _check_next(self) -> None:
        if self._unchecked:
            self._mark(self._unchecked.pop(0))
            self._check_timer.start(0)
        else:
            self.checked.emit()

    def recheck(self) -> None:
        """Check every listed profile again (the card style changed, and with it what a profile's card can be)."""
        for path, item in self._items.items():
            item.setIcon(0, QIcon())
            item.setData(1, Qt.ItemDataRole.AccessibleDescriptionRole, None)
            item.setToolTip(0, "")
            if path in self._duplicates:
                self._mark_duplicate(item, self._duplicates[path])
        self._unchecked = list(self._items)
        self._check_timer.start(0)

    def check_all(self) -> None:
        """Give every listed profile its mark now (a test, or before a whole-fleet action)."""
        self._check_timer.stop()
        while self._unchecked:
            self._mark(self._unchecked.pop(0))
        self.checked.emit()

    def _item(self, path: str) -> QTreeWidgetItem | None:
        return self._items.get(path)

    def _mark(self, path: str) -> None:
        item = self._item(path)
        if item is None:
            return
        prepared = self._prepare(read_source(Path(path)))
        style = self.style()
        if prepared.fingerprint:  # what a printed card of this aircraft carries beside its date
            item.setToolTip(1, f"{path}\nfingerprint {prepared.fingerprint}")
        duplicate = [self._duplicates[path]] if path in self._duplicates else []
        if prepared.errors:
            item.setIcon(0, style.standardIcon(QStyle.StandardPixmap.SP_MessageBoxCritical))
            item.setToolTip(0, "\n".join(duplicate + [str(p.path) + ": " + p.message for p in prepared.errors[:8]]))
            item.setData(1, Qt.ItemDataRole.AccessibleDescriptionRole, "has errors")
        elif duplicate or prepared.warnings:
            # a warning in the words the card prints it in (`Problem.plain`), as a pilot reads it
            item.setIcon(0, style.standardIcon(QStyle.StandardPixmap.SP_MessageBoxWarning))
            item.setToolTip(0, "\n".join(duplicate + [p.plain or (str(p.path) + ": " + p.message)
                                                       for p in prepared.warnings[:8]]))
            item.setData(1, Qt.ItemDataRole.AccessibleDescriptionRole,
                         DUPLICATE if duplicate else "has warnings")

    def _mark_duplicate(self, item: QTreeWidgetItem, why: str) -> None:
        """A profile whose registration another profile of the folder has: marked, and both named, at once."""
        item.setIcon(0, self.style().standardIcon(QStyle.StandardPixmap.SP_MessageBoxWarning))
        item.setToolTip(0, why)
        item.setData(1, Qt.ItemDataRole.AccessibleDescriptionRole, DUPLICATE)

    def rows(self) -> list[tuple[str, str, str]]:
        """(mark, registration, path) per row: mark is "error", "duplicate registration", "warning" or ""."""
        out = []
        for i in range(self.tree.topLevelItemCount()):
            item = self.tree.topLevelItem(i)
            mark = item.data(1, Qt.ItemDataRole.AccessibleDescriptionRole) or ""
            out.append((mark.replace("has ", "").rstrip("s"), item.text(1), item.data(0, PATH_ROLE)))
        return out

    def select(self, path: Path | None) -> None:
        """Highlight the profile at `path`; None (a new profile, not in the fleet): highlight none."""
        self._current = Path(path) if path is not None else None
        for i in range(self.tree.topLevelItemCount()):
            item = self.tree.topLevelItem(i)
            if path is not None and item.data(0, PATH_ROLE) == str(path):
                self.tree.setCurrentItem(item)
                return
        self.tree.setCurrentItem(None)
        self.tree.clearSelection()

    def _chosen(self, item, _column=0):
        self.opened.emit(Path(item.data(0, PATH_ROLE)))


def shown_folder(folder: Path) -> str:
    """`folder` as a person reads it: "in ~/.local/share/kneeboard" (the home folder as ~)."""
    home = Path.home()
    try:
        return f"in ~/{folder.relative_to(home).as_posix()}" if folder != home else "in ~"
    except ValueError:
        return f"in {folder}"
