"""Starting from nothing on the command line: `kneeboard new` writes a profile from a template, `kneeboard samples`
copies the invented sample fleet and the default card style. Neither ever replaces a file.

The files come from the package (`kneeboard.shipped`), the same the app's File › New profile and its first start
use; nothing here loads the card machinery, so both answer at once.
"""

import contextlib
import os
import sys
from pathlib import Path

from kneeboard import shipped
from kneeboard.cli_words import tr
from kneeboard.i18n import Msg
from kneeboard.problems import Told, printable


class Refused(Told):
    """Nothing was written; the message names the file and why."""


def add_commands(command) -> None:
    """Declare `new` and `samples` with the command line's `command(name, help)` (see `kneeboard.cli`)."""
    new = command("new", tr("write a new profile from a template, to fill in with your aircraft's figures"))
    new.add_argument("profile", metavar="PROFILE.toml", help=tr("the file to write (never replaced if it exists)"))
    new.add_argument("--template", choices=shipped.CATEGORIES_WITH_TEMPLATES, default="normal",
                     help=tr("the aircraft's category (default: normal)"))
    samples = command("samples", tr("copy the invented sample fleet and the default card style into a folder"))
    samples.add_argument("folder", metavar="DIR", help=tr("where to copy them (made if needed; nothing in it is "
                                                          "replaced)"))


def write_new(path: Path, data: bytes) -> None:
    """Write `data` to `path`, which must not exist yet (not even as a link): the check and the creation are one
    step of the file system, so a file that appears meanwhile is not replaced either."""
    try:
        fd = os.open(path, os.O_WRONLY | os.O_CREAT | os.O_EXCL | getattr(os, "O_BINARY", 0), 0o666)
    except FileExistsError:
        raise Refused(Msg("{file}: already exists; nothing was written (choose another name, or move it away "
                          "first)", file=printable(path))) from None
    except FileNotFoundError:
        raise Refused(Msg("{file}: the folder {folder} does not exist; nothing was written", file=printable(path),
                          folder=printable(path.parent))) from None
    except (OSError, ValueError) as exc:
        raise Refused(Msg("{file}: cannot be written ({reason})", file=printable(path),
                          reason=str(getattr(exc, "strerror", None) or exc))) from None
    try:
        with os.fdopen(fd, "wb") as f:
            f.write(data)
            f.flush()
            os.fsync(f.fileno())
    except OSError as exc:
        with contextlib.suppress(OSError):  # ours, half written: gone rather than left looking like a profile
            os.unlink(path)
        raise Refused(Msg("{file}: cannot be written ({reason})", file=printable(path),
                          reason=str(exc.strerror or exc))) from None


def new_profile(path: Path, category: str) -> Path:
    """The template of `category` written to `path` (a new .toml file)."""
    path = Path(path)
    if path.suffix.lower() != ".toml":
        example = printable(path.stem or "mine") + ".toml"
        raise Refused(Msg("{file}: a profile's name ends in .toml (e.g. {example}), so that kneeboard finds it in "
                          "its folder; nothing was written", file=printable(path), example=example))
    write_new(path, shipped.template_path(category).read_bytes())
    return path


def copy_samples(folder: Path) -> list[Path]:
    """The sample profiles and the default style (as fleet.style.toml) copied into `folder`; nothing is copied
    when any of their names is taken there."""
    folder = Path(folder)
    sources = [(source, folder / name) for source, name in shipped.sample_fleet_files()]
    if folder.exists() and not folder.is_dir():
        raise Refused(Msg("{folder}: is not a folder; nothing was copied", folder=printable(folder)))
    taken = [target.name for _, target in sources if os.path.lexists(target)]
    if taken:
        raise Refused(Msg("{folder}: already holds {files}; nothing was copied (choose an empty or new folder)",
                          folder=printable(folder), files=", ".join(printable(t) for t in taken)))
    try:
        folder.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        raise Refused(Msg("{folder}: cannot be made ({reason}); nothing was copied", folder=printable(folder),
                          reason=str(exc.strerror or exc))) from None
    written = []
    for source, target in sources:
        write_new(target, source.read_bytes())
        written.append(target)
    return written


def cmd_new(args) -> int:
    from kneeboard.cli_common import EXIT_OK, EXIT_PROBLEMS
    from kneeboard.texts import CAUTION

    try:
        path = new_profile(Path(args.profile), args.template)
    except Refused as exc:
        print(f"kneeboard new: {exc}", file=sys.stderr)
        return EXIT_PROBLEMS
    print(printable(tr("wrote {file} from the {template} template. Every figure in it is a placeholder: replace "
                       "each with this aircraft's flight-manual figure, then delete the line template = "
                       "\"{template}\". `kneeboard check {file}` names the placeholders left.", file=str(path),
                       template=args.template)))
    print(tr(CAUTION))
    return EXIT_OK


def cmd_samples(args) -> int:
    from kneeboard.cli_common import EXIT_OK, EXIT_PROBLEMS
    from kneeboard.texts import CAUTION

    folder = Path(args.folder)
    try:
        written = copy_samples(folder)
    except Refused as exc:
        print(f"kneeboard samples: {exc}", file=sys.stderr)
        return EXIT_PROBLEMS
    profiles = len(written) - 1
    print(printable(tr("copied {n} invented sample profiles and the card style {style} to {folder}. No figure in "
                       "them is from a real flight manual.", n=profiles, style=shipped.FLEET_STYLE,
                       folder=str(folder))))
    command = f"kneeboard card {folder} -o cards.pdf"
    print(printable(tr("Try: {command}", command=command)))
    print(tr(CAUTION))
    return EXIT_OK


HANDLERS = {"new": cmd_new, "samples": cmd_samples}
