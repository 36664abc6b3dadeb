"""The app under a monkey: thousands of random edits, junk included, and undo back to the very start."""

import random

import pytest

from kneeboard.app.fields import BanksField, ChoiceField, NotesField, NumberField, PairsField, TextField
from kneeboard.app.items import ItemsField

STEPS = int(__import__("os").environ.get("KB_MONKEY_STEPS", "3000"))
SEED = 20261201

TEXTS = [
    "52 kt", "96 km/h", "60 mph", "1650 lb", "750 kg", "1000 ft", "300 m", "15 degC", "59 degF", "100 L", "0.72 kg/L",
    "1.4", "1.3", "3.8", "0", "-5", "0, 15, 30, 45, 60", "0, 30, 90", "10, 20", "5 kt", "10 km/h",
    "-5 kt", "0 kt", "1e300 kt", "nan kt", "inf kg", "52 kg", "700 kt", "15 kt", "5 delta_degC", "52", "kt",
    "", " ", "abc", "x" * 300, "日本語 kt", "\x00", "'", '"', "\\", "[[", "= 5", "# comment", "\n\n", "1e999999 kt",
    "10**10**10 kt", "__import__('os') kt", "DEMO-ZZ", "Flaps up", "flaps UP",
]


def pick_text(rng):
    return rng.choice(TEXTS)


def random_value(rng, field):
    """What a person could enter into this kind of field, right or wrong."""
    if isinstance(field, ChoiceField):
        options = [field.input.itemData(i) for i in range(field.input.count())]
        return rng.choice(options + ["junk"])
    if isinstance(field, PairsField):
        return [[pick_text(rng), pick_text(rng)] for _ in range(rng.randint(0, 5))] or None
    if isinstance(field, ItemsField):
        return [{"name": pick_text(rng), rng.choice(["mass", "volume"]): pick_text(rng)}
                for _ in range(rng.randint(0, 3))] or None
    return pick_text(rng)


def type_value(field, value):
    """Enter a value the way the field's own input hands it on."""
    if isinstance(field, (TextField, NumberField, BanksField)) and isinstance(value, str):
        field.input.setText(value)
        field.input.textEdited.emit(value)
    elif isinstance(field, NotesField):
        field.input.setPlainText(value if isinstance(value, str) else "")
    else:
        field.edited.emit(value)


def test_thousands_of_random_edits(qtbot, window):
    rng = random.Random(SEED)
    ed = window.editor
    original = window.doc.text()
    structural = [
        lambda: ed.config_buttons["Add"].click(),
        lambda: ed.config_buttons["Duplicate"].click(),
        lambda: ed.config_buttons["Remove"].click(),
        lambda: ed.config_buttons["Move left"].click(),
        lambda: ed.config_buttons["Move right"].click(),
        lambda: ed.config_tabs.setCurrentIndex(rng.randrange(max(ed.config_tabs.count(), 1))),
        lambda: ed.weight_mode.edited.emit(rng.choice(["reference", "total", "build-up"])),
        lambda: ed.is_glider.click(),
        lambda: ed.fields.get("configuration[1].pattern_mode") and
        ed.fields["configuration[1].pattern_mode"].edited.emit(rng.choice(["factor", "fixed"])),
    ]
    done = {"edit": 0, "undo": 0, "redo": 0, "structure": 0}
    for step in range(STEPS):
        roll = rng.random()
        if roll < 0.70:
            path, field = rng.choice([(p, f) for p, f in ed.fields.items() if p in ed.keys])
            type_value(field, random_value(rng, field))
            done["edit"] += 1
        elif roll < 0.80:
            window.act_undo.trigger()
            done["undo"] += 1
        elif roll < 0.87:
            window.act_redo.trigger()
            done["redo"] += 1
        else:
            rng.choice(structural)()
            done["structure"] += 1
        # after every action: alive, and either a usable profile or its problems on show
        assert window.isVisible()
        loaded = window.doc.loaded
        if loaded.profile is None:
            assert loaded.errors
            assert ed.problem_list.isVisible() and ed.problem_list.count() >= len(loaded.errors)
            assert all(p.path and p.message for p in loaded.errors)
        else:
            assert not ed.problem_list.isVisible() or loaded.warnings
        if step % 250 == 0:
            qtbot.wait(window.controller.timer.interval() + 5)  # let the preview catch up now and then
    qtbot.waitUntil(lambda: not window.controller.renders.busy(), timeout=20_000)
    assert all(n > STEPS // 60 for n in done.values()), done
    while window.doc.undo_stack.canUndo():
        window.doc.undo_stack.undo()
    assert window.doc.text() == original
    assert not window.isWindowModified()


@pytest.mark.parametrize("text", ["1e300 kt", "\x00", "x" * 300, "__import__('os') kt", "nan kt"])
def test_junk_in_every_field_is_kept_and_shown(window, text):
    ed = window.editor
    for path in [p for p in list(ed.fields) if p in ed.keys]:
        field = ed.fields.get(path)
        if isinstance(field, (TextField, NumberField)) and not isinstance(field, BanksField):
            type_value(field, text)
    loaded = window.doc.loaded
    assert loaded.profile is None and loaded.errors
    assert ed.fields["aircraft.max_weight"].input.text() == text
