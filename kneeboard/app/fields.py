"""Editor fields: a line for what the person types, the value in the card's units beside it, and
the problem (if any) right under it. A field never rejects input: what is typed stays, and the
document decides what it means.
"""

from PySide6.QtCore import Signal
from PySide6.QtWidgets import (
    QAbstractItemView,
    QComboBox,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QLineEdit,
    QPlainTextEdit,
    QPushButton,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
    QWidget,
)

from kneeboard.app.words import told, tr
from kneeboard.i18n import N_
from kneeboard.problems import Problem

PLACEHOLDER_NOTE = N_("Warning: the template's placeholder; replace it")
ERROR_STYLE = "color: #A11D1D;"
WARNING_STYLE = "color: #8A5A00;"


class Field(QWidget):
    """Base: an input, an optional read-out beside it, and a problem line under it."""

    edited = Signal(object)  #: the new value as the person typed it

    def __init__(self, editor: QWidget, parent=None):
        super().__init__(parent)
        self.input = editor
        self.beside = QLabel()
        self.beside.setObjectName("converted")
        self.beside.setStyleSheet("color: #555;")
        self.problem_label = QLabel()
        self.problem_label.setWordWrap(True)
        self.problem_label.setObjectName("problem")
        self.problem_label.hide()
        row = QHBoxLayout()
        row.setContentsMargins(0, 0, 0, 0)
        row.addWidget(editor, 1)
        row.addWidget(self.beside)
        box = QVBoxLayout(self)
        box.setContentsMargins(0, 0, 0, 0)
        box.setSpacing(1)
        box.addLayout(row)
        box.addWidget(self.problem_label)
        self.problem: Problem | None = None

    def set_problem(self, problem: Problem | None) -> None:
        """Mark the field with the reason, or clear the mark."""
        if problem == self.problem:
            return  # restyling a widget is costly; most edits leave most fields as they were
        self.problem = problem
        if problem is None:
            self.problem_label.hide()
            self.input.setStyleSheet("")
            self.input.setToolTip("")
            return
        # the problem's words (a Msg) and what would do, in the app's language as the command line frames them
        text = told(problem.message) + (tr("; expected {expected}", expected=problem.expected) if problem.expected
                                        else "")
        prefix = tr("Error: ") if problem.is_error else tr("Warning: ")
        # a new profile has a placeholder under most fields: one short line each, the whole sentence on hover
        self.problem_label.setText(tr(PLACEHOLDER_NOTE) if is_placeholder(problem) else prefix + text)
        self.problem_label.setStyleSheet(ERROR_STYLE if problem.is_error else WARNING_STYLE)
        self.problem_label.show()
        colour = "#C62828" if problem.is_error else "#C77700"
        self.input.setStyleSheet(f"border: 2px solid {colour};")
        self.input.setToolTip(prefix + text)

    def set_beside(self, text: str) -> None:
        if self.beside.text() != text:
            self.beside.setText(text)


def is_placeholder(problem: Problem) -> bool:
    from kneeboard.pipeline import PLACEHOLDER  # loaded already: the problem came from it

    return problem.message == PLACEHOLDER


class TextField(Field):
    """Free text, or a quantity such as "52 kt": the document stores exactly what is typed."""

    def __init__(self, placeholder: str = "", parent=None):
        super().__init__(QLineEdit(), parent)
        self.input.setPlaceholderText(tr(placeholder) if placeholder else "")
        self.input.textEdited.connect(self.edited.emit)

    def value(self) -> str:
        return self.input.text()

    def set_value(self, value) -> None:
        text = "" if value is None else str(value)
        if self.input.text() != text:
            pos = self.input.cursorPosition()
            self.input.setText(text)
            self.input.setCursorPosition(min(pos, len(text)))


class ParsedField(TextField):
    """Text typed into a value of the document (a number, a list of numbers): `parse` makes the value, `shown`
    writes one as text. What does not parse is kept as typed, so its problem can be shown."""

    parse = staticmethod(lambda text: text)
    shown = staticmethod(lambda value: value)

    def __init__(self, placeholder: str = "", parent=None):
        super().__init__(placeholder, parent)
        self.input.textEdited.disconnect()
        self.input.textEdited.connect(lambda text: self.edited.emit(self.parse(text)))

    def set_value(self, value) -> None:
        super().set_value(self.shown(value))


def parse_number(text: str):
    """12 -> 12, "1.4" -> 1.4, "" -> None, anything else stays text so its problem can be shown."""
    text = text.strip()
    if not text:
        return None
    try:
        number = float(text)
    except ValueError:
        return text
    return int(number) if number.is_integer() and "." not in text and "e" not in text.lower() else number


def format_number(value) -> str:
    if value is None:
        return ""
    if isinstance(value, float) and value.is_integer():
        return f"{value:.1f}"
    return str(value)


class NumberField(ParsedField):
    """A plain number (a load factor, a pattern factor)."""

    parse = staticmethod(parse_number)
    shown = staticmethod(format_number)


