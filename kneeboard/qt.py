"""Qt start-up shared by the command line's PNG and SVG work and the app."""

import os


def ensure_gui_app():
    """A QGuiApplication for headless rendering; reuses the running one (the app's) if any."""
    from PySide6.QtGui import QGuiApplication

    app = QGuiApplication.instance()
    if app is None:
        if not os.environ.get("DISPLAY") and not os.environ.get("WAYLAND_DISPLAY"):
            os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
        app = QGuiApplication(["kneeboard"])
    return app
