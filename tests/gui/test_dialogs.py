"""The app's dialogs: they show what the core computed, and export a fleet as the command line does."""

import shutil
from pathlib import Path

import pytest
from card_helpers import card_of, prepared
from conftest import checked_file
from PySide6.QtCore import QSettings, Qt
from PySide6.QtGui import QGuiApplication
from PySide6.QtWidgets import QWidget

from kneeboard.app.dialogs import (
    CAUTION_KEY,
    NO_CHANGE,
    NOT_PRINTED,
    WORSE_MARK,
    CompareDialog,
    FormulaHelpDialog,
    ProblemsDialog,
    export_fleet,
    show_caution_once,
)
from kneeboard.compare import HIGHER_IS_WORSE, LOWER_IS_WORSE, Change, compare
from kneeboard.inputs.profiles import expand_paths
from kneeboard.pipeline import Styles
from kneeboard.problems import ERROR, WARNING, Problem
from kneeboard.texts import CAUTION

# The samples folder, found from this file.
SAMPLES = Path(__file__).resolve().parents[2] / "sample_aircraft"

CHANGES = [
    Change("weight", "2900 lb", "3100 lb"),
    Change("Gear up, flaps up · 30° · margin", "35 kt", "33 kt", LOWER_IS_WORSE),  # smaller margin: worse
    Change("Gear up, flaps up · 30° · turn radius", "1102 ft", "1130 ft"),
    Change("Gear up, flaps up · 75° · stall", None, "120 kt", HIGHER_IS_WORSE),  # added row: not judged
    Change("Gear up, flaps up · 60° · turn radius", "640 ft", None),  # no longer printed
]


def test_compare_dialog_shows_every_change_and_marks_a_worse_margin(qtbot):
    dialog = CompareDialog(CHANGES, "DEMO-RG")
    qtbot.addWidget(dialog)
    assert dialog.row_count() == len(CHANGES)
    rows = dialog.rows()
    assert rows[1] == (WORSE_MARK + CHANGES[1].label, "35 kt", "33 kt")
    expected = [(c.label, c.old or NOT_PRINTED, c.new or NOT_PRINTED) for c in CHANGES]
    assert [r for i, r in enumerate(rows) if i != 1] == [r for i, r in enumerate(expected) if i != 1]
    # worse stands out without colour: a marker text, and bold on every cell of the row
    bold = [all(dialog.table.item(i, j).font().bold() for j in range(3)) for i in range(len(rows))]
    assert bold == [False, True, False, False, False]
    headers = [dialog.table.horizontalHeaderItem(j).text() for j in range(dialog.table.columnCount())]
    assert headers == ["Figure", "On the printed card", "Now"]
    assert "Less room before the stall (1)" in dialog.summary.text()


def test_compare_dialog_from_real_tables_marks_every_smaller_margin(qtbot):
    t = prepared("demo_retractable").table
    heavy = f"{t.max_weight.text} {t.weight_unit}"
    changes = compare(card_of("demo_retractable"), card_of("demo_retractable", weight=heavy))
    assert changes  # fixed pattern speeds: heavier, the margins shrink
    dialog = CompareDialog(changes, t.registration)
    qtbot.addWidget(dialog)
    assert dialog.row_count() == len(changes)
    for change, (figure, old, new) in zip(changes, dialog.rows()):
        assert figure == (WORSE_MARK if change.worse else "") + change.label
        assert (old, new) == (change.old or NOT_PRINTED, change.new or NOT_PRINTED)
    margins = [row for row, c in zip(dialog.rows(), changes) if c.label.endswith("· margin")]
    assert margins and all(row[0].startswith(WORSE_MARK) for row in margins)


def test_compare_dialog_without_changes_says_so(qtbot):
    dialog = CompareDialog([], "DEMO-TRN")
    qtbot.addWidget(dialog)
    assert dialog.row_count() == 0
    assert dialog.rows() == []
    assert NO_CHANGE in dialog.summary.text()
    assert dialog.table.isHidden()
    dialog.copy_button.click()
    assert NO_CHANGE in QGuiApplication.clipboard().text()


def test_copy_as_text_puts_every_row_on_the_clipboard(qtbot):
    dialog = CompareDialog(CHANGES, "DEMO-RG")
    qtbot.addWidget(dialog)
    QGuiApplication.clipboard().setText("")
    qtbot.mouseClick(dialog.copy_button, Qt.MouseButton.LeftButton)
    text = QGuiApplication.clipboard().text()
    assert text.startswith("DEMO-RG")
    lines = text.splitlines()
    for figure, old, new in dialog.rows():
        assert f"{figure}: {old} -> {new}" in lines
    assert f"{WORSE_MARK}Gear up, flaps up · 30° · margin: 35 kt -> 33 kt" in lines


