"""Qt start-up shared by the command line's PNG and SVG work and the app."""

import os


def ensure_gui_app():
    """An application object for headless rendering; reuses the running one (the app's) if any.

    It is a full QApplication, not a bare QGuiApplication: Qt allows one application object per
    process, and widgets created later in the same process (the app, a test) need the full one.
    """
    from PySide6.QtCore import QCoreApplication
    from PySide6.QtWidgets import QApplication

    app = QCoreApplication.instance()
    if app is None:
        if not os.environ.get("DISPLAY") and not os.environ.get("WAYLAND_DISPLAY"):
            os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
        app = QApplication(["kneeboard"])
    return app
