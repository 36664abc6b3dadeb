"""Run a call that must not block, in a thread with a generous bound, so a regression fails instead of hanging.

The bound is no speed assertion: it is reached only when the call blocks (on a FIFO, say).
"""

import threading

HANG_GUARD_S = 30  #: far beyond any read or check; reached only when a call blocks


def promptly(function, *args):
    """Run `function(*args)` in a thread; {"value": ...} or {"error": ...}, failing the test if it never returns."""
    from kneeboard.qt import ensure_gui_app

    ensure_gui_app()  # Qt's application belongs to the main thread: start it here, before the call may need it
    outcome = {}

    def run():
        try:
            outcome["value"] = function(*args)
        except BaseException as exc:  # handed back to the test
            outcome["error"] = exc

    thread = threading.Thread(target=run, daemon=True)
    thread.start()
    thread.join(HANG_GUARD_S)
    assert not thread.is_alive(), f"{getattr(function, '__name__', function)}{args} blocked"
    return outcome