def test_caution_is_shown_on_first_start_only(tmp_path, qtbot):
    ini = str(tmp_path / "s.ini")
    settings = QSettings(ini, QSettings.Format.IniFormat)
    shown = []

    def ask(parent, title, text):
        shown.append((parent, title, text))

    parent = QWidget()
    qtbot.addWidget(parent)
    assert show_caution_once(parent, settings, ask) is True
    assert len(shown) == 1
    assert shown[0][0] is parent and shown[0][2] == CAUTION
    assert show_caution_once(parent, settings, ask) is False
    # acknowledged for good: a new start reads the same settings file
    again = QSettings(ini, QSettings.Format.IniFormat)
    assert again.value(CAUTION_KEY, False, type=bool) is True
    assert show_caution_once(parent, again, ask) is False
    assert len(shown) == 1


def test_formula_help_puts_the_caution_first(qtbot):
    dialog = FormulaHelpDialog()
    qtbot.addWidget(dialog)
    text = dialog.browser.toPlainText()
    assert text.startswith(CAUTION)
    for formula in ("n = 1 / cos(bank)", "Vs(bank) = Vs √n", "R = V² / (g tan bank)", "FAA-H-8083-25",
                    "ICAO Doc 7488", "CS 22.337"):
        assert formula in text


def test_formula_help_speaks_the_apps_language_and_keeps_formulas_and_sources_as_written(qtbot):
    from kneeboard.app import words
    from kneeboard.i18n import translator
    from kneeboard.texts import FORMULAS_TITLE

    words.use("de")  # the conftest puts English back after the test
    dialog = FormulaHelpDialog()
    qtbot.addWidget(dialog)
    text = dialog.browser.toPlainText()
    assert dialog.windowTitle() != "How the figures are computed"
    assert text.startswith(translator("de")(CAUTION)) and not text.startswith(CAUTION)
    # the formulas' symbols and the sources' numbers as written; the words in them are the language's
    for formula in ("n = 1 / cos(Querneigung)", "Vs √n", "FAA-H-8083-25", "ICAO Doc 7488", "CS 22.337"):
        assert formula in text
    assert "cos(bank)" not in text and FORMULAS_TITLE not in text and translator("de")(FORMULAS_TITLE) in text


def test_problems_dialog_lists_errors_before_warnings(qtbot):
    problems = [
        Problem("card.unknown_key", "unknown key, kept when saving", "a key of [card]", "x", WARNING),
        Problem("configuration[2].stall_speed", "a bare number where a speed belongs", 'a speed such as "52 kt"',
                "48", ERROR),
        Problem("aircraft.max_weight", "above any aircraft this card is for", "a weight below 600 t", None, ERROR),
    ]
    dialog = ProblemsDialog("demo_trainer.toml: problems", problems)
    qtbot.addWidget(dialog)
    assert dialog.windowTitle() == "demo_trainer.toml: problems"
    rows = dialog.rows()
    assert [r[0] for r in rows] == ["ERROR", "ERROR", "WARNING"]
    assert rows[0] == ("ERROR", "configuration[2].stall_speed", "a bare number where a speed belongs", "'48'",
                       'a speed such as "52 kt"')
    assert rows[1][1] == "aircraft.max_weight" and rows[1][3] == ""
    assert rows[2][1] == "card.unknown_key"
    assert "2 error(s), 1 warning(s)" in dialog.summary.text()


def test_problems_dialog_of_a_real_broken_profile(qtbot, tmp_path, minimal_text):
    path = tmp_path / "broken.toml"
    path.write_text(minimal_text.replace('"50 kt"', '"50"'), encoding="utf-8")
    loaded = checked_file(path)
    assert loaded.profile is None
    dialog = ProblemsDialog(path.name, list(loaded.problems))
    qtbot.addWidget(dialog)
    assert "configuration[1].stall_speed" in [r[1] for r in dialog.rows()]


@pytest.fixture
def fleet_with_broken(tmp_path, minimal_text):
    """Copies of every sample and one profile with an error; its paths as the app lists them; the default style."""
    folder = tmp_path / "fleet"
    folder.mkdir()
    for sample in SAMPLES.glob("*.toml"):
        shutil.copy(sample, folder / sample.name)
    broken = minimal_text.replace('registration = "TEST-1"', 'registration = "BROKEN-1"').replace('"50 kt"', '"fast"')
    (folder / "broken.toml").write_text(broken, encoding="utf-8")
    return folder, expand_paths([folder]), Styles()


def registrations():
    return sorted(checked_file(p).profile.aircraft.registration for p in SAMPLES.glob("*.toml"))


