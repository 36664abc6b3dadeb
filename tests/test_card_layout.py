"""Legibility and honesty of the layout: sizes, figures traceable to the table builder, nothing cut."""

import re

import pytest
from card_helpers import MADE_ON, SAMPLE_NAMES, SMALL_CARD, card, card_of, default_style, loaded

from kneeboard.card import LayoutError
from kneeboard.card.blocks import names
from kneeboard.card.geometry import CARD_SIZES, LARGE_CARDS
from kneeboard.card.ops import FIGURE, Rect, Text
from kneeboard.tables import BUFFER, STALL

COMBINATIONS = [(n, s, land) for n in SAMPLE_NAMES for s in CARD_SIZES for land in (False, True)]


def _card_or_error(name, size, landscape):
    try:
        return card(name, size, landscape), None
    except LayoutError as exc:
        return None, exc


@pytest.mark.parametrize("name, size, landscape", COMBINATIONS)
def test_every_sample_is_made_legibly_at_every_size(name, size, landscape):
    c, error = _card_or_error(name, size, landscape)
    assert error is None, f"{name} must be made on a {size} card: {error}"
    floor = 10.0 if size in LARGE_CARDS else 8.0
    assert len(c.pages) >= 1
    if size in LARGE_CARDS:
        assert len(c.pages) <= 2, "the samples fit one A5 or half-letter card, front and back"
    for page in c.pages:
        for op in page.ops:
            if isinstance(op, Text):
                assert op.size >= 7.0 - 1e-9, op
                if op.role == FIGURE:
                    assert op.size >= floor - 1e-9, op
        assert page.blocks[-1] == "caution"


def test_every_sample_fits_a5_and_half_letter_in_both_orientations():
    for name in SAMPLE_NAMES:
        for size in LARGE_CARDS:
            for landscape in (False, True):
                assert _card_or_error(name, size, landscape)[1] is None, (name, size, landscape)


def test_powered_samples_fit_the_smallest_card_with_its_blocks():
    for name in ("demo_trainer", "demo_tourer", "demo_retractable", "demo_microlight"):
        c = card_of(name, default_style().with_changes(size="4x6", front=SMALL_CARD))
        assert "margin-table" in c.pages[0].blocks  # the table a pilot needs first is always on the front
    # with every block a 4x6 card holds them all as a card set, never refused, never cut
    c = card_of("demo_tourer", default_style().with_changes(size="4x6"))
    assert len(c.pages) > 2 and c.layout.cards == (len(c.pages) + 1) // 2
    shown = [b for page in c.pages for b in page.blocks if b not in ("back-header", "caution")]
    assert set(shown) == {b for b in names() if b != "circling"}  # every block the tourer has


def _printed_texts(table):
    texts = set()
    for c in table.configurations:
        for p in (c.stall_speed, c.pattern_speed, c.flap_limit_speed):
            if p is not None:
                texts.add(p.text)
        for p in (c.zero_margin_bank, c.buffer_bank, c.limit_bank):
            if p is not None:
                texts.add(f"{p.text}°")
        texts |= {c.limit_load_factor.text, f"{c.available_load_factor.text} g"}
        texts |= {v.text for _, v in c.stall_at_load}
        for r in c.rows:
            texts |= {r.load_factor.text, r.stall_speed.text, r.margin.text, f"{r.bank_text}°"}
            for p in (r.turn_radius, r.time_180, r.time_360):
                if p is not None:
                    texts.add(p.text)
    if table.turn_back:
        tb = table.turn_back
        texts |= {f"{r.bank_text}°" for r in tb.rows}
        texts |= {p.text for r in tb.rows for p in (r.speed, r.margin, *r.height_loss)}
    if table.glider:
        for r in table.glider.rows:
            texts |= {r.speed.text, r.sink_rate.text, f"{r.bank_text}°"}
            texts |= {p.text for p in (r.turn_radius, r.circle_time, r.height_loss_180) if p is not None}
    return texts


@pytest.mark.parametrize("name", SAMPLE_NAMES)
def test_every_figure_is_the_table_builders_rounded_text(name):
    c = card(name)
    allowed = _printed_texts(c.table)
    figures = [op.text for page in c.pages for op in page.ops if isinstance(op, Text) and op.role == FIGURE]
    assert figures
    for text in figures:
        parts = text.split("/")  # "19/38": the 180 and 360 degree times; "3.8/74°": limit and limit bank
        for part in parts:
            part = part.removesuffix("°") + ("°" if part.endswith("°") else "")
            assert part in allowed, text


