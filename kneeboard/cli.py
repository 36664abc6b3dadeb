"""The command line: `kneeboard check | table | card`, calling the same functions as the app; `kneeboard [PATH]`
opens the app."""

import argparse
import contextlib
import difflib
import errno
import io
import os
import sys
import textwrap
from pathlib import Path

from kneeboard import __version__, starter
from kneeboard.fileio import DEVICE_FAILURES, FileProblem, terminate_cleanly
from kneeboard.problems import Problem, printable
from kneeboard.texts import CAUTION

EXIT_OK, EXIT_PROBLEMS, EXIT_BUG, EXIT_OUTPUT = 0, 2, 70, 74  #: 74: the output device failed (EX_IOERR)
EXIT_PIPE = 141  #: the reader of the output went away (128 + SIGPIPE), as a shell tool's exit
COMMANDS = ("check", "table", "card", "compare", "new", "samples")
EXIT_CHANGED = 1  #: compare: the printed card is out of date
PROGRESS_ABOVE = 5  #: more aircraft than this get a progress line on stderr


class UsageProblem(Exception):
    """A bad option value; the message names the option."""


USAGE = """kneeboard [PROFILE_OR_FOLDER]      open the app (on the last fleet, or a copy of the sample fleet)
       kneeboard COMMAND ...              check | table | card | compare, without a window
       kneeboard new | samples ...        start: a profile from a template, or a copy of the samples"""


