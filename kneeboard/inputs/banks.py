"""The one rule for a list of bank angles, as a profile's `card.bank_angles` and a style's `bank_angles` hold it.

Both readers call `read_banks`, so a bank a style may set is exactly a bank a profile may set (the style's banks
are then written into each profile's data and read again by this same rule).
"""

from collections.abc import Callable

from kneeboard.i18n import Msg, Num
from kneeboard.inputs.profile_keys import MAX_BANK_DEG
from kneeboard.inputs.values import finite
from kneeboard.problems import WARNING

MAX_BANKS = 24  #: rows of a card's tables; more would not print legibly on the smallest card
LIST_OF_NUMBERS = Msg("must be a list of numbers")  #: what a list of angles that is no list is told


def read_banks(raw, path: str, problem: Callable) -> tuple[float, ...] | None:
    """The bank angles [deg] of `raw` (the value as the file holds it at `path`), ascending, each once.

    Each bad entry is told through `problem(path, message, expected, value, severity=..., plain=...)` (a
    `values.Reader.problem`) and left out; None when the list is not a list or no entry is usable (the reader
    then keeps its default).
    """
    steepest = Num(f"{MAX_BANK_DEG:g}")
    wanted = Msg("a list of 1 to {most} bank angles in degrees, each from 0 to {steepest}, e.g. [0, 15, 30, 45, 60]",
                 most=str(MAX_BANKS), steepest=steepest)
    if not isinstance(raw, list) or not 1 <= len(raw) <= MAX_BANKS:
        problem(path, LIST_OF_NUMBERS, wanted, raw)
        return None
    banks = []
    for i, b in enumerate(raw, start=1):
        if isinstance(b, bool) or not isinstance(b, (int, float)) or not (finite(b) and 0 <= b <= MAX_BANK_DEG):
            problem(f"{path}[{i}]", Msg("is not a bank angle a level turn can hold"), wanted, b)
            continue
        banks.append(float(b))
    if len(set(banks)) != len(banks):
        problem(path, Msg("lists a bank twice; it is printed once"), Msg("each bank once"), raw, severity=WARNING,
                plain=Msg("A bank angle is listed twice; it is printed once"))
    return tuple(sorted(set(banks))) or None
