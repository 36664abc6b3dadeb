"""What every command of the command line shares: its exit codes, how a profile is prepared safely (a bug on one
file is that file's error), the styles by the one rule, and how problems are printed. `cli`, `cli_compare` and
`starter` import it; it imports none of them."""

import os
from pathlib import Path

from kneeboard.i18n import Msg
from kneeboard.problems import Problem

EXIT_OK, EXIT_PROBLEMS, EXIT_BUG, EXIT_OUTPUT = 0, 2, 70, 74  #: 74: the output device failed (EX_IOERR)
EXIT_PIPE = 141  #: the reader of the output went away (128 + SIGPIPE), as a shell tool's exit
EXIT_CHANGED = 1  #: compare: the printed card is out of date


def print_problems(problems: list[Problem], stream, tr=None) -> None:
    """Each problem's line, in the language of `tr` (an `i18n.Translator`; the user's when None)."""
    for p in problems:
        print(p.told(tr), file=stream)  # Problem's text escapes what a file holds (newlines, escape sequences)


def told(exc: Exception, tr) -> str:
    """A refusal's message in the language of `tr` where it was made as a `Msg`; as the exception says it otherwise."""
    message = exc.args[0] if exc.args else ""
    return tr(message) if isinstance(message, Msg) else str(exc)


def styles_of(args, styles=None, cards=True, **overrides):
    """The style of each profile by the one rule; `cards=False`: a command that makes no card loads no card code."""
    from kneeboard.pipeline import Overrides, Styles

    if styles is not None:  # another run's overrides over the same style files
        return Styles(styles.explicit, Overrides(**overrides), cards)
    return Styles(Path(args.style) if getattr(args, "style", None) else None, Overrides(**overrides), cards)


def safely(source, styles):
    """Prepare one profile file as read; a bug in the handling of one file is that file's error, not the run's."""
    from kneeboard.pipeline import Prepared, prepare_source

    try:
        return prepare_source(source, styles)
    except Exception as exc:
        if os.environ.get("KNEEBOARD_DEBUG"):
            raise
        error = f"{type(exc).__name__}: {exc}"  # the program's own words, for its developers: as they are
        problem = Problem("(file)", Msg("internal error on this profile, please report it: {error}", error=error),
                          file=str(source.path))
        return Prepared(source.path, "", None, None, None, None, (problem,))
