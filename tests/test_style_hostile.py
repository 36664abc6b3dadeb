"""Styles and logos are data like profiles: every hostile style or logo is a Problem naming the field.

Each case once ended in an internal error (exit 70) for every card of a fleet, or hung. Loads
run through `promptly`, so a FIFO that blocks fails the test instead of hanging the suite.
"""

import base64
import os
import struct
import zlib

import pytest
from card_helpers import card_of, loaded
from hang_guard import promptly

from kneeboard.card.logo import LogoProblem, drawn_logo, logo_png
from kneeboard.card.ops import Image
from kneeboard.card.organization import load_card_style, organization_problems
from kneeboard.card.style import CardStyle
from kneeboard.card.svgcheck import MAX_DRAWN
from kneeboard.inputs.styles import load_style

SVG_NS = 'xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink"'


def chunk(kind: bytes, data: bytes) -> bytes:
    return struct.pack(">I", len(data)) + kind + data + struct.pack(">I", zlib.crc32(kind + data))


def png(width: int, height: int, rows: bytes | None = None) -> bytes:
    """An invented RGBA PNG of `width` x `height`, every checksum right (PNG specification, ISO/IEC 15948)."""
    if rows is None:
        rows = (b"\x00" + b"\x1b\x5e\x8c\xff" * width) * height
    header = struct.pack(">IIBBBBB", width, height, 8, 6, 0, 0, 0)
    return b"\x89PNG\r\n\x1a\n" + chunk(b"IHDR", header) + chunk(b"IDAT", zlib.compress(rows)) + chunk(b"IEND", b"")


def svg(body: str, canvas: str = 'width="40" height="20"') -> str:
    return f'<svg {SVG_NS} {canvas}>{body}</svg>'


def load(folder, text, name="style.toml"):
    """A style file of `text` in `folder` read as a card uses it (the organization fitted), promptly; returns
    (style, problems)."""
    path = folder / name
    path.write_text(text)
    outcome = promptly(load_card_style, path)
    assert "error" not in outcome, outcome  # never an exception, whatever the file holds
    return outcome["value"]


def refused_logo(folder, name, content) -> str:
    """The one error of a style whose logo file `name` holds `content`; it must name `logo`."""
    target = folder / name
    if isinstance(content, str):
        target.write_text(content)
    else:
        target.write_bytes(content)
    style, problems = load(folder, f'logo = "{name}"\n')
    errors = [p for p in problems if p.is_error]
    assert style is None and [p.path for p in errors] == ["logo"], problems
    return errors[0].message


# --- the style file itself ---------------------------------------------------------------------------


def test_a_fifo_as_style_is_a_file_problem(tmp_path):
    os.mkfifo(tmp_path / "fleet.style.toml")
    outcome = promptly(load_style, tmp_path / "fleet.style.toml")
    style, problems = outcome["value"]
    assert style is None and [p.path for p in problems] == ["(file)"] and "FIFO" in problems[0].message


@pytest.mark.parametrize("device", ["/dev/null", "/dev/zero"])
def test_a_device_as_style_is_a_file_problem(device):
    style, problems = promptly(load_style, device)["value"]
    assert style is None and problems[0].path == "(file)" and "device" in problems[0].message


def test_a_symlink_loop_as_style_is_a_file_problem(tmp_path):
    (tmp_path / "a.style.toml").symlink_to("b.style.toml")
    (tmp_path / "b.style.toml").symlink_to("a.style.toml")
    style, problems = promptly(load_style, tmp_path / "a.style.toml")["value"]
    assert style is None and problems[0].path == "(file)" and "loop" in problems[0].message


def test_a_5000_digit_integer_is_a_file_problem(tmp_path):
    style, problems = load(tmp_path, "font_scale = " + "9" * 5000 + "\n")
    assert style is None and [p.path for p in problems] == ["(file)"]
    assert "cannot be read" in problems[0].message


def test_a_4000_digit_integer_is_named_at_its_field(tmp_path):
    style, problems = load(tmp_path, "font_scale = " + "9" * 4000 + "\n")
    assert style is None and [p.path for p in problems] == ["font_scale"]
    assert str(problems[0])  # and the message can be shown


