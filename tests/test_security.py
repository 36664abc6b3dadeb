"""Profiles and styles are data: nothing in them is executed, and no path in them leaves their folder."""

import re
from pathlib import Path

import pytest
from conftest import MINIMAL

PACKAGE = Path(__file__).resolve().parent.parent / "kneeboard"
FORBIDDEN = re.compile(r"(?<![.\w])(eval|exec|compile)\(|\bpickle\b|\bmarshal\b|\bshelve\b|__import__\(|os\.system|"
                       r"subprocess|yaml\.load|\bctypes\b")


def test_no_code_execution_anywhere_in_the_package():
    hits = [f"{p.relative_to(PACKAGE)}:{n}: {line.strip()}"
            for p in PACKAGE.rglob("*.py")
            for n, line in enumerate(p.read_text().splitlines(), start=1)
            if FORBIDDEN.search(line) and not line.lstrip().startswith("#")]
    assert hits == []


@pytest.mark.parametrize("text", ["__import__('os').system('x') kt", "eval('1') kt", "1 kt; import os",
                                  "(lambda: 1)() kt", "2**2**2**2 kt", "{0.__class__} kt"])
def test_unit_strings_are_only_quantities(text):
    from kneeboard import units

    with pytest.raises(units.QuantityError):
        units.parse(text, units.SPEED)


@pytest.mark.parametrize("logo", ["../../etc/passwd", "/etc/passwd", "../outside.png", "sub/../../outside.png"])
def test_style_paths_stay_in_the_style_folder(tmp_path, logo):
    from kneeboard.inputs.styles import load_style

    (tmp_path / "outside.png").write_bytes(b"\x89PNG")
    folder = tmp_path / "styles"
    folder.mkdir()
    (folder / "sub").mkdir()
    style_file = folder / "s.style.toml"
    style_file.write_text(f'logo = "{logo}"\n')
    style, problems = load_style(style_file)
    assert style is None
    assert problems[0].path == "logo" and ("outside" in problems[0].message or "no such" in problems[0].message)


def test_unknown_keys_survive_a_save(open_document, tmp_path):
    path = tmp_path / "p.toml"
    path.write_text(MINIMAL.replace("[aircraft]", "owner_note = \"hangar 3\"\n\n[aircraft]") +
                    'paint = "blue"   # kept\n')
    doc = open_document(path)
    assert [p.path for p in doc.loaded.warnings] == ["owner_note", "configuration[1].paint"]
    doc.set(("aircraft", "max_weight"), "760 kg")
    doc.save()
    text = path.read_text()
    assert 'owner_note = "hangar 3"' in text and 'paint = "blue"   # kept' in text
