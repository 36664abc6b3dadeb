"""The one renderer: draws layout pages into vector PDF with reportlab, fonts embedded.

The app previews exactly these bytes and the command line writes them, so what is seen is
what prints.
"""

import io
from functools import cache, lru_cache

from reportlab import rl_config
from reportlab.lib.colors import HexColor
from reportlab.lib.utils import ImageReader
from reportlab.pdfgen.canvas import Canvas

from kneeboard import __version__
from kneeboard.card import fonts
from kneeboard.card.ops import Circle, Image, Line, Path, Rect, SideText, Text

HATCH_SPACING = 2.8  #: distance between hatch lines [pt]


@cache
def _binary_streams() -> None:
    """Compressed streams in binary rather than ASCII85: the file a quarter smaller and a third quicker to draw.

    reportlab keeps this as a process-wide setting (rl_config.useA85, no per-document option); it is set here,
    when the renderer first draws, so importing kneeboard changes nothing in another program's reportlab.
    Binary streams are valid PDF for every reader.
    """
    rl_config.useA85 = 0


class PdfWriter:
    """A PDF drawn page by page: a fleet's pages go in as they are laid out, so no fleet is held in memory whole.

    Only the compressed page streams stay until `finish()`; each page's layout can be dropped once it is added.
    """

    def __init__(self, title: str = "kneeboard card", subject: str = ""):
        fonts.register()
        _binary_streams()
        self._buf = io.BytesIO()
        self._canvas: Canvas | None = None
        self._title, self._subject = title, subject
        self._attachments: list[tuple[str, bytes, str]] = []
        self._keywords = ""
        self.pages = 0

    def add(self, pages) -> None:
        for page in pages:
            c = self._canvas
            if c is None:
                # the initial font is ours too, so no unembedded standard font is ever referenced
                c = self._canvas = Canvas(self._buf, pagesize=(page.width, page.height), invariant=1,
                                          pageCompression=1, initialFontName=fonts.REGULAR, initialFontSize=10)
                c.setTitle(self._title)
                c.setSubject(self._subject)
                c.setCreator(f"kneeboard {__version__}")
            c.setPageSize((page.width, page.height))
            for part in page.parts:
                draw_ops(c, part.ops, part.dx, part.dy)
            c.showPage()
            _compress_now(c)
            self.pages += 1

    def attach(self, name: str, data: bytes, description: str = "") -> None:
        """Embed a file (`name`, `data`) in the PDF: an embedded file (ISO 32000-1, 7.11.4), compressed and marked
        so that a reader without a PDF library finds it again (`kneeboard.card.data.read_card_data`)."""
        import zlib

        # compressed now: a fleet's thousands of attachments wait for the end of the file at a tenth of their size.
        # zlib's default level, as for the pages: level 9 took twice the time (0.4 against 0.2 ms a card) for a
        # stream 6 % smaller (1.87 against 1.98 kB)
        self._attachments.append((name, len(data), zlib.compress(data), description))

    def set_keywords(self, keywords: str) -> None:
        """The document information's keywords (a card's fingerprint, so file browsers show it)."""
        self._keywords = keywords

    def finish(self) -> bytes:
        """The PDF's bytes; a writer that got no page makes none (ValueError)."""
        self._close(self._buf)
        return self._buf.getvalue()

    def finish_into(self, file) -> None:
        """Write the PDF into an open binary `file` (a large fleet's file goes there without a copy in memory)."""
        self._close(file)

    def _close(self, file) -> None:
        if self._canvas is None:
            raise ValueError("a PDF needs at least one page")
        if self._keywords:
            self._canvas.setKeywords(self._keywords)
        if self._attachments:
            _embed(self._canvas, self._attachments)
        self._canvas._filename = file  # reportlab writes the document to this file object when saving
        self._canvas.save()


