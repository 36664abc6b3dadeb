"""Registrations as a fleet tells its aircraft apart: one text form, and duplicates named, never resolved silently.

A registration typed with composed or decomposed accents, in upper or lower case, is the same registration
(`key`: Unicode NFC and case folding). Wherever two profiles, a profile and a card, or two card files are matched by
registration, this is the one comparison; two profiles of one fleet with the same registration (a backup copy beside
the profile, say) are a problem to name with every file, never a choice to make by file order.
"""

import unicodedata
from collections.abc import Iterable
from pathlib import Path


def key(registration: str) -> str:
    """The form registrations are compared in: NFC, case folded (folding may decompose: composed again), trimmed."""
    folded = unicodedata.normalize("NFC", registration).strip().casefold()
    return unicodedata.normalize("NFC", folded)


def duplicates(pairs: Iterable[tuple[str | None, Path]]) -> dict[str, list[Path]]:
    """(registration, file) pairs -> every registration (as first written) given by more than one file, with its
    files in the order given."""
    groups: dict[str, tuple[str, list[Path]]] = {}
    for registration, path in pairs:
        if registration is not None:
            groups.setdefault(key(registration), (registration, []))[1].append(Path(path))
    return {first: files for first, files in groups.values() if len(files) > 1}


def others(path: Path, files: list[Path]) -> str:
    """The files of a duplicate other than `path`, as a message names them."""
    return ", ".join(str(f) for f in files if f != path)


def problems(dups: dict[str, list[Path]], severity: str = "error") -> list:
    """One problem per file of each duplicate, naming the other files (`kneeboard.problems.Problem`)."""
    from kneeboard.i18n import Msg
    from kneeboard.problems import Problem

    return [Problem("aircraft.registration", Msg("{registration} is also the registration of {others}",
                                                 registration=registration, others=others(path, files)),
                    Msg("a registration no other profile of the fleet has (a copy of a profile beside it is a "
                        "duplicate: remove it or give it its own registration)"), severity=severity, file=str(path))
            for registration, files in dups.items() for path in files]
