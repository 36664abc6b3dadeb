"""The command line's words in the user's language: its help, its messages and argparse's own, through the
package's gettext catalogues (`kneeboard.i18n`), as gettext finds the language (LANGUAGE, LC_ALL, LC_MESSAGES,
LANG; `i18n.locale_language`). English otherwise. Option names, JSON and CSV stay English.

`start()` picks the language once per run, reading the one catalogue it needs (none for English), and gives
argparse our words for its own ("usage:", "the following arguments are required: %s"): argparse asks Python's
`gettext` for them, in a domain kneeboard does not ship, so its module's `_` and `ngettext` are pointed at our
translator for the run. No Qt.
"""

import argparse

from kneeboard.i18n import ENGLISH, N_, USER, Translator, locale_language

#: argparse's own messages that kneeboard's commands can show, as argparse writes them (Python 3.11 to 3.13),
#: marked so the catalogues carry them
ARGPARSE = (
    N_("usage: "), N_("positional arguments"), N_("options"), N_("show this help message and exit"),
    N_("argument %(argument_name)s: %(message)s"), N_("unrecognized arguments: %s"),
    N_("the following arguments are required: %s"), N_("expected one argument"),
    N_("expected at least one argument"), N_("invalid %(type)s value: %(value)r"),
    N_("invalid choice: %(value)r (choose from %(choices)s)"), N_("%(prog)s: error: %(message)s\n"),
    N_("ambiguous option: %(option)s could match %(matches)s"), N_("ignored explicit argument %r"),
    N_("not allowed with argument %s"), N_("one of the arguments %s is required"),
)

_speaking = USER  # the app and the command line are never one process: each speaks as its user reads
tr, plural = _speaking.tr, _speaking.plural  # `message` (marked for the catalogue) in the command line's language


def translated() -> Translator:
    """The command line's translator itself."""
    return _speaking.translator


def start(environ=None) -> Translator:
    """Speak the user's locale's language for this run (English when kneeboard has none of it); returns its
    translator. argparse's own words follow."""
    language = locale_language(environ)
    words = _speaking.use(language)
    if language != ENGLISH:
        argparse._ = words  # argparse looks its `_` and `ngettext` up each time it speaks
        argparse.ngettext = words.plural
    else:
        import gettext

        argparse._, argparse.ngettext = gettext.gettext, gettext.ngettext
    return words
