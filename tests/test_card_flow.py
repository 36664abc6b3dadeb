"""A card for every aircraft at every size: the layout measures before it draws, keeps the style's order over as many
faces as the card needs, repeats a long table's heads, and never refuses a card with the default style.

The aircraft: the five samples and the invented test aircraft of `tests/aircraft/` (four configurations and eight
banks in mph, an aerobatic two-seater, a ballasted flapped glider, an overweight trainer with seven warnings, a
four-flap tourer, and the largest content the profile format allows).
"""

import re
import subprocess
import sys
from functools import cache
from pathlib import Path

import pytest
from card_helpers import MADE_ON, default_style
from conftest import SAMPLES
from hypothesis import given, settings
from hypothesis import strategies as st

from kneeboard.card import LayoutError, blocks, fonts
from kneeboard.card.blocks.caution import face_label
from kneeboard.card.blocks.margin_chart import SHAPES
from kneeboard.card.draw import Context, Piece
from kneeboard.card.geometry import CARD_SIZES, LARGE_CARDS
from kneeboard.card.layout import block_order
from kneeboard.card.ops import FIGURE, Circle, Text
from kneeboard.card.ops import Path as PathOp
from kneeboard.inputs.profiles import read_source
from kneeboard.pipeline import Overrides, make_card, prepare

AIRCRAFT = Path(__file__).parent / "aircraft"
PROFILES = sorted(SAMPLES.glob("*.toml")) + sorted(AIRCRAFT.glob("*.toml"))
SCALES = (0.7, 1.0, 1.6)  #: both ends of the documented font_scale range, and the default
ALL_SIZES = [(size, landscape) for size in CARD_SIZES for landscape in (False, True)]


@cache
def prepared(path: Path, size: str = "a5", landscape: bool = False, scale: float = 1.0, front=None):
    style = default_style().with_changes(size=size, landscape=landscape, font_scale=scale, front=front)
    p = prepare(read_source(path), style, Overrides())
    assert p.table is not None, p.errors
    return p


@cache
def card(path: Path, size: str = "a5", landscape: bool = False, scale: float = 1.0, front=None):
    return make_card(prepared(path, size, landscape, scale, front), MADE_ON)


def shown_blocks(c) -> list[str]:
    """The blocks in the order the card prints them, each once (a block broken over faces counted once)."""
    order = []
    for page in c.pages:
        for name in page.blocks:
            if name not in ("back-header", "caution") and (not order or order[-1] != name):
                order.append(name)
    return order


def footer_text(page) -> str:
    return " ".join(op.text for op in page.ops if isinstance(op, Text))


@pytest.mark.parametrize("path", PROFILES, ids=lambda p: p.stem)
def test_every_aircraft_makes_a_legible_card_at_every_size_orientation_and_type_size(path):
    for size, landscape in ALL_SIZES:
        for scale in SCALES:
            c = card(path, size, landscape, scale)  # never a LayoutError with the default style
            t = c.table
            floor = 10.0 if size in LARGE_CARDS else 8.0
            faces = len(c.pages)
            assert c.layout.faces == faces and c.layout.cards == (faces + 1) // 2
            for number, page in enumerate(c.pages, start=1):
                for op in page.ops:
                    if isinstance(op, Text):
                        assert op.size >= 7.0 - 1e-9, (size, landscape, scale, op)
                        if op.role == FIGURE:
                            assert op.size >= floor - 1e-9, (size, landscape, scale, op)
                assert page.blocks[-1] == "caution"
                # every face names its aircraft, its weight, its fingerprint, which face it is, and the caution
                text = footer_text(page)
                assert t.registration in text and f"{t.weight.text} {t.weight_unit}" in text
                assert c.fingerprint in text and "CAUTION." in text
                assert face_label(number, faces) in text
            # the style's order, and every block that has something to show, each once
            front, back = block_order(default_style())
            expected = [b for b in front + back if blocks.get(b).applies(t)]
            assert shown_blocks(c) == expected, (size, landscape, scale)


@pytest.mark.parametrize("path", PROFILES, ids=lambda p: p.stem)
def test_a_smaller_type_size_never_takes_more_cards(path):
    for size, landscape in ALL_SIZES:
        cards = [card(path, size, landscape, scale).layout.cards for scale in SCALES]
        assert cards == sorted(cards), (size, landscape, cards)
        # the type is the largest the fewest cards allow: the card at 1.6 is no smaller than the one at 0.7
        scales = [card(path, size, landscape, scale).layout.scale for scale in SCALES]
        assert scales[0] <= scales[1] + 1e-9 and scales[1] <= scales[2] + 1e-9 or cards[0] < cards[2]


