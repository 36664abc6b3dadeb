"""The card and the reports in the pilot's language: complete catalogues, no English word left on a card, the same
figures in every language, the language's decimal separator, and every card laid out at every size."""

import copy
import gettext
import pickle
import re
import string
import sys
from pathlib import Path

import pytest
from conftest import ROOT, SAMPLES

from kneeboard import i18n, terms
from kneeboard.card import fonts
from kneeboard.card.ops import CAUTION, FIGURE, Text
from kneeboard.cli import main
from kneeboard.i18n import LANGUAGES, Msg, Num, translator
from kneeboard.pipeline import Overrides, Styles, make_card, prepare_file, report_text
from kneeboard.texts import CAUTION as CAUTION_LINE
from kneeboard.texts import CAUTION_CARD

sys.path.insert(0, str(ROOT / "packaging"))
import catalogues  # noqa: E402  (packaging/catalogues.py: the extraction the catalogues are made from)

TRANSLATED = [code for code in LANGUAGES if code != "en"]
AIRCRAFT = sorted(SAMPLES.glob("*.toml")) + sorted((ROOT / "tests" / "aircraft").glob("*.toml"))
SIZES = ("a5", "half-letter", "5x8", "4x6")
MADE_ON = "2026-12-01"
#: Words every language prints as the trade or a regulation writes them, and unit symbols (never translated)
KEPT = {"IAS", "CAS", "TAS", "VA", "VFE", "Vs", "VS", "g", "kt", "mph", "km", "h", "ft", "m", "s", "lb", "kg", "C"}
_WORD = re.compile(r"[^\W\d_]+")


def card(path: Path, language: str, size: str = "a5"):
    return make_card(prepared(path, language, size), MADE_ON)


def prepared(path: Path, language: str, size: str | None = None):
    p = prepare_file(path, Styles(None, Overrides(language=language, size=size)))
    assert p.table is not None, p.problems
    return p


def texts(c) -> list[Text]:
    """The card's lines of text as they print (a soft hyphen prints nothing)."""
    return [op._replace(text=op.text.replace(fonts.SOFT_HYPHEN, "")) for page in c.pages for op in page.ops
            if type(op) is Text]


def words(text: str) -> set[str]:
    return set(_WORD.findall(text))


def own_words(path: Path) -> set[str]:
    """The words the profile itself gives the card (registration, model, configuration names, notes)."""
    t = prepared(path, "en").table
    return words(" ".join([t.registration, t.model, t.notes, *(c.name for c in t.configurations)]))


def placeholders(text: str) -> set[str]:
    return {name for _, name, _, _ in string.Formatter().parse(text) if name}


# --- the catalogues ---------------------------------------------------------------------------------------------


def _key(message) -> tuple:
    return (message.context, message.id if isinstance(message.id, str) else tuple(message.id))


@pytest.mark.parametrize("language", TRANSLATED)
def test_every_message_the_code_marks_is_translated_in_every_catalogue(language):
    wanted = {_key(m) for m in catalogues.template() if m.id}
    catalogue = catalogues.read(language)
    found = {_key(m): m for m in catalogue if m.id}
    assert set(found) == wanted, ("missing", wanted - set(found), "not in the code", set(found) - wanted)
    assert not catalogue.obsolete, list(catalogue.obsolete)
    for key, m in found.items():
        forms = [m.string] if isinstance(m.string, str) else list(m.string)
        assert all(forms) and len(forms) == catalogue.num_plurals if m.pluralizable else all(forms), key
        assert not m.fuzzy, key


@pytest.mark.parametrize("language", TRANSLATED)
def test_translations_keep_every_value_of_their_message(language):
    for m in catalogues.read(language):
        if not m.id:
            continue
        ids = [m.id] if isinstance(m.id, str) else list(m.id)
        forms = [m.string] if isinstance(m.string, str) else list(m.string)
        for form in forms:  # a plural form may leave out the count ("a warning" for {n} = 1)
            found = placeholders(form) - {"n"} if len(ids) > 1 else placeholders(form)
            assert found == (placeholders(ids[-1]) - {"n"} if len(ids) > 1 else placeholders(ids[0])), (m.id, form)


@pytest.mark.parametrize("language", TRANSLATED)
def test_the_package_carries_each_catalogue_compiled_as_translated(language):
    with open(i18n.catalogue_path(language), "rb") as f:
        compiled = gettext.GNUTranslations(f)
    for m in catalogues.read(language):
        if not m.id:
            continue
        if m.context:
            assert compiled.pgettext(m.context, m.id) == m.string
        elif isinstance(m.id, str):
            assert compiled.gettext(m.id) == m.string
        else:
            for n, form in ((1, m.string[0]), (5, m.string[-1])):
                assert compiled.ngettext(m.id[0], m.id[1], n) == form


