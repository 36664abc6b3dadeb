"""The card's fonts: Bitstream Vera, shipped with reportlab, embedded in every PDF (its licence allows it).

Text widths come from the font files themselves, so the layout measures exactly what prints.
"""

from functools import cache, lru_cache

from reportlab.pdfbase import pdfmetrics
from reportlab.pdfbase.ttfonts import TTFont

REGULAR, BOLD = "KbSans", "KbSans-Bold"
_FILES = {REGULAR: "Vera.ttf", BOLD: "VeraBd.ttf"}


@cache
def register() -> None:
    """Register the fonts with reportlab once per process."""
    for name, file in _FILES.items():
        pdfmetrics.registerFont(TTFont(name, file))


@lru_cache(maxsize=8192)
def width(text: str, font: str, size: float) -> float:
    """Advance width of `text` [pt]."""
    register()
    return pdfmetrics.stringWidth(text, font, size)


def ascent(size: float) -> float:
    """Height of capitals above the baseline, close enough for placing text in boxes [pt]."""
    return 0.73 * size


def wrap(text: str, font: str, size: float, max_width: float) -> list[str]:
    """Break `text` into lines no wider than `max_width`; a single word wider than that stays whole."""
    lines: list[str] = []
    for paragraph in text.splitlines() or [""]:
        line = ""
        for word in paragraph.split():
            candidate = f"{line} {word}" if line else word
            if line and width(candidate, font, size) > max_width:
                lines.append(line)
                line = word
            else:
                line = candidate
        lines.append(line)
    return lines
