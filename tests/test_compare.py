"""Compare two cards: exactly the printed figures whose text changed, old and new, read from the laid-out cards."""

import math
from functools import cache

import pytest
from card_helpers import card_from_text, card_of
from conftest import SAMPLES

from kneeboard.card.ops import HIGHER_IS_WORSE, LOWER_IS_WORSE
from kneeboard.compare import Change, compare, printed_figures
from kneeboard.tables import LIMIT_MARK, STALL

NAMES = ("demo_trainer", "demo_tourer", "demo_retractable", "demo_microlight", "demo_glider")


@cache
def card(name: str, **overrides):
    return card_of(name, **overrides)


def expected_count(table) -> int:
    """How many figures the default card prints, counted from the table itself rather than from the labels."""
    top = 8 + (table.maneuvering_speed is not None) + table.over_max_weight
    n = top
    for c in table.configurations:
        n += 5 + (c.buffer_bank is not None) + (c.flap_limit_speed is not None)  # with its limit g and bank
        for r in c.rows:
            n += 2
            if r.state != STALL and r.turn_radius is not None:
                n += 2
    n += len(table.configurations[0].rows)  # the load factor of each bank, printed once for every configuration
    n += sum(1 + len(c.stall_at_load) for c in table.configurations)  # the pull block
    if table.turn_back is not None:
        n += 3 + len(table.turn_back.rows) * (2 + len(table.turn_back.headings))
    if table.glider is not None:
        n += 2 + 5 * sum(r.turn_radius is not None for r in table.glider.rows)
    return n


def test_trainer_labels_and_texts_as_printed():
    figures = printed_figures(card("demo_trainer"))
    # Each expected text computed here from the invented trainer's file (48 kt flaps up at 1,650 lb, flown at
    # 1,560 lb; factor 1.4; VA 97 kt; utility; 800 ft standard day; buffer 5 kt), never read from the program:
    k = math.sqrt(1560 / 1650)  # stall speed and VA with weight: FAA-H-8083-25 (from memory)
    vs, vp_exact = 48 * k, 1.4 * 48 * k  # 46.67 kt; pattern 1.4 VS0 (FAA-H-8083-3 ch. 9)
    vp = math.ceil(vp_exact)  # 66: speeds round up, margins and banks down (the card's rule)
    n30 = 1 / math.cos(math.radians(30))  # FAA-H-8083-25 load factor chart: 1.154
    assert figures["card weight"] == "1560 lb"
    assert figures["limit load factor"] == "4.4 g"  # utility: 14 CFR 23.337 before amendment 23-64
    assert figures["limit bank"] == f"{math.floor(math.degrees(math.acos(1 / 4.4)))}°" == "76°"
    assert figures["maneuvering speed VA"] == f"{math.floor(97 * k)} kt" == "94 kt"
    assert figures["density altitude"] == "800 ft"  # a standard day: density altitude is the pressure altitude
    assert figures["Flaps up · stall speed"] == f"{math.ceil(vs)} kt" == "47 kt"
    assert figures["Flaps up · pattern speed"] == f"{vp} kt" == "66 kt"
    # banks where Vs sqrt(n) reaches the pattern speed less the buffer, and the pattern speed: arccos((Vs / V)^2)
    assert figures["Flaps up · buffer bank"] == f"{math.floor(math.degrees(math.acos((vs / (vp - 5)) ** 2)))}°"
    assert figures["Flaps up · zero-margin bank"] == f"{math.floor(math.degrees(math.acos((vs / vp) ** 2)))}°"
    assert figures["Flaps full · flap limit speed VFE"] == "85 kt"
    assert "Flaps up · flap limit speed VFE" not in figures  # None: not printed
    assert figures["30° · load factor"] == f"{math.ceil(n30 * 100) / 100:.2f} g" == "1.16 g"
    stall30 = math.ceil(vs * math.sqrt(n30))  # FAA-H-8083-25, "Load Factors and Stalling Speeds"
    assert figures["Flaps up · 30° · stall speed"] == f"{stall30} kt"
    assert figures["Flaps up · 30° · margin"] == f"{vp - stall30} kt"
    # R = V^2 / (g tan bank) at the true airspeed (FAA-H-8083-25, "Radius of Turn"): TAS = CAS sqrt(rho0 / rho)
    # at low speed, rho of the 1976 standard atmosphere at 800 ft; within 0.1 % of the compressible form
    rho_ratio = (1 - 0.0065 * 800 * 0.3048 / 288.15) ** 4.2559
    tas = vp_exact * 1852 / 3600 / math.sqrt(rho_ratio)
    radius = tas**2 / (9.80665 * math.tan(math.radians(30)))
    printed_radius = int(figures["Flaps up · 30° · turn radius"].removesuffix(" ft"))
    assert radius / 0.3048 <= printed_radius <= radius / 0.3048 * 1.001 + 1  # rounded up
    t180, t360 = math.pi * radius / tas, 2 * math.pi * radius / tas
    assert figures["Flaps up · 30° · 180°/360° time"] == f"{math.ceil(t180)}/{math.ceil(t360)} s"
    # 60 degrees: Vs sqrt(2) = 66.004 kt prints 67, one above the pattern speed: no margin (common practice:
    # 1.4 Vs leaves none at 60 degrees)
    assert figures["Flaps up · 60° · margin"] == f"{vp - math.ceil(vs * math.sqrt(2))} kt" == "-1 kt"
    assert "Flaps up · 60° · turn radius" not in figures
    assert "Flaps up · 0° · turn radius" not in figures
    labels = list(figures)
    # print order: the header, the margin table row by row, then the limits block's summary
    in_order = ("card weight", "Flaps up · 0° · stall speed", "Flaps full · 0° · stall speed",
                "Flaps up · 10° · stall speed", "Flaps up · stall speed")
    order = [labels.index(label) for label in in_order]
    assert order == sorted(order)


