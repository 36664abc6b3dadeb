"""The command line under the cases that once broke it: outputs onto inputs, closed pipes, full devices, typos,
no display, a fleet with one file the program mishandles. Each case names what it once did."""

import errno
import json
import os
import shutil
import subprocess
import sys

import pytest
from conftest import MINIMAL, ROOT, SAMPLES

from kneeboard import display, pipeline
from kneeboard.card.data import read_card_data
from kneeboard.cli import main


def run(capsys, *args):
    code = main([str(a) for a in args])
    out, err = capsys.readouterr()
    return code, out, err


def kneeboard(*args, env=None, **kwargs):
    base = {k: v for k, v in os.environ.items() if k not in ("DISPLAY", "WAYLAND_DISPLAY", "QT_QPA_PLATFORM")}
    return subprocess.run([sys.executable, "-m", "kneeboard", *map(str, args)], capture_output=True, text=True,
                          timeout=120, env={**base, **(env or {})}, cwd=ROOT, **kwargs)


@pytest.fixture
def fleet(tmp_path):
    folder = tmp_path / "fleet"
    folder.mkdir()
    for name in ("demo_trainer.toml", "demo_microlight.toml"):
        shutil.copy(SAMPLES / name, folder)
    (folder / "fleet.style.toml").write_text('organization = "Demo Flying Club"\n')
    return folder


@pytest.mark.parametrize("target", ["demo_trainer.toml", "fleet.style.toml", "new.toml"])
def test_an_output_never_replaces_an_input(capsys, fleet, target):
    # `card p.toml -o p.toml` once replaced the profile with a PDF, exit 0; the style likewise
    before = {p.name: p.read_bytes() for p in fleet.iterdir()}
    code, _, err = run(capsys, "card", fleet, "-o", fleet / target)
    assert code == 2 and (".toml" in err or "input" in err)
    assert {p.name: p.read_bytes() for p in fleet.iterdir()} == before


def test_an_output_through_a_link_onto_an_input_is_refused(capsys, fleet, tmp_path):
    link = tmp_path / "card.pdf"
    link.symlink_to(fleet / "demo_trainer.toml")
    before = (fleet / "demo_trainer.toml").read_bytes()
    code, _, err = run(capsys, "card", fleet / "demo_trainer.toml", "-o", link)
    assert code == 2 and "input" in err
    assert (fleet / "demo_trainer.toml").read_bytes() == before and link.is_symlink()


def test_each_and_png_names_match_and_counts_are_what_was_written(capsys, tmp_path):
    # --each --png once named PNGs apart from the de-duplicated PDFs, and counted files it never wrote
    folder = tmp_path / "pair"
    folder.mkdir()
    text = (SAMPLES / "demo_microlight.toml").read_text(encoding="utf-8")
    (folder / "a.toml").write_text(text)
    (folder / "b.toml").write_text(text.replace('registration = "DEMO-ML"', 'registration = "DEMO ML2"'))
    out = tmp_path / "cards"
    code, text_out, err = run(capsys, "card", folder, "--each", out, "--png", 40)
    assert code == 0, err
    names = sorted(p.name for p in out.iterdir())
    assert names == sorted(["DEMO-ML.pdf", "DEMO-ML-front.png", "DEMO-ML-back.png",
                            "DEMO_ML2.pdf", "DEMO_ML2-front.png", "DEMO_ML2-back.png"])
    assert "wrote 2 PDF(s)" in text_out and "wrote 4 PNG page(s)" in text_out


