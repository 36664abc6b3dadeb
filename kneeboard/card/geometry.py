"""Card and sheet sizes in PDF points (1 pt = 1/72 in)."""

from dataclasses import dataclass

MM = 72 / 25.4
INCH = 72.0

#: Laminated card sizes, portrait (width, height) [pt].
CARD_SIZES = {
    "a5": (148 * MM, 210 * MM),
    "half-letter": (5.5 * INCH, 8.5 * INCH),
    "5x8": (5 * INCH, 8 * INCH),
    "4x6": (4 * INCH, 6 * INCH),
}
#: Sizes on which table figures must be at least 10 pt; the smaller cards allow less.
LARGE_CARDS = ("a5", "half-letter")

SHEET_SIZES = {"letter": (8.5 * INCH, 11 * INCH), "a4": (210 * MM, 297 * MM)}

SAFE_MARGIN = 6 * MM  #: kept clear of print on every edge, for lamination
BINDING_MARGIN = 14 * MM  #: the edge a punch or ring binder takes


@dataclass(frozen=True)
class PageBox:
    """A card page: its size and the content box inside the margins [pt]."""

    width: float
    height: float
    left: float
    bottom: float
    right: float
    top: float

    @property
    def content_width(self) -> float:
        return self.right - self.left

    @property
    def content_height(self) -> float:
        return self.top - self.bottom


def page_box(size: str, landscape: bool, binding: str, margin: float = SAFE_MARGIN) -> PageBox:
    """The page of a card `size` ("a5"...), turned if `landscape`, with a binding edge "left" | "top" | "none"."""
    w, h = CARD_SIZES[size]
    if landscape:
        w, h = h, w
    left = margin + (BINDING_MARGIN if binding == "left" else 0.0)
    top = h - margin - (BINDING_MARGIN if binding == "top" else 0.0)
    return PageBox(w, h, left, margin, w - margin, top)
