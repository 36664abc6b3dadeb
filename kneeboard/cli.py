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
from kneeboard.cli_common import (
    EXIT_BUG,
    EXIT_OK,
    EXIT_OUTPUT,
    EXIT_PIPE,
    EXIT_PROBLEMS,
    print_problems,
    safely,
    styles_of,
)
from kneeboard.cli_words import plural, start, tr
from kneeboard.fileio import DEVICE_FAILURES, FileProblem, terminate_cleanly
from kneeboard.i18n import N_
from kneeboard.problems import Told, printable
from kneeboard.texts import CAUTION

COMMANDS = ("check", "table", "card", "compare", "new", "samples")
PROGRESS_ABOVE = 5  #: more aircraft than this get a progress line on stderr


class UsageProblem(Told):
    """A bad option value; the message names the option."""


def _usage() -> str:
    return "\n       ".join((
        "kneeboard [PROFILE_OR_FOLDER]      " + tr("open the app (on the last fleet, or a copy of the sample fleet)"),
        "kneeboard COMMAND ...              " + tr("check | table | card | compare, without a window"),
        "kneeboard new | samples ...        " + tr("start: a profile from a template, or a copy of the samples")))


def _parser() -> argparse.ArgumentParser:
    """The command line's options and help, in its language (`cli_words.start` chose it)."""
    # the choices that mirror a style key are that key's declared options (the declarations load neither the units
    # library nor the card code); made only when a command runs, so `kneeboard` opening the app does not pay for them
    from kneeboard.card.geometry import SHEET_SIZES
    from kneeboard.inputs.style_keys import BY_KEY

    sizes, languages = BY_KEY["size"].options, BY_KEY["language"].options
    speed_units, distance_units = BY_KEY["speed_unit"].options, BY_KEY["distance_unit"].options
    caution = textwrap.fill(tr(CAUTION), 79)
    p = argparse.ArgumentParser(
        prog="kneeboard",
        usage=_usage(),
        description=tr("Cockpit cards of stall speed and margin by bank angle, from an aircraft's published "
                       "figures."),
        epilog=caution,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    p.add_argument("--version", action="version", version=f"kneeboard {__version__}\n{caution}",
                   help=tr("show program's version number and exit"))
    sub = p.add_subparsers(dest="command", metavar="COMMAND")

    def command(name, help_text):
        return sub.add_parser(name, prog=f"kneeboard {name}", help=help_text,
                              description=help_text[0].upper() + help_text[1:] + ".", epilog=caution,
                              formatter_class=argparse.RawDescriptionHelpFormatter)

    style_help = tr("card style (default: the fleet.style.toml beside each profile, else the shipped default)")
    language_help = tr("the language of the card's words (default: the style's, else the profile's, else en); the "
                       "figures are the same in every language")
    check = command("check", tr("validate profiles and list every problem"))
    check.add_argument("profiles", nargs="+", metavar="PROFILE_OR_FOLDER")
    check.add_argument("--style", metavar="STYLE.toml", help=style_help)

    table = command("table", tr("print the computed table of one profile"))
    table.add_argument("profile", metavar="PROFILE")
    table.add_argument("--weight", metavar="QTY", help=tr('weight to compute for, e.g. "690 kg" or "1500 lb"'))
    table.add_argument("--bank", metavar="LIST", help=tr("bank angles in degrees, e.g. 0,20,40"))
    table.add_argument("--speed-unit", choices=speed_units)
    table.add_argument("--distance-unit", choices=distance_units)
    table.add_argument("--format", choices=("text", "csv", "json"), default="text")
    table.add_argument("--language", choices=languages, help=language_help)
    table.add_argument("--style", metavar="STYLE.toml", help=style_help)
    card = command("card", tr("make cockpit cards as PDF (one aircraft or a whole folder)"))
    card.add_argument("profiles", nargs="+", metavar="PROFILE_OR_FOLDER")
    card.add_argument("-o", "--output", metavar="OUT.pdf", help=tr("one PDF with every card"))
    card.add_argument("--each", metavar="DIR", help=tr("one PDF per aircraft in DIR, named by registration"))
    card.add_argument("--size", choices=sizes,
                      help=tr("card size (default: the style's, {size})", size=BY_KEY["size"].default))
    card.add_argument("--landscape", action="store_true", help=tr("turn the card sideways"))
    card.add_argument("--style", metavar="STYLE.toml", help=style_help)
    card.add_argument("--weight", metavar="QTY", help=tr('weight for every card, e.g. "690 kg"'))
    card.add_argument("--sheet", choices=tuple(SHEET_SIZES), help=tr("impose several cards on Letter or A4 sheets"))
    card.add_argument("--png", metavar="DPI", type=int, help=tr("also write each card page as PNG at DPI"))
    card.add_argument("--language", choices=languages, help=language_help)
    compare = command("compare", tr("compare a printed card with what its profile prints now (exit 1 when it "
                                     "changed)"))
    compare.add_argument("card", metavar="CARD.pdf_OR_FOLDER", help=tr("a card PDF, or a folder of them"))
    compare.add_argument("profile", metavar="PROFILE_OR_FOLDER", help=tr("its profile, or the fleet folder"))
    compare.add_argument("--style", metavar="STYLE.toml", help=style_help)
    compare.add_argument("--language", choices=languages, help=language_help)
    compare.add_argument("--weight", metavar="QTY", help=tr('compare at this weight, not at the weight the card '
                                                            'was made for, e.g. "690 kg"'))
    starter.add_commands(command)
    return p


def _parse_banks(text: str | None):
    """The numbers of --bank; their range is checked like a profile's own bank angles."""
    if text is None:
        return None
    try:
        banks = [float(part) for part in text.split(",") if part.strip()]
    except ValueError:
        raise UsageProblem(tr("--bank {text}: not a list of numbers; expected e.g. 0,20,40", text=repr(text))) from None
    if not banks:
        raise UsageProblem(tr("--bank {text}: no bank angle given; expected e.g. 0,20,40", text=repr(text)))
    return tuple(banks)


def _print_style_problems(styles, paths) -> None:
    """Each style file's problems once, before the profiles that use it."""
    seen = set()
    for path in paths:
        key = styles.path_for(path)
        if key not in seen:
            seen.add(key)
            print_problems(list(styles.for_profile(path)[1]), sys.stderr)


def cmd_check(args) -> int:
    from kneeboard.inputs.profiles import expand_paths, read_source

    files = expand_paths(args.profiles)
    if not files:
        print("kneeboard check: " + tr("no profile files (*.toml) found"), file=sys.stderr)
        return EXIT_PROBLEMS
    from kneeboard import registrations

    styles = styles_of(args, cards=False)
    _print_style_problems(styles, files)
    failed = 0
    registered = []  # (registration as written, file): each file read once, for its check and for this
    for path in files:
        prepared = safely(source := read_source(path), styles)
        registered.append((source.registration, path))
        print_problems(list(prepared.problems), sys.stdout)
        if prepared.table is None:
            failed += 1
            print(tr("{file}: {n} error(s); no card can be made", file=printable(path), n=len(prepared.errors)))
            continue
        a = prepared.profile.aircraft
        names = ", ".join(_quoted(c.name) for c in prepared.profile.configurations)  # names may hold commas
        warned = tr(", {n} warning(s)", n=len(prepared.warnings)) if prepared.warnings else ""
        print(printable(tr("{file}: ok{warned}: {registration} ({model}), {n} configuration(s): {names}; "
                           "fingerprint {fingerprint}", file=str(path), warned=warned, registration=a.registration,
                           model=a.model, n=len(prepared.profile.configurations), names=names,
                           fingerprint=prepared.fingerprint)))
    duplicates = registrations.duplicates(registered)
    print_problems(registrations.problems(duplicates), sys.stdout)  # every file of each duplicate, named
    print(tr(CAUTION))
    return EXIT_PROBLEMS if failed or duplicates else EXIT_OK


def cmd_table(args) -> int:
    from kneeboard.pipeline import prepare_file, report_text

    styles = styles_of(args, cards=False, weight=args.weight, bank_angles=_parse_banks(args.bank),
                     speed_unit=args.speed_unit, distance_unit=args.distance_unit, language=args.language)
    path = Path(args.profile)
    _print_style_problems(styles, [path])
    prepared = prepare_file(path, styles)
    machine = args.format != "text"
    print_problems(list(prepared.problems), sys.stderr)
    if prepared.table is None:
        print(tr("{file}: {n} error(s); no table can be made", file=printable(args.profile), n=len(prepared.errors)),
              file=sys.stderr)
        return EXIT_PROBLEMS
    sys.stdout.write(report_text(prepared, args.format))
    # the caution in the table's language when one was chosen (--language, the style, the profile), else in the
    # locale's; JSON is the machine interface, in English (its keys and its texts)
    language = prepared.table.language if args.language or prepared.table.language != "en" else None
    caution = CAUTION if args.format == "json" else _translated(CAUTION, language)
    print(caution, file=sys.stderr if machine else sys.stdout)
    return EXIT_OK


def cmd_card(args) -> int:
    from kneeboard.export import export_cards
    from kneeboard.inputs.profiles import expand_paths

    if not args.output and not args.each:
        raise UsageProblem(tr("say where to write: -o OUT.pdf, --each DIR, or both"))
    if args.png is not None and not 36 <= args.png <= 1200:
        raise UsageProblem(tr("--png {dpi}: expected a resolution from 36 to 1200 dpi", dpi=args.png))
    styles = styles_of(args, weight=args.weight, size=args.size, landscape=True if args.landscape else None,
                     language=args.language)
    paths = expand_paths(args.profiles)
    if not paths:
        print("kneeboard card: " + tr("no profile files (*.toml) found"), file=sys.stderr)
        return EXIT_PROBLEMS
    show = len(paths) > PROGRESS_ABOVE

    def progress(done, total, name):
        if show and name:
            print(printable(tr("card {n} of {total}: {name}", n=done + 1, total=total, name=name)), file=sys.stderr)
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
    print_problems(made.warnings, sys.stderr)
    print_problems(made.clashes, sys.stderr)  # each file of a duplicate named, instead of a numbered file name
    for failure in made.failures:
        for line in failure.lines:
            print(printable(line), file=sys.stderr)
        print(tr("{file}: skipped", file=printable(failure.path)), file=sys.stderr)
    for registration, cards, faces in made.made:
        print(printable(f"{registration}: " + tr("{cards} ({faces})", cards=plural("{n} card", "{n} cards", cards),
                                                 faces=plural("{n} face", "{n} faces", faces))))
    if made.cards:
        pngs = [p for p in made.written if p.suffix == ".png"]
        if out is not None:
            on = (tr("{cards} card(s) on {n} sheets", cards=made.cards, n=made.pages) if args.sheet else
                  tr("{cards} card(s) on {n} pages", cards=made.cards, n=made.pages))
            print(printable(tr("wrote {file}: {what}", file=str(out), what=on)))
        if each is not None:
            n = sum(1 for p in made.written if p.suffix == ".pdf" and p.parent == each)
            print(printable(tr("wrote {n} PDF(s) in {folder}", n=n, folder=str(each))))
        if pngs:
            print(printable(tr("wrote {n} PNG page(s) at {dpi} dpi in {folder}", n=len(pngs), dpi=args.png,
                               folder=str(pngs[0].parent))))
    else:
        print("kneeboard card: " + tr("no card could be made"), file=sys.stderr)
    if len(paths) > 1 or made.failures:
        skipped = tr("; {n} skipped (see above)", n=len(made.failures)) if made.failures else ""
        print(tr("{made} of {total} cards made{skipped}", made=made.cards, total=len(paths), skipped=skipped))
    print(_translated(CAUTION, args.language))
    return EXIT_PROBLEMS if made.failures or made.clashes or not made.cards else EXIT_OK


def _translated(text: str, language: str | None) -> str:
    """`text` (a message marked for the catalogues) in `language`; in the locale's when none is asked for."""
    from kneeboard.i18n import translator

    return translator(language)(text) if language else tr(text)


def _quoted(name: str) -> str:
    """A name in double quotes (a quote inside it escaped), so a list of names reads apart from its commas."""
    return '"' + name.replace("\\", "\\\\").replace('"', '\\"') + '"'


def cmd_compare(args) -> int:
    """A printed card against its profile (`kneeboard.cli_compare`)."""
    from kneeboard.cli_compare import compare

    return compare(args)


HANDLERS = {"check": cmd_check, "table": cmd_table, "card": cmd_card, "compare": cmd_compare, **starter.HANDLERS}


def main(argv: list[str] | None = None) -> int:
    argv = sys.argv[1:] if argv is None else argv
    terminate_cleanly()
    _guard_streams()
    start()  # the locale's language for help and messages: one catalogue read, none for English
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
        print("kneeboard: " + tr("interrupted"), file=sys.stderr)
        return 130
    except BrokenPipeError:
        return _closed_pipe()
    except OSError as exc:
        if exc.errno in DEVICE_FAILURES or exc.errno == errno.EBADF:  # stdout on a full, failed or closed device
            _quiet_stdout()
            print("kneeboard: " + tr("the output could not be written ({reason})", reason=_reason(exc)),
                  file=sys.stderr)
            return EXIT_OUTPUT
        return _internal_error(exc)
    except Exception as exc:  # a bug, not bad input: one line, and the traceback on request
        return _internal_error(exc)


def _open_app(target: str | None) -> int:
    """`kneeboard [PATH]`: the app, when there is a screen; a word that is neither a path nor a command is a typo."""
    if target is not None and not os.path.lexists(target):
        close = difflib.get_close_matches(target, COMMANDS, n=1, cutoff=0.5)
        hint = (tr("; did you mean '{command}'?", command=close[0]) if close else
                tr("; the commands are {commands}", commands=", ".join(COMMANDS)))
        print(printable("kneeboard: " + tr("unknown command '{word}'{hint} (or give a profile or folder to open in "
                                           "the app; see kneeboard --help)", word=target, hint=hint)), file=sys.stderr)
        return EXIT_PROBLEMS
    from kneeboard.display import window_problem

    problem = window_problem()
    if problem is not None:
        print(tr(problem), file=sys.stderr)
        return EXIT_PROBLEMS
    from kneeboard.app.main import run  # the desktop app, on a folder or profile if one is named

    return run(target)


def _internal_error(exc: Exception) -> int:
    if os.environ.get("KNEEBOARD_DEBUG"):
        raise exc
    error = f"{type(exc).__name__}: {exc}"
    print(printable("kneeboard: " + tr("internal error, please report it: {error} (set KNEEBOARD_DEBUG=1 for "
                                       "details)", error=error)), file=sys.stderr)
    return EXIT_BUG


class _ClosedStream(io.TextIOBase):
    """Stands for a standard stream that was closed before kneeboard started (`kneeboard check X >&-`).

    Python then has no sys.stdout at all; a write here fails as a write to a closed descriptor does, and is
    answered as every failed output is (exit 74, one line), never with a traceback.
    """

    def writable(self) -> bool:
        return True

    def write(self, text: str) -> int:
        raise OSError(errno.EBADF, N_("the standard output is closed"))


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


def _reason(exc: OSError) -> str:
    """Why an output failed: the system's own words as they are; kneeboard's own (a closed standard output, a Word)
    told in the user's language."""
    return exc.strerror or str(exc)


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
        print("kneeboard: " + tr("the output could not be written ({reason})", reason=_reason(exc)),
              file=sys.stderr)
        code = EXIT_OUTPUT
    sys.exit(code)
