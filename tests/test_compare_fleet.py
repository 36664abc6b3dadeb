"""A card knows the weight it was made for and what its figures come from; compare leads with what matters; a
registration two profiles share is named, never compared silently. Every aircraft here is invented."""

import shutil
import unicodedata

import pytest
from conftest import SAMPLES, checked
from test_printed_limits import TOURER

from kneeboard import registrations
from kneeboard.card.data import read_card_data
from kneeboard.card.ops import HIGHER_IS_WORSE, LOWER_IS_WORSE, Figure
from kneeboard.cli import main
from kneeboard.compare import compare_figures, summary
from kneeboard.pipeline import Overrides, prepare_text


def run(capsys, *args):
    code = main([str(a) for a in args])
    out, err = capsys.readouterr()
    return code, out, err


@pytest.fixture
def trainer(tmp_path):
    path = tmp_path / "trn.toml"
    shutil.copy(SAMPLES / "demo_trainer.toml", path)
    return path


def test_a_card_made_for_another_weight_has_its_own_fingerprint_and_records_that_weight(capsys, trainer, tmp_path):
    from card_helpers import default_style

    text = trainer.read_text(encoding="utf-8")
    own = prepare_text(text, default_style())
    heavy = prepare_text(text, default_style(), Overrides(weight="1985 lb"))
    assert heavy.fingerprint != own.fingerprint
    # the same weight written into the file is the same card's data, but a different file: its own fingerprint
    assert prepare_text(text, default_style(), Overrides(weight="1985 lb")).fingerprint == heavy.fingerprint
    card = tmp_path / "heavy.pdf"
    assert run(capsys, "card", trainer, "--weight", "1985 lb", "-o", card)[0] == 0
    [data] = read_card_data(card.read_bytes())
    assert data["weight_given"] == "1985 lb" and data["fingerprint"] == heavy.fingerprint
    assert data["card_weight"] == "1985 lb"


def test_compare_makes_the_card_again_at_its_own_weight_and_says_so(capsys, trainer, tmp_path):
    card = tmp_path / "heavy.pdf"
    run(capsys, "card", trainer, "--weight", "1985 lb", "-o", card)
    # it once called this card out of date with the profile unchanged, nudging toward a lighter card
    code, out, _ = run(capsys, "compare", card, trainer)
    assert code == 0
    assert "current at 1985 lb, the weight the card was made for: every printed figure reads the same" in out
    code, out, _ = run(capsys, "compare", card, trainer, "--weight", "1560 lb")
    assert code == 1 and "OUT OF DATE at 1560 lb (--weight)" in out
    assert "  card weight: 1985 lb -> 1560 lb" in out.splitlines()


def test_compare_leads_with_a_summary_of_what_leaves_less_room(capsys, trainer, tmp_path):
    card = tmp_path / "trn.pdf"
    run(capsys, "card", trainer, "-o", card)
    trainer.write_text(trainer.read_text(encoding="utf-8").replace('total = "1560 lb"', 'total = "1582 lb"'))
    code, out, _ = run(capsys, "compare", card, trainer)
    lines = out.splitlines()
    assert code == 1 and "OUT OF DATE" in lines[0]
    assert lines[1].startswith("  summary: largest loss of margin 1 kt (")
    assert lines[2] == "  card weight: 1560 lb -> 1582 lb"  # the full list follows


def figure(label, text, worse=None, past=False):
    return Figure(label, text, worse, past_limit=past)


def test_the_summary_names_the_largest_loss_new_no_margin_and_past_limit_cells_and_lower_limits():
    before = {f.label: f for f in (
        figure("Flaps up · 30° · margin", "12 kt", LOWER_IS_WORSE),
        figure("Flaps up · 45° · margin", "7 kt", LOWER_IS_WORSE),
        figure("Flaps up · 60° · margin", "2 kt", LOWER_IS_WORSE),
        figure("Flaps 30 · zero-margin bank", "58°", LOWER_IS_WORSE),
        figure("Flaps 30 · 2.5 g · stall speed", "66 kt", HIGHER_IS_WORSE),
        figure("maneuvering speed VA", "97 kt"),  # untagged by its block: still a limit
        figure("Flaps 30 · flap limit speed VFE", "85 kt"),
        figure("turn radius", "900 ft"),
    )}
    after = dict(before) | {f.label: f for f in (
        figure("Flaps up · 30° · margin", "10 kt", LOWER_IS_WORSE),
        figure("Flaps up · 45° · margin", "3 kt", LOWER_IS_WORSE),
        figure("Flaps up · 60° · margin", "-1 kt", LOWER_IS_WORSE),
        figure("Flaps 30 · zero-margin bank", "≥60°", LOWER_IS_WORSE, past=True),
        figure("Flaps 30 · 2.5 g · stall speed", "66 kt", HIGHER_IS_WORSE, past=True),
        figure("maneuvering speed VA", "95 kt"),
        figure("turn radius", "950 ft"),
    )}
    changes = compare_figures(before, after)
    s = summary(changes)
    assert s.margin_loss[0] == 4 and s.margin_loss[2].label == "Flaps up · 45° · margin"
    assert [c.label for c in s.no_margin] == ["Flaps up · 60° · margin"]
    assert [c.label for c in s.past_limit] == ["Flaps 30 · zero-margin bank", "Flaps 30 · 2.5 g · stall speed"]
    assert [c.label for c in s.lower_limits] == ["maneuvering speed VA"]
    line = s.line()
    assert line.startswith("largest loss of margin 4 kt (Flaps up · 45° · margin: 7 kt -> 3 kt)")
    assert "less room: maneuvering speed VA 97 kt -> 95 kt" in line
    # the same text, newly past the limit, is listed; a lower VA and a bank that reached its limit leave less room
    assert {c.label: c.worse for c in changes} == {
        "Flaps up · 30° · margin": True, "Flaps up · 45° · margin": True, "Flaps up · 60° · margin": True,
        "Flaps 30 · zero-margin bank": True, "Flaps 30 · 2.5 g · stall speed": True, "maneuvering speed VA": True,
        "turn radius": False}


