"""The names a style file may list, known without loading a block (each block module loads the fonts and reportlab).

`BUILT_IN` is the default order of a card's built-in blocks (a test holds it equal to the registry's); a block
registered later (`blocks.register`) adds its name here, so a style may list it at once.
"""

BUILT_IN = ("header", "margin-table", "limits", "pull", "turns", "circling", "turn-back", "margin-chart", "notes")
_added: list[str] = []


def add(name: str) -> None:
    """A block registered beyond the built-in ones: a style may list it."""
    if name not in BUILT_IN and name not in _added:
        _added.append(name)


def remove(name: str) -> None:
    if name in _added:
        _added.remove(name)


def known() -> tuple[str, ...]:
    """Every block name a style may list, in the default order of a card."""
    return BUILT_IN + tuple(_added)
