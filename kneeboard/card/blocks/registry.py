"""The card blocks, each declared once: its name, its label, when it applies, how it measures and draws itself.

A block is one module that calls `register(BlockSpec(...))`. Everything else derives from this registry: the names
a style may list (and their default order), the style dialog's labels, the layout's builders, and Compare, which
reads the printed figures the blocks tag in their text (`ops.Figure`) from the laid-out card itself.

Adding a block is adding one module (and importing it in `kneeboard/card/blocks/__init__.py`).
"""

from collections.abc import Callable
from dataclasses import dataclass


def always(_table) -> bool:
    return True


@dataclass(frozen=True)
class BlockSpec:
    """One kind of block on a card.

    `draw(ctx, width, height)` returns the block (`draw.Block`) laid out in `width` [pt]; `height` is None for a
    block of natural height, or the height it is given when it can grow (then `sizes(ctx, width)` says its least
    readable and its preferred height [pt]). `draw` raises `draw.DoesNotFit` when it cannot be printed legibly in
    the room offered.
    """

    name: str  #: as a style lists it: "margin-table"
    label: str  #: what the style dialog shows
    draw: Callable
    applies: Callable = always  #: applies(table) -> whether this card has anything to show in the block
    sizes: Callable | None = None  #: sizes(ctx, width) -> (minimum, preferred) for a block that grows
    front_only: bool = False  #: a card without it on its front page is no card
    full_width: bool = False  #: spans the whole page width above the columns (the header)


_BLOCKS: dict[str, BlockSpec] = {}


def register(spec: BlockSpec) -> BlockSpec:
    """Add a block (after those already registered); a name can be registered once."""
    if spec.name in _BLOCKS:
        raise ValueError(f"a block named {spec.name!r} is registered already")
    _BLOCKS[spec.name] = spec
    return spec


def unregister(name: str) -> None:
    """Remove a block (for tests that register a throwaway one)."""
    _BLOCKS.pop(name, None)


def names() -> tuple[str, ...]:
    """Every block's name, in the default order of a card."""
    return tuple(_BLOCKS)


def get(name: str) -> BlockSpec:
    return _BLOCKS[name]


def labels() -> dict[str, str]:
    """Block name -> the label a person sees (the style dialog)."""
    return {name: spec.label for name, spec in _BLOCKS.items()}