# --- the card in each language ----------------------------------------------------------------------------------


#: Names kneeboard cites as they are published, in every language: a handbook's title, a regulation's name, "x" for
#: times in a ratio ("1,25 x")
CITED = {"Airplane", "Flying", "Handbook", "CFR", "x"}
#: Words a translation shares with English, spelt alike and meaning the same in that language (checked by reading
#: the catalogue): anything else of the English card's own words on a translated card fails the test
SHARED = {
    "de": {"in", "Wind"},
    "fr": {"a", "air", "altitude", "configuration", "contamination", "correction", "figure", "instruction", "place",
           "position", "proportion", "standard", "structure", "Structure", "table"},
    "es": {"a", "A", "factor", "flaps", "local", "manual", "no", "usual"},  # flaps: see docs/glossary/es.md
    "cs": {"a"},
    "pl": {"to"},
}


def vocabulary(c) -> set[str]:
    """The words a card prints, its fingerprint left out (eight hex digits are no words)."""
    return {w for op in texts(c) for w in words(op.text.replace(c.fingerprint, ""))}


@pytest.mark.parametrize("language", TRANSLATED)
def test_a_card_in_each_language_prints_no_english_word_of_its_own(language):
    """Every word the English card prints that is kneeboard's own (not the profile's, not a unit or a regulation's
    abbreviation, not a cited title) is absent from the card in `language`, but for the words the two languages
    spell alike."""
    for path in AIRCRAFT:
        english = vocabulary(card(path, "en")) - own_words(path) - KEPT - CITED
        assert len(english) > 40
        left = vocabulary(card(path, language)) & english
        assert left <= SHARED[language], (path.name, sorted(left - SHARED[language]))


@pytest.mark.parametrize("language", TRANSLATED)
def test_the_caution_is_printed_in_full_in_the_language_on_every_face(language):
    caution = " ".join(translator(language)(CAUTION_CARD).split())
    assert caution != " ".join(CAUTION_CARD.split())
    for path in (SAMPLES / "demo_trainer.toml", ROOT / "tests" / "aircraft" / "ballast_glider.toml"):
        c = card(path, language, "4x6")
        assert len(c.pages) > 1
        for page in c.pages:
            lines = [op.text for op in page.ops if type(op) is Text and op.role == CAUTION]
            printed = " ".join(" ".join(lines).replace("\u00ad", "").split())
            # the caution wraps at spaces, or breaks a long word with a hyphen printed at the break
            assert caution in printed or caution in re.sub(r"(\w)- (\w)", r"\1\2", printed), (path.name, page)


@pytest.mark.parametrize("language", TRANSLATED)
def test_the_figures_are_the_english_cards_in_every_language(language):
    """Same identities (compare's keys), same figures, and each figure drawn as the English card draws it but for
    the decimal separator."""
    for path in AIRCRAFT:
        english, other = card(path, "en"), card(path, language)
        assert {k: f.text for k, f in other.figures().items()} == {k: f.text for k, f in english.figures().items()}
        sep = i18n.DECIMAL[language]

        def drawn(c):
            return {op.figures[0].identity: op.text for op in texts(c) if op.role == FIGURE and len(op.figures) == 1}

        assert {k: v.replace(sep, ".") for k, v in drawn(other).items()} == drawn(english), path.name


@pytest.mark.parametrize("language", ["de", "cs"])
def test_decimals_are_written_with_the_languages_comma(language):
    path = SAMPLES / "demo_trainer.toml"
    figures = [op.text for op in texts(card(path, language)) if op.role == FIGURE]
    english = [op.text for op in texts(card(path, "en")) if op.role == FIGURE]
    assert "1.41" in english or "1.42" in english  # the load factor at 45° (1 / cos 45° = 1.414, rounded up)
    assert any(re.fullmatch(r"1,4\d", t) for t in figures), figures
    assert not any(re.search(r"\d\.\d", t) for t in figures)
    report = report_text(prepared(path, language), "text", MADE_ON)
    assert re.search(r"\b1,4\d\b", report) and not re.search(r"\b1\.4\d\b", report)
    csv = report_text(prepared(path, language), "csv", MADE_ON)
    assert re.search(r'"1,4\d"', csv)  # quoted: the CSV's delimiter is a comma
    assert "2026-12-01" in report  # dates stay ISO 8601 in every language


