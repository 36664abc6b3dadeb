"""The app in the pilot's language: the system's by default, Settings › Language at once, kept for the next
start; the card's own language is not the app's."""

import pytest
from PySide6.QtCore import QLocale, Qt
from PySide6.QtGui import QAction
from PySide6.QtWidgets import QCheckBox, QComboBox, QFormLayout, QGroupBox, QLabel, QPushButton

from kneeboard.app import words
from kneeboard.i18n import translator
from kneeboard.texts import CAUTION, CAUTION_SHORT


@pytest.fixture
def german_system(settings):
    """A German system locale (the window reads it when it is made)."""
    QLocale.setDefault(QLocale(QLocale.Language.German, QLocale.Country.Germany))
    yield
    QLocale.setDefault(QLocale(QLocale.Language.English, QLocale.Country.UnitedStates))


def menu_titles(window) -> list[str]:
    return [action.text() for action in window.menuBar().actions()]


ENGLISH_MENUS = ["&File", "&Edit", "&Card", "&Settings", "&Help"]


def test_the_menus_are_german_under_a_german_system_and_french_once_chosen(qtbot, german_system, window):
    titles = menu_titles(window)
    assert titles == ["&Datei", "&Bearbeiten", "&Karte", "&Einstellungen", "&Hilfe"]
    assert not set(titles) & set(ENGLISH_MENUS)
    assert window.act_open.text() == "Profil ö&ffnen…" and window.act_export.text() == "Karte als PDF &exportieren…"
    assert window.fleet.reload.text() == "Neu laden"
    assert window.act_language[""].isChecked()  # following the system
    assert window.caution.text() == translator("de")(CAUTION_SHORT)  # the caution on screen, in German
    labels = {label.text() for label in window.editor.findChildren(QLabel)}
    assert {"Kennzeichen", "Höchstmasse", "Überziehgeschwindigkeit"} <= labels  # the declared fields' labels
    assert not {"Registration", "Maximum weight", "Stall speed"} & labels

    window.act_language["fr"].trigger()  # Settings › Language › Français, as a person clicks it
    assert menu_titles(window) == ["&Fichier", "É&dition", "&Carte", "&Réglages", "&Aide"]
    assert window.act_open.text() == "&Ouvrir un profil…" and window.fleet.reload.text() == "Recharger"
    assert window.caution.toolTip() == translator("fr")(CAUTION)  # in full
    assert window.act_language["fr"].isChecked() and not window.act_language[""].isChecked()
    assert window.controller.settings.value(words.SETTING) == "fr"  # kept for the next start
    assert window.fleet.tree.model().headerData(1, Qt.Orientation.Horizontal) == "Immatriculation"  # column heads
    assert "Aéronef" in [box.title() for box in window.editor.findChildren(QGroupBox)]  # the editor, built again


def form_labels(widget) -> set[str]:
    """The labels of every form row in `widget`."""
    return {item.widget().text() for form in widget.findChildren(QFormLayout) for row in range(form.rowCount())
            if (item := form.itemAt(row, QFormLayout.ItemRole.LabelRole)) is not None
            and isinstance(item.widget(), QLabel)}


def test_the_editor_and_the_style_dialog_mark_their_own_words(qtbot, german_system, window):
    """Each is made in the app's language (its own words, the declared fields' and style keys' words); the editor
    is made again when the language changes."""
    from kneeboard.app.style_dialog import StyleDialog
    from kneeboard.inputs.profile_keys import BY_PATH

    editor = window.editor
    assert {"Kennzeichen", "Höchstmasse", "Überziehgeschwindigkeit"} <= form_labels(editor)  # declared labels
    assert not {"Registration", "Maximum weight", "Stall speed"} & form_labels(editor)
    titles = [box.title() for box in editor.findChildren(QGroupBox)]
    assert {"Probleme", "Luftfahrzeug", "Masse für diese Karte", "Karte"} <= set(titles)
    assert editor.config_buttons["Add"].text() == "Hinzufügen"  # kept under its English name, shown in German
    assert "Leermasse plus Posten" in [editor.weight_mode.input.itemText(i)
                                       for i in range(editor.weight_mode.input.count())]
    help_ = BY_PATH["aircraft.registration"].help
    assert editor.fields["aircraft.registration"].toolTip() == translator("de")(help_) != help_  # declared help

    edit = window.controller.outputs.style_to_edit()
    dialog = StyleDialog(edit.style, window, faces=edit.faces)  # made as Card › Edit the fleet's card style makes it
    qtbot.addWidget(dialog)
    assert dialog.windowTitle() == "Kartenstil"
    labels = form_labels(dialog)
    assert {"Organisation", "Akzentfarbe", "Schriftgröße", "Kartengröße", "Ausrichtung"} <= labels
    assert not {"Organization", "Accent colour", "Type size", "Card size", "Orientation"} & labels
    assert [dialog.orientation.itemText(i) for i in range(dialog.orientation.count())] == ["Hochformat", "Querformat"]
    assert dialog.orientation.currentData() == "portrait"  # the file's word is kept
    assert dialog.accent.toolTip() == "die Farbe der Überschriften und Markierungen"
    assert "Reservediagramm" in [dialog.blocks.item(i).text() for i in range(dialog.blocks.count())]
    assert "Abbrechen" in [b.text() for b in dialog.findChildren(QPushButton)]  # Qt's own button, in German too

    window.act_language["fr"].trigger()
    assert window.editor is not editor and window.editor.config_buttons["Add"].text() == "Ajouter"
    assert "Immatriculation" in form_labels(window.editor)
    glider = translator("fr")("This aircraft has a speed polar (gliders)")
    assert [box.text() for box in window.editor.findChildren(QCheckBox)] == [glider] and glider.startswith("Ce")


