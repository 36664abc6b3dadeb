"""The card's fonts: Fira Sans regular and bold, embedded (subset) in every PDF, and text measurement.

Why Fira Sans: its `fontpkg-fira-sans` package on PyPI ships static TrueType files (nothing to instance from
a variable font), it covers Latin Extended-A and -B, Greek and Cyrillic (every European alphabet in use), it
was drawn for small sizes on small screens, and it keeps apart the shapes a pilot must not confuse: 1 has a
flag, l a tail, I is a plain bar, 5/S and 8/B differ in their joins. Its licence is the SIL Open Font
License 1.1, installed beside the fonts (`fontpkg_fira_sans/LICENSE`).

One change is made to the files: 0 is mapped to the family's own slashed zero (its OpenType `zero` feature,
which reportlab does not apply by itself), so 0 never reads as O, in a registration least of all. The
changed fonts are written once with fontTools into the user's cache folder (`$XDG_CACHE_HOME/kneeboard`, or
`~/.cache/kneeboard`), versioned by the font package's version, atomically; where that folder cannot be
written they are made in memory for the process. The installed package is never written to.

Text widths come from the same files the PDF embeds, so the layout measures exactly what prints. A character
the fonts cannot draw is measured and drawn as `substitute()`, so the card marks where one was replaced.
"""

import contextlib
import io
import os
import re
import stat
import threading
import unicodedata
import zlib
from functools import cache, lru_cache
from importlib import metadata, resources
from pathlib import Path

from kneeboard.i18n import Msg
from kneeboard.problems import Told

REGULAR, BOLD = "KbSans", "KbSans-Bold"
FONT_PACKAGE = "fontpkg-fira-sans"  #: the distribution that ships the font files and their licence
_MODULE = "fontpkg_fira_sans"
_SOURCES = {REGULAR: "FiraSans-Regular.ttf", BOLD: "FiraSans-Bold.ttf"}
# Bump when _build changes what it writes, so caches made by an older kneeboard are not reused.
RECIPE = 1
# Marks for a character the fonts lack, best first: the first one both fonts have is used.
_SUBSTITUTES = ("\u25a1", "\u25af", "\ufffd", "?")

_lock = threading.Lock()


class FontProblem(Told, RuntimeError):
    """The card fonts cannot be found or read; the message says what to reinstall."""


def cache_folder() -> Path:
    """Where built fonts are kept: `$XDG_CACHE_HOME/kneeboard`, else `~/.cache/kneeboard`."""
    base = os.environ.get("XDG_CACHE_HOME", "")
    # the XDG rules say a relative path is invalid and to be ignored
    root = Path(base) if base and os.path.isabs(base) else Path.home() / ".cache"
    return root / "kneeboard"


def font_version() -> str:
    """Version of the installed font package (part of the cache key)."""
    try:
        return metadata.version(FONT_PACKAGE)
    except metadata.PackageNotFoundError:
        raise FontProblem(_missing_package()) from None


def _missing_package() -> Msg:
    return Msg("the card fonts ({package}) are not installed; reinstall kneeboard with pip to get them",
               package=FONT_PACKAGE)


def source_file(name: str) -> Path:
    """The installed, unchanged font file behind `name` (REGULAR or BOLD)."""
    try:
        root = resources.files(_MODULE)
    except ModuleNotFoundError:
        raise FontProblem(_missing_package()) from None
    path = Path(str(root / "files" / _SOURCES[name]))
    if not path.is_file():
        raise FontProblem(Msg("{path}: font file missing; reinstall {package}", path=str(path), package=FONT_PACKAGE))
    return path


def licence_file() -> Path:
    """The font's licence (SIL Open Font License 1.1) as installed with the font package."""
    return Path(str(resources.files(_MODULE) / "LICENSE"))


def cached_file(name: str) -> Path:
    """Where the built font of `name` lives in the cache (it may not exist yet)."""
    folder = f"fonts-{FONT_PACKAGE.removeprefix('fontpkg-')}-{font_version()}-r{RECIPE}"
    return cache_folder() / folder / _SOURCES[name]


