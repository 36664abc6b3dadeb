"""The key figures show each configuration's own limit beside the aircraft's (the fleet's marks of a shared
registration are tested on the fleet model, tests/test_app_fleet.py). The aircraft are invented samples."""

from kneeboard import terms
from kneeboard.tables import LIMIT_MARK


def test_the_key_figures_show_each_configurations_limit_and_mark_banks_past_it(qtbot, window, fleet):
    assert window.controller.open_profile(fleet / "demo_tourer.toml")
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