@pytest.mark.parametrize("text", [
    "front = " + "[" * 2000 + "]" * 2000 + "\n",
    "x = " + "{a = " * 300 + "1" + "}" * 300 + "\n",
    ".".join(["k"] * 5000) + " = 1\n",
])
def test_deep_nesting_is_a_file_problem(tmp_path, text):
    style, problems = load(tmp_path, text)
    assert style is None and [p.path for p in problems] == ["(file)"]
    assert "style" in problems[0].expected


def test_unknown_keys_with_controls_are_shown_escaped(tmp_path):
    style, problems = load(tmp_path, '"bad\\u001b[31m" = 1\n')
    assert style is not None and problems[0].severity == "warning"
    assert "\x1b" not in problems[0].path


# --- the organization --------------------------------------------------------------------------------


@pytest.mark.parametrize("value, says", [
    ("Demo\\u0007Club", "U+0007"),  # a bell
    ("Demo \\u202eCLUB", "U+202E"),  # right-to-left override: the card would show other text than the file
    ("Demo\\u200bClub", "U+200B"),  # zero-width space
    ("Demo\\nClub", "U+000A"),  # the organization is one line
    ("x" * 61, "61 characters"),
    ("W" * 60, "does not fit"),
])
def test_the_organization_follows_the_profile_text_rules(tmp_path, value, says):
    style, problems = load(tmp_path, f'organization = "{value}"\n')
    assert style is None
    assert [p.path for p in problems] == ["organization"] and says in problems[0].message


@pytest.mark.parametrize("size, binding, logo", [
    ("4x6", "none", True), ("4x6", "left", False), ("5x8", "left", True), ("half-letter", "top", True),
    ("a5", "none", True),
])
def test_every_organization_the_loader_accepts_fits_its_card(tmp_path, sample_paths, size, binding, logo):
    # the longest name of short words the loader accepts for a card prints on every sample aircraft
    # (their registrations are no wider than the ten characters the room is measured beside)
    from kneeboard.card import fonts
    from kneeboard.card.organization import REGISTRATION_SAMPLE

    (tmp_path / "logo.png").write_bytes(png(40, 20))
    # only the header is at stake here (a glider's circling table never fits a bound 4x6 card, organization or not)
    card_keys = (f'size = "{size}"\nbinding = "{binding}"\nfront = ["header", "margin-table"]\n'
                 + ('logo = "logo.png"\n' if logo else ""))
    name = ""
    while True:
        longer = (name + " Mmmm").strip()
        style, problems = load(tmp_path, f'organization = "{longer}"\n' + card_keys)
        if style is None:
            # the room runs out, or on the widest cards the 60-character limit comes first
            assert [p.path for p in problems] == ["organization"]
            assert "does not fit" in problems[0].message or "characters long" in problems[0].message
            break
        name = longer
    assert len(name) >= 9  # at least "Mmmm Mmmm" on every card
    style, problems = load(tmp_path, f'organization = "{name}"\n' + card_keys)
    assert problems == []
    sample_width = fonts.width(REGISTRATION_SAMPLE, fonts.BOLD, 10)
    for path in sample_paths:
        lp = loaded(path.stem)
        assert fonts.width(lp.profile.aircraft.registration, fonts.BOLD, 10) <= sample_width
        card = card_of(path.stem, style)
        printed = " ".join(op.text for op in card.pages[0].ops if hasattr(op, "text"))
        assert all(word in printed for word in name.split())


def test_an_organization_is_measured_against_the_style_card(tmp_path):
    name = "Mmmm Mmmm Mmmm Mmmm Mmmm Mmmm Mmmm Mmmm Mmmm Mmmm Mmmm"
    style, problems = load(tmp_path, f'organization = "{name}"\nsize = "a5"\n')
    assert problems == [] and style.organization == name
    (too_small,) = organization_problems(style.with_changes(size="4x6", binding="left"))
    assert too_small.path == "organization" and "4x6 (bound left)" in too_small.message
    style, problems = load(tmp_path, f'organization = "{name}"\nsize = "4x6"\nbinding = "left"\n')
    assert style is None and [p.path for p in problems] == ["organization"]


def test_a_nul_in_the_logo_path_is_named(tmp_path):
    style, problems = load(tmp_path, 'logo = "a\\u0000b.png"\n')
    assert style is None and [p.path for p in problems] == ["logo"] and "control character" in problems[0].message