def _build(source: Path) -> bytes:
    """The font file with 0 mapped to the family's slashed zero; everything else as shipped."""
    from fontTools.ttLib import TTFont as FontFile

    # lazy: tables we do not touch are copied as they are (the layout tables are read from a second copy, as
    # reading them would make the first write them anew: a second and a half); no timestamp change, so the
    # bytes (and every PDF that embeds them) are the same wherever and whenever the cache was made
    # Both copies read from bytes in memory and are closed here: a lazy font left to the garbage collector would
    # close its file on whichever thread collects it (the preview's render thread), while another still reads.
    data = source.read_bytes()
    with FontFile(io.BytesIO(data), lazy=True, recalcTimestamp=False) as font, \
            FontFile(io.BytesIO(data), lazy=True) as layout:
        slashed = _feature_glyph(layout, "zero", font.getBestCmap().get(ord("0")))
        if slashed is not None:
            for table in font["cmap"].tables:
                if table.isUnicode() and ord("0") in table.cmap:
                    table.cmap[ord("0")] = slashed
        buf = io.BytesIO()
        font.save(buf)
    return buf.getvalue()


def _feature_glyph(font, tag: str, glyph: str | None) -> str | None:
    """The glyph that OpenType feature `tag` puts in place of `glyph` (single substitution), if any."""
    if glyph is None or "GSUB" not in font:
        return None
    table = font["GSUB"].table
    for record in table.FeatureList.FeatureRecord:
        if record.FeatureTag != tag:
            continue
        for index in record.Feature.LookupListIndex:
            for sub in table.LookupList.Lookup[index].SubTable:
                sub = getattr(sub, "ExtSubTable", sub)  # an extension lookup wraps the real one
                mapping = getattr(sub, "mapping", None)
                if mapping and glyph in mapping:
                    return mapping[glyph]
    return None


CACHED_FONT_LIMIT = 8 * 1024 * 1024  #: a built card font is about half a MiB; a larger cache file is not ours


def _load(name: str) -> tuple["TTFont", bytes]:  # noqa: F821  (reportlab's, imported here: see `register`)
    """The reportlab font of `name` and its file's bytes: from the cache, else built (and cached if it can be)."""
    from reportlab.pdfbase.ttfonts import TTFError, TTFont

    from kneeboard.fileio import FileProblem, read_bytes, write_atomic

    cached = cached_file(name)
    # read as every other input is: a regular file only, opened without blocking (a FIFO there hung every card),
    # its size capped; anything else is no cache and is built again below
    with contextlib.suppress(FileProblem, OSError, TTFError):
        data = read_bytes(cached, CACHED_FONT_LIMIT, "a built card font is about half a MiB")
        return TTFont(name, io.BytesIO(data), validate=1), data  # checksums: a damaged file is rebuilt
    data = _build(source_file(name))
    with contextlib.suppress(OSError, FileProblem):  # a read-only home or cache: the fonts live in memory
        cached.parent.mkdir(parents=True, exist_ok=True)
        _clear_special(cached)
        write_atomic(cached, data)
    return TTFont(name, io.BytesIO(data)), data


def _clear_special(path: Path) -> None:
    """Remove a FIFO, socket, device or link found where a cached font belongs, so the rebuilt font replaces it.

    The cache folder is kneeboard's own; a folder there is left alone (the font then lives in memory).
    """
    try:
        info = os.lstat(path)
    except FileNotFoundError:
        return
    if not stat.S_ISREG(info.st_mode) and not stat.S_ISDIR(info.st_mode):
        os.unlink(path)


_files: dict[str, bytes] = {}


@cache
def register() -> None:
    """Register the fonts with reportlab once per process (reportlab loads here, at the first measure or drawing:
    `missing`, which `kneeboard check` asks, reads the fonts' character maps without it)."""
    from reportlab.pdfbase import pdfmetrics

    with _lock:
        for name in _SOURCES:
            font, _files[name] = _load(name)
            _remember_subsets(font)
            pdfmetrics.registerFont(font)


SUBSETS_KEPT = 32  #: font subsets remembered per font (a card's are 20 to 40 kB each, compressed a third of that)


def _remember_subsets(font) -> None:
    """Make each font subset once per process, and compress it once.

    reportlab cuts the glyphs a PDF uses out of the font file again for every PDF, and compresses them again:
    a tenth of the time of a card. The preview draws the same card with the same characters edit after edit, so
    the subset of the same characters (in the same order) is kept, raw and compressed. The embedded stream is
    the one reportlab makes (the same subset, deflated, its uncompressed length as Length1).
    """
    face = font.face
    make, add = face.makeSubset, face.addSubsetObjects

    @lru_cache(maxsize=SUBSETS_KEPT)
    def subset_of(chars: tuple[int, ...]) -> bytes:
        return make(list(chars))

    @lru_cache(maxsize=SUBSETS_KEPT)
    def deflated(chars: tuple[int, ...]) -> bytes:
        return zlib.compress(subset_of(chars))

    def add_subset_objects(doc, fontname, subset):
        reference = add(doc, fontname, subset)
        stream = doc.idToObject.get(f"fontFile:{face.filename}({fontname})")
        if doc.compression and stream is not None and stream.content == subset_of(tuple(subset)):
            from reportlab.pdfbase.pdfdoc import PDFArray, PDFName

            stream.content, stream.filters = deflated(tuple(subset)), None  # compressed already: marked, not again
            stream.dictionary["Filter"] = PDFArray([PDFName("FlateDecode")])
        return reference

    face.makeSubset = lambda subset: subset_of(tuple(subset))
    face.addSubsetObjects = add_subset_objects