def parse_banks(text: str):
    """ "0, 15, 30" -> [0, 15, 30]; "" -> None; anything else stays text."""
    parts = [p.strip() for p in text.replace(";", ",").split(",") if p.strip()]
    if not parts:
        return None
    numbers = []
    for p in parts:
        try:
            number = float(p)
        except ValueError:
            return text  # kept as typed: the profile check says what is wrong with it
        numbers.append(int(number) if number.is_integer() else number)
    return numbers


def format_banks(value):
    if isinstance(value, list):
        return ", ".join(f"{b:g}" if isinstance(b, (int, float)) else str(b) for b in value)
    return value


class BanksField(ParsedField):
    """Angles typed as "0, 15, 30, 45, 60" (bank angles, turn-back headings)."""

    parse = staticmethod(parse_banks)
    shown = staticmethod(format_banks)


class ChoiceField(Field):
    def __init__(self, options: tuple[str, ...], labels: dict[str, str] | None = None, parent=None):
        super().__init__(QComboBox(), parent)
        for option in options:
            self.input.addItem(tr((labels or {}).get(option, option)), option)
        self.input.activated.connect(lambda i: self.edited.emit(self.input.itemData(i)))

    def set_value(self, value) -> None:
        i = next((k for k in range(self.input.count()) if self.input.itemData(k) == value), -1)
        if i < 0 and value is not None:  # a value from the file we do not offer: show it, flagged
            self.input.addItem(str(value), value)
            i = self.input.count() - 1
        if i >= 0 and i != self.input.currentIndex():
            self.input.setCurrentIndex(i)

    def value(self):
        return self.input.currentData()


class NotesField(Field):
    def __init__(self, parent=None):
        super().__init__(QPlainTextEdit(), parent)
        self.input.setFixedHeight(70)
        self.input.textChanged.connect(self._changed)
        self._quiet = False

    def _changed(self):
        if not self._quiet:
            self.edited.emit(self.input.toPlainText())

    def set_value(self, value) -> None:
        text = value or ""
        if self.input.toPlainText() != text:
            self._quiet = True
            self.input.setPlainText(text)
            self._quiet = False


class TableField(Field):
    """A small table of text cells with add and remove buttons; subclasses say what the rows mean.

    An empty table shows only its add button. Edits go out as the value of all rows at once.
    """

    def __init__(self, headers: tuple[str, ...], add_label: str, remove_label: str, min_height: int, parent=None):
        table = QTableWidget(0, len(headers))
        table.setHorizontalHeaderLabels([tr(h) for h in headers])
        table.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Stretch)
        table.verticalHeader().setVisible(False)
        table.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        table.setMinimumHeight(min_height)
        super().__init__(table, parent)
        table.hide()
        self.add = QPushButton(tr(add_label))
        self.delete = QPushButton(tr(remove_label))
        buttons = QHBoxLayout()
        buttons.addWidget(self.add)
        buttons.addWidget(self.delete)
        buttons.addStretch(1)
        self.layout().insertLayout(1, buttons)
        self._quiet = False
        table.itemChanged.connect(self._changed)
        self.add.clicked.connect(lambda: self.edited.emit(self.value_of(self.cells() + [self.new_row()])))
        self.delete.clicked.connect(self._remove)

    def cells(self) -> list[list[str]]:
        t = self.input
        return [[(t.item(r, c).text() if t.item(r, c) else "") for c in range(t.columnCount())]
                for r in range(t.rowCount())]

    def show_cells(self, rows: list[list[str]]) -> None:
        if rows == self.cells():
            return
        self._quiet = True  # filling the table is not an edit
        self.input.setRowCount(len(rows))
        for r, cells in enumerate(rows):
            for c, text in enumerate(cells):
                self.input.setItem(r, c, QTableWidgetItem(text))
        self._quiet = False
        self.input.setVisible(bool(rows))
        self.delete.setEnabled(bool(rows))

    def value_of(self, rows: list[list[str]]):
        """The document value for these rows (None when there are none): by default, the rows themselves."""
        return rows or None

    def new_row(self) -> list[str]:
        """A row to add: by default a copy of the last one, to be edited."""
        rows = self.cells()
        return list(rows[-1]) if rows else [""] * self.input.columnCount()

    def _changed(self, _item=None):
        if not self._quiet:
            self.edited.emit(self.value_of(self.cells()))

    def _remove(self):
        rows = self.cells()
        r = self.input.currentRow()
        if rows:
            del rows[r if 0 <= r < len(rows) else -1]
        self.edited.emit(self.value_of(rows))


class PairsField(TableField):
    """[a, b] quantity pairs: a calibration table, a polar."""

    def __init__(self, headers: tuple[str, str], parent=None):
        super().__init__(headers, N_("Add row"), N_("Remove row"), 110, parent)

    def set_value(self, value) -> None:
        rows = [[str(x) for x in pair] if isinstance(pair, list) else [str(pair), ""] for pair in (value or [])]
        self.show_cells([(row + ["", ""])[:2] for row in rows])

    def rows(self) -> list[list[str]]:
        return self.cells()
