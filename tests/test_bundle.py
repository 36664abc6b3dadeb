"""The standalone program as `make bundle` builds it, run the way a pilot without Python runs it: copied to a
folder of its own, with nothing on PATH (no Python, no virtual environment, no variables of one), from another
folder. The first build takes about a minute; later ones reuse build/bundle/ and take seconds.
"""

import os
import shutil
import subprocess
from pathlib import Path

import pytest
from conftest import ROOT, SAMPLES, checked_file

import kneeboard
from kneeboard import display
from kneeboard.card.data import read_card_data


@pytest.fixture(scope="module")
def bundle(tmp_path_factory):
    made = subprocess.run(["make", "--no-print-directory", "-C", str(ROOT), "bundle"], capture_output=True,
                          text=True, timeout=1800)
    assert made.returncode == 0, made.stdout[-3000:] + made.stderr[-3000:]
    built = Path(made.stdout.splitlines()[-1])  # make bundle's last line: the executable
    assert built == ROOT / "dist" / "kneeboard" / "kneeboard" and built.is_file()
    # a copy elsewhere: the program must not reach back into the build tree or the development environment
    home = tmp_path_factory.mktemp("pilot")
    program = home / "programs" / "kneeboard"
    shutil.copytree(built.parent, program, symlinks=True)
    yield program / "kneeboard"
    shutil.rmtree(program, ignore_errors=True)  # a quarter of a gigabyte


def clean_environment(home: Path, **extra: str) -> dict:
    empty = home / "empty-path"
    empty.mkdir(exist_ok=True)
    env = {"PATH": str(empty), "HOME": str(home), "LANG": "C.UTF-8", **extra}
    assert shutil.which("python3", path=env["PATH"]) is None and shutil.which("python", path=env["PATH"]) is None
    return env


def run(program: Path, cwd: Path, *args: str, **extra: str) -> subprocess.CompletedProcess:
    return subprocess.run([str(program), *args], cwd=cwd, env=clean_environment(cwd, **extra), capture_output=True,
                          text=True, timeout=300)


@pytest.fixture
def elsewhere(tmp_path):
    folder = tmp_path / "my cards"
    folder.mkdir()
    return folder


def test_it_carries_fonts_licence_templates_samples_and_qt_plugins(bundle):
    inside = bundle.parent / "_internal"
    assert (inside / "fontpkg_fira_sans" / "LICENSE").is_file()
    assert len(list((inside / "fontpkg_fira_sans" / "files").glob("FiraSans-*.ttf"))) >= 2
    assert {p.name for p in (inside / "kneeboard" / "resources" / "templates").glob("*.toml")} == {
        f"{c}.toml" for c in ("normal", "utility", "acrobatic", "glider")}
    assert {p.name for p in (inside / "kneeboard" / "samples").glob("*.toml")} == {p.name for p in
                                                                                  SAMPLES.glob("*.toml")}
    plugins = inside / "PySide6" / "Qt" / "plugins" / "platforms"
    assert (plugins / "libqoffscreen.so").is_file() and (plugins / "libqxcb.so").is_file()
    assert list(inside.rglob("libQt6Pdf.so*")) and list(inside.rglob("libQt6PdfWidgets.so*"))


def test_version_without_python(bundle, elsewhere):
    proc = run(bundle, elsewhere, "--version")
    assert proc.returncode == 0, proc.stderr
    assert proc.stdout.startswith(f"kneeboard {kneeboard.__version__}\n") and "flight manual" in proc.stdout


def test_a_card_from_a_profile_in_another_folder_is_the_card_of_the_source(bundle, elsewhere):
    profile = elsewhere / "trainer.toml"
    shutil.copyfile(SAMPLES / "demo_trainer.toml", profile)
    proc = run(bundle, elsewhere, "card", "trainer.toml", "-o", "trainer.pdf", "--png", "40")
    assert proc.returncode == 0, proc.stderr
    pdf = (elsewhere / "trainer.pdf").read_bytes()
    (data,) = read_card_data(pdf)
    assert data["registration"] == "DEMO-TRN" and data["fingerprint"] == checked_file(profile).fingerprint
    assert b"FiraSans" in pdf  # the shipped fonts, embedded
    assert (elsewhere / "trainer-DEMO-TRN-front.png").read_bytes().startswith(b"\x89PNG")  # through QtPdf
    proc = run(bundle, elsewhere, "card", "trainer.toml", "-o", "karte.pdf", "--language", "de")
    assert proc.returncode == 0, proc.stderr
    (data,) = read_card_data((elsewhere / "karte.pdf").read_bytes())  # its words from the catalogue it carries
    assert data["language"] == "de" and "Flaps up · 30° · Reserve" in {f["label"] for f in data["figures"]}


def test_new_and_samples_start_from_nothing(bundle, elsewhere):
    proc = run(bundle, elsewhere, "new", "--template", "glider", "mine.toml")
    assert proc.returncode == 0, proc.stderr
    assert 'template = "glider"' in (elsewhere / "mine.toml").read_text(encoding="utf-8")
    proc = run(bundle, elsewhere, "samples", "fleet")
    assert proc.returncode == 0, proc.stderr
    proc = run(bundle, elsewhere, "check", "fleet", "mine.toml")
    assert proc.returncode == 0, proc.stderr
    assert proc.stdout.count(": ok") == len(list(SAMPLES.glob("*.toml"))) + 1
    assert "is the template's placeholder" in proc.stdout


def test_the_app_opens_its_window_offscreen_on_its_copy_of_the_samples(bundle, elsewhere):
    # the start-up probe (see benchmarks/) quits once the window shows the fleet
    proc = run(bundle, elsewhere, QT_QPA_PLATFORM="offscreen", KNEEBOARD_STARTUP_PROBE="1")
    assert proc.returncode == 0, proc.stderr
    assert "kneeboard: window shown after" in proc.stderr
    copied = elsewhere / ".local" / "share" / "kneeboard" / "sample fleet"
    assert sorted(p.name for p in copied.glob("*.toml")) == sorted([p.name for p in SAMPLES.glob("*.toml")]
                                                                   + ["fleet.style.toml"])


def test_the_window_check_names_the_system_libraries_the_bundle_does_not_carry(bundle, elsewhere):
    inside = bundle.parent / "_internal"
    missing = display.missing_packages((str(inside), *display.LIBRARY_FOLDERS))
    proc = run(bundle, elsewhere, DISPLAY=":97", XAUTHORITY=os.devnull)  # no such display
    if missing:
        assert proc.returncode == 2
        assert proc.stderr.splitlines()[1] == "  sudo apt install " + " ".join(missing)
    else:  # every library is there: the check lets Qt try, and Qt says it found no display there
        assert proc.returncode != 0 and "could not connect to display" in proc.stderr
    carried = [package for library, package in display.XCB_LIBRARIES.items() if (inside / library).exists()]
    assert carried and not any(package in proc.stderr for package in carried)
