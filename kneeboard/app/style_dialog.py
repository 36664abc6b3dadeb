"""Editing a fleet's card style: the fields of a style file, saved beside the fleet's profiles.

Each input is made from its key's declaration (`kneeboard.inputs.style_keys`): its label, its help as a tooltip,
its options and bounds, so the dialog offers exactly what the reader accepts. Every word is shown in the app's
language as the dialog is made (`tr`: the declarations' words are English, and the catalogues hold them); the
language cannot change while the dialog is open.
"""

from pathlib import Path

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

from kneeboard.app.words import tr
from kneeboard.card.blocks import registry
from kneeboard.card.organization import load_card_style
from kneeboard.card.style import CardStyle
from kneeboard.fileio import FileProblem
from kneeboard.i18n import N_, Msg
from kneeboard.inputs.style_keys import BY_KEY, LEGACY_ORGANIZATION
from kneeboard.inputs.toml import load_document, save_document
from kneeboard.shipped import default_style_path

#: The options shown as the file writes them (no `option_labels` in their declaration), as a person reads them
OPTION_WORDS = {"portrait": N_("portrait"), "landscape": N_("landscape"), "none": N_("none"), "left": N_("left"),
                "top": N_("top")}


class StyleDialog(QDialog):
    """Shows a style; `save(path)` writes it, keeping the file's comments and other keys."""

    def __init__(self, style: CardStyle, parent=None, faces=None):
        """`faces(values)`, when given, says how many cards and faces the open profile's card takes with the
        dialog's values (a line the dialog shows and keeps up to date)."""
        super().__init__(parent)
        self.setWindowTitle(tr("Card style"))
        self.style_in = style
        form = QFormLayout()
        self.organization = QLineEdit(style.organization)
        self.organization.setMaxLength(BY_KEY["organization"].limit)
        self.logo = QLineEdit(style.logo.name if style.logo else "")
        self.logo.setPlaceholderText(tr("a PNG or SVG file in the fleet folder, e.g. logo.png"))
        self.accent = QPushButton(style.accent)
        self.accent.clicked.connect(self._pick_colour)
        self._show_colour(style.accent)
        self.scale = QDoubleSpinBox()
        scale = BY_KEY["font_scale"]
        self.scale.setRange(*scale.bounds)
        self.scale.setSingleStep(scale.step)
        self.scale.setValue(style.font_scale)
        self.size = _combo("size", style.size)
        self.orientation = _combo("orientation", "landscape" if style.landscape else "portrait")
        self.binding = _combo("binding", style.binding)
        self.blocks = QListWidget()
        self.blocks.setDragDropMode(QAbstractItemView.DragDropMode.InternalMove)
        labels = registry.labels()  # every registered block has its label: a new block needs no entry here
        front = list(style.front) if style.front is not None else list(labels)
        shown = front + [b for b in labels if b not in front]
        for name in shown:
            item = QListWidgetItem(tr(labels[name]) if name in labels else name)
            item.setData(Qt.ItemDataRole.UserRole, name)
            item.setFlags(item.flags() | Qt.ItemFlag.ItemIsUserCheckable | Qt.ItemFlag.ItemIsDragEnabled)
            item.setCheckState(Qt.CheckState.Checked if name in front or name in style.back
                               else Qt.CheckState.Unchecked)
            self.blocks.addItem(item)
        inputs = {"organization": self.organization, "logo": self.logo, "accent": self.accent,
                  "font_scale": self.scale, "size": self.size, "orientation": self.orientation,
                  "binding": self.binding}
        for key, widget in inputs.items():
            widget.setToolTip(tr(BY_KEY[key].help))
            form.addRow(tr(BY_KEY[key].label), widget)
        form.addRow(QLabel(tr("Blocks, in order (drag to reorder; the caution is always printed):")))
        self.blocks.setToolTip(tr(BY_KEY["front"].help))
        form.addRow(self.blocks)
        self.faces = QLabel()
        self.faces.setObjectName("faces")
        self._faces_of = faces
        if faces is not None:
            form.addRow(tr("This profile's card"), self.faces)
            for signal in (self.scale.valueChanged, self.size.currentIndexChanged,
                           self.orientation.currentIndexChanged, self.binding.currentIndexChanged,
                           self.organization.textChanged, self.blocks.itemChanged, self.blocks.model().rowsMoved):
                signal.connect(self.show_faces)
            self.show_faces()
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Save | QDialogButtonBox.StandardButton.Cancel)
        buttons.button(QDialogButtonBox.StandardButton.Save).setText(tr("Save"))  # Qt's own words are English
        buttons.button(QDialogButtonBox.StandardButton.Cancel).setText(tr("Cancel"))
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
        colour = QColorDialog.getColor(QColor(self.accent.text()), self, tr("Accent colour"))
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
        try:
            doc = load_document(source)
        except FileProblem as exc:
            # its comments and other keys would be lost: a style file the person must mend is never replaced
            reason = exc.args[0] if exc.args and isinstance(exc.args[0], Msg) else str(exc)
            raise FileProblem(Msg("{problem}; it was left as it is", problem=reason), exc.errno) from None
        for key, value in self.values().items():
            doc[key] = value
        doc.pop(LEGACY_ORGANIZATION, None)  # its value is in organization now: the file speaks one spelling
        save_document(doc, path)
        return load_card_style(path)


def _combo(key: str, current) -> QComboBox:
    """The choice of a style key's options (each shown by its label); `currentData()` is the option as the file
    writes it."""
    combo = QComboBox()
    declared = BY_KEY[key]
    for option in declared.options:
        combo.addItem(tr(OPTION_WORDS.get(option, declared.shown(option))), option)
    combo.setCurrentIndex(max(0, combo.findData(current)))
    return combo
