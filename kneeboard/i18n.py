"""The pilot's language: every word kneeboard prints, through one gettext catalogue per language, and figures
written with the language's decimal separator.

One mechanism for the whole package, Qt-free (the card, the reports and the command line load no Qt; the app can
use the same translators): `translator(language)` gives a `Translator` whose call translates a message and fills
its values in, `tr("LIMITS AT {weight}", weight=...)`. The catalogues are the standard gettext `.po` files in
`translations/`, compiled to the `.mo` files the package carries in `kneeboard/locale/` (see the README, "Languages").

Three kinds of string carry what a translation needs to be made later, in whatever language a card is printed in,
while they read as English wherever they are used as text (each is a `str`):

- `Word`: a term of the trade (`terms.MARGIN`): translated by the catalogue wherever it is shown;
- `Msg`: a message and its values, made where the values are known (a warning's plain words), told again in any
  language (`tr(msg)`);
- `Label`: a printed figure's label made of parts (`terms.label`): its English text is the figure's identity, the
  key `compare` matches on, the same in every language; `tr.label(label)` shows it in a language, translating its
  words and leaving a configuration's own name as the profile wrote it.

Figures are identical in every language: only the decimal separator changes where a decimal is printed ("1,41" in
German), units keep their symbols, dates stay ISO 8601. A `Printed` figure (anything with `.value` and `.text`) or
a `Num` given as a value is written with the language's separator; a plain `str` value (a name) never is.

JSON keys and the profile and style files' keys are an interface, not prose: they stay English.
"""

import gettext
import os
import re
from functools import cache, lru_cache
from pathlib import Path

DOMAIN = "kneeboard"
ENGLISH = "en"
#: The languages a card can be printed in: code (ISO 639-1) -> the language's own name for itself.
LANGUAGES = {"en": "English", "de": "Deutsch", "fr": "Français", "es": "Español", "cs": "Čeština", "pl": "Polski"}
#: The decimal separator each language writes (English a point; the others a comma, as their standards bodies and
#: schools write it: DIN 1333, NF X02-003 / ISO 80000-1, RAE, ČSN 01 6910, PN-ISO 80000-1: from memory).
DECIMAL = {"en": ".", "de": ",", "fr": ",", "es": ",", "cs": ",", "pl": ","}
LOCALE_DIR = Path(__file__).parent / "locale"

_DECIMAL_POINT = re.compile(r"(?<=\d)\.(?=\d)")
SOFT_HYPHEN = "\u00ad"


class Word(str):
    """A term of the trade (or any fixed word) that is translated wherever it is shown: `Word("margin")`.

    As a `str` it is the English word, so it can be used as text, compared and hashed as before.
    """

    __slots__ = ()


class Num(str):
    """A figure's printed text given as a message value ("1.5"): written with the language's decimal separator."""

    __slots__ = ()


class Msg(str):
    """A message with its values, kept so it can be told in any language later; as a `str`, its English text.

    `Msg("Temperature {t} °C is outside ...", t=Num("-75"))`. Values may be `Msg`, `Word`, `Num`, a `Printed`
    figure, numbers or plain text (a configuration's name, never translated).
    """

    def __new__(cls, template: str, /, **params):
        self = super().__new__(cls, _fill(template, params, _english()) if params else template)
        self.template, self.params = template, params
        return self

    def __getnewargs__(self):
        return (str(self),)  # copies and pickles rebuild the English text; the template and values follow as state


class Label(str):
    """A printed figure's label from its parts: English joined by `sep` as a `str` (the figure's identity), the
    parts kept so `Translator.label` can show it in another language."""

    def __new__(cls, parts, sep: str = ""):
        self = super().__new__(cls, parts if isinstance(parts, str) else sep.join(parts))
        self.parts, self.sep = (parts,) if isinstance(parts, str) else tuple(parts), sep
        return self

    def __getnewargs__(self):
        return (str(self),)


def N_(message: str) -> Word:
    """Mark a message for the catalogue where it is declared (a constant), to be translated where it is shown."""
    return Word(message)


class Translator:
    """The words and numbers of one language. `tr(message, **values)` translates `message` (a `Msg` with its own
    values too) and fills its values in; `tr.number(text)` writes a figure's decimal separator; `tr.label(label)`
    shows a figure's label."""

    def __init__(self, language: str, catalogue: gettext.NullTranslations, soft_hyphens: bool = False):
        self.language = language
        self.decimal = DECIMAL[language]
        self._catalogue = catalogue
        self._soft = soft_hyphens

    def _gettext(self, message: str) -> str:
        text = self._catalogue.gettext(message)
        return text if self._soft else text.replace(SOFT_HYPHEN, "")

    def __call__(self, message: str, /, **params) -> str:
        if isinstance(message, Msg) and not params:
            message, params = message.template, message.params
        text = self._gettext(message) if message else message
        return _fill(text, params, self) if params else text

    def pgettext(self, context: str, message: str, /, **params) -> str:
        """`message` as said in `context` (a narrow column head may take a shorter word than the text does)."""
        text = self._catalogue.pgettext(context, message)
        return _fill(text if self._soft else text.replace(SOFT_HYPHEN, ""), params, self) if params else \
            (text if self._soft else text.replace(SOFT_HYPHEN, ""))

    def plural(self, singular: str, plural: str, n: int, /, **params) -> str:
        """The form of a message for `n` (Czech and Polish have three); `{n}` is filled in with the others."""
        text = self._catalogue.ngettext(singular, plural, n)
        return _fill(text if self._soft else text.replace(SOFT_HYPHEN, ""), {"n": n, **params}, self)

    def number(self, text: str) -> str:
        """A printed figure's text ("1.41", "3.8/60°") with the language's decimal separator ("1,41")."""
        return text if self.decimal == "." else _DECIMAL_POINT.sub(self.decimal, text)

    def label(self, label: str) -> str:
        """A printed figure's label in this language: its words translated, names kept as written."""
        if not isinstance(label, Label):
            return label
        return label.sep.join(self.label(p) if isinstance(p, Label) else self.shown(p) for p in label.parts)

    def shown(self, value) -> str:
        """A message value as this language writes it."""
        if isinstance(value, Msg):
            return self(value)
        if isinstance(value, Word):
            return self._gettext(value)
        if isinstance(value, Num):
            return self.number(value)
        if isinstance(value, str):
            return value  # the profile's own words (a configuration's name): never translated
        if isinstance(value, bool):
            return str(value)
        if isinstance(value, int):
            return str(value)
        if isinstance(value, float):
            return self.number(f"{value:g}")
        text = getattr(value, "text", None)  # a Printed figure: its rounded text
        return self.number(text) if isinstance(text, str) else str(value)


