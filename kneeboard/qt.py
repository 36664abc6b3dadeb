"""Qt start-up shared by the command line's PNG and SVG work and the app."""

import os


def ensure_gui_app():
    """An application object for headless rendering; reuses the running one (the app's) if any.

    It is a full QApplication, not a bare QGuiApplication: Qt allows one application object per
    process, and widgets created later in the same process (the app, a test) need the full one.
    """
    import threading

    from PySide6.QtCore import QCoreApplication
    from PySide6.QtWidgets import QApplication

    app = QCoreApplication.instance()
    if app is None:
        if threading.current_thread() is not threading.main_thread():
            # Qt's application object belongs to the main thread; one made elsewhere corrupts Qt's event loop later
            raise RuntimeError("the Qt application must be started on the main thread before rendering elsewhere")
        if not os.environ.get("QT_QPA_PLATFORM"):
            from kneeboard.display import display_reachable, window_problem

            # headless work needs no screen: without a display Qt can use (none set, none answering where DISPLAY
            # points, or the xcb libraries missing) Qt would abort the process, so it draws offscreen instead
            if not display_reachable() or window_problem() is not None:
                os.environ["QT_QPA_PLATFORM"] = "offscreen"
        app = QApplication(["kneeboard"])
    return app