def font_bytes(name: str) -> bytes:
    """The font file registered as `name`, whose subsets the PDFs embed and whose widths the layout uses."""
    register()
    return _files[name]


@cache
def _drawable() -> frozenset[int]:
    """Code points both card fonts have a glyph for, from their character maps (fontTools, without reportlab: a
    check of a profile's text loads no PDF library). Building the fonts changes no character's coverage."""
    from fontTools.ttLib import TTFont as FontFile

    regular, bold = (FontFile(source_file(name), lazy=True).getBestCmap() for name in (REGULAR, BOLD))
    return frozenset(c for c in regular if c in bold)


@cache
def substitute() -> str:
    """The visible mark drawn in place of a character the fonts cannot draw."""
    have = _drawable()
    return next(s for s in _SUBSTITUTES if ord(s) in have)


def _invisible(ch: str) -> bool:
    """Whitespace, format characters (joiners, marks of direction) and variation selectors: no ink of their own."""
    return ch.isspace() or _silent(ch)


def _silent(ch: str) -> bool:
    c = ord(ch)
    return unicodedata.category(ch) == "Cf" or 0xFE00 <= c <= 0xFE0F or 0xE0100 <= c <= 0xE01EF


def missing(text: str) -> list[str]:
    """The distinct characters of `text` the card fonts cannot draw, in order of first appearance.

    Whitespace and line breaks never count; the text is compared in its composed form (NFC), so a letter
    typed as a base and a combining accent counts as the letter.
    """
    have = _drawable()
    found: dict[str, None] = {}
    for ch in unicodedata.normalize("NFC", text):
        if ord(ch) not in have and not _invisible(ch):
            found.setdefault(ch)
    return list(found)


@lru_cache(maxsize=8192)
def printable(text: str) -> str:
    """`text` as the card draws and measures it: composed (NFC), each missing character replaced by the mark.

    Whitespace the fonts lack prints as a space; format characters and variation selectors they lack are
    left out (an emoji and its selector make one mark, not two).
    """
    if text.isascii() and text.isprintable():
        return text  # Fira Sans has every printable ASCII character (a test pins this)
    have = _drawable()
    out = []
    for ch in unicodedata.normalize("NFC", text):
        if ch == SOFT_HYPHEN:
            continue  # a place a word may break (`wrap` prints a hyphen there); never a mark of its own
        if ord(ch) in have:
            out.append(ch)
        elif ch.isspace():
            out.append(" ")
        elif not _silent(ch):
            out.append(substitute())
    return "".join(out)


@lru_cache(maxsize=8192)
def width(text: str, font: str, size: float) -> float:
    """Advance width of `text` as printed [pt]: proportional to the size, so measured once per text and font."""
    return _unit_width(text, font) * size


@lru_cache(maxsize=8192)
def _unit_width(text: str, font: str) -> float:
    from reportlab.pdfbase import pdfmetrics

    register()
    return pdfmetrics.stringWidth(printable(text), font, 1000.0) / 1000.0


@cache
def _cap_height() -> float:
    from reportlab.pdfbase import pdfmetrics

    register()
    return pdfmetrics.getFont(REGULAR).face.capHeight / 1000


def ascent(size: float) -> float:
    """Height of capitals above the baseline, from the font, for placing text in boxes [pt]."""
    return _cap_height() * size


#: Unit symbols and speed bases a number is never parted from at a line break ("100 kt IAS", "1.25 x").
UNIT_WORDS = frozenset({"kt", "kts", "mph", "km/h", "ft", "m", "s", "g", "IAS", "CAS", "TAS", "kg", "lb", "°C", "°F",
                        "degC", "degF", "m/s", "fpm", "L", "gal", "%", "x", "km", "NM", "nm", "min", "h", "hPa",
                        "inHg", "kg/L", "deg"})
_NUMBER = re.compile(r"[^\w]*[-+−]?\d[\d.,/:]*[^\w]*\Z")
_TRAILING = ",.;:)]"


