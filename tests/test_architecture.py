"""The import rules of DEVELOPERS.md, checked."""

import base64
import os
import subprocess
import sys

import pytest


def test_aero_core_imports_no_qt_pint_or_reportlab():
    code = (
        "import sys, kneeboard.aero.turns, kneeboard.aero.atmosphere, kneeboard.aero.airspeed, "
        "kneeboard.aero.glider, kneeboard.aero.limits, kneeboard.aero.glide\n"
        "bad = [m for m in sys.modules if m.split('.')[0] in ('PySide6', 'pint', 'reportlab', 'tomlkit')]\n"
        "print(bad); sys.exit(1 if bad else 0)"
    )
    proc = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True)
    assert proc.returncode == 0, proc.stdout + proc.stderr


def test_command_line_table_does_not_load_qt():
    code = (
        "import sys; from kneeboard import cli, tables, report\n"
        "bad = [m for m in sys.modules if m.startswith('PySide6')]\n"
        "sys.exit(1 if bad else 0)"
    )
    assert subprocess.run([sys.executable, "-c", code]).returncode == 0


def test_the_first_frame_needs_neither_units_nor_numpy_nor_reportlab():
    """Start-up: the window and the fleet's list are on screen before the heavy libraries load (they come with
    the first profile's figures, one event-loop turn later)."""
    code = (
        "import os, sys, tempfile; os.environ['QT_QPA_PLATFORM'] = 'offscreen'\n"
        "from pathlib import Path\n"
        "from PySide6.QtCore import QSettings\n"
        "from PySide6.QtWidgets import QApplication\n"
        "app = QApplication([])\n"
        "from kneeboard.app.window import MainWindow\n"
        "from kneeboard.app.dialogs import show_caution_once\n"
        "tmp = tempfile.mkdtemp()\n"
        "w = MainWindow(QSettings(tmp + '/s.ini', QSettings.Format.IniFormat), Path(tmp) / 'r')\n"
        "w.show(); w.controller.show_fleet(Path(sys.argv[1])); app.processEvents()\n"
        "assert w.fleet.tree.model().rowCount() == 5, w.fleet.tree.model().rowCount()\n"
        "bad = sorted({m.split('.')[0] for m in sys.modules} & {'pint', 'numpy', 'reportlab'})\n"
        "print(bad); sys.exit(1 if bad else 0)"
    )
    from conftest import SAMPLES

    proc = subprocess.run([sys.executable, "-c", code, str(SAMPLES)], capture_output=True, text=True)
    assert proc.returncode == 0, proc.stdout + proc.stderr


# --- a styled fleet: check and table without Qt or reportlab, card without a usable display -----------------------

# an invented 2 x 1 pixel PNG, every chunk's checksum right
PNG_LOGO = base64.b64decode(
    "iVBORw0KGgoAAAANSUhEUgAAAAIAAAABCAYAAAD0In+KAAAAD0lEQVR4nGNQckn7DwQMABNLBMmFFcQnAAAAAElFTkSuQmCC")
SVG_LOGO = '<svg xmlns="http://www.w3.org/2000/svg" width="40" height="20"><rect width="40" height="20"/></svg>'


def styled_fleet(folder, logo: str):
    """A fleet folder of one sample, whose fleet style names an organization, blocks and a `logo` ("png" | "svg")."""
    import shutil

    from conftest import SAMPLES

    folder.mkdir()
    shutil.copy(SAMPLES / "demo_trainer.toml", folder)
    if logo == "png":
        (folder / "logo.png").write_bytes(PNG_LOGO)
    else:
        (folder / "logo.svg").write_text(SVG_LOGO)
    (folder / "fleet.style.toml").write_text(f'organization = "Demo Flying Club (invented)"\nlogo = "logo.{logo}"\n'
                                             'front = ["header", "margin-table", "limits"]\nbank_angles = [0, 30]\n')
    return folder / "demo_trainer.toml"


@pytest.mark.parametrize("logo", ["png", "svg"])
@pytest.mark.parametrize("command", ["check", "table"])
def test_check_and_table_of_a_styled_fleet_load_neither_qt_nor_reportlab_nor_a_block(tmp_path, command, logo):
    profile = styled_fleet(tmp_path / "fleet", logo)
    code = (
        "import sys\nfrom kneeboard import cli\n"
        f"code = cli.main([{command!r}, sys.argv[1]])\n"
        "loaded = [m for m in sys.modules if m.split('.')[0] in ('PySide6', 'reportlab')\n"
        "          or m.startswith(('kneeboard.card.blocks', 'kneeboard.card.layout'))\n"
        "          or m in ('kneeboard.card.logo', 'kneeboard.card.draw', 'kneeboard.card.render')]\n"
        "print('LOADED', loaded, file=sys.stderr); sys.exit(code or (3 if loaded else 0))"
    )
    env = {k: v for k, v in os.environ.items() if k != "QT_QPA_PLATFORM"}
    proc = subprocess.run([sys.executable, "-c", code, str(profile)], capture_output=True, text=True, env=env)
    assert proc.returncode == 0, proc.stdout + proc.stderr
    assert "LOADED []" in proc.stderr
    if command == "table":
        assert "30" in proc.stdout.split()  # the style's banks were applied