def _fill(template: str, params: dict, tr: "Translator") -> str:
    return template.format_map({k: tr.shown(v) for k, v in params.items()})


@cache
def translator(language: str = ENGLISH, soft_hyphens: bool = False) -> Translator:
    """The translator of `language` (a key of LANGUAGES); English reads no catalogue.

    A translation may mark where a long word can break with a soft hyphen (U+00AD): the card's translator keeps
    them (`soft_hyphens`; its wrapping breaks there with a hyphen printed), every other one leaves them out.

    Raises
    ------
    ValueError
        For a language kneeboard has no catalogue of.
    """
    if language not in LANGUAGES:
        raise ValueError(f"no catalogue for language {language!r}; expected one of {', '.join(LANGUAGES)}")
    if language == ENGLISH:
        return Translator(ENGLISH, gettext.NullTranslations(), soft_hyphens)
    if soft_hyphens:
        return Translator(language, translator(language)._catalogue, True)  # the catalogue is read once
    with open(catalogue_path(language), "rb") as f:
        return Translator(language, gettext.GNUTranslations(f))


class Speaking:
    """The language a program speaks to its user now (the app, the command line), which may change while it runs:
    `tr`, `plural` and `translator` follow the last `use`. The card's language is its own (`translator`)."""

    def __init__(self):
        self.translator = translator(ENGLISH)

    def use(self, language: str) -> Translator:
        """Speak `language` (a key of LANGUAGES) from now on; ValueError for one kneeboard has no catalogue of."""
        self.translator = translator(language)
        return self.translator

    def tr(self, message: str, /, **params) -> str:
        """`message` (marked for the catalogue) in the language spoken now, its `{values}` filled in."""
        return self.translator(message, **params)

    def plural(self, singular: str, plural_: str, n: int, /, **params) -> str:
        """The form of a message for `n`, in the language spoken now."""
        return self.translator.plural(singular, plural_, n, **params)


#: The language the person using kneeboard reads its messages in: the command line sets it from the locale
#: (`cli_words.start`), the app from its setting or the system's (`app.words`); a problem and a refusal are told in it
#: (`problems.Problem.told`, `problems.Told`). English until one of them speaks.
USER = Speaking()


def language_of(name: str) -> str | None:
    """The code of LANGUAGES a locale name speaks ("de_DE.UTF-8", "de-AT", "fr", "pl_PL@euro" -> "de", "de", "fr",
    "pl"); None for a language kneeboard has no catalogue of, and for the "C" and "POSIX" locales."""
    code = re.split(r"[_.@-]", name.strip(), maxsplit=1)[0].lower()
    return code if code in LANGUAGES else None


#: The environment variables gettext reads the user's language from, in its order (the first one set wins).
LOCALE_VARIABLES = ("LANGUAGE", "LC_ALL", "LC_MESSAGES", "LANG")


def locale_language(environ=None) -> str:
    """The language of the user's locale, as gettext finds it: the command line's help and messages speak it.

    The first of LC_ALL, LC_MESSAGES and LANG that is set names the locale; LANGUAGE, a list of languages in order
    of preference ("de:fr"), goes before them unless the locale is "C" or "POSIX" (GNU gettext's rule: a program
    run in the C locale speaks English whatever LANGUAGE says). English when none names a language of LANGUAGES.
    Reads no catalogue.
    """
    environ = os.environ if environ is None else environ
    locale = next((environ[v] for v in LOCALE_VARIABLES[1:] if environ.get(v)), "")
    if locale.split(".")[0] in ("", "C", "POSIX"):
        return ENGLISH
    for name in [*environ.get("LANGUAGE", "").split(":"), locale]:
        if name and language_of(name):
            return language_of(name)
    return ENGLISH


def catalogue_path(language: str) -> Path:
    """The compiled catalogue (.mo) of `language` inside the package."""
    return LOCALE_DIR / language / "LC_MESSAGES" / f"{DOMAIN}.mo"


@lru_cache(maxsize=1)
def _english() -> Translator:
    return Translator(ENGLISH, gettext.NullTranslations())


def english(message: str, /, **params) -> str:
    """A message in English with its values filled in (what a `Msg` reads as)."""
    return _english()(message, **params)