def _parser() -> argparse.ArgumentParser:
    # the choices that mirror a style key are that key's declared options (the declarations load neither the units
    # library nor the card code); made only when a command runs, so `kneeboard` opening the app does not pay for them
    from kneeboard.card.geometry import SHEET_SIZES
    from kneeboard.inputs.style_keys import BY_KEY

    sizes, languages = BY_KEY["size"].options, BY_KEY["language"].options
    speed_units, distance_units = BY_KEY["speed_unit"].options, BY_KEY["distance_unit"].options
    caution = textwrap.fill(CAUTION, 79)
    p = argparse.ArgumentParser(
        prog="kneeboard",
        usage=USAGE,
        description="Cockpit cards of stall speed and margin by bank angle, from an aircraft's published figures.",
        epilog=caution,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    p.add_argument("--version", action="version", version=f"kneeboard {__version__}\n{caution}")
    sub = p.add_subparsers(dest="command", metavar="COMMAND")

    def command(name, help_text):
        return sub.add_parser(name, prog=f"kneeboard {name}", help=help_text,
                              description=help_text[0].upper() + help_text[1:] + ".", epilog=caution,
                              formatter_class=argparse.RawDescriptionHelpFormatter)

    style_help = "card style (default: the fleet.style.toml beside each profile, else the shipped default)"
    language_help = ("the language of the card's words (default: the style's, else the profile's, else en); the "
                     "figures are the same in every language")
    check = command("check", "validate profiles and list every problem")
    check.add_argument("profiles", nargs="+", metavar="PROFILE_OR_FOLDER")
    check.add_argument("--style", metavar="STYLE.toml", help=style_help)

    table = command("table", "print the computed table of one profile")
    table.add_argument("profile", metavar="PROFILE")
    table.add_argument("--weight", metavar="QTY", help='weight to compute for, e.g. "690 kg" or "1500 lb"')
    table.add_argument("--bank", metavar="LIST", help="bank angles in degrees, e.g. 0,20,40")
    table.add_argument("--speed-unit", choices=speed_units)
    table.add_argument("--distance-unit", choices=distance_units)
    table.add_argument("--format", choices=("text", "csv", "json"), default="text")
    table.add_argument("--language", choices=languages, help=language_help)
    table.add_argument("--style", metavar="STYLE.toml", help=style_help)
    card = command("card", "make cockpit cards as PDF (one aircraft or a whole folder)")
    card.add_argument("profiles", nargs="+", metavar="PROFILE_OR_FOLDER")
    card.add_argument("-o", "--output", metavar="OUT.pdf", help="one PDF with every card")
    card.add_argument("--each", metavar="DIR", help="one PDF per aircraft in DIR, named by registration")
    card.add_argument("--size", choices=sizes, help=f"card size (default: the style's, {BY_KEY['size'].default})")
    card.add_argument("--landscape", action="store_true", help="turn the card sideways")
    card.add_argument("--style", metavar="STYLE.toml", help=style_help)
    card.add_argument("--weight", metavar="QTY", help='weight for every card, e.g. "690 kg"')
    card.add_argument("--sheet", choices=tuple(SHEET_SIZES), help="impose several cards on Letter or A4 sheets")
    card.add_argument("--png", metavar="DPI", type=int, help="also write each card page as PNG at DPI")
    card.add_argument("--language", choices=languages, help=language_help)
    compare = command("compare", "compare a printed card with what its profile prints now (exit 1 when it changed)")
    compare.add_argument("card", metavar="CARD.pdf_OR_FOLDER", help="a card PDF, or a folder of them")
    compare.add_argument("profile", metavar="PROFILE_OR_FOLDER", help="its profile, or the fleet folder")
    compare.add_argument("--style", metavar="STYLE.toml", help=style_help)
    compare.add_argument("--language", choices=languages, help=language_help)
    compare.add_argument("--weight", metavar="QTY", help="compare at this weight, not at the weight the card was "
                         'made for, e.g. "690 kg"')
    starter.add_commands(command)
    return p


def _parse_banks(text: str | None):
    """The numbers of --bank; their range is checked like a profile's own bank angles."""
    if text is None:
        return None
    try:
        banks = [float(part) for part in text.split(",") if part.strip()]
    except ValueError:
        raise UsageProblem(f"--bank {text!r}: not a list of numbers; expected e.g. 0,20,40") from None
    if not banks:
        raise UsageProblem(f"--bank {text!r}: no bank angle given; expected e.g. 0,20,40")
    return tuple(banks)


def _print_problems(problems: list[Problem], stream) -> None:
    for p in problems:
        print(p, file=stream)  # Problem's text escapes what a file holds (newlines, escape sequences)


def _styles(args, styles=None, cards=True, **overrides):
    """The style of each profile by the one rule; `cards=False`: a command that makes no card loads no card code."""
    from kneeboard.pipeline import Overrides, Styles

    if styles is not None:  # another run's overrides over the same style files
        return Styles(styles.explicit, Overrides(**overrides), cards)
    return Styles(Path(args.style) if getattr(args, "style", None) else None, Overrides(**overrides), cards)


def _print_style_problems(styles, paths) -> None:
    """Each style file's problems once, before the profiles that use it."""
    seen = set()
    for path in paths:
        key = styles.path_for(path)
        if key not in seen:
            seen.add(key)
            _print_problems(list(styles.for_profile(path)[1]), sys.stderr)


def cmd_check(args) -> int:
    from kneeboard.inputs.profiles import expand_paths, read_source

    files = expand_paths(args.profiles)
    if not files:
        print("kneeboard check: no profile files (*.toml) found", file=sys.stderr)
        return EXIT_PROBLEMS
    from kneeboard import registrations

    styles = _styles(args, cards=False)
    _print_style_problems(styles, files)
    failed = 0
    registered = []  # (registration as written, file): each file read once, for its check and for this
    for path in files:
        prepared = _safely(source := read_source(path), styles)
        registered.append((source.registration, path))
        _print_problems(list(prepared.problems), sys.stdout)
        if prepared.table is None:
            failed += 1
            print(f"{printable(path)}: {len(prepared.errors)} error(s); no card can be made")
            continue
        a = prepared.profile.aircraft
        names = ", ".join(_quoted(c.name) for c in prepared.profile.configurations)  # names may hold commas
        warned = f", {len(prepared.warnings)} warning(s)" if prepared.warnings else ""
        print(printable(f"{path}: ok{warned}: {a.registration} ({a.model}), {len(prepared.profile.configurations)} "
                        f"configuration(s): {names}; fingerprint {prepared.fingerprint}"))
    duplicates = registrations.duplicates(registered)
    _print_problems(registrations.problems(duplicates), sys.stdout)  # every file of each duplicate, named
    print(CAUTION)
    return EXIT_PROBLEMS if failed or duplicates else EXIT_OK


def cmd_table(args) -> int:
    from kneeboard.pipeline import prepare_file, report_text

    styles = _styles(args, cards=False, weight=args.weight, bank_angles=_parse_banks(args.bank),
                     speed_unit=args.speed_unit, distance_unit=args.distance_unit, language=args.language)
    path = Path(args.profile)
    _print_style_problems(styles, [path])
    prepared = prepare_file(path, styles)
    machine = args.format != "text"
    _print_problems(list(prepared.problems), sys.stderr)
    if prepared.table is None:
        print(f"{printable(args.profile)}: {len(prepared.errors)} error(s); no table can be made", file=sys.stderr)
        return EXIT_PROBLEMS
    sys.stdout.write(report_text(prepared, args.format))
    # the caution in the table's language; JSON is the machine interface, in English (its keys and its texts)
    caution = CAUTION if args.format == "json" else _translated(CAUTION, prepared.table.language)
    print(caution, file=sys.stderr if machine else sys.stdout)
    return EXIT_OK


def cmd_card(args) -> int:
    from kneeboard.export import export_cards
    from kneeboard.inputs.profiles import expand_paths

    if not args.output and not args.each:
        raise UsageProblem("say where to write: -o OUT.pdf, --each DIR, or both")
    if args.png is not None and not 36 <= args.png <= 1200:
        raise UsageProblem(f"--png {args.png}: expected a resolution from 36 to 1200 dpi")
    styles = _styles(args, weight=args.weight, size=args.size, landscape=True if args.landscape else None,
                     language=args.language)
    paths = expand_paths(args.profiles)
    if not paths:
        print("kneeboard card: no profile files (*.toml) found", file=sys.stderr)
        return EXIT_PROBLEMS
    show = len(paths) > PROGRESS_ABOVE

    def progress(done, total, name):
        if show and name:
            print(printable(f"card {done + 1} of {total}: {name}"), file=sys.stderr)
        return True

    _print_style_problems(styles, paths)
    out = Path(args.output) if args.output else None
    each = Path(args.each) if args.each else None
    try:
        made = export_cards(paths, styles, out=out, sheet=args.sheet, each=each, png_dpi=args.png,
                            progress=progress)
    except FileProblem as exc:
        print(f"kneeboard card: {printable(exc)}", file=sys.stderr)
        print(_translated(CAUTION, args.language))
        return EXIT_OUTPUT if exc.device_failed else EXIT_PROBLEMS  # a full disk is no bad input
    _print_problems(made.warnings, sys.stderr)
    _print_problems(made.clashes, sys.stderr)  # each file of a duplicate named, instead of a numbered file name
    for failure in made.failures:
        for line in failure.lines:
            print(printable(line), file=sys.stderr)
        print(f"{printable(failure.path)}: skipped", file=sys.stderr)
    for registration, cards, faces in made.made:
        print(printable(f"{registration}: {cards} card{'s' if cards != 1 else ''} ({faces} "
                        f"face{'s' if faces != 1 else ''})"))
    if made.cards:
        pngs = [p for p in made.written if p.suffix == ".png"]
        if out is not None:
            print(printable(f"wrote {out}: {made.cards} card(s) on {made.pages} {'sheets' if args.sheet else 'pages'}"))
        if each is not None:
            n = sum(1 for p in made.written if p.suffix == ".pdf" and p.parent == each)
            print(printable(f"wrote {n} PDF(s) in {each}"))
        if pngs:
            print(printable(f"wrote {len(pngs)} PNG page(s) at {args.png} dpi in {pngs[0].parent}"))
    else:
        print("kneeboard card: no card could be made", file=sys.stderr)
    if len(paths) > 1 or made.failures:
        skipped = f"; {len(made.failures)} skipped (see above)" if made.failures else ""
        print(f"{made.cards} of {len(paths)} cards made{skipped}")
    print(_translated(CAUTION, args.language))
    return EXIT_PROBLEMS if made.failures or made.clashes or not made.cards else EXIT_OK


def _translated(text: str, language: str | None) -> str:
    """`text` (a message marked for the catalogues) in `language`; English when none is asked for."""
    from kneeboard.i18n import translator

    return translator(language or "en")(text)


def _quoted(name: str) -> str:
    """A name in double quotes (a quote inside it escaped), so a list of names reads apart from its commas."""
    return '"' + name.replace("\\", "\\\\").replace('"', '\\"') + '"'


def _safely(source, styles):
    """Prepare one profile file as read; a bug in the handling of one file is that file's error, not the run's."""
    from kneeboard.pipeline import Prepared, prepare_source

    try:
        return prepare_source(source, styles)
    except Exception as exc:
        if os.environ.get("KNEEBOARD_DEBUG"):
            raise
        problem = Problem("(file)", f"internal error on this profile, please report it: {type(exc).__name__}: {exc}",
                          file=str(source.path))
        return Prepared(source.path, "", None, None, None, None, (problem,))


def cmd_compare(args) -> int:
    """A printed card against its profile: every printed figure that reads differently, old and new."""
    from kneeboard import registrations
    from kneeboard.card.data import CardDataProblem, figures_of, read_card_data
    from kneeboard.compare import compare_figures, summary
    from kneeboard.fileio import read_bytes
    from kneeboard.i18n import translator
    from kneeboard.inputs.profiles import expand_paths, read_source
    from kneeboard.pipeline import make_card

    card_path, profile_path = Path(args.card), Path(args.profile)
    folder = card_path.is_dir()
    pdfs = sorted(card_path.glob("*.pdf")) if folder else [card_path]
    cards, unread = [], 0
    for pdf in pdfs:
        # each file its own verdict: one that cannot be read (a FIFO, a hostile PDF) is named and skipped, and the
        # genuine cards of the folder are still compared
        try:
            found = read_card_data(read_bytes(pdf, 200 * 1024 * 1024))
        except FileProblem as exc:
            print(f"kneeboard compare: {printable(exc)}" + ("; skipped" if folder else ""), file=sys.stderr)
            unread += 1
            continue
        except CardDataProblem as exc:
            print(printable(f"kneeboard compare: {pdf}: {exc}") + ("; skipped" if folder else ""), file=sys.stderr)
            unread += 1
            continue
        if not found and not folder:
            print(printable(f"kneeboard compare: {pdf}: not a kneeboard card (it carries no printed figures)"),
                  file=sys.stderr)
            return EXIT_PROBLEMS
        cards += [(pdf, data) for data in found]
    if not folder and unread:
        return EXIT_PROBLEMS
    styles = _styles(args, language=args.language)
    profiles: dict[str, list] = {}
    for path in expand_paths([profile_path]):
        source = read_source(path)  # read once: a card made for another weight is prepared from it again
        prepared = _safely(source, styles)
        if prepared.table is not None:
            profiles.setdefault(registrations.key(prepared.table.registration), []).append((prepared, source))
        elif not profile_path.is_dir():
            _print_problems(list(prepared.errors), sys.stderr)
            print(f"{printable(path)}: {len(prepared.errors)} error(s); nothing to compare with", file=sys.stderr)
            return EXIT_PROBLEMS
    changed, problems = 0, unread
    for pdf, data in cards:
        registration = str(data.get("registration", ""))
        found = profiles.get(registrations.key(registration), [])
        where = printable(f"{pdf} ({registration}, printed {data.get('made_on', '?')})")
        if len(found) != 1:
            if found:  # a backup copy beside the profile: which one printed this card cannot be told
                files = ", ".join(str(p.path) for p, _ in found)
                print(printable(f"kneeboard compare: {where}: {registration} is the registration of "
                                f"{len(found)} profiles: {files}; remove the copies or give each its own "
                                "registration"), file=sys.stderr)
            else:
                print(f"{where}: no profile of {printable(registration)} to compare with")
            problems += 1
            continue
        prepared, weight = _at_weight(*found[0], data, args, styles)
        if prepared.table is None:
            _print_problems(list(prepared.errors), sys.stderr)
            problems += 1
            continue
        changes = compare_figures(figures_of(data), make_card(prepared).figures())
        tr = translator(prepared.table.language)  # the labels and figures as the card made now prints them
        if not changes:
            stamp = printable(str(data.get("fingerprint", "")))
            why = (f"fingerprint {stamp}" if stamp == prepared.fingerprint else "the profile changed, not a figure "
                   f"this card prints: fingerprint now {prepared.fingerprint}, the card's {stamp}")
            print(f"{where}: current{weight}: every printed figure reads the same ({why})")
            continue
        changed += 1
        worse = sum(c.worse for c in changes)
        print(f"{where}: OUT OF DATE{weight}: {len(changes)} printed figure(s) read differently"
              + (f", {worse} leaving less room" if worse else "") + "; print a new card")
        print(printable(f"  summary: {summary(changes).line(tr)}"))
        for c in changes:
            mark = "! less room: " if c.worse else ""
            old, new = (tr.number(x) if x else "not printed" for x in (c.old, c.new))
            print(printable(f"  {mark}{tr.label(c.label)}: {old} -> {new}"))
    if not cards:
        print(printable(f"kneeboard compare: {card_path}: no kneeboard card found"), file=sys.stderr)
        return EXIT_PROBLEMS
    print(_translated(CAUTION, args.language))
    return EXIT_PROBLEMS if problems else EXIT_CHANGED if changed else EXIT_OK


def _at_weight(prepared, source, data: dict, args, styles):
    """The profile as the card is compared with it: at `--weight` when given, else at the weight the card was made
    for when one was given for it (`weight_given`), else at the profile's own; and the words that say which."""
    weight = args.weight or data.get("weight_given")
    if not isinstance(weight, str) or not weight:
        return prepared, ""
    said = f" at {weight} (--weight)" if args.weight else f" at {weight}, the weight the card was made for"
    return (_safely(source, _styles(args, weight=weight, language=args.language, styles=styles)),
            printable(said))


HANDLERS = {"check": cmd_check, "table": cmd_table, "card": cmd_card, "compare": cmd_compare, **starter.HANDLERS}


def main(argv: list[str] | None = None) -> int:
    argv = sys.argv[1:] if argv is None else argv
    terminate_cleanly()
    _guard_streams()
    if not argv or (argv[0] not in COMMANDS and not argv[0].startswith("-")):
        return _open_app(argv[0] if argv else None)
    parser = _parser()
    args = parser.parse_args(argv)  # exits 2 with a usage message on bad options
    if args.command is None:
        parser.print_help()
        return EXIT_OK
    try:
        return HANDLERS[args.command](args)
    except UsageProblem as exc:
        print(f"kneeboard {args.command}: {printable(exc)}", file=sys.stderr)
        return EXIT_PROBLEMS
    except KeyboardInterrupt:
        print("kneeboard: interrupted", file=sys.stderr)
        return 130
    except BrokenPipeError:
        return _closed_pipe()
    except OSError as exc:
        if exc.errno in DEVICE_FAILURES or exc.errno == errno.EBADF:  # stdout on a full, failed or closed device
            _quiet_stdout()
            print(f"kneeboard: the output could not be written ({exc.strerror or exc})", file=sys.stderr)
            return EXIT_OUTPUT
        return _internal_error(exc)
    except Exception as exc:  # a bug, not bad input: one line, and the traceback on request
        return _internal_error(exc)


def _open_app(target: str | None) -> int:
    """`kneeboard [PATH]`: the app, when there is a screen; a word that is neither a path nor a command is a typo."""
    if target is not None and not os.path.lexists(target):
        close = difflib.get_close_matches(target, COMMANDS, n=1, cutoff=0.5)
        hint = f"; did you mean '{close[0]}'?" if close else f"; the commands are {', '.join(COMMANDS)}"
        print(printable(f"kneeboard: unknown command '{target}'{hint} (or give a profile or folder to open in "
                        "the app; see kneeboard --help)"), file=sys.stderr)
        return EXIT_PROBLEMS
    from kneeboard.display import window_problem

    problem = window_problem()
    if problem is not None:
        print(problem, file=sys.stderr)
        return EXIT_PROBLEMS
    from kneeboard.app.main import run  # the desktop app, on a folder or profile if one is named

    return run(target)


def _internal_error(exc: Exception) -> int:
    if os.environ.get("KNEEBOARD_DEBUG"):
        raise exc
    print(printable(f"kneeboard: internal error, please report it: {type(exc).__name__}: {exc} "
                    "(set KNEEBOARD_DEBUG=1 for details)"), file=sys.stderr)
    return EXIT_BUG


class _ClosedStream(io.TextIOBase):
    """Stands for a standard stream that was closed before kneeboard started (`kneeboard check X >&-`).

    Python then has no sys.stdout at all; a write here fails as a write to a closed descriptor does, and is
    answered as every failed output is (exit 74, one line), never with a traceback.
    """

    def writable(self) -> bool:
        return True

    def write(self, text: str) -> int:
        raise OSError(errno.EBADF, "the standard output is closed")


def _guard_streams() -> None:
    """Standard streams that cannot fail in a way nobody answers.

    A closed descriptor 0, 1 or 2 gets /dev/null, so no file kneeboard opens takes its number (a card's bytes must
    never land where messages go); a closed stdout is a _ClosedStream, a closed stderr drops its messages (the
    exit code still tells). A stream whose encoding cannot take every character (cp1252 behind a redirect on a
    Windows console) writes a replacement for the ones it cannot, instead of failing on a Czech registration.
    """
    for fd, mode in ((0, os.O_RDONLY), (1, os.O_WRONLY), (2, os.O_WRONLY)):
        try:
            os.fstat(fd)
        except OSError:
            with contextlib.suppress(OSError):
                spare = os.open(os.devnull, mode)
                if spare != fd:
                    os.dup2(spare, fd)
                    os.close(spare)
    if sys.stdout is None:
        sys.stdout = _ClosedStream()
    if sys.stderr is None:
        sys.stderr = io.StringIO()
    for stream in (sys.stdout, sys.stderr):
        if isinstance(stream, io.TextIOWrapper) and stream.errors == "strict":
            with contextlib.suppress(ValueError, OSError):  # a stream that cannot be reconfigured is left as it is
                stream.reconfigure(errors="replace")


def _quiet_stdout() -> None:
    """Point stdout at /dev/null, so the interpreter's own flush at exit cannot fail a second time."""
    with contextlib.suppress(OSError, ValueError):  # no stdout to point anywhere: nothing to quiet
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())


def _closed_pipe() -> int:
    # `kneeboard check FLEET | head -1`: the reader has what it wanted; end quietly, as a shell tool does
    _quiet_stdout()
    return EXIT_PIPE


if __name__ == "__main__":
    sys.exit(main())


def main_exit() -> None:
    """Console-script entry point; the last flush of stdout is answered like every other write."""
    code = main()
    try:
        sys.stdout.flush()
    except BrokenPipeError:
        code = _closed_pipe()
    except OSError as exc:
        _quiet_stdout()
        print(f"kneeboard: the output could not be written ({exc.strerror or exc})", file=sys.stderr)
        code = EXIT_OUTPUT
    sys.exit(code)
