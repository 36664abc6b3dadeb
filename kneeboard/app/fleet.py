"""The fleet panel: the profiles of a folder, with a mark on the ones that have problems."""

from pathlib import Path

from PySide6.QtCore import Qt, Signal
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

from kneeboard.profile_io import load_profile, profile_files

PATH_ROLE = Qt.ItemDataRole.UserRole
COLUMNS = ("", "Registration", "Model")


class FleetPanel(QWidget):
    opened = Signal(Path)  #: the person chose a profile

    def __init__(self, parent=None):
        super().__init__(parent)
        self.folder: Path | None = None
        self.tree = QTreeWidget()
        self.tree.setHeaderLabels(list(COLUMNS))
        self.tree.setRootIsDecorated(False)
        self.tree.setColumnWidth(0, 28)
        self.tree.setColumnWidth(1, 110)
        self.tree.itemActivated.connect(self._chosen)
        self.tree.itemClicked.connect(self._chosen)
        self.title = QLabel("No folder open")
        self.title.setStyleSheet("font-weight: bold;")
        self.title.setWordWrap(True)
        self.open_folder = QPushButton("Open folder…")
        self.reload = QPushButton("Reload")
        self.reload.clicked.connect(lambda: self.folder and self.show_folder(self.folder))
        buttons = QHBoxLayout()
        buttons.addWidget(self.open_folder)
        buttons.addWidget(self.reload)
        box = QVBoxLayout(self)
        box.setContentsMargins(0, 0, 0, 0)
        box.addWidget(self.title)
        box.addWidget(self.tree)
        box.addLayout(buttons)

    def show_folder(self, folder: Path, current: Path | None = None) -> None:
        self.folder = Path(folder)
        self.title.setText(f"Fleet: {self.folder.name}")
        self.title.setToolTip(str(self.folder))
        self.tree.clear()
        style = self.style()
        for path in profile_files(self.folder):
            loaded = load_profile(path)
            a = loaded.profile.aircraft if loaded.profile else None
            item = QTreeWidgetItem(["", a.registration if a else path.stem, a.model if a else "cannot be read"])
            item.setData(0, PATH_ROLE, str(path))
            if loaded.errors:
                item.setIcon(0, style.standardIcon(QStyle.StandardPixmap.SP_MessageBoxCritical))
                item.setToolTip(0, "\n".join(str(p.path) + ": " + p.message for p in loaded.errors[:8]))
                item.setData(1, Qt.ItemDataRole.AccessibleDescriptionRole, "has errors")
            elif loaded.warnings:
                item.setIcon(0, style.standardIcon(QStyle.StandardPixmap.SP_MessageBoxWarning))
                item.setToolTip(0, "\n".join(str(p.path) + ": " + p.message for p in loaded.warnings[:8]))
                item.setData(1, Qt.ItemDataRole.AccessibleDescriptionRole, "has warnings")
            self.tree.addTopLevelItem(item)
            if current is not None and Path(current) == path:
                self.tree.setCurrentItem(item)
        self.tree.sortItems(1, Qt.SortOrder.AscendingOrder)

    def rows(self) -> list[tuple[str, str, str]]:
        """(mark, registration, path) per row: mark is "error", "warning" or ""."""
        out = []
        for i in range(self.tree.topLevelItemCount()):
            item = self.tree.topLevelItem(i)
            mark = item.data(1, Qt.ItemDataRole.AccessibleDescriptionRole) or ""
            out.append((mark.replace("has ", "").rstrip("s"), item.text(1), item.data(0, PATH_ROLE)))
        return out

    def select(self, path: Path) -> None:
        for i in range(self.tree.topLevelItemCount()):
            item = self.tree.topLevelItem(i)
            if item.data(0, PATH_ROLE) == str(path):
                self.tree.setCurrentItem(item)

    def _chosen(self, item, _column=0):
        self.opened.emit(Path(item.data(0, PATH_ROLE)))
