"""The command line's help and messages, and the app's words, in the user's language (kneeboard.cli_words,
kneeboard.app.words): the locale as gettext reads it, English otherwise."""

import os
import subprocess
import sys
from pathlib import Path

import pytest

from kneeboard.cli import main
from kneeboard.i18n import locale_language, translator
from kneeboard.texts import CAUTION

ROOT = Path(__file__).resolve().parent.parent
SAMPLES = ROOT / "sample_aircraft"
ENGLISH_HELP = ("show this help message and exit", "make cockpit cards as PDF", "usage:", "options:",
                "one PDF with every card", "validate profiles and list every problem")


@pytest.fixture
def german(monkeypatch):
    """A German locale, as a German desktop sets it."""
    for name in ("LANGUAGE", "LC_ALL", "LC_MESSAGES"):
        monkeypatch.delenv(name, raising=False)
    monkeypatch.setenv("LANG", "de_DE.UTF-8")  # monkeypatch puts the tests' English back; each run reads it anew


@pytest.mark.parametrize(("environ", "language"), [
    ({"LANG": "de_DE.UTF-8"}, "de"),
    ({"LANG": "fr_CA.UTF-8", "LC_MESSAGES": "cs_CZ.UTF-8"}, "cs"),  # LC_MESSAGES before LANG
    ({"LANG": "en_US.UTF-8", "LC_ALL": "pl_PL"}, "pl"),  # LC_ALL before both
    ({"LANG": "de_DE.UTF-8", "LANGUAGE": "sv:es:fr"}, "es"),  # the first of LANGUAGE's list kneeboard has
    ({"LANG": "C", "LANGUAGE": "de"}, "en"),  # GNU gettext: the C locale speaks English whatever LANGUAGE says
    ({"LANG": "sv_SE.UTF-8"}, "en"),  # a language without a catalogue
    ({}, "en"),
])
def test_the_locale_names_the_language_as_gettext_reads_it(environ, language):
    assert locale_language(environ) == language


def test_the_help_is_german_under_a_german_locale(german, capsys):
    with pytest.raises(SystemExit) as done:
        main(["--help"])
    assert done.value.code == 0
    out = capsys.readouterr().out
    assert out.startswith("Aufruf: kneeboard") and "Optionen:" in out and "diese Hilfe zeigen und beenden" in out
    assert "Cockpitkarten als PDF erstellen" in out and " ".join(translator("de")(CAUTION).split()[:6]) in out
    assert not [sentence for sentence in ENGLISH_HELP if sentence in out]
    with pytest.raises(SystemExit):
        main(["card", "--help"])
    out = capsys.readouterr().out
    assert "ein PDF mit allen Karten" in out and "--output OUT.pdf" in out  # option names stay as they are
    assert not [sentence for sentence in ENGLISH_HELP if sentence in out]


def test_argparses_own_error_and_ours_are_german_and_name_what_is_wrong(german, capsys, tmp_path):
    with pytest.raises(SystemExit) as done:
        main(["card"])
    assert done.value.code == 2
    err = capsys.readouterr().err
    assert "kneeboard card: Fehler: die folgenden Argumente fehlen: PROFILE_OR_FOLDER" in err
    missing = tmp_path / "fehlt.toml"
    assert main(["table", str(missing)]) == 2
    err = capsys.readouterr().err
    assert f"{missing}: 1 Fehler; keine Tabelle möglich" in err
    assert main(["card", str(SAMPLES), "--png", "5", "-o", str(tmp_path / "x.pdf")]) == 2
    assert "--png 5: erwartet eine Auflösung von 36 bis 1200 dpi" in capsys.readouterr().err


def test_check_prints_the_caution_in_the_locales_language(german, capsys):
    assert main(["check", str(SAMPLES / "demo_trainer.toml")]) == 0
    out = capsys.readouterr().out
    assert translator("de")(CAUTION) in out and CAUTION not in out
    assert ": in Ordnung: DEMO-TRN" in out and "Prüfsumme" in out


