"""The card viewer: the card's own PDF bytes shown with QtPdf, with page, zoom and mode controls.

There is one renderer: the bytes shown are exactly the bytes that would be written or printed, and this widget
only displays them; the renders that make them run elsewhere (`preview_jobs.Renders`, scheduled by the controller).
This is the only module of the app that imports QtPdf.
"""

from PySide6.QtCore import (
    QBuffer,
    QByteArray,
    QIODevice,
    QObject,
    QPointF,
    QSizeF,
    Qt,
    QTimer,
    Signal,
)
from PySide6.QtGui import QAction, QActionGroup, QKeySequence
from PySide6.QtPdf import QPdfDocument
from PySide6.QtPdfWidgets import QPdfView
from PySide6.QtWidgets import QComboBox, QGridLayout, QLabel, QSizePolicy, QToolBar, QVBoxLayout, QWidget

from kneeboard.app.pages import page_labels
from kneeboard.app.words import Texts, tr
from kneeboard.i18n import N_, Msg
from kneeboard.problems import Told

__all__ = ["MODES", "ZOOM_STEPS", "CardPreview", "PdfProblem", "open_pdf"]

#: Custom zoom factors the zoom buttons step through (1.0 = the page at its true size on screen).
ZOOM_STEPS = (0.25, 0.33, 0.5, 0.67, 0.75, 0.9, 1.0, 1.1, 1.25, 1.5, 1.75, 2.0, 2.5, 3.0, 4.0)
#: What the preview can show: (mode, label). The controller decides which card each mode renders.
MODES = (("card", N_("Card")), ("letter", N_("Sheet (Letter)")), ("a4", N_("Sheet (A4)")))
BUSY_DELAY_MS = 300  #: renders quicker than this never flash the "Updating" note


class PdfProblem(Told, ValueError):
    """Bytes that are no PDF QtPdf can show; its message is told in the app's language."""


def open_pdf(pdf: bytes, parent: QObject | None = None) -> QPdfDocument:
    """A QPdfDocument reading `pdf`, from a QBuffer child of the document: the bytes live as long as it.

    Raises
    ------
    PdfProblem
        (a ValueError) When the bytes are not a PDF QtPdf can read, or have no page.
    """
    doc = QPdfDocument(parent)
    source = QBuffer(doc)
    source.setData(QByteArray(bytes(pdf)))
    source.open(QIODevice.OpenModeFlag.ReadOnly)
    doc.load(source)
    if doc.status() != QPdfDocument.Status.Ready or doc.pageCount() < 1:
        reason = doc.error().name if doc.status() == QPdfDocument.Status.Error else N_("no page")  # Qt's name as is
        doc.close()
        doc.deleteLater()
        raise PdfProblem(Msg("the PDF could not be read ({reason})", reason=reason))
    return doc