def test_a_symlink_loop_as_logo_is_named(tmp_path):
    (tmp_path / "a.png").symlink_to("b.png")
    (tmp_path / "b.png").symlink_to("a.png")
    style, problems = load(tmp_path, 'logo = "a.png"\n')
    assert style is None and [p.path for p in problems] == ["logo"] and "loop" in problems[0].message


def test_a_fifo_as_logo_is_named_without_waiting(tmp_path):
    os.mkfifo(tmp_path / "logo.png")
    style, problems = load(tmp_path, 'logo = "logo.png"\n')
    assert style is None and problems[0].path == "logo" and "FIFO" in problems[0].message


@pytest.mark.parametrize("device", ["/dev/null", "/dev/zero"])
def test_a_device_as_logo_is_named(tmp_path, device):
    (tmp_path / "logo.png").symlink_to(device)  # a link inside the folder to a device outside it
    style, problems = load(tmp_path, 'logo = "logo.png"\n')
    assert style is None and problems[0].path == "logo"
    assert "outside" in problems[0].message
    # and read directly (a caller's own path), a device is no logo either
    outcome = promptly(logo_png, device)
    assert isinstance(outcome.get("error"), LogoProblem) and "device" in str(outcome["error"])


def test_a_missing_logo_is_named(tmp_path):
    style, problems = load(tmp_path, 'logo = "gone.svg"\n')
    assert style is None and problems[0].path == "logo" and "no such file" in problems[0].message


# --- broken raster logos ------------------------------------------------------------------------------


@pytest.mark.parametrize("content, says", [
    (b"\x00garbage\xff" * 50, "not a PNG"),
    (b"", "empty"),
    (png(40, 20)[:60], "truncated"),
    (png(40, 20)[:-12], "truncated"),  # no end chunk
    (png(40, 20).replace(b"IDAT", b"IDAX"), "checksum"),
    (svg('<rect width="40" height="20"/>').encode(), "SVG named .png"),
    (b"\xff\xd8\xff\xe0 a JPEG", "JPEG"),
    (png(30000, 30000, rows=b""), "30,000 x 30,000 pixels"),  # a small file declaring 900 million pixels
    (png(4001, 4000, rows=b""), "pixels"),
    (png(2000, 1, rows=b""), "differ at most"),
    (png(0, 10, rows=b""), "0 x 10"),
    (png(40, 20, rows=b"\x00" * 10), "cannot be decoded"),  # too few pixel rows for its header
])
def test_broken_png_logos_are_named(tmp_path, content, says):
    assert says in refused_logo(tmp_path, "logo.png", content)


def test_an_oversized_logo_file_is_refused_unread(tmp_path):
    assert "larger than 2048 KiB" in refused_logo(tmp_path, "logo.png", b"\x89PNG\r\n\x1a\n" + b"\0" * (2 << 20))


def test_a_large_png_logo_is_kept_small(tmp_path):
    (tmp_path / "logo.png").write_bytes(png(3000, 1500))
    style, problems = load(tmp_path, 'logo = "logo.png"\n')
    assert problems == [] and drawn_logo(style).startswith(b"\x89PNG")
    width, height = struct.unpack(">II", drawn_logo(style)[16:24])
    assert (width, height) == (1200, 600)


# --- broken and hostile SVG logos ---------------------------------------------------------------------

BILLION_LAUGHS = """<?xml version="1.0"?>
<!DOCTYPE svg [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;">
<!ENTITY c "&b;&b;&b;&b;&b;&b;&b;&b;&b;&b;"><!ENTITY d "&c;&c;&c;&c;&c;&c;&c;&c;&c;&c;">]>
<svg xmlns="http://www.w3.org/2000/svg" width="40" height="20"><text>&d;&d;&d;&d;&d;&d;&d;</text></svg>"""


def nested_uses(levels: int, fan_out: int) -> str:
    """`levels` groups, each drawing `fan_out` copies of the one below: fan_out ** levels rectangles."""
    groups = ['<rect id="l0" width="1" height="1"/>']
    for level in range(1, levels + 1):
        uses = "".join(f'<use href="#l{level - 1}" x="{k}"/>' for k in range(fan_out))
        groups.append(f'<g id="l{level}">{uses}</g>')
    return svg(f'<defs>{"".join(groups)}</defs><use href="#l{levels}"/>')


