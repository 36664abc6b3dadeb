"""Starting the desktop app: `kneeboard` alone, or `kneeboard PROFILE_OR_FOLDER`."""

import sys
from pathlib import Path


def run(target: str | None = None) -> int:
    from PySide6.QtWidgets import QApplication

    from kneeboard.app.dialogs import show_caution_once
    from kneeboard.app.paths import SAMPLES
    from kneeboard.app.window import MainWindow

    app = QApplication.instance() or QApplication(sys.argv[:1])
    app.setApplicationName("kneeboard")
    app.setOrganizationName("kneeboard")
    window = MainWindow()
    last = window.settings.value("last_folder")
    if target is not None and not Path(target).exists():
        print(f"kneeboard: {target}: no such file or folder", file=sys.stderr)
        return 2
    start = Path(target) if target else (Path(last) if last and Path(last).is_dir() else SAMPLES)
    window.show()
    window.open_path(start)
    show_caution_once(window, window.settings)
    window.offer_recovery()
    return app.exec()