def test_a_broken_profile_is_told_in_the_locales_language_with_what_was_written_as_written(german, capsys,
                                                                                           tmp_path):
    text = (SAMPLES / "demo_trainer.toml").read_text(encoding="utf-8")
    broken = tmp_path / "kaputt.toml"
    broken.write_text(text.replace('max_weight = "1650 lb"', 'max_weight = "1650 kt"')
                      .replace('stall_speed = "48 kt"', "stall_speed = 48"), encoding="utf-8")
    assert main(["check", str(broken)]) == 2
    out = capsys.readouterr()
    said = (out.out + out.err).splitlines()
    weight = next(line for line in said if "aircraft.max_weight" in line)
    assert weight.startswith(f"{broken}: Fehler: aircraft.max_weight: 'kt' ist eine Einheit")
    assert "'1650 kt'" in weight and '"1650 lb"' in weight  # the value and the example stay as written
    stall = next(line for line in said if "configuration[1].stall_speed" in line)
    assert "bloße Zahl hat keine Einheit" in stall and "(gefunden: 48)" in stall
    assert f"{broken}: 2 Fehler; keine Karte möglich" in said
    english = ("error:", "is a unit of", "a bare number", "expected a", "no card can be made", "found")
    assert not [word for word in english if word in out.out + out.err]


def test_an_english_locale_keeps_the_english_help(monkeypatch, capsys):
    monkeypatch.setenv("LANG", "en_GB.UTF-8")
    monkeypatch.delenv("LANGUAGE")
    with pytest.raises(SystemExit):
        main(["--help"])
    out = capsys.readouterr().out
    assert out.startswith("usage: kneeboard") and "show this help message and exit" in out


def test_compares_verdict_follows_language_else_the_locale(german, capsys, tmp_path):
    profile = tmp_path / "trn.toml"
    profile.write_text((SAMPLES / "demo_trainer.toml").read_text(encoding="utf-8"), encoding="utf-8")
    pdf = tmp_path / "trn.pdf"
    assert main(["card", str(profile), "-o", str(pdf)]) == 0
    capsys.readouterr()
    assert main(["compare", str(pdf), str(profile)]) == 0
    out = capsys.readouterr().out
    assert "jeder gedruckte Wert lautet gleich" in out and "current" not in out  # the locale's German
    profile.write_text(profile.read_text(encoding="utf-8").replace('total = "1560 lb"', 'total = "1640 lb"'),
                       encoding="utf-8")
    assert main(["compare", str(pdf), str(profile), "--language", "es"]) == 1  # --language wins over the locale
    out = capsys.readouterr().out
    assert "DESACTUALIZADA" in out and "imprima una tarjeta nueva" in out and "! menos margen: " in out
    assert "velocidad de pérdida" in out and translator("es")(CAUTION) in out
    assert "OUT OF DATE" not in out and "Fehler" not in out


def test_the_installed_entry_point_reads_the_locale(tmp_path):
    env = {k: v for k, v in os.environ.items() if k not in ("LANGUAGE", "LC_ALL", "LC_MESSAGES")}
    env.update(LANG="fr_FR.UTF-8", PYTHONPATH=str(ROOT))
    done = subprocess.run([sys.executable, "-m", "kneeboard", "--help"], env=env, capture_output=True, text=True,
                          cwd=tmp_path, check=False)
    assert done.returncode == 0, done.stderr
    assert done.stdout.startswith("utilisation : kneeboard") and "afficher cette aide et quitter" in done.stdout


def test_the_window_free_controller_asks_and_tells_in_the_apps_language(controller):
    from kneeboard.app import words

    changed = []
    controller.languageChanged.connect(changed.append)
    controller.set_language("de")
    assert changed == ["de"] and words.language() == "de"
    asked = []
    controller.ui.ask_open_path = lambda title, start, filters: asked.append((title, filters))
    controller.open_asked()
    assert asked == [("Profil öffnen", "Profile (*.toml)")]
    said = []
    controller.status.connect(lambda text, _ms: said.append(text))
    controller.use_style_file(None)
    assert said == ["Die Karten verwenden den Standardstil."]
    with pytest.raises(ValueError, match="klingon"):
        controller.set_language("klingon")
    controller.set_language("")  # the system's: the tests' English
    assert words.language() == "en"
