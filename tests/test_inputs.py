"""Reading and writing the files a person writes (kneeboard/inputs/): round trip, limits, atomic replacement,
fingerprint."""

import os

import pytest
from conftest import checked_file

from kneeboard import fileio
from kneeboard.inputs.profiles import read_source
from kneeboard.inputs.toml import load_document, save_document


def test_round_trip_keeps_every_byte(sample_paths, tmp_path):
    for path in sample_paths:
        doc = load_document(path)
        out = tmp_path / path.name
        save_document(doc, out)
        assert out.read_bytes() == path.read_bytes()


def test_edit_changes_only_the_edited_value(sample_paths, tmp_path):
    path = next(p for p in sample_paths if "trainer" in p.name)
    doc = load_document(path)
    doc["aircraft"]["max_weight"] = "1700 lb"
    out = tmp_path / "edited.toml"
    save_document(doc, out)
    before, after = path.read_text().splitlines(), out.read_text().splitlines()
    changed = [(a, b) for a, b in zip(before, after) if a != b]
    assert len(before) == len(after) and len(changed) == 1
    assert "1700 lb" in changed[0][1]
    assert checked_file(out).profile.aircraft.max_weight == pytest.approx(1700 * 0.45359237)


def test_large_file_refused_unread(tmp_path):
    f = tmp_path / "big.toml"
    f.write_bytes(b"#" * (fileio.MAX_FILE_BYTES + 1))
    loaded = read_source(f)
    assert loaded.data is None and "refused" in loaded.problems[0].message
    assert checked_file(f).profile is None


def test_atomic_write_keeps_old_file_on_failure(tmp_path, monkeypatch):
    target = tmp_path / "p.toml"
    target.write_text("old")

    def boom(src, dst):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(os, "replace", boom)
    with pytest.raises(fileio.FileProblem, match="No space left"):
        fileio.write_atomic(target, "new")
    assert target.read_text() == "old"
    assert [p.name for p in tmp_path.iterdir()] == ["p.toml"]


def test_fingerprint_follows_data_not_comments(sample_paths, tmp_path):
    path = next(p for p in sample_paths if "trainer" in p.name)
    a = read_source(path).fingerprint
    f = tmp_path / "c.toml"
    f.write_text("# another comment\n" + path.read_text())
    assert read_source(f).fingerprint == a
    f.write_text(path.read_text().replace('"1650 lb"', '"1651 lb"', 1))
    assert read_source(f).fingerprint != a
    assert len(a) == 8


# --- the one door for TOML ----------------------------------------------------------------------------------------

def test_only_the_inputs_toml_module_imports_the_toml_libraries():
    import ast
    from pathlib import Path

    import kneeboard

    package = Path(kneeboard.__file__).parent
    found = set()
    for module in package.rglob("*.py"):
        for node in ast.walk(ast.parse(module.read_text(encoding="utf-8"))):
            names = [a.name for a in node.names] if isinstance(node, ast.Import) else \
                [node.module or ""] if isinstance(node, ast.ImportFrom) and not node.level else []
            if any(name.split(".")[0] in ("tomllib", "tomlkit") for name in names):
                found.add(module.relative_to(package.parent).as_posix())
    assert found == {"kneeboard/inputs/toml.py"}


def test_a_document_is_guarded_as_the_plain_reading_is():
    from kneeboard.inputs.toml import MAX_DEPTH, document_from_text, parse_text

    deep_key = ".".join(["a"] * (MAX_DEPTH + 2)) + " = 1\n"
    deep_array = "a = " + "[" * (MAX_DEPTH + 2) + "]" * (MAX_DEPTH + 2) + "\n"  # short keys: measured once parsed
    for text in (deep_key, deep_array):
        data, problems = parse_text(text)
        assert data is None and problems[0].path == "(file)" and "levels deep" in problems[0].message
        with pytest.raises(fileio.FileProblem, match="in.toml: .*levels deep"):
            document_from_text(text, "in.toml")
    huge = "# " + "x" * fileio.MAX_FILE_BYTES
    assert "larger than" in parse_text(huge)[1][0].message
    with pytest.raises(fileio.FileProblem, match="larger than"):
        document_from_text(huge, "in.toml")
    with pytest.raises(fileio.FileProblem, match="in.toml: is not valid TOML"):
        document_from_text("a = [", "in.toml")


# --- each file read once per run -----------------------------------------------------------------------------------


@pytest.fixture
def three_profiles(tmp_path):
    """A folder of three of the (invented) sample aircraft."""
    import shutil

    from conftest import SAMPLES

    folder = tmp_path / "fleet"
    folder.mkdir()
    for name in ("demo_trainer", "demo_tourer", "demo_microlight"):
        shutil.copy(SAMPLES / f"{name}.toml", folder / f"{name}.toml")
    return folder, sorted(folder.glob("*.toml"))


def count_opens(monkeypatch, paths):
    """How often each of `paths` is opened (every file reading of kneeboard goes through os.open)."""
    from collections import Counter

    opened, real, wanted = Counter(), os.open, {str(p) for p in paths}

    def counting(path, *args, **kwargs):
        if str(path) in wanted:
            opened[str(path)] += 1
        return real(path, *args, **kwargs)

    monkeypatch.setattr(os, "open", counting)
    return opened


def test_a_fleets_cards_read_each_profile_once(three_profiles, tmp_path, monkeypatch, capsys):
    from kneeboard.cli import main

    folder, profiles = three_profiles
    opened = count_opens(monkeypatch, profiles)
    assert main(["card", str(folder), "-o", str(tmp_path / "all.pdf"), "--each", str(tmp_path / "each")]) == 0
    assert dict(opened) == {str(p): 1 for p in profiles}  # ordered by registration, then made, from one reading
    assert len(list((tmp_path / "each").glob("*.pdf"))) == 3


def test_check_and_compare_read_each_profile_once(three_profiles, tmp_path, monkeypatch, capsys):
    from kneeboard.cli import main

    folder, profiles = three_profiles
    assert main(["card", str(folder), "--each", str(tmp_path / "cards")]) == 0
    opened = count_opens(monkeypatch, profiles)
    assert main(["check", str(folder)]) == 0
    assert dict(opened) == {str(p): 1 for p in profiles}  # the duplicate check and the checks from one reading
    opened.clear()
    # at another weight each card is prepared a second time, from the text read once
    main(["compare", str(tmp_path / "cards"), str(folder), "--weight", "500 kg"])
    assert "OUT OF DATE at 500 kg" in capsys.readouterr().out
    assert dict(opened) == {str(p): 1 for p in profiles}
