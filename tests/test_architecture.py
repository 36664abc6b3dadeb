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