@pytest.mark.parametrize("name", SAMPLE_NAMES)
def test_marked_rows_survive_black_and_white(name):
    """Rows beyond the buffer get hatching, rows beyond zero margin a black fill: shape, not colour."""
    c = card(name)
    rects = [op for op in c.pages[0].ops if isinstance(op, Rect)]
    buffer_rows = sum(r.state == BUFFER for cfg in c.table.configurations for r in cfg.rows)
    stall_rows = sum(r.state == STALL for cfg in c.table.configurations for r in cfg.rows)
    hatched = [r for r in rects if r.hatch]
    black = [r for r in rects if r.fill == "#111111" and not r.hatch]
    assert len(hatched) >= buffer_rows + 1  # + the legend swatch
    assert len(black) >= stall_rows + 1


def test_content_moves_to_the_back_then_on_to_more_cards_unless_the_style_caps_the_faces():
    style = default_style()
    one = card_of("demo_tourer", style.with_changes(front=("header", "margin-table")))
    assert len(one.pages) == 1
    two = card_of("demo_tourer", style)
    assert len(two.pages) == 2 and two.pages[1].blocks[0] == "back-header"
    many = tuple(float(b) for b in range(0, 72, 3))
    made = card_of("demo_tourer", style.with_changes(size="4x6"), bank_angles=many)
    assert len(made.pages) > 2
    with pytest.raises(LayoutError) as err:  # the person's own cap: the blocks left out and the choices named
        card_of("demo_tourer", style.with_changes(size="4x6", max_faces=2), bank_angles=many)
    assert set(err.value.left_out) <= set(names()) and err.value.left_out
    message = str(err.value)
    assert "allows 2" in message and f"allow {len(made.pages)} faces" in message and "larger card size" in message
    for block in err.value.left_out:
        assert block in message


def test_style_can_force_a_back_page():
    style = default_style().with_changes(front=("header", "margin-table"), back=("margin-chart", "limits"))
    c = card_of("demo_microlight", style)
    assert [p.blocks for p in c.pages] == [("header", "margin-table", "caution"),
                                          ("back-header", "margin-chart", "limits", "caution")]


def test_blocks_can_be_turned_off_but_not_the_caution():
    lp = loaded("demo_trainer")
    style = default_style().with_changes(front=("margin-table",), back=())
    c = card_of("demo_trainer", style)
    assert c.pages[0].blocks == ("margin-table", "caution")
    text = " ".join(op.text for op in c.pages[0].ops if isinstance(op, Text))
    assert lp.profile.aircraft.registration in text  # the footer still names the aircraft


def test_header_shows_weights_date_and_fingerprint():
    c = card("demo_trainer")
    text = " ".join(op.text for op in c.pages[0].ops if isinstance(op, Text))
    assert "1560 lb" in text and "1650 lb" in text
    assert MADE_ON in text and c.fingerprint in text


def test_over_weight_is_shouted():
    c = card_of("demo_trainer", weight="1700 lb")
    text = " ".join(op.text for op in c.pages[0].ops if isinstance(op, Text))
    assert "ABOVE THE MAXIMUM WEIGHT" in text


def test_binding_edge_moves_content_and_marks_holes():
    from kneeboard.card.ops import Circle

    plain = card("demo_microlight")
    bound = card("demo_microlight", binding="left")
    min_x = min(op.x for op in bound.pages[0].ops if isinstance(op, Text) and op.align == "left")
    assert min_x > min(op.x for op in plain.pages[0].ops if isinstance(op, Text) and op.align == "left") + 30
    holes = [op for op in bound.pages[0].ops if isinstance(op, Circle) and op.fill is None and op.r > 5]
    assert len(holes) == 2


def test_chart_marks_zero_margin_and_buffer_banks():
    c = card("demo_trainer")
    chart_texts = {op.text for page in c.pages for op in page.ops if isinstance(op, Text)}
    for cfg in c.table.configurations:
        assert f"{cfg.zero_margin_bank.text}°" in chart_texts
        assert f"pattern {cfg.pattern_speed.text}" in chart_texts
    assert any(re.match(r"stall speed, kt IAS", t) for t in chart_texts)
    assert "bank angle" in chart_texts
