"""Card style files: defaults, every bad value named, logos confined to the style's folder."""

import base64

import pytest
from card_helpers import card_of

from kneeboard.card.ops import Image, Text
from kneeboard.inputs.styles import load_style
from kneeboard.shipped import default_style_path

# a 2 x 1 pixel PNG (invented test image; every chunk's checksum right, as logos are now checked)
PNG = base64.b64decode(
    "iVBORw0KGgoAAAANSUhEUgAAAAIAAAABCAYAAAD0In+KAAAAD0lEQVR4nGNQckn7DwQMABNLBMmFFcQnAAAAAElFTkSuQmCC"
)
SVG = '<svg xmlns="http://www.w3.org/2000/svg" width="40" height="20"><rect width="40" height="20" fill="#246"/></svg>'


def test_default_style_ships_and_loads():
    assert default_style_path().is_file()
    style, problems = load_style()
    assert problems == [] and style.size == "a5" and style.front is None  # every registered block, in order


def write(tmp_path, text, name="style.toml"):
    path = tmp_path / name
    path.write_text(text)
    return path


@pytest.mark.parametrize("line, key", [
    ('size = "a3"', "size"),
    ('accent = "blue"', "accent"),
    ("font_scale = 5", "font_scale"),
    ('front = ["header", "weather"]', "front"),
    ('orientation = "sideways"', "orientation"),
    ("bank_angles = [0, 95]", "bank_angles[2]"),  # the profile's bank rule: the entry is named
    ('speed_unit = "furlong/fortnight"', "speed_unit"),
    ("style = 9", "style"),
])
def test_bad_values_are_named(tmp_path, line, key):
    style, problems = load_style(write(tmp_path, line + "\n"))
    assert style is None
    assert [p.path for p in problems if p.is_error] == [key]


def test_logo_outside_the_folder_is_refused(tmp_path):
    style, problems = load_style(write(tmp_path, 'logo = "../../etc/passwd"\n'))
    assert style is None and "outside" in problems[0].message
    style, problems = load_style(write(tmp_path, 'logo = "/etc/hostname"\n'))
    assert style is None


def test_png_and_svg_logos_are_printed(tmp_path):
    (tmp_path / "logo.png").write_bytes(PNG)
    (tmp_path / "logo.svg").write_text(SVG)
    for name in ("logo.png", "logo.svg"):
        style, problems = load_style(write(tmp_path, f'logo = "{name}"\norganization = "Demo Flying Club"\n'))
        assert problems == [], problems
        c = card_of("demo_microlight", style)
        images = [op for op in c.pages[0].ops if isinstance(op, Image)]
        assert len(images) == 1 and images[0].png.startswith(b"\x89PNG")
        assert "Demo Flying Club" in {op.text for op in c.pages[0].ops if isinstance(op, Text)}


def test_style_overrides_banks_and_units(tmp_path):
    style, _ = load_style(write(tmp_path, 'bank_angles = [0, 20, 40]\nspeed_unit = "mph"\n'))
    c = card_of("demo_trainer", style)
    assert [r.bank_text for r in c.table.configurations[0].rows] == ["0", "20", "40"]
    assert c.table.speed_unit == "mph"


def test_unknown_key_warns(tmp_path):
    style, problems = load_style(write(tmp_path, 'colour_scheme = "night"\n'))
    assert style is not None and [p.severity for p in problems] == ["warning"]


def test_the_older_spelling_of_organization_is_read_with_a_warning(tmp_path):
    """One spelling (American, as the FAA writes) in keys; a file written with the other loses nothing."""
    path = tmp_path / "old.style.toml"
    path.write_text('style = 1\norganisation = "Aeroklub Demo (invented)"\n', encoding="utf-8")
    style, problems = load_style(path)
    assert style is not None and style.organization == "Aeroklub Demo (invented)"
    (warning,) = problems
    assert warning.path == "organisation" and not warning.is_error and "write organization" in warning.message
    path.write_text('style = 1\norganisation = "Old"\norganization = "New"\n', encoding="utf-8")
    style, problems = load_style(path)
    assert style.organization == "New" and [p.path for p in problems] == ["organisation"]