ORDERS = [
    ("header", "margin-chart", "margin-table", "limits", "turns"),  # the chart before the limits
    ("header", "notes", "limits", "margin-table", "pull", "margin-chart"),
    ("margin-table", "turns", "header", "limits"),  # the header is always the top of the first face
]


@pytest.mark.parametrize("front", ORDERS)
@pytest.mark.parametrize("size, landscape", [("a5", False), ("a5", True), ("4x6", False), ("5x8", True)])
def test_the_styles_order_is_kept_whatever_fits(front, size, landscape):
    for path in (SAMPLES / "demo_tourer.toml", AIRCRAFT / "six_seat_mph.toml"):
        c = card(path, size, landscape, 1.0, front)
        expected = [b for b in front if blocks.get(b).applies(c.table)]
        if "header" in expected:
            expected.remove("header")
            expected.insert(0, "header")
        assert shown_blocks(c) == expected


def test_the_back_list_begins_on_a_back_face():
    style = default_style().with_changes(front=("header", "margin-table"), back=("notes", "limits"))
    c = make_card(prepare(read_source(SAMPLES / "demo_tourer.toml"), style, Overrides()), MADE_ON)
    assert c.pages[0].blocks == ("header", "margin-table", "caution")
    assert c.pages[1].blocks == ("back-header", "notes", "limits", "caution")


def test_a_table_taller_than_a_face_continues_with_its_heads_repeated():
    extreme = AIRCRAFT / "extreme.toml"  # 12 configurations, 24 banks
    c = card(extreme, "4x6", False)
    holding = [page for page in c.pages if "margin-table" in page.blocks]
    assert len(holding) >= 2
    for page in holding:  # each piece of the table carries its bank and load heads and its banks
        texts = [op.text for op in page.ops if isinstance(op, Text)]
        assert "bank" in texts and "load" in texts and "stall" in texts and "margin" in texts
    # every configuration and every bank row is printed, each row of each configuration once
    figures = c.figures()
    for cfg in c.table.configurations:
        for row in cfg.rows:
            assert f"{cfg.name} · {row.bank_text}° · margin" in figures
    # a later piece of a block with a title says it continues
    titles = [op.text for page in c.pages for op in page.ops if isinstance(op, Text)]
    assert any(t.endswith("(continued)") for t in titles)


def test_a_table_too_wide_for_its_column_breaks_into_groups_of_configurations():
    c = card(AIRCRAFT / "extreme.toml", "4x6", False)
    groups = []
    for page in c.pages:
        for name, part in zip(page.blocks, page.parts):
            if name == "margin-table":
                names = {f.label.split(" · ")[0] for op in part.ops if isinstance(op, Text) for f in op.figures
                         if f.label.endswith("margin")}
                groups.append(names)
    assert len(groups) >= 2 and all(len(g) < 12 for g in groups)
    assert set().union(*groups) == {cfg.name for cfg in c.table.configurations}


def test_each_piece_is_drawn_exactly_as_tall_as_it_was_measured():
    for path in PROFILES:
        p = prepared(path)
        for scale in (0.667, 1.0, 1.4):
            for width in (254.0, 395.0):
                for split in (False, True):
                    ctx = Context(p.table, p.style, scale, "ABCDEF12", MADE_ON, None, split)
                    for name in blocks.names():
                        spec = blocks.get(name)
                        if not spec.applies(p.table):
                            continue
                        try:
                            plan = spec.planned(ctx, width)
                        except Exception:  # too wide at this size: the layout tries another
                            continue
                        m = plan.measure
                        pieces = Piece.whole(m)
                        for s, section in enumerate(m.sections):
                            n = len(section.rows)
                            if n >= 3:
                                pieces += [Piece(s, 0, 1, lead=True), Piece(s, 1, n - 1, again=True),
                                           Piece(s, n - 1, n, again=True, foot=True)]
                            if section.grow:  # a chart given part of the room it would grow into
                                pieces.append(Piece(s, lead=s == 0, foot=True, extra=section.grow / 2))
                        for piece in pieces:
                            assert plan.draw(piece).height == pytest.approx(piece.height(m), abs=1e-9), (name, piece)


