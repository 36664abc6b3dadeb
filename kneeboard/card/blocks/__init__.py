"""The card's blocks, one module each. The tuple below is the default order of a card; `registry` holds them."""

from kneeboard.card.blocks import (
    circling,
    header,
    limits,
    margin_chart,
    margin_table,
    notes,
    pull,
    turn_back,
    turns,
)
from kneeboard.card.blocks.registry import BlockSpec, get, labels, names, register, unregister

#: The built-in blocks in the order a card shows them when a style lists none.
BUILT_IN = (header, margin_table, limits, pull, turns, circling, turn_back, margin_chart, notes)

for _module in BUILT_IN:
    register(_module.SPEC)

__all__ = ["BlockSpec", "get", "labels", "names", "register", "unregister"]