def test_the_chosen_language_wins_over_the_system_at_the_next_start(qtbot, german_system, settings, tmp_path):
    from kneeboard.app.window import MainWindow

    settings.setValue(words.SETTING, "pl")
    w = MainWindow(settings, recovery_dir=tmp_path / "recovery")
    qtbot.addWidget(w)
    assert menu_titles(w)[0] == "&Plik" and w.act_language["pl"].isChecked()
    w.act_language[""].trigger()  # back to the system's: German
    assert menu_titles(w)[0] == "&Datei" and settings.value(words.SETTING) == ""


def test_an_english_app_keeps_the_cards_language(qtbot, window, tmp_path):
    """The card's words come from the style or the profile, never from the app."""
    assert menu_titles(window) == ENGLISH_MENUS
    window.act_language["de"].trigger()
    assert menu_titles(window)[0] == "&Datei"
    assert window.doc.loaded.table.language == "en"  # the card still prints in English
    readout = window.readout.label.text()
    assert "Masse der Karte" in readout and "card weight" not in readout.lower()  # the app's key figures: German


def test_the_previews_controls_and_pages_follow_the_language(qtbot, window):
    from conftest import settle

    settle(qtbot, window.controller)
    window.act_language["cs"].trigger()
    preview = window.preview
    assert preview.findChild(QAction, "fitWidth").text() == "Přizpůsobit šířce"
    modes = preview.findChild(QComboBox, "modeSelector")
    assert [modes.itemText(i) for i in range(modes.count())] == ["Karta", "Arch (Letter)", "Arch (A4)"]
    pages = preview.findChild(QComboBox, "pageSelector")
    assert [pages.itemText(i) for i in range(pages.count())][:2] == ["Přední strana", "Zadní strana"]


def test_a_problem_is_told_in_the_apps_language_in_the_editor_and_the_problems_dialog(qtbot, german_system, window):
    """The frame words are the app's language (the command line's); the path and the value as written are not."""
    from conftest import settle

    from kneeboard.app.dialogs import ProblemsDialog
    from kneeboard.i18n import Msg, Num
    from kneeboard.problems import ERROR, Problem

    field = window.editor.fields["weight.total"]
    field.input.setFocus()
    field.input.selectAll()
    qtbot.keyClicks(field.input, "1450 kt")  # a speed where a weight belongs
    settle(qtbot, window.controller)
    listed = [window.editor.problem_list.item(i).text() for i in range(window.editor.problem_list.count())]
    assert [line for line in listed if line.startswith("Fehler: weight.total: ")], listed
    assert not [line for line in listed if line.startswith("error")]
    assert field.problem_label.text().startswith("Fehler: ") and "; erwartet " in field.problem_label.text()

    problem = Problem("card.buffer", Msg("{buffer} kt is below the least", buffer=Num("2.5")),
                      Msg("at least {least} kt", least=Num("3.5")), "2.5 kt", ERROR)
    dialog = ProblemsDialog("trainer.toml", [problem])
    qtbot.addWidget(dialog)
    assert dialog.rows() == [("FEHLER", "card.buffer", "2,5 kt is below the least", "'2.5 kt'", "at least 3,5 kt")]
    assert dialog.table.item(0, 0).toolTip().startswith("Fehler: card.buffer: 2,5 kt")  # the whole line on hover
