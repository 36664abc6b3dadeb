"""Problems and refusals of the core (the checks, the quantities, the files, the command line's starters, the fleet)
made as messages told in the user's language: their English line exactly as before, every word of theirs reaching the
catalogue, and the profile's own text (file names, registrations, values as written) never translated.

A marking catalogue (each message it is asked for comes back «between guillemets») shows which words go through the
translation: whatever is not marked would stay English in every language."""

import gettext
import re

import pytest
from conftest import MINIMAL, checked

from kneeboard import display, registrations, starter, units
from kneeboard.cli_common import told
from kneeboard.fileio import FileProblem, read_text
from kneeboard.i18n import USER, Msg, Translator, translator

_FORMAT_SPEC = re.compile(r"\{[^{}]*[:!][^{}]*\}")  # "{v:.1f}", "{text!r}": a template fills values as text only


class _Marking(gettext.NullTranslations):
    def gettext(self, message):
        return f"«{message}»"


MARKING = Translator("de", _Marking())


def _made_well(message) -> Msg:
    """`message` made as a Msg whose template an f-string left nothing in."""
    assert isinstance(message, Msg), repr(message)
    assert not _FORMAT_SPEC.search(message.template), message.template
    return message


def test_a_physics_warning_reads_as_before_in_english_and_in_german_with_the_decimal_comma():
    [warning] = checked(MINIMAL + "pattern_factor = 1.2\n").problems
    _made_well(warning.message), _made_well(warning.expected)
    assert str(warning) == ("warning: configuration[1].pattern_factor: the pattern speed is 1.20 x the stall speed at "
                            "the card weight in CAS, less than the least usual 1.3 (FAA-H-8083-3); expected 1.3 x "
                            "stall speed or more, in CAS")
    USER.use("de")
    german = str(warning)
    assert german.startswith("Warnung: configuration[1].pattern_factor: ")  # the field's path as the file has it
    assert "1,20 x" in german and "Mindestwert 1,3 (FAA-H-8083-3)" in german and "erwartet 1,3 x" in german
    assert "stall speed" not in german and "Überziehgeschwindigkeit" in german
    assert "1.2" not in german and "1.3" not in german


def test_a_temperature_far_from_standard_keeps_its_sign_and_its_figures():
    text = MINIMAL.replace("[[configuration]]", '[card]\npressure_altitude = "0 ft"\ntemperature = "60 degC"\n\n'
                                                 "[[configuration]]")
    [warning] = checked(text).problems
    _made_well(warning.message)
    assert str(warning) == ("warning: card.temperature: is +45 degC from the standard temperature at this pressure "
                            "altitude (15 degC); check it; expected an outside air temperature as measured")
    told_marked = warning.told(MARKING)
    assert "«is +45 degC from the standard temperature at this pressure altitude (15 degC); check it»" in told_marked
    assert "«an outside air temperature as measured»" in told_marked


def test_a_unit_of_the_wrong_kind_is_told_with_both_kinds_translated_and_the_unit_as_written():
    with pytest.raises(units.QuantityError) as err:
        units.parse("750 kg", units.SPEED)
    exc = err.value
    _made_well(exc.message), _made_well(exc.expected)
    assert str(exc) == "'kg' is a unit of mass, not of speed"
    assert exc.expected == 'a speed such as "52 kt", "96 km/h" or "60 mph"'
    assert MARKING(exc.message) == "«{unit} is a unit of {described}, not of {kind}»".format(
        unit="'kg'", described="«mass»", kind="«speed»")
    assert MARKING(exc.expected) == '«a speed such as "52 kt", "96 km/h" or "60 mph"»'
    USER.translator = MARKING  # the conftest puts English back
    assert str(exc) == "«'kg' is a unit of «mass», not of «speed»»"


def test_a_decimal_comma_is_refused_with_what_to_type_written_as_typed_in_every_language():
    with pytest.raises(units.QuantityError) as err:
        units.parse("52,5 kt", units.SPEED)
    assert str(err.value) == "the decimal separator is a point, not a comma; write 52.5 kt"
    USER.use("de")
    assert str(err.value).endswith("52.5 kt")  # what to type: never written with the language's comma


def test_a_file_refusal_names_the_file_as_it_is_and_tells_every_word_of_its_own(tmp_path):
    folder = tmp_path / "fleet.toml"
    folder.mkdir()
    with pytest.raises(FileProblem) as err:
        read_text(folder)
    _made_well(err.value.args[0])
    assert str(err.value) == f"{folder}: is a folder, not a regular file; refused"
    USER.translator = MARKING
    assert str(err.value) == f"«{folder}: «is a folder», not a regular file; refused»"
    assert told(err.value, translator("en")) == f"{folder}: is a folder, not a regular file; refused"


def test_a_file_too_large_says_why_in_the_users_words(tmp_path):
    big = tmp_path / "big.toml"
    big.write_bytes(b"#" * 2048)
    with pytest.raises(FileProblem) as err:
        read_text(big, limit=1024)
    assert str(err.value) == f"{big}: larger than 1 KiB; a profile is a few KiB, refused unread"
    _made_well(err.value.args[0])
    assert MARKING(err.value.args[0]) == f"«{big}: «larger than «1 KiB»; «a profile is a few KiB», refused unread»»"


def test_a_starter_refusal_keeps_its_english_and_names_the_file(tmp_path):
    with pytest.raises(starter.Refused) as err:
        starter.new_profile(tmp_path / "mine.txt", "normal")
    _made_well(err.value.args[0])
    assert str(err.value) == (f"{tmp_path / 'mine.txt'}: a profile's name ends in .toml (e.g. mine.toml), so that "
                              "kneeboard finds it in its folder; nothing was written")
    assert not (tmp_path / "mine.txt").exists()


def test_a_duplicate_registration_is_a_problem_told_with_the_files_as_written(tmp_path):
    a, b = tmp_path / "a.toml", tmp_path / "b.toml"
    [first, second] = registrations.problems({"D-EABC": [a, b]})
    _made_well(first.message), _made_well(first.expected)
    assert first.message == f"D-EABC is also the registration of {b}"
    assert second.message == f"D-EABC is also the registration of {a}"
    assert first.told(MARKING).startswith(f"{a}: «error»: aircraft.registration: «D-EABC is also the registration "
                                          f"of {b}»")


def test_no_display_is_one_message_whose_parts_are_all_told():
    said = display.window_problem({}, "linux")
    _made_well(said)
    assert said == ("kneeboard: no display found (neither DISPLAY nor WAYLAND_DISPLAY is set), so the app cannot "
                    "open; the commands check, table, card and compare work without one (kneeboard --help).")
    assert MARKING(said).count("«") == 2  # the line and the commands that work without a display
