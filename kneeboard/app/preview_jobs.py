"""Preview renders: a card's PDF built on a pool thread, the newest request's result only, and no widget.

`Renders` is a latest-wins job runner. At most one job runs and at most one waits (the newest; a job replaced
while it waits never runs), and only the newest request's result is reported: a result older than the newest
request, or one cancelled, is dropped when it comes. The controller asks for renders and passes the result to the
viewer (`preview.CardPreview`), which only shows bytes.

Results reach the GUI thread through a relay owned by the application, not by the runner, so a result arriving
after the runner is gone finds a living receiver that discards it.
"""

import logging
import weakref
from collections.abc import Callable
from dataclasses import dataclass
from time import perf_counter

import shiboken6
from PySide6.QtCore import QCoreApplication, QObject, QRunnable, QThreadPool, Signal, Slot

log = logging.getLogger(__name__)

Job = Callable[[], bytes]


def failure_text(exc: Exception) -> str:
    # a LayoutError's text is already a sentence for the pilot; anything else at least names itself
    from kneeboard.app.words import tr

    return str(exc) or tr("The card could not be drawn ({error}).", error=type(exc).__name__)


@dataclass
class Request:
    generation: int
    job: Job
    started: float  #: perf_counter() when request() was called [s]


class Renders(QObject):
    """Runs card jobs off the GUI thread; the newest request wins.

    Signals
    -------
    done(int generation, object pdf, float milliseconds)
        The newest job returned its PDF bytes; the time runs from its `request()`.
    failed(int generation, str message)
        The newest job raised; the message is a sentence for the pilot.
    busyChanged(bool busy)
        Whether a job whose result is wanted runs or waits (a viewer shows "Updating" from it).
    """

    done = Signal(int, object, float)
    failed = Signal(int, str)
    busyChanged = Signal(bool)

    def __init__(self, parent: QObject | None = None):
        super().__init__(parent)
        self.generation = 0  #: the newest generation requested
        self._running: Request | None = None
        self._pending: Request | None = None
        self._busy = False
        self._relay = Relay(self)
        self.destroyed.connect(self._relay.detach)

    def request(self, job: Job) -> int:
        """Schedule `job` (it builds the PDF bytes) on a worker thread; returns its generation.

        Never blocks. If a job is running, `job` waits in its place; a job already waiting is dropped without
        running, since its result would be stale before it was shown.
        """
        self.generation += 1
        request = Request(self.generation, job, perf_counter())
        if self._running is None:
            self._start(request)
        else:
            self._pending = request
        self._tell_busy()
        return request.generation

    def cancel(self) -> None:
        """Want no result of what was asked so far: a running job ends on its own and its result is dropped, a
        waiting job never runs."""
        self.generation += 1
        self._pending = None
        self._tell_busy()

    def busy(self) -> bool:
        """Whether a job whose result is still wanted runs or waits. One cancelled, or one whose runner was deleted,
        is not: it ends on its own, and its result is dropped when it comes."""
        if not shiboken6.isValid(self):
            return False  # the runner is gone: its relay drops whatever still comes back
        running = self._running is not None and self._running.generation == self.generation
        return running or self._pending is not None

    def _start(self, request: Request) -> None:
        self._running = request
        self._relay.outstanding += 1
        QThreadPool.globalInstance().start(Runner(request, self._relay))

    def _finished(self, generation: int, data: bytes | None, error: str) -> None:
        """A job came back (GUI thread): reported unless a newer one was asked for since."""
        request, self._running = self._running, None
        if self._pending is not None:
            waiting, self._pending = self._pending, None
            self._start(waiting)
        if generation == self.generation and request is not None:
            if data is not None:
                self.done.emit(generation, data, (perf_counter() - request.started) * 1000.0)
            else:
                self.failed.emit(generation, error)
        self._tell_busy()

    def _tell_busy(self) -> None:
        busy = self.busy()
        if busy != self._busy:
            self._busy = busy
            self.busyChanged.emit(busy)


class Relay(QObject):
    """Carries finished jobs from pool threads to the GUI thread, and outlives its runner.

    It is a child of the application, so a worker never emits on a deleted object; once its runner is gone it
    discards what still arrives and deletes itself after the last result.
    """

    done = Signal(int, object, str)  #: generation, PDF bytes or None, failure text ("" on success)

    def __init__(self, target: Renders):
        super().__init__(QCoreApplication.instance())
        self.outstanding = 0  #: jobs started whose result has not come back yet
        self._target = weakref.WeakMethod(target._finished)
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
