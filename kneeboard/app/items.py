"""The weight build-up: items by mass or by volume, in one table.

The amount column takes "80 kg" or "60 L": a volume makes the item a volume (with the density
column, default aviation gasoline), anything else is stored as its mass, exactly as typed.
"""

from kneeboard.app.fields import TableField
from kneeboard.app.hints import is_volume
from kneeboard.app.words import tr
from kneeboard.i18n import N_

COLUMNS = (N_("Item"), N_("Mass or volume"), N_("Density"))  #: a density is only read for a volume


class ItemsField(TableField):
    def __init__(self, parent=None):
        super().__init__(COLUMNS, N_("Add item"), N_("Remove item"), 130, parent)

    def set_value(self, value) -> None:
        rows = []
        for item in value or []:
            if not isinstance(item, dict):
                rows.append([str(item), "", ""])
                continue
            amount = item.get("volume", item.get("mass", ""))
            rows.append([str(item.get("name", "")), str(amount), str(item.get("density", ""))])
        self.show_cells(rows)

    def items(self) -> list[dict]:
        return self.value_of(self.cells()) or []

    def value_of(self, rows):
        out = []
        for name, amount, density in rows:
            item = {"name": name}
            if is_volume(amount):
                item["volume"] = amount
                if density.strip():
                    item["density"] = density
            else:
                item["mass"] = amount
            out.append(item)
        return out or None

    def new_row(self) -> list[str]:
        return [tr("New item"), "0 kg", ""]

