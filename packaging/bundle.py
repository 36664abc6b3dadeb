"""Build the standalone kneeboard (`make bundle`): one folder under dist/ that runs the app and the command line on
a machine without Python. Its last line of output is the path of the executable.

It freezes kneeboard as a wheel installs it (the style, templates and samples inside the package, as a pip or
pipx user gets them), never the source tree: the wheel goes into an environment of its own under build/bundle/,
which borrows the third-party packages (Qt, numpy, reportlab, PyInstaller) of the environment running this script
through a path entry, so nothing is downloaded twice. PyInstaller's work folder stays in build/bundle/ too, and a
second build reuses its analysis when nothing changed.

Run with the Python of an environment that has kneeboard's dependencies and PyInstaller
(`pip install -e '.[bundle]'`). The same steps are meant for Windows and macOS (the executable is then
dist/kneeboard/kneeboard.exe, or dist/kneeboard/kneeboard); only the Linux build is built and tested here.
"""

import hashlib
import os
import shutil
import site
import subprocess
import sys
import sysconfig
import time
import zipfile
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
WORK = ROOT / "build" / "bundle"  #: kept between builds (ignored by git): the wheel, its environment, the analysis
DIST = ROOT / "dist"
SPEC = ROOT / "packaging" / "kneeboard.spec"


def say(text: str) -> None:
    print(f"bundle: {text}", flush=True)


def run(command: list, log: Path | None = None) -> None:
    """Run a build step in the work folder (in the repository, `python -m` would find the source tree's kneeboard
    before the wheel's); when it fails, show the end of what it said and stop."""
    if log is None:
        proc = subprocess.run(command, capture_output=True, text=True, cwd=WORK)
        output = proc.stdout + proc.stderr
    else:
        with log.open("w", encoding="utf-8") as out:
            proc = subprocess.run(command, stdout=out, stderr=subprocess.STDOUT, text=True, cwd=WORK)
        output = log.read_text(encoding="utf-8", errors="replace")
    if proc.returncode != 0:
        print(output[-4000:], file=sys.stderr)
        where = f" (the whole log: {log})" if log is not None else ""
        sys.exit(f"bundle: failed: {' '.join(str(c) for c in command[:4])} ...{where}")


def environment_python(env: Path) -> Path:
    return env / ("Scripts/python.exe" if os.name == "nt" else "bin/python")


def build_wheel() -> Path:
    wheels = WORK / "wheel"
    shutil.rmtree(wheels, ignore_errors=True)
    say("building the wheel")
    run([sys.executable, "-m", "pip", "wheel", "--no-deps", "-q", str(ROOT), "-w", str(wheels)])
    (wheel,) = wheels.glob("kneeboard-*.whl")
    return wheel


def prepare_environment(wheel: Path) -> Path:
    """An environment holding the wheel's kneeboard and, through a path entry, this one's other packages."""
    env = WORK / "env"
    python = environment_python(env)
    if not python.exists():
        say("making the build environment")
        run([sys.executable, "-m", "venv", "--without-pip", str(env)])
    purelib = Path(subprocess.run([str(python), "-c", "import sysconfig; print(sysconfig.get_paths()['purelib'])"],
                                  capture_output=True, text=True, check=True).stdout.strip())
    # a path entry runs none of that folder's own start-up hooks, so an editable kneeboard there stays out of reach
    ours = [p for p in site.getsitepackages() + [sysconfig.get_paths()["purelib"]] if Path(p).is_dir()]
    (purelib / "borrowed-packages.pth").write_text("\n".join(dict.fromkeys(ours)) + "\n", encoding="utf-8")
    stamp = env / "kneeboard-wheel.sha256"
    digest = wheel_digest(wheel)
    if stamp.is_file() and stamp.read_text(encoding="utf-8") == digest:
        say(f"{wheel.name} is installed there as built; the last freeze's analysis is reused")
        return python
    say(f"installing {wheel.name} into it")
    run([sys.executable, "-m", "pip", "--python", str(python), "install", "--no-deps", "--force-reinstall", "-q",
         str(wheel)])
    stamp.write_text(digest, encoding="utf-8")
    return python


def wheel_digest(wheel: Path) -> str:
    """The wheel's files and their contents (not the zip's own bytes, which carry dates): the same digest means
    the same installed program, so nothing is reinstalled and PyInstaller finds every file as it left it."""
    digest = hashlib.sha256()
    with zipfile.ZipFile(wheel) as z:
        for name in sorted(z.namelist()):
            digest.update(name.encode() + b"\0" + hashlib.sha256(z.read(name)).digest())
    return digest.hexdigest()


def freeze(python: Path) -> Path:
    say("freezing with PyInstaller (about a minute the first time; later builds reuse build/bundle/)")
    log = WORK / "pyinstaller.log"
    run([str(python), "-m", "PyInstaller", "--noconfirm", "--log-level", "WARN", "--workpath", str(WORK / "work"),
         "--distpath", str(DIST), str(SPEC)], log)
    folder = DIST / "kneeboard"
    return folder / ("kneeboard.exe" if os.name == "nt" else "kneeboard")


def main() -> int:
    started = time.monotonic()
    WORK.mkdir(parents=True, exist_ok=True)
    python = prepare_environment(build_wheel())
    executable = freeze(python)
    if not executable.is_file():
        sys.exit(f"bundle: failed: PyInstaller made no {executable}")
    say(f"done in {time.monotonic() - started:.0f} s; the folder {executable.parent} is the whole program")
    print(executable)
    return 0


if __name__ == "__main__":
    sys.exit(main())