def blur_filters(count: int) -> str:
    filters = "".join(f'<filter id="f{k}"><feGaussianBlur stdDeviation="5"/></filter>' for k in range(count))
    shapes = "".join(f'<rect width="40" height="20" filter="url(#f{k})"/>' for k in range(count))
    return svg(f"<defs>{filters}</defs>{shapes}")


@pytest.mark.parametrize("content, says", [
    ("", "empty"),
    ("   \n", "empty"),
    ("<svg", "not well-formed"),
    ("<svg xmlns='http://www.w3.org/2000/svg'><rect></svg>", "not well-formed"),
    ("<html><body/></html>", "not an SVG"),
    (png(40, 20), "PNG image named .svg"),
    (b"\xff\xfe<\x00s\x00v\x00g\x00", "not UTF-8"),
    (BILLION_LAUGHS, "DOCTYPE"),
    ('<!ENTITY x SYSTEM "file:///etc/passwd">' + svg(""), "DOCTYPE or entities"),
    ('<?xml-stylesheet href="other.css"?>' + svg(""), "instruction"),
    (svg('<g id="a"><use href="#a"/></g>'), "refers back to itself"),
    (svg('<use id="x" xlink:href="#x"/>'), "refers back to itself"),
    (svg('<defs><g id="a"><use href="#b"/></g><g id="b"><use href="#a"/></g></defs><use href="#a"/>'), "back"),
    (nested_uses(10, 10), "<use> elements"),  # 10 levels of 10: ten thousand million rectangles
    (nested_uses(5, 2), "chains <use> copies more than 3 deep"),
    (nested_uses(3, 30), f"more than {MAX_DRAWN:,} elements"),
    (blur_filters(2000), "elements"),
    (blur_filters(21), "filters"),
    (svg('<image href="../../x.png" width="10" height="10"/>'), "outside the SVG"),
    (svg('<image xlink:href="/etc/x.png" width="10" height="10"/>'), "outside the SVG"),
    (svg('<image href="file:///etc/x.png" width="10" height="10"/>'), "outside the SVG"),
    (svg('<image href="http://example.invalid/x.png" width="10" height="10"/>'), "outside the SVG"),
    (svg('<image href="data:image/svg+xml;base64,PHN2Zy8+" width="10" height="10"/>'), "outside the SVG"),
    (svg('<use href="other.svg#part"/>'), "outside the SVG"),
    (svg('<rect width="4" height="2" fill="url(pattern.svg#p)"/>'), "outside the SVG"),
    (svg('<rect width="4" height="2" style="fill: url(\'/etc/x.png\')"/>'), "outside the SVG"),
    (svg('<style>@import "other.css";</style>'), "imports"),
    (svg('<style>rect { fill: url(x.svg#g) }</style>'), "outside the SVG"),
    (svg('<style>rect { fill: u\\72l(x.svg) }</style>'), "backslash"),
    (svg('<script>alert(1)</script>'), "<script>"),
    (svg('<rect width="1" height="1"/>', 'width="10" height="10000000"'), "height"),
    (svg('<rect width="1" height="1"/>', 'viewBox="0 0 10 10000000"'), "viewBox"),
    (svg('<rect width="1" height="1"/>', 'viewBox="0 0 10"'), "four numbers"),
    (svg('<rect width="1" height="1"/>', 'width="1000" height="10"'), "differ at most"),
    (svg('<rect width="1" height="1"/>', 'width="-5" height="10"'), "width"),
    (svg('<rect width="1" height="1"/>', 'width="ten" height="10"'), "not a length"),
    (svg('<rect width="1" height="1"/>', ""), "no size"),
    (svg("<g>" * 60 + "</g>" * 60), "nests"),
    (svg('<rect width="1" height="1"/>' * 5001), "elements"),
])
def test_broken_svg_logos_are_named(tmp_path, content, says):
    assert says in refused_logo(tmp_path, "logo.svg", content)


