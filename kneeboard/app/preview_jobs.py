"""Preview jobs: a card's PDF built on a pool thread, and the relay that carries it back to the GUI thread.

At most one job of a preview runs and at most one waits (see preview.CardPreview.request); this module only runs
a job and always reports back, whatever the job does.
"""

import logging
import weakref
from collections.abc import Callable
from dataclasses import dataclass

import shiboken6
from PySide6.QtCore import QCoreApplication, QObject, QRunnable, Signal, Slot

log = logging.getLogger(__name__)

Job = Callable[[], bytes]


def failure_text(exc: Exception) -> str:
    # a LayoutError's text is already a sentence for the pilot; anything else at least names itself
    return str(exc) or f"The card could not be drawn ({type(exc).__name__})."


@dataclass
class Request:
    generation: int
    job: Job
    started: float  #: perf_counter() when request() was called [s]


class Relay(QObject):
    """Carries finished jobs from pool threads to the GUI thread, and outlives its widget.

    It is a child of the application, so a worker never emits on a deleted object; once its
    widget is gone it discards what still arrives and deletes itself after the last result.
    """

    done = Signal(int, object, str)  #: generation, PDF bytes or None, failure text ("" on success)

    def __init__(self, widget: QObject):  # a preview.CardPreview
        super().__init__(QCoreApplication.instance())
        self.outstanding = 0  #: jobs started whose result has not come back yet
        self._target = weakref.WeakMethod(widget._finished)
        # emitted from a pool thread, received here in the GUI thread: a queued connection
        self.done.connect(self._deliver)

    def detach(self) -> None:
        self._target = None
        if self.outstanding == 0:
            self.deleteLater()

    @Slot(int, object, str)
    def _deliver(self, generation: int, data: bytes | None, error: str) -> None:
        self.outstanding -= 1
        method = self._target() if self._target is not None else None
        if method is not None and shiboken6.isValid(method.__self__):
            method(generation, data, error)
        elif self.outstanding == 0:
            self._target = None
            self.deleteLater()


class Runner(QRunnable):
    """Runs one job on a pool thread and always reports back, whatever the job does."""

    def __init__(self, request: Request, relay: Relay):
        super().__init__()
        self._request = request
        self._relay = relay

    def run(self) -> None:
        data, error = None, ""
        try:
            data = self._request.job()
            if not isinstance(data, bytes | bytearray):
                raise TypeError(f"a preview job must return PDF bytes, not {type(data).__name__}")
            data = bytes(data)
        except Exception as exc:  # every failure must reach the user; a lost one would hang the preview
            log.debug("preview job %d failed", self._request.generation, exc_info=True)
            data, error = None, failure_text(exc)
        self._relay.done.emit(self._request.generation, data, error)
