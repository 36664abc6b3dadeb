"""Starting the desktop app: `kneeboard` alone, or `kneeboard PROFILE_OR_FOLDER`."""

import os
import sys
import time
from pathlib import Path

STARTED = time.perf_counter()


def run(target: str | None = None) -> int:
    from PySide6.QtCore import QTimer
    from PySide6.QtWidgets import QApplication

    from kneeboard.app.dialogs import show_caution_once
    from kneeboard.app.places import sample_fleet
    from kneeboard.app.window import MainWindow

    app = QApplication.instance() or QApplication(sys.argv[:1])
    app.setApplicationName("kneeboard")
    app.setOrganizationName("kneeboard")
    window = MainWindow()
    controller = window.controller
    last = controller.settings.value("last_folder")
    if target is not None and not Path(target).exists():
        from kneeboard.app.words import tr

        print(tr("kneeboard: {path}: no such file or folder", path=target), file=sys.stderr)
        return 2
    start = Path(target) if target else (Path(last) if last and Path(last).is_dir() else sample_fleet())
    window.show()

    # The window is on screen before the units library, numpy and the card machinery load; the fleet's list
    # follows on the next turn of the event loop, then the first profile and its card, then each profile's mark.
    def fleet_shown() -> None:
        controller.show_fleet(start)
        if os.environ.get("KNEEBOARD_STARTUP_PROBE"):  # the benchmark: report when the fleet is shown, then quit
            QTimer.singleShot(0, lambda: _probe_and_quit(app))
            return
        QTimer.singleShot(0, first_profile)

    def first_profile() -> None:
        controller.open_path(start)
        show_caution_once(window, controller.settings)
        controller.offer_recovery()

    QTimer.singleShot(0, fleet_shown)
    return app.exec()


def _probe_and_quit(app) -> None:
    import resource

    peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    print(f"kneeboard: window shown after {time.perf_counter() - STARTED:.3f} s, peak {peak} KiB", file=sys.stderr)
    app.quit()
