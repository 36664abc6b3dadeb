"""The weight build-up: items by mass or by volume, in one table.

The amount column takes "80 kg" or "60 L": a volume makes the item a volume (with the density
column, default aviation gasoline), anything else is stored as its mass, exactly as typed.
"""

from PySide6.QtWidgets import (
    QAbstractItemView,
    QHBoxLayout,
    QHeaderView,
    QPushButton,
    QTableWidget,
    QTableWidgetItem,
)

from kneeboard import units
from kneeboard.app.fields import Field

COLUMNS = ("Item", "Mass or volume", "Density (for a volume)")


class ItemsField(Field):
    def __init__(self, parent=None):
        table = QTableWidget(0, 3)
        table.setHorizontalHeaderLabels(list(COLUMNS))
        table.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Stretch)
        table.verticalHeader().setVisible(False)
        table.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        table.setMinimumHeight(130)
        super().__init__(table, parent)
        self.add = QPushButton("Add item")
        self.delete = QPushButton("Remove item")
        row = QHBoxLayout()
        row.addWidget(self.add)
        row.addWidget(self.delete)
        row.addStretch(1)
        self.layout().insertLayout(1, row)
        self._quiet = False
        table.itemChanged.connect(self._changed)
        self.add.clicked.connect(self._add)
        self.delete.clicked.connect(self._remove)

    def _cells(self) -> list[list[str]]:
        t = self.input
        return [[(t.item(r, c).text() if t.item(r, c) else "") for c in range(3)] for r in range(t.rowCount())]

    def set_value(self, value) -> None:
        rows = []
        for item in value or []:
            if not isinstance(item, dict):
                rows.append([str(item), "", ""])
                continue
            amount = item.get("volume", item.get("mass", ""))
            rows.append([str(item.get("name", "")), str(amount), str(item.get("density", ""))])
        if rows == self._cells():
            return
        self._quiet = True
        self.input.setRowCount(len(rows))
        for r, cells in enumerate(rows):
            for c, text in enumerate(cells):
                self.input.setItem(r, c, QTableWidgetItem(text))
        self._quiet = False

    def items(self) -> list[dict]:
        out = []
        for name, amount, density in self._cells():
            item = {"name": name}
            if _is_volume(amount):
                item["volume"] = amount
                if density.strip():
                    item["density"] = density
            else:
                item["mass"] = amount
            out.append(item)
        return out

    def _changed(self, _item=None):
        if not self._quiet:
            self.edited.emit(self.items() or None)

    def _add(self):
        self.edited.emit(self.items() + [{"name": "New item", "mass": "0 kg"}])

    def _remove(self):
        items = self.items()
        r = self.input.currentRow()
        if items:
            del items[r if 0 <= r < len(items) else -1]
        self.edited.emit(items or None)


def _is_volume(text: str) -> bool:
    try:
        units.parse(text, units.VOLUME)
        return True
    except units.QuantityError:
        return False