def test_a_cap_on_faces_names_what_is_left_out_and_what_would_fit():
    style = default_style().with_changes(size="4x6", landscape=True, max_faces=2)
    with pytest.raises(LayoutError) as err:
        make_card(prepare(read_source(SAMPLES / "demo_tourer.toml"), style, Overrides()), MADE_ON)
    message = str(err.value)
    assert "allows 2" in message and "larger card size" in message and "fewer bank angles" in message
    assert err.value.left_out and all(b in message for b in err.value.left_out)


def test_the_style_key_max_faces_is_read_and_checked(tmp_path):
    from kneeboard.inputs.styles import load_style

    (tmp_path / "ok.style.toml").write_text("max_faces = 4\n")
    style, problems = load_style(tmp_path / "ok.style.toml")
    assert problems == [] and style.max_faces == 4
    for bad in ("0", "25", "2.5", "true", '"two"'):
        (tmp_path / "bad.style.toml").write_text(f"max_faces = {bad}\n")
        style, problems = load_style(tmp_path / "bad.style.toml")
        assert style is None and [p.path for p in problems] == ["max_faces"]


# --- lines that never break badly -----------------------------------------------------------------------------

UNITS = sorted(fonts.UNIT_WORDS - {"x"})


@settings(max_examples=300, derandomize=True, deadline=None)
@given(st.lists(st.one_of(st.sampled_from(["bank", "at", "the", "pattern", "Flaps", "speed", "gear", "down,"]),
                          st.integers(0, 9999).map(str), st.sampled_from(UNITS)), min_size=1, max_size=14),
       st.floats(20, 200))
def test_a_line_never_parts_a_number_from_its_unit(words, width):
    lines = fonts.wrap(" ".join(words), fonts.REGULAR, 8.0, width)
    for before, after in zip(lines, lines[1:]):
        last, first = before.split()[-1], after.split()[0]
        if re.fullmatch(r"\d+", last) and first in UNITS:
            # only when the number and its units together are wider than a line
            group = " ".join([last, first])
            assert fonts.width(group, fonts.REGULAR, 8.0) > width, (before, after)


def test_a_configurations_name_breaks_only_at_a_space_and_only_when_it_must():
    from kneeboard.card.draw import fit_lines

    name = "Gear down, flaps 15"
    one = fit_lines("t", name, fonts.BOLD, 9.0, fonts.width(name, fonts.BOLD, 9.0) + 1, 3)
    assert one == [name]
    two = fit_lines("t", name, fonts.BOLD, 9.0, fonts.width("Gear down, flaps", fonts.BOLD, 9.0) + 1, 3)
    assert two == ["Gear down,", "flaps 15"]  # the number stays with its word
    assert " ".join(two) == name


# --- the chart --------------------------------------------------------------------------------------------------


def _marker_boxes(part):
    boxes = []
    for op in part.ops:
        if type(op) is Circle and op.r > 1.5:
            boxes.append((op.x - op.r, op.y - op.r, op.x + op.r, op.y + op.r))
        elif type(op) is PathOp and op.closed and op.fill is not None and op.color is not None:
            xs, ys = [x for x, _ in op.points], [y for _, y in op.points]
            boxes.append((min(xs), min(ys), max(xs), max(ys)))
    return boxes


@pytest.mark.parametrize("path", PROFILES, ids=lambda p: p.stem)
def test_no_chart_marker_touches_another(path):
    for size, landscape in ALL_SIZES:
        c = card(path, size, landscape)
        for page in c.pages:
            for name, part in zip(page.blocks, page.parts):
                if name != "margin-chart":
                    continue
                boxes = _marker_boxes(part)
                plot = [b for b in boxes if b[1] > min(bb[1] for bb in boxes) - 1]  # markers and legend swatches
                for i, a in enumerate(plot):
                    for b in plot[i + 1:]:
                        overlap = a[0] < b[2] and b[0] < a[2] and a[1] < b[3] and b[1] < a[3]
                        assert not overlap, (size, landscape, a, b)