def _compress_now(canvas: Canvas) -> None:
    """Compress the page just finished now, not when the file is written: a fleet of thousands of cards then holds
    each page's few compressed kilobytes, not its drawing commands (a quarter of the memory). The bytes are the
    ones reportlab itself writes (the same zlib stream, marked FlateDecode)."""
    import zlib

    from reportlab.pdfbase.pdfdoc import PDFArray, PDFDictionary, PDFName, PDFStream

    page = canvas._doc.Pages.pages[-1]
    if page.Contents or not page.stream:
        return
    code = page.stream.encode("utf8") if isinstance(page.stream, str) else page.stream
    page.Contents = PDFStream(PDFDictionary({"Filter": PDFArray([PDFName("FlateDecode")])}), zlib.compress(code))
    page.Contents.__Comment__ = "page stream"
    page.stream = None


def pdf_bytes(pages, title: str = "kneeboard card", subject: str = "", attachments=(), keywords: str = "") -> bytes:
    """One PDF page per layout page, each page box exactly the page's size; `attachments` are (name, bytes,
    description) embedded files."""
    writer = PdfWriter(title, subject)
    writer.add(pages)
    for name, data, description in attachments:
        writer.attach(name, data, description)
    writer.set_keywords(keywords)
    return writer.finish()


def _embed(canvas: Canvas, files) -> None:
    """The document's embedded files name tree (ISO 32000-1, 7.7.4 and 7.11)."""
    from reportlab.pdfbase.pdfdoc import PDFArray, PDFDictionary, PDFName, PDFStream, PDFString

    from kneeboard.card.data import COMPRESSED_MARK

    doc = canvas._doc
    names = []
    for name, size, compressed, description in files:
        # compressed, and marked so that `read_card_data` finds it with zlib alone, without a PDF library
        stream = PDFStream(PDFDictionary({"Type": PDFName("EmbeddedFile"), "Subtype": PDFName("application#2Fjson"),
                                          "Params": PDFDictionary({"Size": size}),
                                          "Filter": PDFArray([PDFName("FlateDecode")]),
                                          COMPRESSED_MARK: PDFName("Card")}), compressed)
        spec = PDFDictionary({"Type": PDFName("Filespec"), "F": PDFString(name), "UF": PDFString(name),
                              "Desc": PDFString(description), "EF": PDFDictionary({"F": doc.Reference(stream)})})
        names += [PDFString(name), doc.Reference(spec)]
    doc.Catalog.Names = PDFDictionary({"EmbeddedFiles": PDFDictionary({"Names": PDFArray(names)})})


class _Pen:
    """The graphics state a part has set so far: each colour, width and dash is written into the page only when it
    changes (reportlab writes every call), so a table of a hundred lines sets its colour once, not a hundred times.
    None means not known, so the first use always writes it."""

    __slots__ = ("c", "stroke", "fill", "width", "dash", "join")

    def __init__(self, c: Canvas):
        self.c = c
        self.stroke = self.fill = self.width = self.dash = self.join = None

    def saved(self) -> tuple:
        return self.stroke, self.fill, self.width, self.dash, self.join

    def restore(self, state: tuple) -> None:
        """After the canvas's restoreState: the pen is again what it was when `saved`."""
        self.stroke, self.fill, self.width, self.dash, self.join = state

    def stroke_with(self, color: str, width: float, dash=()) -> None:
        if color != self.stroke:
            self.c.setStrokeColor(colour(color))
            self.stroke = color
        if width != self.width:
            self.c.setLineWidth(width)
            self.width = width
        if dash != self.dash:
            self.c.setDash(list(dash))
            self.dash = dash

    def fill_with(self, color: str) -> None:
        if color != self.fill:
            self.c.setFillColor(colour(color))
            self.fill = color


def draw_ops(c: Canvas, ops, dx: float = 0.0, dy: float = 0.0) -> None:
    """Draw layout ops on a reportlab canvas, shifted by (dx, dy) [pt]."""
    if not ops:
        return
    c.saveState()
    c.translate(dx, dy)
    pen = _Pen(c)
    run: list[Text] = []
    for op in ops:
        if type(op) is Text:
            run.append(op)
            continue
        if run:
            _texts(c, run, pen)
            run = []
        _DRAW[type(op)](pen, op)
    if run:
        _texts(c, run, pen)
    c.restoreState()


