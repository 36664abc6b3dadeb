"""The templates' comments agree with the declarations of the keys they explain (kneeboard/inputs/profile_keys.py).

A comment that calls a value the default must show the declared default, and name no other source than the
declared one; a list of choices must be the declared choices; a regulation it cites must be the one the
declaration cites; every key it names, commented out or not, must be declared where it stands.
"""

import re

import pytest

from kneeboard import units
from kneeboard.inputs import profile_keys
from kneeboard.inputs.toml import parse_text
from kneeboard.shipped import CATEGORIES_WITH_TEMPLATES, template_path

#: a key line, commented out (an example) or not, with the comment explaining it
KEY_LINE = re.compile(r"^(?:# )?(?P<key>[a-z_]+) = (?P<value>.+?)\s+# (?P<comment>.+)$")
HEADER = re.compile(r"^\[\[?(?P<section>[a-z.]+)\]\]?\s*$")
REGULATION = re.compile(r"(?:14 CFR|CS) \d+\.\d+")


def commented_keys(category):
    """(section, key, value as written, comment) of every key line with a comment, in the template of `category`."""
    found, section = [], ""
    for line in template_path(category).read_text(encoding="utf-8").splitlines():
        if header := HEADER.match(line):
            section = header["section"]
        elif match := KEY_LINE.match(line):
            found.append((section, match["key"], match["value"], match["comment"]))
    return found


def value_of(text):
    data, problems = parse_text(f"v = {text}\n")
    assert data is not None, problems
    return data["v"]


@pytest.mark.parametrize("category", CATEGORIES_WITH_TEMPLATES)
def test_every_template_comment_agrees_with_its_declaration(category):
    lines = commented_keys(category)
    assert len(lines) >= 4  # the check reads the templates' comments, not nothing
    for section, key, written, comment in lines:
        where = f"{category}.toml {section}.{key}"
        declared = profile_keys.BY_PATH.get(f"{section}.{key}")
        assert declared is not None, f"{where}: not a declared key"
        for named in re.findall(r"\b([a-z]+_[a-z_]+) =", comment):
            assert f"{section}.{named}" in profile_keys.BY_PATH, f"{where}: names {named}, not a declared key"
        if "default" in comment:
            value = value_of(written)
            if declared.kind == profile_keys.QUANTITY:
                value = units.parse(value, declared.quantity)
            elif declared.kind == profile_keys.BANKS:
                value = tuple(float(v) for v in value)
            assert value == pytest.approx(declared.default), f"{where}: shows {written}, the default is " \
                                                             f"{declared.default_text}"
            source = re.search(r"default; ([^)]+)\)", comment)
            assert source is None or source[1] in declared.default_source, f"{where}: source {source[1]!r}"
        if " | " in comment:
            choices = tuple(c.strip() for c in comment.split(":")[-1].split("|"))
            assert choices == declared.options, f"{where}: lists {choices}, the choices are {declared.options}"
        for regulation in REGULATION.findall(comment):
            assert regulation in declared.help + declared.default_source, f"{where}: cites {regulation}"


def test_the_check_finds_a_comment_that_disagrees(monkeypatch, tmp_path):
    """A default changed in the declarations and not in the templates (or the other way) fails the check."""
    from dataclasses import replace

    changed = replace(profile_keys.BY_PATH["card.reaction_time"], default=5.0)
    monkeypatch.setitem(profile_keys.BY_PATH, "card.reaction_time", changed)
    with pytest.raises(AssertionError, match="reaction_time: shows"):
        test_every_template_comment_agrees_with_its_declaration("normal")


def test_placeholders_and_the_reader_take_the_declared_defaults():
    from conftest import MINIMAL, checked

    factor = profile_keys.BY_PATH["configuration.pattern_factor"]
    assert factor.placeholder == "default 1.4" and factor.default_source  # written once, with its source
    assert profile_keys.BY_PATH["card.reaction_time"].placeholder == 'default "4 s"'
    assert profile_keys.BY_PATH["card.turn_back_degrees"].placeholder == "degrees, default 180, 270"
    profile = checked(MINIMAL).profile  # MINIMAL gives no factor, no banks, no reaction time
    assert profile.configurations[0].pattern_factor == factor.default
    assert profile.card.bank_angles_deg == profile_keys.default("card.bank_angles")
    assert profile.card.reaction_time == profile_keys.default("card.reaction_time")
    assert profile.card.language == profile_keys.default("card.language")
