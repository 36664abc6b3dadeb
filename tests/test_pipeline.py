"""One way through: every route gives the same card, the physics runs once per card, blocks and fields declared once."""

import io
import json
import shutil
from unittest import mock

import pytest
from card_helpers import card_of, default_style
from conftest import SAMPLES
from pypdf import PdfReader

from kneeboard import compute as compute_module
from kneeboard import pipeline, tables
from kneeboard.card import blocks
from kneeboard.card.blocks.registry import BlockSpec
from kneeboard.card.draw import Draw, figure
from kneeboard.card.ops import LABEL
from kneeboard.cli import main
from kneeboard.compare import compare
from kneeboard.inputs import profile_keys
from kneeboard.inputs.schema import KNOWN_KEYS
from kneeboard.inputs.styles import load_style

STYLE = 'speed_unit = "km/h"\nbank_angles = [0, 20, 40]\norganization = "Demo Flying Club"\n'


@pytest.fixture
def styled_fleet(tmp_path):
    folder = tmp_path / "fleet"
    folder.mkdir()
    for name in ("demo_trainer", "demo_tourer"):
        shutil.copy(SAMPLES / f"{name}.toml", folder)
    (folder / "fleet.style.toml").write_text(STYLE)
    return folder


def page_texts(path):
    return [page.extract_text() for page in PdfReader(io.BytesIO(path.read_bytes())).pages]


