"""Making and writing cards for one aircraft or a fleet: the command line and the app both use this.

A profile with errors, or whose card cannot be laid out, is reported and skipped; the others are
still made. Every file is written atomically.
"""

import itertools
import unicodedata
from collections.abc import Callable
from dataclasses import dataclass, field
from pathlib import Path

from kneeboard.card import Card, LayoutError
from kneeboard.card.sheets import SheetError
from kneeboard.fileio import FileProblem, write_atomic
from kneeboard.pipeline import Styles, card_pdf, fleet_pdf, make_card, prepare_file
from kneeboard.problems import Problem


@dataclass
class Failure:
    path: Path
    lines: list[str]  #: what went wrong, one line each


@dataclass
class Batch:
    cards: list[Card] = field(default_factory=list)
    sources: dict[str, Path] = field(default_factory=dict)  #: registration -> profile file
    failures: list[Failure] = field(default_factory=list)
    warnings: list[Problem] = field(default_factory=list)
    cancelled: bool = False


def make_cards(paths: list[Path], styles: Styles, made_on: str | None = None,
               progress: Callable[[int, int, str], bool] | None = None) -> Batch:
    """Cards of `paths` (each with its style by the one rule of `styles`), in registration order.

    `progress(done, total, name)` may return False to cancel.
    """
    batch = Batch()
    made = []
    for i, path in enumerate(paths, start=1):
        if progress is not None and progress(i - 1, len(paths), path.name) is False:
            batch.cancelled = True
            break
        prepared = prepare_file(path, styles)
        batch.warnings += prepared.warnings
        if prepared.table is None:
            batch.failures.append(Failure(path, [str(p) for p in prepared.errors]))
            continue
        try:
            card = make_card(prepared, made_on)
        except LayoutError as exc:
            batch.failures.append(Failure(path, [f"{path}: {exc}"]))
            continue
        made.append((card.registration.casefold(), str(path), card))
        batch.sources[card.registration] = path
    if progress is not None and not batch.cancelled:
        progress(len(paths), len(paths), "")
    batch.cards = [card for _, _, card in sorted(made, key=lambda item: item[:2])]
    return batch


# Windows refuses these as file names whatever the extension (and the same with a digit, COM1...LPT9).
_RESERVED = {"CON", "PRN", "AUX", "NUL"} | {f"{d}{n}" for d in ("COM", "LPT") for n in range(10)}


def safe_name(registration: str) -> str:
    """A file name from a registration: every letter and digit kept (NFC), '-' and '_'; anything else is '_'.

    So `OK-ŘÍZ` stays `OK-ŘÍZ`, while path separators, control characters and the characters Windows or
    macOS forbid (`<>:"/\\|?*`) never reach the file system. A run of replaced characters is one '_'.
    """
    runs = itertools.groupby(unicodedata.normalize("NFC", registration), key=_kept)
    name = "".join("".join(chars) if kept else "_" for kept, chars in runs).strip("_")
    if not any(unicodedata.category(ch)[0] in "LN" for ch in name):
        return "card"
    return f"{name}_" if name.upper() in _RESERVED else name


def _kept(ch: str) -> bool:
    # letters with the accents that may follow them as combining marks, and decimal digits of any script
    category = unicodedata.category(ch)
    return ch in "-_" or category[0] in "LM" or category == "Nd"


def write_fleet(cards: list[Card], out: Path, sheet: str | None = None) -> None:
    """All cards in one PDF (imposed on `sheet` if given), written atomically."""
    try:
        data = fleet_pdf(cards, sheet)
    except SheetError as exc:
        raise FileProblem(f"{out}: {exc}") from None
    write_atomic(out, data)


def write_each(cards: list[Card], folder: Path) -> list[Path]:
    """One PDF per aircraft in `folder`, named by registration; returns the files written."""
    if not folder.is_dir():
        try:
            folder.mkdir(parents=True)
        except OSError as exc:
            raise FileProblem(f"{folder}: cannot create the folder ({exc.strerror or exc})") from None
    written, used = [], set()
    for card in cards:
        name = safe_name(card.registration)
        stem, n = name, 2
        while stem.casefold() in used:
            stem, n = f"{name}-{n}", n + 1
        used.add(stem.casefold())
        path = folder / f"{stem}.pdf"
        write_atomic(path, card_pdf(card))
        written.append(path)
    return written


def write_pngs(cards: list[Card], folder: Path, prefix: str, dpi: int) -> list[Path]:
    """Each card page as a PNG at `dpi`, named PREFIX<REGISTRATION>-front.png / -back.png."""
    from kneeboard.card.raster import pdf_to_pngs

    written = []
    for card in cards:
        for side, png in zip(("front", "back"), pdf_to_pngs(card_pdf(card), dpi)):
            path = folder / f"{prefix}{safe_name(card.registration)}-{side}.png"
            write_atomic(path, png)
            written.append(path)
    return written