@lru_cache(maxsize=64)
def colour(hex_text: str) -> HexColor:
    return HexColor(hex_text)


def _texts(c: Canvas, texts: list[Text], pen: _Pen) -> None:
    """A run of strings in one PDF text object: font and colour are set only when they change."""
    t = c.beginText()
    font = None
    fill = pen.fill
    for op in texts:
        if (op.font, op.size) != font:
            t.setFont(op.font, op.size)
            font = (op.font, op.size)
        if op.color != fill:
            t.setFillColor(colour(op.color))
            fill = op.color
        x = op.x
        if op.align != "left":
            w = fonts.width(op.text, op.font, op.size)
            x -= w if op.align == "right" else w / 2
        t.setTextOrigin(x, op.y)
        # the same substitution fonts.width measured with, so a replaced character is marked, not lost.
        # `_textOut` is `textOut` without measuring the string to move reportlab's cursor past it: each string
        # sets its own origin, and the measuring was a twentieth of the PDF's time
        t._textOut(fonts.printable(op.text))
    c.drawText(t)
    pen.fill = fill  # a colour set inside a text object stays in the graphics state after it


def _line(pen: _Pen, op: Line) -> None:
    pen.stroke_with(op.color, op.width, op.dash)
    pen.c.line(op.x1, op.y1, op.x2, op.y2)


def _rect(pen: _Pen, r: Rect) -> None:
    c = pen.c
    if r.fill:
        pen.fill_with(r.fill)
        c.rect(r.x, r.y, r.w, r.h, stroke=0, fill=1)
    if r.hatch:
        c.saveState()
        before = pen.saved()
        clip = c.beginPath()
        clip.rect(r.x, r.y, r.w, r.h)
        c.clipPath(clip, stroke=0, fill=0)
        pen.stroke_with(r.hatch, 0.6, ())
        k = -r.h
        while k < r.w:
            c.line(r.x + k, r.y, r.x + k + r.h, r.y + r.h)
            k += HATCH_SPACING
        c.restoreState()
        pen.restore(before)
    if r.stroke:
        pen.stroke_with(r.stroke, r.width, ())
        c.rect(r.x, r.y, r.w, r.h, stroke=1, fill=0)


def _path(pen: _Pen, p: Path) -> None:
    if len(p.points) < 2:
        return
    c = pen.c
    path = c.beginPath()
    path.moveTo(*p.points[0])
    for x, y in p.points[1:]:
        path.lineTo(x, y)
    if p.closed:
        path.close()
    if p.fill:
        c.saveState()
        before = pen.saved()
        pen.fill_with(p.fill)
        c.setFillAlpha(p.fill_alpha)
        c.drawPath(path, stroke=0, fill=1)
        c.restoreState()
        pen.restore(before)
    if p.color:
        pen.stroke_with(p.color, p.width, p.dash)
        if pen.join != 1:
            c.setLineJoin(1)
            pen.join = 1
        c.drawPath(path, stroke=1, fill=0)


def _circle(pen: _Pen, op: Circle) -> None:
    if op.fill:
        pen.fill_with(op.fill)
    if op.stroke:
        pen.stroke_with(op.stroke, op.width, ())
    pen.c.circle(op.x, op.y, op.r, stroke=1 if op.stroke else 0, fill=1 if op.fill else 0)


def _image(pen: _Pen, op: Image) -> None:
    pen.c.drawImage(ImageReader(io.BytesIO(op.png)), op.x, op.y, op.w, op.h, mask="auto",
                    preserveAspectRatio=True, anchor="e")


def _side_text(pen: _Pen, op: SideText) -> None:
    t = pen.c.beginText()
    t.setFont(op.font, op.size)
    t.setFillColor(colour(op.color))
    t.setTextTransform(0, 1, -1, 0, op.x, op.y)  # a quarter turn to the left
    t._textOut(fonts.printable(op.text))
    pen.c.drawText(t)
    pen.fill = op.color


_DRAW = {Line: _line, Rect: _rect, Path: _path, Circle: _circle, Image: _image, SideText: _side_text}

