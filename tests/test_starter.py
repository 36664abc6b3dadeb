"""`kneeboard new` and `kneeboard samples`: a first profile and a copy of the samples, never replacing a file.

(The same two commands from an installed wheel, in another folder: tests/test_installed.py.)
"""

import os

import pytest
from conftest import ROOT, SAMPLES, checked_file

from kneeboard.cli import main
from kneeboard.pipeline import PLACEHOLDER
from kneeboard.shipped import CATEGORIES_WITH_TEMPLATES


def run(capsys, *args):
    code = main([str(a) for a in args])
    out, err = capsys.readouterr()
    return code, out, err


@pytest.mark.parametrize("category", CATEGORIES_WITH_TEMPLATES)
def test_new_writes_the_template_whose_placeholders_check_reports_until_replaced(capsys, tmp_path, category):
    path = tmp_path / "mine.toml"
    code, out, _ = run(capsys, "new", "--template", category, path)
    assert code == 0 and f"wrote {path} from the {category} template" in out
    assert path.read_bytes() == (ROOT / "resources" / "templates" / f"{category}.toml").read_bytes()
    assert "flight manual" in out.splitlines()[-1]  # the caution
    code, out, _ = run(capsys, "check", path)
    assert code == 0  # placeholders are warnings: a card can be made, and says so
    placeholders = [line for line in out.splitlines() if PLACEHOLDER in line]
    assert any("aircraft.registration" in line for line in placeholders)
    assert any("configuration[1].stall_speed" in line for line in placeholders)
    # the person types their aircraft's figures: each replaced figure is no longer reported
    text = path.read_text(encoding="utf-8")
    registration = checked_file(path).profile.aircraft.registration
    path.write_text(text.replace(f'"{registration}"', '"DEMO-42"'), encoding="utf-8")
    _, out, _ = run(capsys, "check", path)
    left = [line for line in out.splitlines() if PLACEHOLDER in line]
    assert len(left) == len(placeholders) - 1 and not any("aircraft.registration" in line for line in left)


def test_new_takes_the_normal_template_when_none_is_named(capsys, tmp_path):
    code, _, _ = run(capsys, "new", tmp_path / "a.toml")
    assert code == 0 and 'template = "normal"' in (tmp_path / "a.toml").read_text(encoding="utf-8")


def test_new_never_replaces_a_file_or_a_link(capsys, tmp_path):
    mine = tmp_path / "mine.toml"
    mine.write_text("my own work\n", encoding="utf-8")
    code, out, err = run(capsys, "new", mine)
    assert code == 2 and out == "" and "mine.toml: already exists; nothing was written" in err
    assert mine.read_text(encoding="utf-8") == "my own work\n"
    dangling = tmp_path / "link.toml"
    os.symlink(tmp_path / "elsewhere.toml", dangling)  # writing through it would create a file somewhere else
    code, _, err = run(capsys, "new", dangling)
    assert code == 2 and "already exists" in err and not (tmp_path / "elsewhere.toml").exists()


@pytest.mark.parametrize(("name", "said"), [
    ("mine", "a profile's name ends in .toml (e.g. mine.toml)"),
    ("no/such/folder/mine.toml", "the folder no/such/folder does not exist"),
])
def test_new_names_what_is_wrong_with_the_file_name(capsys, tmp_path, monkeypatch, name, said):
    monkeypatch.chdir(tmp_path)
    code, _, err = run(capsys, "new", name)
    assert code == 2 and said in err and "nothing was written" in err
    assert list(tmp_path.iterdir()) == []


def test_new_refuses_an_unknown_template_naming_the_option(capsys, tmp_path):
    with pytest.raises(SystemExit) as stop:
        main(["new", "--template", "airliner", str(tmp_path / "a.toml")])
    assert stop.value.code == 2 and "--template" in capsys.readouterr().err
    assert not (tmp_path / "a.toml").exists()


def test_samples_copies_the_fleet_and_its_style_which_make_cards(capsys, tmp_path):
    folder = tmp_path / "new" / "fleet"  # made, with its parents
    code, out, _ = run(capsys, "samples", folder)
    assert code == 0 and "invented" in out and f"kneeboard card {folder}" in out
    copied = sorted(p.name for p in folder.iterdir())
    assert copied == sorted([p.name for p in SAMPLES.glob("*.toml")] + ["fleet.style.toml"])
    for p in SAMPLES.glob("*.toml"):
        assert (folder / p.name).read_bytes() == p.read_bytes()
    assert (folder / "fleet.style.toml").read_bytes() == (ROOT / "resources" / "default.style.toml").read_bytes()
    code, out, _ = run(capsys, "check", folder)
    assert code == 0 and out.count(": ok") == len(list(SAMPLES.glob("*.toml")))


def test_the_copies_style_is_the_one_a_fleet_folder_uses_and_the_app_copies_it_too(tmp_path):
    from kneeboard import shipped
    from kneeboard.inputs.styles import FLEET_STYLE

    assert shipped.FLEET_STYLE == FLEET_STYLE
    folder = shipped.copy_samples(tmp_path / "app copy")  # the app's first start
    assert sorted(p.name for p in folder.iterdir()) == sorted(name for _, name in shipped.sample_fleet_files())


def test_samples_copies_nothing_into_a_folder_where_one_name_is_taken(capsys, tmp_path):
    (tmp_path / "demo_tourer.toml").write_text("my tourer\n", encoding="utf-8")
    (tmp_path / "notes.txt").write_text("mine\n", encoding="utf-8")
    code, out, err = run(capsys, "samples", tmp_path)
    assert code == 2 and out == ""
    assert "already holds demo_tourer.toml; nothing was copied" in err
    assert sorted(p.name for p in tmp_path.iterdir()) == ["demo_tourer.toml", "notes.txt"]
    assert (tmp_path / "demo_tourer.toml").read_text(encoding="utf-8") == "my tourer\n"


def test_samples_into_a_file_says_it_is_not_a_folder(capsys, tmp_path):
    target = tmp_path / "fleet"
    target.write_text("x", encoding="utf-8")
    code, _, err = run(capsys, "samples", target)
    assert code == 2 and "is not a folder; nothing was copied" in err and target.read_text() == "x"
