"""The profile editor: every field of the profile file, bound to a key of the open document.

Widgets here only display and edit: values go into the document exactly as typed, the document
reads them into a profile, and the problems it finds come back to the fields that caused them.

Every word is shown in the app's language as the editor is built (`tr`; a declared field's label, placeholder and
help are English in `kneeboard.inputs.profile_keys` and translated here); when the language changes, the window
builds the editor again. The undo steps' names stay English: the undo stack is never shown.
"""

from PySide6.QtCore import Qt, Signal
from PySide6.QtWidgets import (
    QCheckBox,
    QFormLayout,
    QGroupBox,
    QHBoxLayout,
    QLabel,
    QListWidget,
    QPushButton,
    QScrollArea,
    QStackedWidget,
    QTabWidget,
    QVBoxLayout,
    QWidget,
)

from kneeboard import terms, units
from kneeboard.app import hints
from kneeboard.app.document import ProfileDocument, key_text
from kneeboard.app.fields import BanksField, ChoiceField, Field, NotesField, NumberField, PairsField, TextField
from kneeboard.app.items import ItemsField
from kneeboard.app.words import told, tr
from kneeboard.i18n import N_
from kneeboard.inputs import profile_keys as declared
from kneeboard.problems import SEVERITY_WORDS, Problem

CONFIG = "configuration"
PROBLEMS_HEIGHT = 96  #: [px] the problems list: four lines, then it scrolls
DEFAULT = N_("(default)")  #: an optional choice left to its default
#: How the card's weight is given, and how a configuration's pattern speed is (the file's way -> shown as)
WEIGHT_MODES = {"reference": N_("The weight the speeds were published at"), "total": N_("A total weight"),
                "build-up": N_("Empty weight plus items")}
PATTERN_MODES = {"factor": N_("A factor of the stall speed"), "fixed": N_("A fixed speed")}
#: The configurations' buttons: kept under their English names, shown in the app's language
CONFIG_BUTTONS = (N_("Add"), N_("Duplicate"), N_("Remove"), N_("Move left"), N_("Move right"))


