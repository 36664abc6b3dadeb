"""Compare with saved: which figures a card prints have changed, old text and new.

A club member who changes the weight or a speed sees, before printing a replacement card, every
printed figure that would read differently. Figures are compared as the card prints them (the
table builder's rounded text with its unit), so a change too small to move a printed digit is
not listed, and nothing here rounds or computes a figure of its own.

Only figures the card actually prints are listed: the turn radius and time of a configuration
that is stalled at a bank are printed as a dash, and a glider's wings-level row is not in the
circling table (its speed and sink are printed as the straight-flight figures).
"""

import re
from dataclasses import dataclass

from kneeboard.tables import STALL, CardTable, Printed

SEP = " · "  #: between the parts of a label: configuration, bank, figure
CIRCLING = "circling"  #: label prefix of a glider's circling figures

#: Label endings of figures where a smaller number leaves the pilot less room.
_SMALLER_IS_WORSE = (f"{SEP}margin", "buffer left at", "no margin at", "limit bank")
#: Label endings of figures where a larger number leaves the pilot less room.
_LARGER_IS_WORSE = (f"{SEP}stall",)
_NUMBER = re.compile(r"\s*(-?\d+(?:\.\d+)?)(.*)\Z", re.DOTALL)


@dataclass(frozen=True)
class Change:
    """One printed figure that reads differently; None when it was not printed before / is no longer."""

    label: str
    old: str | None
    new: str | None

    @property
    def worse(self) -> bool:
        """True when a margin or a bank got smaller, or a stall speed larger, in the same unit.

        Only figures printed both before and after are judged; a figure whose unit changed is not.
        """
        if self.old is None or self.new is None:
            return False
        old, new = _number(self.old), _number(self.new)
        if old is None or new is None or old[1] != new[1]:
            return False
        if self.label.endswith(_SMALLER_IS_WORSE):
            return new[0] < old[0]
        if self.label.endswith(_LARGER_IS_WORSE):
            return new[0] > old[0]
        return False


def _number(text: str) -> tuple[float, str] | None:
    """The leading number of a printed text and the rest (its unit), or None."""
    match = _NUMBER.match(text)
    return None if match is None else (float(match.group(1)), match.group(2).strip())


class _Figures:
    """An ordered label -> text collector that never lets two figures share a label."""

    def __init__(self):
        self.items: dict[str, str] = {}

    def add(self, label: str, printed: Printed | None, unit: str = "") -> None:
        if printed is None:
            return
        # Banks print as "53°"; every other unit follows its figure after a space.
        self.text(label, printed.text + unit if unit == "°" else f"{printed.text} {unit}".rstrip())

    def text(self, label: str, text: str) -> None:
        # A configuration may be named like another label's prefix (say "circling"); number the
        # second one rather than silently lose a figure.
        unique, n = label, 2
        while unique in self.items:
            unique, n = f"{label} ({n})", n + 1
        self.items[unique] = text


def printed_figures(table: CardTable) -> dict[str, str]:
    """Every figure the card of `table` prints, in print order: label -> printed text with its unit.

    Speeds are IAS in the table's speed unit, distances in its distance unit, times in seconds,
    banks in degrees, load factors in g.
    """
    su, du, wu = table.speed_unit, table.distance_unit, table.weight_unit
    f = _Figures()
    f.add("weight", table.weight, wu)
    f.add("speeds published at", table.reference_weight, wu)
    if table.over_max_weight:
        f.add("maximum weight (exceeded)", table.max_weight, wu)
    f.add("buffer", table.buffer, su)
    f.add("limit load factor", table.limit_load_factor, "g")
    f.add("limit bank", table.limit_bank, "°")
    f.add("maneuvering speed VA", table.maneuvering_speed, su)
    f.add("pressure altitude", table.pressure_altitude, du)
    f.add("temperature", table.temperature_c, "°C")
    f.add("density altitude", table.density_altitude, du)
    for c in table.configurations:
        name = c.name
        f.add(f"{name}{SEP}stall", c.stall_speed, su)
        f.add(f"{name}{SEP}fly (pattern speed)", c.pattern_speed, su)
        f.add(f"{name}{SEP}{table.buffer.text} {su} buffer left at", c.buffer_bank, "°")
        f.add(f"{name}{SEP}no margin at", c.zero_margin_bank, "°")
        f.add(f"{name}{SEP}flap limit", c.flap_limit_speed, su)
        for row in c.rows:
            at = f"{name}{SEP}{row.bank_text}°{SEP}"
            f.add(f"{at}load factor", row.load_factor, "g")
            f.add(f"{at}stall", row.stall_speed, su)
            f.add(f"{at}margin", row.margin, su)
            if row.state == STALL:
                continue  # the turns table prints a dash where the configuration has stalled
            f.add(f"{at}turn radius", row.turn_radius, du)
            if row.time_180 is not None and row.time_360 is not None:
                f.text(f"{at}180°/360° time", f"{row.time_180.text}/{row.time_360.text} s")
    if table.glider is not None:
        g = table.glider
        f.add(f"{CIRCLING}{SEP}straight{SEP}speed", g.min_sink_speed, su)
        f.add(f"{CIRCLING}{SEP}straight{SEP}sink", g.min_sink_rate, table.sink_unit)
        for row in g.rows:
            if row.turn_radius is None:
                continue  # wings level: printed above as the straight-flight figures
            at = f"{CIRCLING}{SEP}{row.bank_text}°{SEP}"
            f.add(f"{at}speed", row.speed, su)
            f.add(f"{at}sink", row.sink_rate, table.sink_unit)
            f.add(f"{at}turn radius", row.turn_radius, du)
            f.add(f"{at}circle time", row.circle_time, "s")
            f.add(f"{at}180° loss", row.height_loss_180, du)
    return f.items


def compare(old: CardTable, new: CardTable) -> list[Change]:
    """The printed figures whose text differs: in the new card's print order, then those no longer printed."""
    before, after = printed_figures(old), printed_figures(new)
    changes = [Change(label, before.get(label), text) for label, text in after.items() if before.get(label) != text]
    changes += [Change(label, text, None) for label, text in before.items() if label not in after]
    return changes
