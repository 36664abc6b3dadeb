"""Reading and writing profile files: round trip, limits, atomic replacement."""

import os

import pytest

from kneeboard import fileio
from kneeboard.profile_io import load_document, load_profile, save_document


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
    assert load_profile(out).profile.aircraft.max_weight == pytest.approx(1700 * 0.45359237)


def test_large_file_refused_unread(tmp_path):
    f = tmp_path / "big.toml"
    f.write_bytes(b"#" * (fileio.MAX_FILE_BYTES + 1))
    loaded = load_profile(f)
    assert loaded.profile is None and "refused" in loaded.errors[0].message


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
    a = load_profile(path).fingerprint
    f = tmp_path / "c.toml"
    f.write_text("# another comment\n" + path.read_text())
    assert load_profile(f).fingerprint == a
    f.write_text(path.read_text().replace('"1650 lb"', '"1651 lb"', 1))
    assert load_profile(f).fingerprint != a
    assert len(a) == 8
