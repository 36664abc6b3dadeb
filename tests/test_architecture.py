"""The import rules of DEVELOPERS.md, checked."""

import subprocess
import sys


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