def test_glider_circling_rows():
    c = card("demo_glider")
    table = c.table
    figures = printed_figures(c)
    row = next(r for r in table.glider.rows if r.bank_text == "30")
    assert figures["circling · 30° · speed"] == f"{row.speed.text} km/h"
    assert figures["circling · 30° · sink rate"] == f"{row.sink_rate.text} {table.sink_unit}"
    assert figures["circling · 30° · turn radius"] == f"{row.turn_radius.text} m"
    assert figures["circling · 30° · circle time"] == f"{row.circle_time.text} s"
    assert figures["circling · 30° · 180° height loss"] == f"{row.height_loss_180.text} m"
    assert figures["circling · straight · speed"] == f"{table.glider.min_sink_speed.text} km/h"
    assert "circling · 0° · speed" not in figures  # the card's circling table starts above 0 bank


@pytest.mark.parametrize("name", NAMES)
def test_every_figure_has_its_own_label(name):
    c = card(name)
    figures = printed_figures(c)
    assert len(figures) == expected_count(c.table)  # no figure overwrote another
    # a figure is a number, or a limit printed in the place of a bank at or past it ("≥60°")
    assert all(text and text[0] in "-0123456789" + LIMIT_MARK for text in figures.values())


@pytest.mark.parametrize("name", NAMES)
def test_a_figure_printed_twice_reads_the_same_both_times(name):
    seen = {}
    for page in card(name).pages:
        for f in page.figures():
            assert seen.setdefault(f.label, f) == f, f  # the limits block and the chart agree with the table


def test_a_configuration_named_like_the_circling_prefix_loses_no_figure():
    text = (SAMPLES / "demo_glider.toml").read_text(encoding="utf-8").replace('name = "Clean"', 'name = "circling"')
    c = card_from_text(text)
    assert len(c.figures()) == expected_count(c.table)


@pytest.mark.parametrize("name", NAMES)
def test_identical_cards_give_no_changes(name):
    assert compare(card(name), card_of(name)) == []