def test_export_each_writes_one_pdf_per_aircraft_and_reports_the_broken_one(qtbot, tmp_path, fleet_with_broken):
    folder, paths, style = fleet_with_broken
    parent = QWidget()
    qtbot.addWidget(parent)
    each = tmp_path / "cards"
    batch = export_fleet(parent, paths, style, each=each)  # the real progress dialog
    assert not batch.cancelled
    assert sorted(p.stem for p in each.glob("*.pdf")) == registrations()
    assert all(p.read_bytes().startswith(b"%PDF") for p in each.glob("*.pdf"))
    assert [f.path.name for f in batch.failures] == ["broken.toml"]
    assert any("stall_speed" in line for line in batch.failures[0].lines)


class FakeProgress:
    """Stands in for the progress dialog; the user presses Cancel once `cancel_at` cards are made."""

    def __init__(self, total, cancel_at=None):
        self.total, self.cancel_at = total, cancel_at
        self.value, self.labels, self.closed = 0, [], False

    def setValue(self, value):  # noqa: N802 - Qt's name
        self.value = value

    def setLabelText(self, text):  # noqa: N802
        self.labels.append(text)

    def wasCanceled(self):  # noqa: N802
        return self.cancel_at is not None and self.value >= self.cancel_at

    def close(self):
        self.closed = True


def quiet(parent, total):
    return FakeProgress(total)


def test_export_one_fleet_pdf_with_progress_labels(tmp_path, fleet_with_broken):
    folder, paths, style = fleet_with_broken
    made = []

    def factory(parent, total):
        made.append(FakeProgress(total))
        return made[0]

    out = tmp_path / "fleet.pdf"
    batch = export_fleet(None, paths, style, out, "letter", progress_factory=factory)
    progress = made[0]
    assert progress.total == len(paths) == 6
    assert progress.labels[0] == f"Card 1 of 6: {paths[0].name}"
    assert progress.labels == [f"Card {i} of 6: {p.name}" for i, p in enumerate(paths, start=1)]
    assert progress.closed
    assert out.read_bytes().startswith(b"%PDF")
    assert batch.cards == 5 and len(batch.failures) == 1 and batch.written == [out]


def test_cancel_after_two_cards_writes_nothing(tmp_path, fleet_with_broken):
    folder, paths, style = fleet_with_broken
    fakes = []

    def factory(parent, total):
        fakes.append(FakeProgress(total, cancel_at=2))
        return fakes[-1]

    out = tmp_path / "fleet.pdf"
    batch = export_fleet(None, paths, style, out, progress_factory=factory)
    assert batch.cancelled
    assert batch.cards + len(batch.failures) == 2  # the third profile was never read
    assert fakes[0].closed
    assert not out.exists()
    assert list(tmp_path.iterdir()) == [folder]


def test_a_file_that_cannot_be_written_is_a_failure_not_an_exception(tmp_path, fleet_with_broken):
    folder, paths, style = fleet_with_broken
    out = tmp_path / "no such folder" / "fleet.pdf"
    batch = export_fleet(None, paths, style, out, progress_factory=quiet)
    failure = batch.failures[-1]
    assert failure.path == out
    assert len(failure.lines) == 1 and str(out) in failure.lines[0]


def test_export_needs_somewhere_to_write(fleet_with_broken):
    _, paths, style = fleet_with_broken
    with pytest.raises(ValueError):
        export_fleet(None, paths, style, progress_factory=quiet)


def test_the_style_dialogs_inputs_are_made_from_the_style_keys(qtbot):
    from PySide6.QtWidgets import QFormLayout

    from kneeboard.app.style_dialog import StyleDialog
    from kneeboard.card.style import CardStyle
    from kneeboard.inputs.style_keys import BY_KEY

    dialog = StyleDialog(CardStyle(size="5x8", binding="top"))
    qtbot.addWidget(dialog)
    form = dialog.findChild(QFormLayout)
    labels = [form.itemAt(row, QFormLayout.ItemRole.LabelRole).widget().text() for row in range(form.rowCount())
              if form.itemAt(row, QFormLayout.ItemRole.LabelRole) is not None]
    for key in ("organization", "logo", "accent", "font_scale", "size", "orientation", "binding"):
        assert BY_KEY[key].label in labels
    for key, combo in (("size", dialog.size), ("orientation", dialog.orientation), ("binding", dialog.binding)):
        assert tuple(combo.itemData(i) for i in range(combo.count())) == BY_KEY[key].options
        assert combo.toolTip() == BY_KEY[key].help
    assert dialog.size.currentText() == BY_KEY["size"].shown("5x8") == "5 x 8 in"
    assert (dialog.scale.minimum(), dialog.scale.maximum()) == BY_KEY["font_scale"].bounds
    assert set(dialog.values()) <= set(BY_KEY)  # the dialog writes declared keys only
