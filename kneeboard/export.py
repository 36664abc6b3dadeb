"""Making and writing cards for one aircraft or a fleet: the command line and the app both use this.

A profile with errors, or whose card cannot be laid out, is reported and skipped; the others are still made. No
profile holds the fleet hostage: whatever goes wrong with one file, the rest are made. Every file is written
atomically, and a fleet flows through one card at a time (`export_cards`), so memory stays flat with its size.
"""

import itertools
import unicodedata
from collections.abc import Callable
from dataclasses import dataclass, field
from pathlib import Path

from kneeboard import registrations
from kneeboard.card import Card, LayoutError, attachment
from kneeboard.card.sheets import SheetError
from kneeboard.fileio import FileProblem, refuse_overwrite_of_inputs, write_atomic
from kneeboard.i18n import USER, Msg
from kneeboard.inputs.profiles import Unparsed, read_text_once
from kneeboard.pipeline import Styles, card_pdf, make_card, prepare_source
from kneeboard.problems import Problem, printable


@dataclass
class Failure:
    path: Path
    lines: list[str]  #: what went wrong, one line each


def _card(listed: Unparsed, styles: Styles, made_on: str | None, batch: "Export") -> Card | None:
    """The card of one profile file (its text as read once), or None with its failure and warnings noted in
    `batch`."""
    path = listed.path
    try:
        prepared = prepare_source(listed.source(), styles)
        batch.warnings += prepared.warnings
        if prepared.table is None:
            batch.failures.append(Failure(path, [str(p) for p in prepared.errors]))
            return None
        try:
            return make_card(prepared, made_on)
        except LayoutError as exc:
            batch.failures.append(Failure(path, [f"{printable(path)}: {exc}"]))
            return None
    except Exception as exc:  # a bug in the handling of one file must not cost the rest of the fleet its cards
        error = f"{type(exc).__name__}: {printable(str(exc))}"  # the program's own words, for its developers
        batch.failures.append(Failure(path, [f"{printable(path)}: " + USER.tr(
            "internal error on this profile, please report it: {error}", error=error)]))
        return None


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


def _pngs(card: Card, folder: Path, stem: str, dpi: int, guard=lambda path: path) -> list[Path]:
    from kneeboard.card.raster import pdf_to_pngs

    written = []
    pngs = pdf_to_pngs(card_pdf(card), dpi)
    for face, png in enumerate(pngs):
        side = ("front", "back")[face % 2]
        path = guard(folder / (f"{stem}-{side}.png" if len(pngs) <= 2 else f"{stem}-card{face // 2 + 1}-{side}.png"))
        write_atomic(path, png)
        written.append(path)
    return written


def _make_folder(folder: Path) -> None:
    if not folder.is_dir():
        try:
            folder.mkdir(parents=True)
        except OSError as exc:
            raise FileProblem(Msg("{folder}: cannot create the folder ({reason})", folder=printable(folder),
                                  reason=str(exc.strerror or exc)), exc.errno) from None


# --- a fleet, one card at a time ------------------------------------------------------------------------------


@dataclass
class Export:
    """What `export_cards` made: counts and files match what was written, failures name their files."""

    cards: int = 0  #: aircraft whose card was made
    pages: int = 0  #: pages (or sheets) of the one PDF
    made: list[tuple[str, int, int]] = field(default_factory=list)  #: (registration, cards, faces) per aircraft
    written: list[Path] = field(default_factory=list)  #: every file written, PDFs and PNGs
    failures: list[Failure] = field(default_factory=list)
    warnings: list[Problem] = field(default_factory=list)
    cancelled: bool = False
    clashes: list[Problem] = field(default_factory=list)  #: profiles whose own files would be one: not written


def _registered(paths: list[Path]) -> list[tuple[str | None, Unparsed]]:
    """(registration or None, the file's text as read) in the order cards print: by registration
    (`registrations.key`), then file name. Each file is read here, once: its card is made from the text kept."""
    found = []
    for path in paths:
        listed = read_text_once(path)
        found.append((listed.source().registration, listed))
    return sorted(found, key=lambda item: (registrations.key(item[0] or ""), str(item[1].path)))