@pytest.mark.parametrize("language", LANGUAGES)
def test_every_aircraft_lays_out_at_every_size_in_every_language(language):
    for path in AIRCRAFT:
        p = prepared(path, language)
        for size in SIZES:
            c = make_card(prepare_file(path, Styles(None, Overrides(language=language, size=size))), MADE_ON)
            assert c.layout.faces >= 1 and c.table.language == language == p.table.language


def test_a_long_word_breaks_only_at_a_soft_hyphen_with_a_hyphen_printed():
    shy = fonts.SOFT_HYPHEN
    text = f"Quer{shy}neigung an Mindest{shy}reserve"
    narrow = fonts.width("Mindest-", fonts.REGULAR, 7) + 0.5
    lines = fonts.wrap(text, fonts.REGULAR, 7, narrow, hyphenate=False)
    assert lines == ["Quer-", "neigung", "an", "Mindest-", "reserve"]  # "neigung an" is wider than "Mindest-"
    assert all(fonts.width(line, fonts.REGULAR, 7) <= narrow for line in lines)
    # wide enough: no break, and the soft hyphens never print
    (line,) = fonts.wrap(text, fonts.REGULAR, 7, 500, hyphenate=False)
    assert fonts.printable(line) == "Querneigung an Mindestreserve"


# --- choosing the language --------------------------------------------------------------------------------------


def test_the_language_changes_no_fingerprint(tmp_path):
    path = SAMPLES / "demo_trainer.toml"
    english = prepared(path, "en").fingerprint
    assert all(prepared(path, code).fingerprint == english for code in TRANSLATED)
    own = tmp_path / "trn.toml"
    own.write_text(path.read_text(encoding="utf-8").replace("[card]", '[card]\nlanguage = "pl"'), encoding="utf-8")
    p = prepare_file(own, Styles())
    assert p.table.language == "pl" and p.fingerprint == english


def test_a_style_and_a_profile_choose_the_language_and_a_wrong_one_is_named(tmp_path):
    style = tmp_path / "fleet.style.toml"
    style.write_text('style = 1\nlanguage = "cs"\n', encoding="utf-8")
    profile = tmp_path / "trn.toml"
    profile.write_text((SAMPLES / "demo_trainer.toml").read_text(encoding="utf-8"), encoding="utf-8")
    assert prepare_file(profile, Styles()).table.language == "cs"  # the folder's style
    assert prepare_file(profile, Styles(overrides=Overrides(language="fr"))).table.language == "fr"  # --language
    style.write_text('style = 1\nlanguage = "klingon"\n', encoding="utf-8")
    p = prepare_file(profile, Styles())
    assert p.table is None and any(x.path == "language" and "en | de" in x.expected for x in p.style_problems)
    style.unlink()
    profile.write_text(profile.read_text(encoding="utf-8").replace("[card]", '[card]\nlanguage = "xx"'),
                       encoding="utf-8")
    p = prepare_file(profile, Styles())
    assert p.table is None and [x.path for x in p.errors] == ["card.language"]


def test_the_command_line_prints_the_table_in_the_language_and_json_stays_english(capsys):
    path = str(SAMPLES / "demo_trainer.toml")
    assert main(["table", path, "--language", "de"]) == 0
    out = capsys.readouterr().out
    assert "Überziehgeschwindigkeit" in out and "\u00ad" not in out and translator("de")(CAUTION_CARD) not in out
    assert out.rstrip().endswith(translator("de")(CAUTION_LINE)) and "stall speed" not in out
    assert main(["table", path, "--language", "de", "--format", "json"]) == 0
    captured = capsys.readouterr()
    assert '"stall_speed"' in captured.out and "CAUTION:" in captured.err  # the machine interface: English


def test_a_card_printed_in_german_compares_current_with_its_profile_in_any_language(capsys, tmp_path):
    profile = tmp_path / "trn.toml"
    profile.write_text((SAMPLES / "demo_trainer.toml").read_text(encoding="utf-8"), encoding="utf-8")
    pdf = tmp_path / "trn.pdf"
    assert main(["card", str(profile), "-o", str(pdf), "--language", "de"]) == 0
    capsys.readouterr()
    assert main(["compare", str(pdf), str(profile)]) == 0  # the English card of today reads the same figures
    assert "current" in capsys.readouterr().out
    profile.write_text(profile.read_text(encoding="utf-8").replace('total = "1560 lb"', 'total = "1640 lb"'),
                       encoding="utf-8")
    assert main(["compare", str(pdf), str(profile), "--language", "fr"]) == 1
    out = capsys.readouterr().out
    # the verdicts, labels and figures in French, as a French card prints them; the configuration's name as the
    # profile writes it
    assert "! moins de marge : Flaps up · 0° · vitesse de décrochage: 47 kt -> 48 kt" in out
    assert "Flaps up · 1,5 g · vitesse de décrochage: 58 kt -> 59 kt" in out


