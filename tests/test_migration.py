"""File formats: newer ones refused with a reason, older ones migrated, their originals kept."""

from conftest import MINIMAL, checked_file

from kneeboard.inputs.migration import file_format, migrate_text

FORMAT_0 = "# an old hand-written profile (invented)\n" + MINIMAL.replace("schema = 1\n", "")


def test_newer_format_is_refused_with_a_reason(tmp_path, capsys):
    from kneeboard.cli import main

    path = tmp_path / "new.toml"
    path.write_text(MINIMAL.replace("schema = 1", "schema = 2"))
    loaded = checked_file(path)
    assert loaded.profile is None
    assert "format 2, written by a newer kneeboard; this version reads format 1" in loaded.errors[0].message
    assert main(["check", str(path)]) == 2
    assert "newer kneeboard" in capsys.readouterr().out


def test_format_0_is_read_and_warned():
    assert file_format(FORMAT_0) == 0 and file_format(MINIMAL) == 1
    text, old = migrate_text(FORMAT_0)
    assert old == 0 and file_format(text) == 1
    assert text.startswith("# an old hand-written profile (invented)\nschema = 1\n")
    assert migrate_text(MINIMAL) == (MINIMAL, None)


def test_app_migrates_and_keeps_the_original_on_first_save(open_document, tmp_path):
    path = tmp_path / "old.toml"
    path.write_text(FORMAT_0)
    doc = open_document(path)
    assert doc.modified and doc.migrated_from == 0
    assert doc.undo_stack.undoText() == "Update the file format"
    assert not any("schema" in p.path for p in doc.loaded.problems)
    doc.set(("aircraft", "max_weight"), "760 kg")
    doc.save()
    backup = tmp_path / "old.toml.format0.bak"
    assert backup.read_text() == FORMAT_0
    assert path.read_text().startswith("# an old hand-written profile (invented)\nschema = 1\n")
    assert 'max_weight = "760 kg"' in path.read_text()
    doc.set(("aircraft", "max_weight"), "770 kg")
    doc.save()
    assert backup.read_text() == FORMAT_0  # the original is kept, never overwritten by later saves
