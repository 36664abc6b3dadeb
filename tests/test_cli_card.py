"""`kneeboard card`: fleets, sheets, one file per aircraft, PNGs, failures reported and skipped."""

import io
import os

import pytest
from conftest import MINIMAL, SAMPLES
from pypdf import PdfReader

from kneeboard.cli import main


def run(capsys, *args):
    code = main([str(a) for a in args])
    out, err = capsys.readouterr()
    return code, out, err


def pages(path):
    return PdfReader(io.BytesIO(path.read_bytes())).pages


def test_fleet_on_letter_sheets(capsys, tmp_path):
    out = tmp_path / "fleet.pdf"
    code, text, err = run(capsys, "card", SAMPLES, "-o", out, "--sheet", "letter")
    assert code == 0, err
    assert "flight manual" in text
    sheets = pages(out)
    assert len(sheets) >= 5
    assert {round(float(p.mediabox.width)) for p in sheets} <= {612, 792}


def test_one_card_4x6_and_registration_order(capsys, tmp_path):
    out = tmp_path / "one.pdf"
    small = tmp_path / "small.style.toml"  # a 4x6 card holds the essential blocks; every block would not fit
    small.write_text('front = ["header", "margin-table", "limits", "turns", "margin-chart", "notes"]\n')
    code, _, err = run(capsys, "card", SAMPLES / "demo_trainer.toml", "-o", out, "--size", "4x6", "--style", small)
    assert code == 0, err
    p = pages(out)
    assert (float(p[0].mediabox.width), float(p[0].mediabox.height)) == pytest.approx((288, 432), abs=0.1)
    out = tmp_path / "all.pdf"
    run(capsys, "card", SAMPLES, "-o", out)
    firsts = [page.extract_text().split()[0] for page in pages(out) if "continued" not in page.extract_text()]
    assert firsts == sorted(firsts, key=str.casefold)


def test_each_and_png(capsys, tmp_path):
    each = tmp_path / "cards"
    code, _, err = run(capsys, "card", SAMPLES / "demo_microlight.toml", SAMPLES / "demo_trainer.toml",
                       "--each", each, "--png", 50)
    assert code == 0, err
    names = sorted(p.name for p in each.iterdir())
    assert names == ["DEMO-ML-back.png", "DEMO-ML-front.png", "DEMO-ML.pdf", "DEMO-TRN-back.png",
                     "DEMO-TRN-front.png", "DEMO-TRN.pdf"]
    assert (each / "DEMO-ML-front.png").read_bytes().startswith(b"\x89PNG")


def test_bad_profile_skipped_others_exported_exit_2(capsys, tmp_path):
    folder = tmp_path / "fleet"
    folder.mkdir()
    for name in ("demo_trainer.toml", "demo_microlight.toml"):
        (folder / name).write_bytes((SAMPLES / name).read_bytes())
    (folder / "broken.toml").write_text(MINIMAL.replace('"50 kt"', '"50 kg"'))
    out = tmp_path / "fleet.pdf"
    code, _, err = run(capsys, "card", folder, "-o", out, "--each", tmp_path / "each")
    assert code == 2
    assert "broken.toml" in err and "configuration[1].stall_speed" in err and "skipped" in err
    assert len([p for p in pages(out) if "continued" not in p.extract_text()]) == 2
    assert sorted(p.name for p in (tmp_path / "each").iterdir()) == ["DEMO-ML.pdf", "DEMO-TRN.pdf"]


def test_progress_line_for_larger_fleets(capsys, tmp_path):
    folder = tmp_path / "fleet"
    folder.mkdir()
    for i in range(7):
        (folder / f"p{i}.toml").write_text(MINIMAL.replace("TEST-1", f"TEST-{i}"))
    code, _, err = run(capsys, "card", folder, "-o", tmp_path / "f.pdf")
    assert code == 0
    assert "card 7 of 7" in err


def test_read_only_folder_clear_message(capsys, tmp_path, monkeypatch):
    folder = tmp_path / "ro"
    folder.mkdir()
    folder.chmod(0o500)
    if os.geteuid() == 0:
        # root ignores folder permissions; make the folder refuse new files the way the kernel would
        import tempfile

        def refuse(*_args, **_kwargs):
            raise PermissionError(13, "Permission denied")

        monkeypatch.setattr(tempfile, "mkstemp", refuse)
    try:
        code, _, err = run(capsys, "card", SAMPLES / "demo_trainer.toml", "-o", folder / "x.pdf")
    finally:
        folder.chmod(0o700)
    assert code == 2
    assert f"{folder / 'x.pdf'}: cannot write in {folder} (Permission denied)" in err
    assert list(folder.iterdir()) == []


def test_failed_export_keeps_the_old_file(capsys, tmp_path, monkeypatch):
    out = tmp_path / "fleet.pdf"
    out.write_bytes(b"old card")

    def boom(*_args, **_kw):
        raise OSError(5, "Input/output error")

    monkeypatch.setattr(os, "replace", boom)
    code, _, err = run(capsys, "card", SAMPLES / "demo_trainer.toml", "-o", out)
    assert code == 74 and "Input/output error" in err  # the output device failed: 74, not bad input
    assert out.read_bytes() == b"old card"
    assert [p.name for p in tmp_path.iterdir()] == ["fleet.pdf"]


def test_needs_an_output(capsys):
    code, _, err = run(capsys, "card", SAMPLES)
    assert code == 2 and "-o OUT.pdf" in err


def test_style_with_errors_stops(capsys, tmp_path):
    style = tmp_path / "s.toml"
    style.write_text('size = "poster"\n')
    code, _, err = run(capsys, "card", SAMPLES, "-o", tmp_path / "x.pdf", "--style", style)
    assert code == 2 and "size" in err


def test_folder_uses_its_fleet_style(capsys, tmp_path):
    folder = tmp_path / "fleet"
    folder.mkdir()
    (folder / "demo_microlight.toml").write_bytes((SAMPLES / "demo_microlight.toml").read_bytes())
    (folder / "fleet.style.toml").write_text('size = "4x6"\norganization = "Demo Flying Club"\n')
    out = tmp_path / "f.pdf"
    code, _, err = run(capsys, "card", folder, "-o", out)
    assert code == 0, err  # the style file is not read as a profile
    first = pages(out)[0]
    assert float(first.mediabox.width) == pytest.approx(288, abs=0.1)
    assert "Demo Flying Club" in first.extract_text()


def test_a_fleet_run_ends_with_how_many_cards_were_made_and_skipped(capsys, tmp_path):
    fleet = tmp_path / "fleet"
    fleet.mkdir()
    for p in SAMPLES.glob("*.toml"):
        (fleet / p.name).write_bytes(p.read_bytes())
    (fleet / "broken.toml").write_text(MINIMAL.replace('"50 kt"', '"50 kg"'), encoding="utf-8")
    total = len(list(fleet.glob("*.toml")))
    code, out, err = run(capsys, "card", fleet, "-o", tmp_path / "all.pdf")
    assert code == 2  # unchanged: a profile was skipped
    lines = out.splitlines()
    assert lines[-2] == f"{total - 1} of {total} cards made; 1 skipped (see above)"
    assert "flight manual" in lines[-1]  # the caution stays the last word
    assert "broken.toml: skipped" in err and "configuration[1].stall_speed" in err
    (fleet / "broken.toml").unlink()
    code, out, _ = run(capsys, "card", fleet, "-o", tmp_path / "all.pdf")
    assert code == 0 and out.splitlines()[-2] == f"{total - 1} of {total - 1} cards made"