@pytest.mark.parametrize("twin", ["demo-ml", "DEMO ML"])
def test_each_reports_a_registration_clash_instead_of_numbering_a_file(capsys, tmp_path, twin):
    # a backup copy beside a profile once got its card written quietly as DEMO-ML-2.pdf; two registrations one file
    # name cannot tell apart ("DEMO-ML", "DEMO ML" -> DEMO-ML.pdf, DEMO_ML.pdf differ; "demo-ml" does not) likewise
    folder = tmp_path / "twins"
    folder.mkdir()
    text = (SAMPLES / "demo_microlight.toml").read_text(encoding="utf-8")
    (folder / "a.toml").write_text(text)
    (folder / "b copy.toml").write_text(text.replace('registration = "DEMO-ML"', f'registration = "{twin}"'))
    (folder / "c.toml").write_text(text.replace('registration = "DEMO-ML"', 'registration = "DEMO-OTHER"'))
    out = tmp_path / "cards"
    code, _, err = run(capsys, "card", folder, "--each", out, "-o", tmp_path / "all.pdf")
    clash = twin.casefold() == "demo-ml"
    assert code == (2 if clash else 0), err
    names = sorted(p.name for p in out.iterdir())
    if clash:
        assert names == ["DEMO-OTHER.pdf"]  # neither twin: which one is the aircraft's cannot be told
        for name, other in (("a.toml", "b copy.toml"), ("b copy.toml", "a.toml")):
            line = next(line for line in err.splitlines() if line.startswith(str(folder / name)))
            assert "is also the registration of" in line and str(folder / other) in line
    else:
        assert names == ["DEMO-ML.pdf", "DEMO-OTHER.pdf", "DEMO_ML.pdf"]
    # the one PDF holds every card: nothing is dropped from it
    assert len(read_card_data((tmp_path / "all.pdf").read_bytes())) == 3


def test_one_profile_the_program_mishandles_never_costs_the_others_their_cards(capsys, fleet, monkeypatch):
    real = pipeline.compute

    def broken_for_the_trainer(profile, *args, **kwargs):
        if profile.aircraft.registration == "DEMO-TRN":
            raise ZeroDivisionError("an invented bug")
        return real(profile, *args, **kwargs)

    monkeypatch.setattr(pipeline, "compute", broken_for_the_trainer)
    out = fleet.parent / "cards.pdf"
    code, text, err = run(capsys, "card", fleet, "-o", out)
    assert code == 2 and out.is_file() and "1 card(s)" in text
    assert "demo_trainer.toml: internal error on this profile" in err and "Traceback" not in err
    code, text, _ = run(capsys, "check", fleet)
    assert code == 2 and "demo_microlight.toml: ok" in text and "internal error on this profile" in text


def test_a_closed_pipe_ends_quietly():
    # `kneeboard check DIR | head -1` once ended in "internal error, please report it"
    proc = subprocess.Popen([sys.executable, "-m", "kneeboard", "check", str(SAMPLES)], stdout=subprocess.PIPE,
                            stderr=subprocess.PIPE, cwd=ROOT)
    proc.stdout.readline()
    proc.stdout.close()
    err = proc.stderr.read().decode()
    assert proc.wait(timeout=60) == 141 and "internal error" not in err and "Traceback" not in err


@pytest.mark.skipif(not os.path.exists("/dev/full"), reason="needs /dev/full (Linux)")
def test_a_full_output_device_is_said_in_one_line():
    with open("/dev/full", "w") as full:
        proc = subprocess.run([sys.executable, "-m", "kneeboard", "table", str(SAMPLES / "demo_trainer.toml")],
                              stdout=full, stderr=subprocess.PIPE, text=True, cwd=ROOT, timeout=60)
    assert proc.returncode == 74 and proc.stderr.strip().endswith("(No space left on device)")
    assert "internal error" not in proc.stderr


def test_control_characters_in_a_file_name_are_escaped(capsys, tmp_path):
    path = tmp_path / "evil\x1b[31m\nname.toml"
    path.write_text(MINIMAL.replace('"50 kt"', '"50 kg"'))
    code, out, _ = run(capsys, "check", path)
    assert code == 2 and "\x1b" not in out and "\\x1b[31m\\x0aname.toml" in out
    assert all(line.startswith(str(tmp_path)) or line.startswith("CAUTION") for line in out.splitlines())


