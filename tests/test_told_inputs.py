"""A profile's and a style's problems are made as Msg, so each is told in the user's language wherever it is shown,
while its English line stays as it was.

The catalogues may not hold every message yet: what is checked is what holds now: the message and what would do are
Msg (or a declared Word), their templates hold no f-string leftovers and name exactly their values, the English
line is the text the tests and people know, and told in German the frame words and a figure's decimal separator
are German.
"""

import copy
import string
import tomllib
from pathlib import Path

import pytest
from conftest import MINIMAL, SAMPLES

from kneeboard.fileio import FileProblem
from kneeboard.i18n import USER, Msg, Num, Word
from kneeboard.inputs.profile_keys import FIELDS, QUANTITY, field
from kneeboard.inputs.schema import profile_from_data
from kneeboard.inputs.styles import load_style, style_from_data
from kneeboard.inputs.toml import parse_text, unreadable
from kneeboard.problems import Problem

BASE = tomllib.loads(MINIMAL)


def _profile(**sections) -> list[Problem]:
    data = copy.deepcopy(BASE)
    for section, value in sections.items():
        data[section] = value
    return profile_from_data(data)[1]


def _only(problems: list[Problem], path: str) -> Problem:
    found = [p for p in problems if p.path == path]
    assert len(found) == 1, [str(p) for p in problems]
    return found[0]


def _fields(template: str) -> list[tuple[str, str, str | None]]:
    return [(name, spec, conversion) for _, name, spec, conversion in string.Formatter().parse(template)
            if name is not None]


def _assert_well_made(text) -> None:
    """A Msg whose template names exactly its values, with no format spec or conversion (values are filled in as
    strings), each value itself well made; a Word or plain text as it is."""
    if not isinstance(text, Msg):
        return
    fields = _fields(text.template)
    assert all(spec == "" and conversion is None for _, spec, conversion in fields), text.template
    assert {name for name, _, _ in fields} == set(text.params), text.template
    assert all(isinstance(value, str) for value in text.params.values()), text.params
    for value in text.params.values():
        _assert_well_made(value)


def test_a_profile_problem_is_told_in_german_and_its_english_line_is_unchanged():
    problem = _only(_profile(card={"bank_angles": [0, 99]}), "card.bank_angles[2]")
    english = ("error: card.bank_angles[2]: is not a bank angle a level turn can hold (found 99); expected a list of "
               "1 to 24 bank angles in degrees, each from 0 to 85, e.g. [0, 15, 30, 45, 60]")
    assert str(problem) == english
    assert isinstance(problem.message, Msg) and isinstance(problem.expected, Msg)
    _assert_well_made(problem.message)
    _assert_well_made(problem.expected)
    USER.use("de")
    german = str(problem)
    assert german.startswith("Fehler: card.bank_angles[2]: ") and german != english
    assert "99" in german  # the value as written is never translated
    USER.use("en")
    assert str(problem) == english


def test_a_figure_in_a_problem_is_a_num_the_language_writes():
    problems = _profile(weight={"total": "760 kg"})
    problem = _only(problems, "weight")
    assert problem.message == "760 kg is above the maximum weight of 750 kg; limit loads are reduced in proportion"
    assert isinstance(problem.message, Msg)
    assert isinstance(problem.message.params["weight"], Num) and isinstance(problem.message.params["most"], Num)
    _assert_well_made(problem.message)
    german = problem.told(USER.use("de"))
    assert german.startswith("Warnung: weight: ") and "760 kg" in german


def test_a_declared_range_reaches_the_problem_as_a_word_for_the_catalogue():
    problem = _only(_profile(configuration=[{"name": "Up", "stall_speed": "50 kt", "pattern_factor": 9}]),
                    "configuration[1].pattern_factor")
    assert problem.message == "is out of range" and isinstance(problem.message, Msg)
    assert problem.expected == "a number above 1 and at most 3 (pattern speed / stall speed), e.g. 1.4"
    assert isinstance(problem.expected, Word)
    # and every declared range is marked so, quantities' too (told in "a {kind} {wording}")
    assert all(isinstance(f.bounds[2], Word) for f in FIELDS if f.bounds)


def test_a_quantity_out_of_range_says_its_kind_and_range_in_one_message():
    problem = _only(_profile(aircraft={**BASE["aircraft"], "max_weight": "900000 kg"}), "aircraft.max_weight")
    assert problem.expected == "a mass above 1 kg and at most 600,000 kg"
    assert isinstance(problem.expected, Msg) and problem.expected.template == "a {kind} {wording}"
    assert isinstance(problem.expected.params["wording"], Word)


def test_a_misspelt_section_and_key_name_the_file_as_written_inside_a_message():
    data = copy.deepcopy(BASE)
    data["weigth"] = {"total": "700 kg"}
    data["aircraft"]["registraton"] = "X"
    problems = profile_from_data(data)[1]
    section = _only(problems, "weight")
    assert section.message == "[weigth] is not a section of a profile; did you mean [weight]?"
    assert section.message.params == {"key": "weigth", "section": "weight"}  # the file's own words, untranslated
    key = _only(problems, "aircraft.registraton")
    assert key.message == "unknown key, kept in the file but not used; did you mean registration?"
    for p in (section, key):
        _assert_well_made(p.message)