def test_a_profile_in_a_styled_fleet_prints_the_same_by_every_route(styled_fleet, tmp_path, capsys):
    one, all_ = tmp_path / "one.pdf", tmp_path / "all.pdf"
    assert main(["card", str(styled_fleet / "demo_trainer.toml"), "-o", str(one)]) == 0
    assert main(["card", str(styled_fleet), "-o", str(all_)]) == 0
    alone = page_texts(one)
    # the folder's cards come in registration order: DEMO-TOUR, then DEMO-TRN
    assert alone == page_texts(all_)[-len(alone):]
    assert "km/h" in alone[0] and "Demo Flying Club" in alone[0]
    capsys.readouterr()
    assert main(["table", str(styled_fleet / "demo_trainer.toml"), "--format", "json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["speed_unit"] == "km/h"
    assert [r["bank_deg"] for r in data["configurations"][0]["rows"]] == [0, 20, 40]
    assert main(["table", str(styled_fleet / "demo_trainer.toml"), "--format", "csv"]) == 0
    csv_text = capsys.readouterr().out
    assert "stall_speed_km/h" in csv_text.splitlines()[0]


def test_an_explicit_style_replaces_the_fleet_style(styled_fleet, capsys):
    other = styled_fleet.parent / "other.style.toml"
    other.write_text('speed_unit = "mph"\n')
    assert main(["table", str(styled_fleet / "demo_trainer.toml"), "--format", "json", "--style", str(other)]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["speed_unit"] == "mph" and len(data["configurations"][0]["rows"]) == 8  # the profile's own banks


def test_the_physics_runs_once_per_card(tmp_path, monkeypatch):
    calls = []
    real = compute_module.compute

    def counting(*args, **kwargs):
        calls.append(args[0].aircraft.registration)
        return real(*args, **kwargs)

    for module in (compute_module, pipeline, tables):
        monkeypatch.setattr(module, "compute", counting)
    assert main(["card", str(SAMPLES / "demo_glider.toml"), "-o", str(tmp_path / "g.pdf")]) == 0
    assert calls == ["DEMO-GL"]
    calls.clear()
    assert main(["card", str(SAMPLES), "-o", str(tmp_path / "all.pdf")]) == 0
    assert sorted(calls) == sorted(["DEMO-GL", "DEMO-ML", "DEMO-RG", "DEMO-TOUR", "DEMO-TRN"])


def test_reading_a_profile_runs_no_physics():
    from kneeboard.inputs.schema import profile_from_data

    with mock.patch.object(compute_module, "compute", side_effect=AssertionError("physics while reading")):
        assert profile_from_data(pipeline.read_source(SAMPLES / "demo_tourer.toml").data)[0] is not None


def test_an_override_is_checked_like_the_files_own_value_and_names_itself():
    p = pipeline.prepare(pipeline.read_source(SAMPLES / "demo_trainer.toml"), default_style(),
                         pipeline.Overrides(weight="0.001 kg"))
    assert p.table is None
    assert [e.path for e in p.errors] == ["--weight (weight.total)"] and "out of range" in p.errors[0].message


@pytest.fixture
def throwaway_block():
    """A block declared inside the test and nowhere else."""

    def draw(ctx, width, _height=None):
        d = Draw(ctx)
        text = f"hangar check {ctx.table.weight.text}"
        d.text(0, -10, text, LABEL, figures=figure("hangar check", ctx.table.weight, ctx.table.weight_unit))
        return d.block("hangar-check", 14)

    blocks.register(BlockSpec("hangar-check", "Hangar check (a test block)", draw))
    yield "hangar-check"
    blocks.unregister("hangar-check")


def test_a_new_block_is_one_declaration_for_the_style_the_layout_and_compare(throwaway_block, tmp_path):
    assert throwaway_block in blocks.names() and blocks.labels()[throwaway_block] == "Hangar check (a test block)"
    style_file = tmp_path / "s.style.toml"
    style_file.write_text(f'front = ["header", "margin-table", "{throwaway_block}"]\n')
    style, problems = load_style(style_file)
    assert problems == [] and style is not None
    light, heavy = card_of("demo_trainer", style), card_of("demo_trainer", style, weight="1600 lb")
    assert throwaway_block in light.pages[0].blocks
    changed = {c.label: (c.old, c.new) for c in compare(light, heavy)}
    assert changed["hangar check"] == ("1560 lb", "1600 lb")
    # the default order includes it too: a style without a list shows every registered block
    assert throwaway_block in [b for page in card_of("demo_trainer").pages for b in page.blocks]


def test_every_key_the_reader_accepts_is_declared_once():
    declared = {(f.section, f.key) for f in profile_keys.FIELDS}
    assert len(declared) == len(profile_keys.FIELDS)
    for section, keys in KNOWN_KEYS.items():
        for key in keys:
            assert (section, key) in declared or (section == "" and key in profile_keys.TOP_LEVEL), (section, key)


def test_templates_use_only_declared_fields():
    import tomllib

    from kneeboard.shipped import CATEGORIES_WITH_TEMPLATES, template_path

    for category in CATEGORIES_WITH_TEMPLATES:
        data = tomllib.loads(template_path(category).read_text(encoding="utf-8"))
        for section, table in data.items():
            if section not in profile_keys.SECTIONS:
                assert section in profile_keys.TOP_LEVEL, section
                continue
            for row in table if isinstance(table, list) else [table]:
                for key in row:
                    assert (section, key) in {(f.section, f.key) for f in profile_keys.FIELDS}, (category, section, key)


def test_a_profile_from_a_template_warns_until_every_placeholder_is_replaced():
    from conftest import checked

    from kneeboard.shipped import template_path

    text = template_path("normal").read_text(encoding="utf-8")
    p = checked(text)
    paths = {w.path for w in p.warnings if "placeholder" in w.message}
    assert {"aircraft.registration", "aircraft.model", "aircraft.max_weight", "configuration[1].stall_speed"} <= paths
    assert any(line.startswith("WARNING placeholder values") for line in p.table.warnings)
    mine = (text.replace('"NEW-1"', '"DEMO-77"').replace('"Aircraft model"', '"Trainer (invented)"')
            .replace('"1000 kg"', '"780 kg"').replace('"100 kt"', '"98 kt"').replace('"50 kt"', '"48 kt"')
            .replace('"45 kt"', '"43 kt"').replace('"85 kt"', '"82 kt"'))
    assert not [w for w in checked(mine).warnings if "placeholder" in w.message]
    # a profile never made from a template is never judged by one
    assert not [w for w in checked(mine.replace('template = "normal"', "")).warnings if "placeholder" in w.message]


def test_a_misspelt_section_is_an_error_and_a_misspelt_key_a_hint():
    from conftest import MINIMAL, checked

    p = checked(MINIMAL + '[weigth]\ntotal = "700 kg"\n')
    assert [str(e).split(": ", 1)[1] for e in p.errors] == [
        "weight: [weigth] is not a section of a profile; did you mean [weight]?"]  # said once, not twice
    p = checked(MINIMAL + 'flap_limt_speed = "80 kt"\n')
    assert "did you mean flap_limit_speed?" in p.warnings[0].message
    # the card names the figure in the editor's words, never the file's key
    assert any("misspelt 'Flap limit VFE'" in line for line in p.table.warnings)
    assert not any("flap_limit_speed" in line or "flap_limt_speed" in line for line in p.table.warnings)


def test_characters_the_fonts_cannot_draw_are_named_at_their_field():
    from conftest import MINIMAL, checked

    p = checked(MINIMAL + '[card]\nnotes = "日本 and Říčany"\n')
    (w,) = [w for w in p.warnings if w.path == "card.notes"]
    assert "日, 本" in w.message and "Ř" not in w.message
    assert not [w for w in checked(MINIMAL + '[card]\nnotes = "Αερολέσχη Аэроклуб"\n').warnings]
