"""The app's own words in the person's language, through the same gettext catalogues as the card
(`kneeboard.i18n`); no Qt translation files.

The app speaks one language at a time, the one its setting names (Settings › Language, kept in QSettings under
`SETTING`), else the system's (`QLocale()`, which is the system's locale unless a default was set), else English.
It is separate from the card's language: an English app prints a German card when the style says so.

Widgets show `tr("Open profile…")`; a text that is shown again when the language changes is set through a `Texts`,
which keeps the English with the widget's setter and sets every one again in the new language.
"""

from kneeboard.i18n import ENGLISH, LANGUAGES, N_, USER, language_of

SETTING = "language"  #: QSettings key: a code of i18n.LANGUAGES, or "" (or nothing) to follow the system
SYSTEM = N_("The system's language")  #: the language menu's first entry
#: The templates' categories as the app names them (shipped.CATEGORIES_WITH_TEMPLATES)
CATEGORY_NAMES = {"normal": N_("Normal"), "utility": N_("Utility"), "acrobatic": N_("Acrobatic"),
                  "glider": N_("Glider")}
#: The same in a sentence ("3.8 for the normal category")
CATEGORY_WORDS = {"normal": N_("normal"), "utility": N_("utility"), "acrobatic": N_("acrobatic"),
                  "glider": N_("glider")}

_speaking = USER  # the app and the command line are never one process: each speaks as its user reads
tr, plural = _speaking.tr, _speaking.plural  # `message` (marked for the catalogue) in the app's language


def told(value) -> str:
    """A problem's words in the app's language: a `Msg` (a message kept with its values) or a `Word` translated, a
    figure (`Num`) with the language's decimal separator, the profile's own text (a field path, a name, a value as
    written) as it is."""
    return _speaking.translator.shown(value)


def translated() -> object:
    """The app's translator itself (`i18n.Translator`), for what takes one (a comparison's summary line)."""
    return _speaking.translator


def language() -> str:
    return _speaking.translator.language


def use(code: str) -> None:
    """Speak `code` (a key of i18n.LANGUAGES) from now on."""
    _speaking.use(code)


def system_language() -> str:
    """The system's language if kneeboard has it (Qt's default locale: the system's, unless a default was set),
    else English."""
    from PySide6.QtCore import QLocale

    return language_of(QLocale().name()) or ENGLISH


def chosen(settings) -> str:
    """The language the person chose in the settings; "" when they follow the system (or chose nothing valid)."""
    value = settings.value(SETTING, "")
    return value if isinstance(value, str) and value in LANGUAGES else ""


def start(settings) -> str:
    """Speak the language the settings name, else the system's; returns it."""
    use(chosen(settings) or system_language())
    return language()


class Texts:
    """Texts of widgets kept with their English, so a change of language sets each again.

    `texts.set(button.setText, "Reload")` shows the text now, and `again()` shows every one kept in the language of
    the moment; setting the same setter again replaces what it showed.
    """

    def __init__(self):
        self._kept: dict = {}

    def set(self, setter, message: str, /, **params) -> None:
        self._kept[setter] = (message, params)
        setter(tr(message, **params))

    def again(self) -> None:
        for setter, (message, params) in self._kept.items():
            setter(tr(message, **params))
