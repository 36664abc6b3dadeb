"""Compare two cards: which printed figures read differently, old text and new.

A club member who changes the weight or a speed sees, before printing a replacement card, every printed figure that
would read differently. The figures are read from the laid-out cards themselves (every block tags the figures it
prints, `card.ops.Figure`), so a change too small to move a printed digit is not listed, a block a style turns off
is not compared, and a new block's figures are compared without a list to keep up to date.

`summary` says first what matters most: the largest loss of margin, any cell that newly has no margin or lies past
a limit, and any limit (VA, VFE, a limit load factor or bank) that is now lower.
"""

import re
from dataclasses import dataclass

from kneeboard import terms
from kneeboard.card.ops import HIGHER_IS_WORSE, LOWER_IS_WORSE, Figure
from kneeboard.i18n import Translator, translator
from kneeboard.tables import LIMIT_MARK

_NUMBER = re.compile(rf"\s*{LIMIT_MARK}?\s*(-?\d+(?:\.\d+)?)(.*)\Z", re.DOTALL)
#: Figures that are limits: lower leaves less room, whether or not the block that prints them says so
LIMITS = (terms.VA, terms.FLAP_LIMIT, terms.LIMIT_LOAD, terms.LIMIT_BANK)
SHOWN = 3  #: labels named in each part of the summary before "and N more"


@dataclass(frozen=True)
class Change:
    """One printed figure that reads differently; None when it was not printed before / is no longer."""

    label: str
    old: str | None
    new: str | None
    worse_if: str | None = None  #: HIGHER_IS_WORSE, LOWER_IS_WORSE or None (from the figure's tag)
    past_limit: bool = False  #: the new figure lies at or past a limit and the old one did not

    @property
    def worse(self) -> bool:
        """True when the figure now leaves less room (a smaller margin or bank, a higher stall speed, a lower limit),
        or newly lies past a limit.

        Only figures printed both before and after, in the same unit, are judged by their numbers.
        """
        if self.past_limit:
            return True
        if self.old is None or self.new is None or self.worse_if is None:
            return False
        old, new = _number(self.old), _number(self.new)
        if old is None or new is None or old[1] != new[1]:
            return False
        return new[0] > old[0] if self.worse_if == HIGHER_IS_WORSE else new[0] < old[0]


def _number(text: str) -> tuple[float, str] | None:
    """The leading number of a printed text (after a limit mark) and the rest (its unit), or None."""
    match = _NUMBER.match(text)
    return None if match is None else (float(match.group(1)), match.group(2).strip())


def _past(f: Figure | None) -> bool:
    return f is not None and (f.past_limit or f.text.lstrip().startswith(LIMIT_MARK))


def _worse_if(f: Figure) -> str | None:
    """The figure's own tag; a limit is worse lower even where its block left it untagged."""
    if f.worse is None and f.label.split(terms.SEP)[-1] in LIMITS:
        return LOWER_IS_WORSE
    return f.worse


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
        if old is None or old.text != f.text or _past(f) != _past(old):
            changes.append(Change(f.label, None if old is None else old.text, f.text, _worse_if(f),
                                  _past(f) and not _past(old)))
    changes += [Change(f.label, f.text, None, _worse_if(f)) for key, f in before.items() if key not in after]
    return changes


def compare(old_card, new_card) -> list[Change]:
    """The printed figures that read differently on `new_card` than on `old_card`."""
    return compare_figures(old_card.figures(), new_card.figures())


@dataclass(frozen=True)
class Summary:
    """What a changed card's reader needs first, from its changes."""

    margin_loss: tuple[float, str, Change] | None  #: (amount, unit, change) of the largest loss of margin
    no_margin: tuple[Change, ...]  #: margins now 0 or less that were positive (or not printed)
    past_limit: tuple[Change, ...]  #: figures now at or past a limit that were not
    lower_limits: tuple[Change, ...]  #: VA, VFE, limit load factors and banks now lower

    def line(self, tr: Translator | None = None) -> str:
        """The summary in one line; `tr`: the figures' labels and numbers as a card in that language prints them
        (the line's own words are the command line's, English this round)."""
        tr = tr or translator()
        parts = []
        if self.margin_loss is not None:
            amount, unit, c = self.margin_loss
            parts.append(f"largest loss of margin {tr.number(f'{amount:g}')} {unit} ({tr.label(c.label)}: "
                         f"{tr.number(c.old)} -> {tr.number(c.new)})")
        else:
            parts.append("no margin smaller")
        if self.no_margin:
            parts.append(f"new no-margin cell(s): {_names(self.no_margin, tr)}")
        if self.past_limit:
            parts.append(f"new past a limit: {_names(self.past_limit, tr)}")
        if self.lower_limits:
            parts.append("less room: " + _names(self.lower_limits, tr, values=True))
        return "; ".join(parts)


def _names(changes, tr: Translator, values: bool = False) -> str:
    shown = [f"{tr.label(c.label)} {tr.number(c.old or '')} -> {tr.number(c.new or '')}" if values
             else tr.label(c.label) for c in changes[:SHOWN]]
    more = len(changes) - SHOWN
    return ", ".join(shown) + (f" and {more} more" if more > 0 else "")


def summary(changes: list[Change]) -> Summary:
    """The summary of `changes` (`compare_figures`): what leaves the pilot less room, the worst first."""
    loss, no_margin, lower = None, [], []
    for c in changes:
        name = c.label.split(terms.SEP)[-1]
        new = None if c.new is None else _number(c.new)
        old = None if c.old is None else _number(c.old)
        if name == terms.MARGIN and new is not None:
            if new[0] <= 0 and (old is None or old[0] > 0):
                no_margin.append(c)
            if old is not None and old[1] == new[1] and old[0] - new[0] > 0 and (
                    loss is None or old[0] - new[0] > loss[0]):
                loss = (old[0] - new[0], new[1], c)
        if name in LIMITS and c.worse:
            lower.append(c)
    return Summary(loss, tuple(no_margin), tuple(c for c in changes if c.past_limit), tuple(lower))


__all__ = ["HIGHER_IS_WORSE", "LOWER_IS_WORSE", "Change", "Summary", "compare", "compare_figures", "printed_figures",
           "summary"]