@pytest.mark.parametrize("command", ["check", "table", "card"])
def test_a_display_that_is_not_there_is_no_abort(tmp_path, command):
    """DISPLAY=:99 with nothing listening (or a stale SSH forwarding): Qt would abort with exit 134. A card still
    draws its SVG logo, offscreen."""
    from kneeboard.display import display_reachable

    profile = styled_fleet(tmp_path / "fleet", "svg")
    env = {k: v for k, v in os.environ.items() if k not in ("QT_QPA_PLATFORM", "WAYLAND_DISPLAY")}
    env["DISPLAY"] = ":99"
    assert not display_reachable(env)  # nothing listens there, as the test supposes
    out = tmp_path / "card.pdf"
    extra = ["-o", str(out)] if command == "card" else []
    proc = subprocess.run([sys.executable, "-m", "kneeboard", command, str(profile), *extra], capture_output=True,
                          text=True, env=env)
    assert proc.returncode == 0, proc.stdout + proc.stderr
    if command == "card":
        assert out.read_bytes().count(b"/Subtype /Image") >= 1  # the logo is on the card


def test_display_reachable_answers_from_the_socket(tmp_path):
    import socket

    from kneeboard.display import display_reachable

    path = tmp_path / "wayland-test"
    with socket.socket(socket.AF_UNIX, socket.SOCK_STREAM) as server:
        server.bind(str(path))
        server.listen(1)
        assert display_reachable({"WAYLAND_DISPLAY": str(path)}, "linux")
        assert display_reachable({"WAYLAND_DISPLAY": "wayland-test", "XDG_RUNTIME_DIR": str(tmp_path)}, "linux")
    assert not display_reachable({"WAYLAND_DISPLAY": str(tmp_path / "gone")}, "linux")
    assert not display_reachable({"DISPLAY": "not a display"}, "linux")
    assert not display_reachable({}, "linux")
    assert display_reachable({}, "darwin")  # elsewhere Qt's own platform is asked


# --- the card package: no import circle ---------------------------------------------------------------------------


def card_imports(package=None) -> dict[str, set[str]]:
    """Each module of kneeboard/card/ (or of `package`) -> the modules of it that it imports, at module level or
    inside a function (a lazy import is still an arrow)."""
    import ast
    from pathlib import Path

    import kneeboard.card

    package = package or kneeboard.card
    root = Path(package.__file__).parent
    top = Path(kneeboard.__file__).parent.parent
    modules = {}
    for path in sorted(root.rglob("*.py")):
        parts = path.relative_to(top).with_suffix("").parts
        modules[".".join(parts[:-1] if parts[-1] == "__init__" else parts)] = path
    graph = {}
    for name, path in modules.items():
        package = name if path.name == "__init__.py" else name.rsplit(".", 1)[0]
        found = set()
        for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
            targets = []
            if isinstance(node, ast.Import):
                targets = [alias.name for alias in node.names]
            elif isinstance(node, ast.ImportFrom):
                base = node.module or ""
                if node.level:  # a relative import, from the package up
                    up = package.split(".")[: len(package.split(".")) - node.level + 1]
                    base = ".".join(up + ([base] if base else []))
                names = [f"{base}.{alias.name}" for alias in node.names]
                # `from kneeboard.card import fonts` imports the submodule; a name of the package's own is an arrow
                # to the package
                targets = names + ([base] if not all(n in modules for n in names) else [])
            found |= {t for t in targets if t in modules and t != name}
        graph[name] = found
    return graph


def test_the_card_package_has_no_import_circle():
    graph = card_imports()
    assert "kneeboard.card.style" in graph and "kneeboard.card.header" not in graph
    assert "kneeboard.card.draw" in graph["kneeboard.card.blocks.header"]  # the graph sees imports
    assert "kneeboard.card.render" in graph["kneeboard.card"]  # and imports inside functions
    assert circles_of(graph) == []


def test_the_package_has_no_import_circle():
    """Across every module of kneeboard, imports inside functions counted: the command line's shared parts, the
    app's places and the inputs each sit below what imports them."""
    import kneeboard

    graph = card_imports(kneeboard)
    assert "kneeboard.cli_common" in graph["kneeboard.cli_compare"]  # the graph sees the whole package
    assert "kneeboard.inputs.toml" in graph["kneeboard.shipped"]  # and imports inside functions
    assert circles_of(graph) == []


def circles_of(graph: dict[str, set[str]]) -> list[list[str]]:
    """Every import circle a depth-first walk of `graph` meets, each as its modules in order."""
    state: dict[str, int] = {}
    circles = []

    def visit(module, trail):
        state[module] = 1
        for dep in sorted(graph[module]):
            if state.get(dep) == 1:
                circles.append(trail[trail.index(dep):] + [dep])
            elif dep not in state:
                visit(dep, trail + [dep])
        state[module] = 2

    for module in sorted(graph):
        if module not in state:
            visit(module, [module])
    return circles


def test_card_style_is_a_plain_value():
    deps = card_imports()["kneeboard.card.style"]
    heavy = ("kneeboard.card.blocks", "kneeboard.card.draw", "kneeboard.card.layout", "kneeboard.card.logo",
             "kneeboard.card.fonts")
    assert not [d for d in deps if d.startswith(heavy)], deps


def test_the_wheel_lists_every_package_of_kneeboard():
    """setuptools takes the packages as pyproject.toml lists them: a new folder left out of the list is missing
    from the wheel (tests/test_installed.py finds that too, minutes later)."""
    import tomllib
    from pathlib import Path

    import kneeboard

    top = Path(kneeboard.__file__).parent.parent
    folders = {".".join(p.parent.relative_to(top).parts) for p in (top / "kneeboard").rglob("__init__.py")}
    listed = set(tomllib.loads((top / "pyproject.toml").read_text(encoding="utf-8"))["tool"]["setuptools"]["packages"])
    assert "kneeboard.inputs" in folders
    assert folders <= listed, sorted(folders - listed)