def test_a_warning_is_printed_in_the_cards_language_with_its_figures():
    path = ROOT / "tests" / "aircraft" / "overweight_utility.toml"
    lines = [op.text for op in texts(card(path, "de")) if op.role == CAUTION]
    assert "WARNUNG" in lines and any("über der Höchstmasse von 1100 kg" in line for line in lines), lines
    assert not any("WARNING" in line or "maximum weight" in line for line in lines)


# --- the mechanism ------------------------------------------------------------------------------------------------


def test_a_message_keeps_its_values_through_copies_and_is_told_in_any_language():
    m = Msg("Temperature {temperature} °C is outside -70 to +60 °C: check the temperature of the turn figures",
            temperature=Num("-75.5"))
    assert m == "Temperature -75.5 °C is outside -70 to +60 °C: check the temperature of the turn figures"
    for again in (pickle.loads(pickle.dumps(m)), copy.deepcopy(m)):
        assert again == m and translator("de")(again).startswith("Temperatur -75,5 °C liegt außerhalb")
    label = terms.label("Flaps 1.5", Msg("{load} g", load=Num("1.5")), terms.STALL)
    assert label == "Flaps 1.5 · 1.5 g · stall speed"  # the identity compare matches on, in every language
    assert translator("fr").label(label) == "Flaps 1.5 · 1,5 g · vitesse de décrochage"  # a name never changes
    assert pickle.loads(pickle.dumps(label)).parts == label.parts


def test_an_unknown_language_is_refused_by_name():
    with pytest.raises(ValueError, match="'xx'.*en, de, fr, es, cs, pl"):
        translator("xx")


# --- the glossaries ------------------------------------------------------------------------------------------------

SOURCES = ("regulation", "public page", "common practice", "from memory", "our own word")


def _stem(word: str) -> str:
    """A word's stem, so an inflected form matches (Czech and Polish decline: "klapky", "klapkami")."""
    return word if len(word) <= 3 else word[:max(4, len(word) - 2)]


@pytest.mark.parametrize("language", TRANSLATED)
def test_each_glossary_word_has_its_source_and_is_the_word_its_catalogue_prints(language):
    text = (ROOT / "docs" / "glossary" / f"{language}.md").read_text(encoding="utf-8")
    rows = [[cell.strip() for cell in line.strip("|").split("|")] for line in text.splitlines()
            if line.startswith("| ") and not line.startswith("| trade term")]
    terms_found = {row[0] for row in rows}
    assert {"bank angle", "load factor", "stall speed", "pattern, traffic circuit", "base leg", "final", "margin",
            "buffer", "flaps", "air brakes", "VA", "VFE", "IAS / CAS / TAS", "density altitude", "best glide",
            "minimum sink", "ballast"} <= terms_found
    messages = {m.id: m.string for m in catalogues.read(language) if m.id and isinstance(m.id, str)}
    for term, word, message, source in rows:
        assert any(kind in source for kind in SOURCES), (term, source)
        if message == "—":
            continue
        msgid = message.strip("`")
        if msgid.endswith("…"):
            (msgid,) = [m for m in messages if m.startswith(msgid[:-1])]
        printed = messages[msgid].replace(fonts.SOFT_HYPHEN, "").lower()
        alternatives = [w.strip() for w in re.split(r"[,/]", word)]
        assert any(all(_stem(w.lower()) in printed for w in alt.split()) for alt in alternatives), (term, word,
                                                                                                     printed)


def test_a_translated_head_widens_its_column_in_the_text_table_and_keeps_the_figures_under_it():
    """Polish "przechylenie" is longer than the bank column's five characters: the column widens, and the load
    factors still end under the "n" of their head."""
    text = report_text(prepared(ROOT / "tests" / "aircraft" / "ballast_glider.toml", "pl"), "text", MADE_ON)
    lines = text.splitlines()
    head = next(i for i, line in enumerate(lines) if line.lstrip().startswith("przechylenie ") and " n " in line)
    end = lines[head].index(" n ") + 1  # the column of the head's "n"
    rows = lines[head + 2:head + 11]
    assert len(rows) == 9 and all(re.fullmatch(r"\s*\d+ +\d,\d\d", row[:end + 1]) for row in rows), rows