def test_more_configurations_than_marker_shapes_make_another_chart():
    c = card(AIRCRAFT / "extreme.toml", "a5")
    charts = [part for page in c.pages for name, part in zip(page.blocks, page.parts) if name == "margin-chart"]
    assert len(charts) == -(-len(c.table.configurations) // len(SHAPES))


# --- through the command line and the app -------------------------------------------------------------------


@pytest.mark.parametrize("size, landscape", ALL_SIZES)
def test_the_command_line_makes_every_card_and_says_how_many_faces(tmp_path, size, landscape):
    out = tmp_path / "cards.pdf"
    args = [sys.executable, "-m", "kneeboard", "card", str(SAMPLES), str(AIRCRAFT), "--size", size, "-o", str(out)]
    run = subprocess.run(args + (["--landscape"] if landscape else []), capture_output=True, text=True)
    assert run.returncode == 0, run.stderr
    lines = re.findall(r"^(\S+): (\d+) cards? \((\d+) faces?\)$", run.stdout, re.M)
    assert len(lines) == len(PROFILES)
    for _registration, cards, faces in lines:
        assert int(cards) == (int(faces) + 1) // 2


def test_the_command_line_names_the_blocks_a_capped_style_leaves_out(tmp_path):
    style = tmp_path / "capped.style.toml"
    style.write_text('size = "4x6"\norientation = "landscape"\nmax_faces = 1\n')
    run = subprocess.run([sys.executable, "-m", "kneeboard", "card", str(SAMPLES / "demo_tourer.toml"), "--style",
                          str(style), "-o", str(tmp_path / "c.pdf")], capture_output=True, text=True)
    assert run.returncode == 2 and "Left out:" in run.stderr and "max_faces" in run.stderr
    assert not (tmp_path / "c.pdf").exists()


# --- aircraft no test has seen --------------------------------------------------------------------------------

WORDS = ("Gear", "down,", "flaps", "up", "Flaps", "landing", "clean", "Wheels", "floats", "brakes", "out",
         "take-off", "approach", "Ferry", "tanks", "full", "Schleppkupplung", "Landeklappen", "Vztlakové", "klapky")


@st.composite
def invented_profiles(draw):
    """A profile within the file format's limits: 1 to 12 configurations with names of up to 24 characters, 1 to 24
    banks from 0 to 85 degrees, 1 to 6 turn-back headings, a registration of up to 16 characters, notes of up to
    600 characters (invented, for the layout only)."""
    n = draw(st.integers(1, 12))
    stall = draw(st.integers(35, 70))
    names = []
    for k in range(n):
        name = " ".join(draw(st.lists(st.sampled_from(WORDS), min_size=1, max_size=4)))[:20].strip() + f" {k}"
        names.append(name)
    configurations = "".join(
        f'[[configuration]]\nname = "{name}"\nstall_speed = "{stall - k % 5} kt"\n'
        + (f'flap_limit_speed = "{2 * stall} kt"\nextended = "flaps"\n' if k else "")
        for k, name in enumerate(names))
    banks = sorted(draw(st.sets(st.integers(0, 85), min_size=1, max_size=24)))
    headings = sorted(draw(st.sets(st.integers(10, 360), min_size=1, max_size=6)))
    registration = draw(st.text("ABCDEFGHIJKLMNOPQRSTUVWXYZW0123456789-", min_size=2, max_size=16))
    notes = " ".join(draw(st.lists(st.sampled_from(WORDS + ("https://example.invalid/" + "x" * 60,)),
                                   max_size=80)))[:600]
    glide = f'best_glide_speed = "{stall + 20} kt"\nglide_ratio = 9\n' if draw(st.booleans()) else ""
    return (f'schema = 1\n[aircraft]\nregistration = "{registration}"\nmodel = "Invented test aircraft"\n'
            f'category = "{draw(st.sampled_from(["normal", "utility", "acrobatic"]))}"\nmax_weight = "1200 kg"\n'
            f'maneuvering_speed = "{2 * stall} kt"\n{glide}\n{configurations}\n[card]\nbank_angles = {banks}\n'
            f'buffer = "{draw(st.integers(0, 15))} kt"\nturn_back_degrees = {headings}\nnotes = """{notes}"""\n')


@settings(max_examples=25, derandomize=True, deadline=None)
@given(invented_profiles(), st.sampled_from(ALL_SIZES), st.sampled_from(SCALES))
def test_an_aircraft_no_test_has_seen_makes_a_card_at_any_size(text, size, scale):
    from kneeboard.pipeline import prepare_text

    style = default_style().with_changes(size=size[0], landscape=size[1], font_scale=scale)
    p = prepare_text(text, style, Overrides())
    assert p.table is not None, [str(e) for e in p.errors]
    c = make_card(p, MADE_ON)  # never a LayoutError with the default style
    floor = 10.0 if size[0] in LARGE_CARDS else 8.0
    for page in c.pages:
        assert page.blocks[-1] == "caution"
        for op in page.ops:
            if isinstance(op, Text) and op.role == FIGURE:
                assert op.size >= floor - 1e-9