def file_clashes(registered: list[tuple[str | None, Path]], folder: Path) -> dict[Path, Problem]:
    """The profiles whose cards would be written to one file in `folder` (one registration in two profiles, or two
    registrations one file name cannot tell apart): each named with the others, none written there. A number
    added to one name would hide which profile is the aircraft's."""
    groups: dict[str, list[tuple[str, Path]]] = {}
    for registration, path in registered:
        if registration is not None:
            groups.setdefault(safe_name(registration).casefold(), []).append((registration, path))
    clashes = {}
    for group in (g for g in groups.values() if len(g) > 1):
        for registration, path in group:
            others = ", ".join(f"{r} ({p})" for r, p in group if p != path)
            same = all(registrations.key(r) == registrations.key(registration) for r, _ in group)
            values = {"registration": registration, "others": others, "file": f"{safe_name(registration)}.pdf",
                      "folder": str(folder)}
            clashes[path] = Problem(
                "aircraft.registration",
                Msg("{registration} is also the registration of {others}: no card of either is written as {file} in "
                    "{folder}", **values) if same else
                Msg("{registration} would have its card written to the same file as {others}: no card of either is "
                    "written as {file} in {folder}", **values),
                Msg("a registration no other profile of the fleet has (a copy of a profile beside it is a duplicate: "
                    "remove it or give it its own registration)"), file=str(path))
    return clashes


def export_cards(paths: list[Path], styles: Styles, out: Path | None = None, sheet: str | None = None,
                 each: Path | None = None, png_dpi: int | None = None, made_on: str | None = None,
                 progress: Callable[[int, int, str], bool] | None = None) -> Export:
    """Make the cards of `paths` one at a time and write them as they come: one PDF `out` (imposed on `sheet`),
    one PDF per aircraft in `each`, and PNGs of every page at `png_dpi`. A card's layout is dropped once drawn.

    Raises FileProblem when a file cannot be written (the first one stops the writing, as a full disk would).
    `progress(done, total, name)` may return False to cancel; then the one PDF is not written.
    """
    from kneeboard.card.render import PdfWriter
    from kneeboard.card.sheets import grid_for, impose, physical_cards

    result = Export()
    registered = _registered(paths)
    ordered = [listed.path for _, listed in registered]
    clashes = file_clashes([(registration, listed.path) for registration, listed in registered],
                           each if each is not None else out.parent) if each or png_dpi else {}
    result.clashes = list(clashes.values())
    for path in ordered:
        styles.for_profile(path)  # every style (and its logo) is known before anything is written

    def guard(target: Path) -> Path:
        refuse_overwrite_of_inputs(target, [*ordered, *styles.inputs()])
        return target

    if out is not None:
        guard(out)
    writer = None
    if out is not None:
        title = "kneeboard cards" + (f" on {sheet} sheets" if sheet else "")
        writer = PdfWriter(title)
    if each is not None:
        _make_folder(each)
    fingerprints: list[str] = []
    group: list = []  # cards waiting to fill a sheet
    languages: list[str] = []  # the language of each card in `group`: a sheet's note is in its first card's
    grid = None

    def flush(full_only: bool = False) -> None:
        while group and (len(group) >= grid.per_sheet or not full_only):
            writer.add(impose(group[:grid.per_sheet], sheet, languages[0]))
            del group[:grid.per_sheet], languages[:grid.per_sheet]

    for i, (_, listed) in enumerate(registered):
        path = listed.path
        if progress is not None and progress(i, len(ordered), path.name) is False:
            result.cancelled = True
            return result
        card = _card(listed, styles, made_on, result)
        if card is None:
            continue
        stem = safe_name(card.registration)
        fingerprints.append(card.fingerprint)
        if writer is not None:
            writer.attach(*attachment(card))
            if sheet is None:
                writer.add(card.pages)
            else:
                first = card.pages[0]
                try:
                    grid = grid or grid_for(first.width, first.height, sheet)
                except SheetError as exc:
                    raise FileProblem(Msg("{file}: {problem}", file=printable(out),
                                          problem=exc.args[0] if exc.args else str(exc))) from None
                if (first.width, first.height) != (grid.card_w, grid.card_h):
                    result.failures.append(Failure(path, [USER.tr(Msg(
                        "{file}: its card is not the size of the others on the sheet; print it on its own",
                        file=printable(path)))]))
                    continue
                slots = physical_cards([card.pages])
                group.extend(slots)  # a card set fills a slot per physical card
                languages.extend([card.table.language] * len(slots))
                flush(full_only=True)
        if each is not None and path not in clashes:
            target = guard(each / f"{stem}.pdf")
            write_atomic(target, card_pdf(card))
            result.written.append(target)
        if png_dpi and path not in clashes:
            folder, prefix = (each, "") if each is not None else (out.parent, f"{out.stem}-")
            result.written += _pngs(card, folder, f"{prefix}{stem}", png_dpi, guard)
        result.cards += 1
        result.made.append((card.registration, card.layout.cards, card.layout.faces))
    if progress is not None:
        progress(len(ordered), len(ordered), "")
    if writer is not None and result.cards:
        if sheet is not None:
            flush()
        if len(fingerprints) <= 20:  # the fingerprints in the metadata, where a file browser shows them
            writer.set_keywords("kneeboard cards, fingerprints " + ", ".join(fingerprints))
        result.pages = writer.pages
        write_atomic(out, writer.finish_into)  # a fleet's file is written straight into its temporary file
        result.written.insert(0, out)
    return result

