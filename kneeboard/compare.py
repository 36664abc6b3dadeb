"""Compare two cards: which printed figures read differently, old text and new.

A club member who changes the weight or a speed sees, before printing a replacement card, every printed figure that
would read differently. The figures are read from the laid-out cards themselves (every block tags the figures it
prints, `card.ops.Figure`), so a change too small to move a printed digit is not listed, a block a style turns off
is not compared, and a new block's figures are compared without a list to keep up to date.
"""

import re
from dataclasses import dataclass

from kneeboard.card.ops import HIGHER_IS_WORSE, LOWER_IS_WORSE, Figure

_NUMBER = re.compile(r"\s*(-?\d+(?:\.\d+)?)(.*)\Z", re.DOTALL)


@dataclass(frozen=True)
class Change:
    """One printed figure that reads differently; None when it was not printed before / is no longer."""

    label: str
    old: str | None
    new: str | None
    worse_if: str | None = None  #: HIGHER_IS_WORSE, LOWER_IS_WORSE or None (from the figure's tag)

    @property
    def worse(self) -> bool:
        """True when the figure now leaves less room (a smaller margin or bank, a higher stall speed).

        Only figures printed both before and after, in the same unit, are judged.
        """
        if self.old is None or self.new is None or self.worse_if is None:
            return False
        old, new = _number(self.old), _number(self.new)
        if old is None or new is None or old[1] != new[1]:
            return False
        return new[0] > old[0] if self.worse_if == HIGHER_IS_WORSE else new[0] < old[0]


def _number(text: str) -> tuple[float, str] | None:
    """The leading number of a printed text and the rest (its unit), or None."""
    match = _NUMBER.match(text)
    return None if match is None else (float(match.group(1)), match.group(2).strip())


def printed_figures(card) -> dict[str, str]:
    """Every figure `card` prints, in print order: label -> printed text with its unit."""
    return {f.label: f.text for f in card.figures().values()}


def compare_figures(before: dict[str, Figure], after: dict[str, Figure]) -> list[Change]:
    """The figures whose text differs: in the new card's print order, then those no longer printed.

    Both are `Card.figures()` mappings (identity -> figure).
    """
    changes = []
    for key, f in after.items():
        old = before.get(key)
        if old is None or old.text != f.text:
            changes.append(Change(f.label, None if old is None else old.text, f.text, f.worse))
    changes += [Change(f.label, f.text, None, f.worse) for key, f in before.items() if key not in after]
    return changes


def compare(old_card, new_card) -> list[Change]:
    """The printed figures that read differently on `new_card` than on `old_card`."""
    return compare_figures(old_card.figures(), new_card.figures())


__all__ = ["HIGHER_IS_WORSE", "LOWER_IS_WORSE", "Change", "compare", "compare_figures", "printed_figures"]
