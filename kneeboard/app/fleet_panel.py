"""The fleet panel: a view of the fleet model (`app.fleet`), with a mark on the profiles that have problems."""

from pathlib import Path

from PySide6.QtCore import QIdentityProxyModel, Qt, Signal
from PySide6.QtWidgets import (
    QAbstractItemView,
    QHBoxLayout,
    QLabel,
    QPushButton,
    QStyle,
    QTreeView,
    QVBoxLayout,
    QWidget,
)

from kneeboard.app.fleet import (
    DUPLICATE,
    ERROR,
    MARK_COLUMN,
    MARK_ROLE,
    PATH_ROLE,
    REGISTRATION_COLUMN,
    WARNING,
    FleetModel,
    home_relative,
)
from kneeboard.app.words import Texts
from kneeboard.i18n import N_

EMPTY_HINT = N_("No profiles (*.toml) in this folder. File › New profile from template makes one; save it here "
                "and it appears in this list.")


class _Marks(QIdentityProxyModel):
    """The model's marks as the icons of the mark column."""

    ICONS = {ERROR: QStyle.StandardPixmap.SP_MessageBoxCritical, WARNING: QStyle.StandardPixmap.SP_MessageBoxWarning,
             DUPLICATE: QStyle.StandardPixmap.SP_MessageBoxWarning}

    def __init__(self, style: QStyle, parent=None):
        super().__init__(parent)
        self._icons = {mark: style.standardIcon(pixmap) for mark, pixmap in self.ICONS.items()}

    def data(self, index, role=Qt.ItemDataRole.DisplayRole):
        if role == Qt.ItemDataRole.DecorationRole and index.column() == MARK_COLUMN:
            return self._icons.get(super().data(index, MARK_ROLE))
        return super().data(index, role)


class FleetPanel(QWidget):
    opened = Signal(Path)  #: the person chose a profile

    def __init__(self, model: FleetModel, parent=None):
        super().__init__(parent)
        self.model = model
        self._current: Path | None = None  #: the profile highlighted: the one being edited
        self.tree = QTreeView()
        self.tree.setModel(_Marks(self.style(), self))
        self.tree.model().setSourceModel(model)
        self.tree.setRootIsDecorated(False)
        self.tree.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        self.tree.setEditTriggers(QAbstractItemView.EditTrigger.NoEditTriggers)
        self.tree.setColumnWidth(MARK_COLUMN, 28)
        self.tree.setColumnWidth(REGISTRATION_COLUMN, 110)
        self.tree.activated.connect(self._chosen)
        self.tree.clicked.connect(self._chosen)
        self.texts = Texts()  #: the panel's words, shown again when the language changes
        self.hint = QLabel()
        self.texts.set(self.hint.setText, EMPTY_HINT)
        self.hint.setWordWrap(True)
        self.hint.hide()
        self.title = QLabel()
        self.texts.set(self.title.setText, N_("No folder open"))
        self.title.setStyleSheet("font-weight: bold;")
        self.title.setWordWrap(True)
        self.where = QLabel()  #: where the folder is (the sample fleet's copy lives in the app's data folder)
        self.where.setStyleSheet("color: #555;")
        self.where.setWordWrap(True)
        self.where.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        self.where.hide()
        self.open_folder = QPushButton()
        self.texts.set(self.open_folder.setText, N_("Open folder…"))
        self.reload = QPushButton()
        self.texts.set(self.reload.setText, N_("Reload"))
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
        model.modelReset.connect(self._listed)

    def _listed(self) -> None:
        """A folder was listed: its name, where it is, and the highlight of the profile being edited."""
        folder = self.model.folder
        if folder is not None:
            self.texts.set(self.title.setText, N_("Fleet: {name}"), name=folder.name)
            self.title.setToolTip(str(folder))
            self.texts.set(self.where.setText, N_("in {folder}"), folder=home_relative(folder.parent))
            self.where.setToolTip(str(folder))
            self.where.show()
        rows = self.model.rowCount()
        self.hint.setVisible(not rows)
        self.tree.setVisible(bool(rows))
        self.tree.resizeColumnToContents(REGISTRATION_COLUMN)
        self.select(self._current)

    def retranslate(self) -> None:
        """The app's language changed: the panel's words and the list's column heads in it."""
        self.texts.again()
        self.model.headerDataChanged.emit(Qt.Orientation.Horizontal, 0, self.model.columnCount() - 1)

    def select(self, path: Path | None) -> None:
        """Highlight the profile at `path`; None (a new profile, not in the fleet): highlight none."""
        self._current = Path(path) if path is not None else None
        row = self.model.row_of(self._current)
        if row >= 0:
            self.tree.setCurrentIndex(self.tree.model().index(row, REGISTRATION_COLUMN))
            return
        self.tree.selectionModel().clear()  # neither selected nor current

    def _chosen(self, index) -> None:
        self.opened.emit(Path(index.data(PATH_ROLE)))