def test_every_problem_of_broken_sample_profiles_is_made_well():
    """Each sample with every value of its first configuration and aircraft replaced by wrong ones: each message
    and expected text made as Msg is well made, and the messages of the file reader's own are Msg (a quantity's
    refusal and a file's are made where they are raised)."""
    made = 0
    for sample in sorted(SAMPLES.glob("*.toml")):
        data = tomllib.loads(sample.read_text(encoding="utf-8"))
        for section, table in (("aircraft", data["aircraft"]), ("card", data.get("card", {})),
                               ("configuration", data["configuration"][0])):
            for key in list(table):
                for wrong in (True, [], "x" * 700, 0, {"a": 1}):
                    broken = copy.deepcopy(data)
                    target = broken["configuration"][0] if section == "configuration" else broken.setdefault(section,
                                                                                                               {})
                    target[key] = wrong
                    for p in profile_from_data(broken)[1]:
                        _assert_well_made(p.message)
                        _assert_well_made(p.expected)
                        made += isinstance(p.message, Msg)
                        if not isinstance(p.message, Msg):  # only a quantity's refusal, made by the units
                            assert field(p.path).kind == QUANTITY, str(p)
    assert made > 200


def test_a_style_problem_tells_its_bounds_with_the_languages_decimal_comma(tmp_path):
    _, problems = style_from_data({"style": 1, "font_scale": 9.5}, tmp_path)
    problem = _only(problems, "font_scale")
    assert str(problem) == "error: font_scale: is out of range (found 9.5); expected a number from 0.7 to 1.6"
    assert isinstance(problem.message, Msg) and isinstance(problem.expected, Msg)
    _assert_well_made(problem.expected)
    german = problem.told(USER.use("de"))
    assert german.startswith("Fehler: font_scale: ")
    assert "0,7" in german and "1,6" in german
    assert "(found 9.5)" in german or "9.5" in german  # the value as written keeps its point


@pytest.mark.parametrize("data, path, english", [
    ({"organization": "x" * 61}, "organization", "is 61 characters long"),
    ({"accent": "red"}, "accent", "is not a colour"),
    ({"language": "xx"}, "language", "is not a language kneeboard prints"),
    ({"front": ["header", "nope"]}, "front", "names unknown blocks: nope"),
    ({"organisation": "Club"}, "organisation", "is the older spelling of this key; it is read, but write organization"),
    ({"logo": "../outside.png"}, "logo", "points outside the style's folder; refused"),
])
def test_each_kind_of_style_problem_is_a_msg(tmp_path, data, path, english):
    problem = _only(style_from_data({"style": 1, **data}, tmp_path)[1], path)
    assert problem.message == english and isinstance(problem.message, Msg)
    _assert_well_made(problem.message)
    _assert_well_made(problem.expected)


def test_toml_that_cannot_be_read_keeps_the_parsers_detail_inside_a_msg():
    data, problems = parse_text("a = \n")
    assert data is None
    problem = problems[0]
    assert str(problem).startswith("error: (file): is not valid TOML: Invalid ")
    assert problem.message.template == "is not valid TOML: {detail}"
    assert type(problem.message.params["detail"]) is str  # the parser's own words: never translated
    assert isinstance(problem.expected, Msg)
    assert problem.told(USER.use("de")).startswith("Fehler: (file): ")


def test_a_style_nested_too_deeply_is_told_so_as_a_style(tmp_path):
    style = tmp_path / "deep.style.toml"
    style.write_text("a = " + "[" * 1100 + "]" * 1100 + "\n", encoding="utf-8")
    _, problems = load_style(style)
    (problem,) = problems
    assert str(problem) == (f"{style}: error: (file): nests too deeply to be a style; expected a card style file as "
                            "described in the README")
    assert isinstance(problem.message, Msg) and isinstance(problem.expected, Msg)


def test_a_file_that_cannot_be_read_keeps_its_refusals_msg_without_the_file_name():
    path = Path("fleet/plane.toml")
    inner = Msg("is {size} bytes long", size="9")
    made = unreadable(FileProblem(Msg("{file}: {problem}", file=str(path), problem=inner)), path)
    assert made.message is inner and made.file == str(path)
    assert str(made) == "fleet/plane.toml: error: (file): is 9 bytes long"
    said = unreadable(FileProblem(f"{path}: cannot be read (Permission denied)"), path)
    assert said.message == "cannot be read (Permission denied)"  # a refusal made as text: its text, as before


def test_a_missing_profile_file_is_named_once_in_its_problem(tmp_path):
    from kneeboard.inputs.profiles import read_source

    source = read_source(tmp_path / "absent.toml")
    (problem,) = source.problems
    assert problem.file == str(tmp_path / "absent.toml") and problem.path == "(file)"
    assert str(tmp_path) not in str(problem.message)
