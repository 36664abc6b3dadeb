"""Preview latency: from a changed field value to the new preview being ready, in the app, offscreen; each edit
followed by the card floor (reportlab alone drawing the same card), in the same process."""

import os
import tempfile
import time
from pathlib import Path

from benchmarks.card import FLOOR_IS, LARGEST, floor_sampler
from benchmarks.stats import figure, ratios_of, summary

WARM = 3  #: the first edits fill caches


def run(smoke: bool = False, env: dict | None = None, work: Path | None = None) -> dict:
    os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    from PySide6.QtCore import QEventLoop, QSettings, QTimer
    from PySide6.QtWidgets import QApplication

    from kneeboard.app.window import MainWindow

    app = QApplication.instance() or QApplication([])  # kept alive for the whole measurement
    assert app is not None
    repeats = 5 if smoke else 150
    floor = floor_sampler()
    with tempfile.TemporaryDirectory() as tmp:
        settings = QSettings(str(Path(tmp) / "s.ini"), QSettings.Format.IniFormat)
        window = MainWindow(settings, recovery_dir=Path(tmp) / "recovery")
        window.show()
        window.open_profile(LARGEST)
        window.preview.wait_idle(10_000)
        done = []
        loop = QEventLoop()
        window.preview.rendered.connect(lambda *_: (done.append(time.perf_counter()), loop.quit()))
        field = window.editor.fields["aircraft.max_weight"]
        samples, floors = [], []
        for i in range(repeats + WARM):
            text = f"{1150 + (i % 40)} kg"  # a printed figure changes with every edit: each one must render
            done.clear()
            t = time.perf_counter()
            field.input.setText(text)
            field.input.textEdited.emit(text)  # what one keystroke that completes a value does
            # wait the way the app waits: idle in an event loop, not spinning (a spinning loop would take
            # the interpreter lock from the render thread and measure the benchmark, not the app)
            QTimer.singleShot(10_000, loop.quit)
            if not done:
                loop.exec()
            if not done:
                raise RuntimeError("the preview did not update within 10 s")
            window.preview.wait_idle(5000)
            if i >= WARM:
                samples.append((done[0] - t) * 1000)
                floors.append(floor())
        window.doc.undo_stack.setClean()
        window.close()
    return {"preview": figure(summary(samples, "ms"), summary(floors, "ms"), ratios_of(samples, floors), FLOOR_IS,
                              {"ratio p50": 1.5, "ratio p95": 2.5}, smoke,
                              what="an edited weight in the app to its new preview rendered, in-process")}