def test_csv_cells_never_start_a_formula(capsys, tmp_path):
    path = tmp_path / "p.toml"
    path.write_text(MINIMAL.replace('name = "Flaps up"', 'name = "=HYPERLINK(1)"'))
    code, out, _ = run(capsys, "table", path, "--format", "csv")
    assert code == 0 and ",'=HYPERLINK(1)," in out and "\n=" not in out and ",=" not in out
    assert ",-1," in out  # a negative margin stays a number (1.4 x stall leaves none at 60 degrees)


def test_an_unknown_command_gets_a_suggestion_with_or_without_a_display():
    for env in ({}, {"DISPLAY": ":99"}):
        proc = kneeboard("crad", "x.toml", env=env)
        assert proc.returncode == 2 and "unknown command 'crad'; did you mean 'card'?" in proc.stderr
        assert "xcb" not in proc.stderr and "Aborted" not in proc.stderr


def test_no_display_is_said_in_one_line_naming_what_works():
    proc = kneeboard()
    assert proc.returncode == 2
    assert proc.stderr.count("\n") == 1 and "no display" in proc.stderr
    assert "check, table, card and compare" in proc.stderr


def test_missing_window_libraries_are_named_by_their_packages(tmp_path):
    empty = tmp_path / "lib"
    empty.mkdir()
    (empty / "libxcb.so.1").touch()
    said = display.window_problem({"DISPLAY": ":0"}, "linux", folders=(str(empty),))
    assert said.splitlines()[1].startswith("  sudo apt install libxcb-cursor0 libxcb-icccm4")
    assert "libxcb1" not in said  # the one that is there is not asked for
    for library in display.XCB_LIBRARIES:
        (empty / library).touch()
    assert display.window_problem({"DISPLAY": ":0"}, "linux", folders=(str(empty),)) is None
    assert display.window_problem({}, "darwin") is None
    assert display.window_problem({"QT_QPA_PLATFORM": "offscreen"}, "linux") is None


def test_the_standalone_programs_own_libraries_count_as_installed(tmp_path, monkeypatch):
    bundle = tmp_path / "_internal"  # what PyInstaller's bootloader names sys._MEIPASS, first on the loader's path
    bundle.mkdir()
    for library in display.XCB_LIBRARIES:
        (bundle / library).touch()
    system = tmp_path / "lib"
    system.mkdir()
    assert display.missing_packages((str(system),)) == list(dict.fromkeys(display.XCB_LIBRARIES.values()))
    monkeypatch.setattr(sys, "_MEIPASS", str(bundle), raising=False)
    assert display.library_folders() == display.LIBRARY_FOLDERS  # not frozen: a stray attribute is not a bundle
    monkeypatch.setattr(sys, "frozen", True, raising=False)
    assert display.library_folders()[0] == str(bundle)
    (bundle / "libxcb-icccm.so.4").unlink()
    assert display.missing_packages((*display.library_folders()[:1], str(system))) == ["libxcb-icccm4"]


def test_help_names_the_app_and_every_page_ends_with_the_caution(capsys):
    for args in (["--help"], ["check", "--help"], ["table", "--help"], ["card", "--help"], ["--version"]):
        with pytest.raises(SystemExit) as stop:
            main(args)
        assert stop.value.code == 0
        out = " ".join(capsys.readouterr().out.split())
        assert out.endswith("qualified flight instructor."), args
    with pytest.raises(SystemExit):
        main(["--help"])
    assert "kneeboard [PROFILE_OR_FOLDER]" in capsys.readouterr().out


@pytest.mark.parametrize("weight", ["0.001 kg", "600000 kg", "5e-324 kg", "48 kt*neper"])
def test_a_weight_override_is_checked_like_the_files_own(capsys, fleet, weight):
    # these once made cards the reader would refuse, or ended in exit 70 for the whole fleet
    code, _, err = run(capsys, "card", fleet, "-o", fleet.parent / "w.pdf", "--weight", weight)
    assert code == 2 and "--weight" in err and "internal error" not in err