def _is_number(word: str) -> bool:
    return any(c.isdigit() for c in word) and bool(_NUMBER.match(word))


def _is_unit(word: str) -> bool:
    return word.rstrip(_TRAILING) in UNIT_WORDS


def glued(words: list[str]) -> list[list[str]]:
    """Words in the groups a line never breaks inside: a number with the unit symbols after it ("100 kt IAS"), and
    a number without a unit with the word before it ("flaps 15", "at 45°")."""
    groups: list[list[str]] = []
    i = 0
    while i < len(words):
        word = words[i]
        group = [word]
        if _is_number(word):
            while i + 1 < len(words) and _is_unit(words[i + 1]) and not group[-1].endswith(tuple(_TRAILING)):
                i += 1
                group.append(words[i])
            if len(group) == 1 and groups and not any(_is_number(w) for w in groups[-1]) \
                    and not groups[-1][-1].endswith(tuple(",.;:")):
                groups[-1].append(word)
                i += 1
                continue
        groups.append(group)
        i += 1
    return groups


SOFT_HYPHEN = "\u00ad"  #: where a word may be broken, with a hyphen printed (a catalogue's long compounds carry it)


def wrap(text: str, font: str, size: float, max_width: float, hyphenate: bool = True) -> list[str]:
    """Break `text` into lines no wider than `max_width`, at spaces, never between a number and its unit or the
    word it numbers (`glued`). A word that does not fit is broken at a soft hyphen (U+00AD, set between syllables
    by a translation) with a hyphen printed; a word still wider than the line is broken with a hyphen anywhere when
    `hyphenate`, else it stays whole (and the caller sees a line too wide)."""
    if "\n" not in text and "\r" not in text and width(text, font, size) <= max_width:
        return [" ".join(text.split())]  # the common case: it fits on one line
    return list(_wrapped(text, font, size, max_width, hyphenate))


@lru_cache(maxsize=4096)
def _wrapped(text: str, font: str, size: float, max_width: float, hyphenate: bool) -> tuple[str, ...]:
    lines: list[str] = []
    for paragraph in text.splitlines() or [""]:
        line = ""
        for group in glued(paragraph.split()):
            chunk = " ".join(group)
            pieces = [chunk]
            if len(group) > 1 and width(chunk, font, size) > max_width:  # wider than a line: a number keeps its
                pieces = group  # first unit where the two fit, every other word goes on its own
                if len(group) > 2 and _is_number(group[0]) and width(" ".join(group[:2]), font, size) <= max_width:
                    pieces = [" ".join(group[:2]), *group[2:]]
            for piece in pieces:
                candidate = f"{line} {piece}" if line else piece
                if SOFT_HYPHEN in piece and width(candidate, font, size) > max_width:
                    line = _soft_broken(lines, line, piece.split(SOFT_HYPHEN), font, size, max_width)
                elif line and width(candidate, font, size) > max_width:
                    lines.append(line)
                    line = piece
                else:
                    line = candidate
                if hyphenate and width(line, font, size) > max_width and " " not in line:
                    broken = _hyphenated(line, font, size, max_width)
                    lines.extend(broken[:-1])
                    line = broken[-1]
        lines.append(line)
    return tuple(lines)


def _soft_broken(lines: list[str], line: str, parts: list[str], font: str, size: float, max_width: float) -> str:
    """Add a word given in `parts` (its syllables between soft hyphens) after `line`: as much of it as fits, up to a
    soft hyphen and with a hyphen printed, each line full going to `lines`; returns the line it ends on."""

    def fits(text):
        return width(text, font, size) <= max_width

    while True:
        whole = "".join(parts)
        candidate = f"{line} {whole}" if line else whole
        if fits(candidate):
            return candidate
        for k in range(len(parts) - 1, 0, -1):
            head = "".join(parts[:k]) + "-"
            head = f"{line} {head}" if line else head
            if fits(head):
                lines.append(head)
                line, parts = "", parts[k:]
                break
        else:
            if not line:
                return whole  # not even its first syllable fits a line: left whole, and the caller sees it
            lines.append(line)
            line = ""


def _hyphenated(word: str, font: str, size: float, max_width: float) -> list[str]:
    """A word too wide for a line, in pieces that fit, each but the last ending in a hyphen."""
    pieces, rest = [], word
    while width(rest, font, size) > max_width and len(rest) > 1:
        cut = len(rest) - 1
        while cut > 1 and width(rest[:cut] + "-", font, size) > max_width:
            cut -= 1
        pieces.append(rest[:cut] + "-")
        rest = rest[cut:]
    return pieces + [rest]