def test_an_image_embedded_in_an_svg_is_checked_like_a_logo_file(tmp_path):
    bomb = base64.b64encode(png(30000, 30000, rows=b"")).decode()
    content = svg(f'<image href="data:image/png;base64,{bomb}" width="40" height="20"/>')
    assert "30,000 x 30,000 pixels" in refused_logo(tmp_path, "logo.svg", content)
    broken = base64.b64encode(png(40, 20)[:50]).decode()
    content = svg(f'<image href="data:image/png;base64,{broken}" width="40" height="20"/>')
    assert "truncated" in refused_logo(tmp_path, "logo.svg", content)
    assert "base64" in refused_logo(tmp_path, "logo.svg", svg('<image href="data:image/png;base64,@@@"/>'))


def test_an_svg_referring_to_a_fifo_returns_promptly_and_is_refused(tmp_path):
    os.mkfifo(tmp_path / "pipe.png")
    assert "outside the SVG" in refused_logo(tmp_path, "logo.svg", svg('<image href="pipe.png" width="4" height="2"/>'))


def test_a_file_beside_the_logo_is_never_read(tmp_path):
    secret = png(4, 2, rows=(b"\x00" + b"\x12\x34\x56\xff" * 4) * 2)
    (tmp_path / "secret.png").write_bytes(secret)
    for href in ("secret.png", "./secret.png", f"file://{tmp_path / 'secret.png'}", str(tmp_path / "secret.png")):
        assert "outside the SVG" in refused_logo(tmp_path, "logo.svg",
                                                 svg(f'<image href="{href}" width="40" height="20"/>'))


# --- good logos still work ----------------------------------------------------------------------------


@pytest.mark.parametrize("body, canvas", [
    ('<rect width="40" height="20" fill="#246"/>', 'width="40" height="20"'),
    ('<defs><linearGradient id="g"><stop offset="0" stop-color="#123"/></linearGradient></defs>'
     '<rect width="40" height="20" fill="url(#g)" style="stroke: url(\'#g\')"/>', 'viewBox="0 0 40 20"'),
    ('<defs><rect id="a" width="4" height="2"/><g id="b"><use href="#a"/><use xlink:href="#a" x="5"/></g>'
     '<g id="c"><use href="#b"/><use href="#b" y="5"/></g></defs><use href="#c"/>', 'width="40mm" height="20mm"'),
    (f'<image href="data:image/png;base64,{base64.b64encode(png(4, 2)).decode()}" width="40" height="20"/>',
     'width="100%" height="100%" viewBox="0 0 40 20"'),
    ('<defs><filter id="f"><feGaussianBlur stdDeviation="1"/></filter></defs>'
     '<rect width="40" height="20" filter="url(#f)"/>', 'width="40" height="20"'),
])
def test_good_svg_logos_load_and_print(tmp_path, body, canvas):
    (tmp_path / "logo.svg").write_text(svg(body, canvas))
    style, problems = load(tmp_path, 'logo = "logo.svg"\n')
    assert problems == [], problems
    assert drawn_logo(style).startswith(b"\x89PNG")
    card = card_of("demo_trainer", style)
    assert [op.png for op in card.pages[0].ops if isinstance(op, Image)] == [drawn_logo(style)]


def test_drawing_uses_the_logo_checked_at_load_time(tmp_path):
    (tmp_path / "logo.png").write_bytes(png(40, 20))
    style, _ = load(tmp_path, 'logo = "logo.png"\n')
    (tmp_path / "logo.png").write_bytes(b"broken after the style was loaded")
    card = card_of("demo_trainer", style)
    assert [op.png for op in card.pages[0].ops if isinstance(op, Image)] == [drawn_logo(style)]


def test_logo_png_still_serves_callers_and_styles_compare_without_the_bytes(tmp_path):
    (tmp_path / "logo.png").write_bytes(png(40, 20))
    assert logo_png(tmp_path / "logo.png").startswith(b"\x89PNG") and logo_png(None) is None
    (tmp_path / "bad.png").write_bytes(b"nope")
    with pytest.raises(LogoProblem, match="not a PNG"):
        logo_png(tmp_path / "bad.png")
    style, _ = load(tmp_path, 'logo = "logo.png"\n')
    assert style.logo_bytes and style == CardStyle(logo=tmp_path.resolve() / "logo.png")
