"""The style keys' declarations: the reader, the dialog and the command line are made from them."""

from pathlib import Path

import pytest

from kneeboard.card.style import CardStyle
from kneeboard.inputs import style_keys as sk
from kneeboard.inputs.banks import read_banks
from kneeboard.inputs.styles import load_style, style_from_data
from kneeboard.problems import Problem


def test_a_style_file_without_keys_reads_as_the_declared_defaults_and_the_dataclass_agrees(tmp_path):
    style, problems = style_from_data({}, tmp_path)
    assert problems == [] and style == CardStyle()
    # each declared default is the dataclass's (a key and a field may differ in name: orientation -> landscape)
    fields = {"orientation": ("landscape", lambda v: v == "landscape"), "bank_angles": ("bank_angles_deg", None),
              "logo": ("logo", None)}
    for decl in sk.KEYS:
        if decl.key == "style":
            continue
        name, convert = fields.get(decl.key, (decl.key, None))
        assert getattr(CardStyle(), name) == (convert(decl.default) if convert else decl.default), decl.key


def test_every_declaration_is_complete():
    assert len(sk.BY_KEY) == len(sk.KEYS)
    for decl in sk.KEYS:
        assert decl.source and decl.help, decl.key  # where its default comes from, and what it does
        if decl.kind == sk.CHOICE:
            assert decl.options and (decl.default is None or decl.default in decl.options), decl.key
        if decl.kind in (sk.NUMBER, sk.COUNT):
            low, high = decl.bounds
            assert low < high and (decl.default is None or low <= decl.default <= high), decl.key


def test_every_declared_key_is_read_and_an_undeclared_one_is_kept_with_a_warning(tmp_path):
    good = {"style": 1, "organization": "Demo Club (invented)", "accent": "#112233", "font_scale": 1.2,
            "size": "4x6", "orientation": "landscape", "binding": "left", "front": ["header"], "back": ["limits"],
            "max_faces": 4, "bank_angles": [0, 20], "speed_unit": "mph", "distance_unit": "m", "language": "de",
            "logo": ""}
    assert set(good) == set(sk.BY_KEY)
    style, problems = style_from_data({**good, "colour_scheme": "night"}, tmp_path)
    assert [(p.path, p.severity) for p in problems] == [("colour_scheme", "warning")]
    assert (style.size, style.landscape, style.binding, style.front, style.back, style.max_faces) == \
        ("4x6", True, "left", ("header",), ("limits",), 4)
    assert (style.bank_angles_deg, style.speed_unit, style.distance_unit, style.language) == ((0.0, 20.0), "mph",
                                                                                              "m", "de")


@pytest.mark.parametrize("key", [k.key for k in sk.KEYS if k.kind in (sk.CHOICE, sk.NUMBER, sk.COUNT)])
def test_a_value_outside_a_keys_declaration_is_named_at_the_key_with_what_would_do(tmp_path, key):
    decl = sk.BY_KEY[key]
    style, problems = style_from_data({key: "no such value"}, tmp_path)
    (problem,) = problems
    assert problem.path == key and problem.is_error and problem.expected == decl.expected
    assert getattr(style, {"orientation": "landscape"}.get(key, key)) == (False if key == "orientation" else
                                                                           decl.default)


def test_the_shipped_sample_and_test_style_files_read_without_a_problem():
    from conftest import ROOT

    files = [ROOT / "resources" / "default.style.toml", *Path(ROOT).glob("sample_aircraft/*.style.toml"),
             *Path(ROOT).glob("tests/**/*.style.toml")]
    for path in files:
        style, problems = load_style(path)
        assert style is not None and problems == [], (path, problems)
    assert load_style()[1] == []


def test_one_bank_rule_for_profiles_and_styles(tmp_path):
    found = []

    def problem(*args, **kwargs):
        found.append(Problem(*args, **kwargs))

    assert read_banks([45, 0, 30, 30], "card.bank_angles", problem) == (0.0, 30.0, 45.0)
    assert [(p.path, p.severity) for p in found] == [("card.bank_angles", "warning")]  # listed twice
    found.clear()
    assert read_banks([0, 95, True], "bank_angles", problem) == (0.0,)
    assert [p.path for p in found] == ["bank_angles[2]", "bank_angles[3]"]
    found.clear()
    assert read_banks("45", "bank_angles", problem) is None and found[0].message == "must be a list of numbers"
    # a style's bank list is held to exactly the profile's rule, and named in the style's own words
    style, problems = style_from_data({"bank_angles": [0, 95]}, tmp_path)
    assert [p.path for p in problems] == ["bank_angles[2]"] and style.bank_angles_deg == (0.0,)
    assert problems[0].message == "is not a bank angle a level turn can hold"


def test_the_block_names_a_style_may_list_are_the_registered_blocks():
    from kneeboard.card import block_names, blocks
    from kneeboard.card.blocks import BlockSpec

    assert blocks.names() == block_names.BUILT_IN == block_names.known()
    blocks.register(BlockSpec("wind-check", "Wind check (a test block)", draw=lambda ctx, width: None))
    try:
        assert block_names.known()[-1] == "wind-check"
    finally:
        blocks.unregister("wind-check")
    assert block_names.known() == block_names.BUILT_IN


def test_the_fonts_coverage_read_without_reportlab_is_reportlabs():
    from reportlab.pdfbase import pdfmetrics

    from kneeboard.card import fonts

    fonts.register()
    regular, bold = (pdfmetrics.getFont(name).face.charToGlyph for name in (fonts.REGULAR, fonts.BOLD))
    assert fonts._drawable() == frozenset(c for c in regular if regular[c] and bold.get(c))