class CardPreview(QWidget):
    """The card as it will print, rendered from its PDF, with zoom, page and mode controls.

    Signals
    -------
    failed(str message)
        Bytes given to `show_pdf` could not be read; the message is shown over the last good page, which stays.
    modeChanged(str mode)
        The user chose "card", "letter" or "a4"; the controller answers with a new render.

    Child widgets have object names for tests and style sheets: ``previewView``, ``previewError``,
    ``pageSelector``, ``modeSelector``, and the actions ``zoomOut``, ``zoomIn``, ``fitWidth``,
    ``wholePage``.
    """

    failed = Signal(str)
    modeChanged = Signal(str)

    def __init__(self, parent: QWidget | None = None):
        super().__init__(parent)
        self._doc: QPdfDocument | None = None
        self._pdf: bytes | None = None
        self.texts = Texts()  #: the preview's words, shown again when the language changes
        self._busy_timer = QTimer(self, singleShot=True, interval=BUSY_DELAY_MS)
        self._busy_timer.timeout.connect(lambda: self._busy_action.setVisible(True))

        # two page views, in turn: the one shown, and one resting (see _replace_view)
        self._view = self._new_view(QPdfView.ZoomMode.FitInView, 1.0)
        self._resting = self._new_view(QPdfView.ZoomMode.FitInView, 1.0)
        self._resting.setObjectName("previewViewResting")
        self._resting.hide()

        # the message lies over the last good page: a translucent veil greys it without hiding it
        self._error = QWidget(self)
        self._error.setObjectName("previewError")
        self._error.setAttribute(Qt.WidgetAttribute.WA_StyledBackground)
        self._error.setAttribute(Qt.WidgetAttribute.WA_TransparentForMouseEvents)  # the page still scrolls
        self._error.setStyleSheet(
            "QWidget#previewError { background: rgba(225, 225, 225, 150); }"
            " QLabel { background: white; color: #7A1010; border: 2px solid #7A1010; padding: 12px; }")
        self._error_text = QLabel(self._error)
        self._error_text.setWordWrap(True)
        self._error_text.setAlignment(Qt.AlignmentFlag.AlignCenter)
        self._error_text.setMaximumWidth(420)
        veil = QVBoxLayout(self._error)
        veil.addWidget(self._error_text, 0, Qt.AlignmentFlag.AlignCenter)
        self._error.hide()

        self._toolbar = self._build_toolbar()
        self._stack = stack = QGridLayout()
        stack.setContentsMargins(0, 0, 0, 0)
        stack.addWidget(self._view, 0, 0)
        stack.addWidget(self._resting, 0, 0)
        stack.addWidget(self._error, 0, 0)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(0, 0, 0, 0)
        layout.setSpacing(0)
        layout.addWidget(self._toolbar)
        layout.addLayout(stack, 1)
        self._sync_zoom_controls()

    def _new_view(self, zoom_mode: QPdfView.ZoomMode, zoom: float) -> QPdfView:
        """One of the preview's two page views (see _replace_view for why two)."""
        view = QPdfView(self)
        view.setObjectName("previewView")
        view.setPageMode(QPdfView.PageMode.SinglePage)
        view.setZoomMode(zoom_mode)
        view.setZoomFactor(zoom)
        view.setSizePolicy(QSizePolicy.Policy.Expanding, QSizePolicy.Policy.Expanding)
        view.pageNavigator().currentPageChanged.connect(self._sync_page_selector)
        view.zoomModeChanged.connect(self._sync_zoom_controls)
        view.zoomFactorChanged.connect(self._sync_zoom_controls)
        return view

    # ------------------------------------------------------------------ controls

    def _build_toolbar(self) -> QToolBar:
        bar = QToolBar(self)
        self.texts.set(bar.setWindowTitle, N_("Preview"))
        bar.setToolButtonStyle(Qt.ToolButtonStyle.ToolButtonTextOnly)

        def action(name: str, text: str, tip: str, slot, keys=None) -> QAction:
            act = QAction(self)
            act.setObjectName(name)
            if text in ("\u2212", "+"):
                act.setText(text)
            else:
                self.texts.set(act.setText, text)
            self.texts.set(act.setToolTip, tip)
            if keys is not None:
                act.setShortcut(keys)
                # only while the preview has focus: the editor keeps its own keys
                act.setShortcutContext(Qt.ShortcutContext.WidgetWithChildrenShortcut)
                self.addAction(act)
            act.triggered.connect(slot)
            bar.addAction(act)
            return act

        self._zoom_out = action("zoomOut", "\u2212", N_("Zoom out"), self.zoom_out, QKeySequence.StandardKey.ZoomOut)
        self._zoom_label = QLabel(bar)
        self._zoom_label.setObjectName("zoomLabel")
        self._zoom_label.setMinimumWidth(self._zoom_label.fontMetrics().horizontalAdvance("400 %") + 8)
        self._zoom_label.setAlignment(Qt.AlignmentFlag.AlignCenter)
        bar.addWidget(self._zoom_label)
        self._zoom_in = action("zoomIn", "+", N_("Zoom in"), self.zoom_in, QKeySequence.StandardKey.ZoomIn)
        fits = QActionGroup(self)
        fits.setExclusionPolicy(QActionGroup.ExclusionPolicy.ExclusiveOptional)
        self._fit_width = action("fitWidth", N_("Fit width"), N_("Fit the page's width to the view"),
                                 lambda: self._set_zoom(QPdfView.ZoomMode.FitToWidth))
        self._whole_page = action("wholePage", N_("Whole page"), N_("Show the whole page"),
                                  lambda: self._set_zoom(QPdfView.ZoomMode.FitInView))
        for act in (self._fit_width, self._whole_page):
            act.setCheckable(True)
            fits.addAction(act)
        bar.addSeparator()

        self._pages = QComboBox(bar)
        self._pages.setObjectName("pageSelector")
        self.texts.set(self._pages.setToolTip, N_("Page shown"))
        self._pages.setSizeAdjustPolicy(QComboBox.SizeAdjustPolicy.AdjustToContents)
        self._pages.currentIndexChanged.connect(self._page_chosen)
        self._pages_action = bar.addWidget(self._pages)
        self._pages_action.setVisible(False)

        spacer = QWidget(bar)
        spacer.setSizePolicy(QSizePolicy.Policy.Expanding, QSizePolicy.Policy.Preferred)
        bar.addWidget(spacer)
        busy = QLabel(bar)
        self.texts.set(busy.setText, N_("Updating\u2026"))
        self._busy_action = bar.addWidget(busy)
        self._busy_action.setVisible(False)
        self._modes = QComboBox(bar)
        self._modes.setObjectName("modeSelector")
        self.texts.set(self._modes.setToolTip, N_("Show the card alone or imposed on a printing sheet"))
        for mode, label in MODES:
            self._modes.addItem(tr(label), mode)
        self._modes.currentIndexChanged.connect(lambda _i: self.modeChanged.emit(self.mode()))
        bar.addWidget(self._modes)
        return bar

    def retranslate(self) -> None:
        """The app's language changed: the controls' words, the modes and the pages' names in it."""
        self.texts.again()
        for i, (_mode, label) in enumerate(MODES):
            self._modes.setItemText(i, tr(label))
        self._fill_page_selector(self.page_count(), max(0, self.current_page()) if self.page_count() else -1)

    def _set_zoom(self, mode: QPdfView.ZoomMode, factor: float | None = None) -> None:
        self._view.setZoomMode(mode)
        if factor is not None:
            self._view.setZoomFactor(factor)
        self._sync_zoom_controls()

    def _effective_zoom(self) -> float:
        """The zoom factor the page is drawn at, in the fit modes too (QPdfView keeps those to itself)."""
        view = self._view
        if view.zoomMode() == QPdfView.ZoomMode.Custom or self._doc is None:
            return view.zoomFactor()
        # QPdfView draws a page at zoom 1 at its true size on a screen of the logical resolution
        points = self._doc.pagePointSize(max(0, self.current_page()))
        scale = self.logicalDpiX() / 72.0
        margins = view.documentMargins()
        port = view.viewport().size()
        across = (port.width() - margins.left() - margins.right()) / max(1.0, points.width() * scale)
        if view.zoomMode() == QPdfView.ZoomMode.FitToWidth:
            return max(0.01, across)
        down = (port.height() - margins.top() - margins.bottom()) / max(1.0, points.height() * scale)
        return max(0.01, min(across, down))

    def zoom_in(self) -> None:
        """Next larger zoom step, from whatever size the page has now."""
        now = self._effective_zoom()
        self._set_zoom(QPdfView.ZoomMode.Custom, next((z for z in ZOOM_STEPS if z > now * 1.01), ZOOM_STEPS[-1]))

    def zoom_out(self) -> None:
        """Next smaller zoom step, from whatever size the page has now."""
        now = self._effective_zoom()
        smaller = [z for z in ZOOM_STEPS if z < now / 1.01]
        self._set_zoom(QPdfView.ZoomMode.Custom, smaller[-1] if smaller else ZOOM_STEPS[0])

    def _sync_zoom_controls(self, *_args) -> None:
        mode = self._view.zoomMode()
        self._fit_width.setChecked(mode == QPdfView.ZoomMode.FitToWidth)
        self._whole_page.setChecked(mode == QPdfView.ZoomMode.FitInView)
        zoom = self._effective_zoom()
        self._zoom_label.setText(f"{round(zoom * 100)} %")
        self._zoom_in.setEnabled(zoom < ZOOM_STEPS[-1] / 1.01)
        self._zoom_out.setEnabled(zoom > ZOOM_STEPS[0] * 1.01)

    def resizeEvent(self, event) -> None:
        super().resizeEvent(event)
        self._sync_zoom_controls()  # a fit mode's percentage follows the view's size

    def _page_chosen(self, index: int) -> None:
        if index >= 0 and self._doc is not None and index != self.current_page():
            self.set_page(index)

    def _sync_page_selector(self, page: int) -> None:
        if 0 <= page < self._pages.count() and self._pages.currentIndex() != page:
            self._pages.blockSignals(True)
            self._pages.setCurrentIndex(page)
            self._pages.blockSignals(False)

    def _fill_page_selector(self, count: int, current: int) -> None:
        labels = page_labels(count, self.mode())
        self._pages.blockSignals(True)
        if [self._pages.itemText(i) for i in range(self._pages.count())] != labels:
            self._pages.clear()
            self._pages.addItems(labels)
        self._pages.setCurrentIndex(current)
        self._pages.blockSignals(False)
        self._pages_action.setVisible(count > 1)

    # ------------------------------------------------------------------ what to show

    def set_busy(self, busy: bool) -> None:
        """A render is running for this view: "Updating" shows once it has taken longer than BUSY_DELAY_MS."""
        if busy:
            if not self._busy_timer.isActive() and not self._busy_action.isVisible():
                self._busy_timer.start()
        else:
            self._busy_timer.stop()
            self._busy_action.setVisible(False)

    def show_pdf(self, data: bytes) -> bool:
        """Show `data`, a card's PDF, as current; False (and the reason shown over the last good page) when it
        cannot be read."""
        try:
            doc = open_pdf(data, self)
        except ValueError as exc:
            self.show_error(tr("The preview could not show this card: {reason}.", reason=str(exc)))
            return False
        # a new render of the same card must not move the reader: keep page, zoom and scroll
        page = max(0, self.current_page())
        scroll = (self._view.horizontalScrollBar().value(), self._view.verticalScrollBar().value())
        self._doc, self._pdf = doc, data
        view = self._replace_view(doc)
        page = min(page, doc.pageCount() - 1)
        if view.pageNavigator().currentPage() != page:
            view.pageNavigator().jump(page, QPointF(), 0)
        view.horizontalScrollBar().setValue(scroll[0])
        view.verticalScrollBar().setValue(scroll[1])
        self._fill_page_selector(doc.pageCount(), page)
        self._error.hide()
        self._sync_zoom_controls()
        return True

    def _replace_view(self, doc: QPdfDocument | None) -> QPdfView:
        """Show `doc` in the resting view and put the shown one to rest; returns the view now shown.

        QPdfView renders pages on a worker thread and caches each image under the page's number alone: a render
        of the previous document that finished after setDocument() landed in that cache as the new document's
        page, and stayed there for good (the header named the new card, the page showed the old one). So a new
        document never goes to the view that showed the last one. It goes to the resting view, which has painted
        nothing since it was put to rest a whole render ago: what its worker still had to deliver was posted to
        this thread before the render that brings `doc` came back, so it has landed already, and setDocument()
        clears it away. The views live as long as the preview (creating and deleting a view per card was tried:
        rare heap corruption in full test runs). A document is deleted only once its view shows another one:
        setDocument() waits for the view's worker to finish what it was reading.
        """
        shown, view = self._view, self._resting
        previous = view.document()
        view.setZoomMode(shown.zoomMode())
        view.setZoomFactor(shown.zoomFactor())
        view.setGeometry(shown.geometry())  # the page is laid out for the view's size before it is shown
        view.setDocument(doc)
        if previous is not None and previous is not doc:
            previous.deleteLater()
        self._view, self._resting = view, shown
        view.setObjectName("previewView")
        shown.setObjectName("previewViewResting")
        view.setHidden(shown.isHidden())  # hidden only if the shown one was, not merely while the window is
        shown.hide()
        self._error.raise_()
        return view

    def show_error(self, message: str) -> None:
        """The newest card could not be made: `message` over the last good page, which stays, greyed."""
        self.mark_stale(message)
        self.failed.emit(message)

    def mark_stale(self, message: str) -> None:
        """The page shown is no longer the card as it prints: grey it under `message`. The next `show_pdf` shows
        its card as current again."""
        self._error_text.setText(message)
        self._error.show()
        self._error.raise_()

    def clear(self) -> None:
        """Show nothing."""
        self._replace_view(None)  # an empty view is shown; the card shown rests, deleted when its view is reused
        self._doc = self._pdf = None
        self._error.hide()
        self._fill_page_selector(0, -1)

    # ------------------------------------------------------------------ what is shown now

    def pdf_bytes(self) -> bytes | None:
        """The PDF shown now (the last good one while an error is displayed), or None."""
        return self._pdf

    def page_count(self) -> int:
        return self._doc.pageCount() if self._doc is not None else 0

    def page_size_points(self, i: int) -> QSizeF:
        """Size of page `i` of the shown PDF [pt]."""
        self._check_page(i)
        return self._doc.pagePointSize(i)

    def current_page(self) -> int:
        """Index of the page shown (0 is the front); -1 when nothing is shown."""
        return self._view.pageNavigator().currentPage() if self._doc is not None else -1

    def set_page(self, i: int) -> None:
        self._check_page(i)
        self._view.pageNavigator().jump(i, QPointF(), 0)
        self._sync_page_selector(i)

    def zoom_mode(self) -> QPdfView.ZoomMode:
        return self._view.zoomMode()

    def zoom_factor(self) -> float:
        """The custom zoom factor (1.0 is true size); meaningful when `zoom_mode()` is Custom."""
        return self._view.zoomFactor()

    def error_text(self) -> str:
        """The failure message shown over the page, or "" when the shown PDF is current."""
        return self._error_text.text() if not self._error.isHidden() else ""

    def mode(self) -> str:
        """"card", "letter" or "a4": what the user chose to see."""
        return self._modes.currentData()

    def set_mode(self, mode: str) -> None:
        """Choose the mode as the user would; emits modeChanged when it changes."""
        index = self._modes.findData(mode)
        if index < 0:
            raise ValueError(f"unknown preview mode {mode!r}; expected one of {[m for m, _ in MODES]}")
        self._modes.setCurrentIndex(index)

    def _check_page(self, i: int) -> None:
        if not 0 <= i < self.page_count():
            raise IndexError(f"page {i} does not exist; the preview shows {self.page_count()} page(s)")
