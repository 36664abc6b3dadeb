"""`kneeboard compare CARD.pdf PROFILE`: a printed card against what its profile prints now, every printed figure
that reads differently, old and new, and a verdict per card.

The whole text (the verdicts, the summary, the figures' labels and their decimal separator) is in `--language` when
given (the language the card is made in now for the comparison), else in the user's locale's
(`kneeboard.cli_words`). The figures compared are each figure's identity, the same in every language.
"""

import sys
from pathlib import Path

from kneeboard.cli_common import EXIT_CHANGED, EXIT_OK, EXIT_PROBLEMS, print_problems, safely, styles_of, told
from kneeboard.cli_words import translated
from kneeboard.fileio import FileProblem
from kneeboard.problems import printable
from kneeboard.texts import CAUTION


def compare(args) -> int:
    """A printed card against its profile: every printed figure that reads differently, old and new."""
    from kneeboard import registrations
    from kneeboard.card.data import CardDataProblem, figures_of, read_card_data
    from kneeboard.compare import compare_figures, summary
    from kneeboard.fileio import read_bytes
    from kneeboard.i18n import translator
    from kneeboard.inputs.profiles import expand_paths, read_source
    from kneeboard.pipeline import make_card

    tr = translator(args.language) if args.language else translated()  # --language, else the locale's
    card_path, profile_path = Path(args.card), Path(args.profile)
    folder = card_path.is_dir()
    skipped = tr("; skipped") if folder else ""
    pdfs = sorted(card_path.glob("*.pdf")) if folder else [card_path]
    cards, unread = [], 0
    for pdf in pdfs:
        # each file its own verdict: one that cannot be read (a FIFO, a hostile PDF) is named and skipped, and the
        # genuine cards of the folder are still compared
        try:
            found = read_card_data(read_bytes(pdf, 200 * 1024 * 1024))
        except FileProblem as exc:
            print("kneeboard compare: " + printable(told(exc, tr)) + skipped, file=sys.stderr)
            unread += 1
            continue
        except CardDataProblem as exc:
            print(printable(f"kneeboard compare: {pdf}: {told(exc, tr)}") + skipped, file=sys.stderr)
            unread += 1
            continue
        if not found and not folder:
            print(printable("kneeboard compare: " + tr(
                "{file}: not a kneeboard card (it carries no printed figures)", file=str(pdf))), file=sys.stderr)
            return EXIT_PROBLEMS
        cards += [(pdf, data) for data in found]
    if not folder and unread:
        return EXIT_PROBLEMS
    styles = styles_of(args, language=args.language)
    profiles: dict[str, list] = {}
    for path in expand_paths([profile_path]):
        source = read_source(path)  # read once: a card made for another weight is prepared from it again
        prepared = safely(source, styles)
        if prepared.table is not None:
            profiles.setdefault(registrations.key(prepared.table.registration), []).append((prepared, source))
        elif not profile_path.is_dir():
            print_problems(list(prepared.errors), sys.stderr, tr)
            print(tr("{file}: {n} error(s); nothing to compare with", file=printable(path), n=len(prepared.errors)),
                  file=sys.stderr)
            return EXIT_PROBLEMS
    changed, problems = 0, unread
    for pdf, data in cards:
        registration = str(data.get("registration", ""))
        found = profiles.get(registrations.key(registration), [])
        where = printable(tr("{file} ({registration}, printed {date})", file=str(pdf), registration=registration,
                              date=str(data.get("made_on", "?"))))
        if len(found) != 1:
            if found:  # a backup copy beside the profile: which one printed this card cannot be told
                files = ", ".join(str(p.path) for p, _ in found)
                print(printable("kneeboard compare: " + tr(
                    "{where}: {registration} is the registration of {n} profiles: {files}; remove the copies or give "
                    "each its own registration", where=where, registration=registration, n=len(found), files=files)),
                    file=sys.stderr)
            else:
                print(tr("{where}: no profile of {registration} to compare with", where=where,
                          registration=printable(registration)))
            problems += 1
            continue
        prepared, weight = _at_weight(*found[0], data, args, styles, tr)
        if prepared.table is None:
            print_problems(list(prepared.errors), sys.stderr, tr)
            problems += 1
            continue
        changes = compare_figures(figures_of(data), make_card(prepared).figures())
        if not changes:
            stamp = printable(str(data.get("fingerprint", "")))
            why = (tr("fingerprint {fingerprint}", fingerprint=stamp) if stamp == prepared.fingerprint else
                   tr("the profile changed, not a figure this card prints: fingerprint now {now}, the card's {card}",
                       now=prepared.fingerprint, card=stamp))
            print(tr("{where}: current{weight}: every printed figure reads the same ({why})", where=where,
                      weight=weight, why=why))
            continue
        changed += 1
        worse = sum(c.worse for c in changes)
        verdict = tr("{where}: OUT OF DATE{weight}: {n} printed figure(s) read differently", where=where,
                      weight=weight, n=len(changes))
        if worse:
            verdict += tr(", {n} leaving less room", n=worse)
        print(verdict + tr("; print a new card"))
        print(printable("  " + tr("summary: {line}", line=summary(changes).line(tr))))
        for c in changes:
            mark = tr("! less room: ") if c.worse else ""
            old, new = (tr.number(x) if x else tr("not printed") for x in (c.old, c.new))
            print(printable(f"  {mark}{tr.label(c.label)}: {old} -> {new}"))
    if not cards:
        print(printable("kneeboard compare: " + tr("{file}: no kneeboard card found", file=str(card_path))),
              file=sys.stderr)
        return EXIT_PROBLEMS
    print(tr(CAUTION))
    return EXIT_PROBLEMS if problems else EXIT_CHANGED if changed else EXIT_OK


def _at_weight(prepared, source, data: dict, args, styles, tr):
    """The profile as the card is compared with it: at `--weight` when given, else at the weight the card was made
    for when one was given for it (`weight_given`), else at the profile's own; and the words that say which."""
    weight = args.weight or data.get("weight_given")
    if not isinstance(weight, str) or not weight:
        return prepared, ""
    said = (tr(" at {weight} (--weight)", weight=weight) if args.weight else
            tr(" at {weight}, the weight the card was made for", weight=weight))
    return (safely(source, styles_of(args, weight=weight, language=args.language, styles=styles)),
            printable(said))
