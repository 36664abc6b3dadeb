"""Editing a fleet's card style: the fields of a style file, saved beside the fleet's profiles."""

from pathlib import Path

import tomlkit
import tomlkit.exceptions
from PySide6.QtCore import Qt
from PySide6.QtGui import QColor
from PySide6.QtWidgets import (
    QAbstractItemView,
    QColorDialog,
    QComboBox,
    QDialog,
    QDialogButtonBox,
    QDoubleSpinBox,
    QFormLayout,
    QLabel,
    QLineEdit,
    QListWidget,
    QListWidgetItem,
    QPushButton,
    QVBoxLayout,
)

from kneeboard.card.blocks import registry
from kneeboard.card.geometry import CARD_SIZES
from kneeboard.card.style import BINDINGS, LEGACY_ORGANIZATION, CardStyle, load_style
from kneeboard.fileio import FileProblem, read_text, write_atomic
from kneeboard.shipped import default_style_path

#: What the card sizes are, as a person buying card stock reads them.
SIZE_LABELS = {"a5": "A5 (148 x 210 mm)", "half-letter": "Half letter (5.5 x 8.5 in)", "5x8": "5 x 8 in",
               "4x6": "4 x 6 in"}


class StyleDialog(QDialog):
    """Shows a style; `save(path)` writes it, keeping the file's comments and other keys."""

    def __init__(self, style: CardStyle, parent=None, faces=None):
        """`faces(values)`, when given, says how many cards and faces the open profile's card takes with the
        dialog's values (a line the dialog shows and keeps up to date)."""
        super().__init__(parent)
        self.setWindowTitle("Card style")
        self.style_in = style
        form = QFormLayout()
        self.organization = QLineEdit(style.organization)
        self.logo = QLineEdit(style.logo.name if style.logo else "")
        self.logo.setPlaceholderText("a PNG or SVG file in the fleet folder, e.g. logo.png")
        self.accent = QPushButton(style.accent)
        self.accent.clicked.connect(self._pick_colour)
        self._show_colour(style.accent)
        self.scale = QDoubleSpinBox()
        self.scale.setRange(0.7, 1.6)
        self.scale.setSingleStep(0.05)
        self.scale.setValue(style.font_scale)
        self.size = _combo(tuple(CARD_SIZES), style.size, SIZE_LABELS)
        self.orientation = _combo(("portrait", "landscape"), "landscape" if style.landscape else "portrait")
        self.binding = _combo(BINDINGS, style.binding)
        self.blocks = QListWidget()
        self.blocks.setDragDropMode(QAbstractItemView.DragDropMode.InternalMove)
        labels = registry.labels()  # every registered block has its label: a new block needs no entry here
        front = list(style.front) if style.front is not None else list(labels)
        shown = front + [b for b in labels if b not in front]
        for name in shown:
            item = QListWidgetItem(labels.get(name, name))
            item.setData(Qt.ItemDataRole.UserRole, name)
            item.setFlags(item.flags() | Qt.ItemFlag.ItemIsUserCheckable | Qt.ItemFlag.ItemIsDragEnabled)
            item.setCheckState(Qt.CheckState.Checked if name in front or name in style.back
                               else Qt.CheckState.Unchecked)
            self.blocks.addItem(item)
        form.addRow("Organization", self.organization)
        form.addRow("Logo", self.logo)
        form.addRow("Accent colour", self.accent)
        form.addRow("Type size", self.scale)
        form.addRow("Card size", self.size)
        form.addRow("Orientation", self.orientation)
        form.addRow("Binding edge", self.binding)
        form.addRow(QLabel("Blocks, in order (drag to reorder; the caution is always printed):"))
        form.addRow(self.blocks)
        self.faces = QLabel()
        self.faces.setObjectName("faces")
        self._faces_of = faces
        if faces is not None:
            form.addRow("This profile's card", self.faces)
            for signal in (self.scale.valueChanged, self.size.currentIndexChanged,
                           self.orientation.currentIndexChanged, self.binding.currentIndexChanged,
                           self.organization.textChanged, self.blocks.itemChanged, self.blocks.model().rowsMoved):
                signal.connect(self.show_faces)
            self.show_faces()
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Save | QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(self.accept)
        buttons.rejected.connect(self.reject)
        box = QVBoxLayout(self)
        box.addLayout(form)
        box.addWidget(buttons)

    def show_faces(self, *_args) -> None:
        """How many cards and faces the open profile's card takes with what the dialog shows now."""
        self.faces.setText(self._faces_of(self.values()))

    def _show_colour(self, colour: str):
        self.accent.setText(colour)
        self.accent.setStyleSheet(f"background: {colour}; color: white;")

    def _pick_colour(self):
        colour = QColorDialog.getColor(QColor(self.accent.text()), self, "Accent colour")
        if colour.isValid():
            self._show_colour(colour.name().upper())

    def values(self) -> dict:
        """The style file's keys as the dialog shows them."""
        front = [self.blocks.item(i).data(Qt.ItemDataRole.UserRole) for i in range(self.blocks.count())
                 if self.blocks.item(i).checkState() == Qt.CheckState.Checked]
        return {
            "organization": self.organization.text(),
            "logo": self.logo.text().strip(),
            "accent": self.accent.text(),
            "font_scale": round(self.scale.value(), 2),
            "size": self.size.currentData(),
            "orientation": self.orientation.currentData(),
            "binding": self.binding.currentData(),
            "front": [b for b in front if b not in self.style_in.back],
        }

    def save(self, path: Path):
        """Write the style to `path` and read it back; returns (style or None, problems)."""
        source = path if path.is_file() else (self.style_in.source or default_style_path())
        text = read_text(source)
        try:
            doc = tomlkit.parse(text)
        except (tomlkit.exceptions.TOMLKitError, ValueError, RecursionError) as exc:
            # its comments and other keys would be lost: a style file the person must mend is never replaced
            raise FileProblem(f"{source}: is not valid TOML ({str(exc)[:120]}); it was left as it is") from None
        for key, value in self.values().items():
            doc[key] = value
        doc.pop(LEGACY_ORGANIZATION, None)  # its value is in organization now: the file speaks one spelling
        write_atomic(path, tomlkit.dumps(doc))
        return load_style(path)


def _combo(options, current, labels: dict[str, str] | None = None) -> QComboBox:
    """A choice of `options` (each shown by its label); `currentData()` is the option as the file writes it."""
    combo = QComboBox()
    for option in options:
        combo.addItem((labels or {}).get(option, option), option)
    combo.setCurrentIndex(max(0, combo.findData(current)))
    return combo
