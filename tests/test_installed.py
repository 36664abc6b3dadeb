"""The package as it is installed: a wheel built from the source, in a fresh environment, run from another folder.

The fresh environment borrows the test environment's third-party packages through a path entry (no second
download of Qt), but not its editable kneeboard: that one is only reachable through the test environment's own
start-up hooks, which a path entry does not run. So every file the commands below read comes from the wheel.
The same wheel is also installed with pipx, the README's way for people who have Python.
"""

import json
import os
import shutil
import site
import subprocess
import sys
import sysconfig
import zipfile
from pathlib import Path

import pytest
from conftest import ROOT, SAMPLES

import kneeboard


@pytest.fixture(scope="module")
def installed(tmp_path_factory):
    base = tmp_path_factory.mktemp("installed")
    wheels = base / "wheels"
    build = subprocess.run([sys.executable, "-m", "pip", "wheel", "--no-deps", "-q", str(ROOT), "-w", str(wheels)],
                           capture_output=True, text=True, timeout=600)
    assert build.returncode == 0, build.stderr[-2000:]
    (wheel,) = wheels.glob("kneeboard-*.whl")
    env = base / "env"
    subprocess.run([sys.executable, "-m", "venv", "--without-pip", str(env)], check=True, timeout=120)
    python = env / "bin" / "python"
    purelib = Path(subprocess.run([str(python), "-c", "import sysconfig; print(sysconfig.get_paths()['purelib'])"],
                                  capture_output=True, text=True, check=True).stdout.strip())
    ours = [p for p in site.getsitepackages() + [sysconfig.get_paths()["purelib"]] if Path(p).is_dir()]
    (purelib / "test-environment-packages.pth").write_text("\n".join(dict.fromkeys(ours)) + "\n")
    install = subprocess.run([sys.executable, "-m", "pip", "--python", str(python), "install", "--no-deps", "-q",
                              str(wheel)], capture_output=True, text=True, timeout=600)
    assert install.returncode == 0, install.stderr[-2000:]
    work = base / "elsewhere"
    work.mkdir()
    return wheel, env, work


def run(env: Path, work: Path, *args: str) -> subprocess.CompletedProcess:
    return subprocess.run([str(env / "bin" / "kneeboard"), *args], cwd=work, capture_output=True, text=True,
                          timeout=300, env={"PATH": "/usr/bin:/bin", "HOME": str(work), "QT_QPA_PLATFORM": "offscreen"})


def test_the_wheel_carries_the_style_templates_and_samples(installed):
    wheel, _, _ = installed
    names = set(zipfile.ZipFile(wheel).namelist())
    assert "kneeboard/resources/default.style.toml" in names
    assert {f"kneeboard/resources/templates/{c}.toml" for c in ("normal", "utility", "acrobatic", "glider")} <= names
    assert {f"kneeboard/samples/{p.name}" for p in SAMPLES.glob("*.toml")} <= names
    assert {f"kneeboard/locale/{code}/LC_MESSAGES/kneeboard.mo" for code in ("de", "fr", "es", "cs", "pl")} <= names


def test_an_installed_package_makes_cards_from_another_folder(installed):
    _, env, work = installed
    profile = work / "mine.toml"
    profile.write_text((SAMPLES / "demo_trainer.toml").read_text(encoding="utf-8"), encoding="utf-8")
    where = subprocess.run([str(env / "bin" / "python"), "-c", "import kneeboard, kneeboard.shipped as s; "
                            "print(kneeboard.__file__); print(s.default_style_path())"],
                           cwd=work, capture_output=True, text=True, check=True).stdout.split()
    assert all(str(env) in line for line in where), where  # the wheel's files, not the source tree's
    proc = run(env, work, "card", "mine.toml", "-o", "mine.pdf", "--png", "40")
    assert proc.returncode == 0, proc.stderr
    assert (work / "mine.pdf").read_bytes().startswith(b"%PDF") and (work / "mine-DEMO-TRN-front.png").is_file()
    table = run(env, work, "table", "mine.toml", "--format", "json")
    assert table.returncode == 0 and json.loads(table.stdout)["registration"] == "DEMO-TRN"
    german = run(env, work, "table", "mine.toml", "--language", "de")  # the catalogue the wheel carries
    assert german.returncode == 0 and "Überziehgeschwindigkeit" in german.stdout, german.stderr
    check = run(env, work, "check", str(env))  # a folder without profiles: said so, exit 2
    assert check.returncode == 2 and "no profile" in check.stderr


