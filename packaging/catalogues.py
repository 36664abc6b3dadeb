"""The translation catalogues: extract the messages the code marks, bring each language's `.po` up to date, and
compile them into the `.mo` files the package carries (`make catalogues`; Babel, a development tool).

    python packaging/catalogues.py            # extract, update every translations/LANG.po, compile
    python packaging/catalogues.py compile    # compile only (after translating)

The messages are every string the code marks: `tr("...")` and `tr.plural("...", "...", n)` where it is shown,
`Msg("...")` where a message is made with its values, `N_("...")` where a constant is declared (`kneeboard.i18n`).
The app's windows (kneeboard/app/) mark theirs the same way (`tr` from `kneeboard.app.words`). The declared
keys' words (`kneeboard.inputs.profile_keys`: the editor's labels, placeholders, help and column names;
`kneeboard.inputs.style_keys`: the style dialog's labels, help and options) are read from the declarations
themselves, which are data rather than marked calls. The `.po` files keep no source line numbers, so
moving code changes no catalogue.
"""

import sys
from pathlib import Path

from babel.messages.catalog import Catalog
from babel.messages.extract import extract_from_dir
from babel.messages.mofile import write_mo
from babel.messages.pofile import read_po, write_po

ROOT = Path(__file__).resolve().parent.parent
SOURCE = ROOT / "kneeboard"
TRANSLATIONS = ROOT / "translations"  #: LANG.po, one per language, and kneeboard.pot
sys.path.insert(0, str(ROOT))
from kneeboard import __version__  # noqa: E402
from kneeboard.i18n import DOMAIN, ENGLISH, LANGUAGES, catalogue_path  # noqa: E402

HEADER = """\
# {language} words of kneeboard: the card, the text and CSV reports, the warnings.
# The trade's words follow docs/glossary/{code}.md, where each has its source.
# Figures are never translated; keep every {{placeholder}} as it is.
#"""

KEYWORDS = {"tr": None, "Msg": None, "N_": None, "plural": (1, 2), "pgettext": ((1, "c"), 2)}
METHODS = [("**.py", "python")]


def template() -> Catalog:
    """Every message the package's code marks, as a catalogue without translations."""
    catalogue = Catalog(project="kneeboard", version=__version__, domain=DOMAIN, charset="utf-8", fuzzy=False,
                        msgid_bugs_address="", copyright_holder="kneeboard",
                        header_comment="# The messages of kneeboard, extracted by packaging/catalogues.py.\n#")
    for _file, _line, message, comments, context in extract_from_dir(SOURCE, METHODS, keywords=KEYWORDS,
                                                                      strip_comment_tags=True):
        catalogue.add(message, None, auto_comments=comments, context=context)
    for message in declared():
        if message not in catalogue:
            catalogue.add(message, None, auto_comments=["a profile field's label, placeholder or help (the editor)"])
    return catalogue


def declared() -> list[str]:
    """The words of the declared keys the app shows: a profile field's label, placeholder, help and column names (the
    editor), a style key's label, help and options as shown (the style dialog)."""
    from kneeboard.inputs.profile_keys import FIELDS
    from kneeboard.inputs.style_keys import KEYS

    words = []
    for field in FIELDS:
        words += [w for w in (field.label, field.placeholder, field.help, *field.columns) if w]
    for key in KEYS:
        words += [w for w in (key.label, key.help, *(shown for _, shown in key.option_labels)) if w]
    return list(dict.fromkeys(words))


def po_path(language: str) -> Path:
    return TRANSLATIONS / f"{language}.po"


def read(language: str) -> Catalog:
    with open(po_path(language), "rb") as f:
        return read_po(f, locale=language, domain=DOMAIN)


def write(catalogue: Catalog, path: Path) -> None:
    with open(path, "wb") as f:
        write_po(f, catalogue, width=116, omit_header=False, include_lineno=False, sort_output=False,
                 ignore_obsolete=False)


def update() -> None:
    """Write kneeboard.pot, and bring each language's .po up to it: new messages added untranslated, changed ones
    marked fuzzy (a test fails on both), removed ones kept as obsolete at the end."""
    TRANSLATIONS.mkdir(exist_ok=True)
    pot = template()
    write(pot, TRANSLATIONS / f"{DOMAIN}.pot")
    for language in LANGUAGES:
        if language == ENGLISH:
            continue
        if po_path(language).exists():
            catalogue = read(language)
        else:
            catalogue = Catalog(locale=language, domain=DOMAIN, project="kneeboard", version=__version__,
                                msgid_bugs_address="", copyright_holder="kneeboard", fuzzy=False,
                                header_comment=HEADER.format(language=LANGUAGES[language], code=language))
        catalogue.update(pot, update_header_comment=False)
        write(catalogue, po_path(language))


def compile_all() -> None:
    """Compile each translations/LANG.po into the package's kneeboard/locale/LANG/LC_MESSAGES/kneeboard.mo."""
    for language in LANGUAGES:
        if language == ENGLISH:
            continue
        target = catalogue_path(language)
        target.parent.mkdir(parents=True, exist_ok=True)
        with open(target, "wb") as f:
            write_mo(f, read(language), use_fuzzy=False)


if __name__ == "__main__":
    if sys.argv[1:] != ["compile"]:
        update()
    compile_all()