def row_figures(table, config, row) -> dict[str, str]:
    """The figures of one margin-table row as the card prints them, read straight from the row."""
    su, du = table.speed_unit, table.distance_unit
    at = f"{config.name} · {row.bank_text}° · "
    out = {at + "load factor": f"{row.load_factor.text} g", at + "stall speed": f"{row.stall_speed.text} {su}",
           at + "margin": f"{row.margin.text} {su}"}
    if row.state != STALL and row.turn_radius is not None:  # the turns table prints a dash when stalled
        out[at + "turn radius"] = f"{row.turn_radius.text} {du}"
        out[at + "180°/360° time"] = f"{row.time_180.text}/{row.time_360.text} s"
    return out


def expected_row_changes(old, new) -> dict[str, tuple[str | None, str | None]]:
    """Label -> (old, new) of every row figure whose printed text differs, for tables with the same banks."""
    out = {}
    for co, cn in zip(old.configurations, new.configurations, strict=True):
        assert co.name == cn.name
        for ro, rn in zip(co.rows, cn.rows, strict=True):
            assert ro.bank_text == rn.bank_text
            a, b = row_figures(old, co, ro), row_figures(new, cn, rn)
            out.update({k: (a.get(k), b.get(k)) for k in a | b if a.get(k) != b.get(k)})
    return out


# The trainer's pattern speeds follow the weight (a factor of the stall speed); the retractable's are fixed,
# so at its maximum weight margins shrink and one configuration loses all margin at 60 degrees.
@pytest.mark.parametrize(("name", "heavier"), [("demo_trainer", "1650 lb"), ("demo_retractable", "3100 lb")])
def test_heavier_weight_lists_exactly_the_changed_figures(name, heavier):
    old_card, new_card = card(name), card(name, weight=heavier)
    old, new = old_card.table, new_card.table
    changes = compare(old_card, new_card)
    by_label = {c.label: c for c in changes}
    assert len(by_label) == len(changes)
    assert (by_label["card weight"].old, by_label["card weight"].new) == (f"{old.weight.text} lb", heavier)

    expected = expected_row_changes(old, new)
    assert any(label.endswith("· stall speed") or label.endswith("· margin") for label in expected)
    row_changes = {c.label: (c.old, c.new) for c in changes if c.label.count(" · ") == 2
                   and c.label.split(" · ")[1].endswith("°") and not c.label.startswith("turn back")}
    assert row_changes == expected

    # load factors depend on bank alone: none may be listed
    assert not [c for c in changes if c.label.endswith("· load factor")]
    # the configuration summary: listed exactly when its printed text moved
    for co, cn in zip(old.configurations, new.configurations):
        assert (f"{cn.name} · stall speed" in by_label) == (co.stall_speed.text != cn.stall_speed.text)
        assert (f"{cn.name} · pattern speed" in by_label) == (co.pattern_speed.text != cn.pattern_speed.text)
        assert (f"{cn.name} · zero-margin bank" in by_label) == (co.zero_margin_bank.text != cn.zero_margin_bank.text)
    assert ("limit load factor" in by_label) is False
    assert ("density altitude" in by_label) is False
    # in the new card's print order, figures no longer printed last
    order = list(printed_figures(new_card))
    kept = [c for c in changes if c.new is not None]
    assert [c.label for c in kept] == sorted((c.label for c in kept), key=order.index)
    assert all(c.new is None for c in changes[len(kept):])