def test_an_installed_package_starts_a_profile_and_a_fleet_from_nothing(installed):
    _, env, work = installed
    made = run(env, work, "new", "--template", "utility", "first.toml")
    assert made.returncode == 0, made.stderr
    assert (work / "first.toml").read_bytes() == (ROOT / "resources" / "templates" / "utility.toml").read_bytes()
    check = run(env, work, "check", "first.toml")
    assert check.returncode == 0 and "first.toml: warning: aircraft.registration: is the template's placeholder" \
        in check.stdout
    again = run(env, work, "new", "first.toml")
    assert again.returncode == 2 and "already exists; nothing was written" in again.stderr
    copied = run(env, work, "samples", "club fleet")
    assert copied.returncode == 0, copied.stderr
    names = sorted(p.name for p in (work / "club fleet").iterdir())
    assert names == sorted([p.name for p in SAMPLES.glob("*.toml")] + ["fleet.style.toml"])
    cards = run(env, work, "card", "club fleet", "-o", "club.pdf")
    assert cards.returncode == 0, cards.stderr
    n = len(list(SAMPLES.glob("*.toml")))
    assert f"{n} of {n} cards made" in cards.stdout
    again = run(env, work, "samples", "club fleet")
    assert again.returncode == 2 and "nothing was copied" in again.stderr


def test_pipx_puts_kneeboard_on_path(installed, tmp_path):
    """The README's way for people who have Python: `pipx install` from the wheel. pipx makes its own environment
    and installs the dependencies into it as a person's would (from the package index, or pip's cache)."""
    wheel, _, work = installed
    home, bin_dir = tmp_path / "pipx", tmp_path / "bin"
    env = {**os.environ, "PIPX_HOME": str(home), "PIPX_BIN_DIR": str(bin_dir), "PIPX_MAN_DIR": str(tmp_path / "man")}
    env.pop("VIRTUAL_ENV", None)
    try:
        proc = subprocess.run([sys.executable, "-m", "pipx", "install", str(wheel)], capture_output=True, text=True,
                              env=env, timeout=1200)
        assert proc.returncode == 0, proc.stdout[-2000:] + proc.stderr[-2000:]
        path = f"{bin_dir}:/usr/bin:/bin"
        found = shutil.which("kneeboard", path=path)
        assert found == str(bin_dir / "kneeboard")
        clean = {"PATH": path, "HOME": str(work), "QT_QPA_PLATFORM": "offscreen"}
        version = subprocess.run(["kneeboard", "--version"], env=clean, cwd=work, capture_output=True, text=True,
                                 timeout=120)
        assert version.returncode == 0 and version.stdout.startswith(f"kneeboard {kneeboard.__version__}\n")
        made = subprocess.run(["kneeboard", "samples", "pipx fleet"], env=clean, cwd=work, capture_output=True,
                              text=True, timeout=120)
        assert made.returncode == 0, made.stderr
        card = subprocess.run(["kneeboard", "card", "pipx fleet/demo_glider.toml", "-o", "glider.pdf"], env=clean,
                              cwd=work, capture_output=True, text=True, timeout=300)
        assert card.returncode == 0, card.stderr
        assert (work / "glider.pdf").read_bytes().startswith(b"%PDF")
    finally:
        shutil.rmtree(home, ignore_errors=True)  # its own Qt: most of a gigabyte
