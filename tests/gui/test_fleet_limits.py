"""The app as a person meets item by item: a registration two profiles share is marked on both, and the key
figures show each configuration's own limit beside the aircraft's. The aircraft are invented samples."""

import shutil
from pathlib import Path

from kneeboard import terms
from kneeboard.app.fleet import DUPLICATE
from kneeboard.tables import LIMIT_MARK


def test_the_fleet_list_marks_both_profiles_of_one_registration(qtbot, window, fleet):
    shutil.copy(fleet / "demo_trainer.toml", fleet / "demo_trainer copy.toml")
    window.fleet.reload.click()
    window.fleet.check_all()
    marks = {Path(r[2]).name: r[0] for r in window.fleet.rows()}
    assert marks["demo_trainer.toml"] == marks["demo_trainer copy.toml"] == DUPLICATE
    assert marks["demo_tourer.toml"] == ""
    tips = {Path(item.data(0, 256)).name: item.toolTip(0) for item in window.fleet._items.values()}
    assert "demo_trainer copy.toml" in tips["demo_trainer.toml"] and "DEMO-TRN" in tips["demo_trainer.toml"]
    assert str(fleet / "demo_trainer.toml") in tips["demo_trainer copy.toml"]
    # a changed card style checks the fleet again: the mark stays
    window.fleet.recheck()
    window.fleet.check_all()
    assert {Path(r[2]).name: r[0] for r in window.fleet.rows()}["demo_trainer copy.toml"] == DUPLICATE


def test_the_key_figures_show_each_configurations_limit_and_mark_banks_past_it(qtbot, window, fleet):
    assert window.open_profile(fleet / "demo_tourer.toml")
    qtbot.waitUntil(lambda: window.readout.figures.get(terms.CARD_WEIGHT) == "1067 kg", timeout=10_000)
    figures = window.readout.figures
    # flaps 30 are limited to 2.0 g (14 CFR 23.345, from memory): arccos(1/2) = 60 degrees, beside the 3.8 g wing's
    assert figures[terms.label("Flaps 30", terms.LIMIT_LOAD)] == "2.0 g / 60°"
    assert figures[terms.label("Flaps 0", terms.LIMIT_LOAD)] == "3.8 g / 74°"
    assert figures[terms.label("Flaps 30", terms.ZERO_MARGIN_BANK)] == f"{LIMIT_MARK}60°"
    # the key figures are the card's own limits rows: every one the card tags, the same text
    card = window.session.card(window.doc.loaded)
    for label, text in figures.items():
        if label in card.figures():
            assert card.figures()[label].text == text
    shown = window.readout.label.text()
    assert "limit g / bank" in shown and f"{LIMIT_MARK}: a bank at or past the configuration's own limit bank" in shown


def test_the_apps_compare_makes_a_card_made_for_another_weight_again_at_that_weight(qtbot, window, fleet, tmp_path):
    import subprocess
    import sys

    from kneeboard.app.dialogs import CompareDialog

    out = tmp_path / "heavy.pdf"
    cli = subprocess.run([sys.executable, "-m", "kneeboard", "card", str(fleet / "demo_trainer.toml"), "--weight",
                          "1985 lb", "-o", str(out)], capture_output=True, text=True)
    assert cli.returncode == 0, cli.stderr
    window.ask_open_path = lambda *_: out
    window.act_compare_printed.trigger()
    (dialog,) = window.findChildren(CompareDialog)
    # the profile is unchanged: at the card's own weight every figure reads the same, and the dialog says which
    assert dialog.row_count() == 0
    assert "at 1985 lb, the weight it was made for" in dialog.summary.text()