class ProfileEditor(QScrollArea):
    """All sections of one profile. `focus_problem(path)` brings a problem's field into view."""

    problemsShown = Signal(int, int)  #: errors, warnings

    def __init__(self, doc: ProfileDocument, parent=None):
        super().__init__(parent)
        self.doc = doc
        self.setWidgetResizable(True)
        body = QWidget()
        self.setWidget(body)
        self.box = QVBoxLayout(body)
        self.fields: dict[str, Field] = {}
        self.kinds: dict[str, units.Kind] = {}
        self.keys: dict[str, tuple] = {}
        self.sink_fields: set[str] = set()
        self.problem_list = QListWidget()
        # a problem's line read whole, wrapped at the panel's width, never behind a sideways scroll
        self.problem_list.setWordWrap(True)
        self.problem_list.setResizeMode(QListWidget.ResizeMode.Adjust)
        self.problem_list.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.all_clear = QLabel(tr("No input problems found."))
        self.all_clear.setStyleSheet("color: #1B5E20; font-weight: bold;")
        self.problem_list.itemActivated.connect(lambda item: self.focus_problem(item.data(256)))
        self.all_clear.setAlignment(Qt.AlignmentFlag.AlignTop | Qt.AlignmentFlag.AlignLeft)
        problems = QGroupBox(tr("Problems"))
        problems_box = QVBoxLayout(problems)
        # one height whatever it shows, so the form below never jumps when a problem appears or goes
        self.problem_pages = QStackedWidget()
        self.problem_pages.addWidget(self.all_clear)
        self.problem_pages.addWidget(self.problem_list)
        self.problem_pages.setFixedHeight(PROBLEMS_HEIGHT)
        problems_box.addWidget(self.problem_pages)
        self.problems_box = problems
        self.box.addWidget(problems)
        self._aircraft()
        self._weight()
        self._configurations()
        self._glider()
        self._card()
        self.box.addStretch(1)
        doc.changed.connect(self.refresh)
        self.refresh()

    # --- building ------------------------------------------------------------------------------
    def _bind(self, form: QFormLayout | None, label: str, key: tuple, field: Field, kind=None) -> Field:
        """`label` is the field's English label (its undo step's name), shown in the app's language."""
        path = key_text(key)
        self.fields[path] = field
        self.keys[path] = key
        if kind is not None:
            self.kinds[path] = kind
        field.edited.connect(lambda value, key=key, label=label: self.doc.set(key, value, f"Change {label}"))
        if form is not None:
            form.addRow(tr(label), field)
        return field

    def _group(self, title: str) -> QFormLayout:
        group = QGroupBox(tr(title))
        form = QFormLayout(group)
        self.box.addWidget(group)
        return form

    def _declared(self, form: QFormLayout | None, key: tuple, decl: declared.Field) -> Field:
        """The widget of one declared field (`kneeboard.inputs.profile_keys`), bound to `key` of the document."""
        if decl.kind == declared.CHOICE:
            options = decl.options if decl.required else (None,) + tuple(decl.options)
            widget = ChoiceField(options, {None: DEFAULT})
        elif decl.kind == declared.NUMBER:
            widget = NumberField(decl.placeholder)
        elif decl.kind == declared.NOTES:
            widget = NotesField()
        elif decl.kind == declared.PAIRS:
            widget = PairsField(decl.columns)
        elif decl.kind == declared.BANKS:
            widget = BanksField(decl.placeholder)
        elif decl.kind == declared.ITEMS:
            widget = ItemsField()
        else:  # TEXT and QUANTITY are typed as text: a quantity with its unit
            widget = TextField(decl.placeholder)
        if decl.help:
            widget.setToolTip(tr(decl.help))
        if decl.bounds is declared.SINK_RANGE:  # a sink rate: shown in the card's sink unit, not its speed unit
            self.sink_fields.add(key_text(key))
        return self._bind(form, decl.label, key, widget, decl.quantity)

    def _section(self, form: QFormLayout, section: str, prefix: tuple, skip=()) -> None:
        for decl in declared.FIELDS:
            if decl.section == section and decl.key not in skip:
                self._declared(form, prefix + (decl.key,), decl)

    def _aircraft(self):
        self._section(self._group(N_("Aircraft")), "aircraft", ("aircraft",))

    def _weight(self):
        f = self._group(N_("Weight for this card"))
        self.weight_mode = ChoiceField(tuple(WEIGHT_MODES), WEIGHT_MODES)
        self.weight_mode.edited.connect(self._set_weight_mode)
        f.addRow(tr("Weight"), self.weight_mode)
        self.fields["weight"] = self.weight_mode  # problems of the weight as a whole show here
        self._section(f, "weight", ("weight",))
        self.weight_form = f

    def _configurations(self):
        group = QGroupBox(tr("Configurations"))
        v = QVBoxLayout(group)
        buttons = QHBoxLayout()
        self.config_buttons = {}
        slots = (self._add_config, self._duplicate_config, self._remove_config, lambda: self._move_config(-1),
                 lambda: self._move_config(1))
        for name, slot in zip(CONFIG_BUTTONS, slots, strict=True):
            b = QPushButton(tr(name))
            b.clicked.connect(slot)
            buttons.addWidget(b)
            self.config_buttons[name] = b
        buttons.addStretch(1)
        v.addLayout(buttons)
        self.config_tabs = QTabWidget()
        v.addWidget(self.config_tabs)
        self.box.addWidget(group)

    def _config_form(self, i: int) -> QWidget:
        page = QWidget()
        f = QFormLayout(page)
        c = (CONFIG, i)
        for decl in declared.FIELDS:
            if decl.section != CONFIG:
                continue
            if decl.key == "pattern_factor":  # how the pattern speed is given comes first
                mode = ChoiceField(tuple(PATTERN_MODES), PATTERN_MODES)
                mode.edited.connect(lambda value, i=i: self._set_pattern_mode(i, value))
                pattern = tr(terms.PATTERN)
                f.addRow(pattern[:1].upper() + pattern[1:], mode)  # a label begins with a capital
                self.fields[f"{CONFIG}[{i + 1}].pattern_mode"] = mode
            self._declared(f, c + (decl.key,), decl)
        return page

    def _glider(self):
        f = self._group(N_("Glider polar"))
        self.is_glider = QCheckBox(tr("This aircraft has a speed polar (gliders)"))
        self.is_glider.clicked.connect(self._set_glider)
        f.addRow(self.is_glider)
        self._section(f, "glider", ("glider",))

    def _card(self):
        self._section(self._group(N_("Card")), "card", ("card",))

    # --- structural edits ------------------------------------------------------------------------
    def _current_config(self) -> int:
        return max(self.config_tabs.currentIndex(), 0)

    def _add_config(self):
        n = self.doc.count((CONFIG,))
        unit = self.card_units()[0]
        self.doc.add_table((CONFIG,), {"name": tr("Configuration {n}", n=n + 1), "stall_speed": f"50 {unit}"},
                           "Add configuration")
        self.config_tabs.setCurrentIndex(n)

    def _duplicate_config(self):
        i = self._current_config()
        name = self.doc.get((CONFIG, i, "name"), tr("Configuration"))
        self.doc.duplicate_table((CONFIG,), i, tr("{name} (copy)", name=str(name)), "Duplicate configuration")
        self.config_tabs.setCurrentIndex(i + 1)

    def _remove_config(self):
        i = self._current_config()
        if self.doc.count((CONFIG,)) > 1:
            self.doc.remove((CONFIG, i), "Remove configuration")

    def _move_config(self, delta: int):
        i = self._current_config()
        self.doc.move_table((CONFIG,), i, delta, "Move configuration")
        self.config_tabs.setCurrentIndex(max(0, min(i + delta, self.doc.count((CONFIG,)) - 1)))

    def _set_pattern_mode(self, i: int, mode: str):
        loaded = self.doc.loaded

        def change(doc):
            table = doc[CONFIG][i]
            if mode == "fixed" and "pattern_speed" not in table:
                table.pop("pattern_factor", None)
                table["pattern_speed"] = self._pattern_speed_text(loaded, i)
            elif mode == "factor" and "pattern_speed" in table:
                del table["pattern_speed"]
                table["pattern_factor"] = declared.default("configuration.pattern_factor")

        self.doc.apply(change, "Change pattern speed")

    def _pattern_speed_text(self, loaded, i: int) -> str:
        return hints.pattern_speed_text(loaded, i, self.card_units()[0])  # the speed the card prints now

    def _set_weight_mode(self, mode: str):
        loaded = self.doc.loaded
        unit = self.card_units()[2]
        current = hints.weight_text(loaded, unit)

        def change(doc):
            if mode == "reference":
                doc.pop("weight", None)
                return
            if "weight" not in doc:
                from kneeboard.inputs.toml import new_table

                doc["weight"] = new_table()
            w = doc["weight"]
            if mode == "total" and "total" not in w:
                for key in ("empty", "item"):
                    w.pop(key, None)
                w["total"] = current or f"0 {unit}"
            elif mode == "build-up" and "empty" not in w:
                w.pop("total", None)
                w["empty"] = current or f"0 {unit}"

        self.doc.apply(change, "Change how the weight is given")

    def _set_glider(self, on: bool):
        if on and self.doc.peek(("glider",)) is None:
            unit = self.card_units()[2]
            weight = self.doc.get(("aircraft", "max_weight")) or f"400 {unit}"
            self.doc.set(("glider", "polar_weight"), weight, "Add polar", merge=False)
        elif not on and self.doc.peek(("glider",)) is not None:
            self.doc.remove(("glider",), "Remove polar")

    # --- showing the document ------------------------------------------------------------------
    def card_units(self) -> tuple[str, str, str]:
        """Speed, distance and weight units of the card (the profile's, or defaults while it has errors)."""
        return hints.card_units(self.doc.loaded, self.doc.peek(("card",)))

    def refresh(self):
        over = self._over_limits()
        for i in range(self.box.count()):  # a profile past its limits is shown refused, its sections not editable
            section = self.box.itemAt(i).widget()
            if section is not None and section is not self.problems_box:
                section.setEnabled(not over)
        if over:
            self._show_problems(list(self.doc.loaded.problems))
            return
        self._sync_config_tabs()
        for path, field in self.fields.items():
            key = self.keys.get(path)
            if key is not None:
                field.set_value(self.doc.peek(key))  # every field only reads what it shows
        self._sync_modes()
        self._show_conversions()
        self._show_problems(list(self.doc.loaded.problems))

    def _over_limits(self) -> list[str]:
        """The lists past the profile's limits, checked before any widget is built for them: the editor built a
        tab for each of 10,000 configurations (minutes, gigabytes) where the command line refused the file at
        once. The Problems list then shows the command line's own refusal; Undo goes back."""
        from kneeboard.inputs.banks import MAX_BANKS
        from kneeboard.inputs.schema import MAX_CONFIGURATIONS, MAX_ITEMS
        from kneeboard.inputs.values import MAX_POLAR_POINTS

        limits = [((CONFIG,), MAX_CONFIGURATIONS), (("weight", "item"), MAX_ITEMS),
                  (("card", "bank_angles"), MAX_BANKS), (("glider", "polar"), MAX_POLAR_POINTS),
                  (("aircraft", "calibration"), MAX_POLAR_POINTS)]
        limits += [((CONFIG, i, "calibration"), MAX_POLAR_POINTS)
                   for i in range(min(self.doc.count((CONFIG,)), MAX_CONFIGURATIONS))]
        return [key_text(key) for key, most in limits if self.doc.count(key) > most]

    def _sync_config_tabs(self):
        n = self.doc.count((CONFIG,))
        names = [str(self.doc.get((CONFIG, i, "name"), "") or f"#{i + 1}") for i in range(n)]
        while self.config_tabs.count() < n:
            i = self.config_tabs.count()
            self.config_tabs.addTab(self._config_form(i), names[i])
        while self.config_tabs.count() > n:
            i = self.config_tabs.count() - 1
            page = self.config_tabs.widget(i)
            self.config_tabs.removeTab(i)
            page.deleteLater()
            prefix = f"{CONFIG}[{i + 1}]"
            for path in [p for p in self.fields if p.startswith(prefix)]:
                self.fields.pop(path)
                self.keys.pop(path, None)
                self.kinds.pop(path, None)
        for i, name in enumerate(names):
            if self.config_tabs.tabText(i) != name:
                self.config_tabs.setTabText(i, name)
        self.config_buttons["Remove"].setEnabled(n > 1)

    def _sync_modes(self):
        w = self.doc.peek(("weight",))
        mode = "reference" if not isinstance(w, dict) else ("total" if "total" in w else "build-up")
        self.weight_mode.set_value(mode)
        form = self.weight_form
        for path, show in (("weight.total", mode == "total"), ("weight.empty", mode == "build-up"),
                           ("weight.item", mode == "build-up")):
            form.setRowVisible(self.fields[path], show)
        for i in range(self.doc.count((CONFIG,))):
            fixed = self.doc.get((CONFIG, i, "pattern_speed")) is not None
            self.fields[f"{CONFIG}[{i + 1}].pattern_mode"].set_value("fixed" if fixed else "factor")
            page = self.config_tabs.widget(i)
            page.layout().setRowVisible(self.fields[f"{CONFIG}[{i + 1}].pattern_factor"], not fixed)
            page.layout().setRowVisible(self.fields[f"{CONFIG}[{i + 1}].pattern_speed"], fixed)
        glider = self.doc.peek(("glider",)) is not None
        self.is_glider.setChecked(glider)
        for path in ("glider.polar_weight", "glider.polar"):
            self.fields[path].setEnabled(glider)
        category = self.doc.get(("aircraft", "category")) or "normal"
        hint = hints.limit_load_hint(self.doc.loaded, category)  # the default the card uses
        if hint is not None:
            self.fields["aircraft.limit_load_factor"].input.setPlaceholderText(hint)

    def _show_conversions(self):
        shown = self.card_units()
        for path, kind in self.kinds.items():
            field = self.fields.get(path)
            if field is not None:
                target = hints.target_unit(kind, path in self.sink_fields, shown)
                field.set_beside(hints.converted(field.value() if hasattr(field, "value") else "", kind, target))

    def _show_problems(self, problems: list[Problem]):
        errors = [p for p in problems if p.is_error]
        warnings = [p for p in problems if not p.is_error]
        marks: dict[int, tuple[Field, Problem]] = {}
        for p in errors + warnings:  # each field shows its first problem, errors before warnings
            field = self.field_for(p.path)
            if field is not None and id(field) not in marks:
                marks[id(field)] = (field, p)
        for field in self.fields.values():
            field.set_problem(marks[id(field)][1] if id(field) in marks else None)
        self.problem_list.clear()
        for p in errors + warnings:
            # the problem's line as the command line frames it, in the app's language; the path as the file has it
            self.problem_list.addItem(f"{tr(SEVERITY_WORDS[p.severity])}: {p.path}: {told(p.message)}")
            self.problem_list.item(self.problem_list.count() - 1).setData(256, p.path)
        self.problem_pages.setCurrentWidget(self.problem_list if problems else self.all_clear)
        self.problemsShown.emit(len(errors), len(warnings))

    def field_for(self, path: str) -> Field | None:
        """The field a problem belongs to: its own, or the nearest enclosing one."""
        while path:
            if path in self.fields:
                return self.fields[path]
            cut = max(path.rfind("."), path.rfind("["))
            path = path[:cut] if cut > 0 else ""
        return None

    def focus_problem(self, path: str):
        field = self.field_for(path or "")
        if field is None:
            return
        if path.startswith(CONFIG + "["):
            self.config_tabs.setCurrentIndex(int(path[len(CONFIG) + 1:].split("]")[0]) - 1)
        self.ensureWidgetVisible(field)
        field.input.setFocus()