@pytest.mark.parametrize("lines", ["front = []\n", "front = []\nback = []\n"])
def test_a_style_that_shows_no_block_is_refused_naming_the_key(capsys, tmp_path, lines):
    style = tmp_path / "empty.style.toml"
    style.write_text(lines)
    out = tmp_path / "card.pdf"
    code, _out, err = run(capsys, "card", "--style", style, "-o", out, SAMPLES / "demo_trainer.toml")
    assert code == 2 and "front" in err and "no block" in err
    assert not out.exists()


def test_a_style_whose_blocks_do_not_apply_to_the_aircraft_is_refused(capsys, tmp_path):
    # circling is a glider's block: an aeroplane's card of it alone would print nothing but its caution
    style = tmp_path / "glider_only.style.toml"
    style.write_text('front = ["circling"]\n')
    out = tmp_path / "card.pdf"
    code, _out, err = run(capsys, "card", "--style", style, "-o", out, SAMPLES / "demo_trainer.toml")
    assert code == 2 and "no block" in err and "circling" in err
    assert not out.exists()


CZECH = MINIMAL.replace('"TEST-1"', '"OK-ŘÍZ"').replace("(invented)", "(invented) – Čáp")


@pytest.mark.parametrize("command", ["check", "table", "card", "compare"])
def test_a_closed_stdout_is_exit_74_in_one_line(tmp_path, command):
    # `kneeboard card ... >&-` wrote the card, then ended in a traceback (exit 1)
    profile = SAMPLES / "demo_trainer.toml"
    card = tmp_path / "card.pdf"
    if command == "compare":
        assert main(["card", "-o", str(card), str(profile)]) == 0
    args = {"check": [profile], "table": [profile], "card": ["-o", card, profile], "compare": [card, profile]}
    proc = kneeboard(command, *args[command], preexec_fn=lambda: os.close(1))
    assert proc.returncode == 74, proc.stderr
    assert "Traceback" not in proc.stderr and "internal error" not in proc.stderr
    assert proc.stderr.strip().splitlines()[-1] == "kneeboard: the output could not be written (the standard " \
                                                    "output is closed)"
    if command == "card":
        assert card.read_bytes().startswith(b"%PDF")  # the card itself was written before the message failed


@pytest.mark.parametrize("command", [["check"], ["table"], ["table", "--format", "csv"], ["table", "--format", "json"]])
def test_a_legacy_output_encoding_gets_replacements_never_an_internal_error(tmp_path, command):
    # cp1252, as a redirect on a Windows console gives: "Ř" has no place in it
    profile = tmp_path / "okriz.toml"
    profile.write_text(CZECH, encoding="utf-8")
    base = {k: v for k, v in os.environ.items() if k not in ("DISPLAY", "WAYLAND_DISPLAY", "QT_QPA_PLATFORM")}
    proc = subprocess.run([sys.executable, "-m", "kneeboard", *command, str(profile)], capture_output=True,
                          timeout=120, env={**base, "PYTHONIOENCODING": "cp1252"}, cwd=ROOT)
    err = proc.stderr.decode("cp1252")
    assert proc.returncode == 0, err
    assert "internal error" not in err and "Traceback" not in err
    out = proc.stdout.decode("cp1252")
    if "json" in command:  # the machine interface escapes every non-ASCII letter: the registration stays whole
        assert json.loads(out)["registration"] == "OK-ŘÍZ"
    else:
        assert "OK-?ÍZ" in out  # the letter cp1252 lacks is replaced, the ones it has are kept


@pytest.mark.parametrize("code", [errno.ENOSPC, errno.EIO])
def test_a_failing_output_device_is_exit_74_with_the_old_file_intact(capsys, monkeypatch, tmp_path, code):
    out = tmp_path / "card.pdf"
    out.write_bytes(b"the card printed last week")

    def fail(_fd):
        raise OSError(code, os.strerror(code))

    monkeypatch.setattr(os, "fsync", fail)  # where a full disk or a failing medium shows itself at the latest
    status, _out, err = run(capsys, "card", "-o", out, SAMPLES / "demo_trainer.toml")
    assert status == 74 and os.strerror(code) in err and str(out) in err
    assert out.read_bytes() == b"the card printed last week"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["card.pdf"]  # no temporary left
