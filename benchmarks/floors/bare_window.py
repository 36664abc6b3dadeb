"""The start-up floor: a bare PySide6 process that shows an empty 1400 x 900 main window and quits after its first
frame, the way the app's start-up probe quits after its own (a zero timer once the window is shown)."""

import sys

from PySide6.QtCore import QTimer
from PySide6.QtWidgets import QApplication, QMainWindow

app = QApplication(sys.argv[:1])
window = QMainWindow()
window.resize(1400, 900)
window.show()
QTimer.singleShot(0, app.quit)
sys.exit(app.exec())
