"""The card blocks, each declared once: its name, its label, when it applies, how it measures and draws itself.

A block is one module that calls `register(BlockSpec(...))`. Everything else derives from this registry: the names
a style may list (and their default order), the style dialog's labels, the layout's builders, and Compare, which
reads the printed figures the blocks tag in their text (`ops.Figure`) from the laid-out card itself.

Adding a block is adding one module (and importing it in `kneeboard/card/blocks/__init__.py`).
"""

from collections.abc import Callable
from dataclasses import dataclass

from kneeboard.card import block_names
from kneeboard.card.draw import Plan, Whole


def always(_table) -> bool:
    return True


@dataclass(frozen=True)
class BlockSpec:
    """One kind of block on a card.

    `plan(ctx, width)` returns the block planned at the context's type size in `width` [pt] (`draw.Plan`): its
    measure, taken without drawing, says how tall its parts are and where it may break; the layout then asks the
    plan to draw the pieces it placed. A simple block may give `draw(ctx, width)` instead, returning the whole
    block (`draw.Block`) in one piece. Either raises `draw.DoesNotFit` when the block cannot be printed legibly in
    `width`.
    """

    name: str  #: as a style lists it: "margin-table"
    label: str  #: what the style dialog shows
    draw: Callable | None = None  #: draw(ctx, width) -> Block, for a block without a plan of its own
    applies: Callable = always  #: applies(table) -> whether this card has anything to show in the block
    full_width: bool = False  #: spans the whole page width above the columns (the header)
    plan: Callable | None = None  #: plan(ctx, width) -> Plan

    def planned(self, ctx, width: float) -> Plan:
        """The block planned at `ctx`'s type size in `width`."""
        if self.plan is not None:
            return self.plan(ctx, width)
        return Whole(self.draw(ctx, width))


_BLOCKS: dict[str, BlockSpec] = {}


def register(spec: BlockSpec) -> BlockSpec:
    """Add a block (after those already registered); a name can be registered once."""
    if spec.name in _BLOCKS:
        raise ValueError(f"a block named {spec.name!r} is registered already")
    if spec.plan is None and spec.draw is None:
        raise ValueError(f"the block {spec.name!r} has neither a plan nor a draw")
    _BLOCKS[spec.name] = spec
    block_names.add(spec.name)  # a style may list it (the style reader knows the names without the blocks)
    return spec


def unregister(name: str) -> None:
    """Remove a block (for tests that register a throwaway one)."""
    _BLOCKS.pop(name, None)
    block_names.remove(name)


def names() -> tuple[str, ...]:
    """Every block's name, in the default order of a card."""
    return tuple(_BLOCKS)


def get(name: str) -> BlockSpec:
    return _BLOCKS[name]


def labels() -> dict[str, str]:
    """Block name -> the label a person sees (the style dialog)."""
    return {name: spec.label for name, spec in _BLOCKS.items()}