def test_registrations_are_one_text_form():
    composed, decomposed = "OK-ŘÍZ", unicodedata.normalize("NFD", "ok-říz")
    assert composed != decomposed and registrations.key(composed) == registrations.key(decomposed)
    assert registrations.key(" demo-trn ") == registrations.key("DEMO-TRN")
    assert registrations.key("DEMO-TRN") != registrations.key("DEMO-TRN2")


def test_a_card_finds_its_profile_whatever_form_its_registration_is_typed_in(capsys, tmp_path):
    fleet = tmp_path / "fleet"
    fleet.mkdir()
    text = TOURER.replace('"TEST-LIM"', '"OK-ŘÍZ"')
    (fleet / "riz.toml").write_text(text, encoding="utf-8")
    card = tmp_path / "riz.pdf"
    run(capsys, "card", fleet / "riz.toml", "-o", card)
    (fleet / "riz.toml").write_text(text.replace("OK-ŘÍZ", unicodedata.normalize("NFD", "ok-říz")), encoding="utf-8")
    code, out, _ = run(capsys, "compare", card, fleet)
    assert code == 0 and "current" in out


def test_a_backup_copy_beside_a_profile_is_named_by_check_and_refused_by_compare(capsys, trainer, tmp_path):
    card = tmp_path / "trn.pdf"
    run(capsys, "card", trainer, "-o", card)
    copy = trainer.parent / "trn copy.toml"
    shutil.copy(trainer, copy)
    trainer.write_text(trainer.read_text(encoding="utf-8").replace('total = "1560 lb"', 'total = "1650 lb"'))
    # compare once took the copy (it sorts first) and said "current" for a card 90 lb light
    code, out, err = run(capsys, "compare", card, trainer.parent)
    assert code == 2 and "current" not in out
    assert "DEMO-TRN is the registration of 2 profiles" in err and str(copy) in err and str(trainer) in err
    code, out, _ = run(capsys, "check", trainer.parent)
    assert code == 2
    for path, other in ((copy, trainer), (trainer, copy)):
        assert f"{path}: error: aircraft.registration: DEMO-TRN is also the registration of {other}" in out


def test_no_option_name_or_field_path_appears_among_a_cards_warnings():
    # an overweight tourer (invented) made for a weight given on the command line, a flap setting without its limit,
    # a pattern factor under 1.3, an unknown entry, a hot day (45 degC above standard): every warning in plain words
    from card_helpers import default_style

    text = (TOURER.replace('flap_limit_speed = "85 kt"\n', "")
            .replace('name = "Clean"\nstall_speed = "52 kt"', 'name = "Clean"\nstall_speed = "52 kt"\n'
                     'pattern_factor = 1.25\nvne = "150 kt"')
            .replace("[card]", '[card]\ntemperature = "60 degC"'))
    p = prepare_text(text, default_style(), Overrides(weight="1300 kg"))
    assert len(p.table.warnings) >= 5, p.table.warnings
    for line in p.table.warnings:
        assert "--" not in line and "_" not in line and "[" not in line, line
        assert not any(word in line for word in ("configuration.", "aircraft.", "weight.", "card.")), line
    assert any("Card weight 1300 kg is above the maximum weight of 1200 kg" in line for line in p.table.warnings)
    # the command line's own messages keep the field path for the person fixing the file
    assert "--weight (weight)" in {w.path for w in p.warnings}
    assert checked(text).table is not None


def test_the_fingerprint_follows_the_style_choices_that_change_figures_and_no_other():
    from card_helpers import default_style

    text = TOURER
    plain = prepare_text(text, default_style())
    assert plain.fingerprint == checked(text).fingerprint
    banks = default_style().with_changes(bank_angles_deg=(0.0, 30.0, 60.0))
    mph = default_style().with_changes(speed_unit="mph")
    small = default_style().with_changes(size="4x6")
    assert len({plain.fingerprint, prepare_text(text, banks).fingerprint, prepare_text(text, mph).fingerprint}) == 3
    assert prepare_text(text, small).fingerprint == plain.fingerprint  # the card size changes no figure
    # a style writing what the file already says changes nothing
    same = default_style().with_changes(bank_angles_deg=(0.0, 20.0, 45.0, 60.0, 70.0, 80.0))
    assert prepare_text(text.replace("[card]", "[card]\nspeed_unit = \"kt\""), same).fingerprint == \
        prepare_text(text.replace("[card]", "[card]\nspeed_unit = \"kt\""), default_style()).fingerprint