def test_heavier_weight_worse_figures():
    changes = compare(card("demo_trainer"), card("demo_trainer", weight="1650 lb"))
    stalls = [c for c in changes if c.label.endswith("· stall speed")]
    assert stalls and all(c.worse for c in stalls)
    # the pattern speed grows with the stall speed, so the trainer's margins grow: not worse
    assert not [c for c in changes if c.label.endswith("· margin") and c.worse]

    banks = (0, 30, 66)
    before = card("demo_retractable", bank_angles=banks)
    changes = compare(before, card("demo_retractable", bank_angles=banks, weight="3100 lb"))
    margins = [c for c in changes if c.label.endswith("· margin")]
    assert margins and all(c.worse for c in margins)
    old_figures = printed_figures(before)
    stalled = {c.label: c for c in changes}["Gear down, flaps 40 · 66° · margin"]
    # computed here from the invented file: its CAS figures read into IAS linearly through its calibration pairs
    # (54 CAS between [42, 49] and [55, 60]; 76 CAS between [70, 72] and [90, 90]); the stall speed times
    # sqrt(W / 3100 lb) sqrt(1 / cos 66 deg) (FAA-H-8083-25), speeds rounded up, the margin their difference
    vs_ias = 42 + (54 - 49) * (55 - 42) / (60 - 49)
    vp = math.ceil(70 + (76 - 72) * (90 - 70) / (90 - 72))
    n66 = 1 / math.cos(math.radians(66))
    margins = [vp - math.ceil(vs_ias * math.sqrt(w / 3100) * math.sqrt(n66)) for w in (2900, 3100)]
    assert (stalled.old, stalled.new) == tuple(f"{m} kt" for m in margins) == ("2 kt", "-1 kt")
    assert stalled.worse
    # stalled now: the turns table prints a dash, so its turn figures are no longer printed
    radius = "Gear down, flaps 40 · 66° · turn radius"
    assert Change(radius, old_figures[radius], None) in changes


def test_other_banks_add_and_remove_rows():
    old_card = card("demo_trainer")  # banks 0, 10, 20, 30, 40, 45, 50, 60
    new_card = card("demo_trainer", bank_angles=(0, 15, 30, 45))
    new = new_card.table
    changes = compare(old_card, new_card)
    added = [c for c in changes if c.old is None]
    removed = [c for c in changes if c.new is None]
    def bank(label):
        return next(part for part in label.split(" · ") if part.endswith("°"))

    assert {bank(c.label) for c in added} == {"15°"}
    assert {bank(c.label) for c in removed} == {"10°", "20°", "40°", "50°", "60°"}
    # rows kept at the same weight print the same figures: nothing else is listed
    assert len(changes) == len(added) + len(removed)
    # removed figures come last, in the old card's order
    assert changes[len(changes) - len(removed):] == removed
    old_order = list(printed_figures(old_card))
    assert [c.label for c in removed] == sorted((c.label for c in removed), key=old_order.index)
    assert Change("15° · load factor", None, new.configurations[0].rows[1].load_factor.text + " g") in added


def test_worse_is_judged_by_number_unit_and_the_figures_direction():
    lower, higher = LOWER_IS_WORSE, HIGHER_IS_WORSE
    assert Change("margin", "15 kt", "14 kt", lower).worse
    assert not Change("margin", "14 kt", "15 kt", lower).worse
    assert Change("margin", "2 kt", "-1 kt", lower).worse
    assert Change("stall", "47 kt", "48 kt", higher).worse
    assert Change("bank", "59°", "58°", lower).worse
    assert not Change("radius", "671 ft", "700 ft").worse  # a figure with no direction is never judged
    assert not Change("stall", "47 kt", "87 km/h", higher).worse  # another unit: not comparable
    assert not Change("margin", None, "3 kt", lower).worse
    assert not Change("margin", "3 kt", None, lower).worse


def test_every_card_figure_says_which_way_is_worse_where_it_matters():
    figures = card("demo_trainer").figures()
    assert figures["Flaps up · 30° · margin"].worse == LOWER_IS_WORSE
    assert figures["Flaps up · 30° · stall speed"].worse == HIGHER_IS_WORSE
    assert figures["Flaps up · zero-margin bank"].worse == LOWER_IS_WORSE
    assert figures["limit bank"].worse == LOWER_IS_WORSE
    assert figures["Flaps up · 30° · turn radius"].worse is None
