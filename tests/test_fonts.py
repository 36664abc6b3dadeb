"""The card fonts: every European letter prints and can be read back, subsets are embedded, what the fonts
cannot draw is found and marked, the built fonts are cached safely, and file names keep every letter."""

import io
import os
import re
import stat
import unicodedata

import pypdfium2 as pdfium
import pytest
from card_helpers import card_from_text, default_style
from fontTools.ttLib import TTFont as FontFile
from hostile_checks import hang_guard
from pypdf import PdfReader

from kneeboard.card import card_pdf, fonts
from kneeboard.card.geometry import LARGE_CARDS
from kneeboard.card.ops import FIGURE, Text
from kneeboard.export import export_cards, safe_name
from kneeboard.pipeline import Styles
from kneeboard.shipped import samples_folder

SAMPLES = samples_folder()

# Invented clubs and aircraft, one per script or language with letters beyond Latin-1.
LANGUAGES = {
    "polish": ("Aeroklub Łódź", "SP-ŁĄK żółć gęś"),
    "turkish": ("Türk Hava Kurumu", "ğ ı ş İ Ğ Ş ç ö ü"),
    "czech": ("Aeroklub Říčany", "ř č ě ů ž Ů Ž Ě"),
    "cyrillic": ("Аэроклуб", "Закрылки выпущены: держать скорость"),
    "greek": ("Αερολέσχη", "Πτερύγια κάτω: ταχύτητα ΑΒΓΔ"),
}

PROFILE = """\
schema = 1

[aircraft]
registration = "{registration}"
model = "{model}"
max_weight = "750 kg"

[[configuration]]
name = "{configuration}"
stall_speed = "50 kt"

[card]
notes = "{notes}"
"""


def make_card(model, notes, registration="OK-ŘÍZ", configuration="Flaps up", size="a5"):
    text = PROFILE.format(registration=registration, model=model, notes=notes, configuration=configuration)
    return card_from_text(text, default_style().with_changes(size=size))


def extracted(data: bytes) -> str:
    """The PDF's text as a reader gets it, whitespace collapsed."""
    text = " ".join(page.extract_text() for page in PdfReader(io.BytesIO(data)).pages)
    return " ".join(unicodedata.normalize("NFC", text).split())


def card_text(card) -> str:
    return " ".join(op.text for page in card.pages for op in page.ops if isinstance(op, Text))


@pytest.mark.parametrize("language", list(LANGUAGES))
def test_every_letter_prints_and_reads_back(language):
    model, notes = LANGUAGES[language]
    card = make_card(model, notes, configuration=notes.split()[0].rstrip(":"))
    text = extracted(card_pdf(card))
    assert "OK-ŘÍZ" in text
    assert model in text
    assert notes in text
    assert fonts.substitute() not in text  # nothing was replaced


def test_one_card_with_every_language():
    notes = " / ".join(f"{model}: {rest}" for model, rest in LANGUAGES.values())
    card = make_card("Aeroklub Říčany · Аэроклуб · Αερολέσχη", notes)
    text = extracted(card_pdf(card))
    for model, rest in LANGUAGES.values():
        assert model in text and rest in text
    letters = {ch for ch in notes if ch.isalpha()}
    assert letters <= set(text)


def _fonts_of(data: bytes):
    for page in PdfReader(io.BytesIO(data)).pages:
        for font in page["/Resources"]["/Font"].values():
            yield font.get_object()


def test_embedded_fonts_are_subsets():
    data = card_pdf(make_card(*LANGUAGES["czech"]))
    full = min(fonts.source_file(name).stat().st_size for name in (fonts.REGULAR, fonts.BOLD))
    seen = set()
    for font in _fonts_of(data):
        base = str(font["/BaseFont"])
        # PDF 32000-1, 9.6.4: a subset's name starts with six capital letters and a plus sign
        assert re.fullmatch(r"/[A-Z]{6}\+FiraSans-(Regular|Bold)", base), base
        stream = font["/FontDescriptor"].get_object()["/FontFile2"].get_object()
        assert len(stream.get_data()) < full / 5  # a few dozen glyphs of the font's 1700
        seen.add(base.split("+")[1])
    assert seen == {"FiraSans-Regular", "FiraSans-Bold"}
    assert len(data) < 120_000


def test_missing_finds_what_the_fonts_cannot_draw():
    assert fonts.missing("日本") == ["日", "本"]
    assert fonts.missing("本日本 x 日") == ["本", "日"]  # distinct, in order of first appearance
    assert fonts.missing("Říčany") == []
    assert fonts.missing(unicodedata.normalize("NFD", "Říčany")) == []  # a letter typed as letter + accent
    assert fonts.missing("a\nb\r\nc\td\u00a0e\u3000f\u2028") == []  # whitespace and line breaks never count
    assert fonts.missing("climb ✈️ now") == ["✈"]  # the emoji counts once, its variation selector not at all


def test_european_alphabets_are_covered():
    latin_a = "".join(map(chr, range(0x100, 0x180)))  # Unicode block Latin Extended-A, all assigned
    latin_b = "".join(chr(c) for c in range(0x180, 0x250) if unicodedata.category(chr(c)) != "Cn")
    greek = "".join(chr(c) for c in range(0x386, 0x3D0) if unicodedata.category(chr(c)) != "Cn")
    cyrillic = "".join(map(chr, range(0x400, 0x460)))  # the modern letters of every Cyrillic alphabet
    for text in (latin_a, latin_b, greek, cyrillic, "°±×÷–—‘’“”„…€≤≥−"):
        assert fonts.missing(text) == [], text
    # printable() passes ASCII through unchecked: every printable ASCII character must be in both fonts
    assert fonts.missing("".join(map(chr, range(0x21, 0x7F)))) == []


def test_printable_marks_each_replaced_character():
    mark = fonts.substitute()
    assert mark in ("\u25a1", "\u25af", "\ufffd", "?")
    assert fonts.missing(mark) == []
    assert fonts.printable("Club 日本 ✈️ 1") == f"Club {mark}{mark} {mark} 1"
    assert fonts.printable(unicodedata.normalize("NFD", "Říčany")) == "Říčany"
    assert fonts.printable("OK-ŘÍZ") == "OK-ŘÍZ"


def test_measurement_and_drawing_agree_on_replaced_characters():
    mark = fonts.substitute()
    assert fonts.width("日本", fonts.REGULAR, 10) == fonts.width(mark * 2, fonts.REGULAR, 10)
    assert fonts.width("日本", fonts.REGULAR, 10) > 0


def test_a_card_with_a_cjk_note_builds_and_shows_the_mark():
    card = make_card("Aeroklub Říčany", "Hangar 2 日本語 key in the office")
    assert "日本語" in card_text(card)  # the layout keeps the text as written ...
    text = extracted(card_pdf(card))
    mark = fonts.substitute()
    assert f"Hangar 2 {mark * 3} key in the office" in text  # ... and the page marks each replaced character
    assert "日" not in text


def test_widths_come_from_the_embedded_font_files():
    # advance widths summed from the font file the PDF embeds, read by another library (fontTools)
    for name in (fonts.REGULAR, fonts.BOLD):
        font = FontFile(io.BytesIO(fonts.font_bytes(name)))
        cmap, hmtx, upem = font.getBestCmap(), font["hmtx"], font["head"].unitsPerEm
        for text in ("OK-ŘÍZ", "Аэроклуб", "Αερολέσχη", "0123456789"):
            expected = sum(hmtx[cmap[ord(ch)]][0] for ch in text) * 12 / upem
            assert fonts.width(text, name, 12) == pytest.approx(expected, abs=1e-6), (name, text)


def test_zero_is_the_slashed_zero_of_the_family():
    for name in (fonts.REGULAR, fonts.BOLD):
        built = FontFile(io.BytesIO(fonts.font_bytes(name)))
        shipped = FontFile(fonts.source_file(name))
        assert shipped.getBestCmap()[ord("0")] == "zero"
        assert built.getBestCmap()[ord("0")] == "zero.zero"  # the glyph Fira's own `zero` feature selects
        assert {k: v for k, v in built.getBestCmap().items() if k != ord("0")} == \
            {k: v for k, v in shipped.getBestCmap().items() if k != ord("0")}


def _ink_at_centre(text: str) -> bool:
    """Whether the middle of `text`, drawn alone at 200 pt, is inked (a slashed zero is; O is hollow)."""
    from kneeboard.card.ops import Page, Part
    from kneeboard.card.render import pdf_bytes

    op = Text(20, 40, text, fonts.REGULAR, 200, "#000000", "left", "label")
    data = pdf_bytes([Page(240, 260, (Part(0, 0, (op,)),), ("test",))])
    image = pdfium.PdfDocument(data)[0].render(scale=1).to_pil().convert("L")
    w = fonts.width(text, fonts.REGULAR, 200)
    x, y = round(20 + w / 2), round(260 - 40 - fonts.ascent(200) / 2)
    return image.getpixel((x, y)) < 128


def test_zero_and_capital_o_differ_in_print():
    assert _ink_at_centre("0")
    assert not _ink_at_centre("O")


def test_legibility_floors_hold_with_every_script():
    notes = " ".join(" ".join(pair) for pair in LANGUAGES.values())
    for size in ("a5", "half-letter", "5x8", "4x6"):
        card = make_card("Aeroklub Říčany · Аэроклуб · Αερολέσχη", notes, configuration="Закрылки", size=size)
        floor = 10.0 if size in LARGE_CARDS else 8.0
        for page in card.pages:
            for op in page.ops:
                if isinstance(op, Text):
                    assert op.size >= 7.0 - 1e-9, op
                    if op.role == FIGURE:
                        assert op.size >= floor - 1e-9, op


# --- the cache of built fonts ---


@pytest.fixture
def cache_home(tmp_path, monkeypatch):
    monkeypatch.setenv("XDG_CACHE_HOME", str(tmp_path / "cache"))
    return tmp_path / "cache"


def test_fonts_are_built_once_into_the_versioned_cache(cache_home, monkeypatch):
    path = fonts.cached_file(fonts.REGULAR)
    assert path.parent == cache_home / "kneeboard" / f"fonts-fira-sans-{fonts.font_version()}-r{fonts.RECIPE}"
    font, _ = fonts._load(fonts.REGULAR)
    assert path.read_bytes() == fonts.font_bytes(fonts.REGULAR)
    assert font.face.charToGlyph[ord("Ř")]
    assert [p.name for p in path.parent.iterdir()] == [path.name]  # no temporary left behind

    def no_build(source):
        raise AssertionError("built again although the cache holds the font")

    monkeypatch.setattr(fonts, "_build", no_build)
    assert fonts._load(fonts.REGULAR)[0].face.charToGlyph == font.face.charToGlyph


def test_a_damaged_cache_file_is_rebuilt(cache_home):
    path = fonts.cached_file(fonts.BOLD)
    path.parent.mkdir(parents=True)
    good = fonts.font_bytes(fonts.BOLD)
    path.write_bytes(good[: len(good) // 2])
    assert fonts._load(fonts.BOLD)[0].face.charToGlyph[ord("Ж")]
    assert path.read_bytes() == good


def test_an_unwritable_cache_falls_back_to_memory(tmp_path, monkeypatch):
    blocker = tmp_path / "not-a-folder"
    blocker.write_text("a file where the cache folder would be")
    monkeypatch.setenv("XDG_CACHE_HOME", str(blocker))
    font, data = fonts._load(fonts.REGULAR)
    assert font.face.charToGlyph[ord("Ł")] and data == fonts.font_bytes(fonts.REGULAR)
    assert blocker.read_text() == "a file where the cache folder would be"


def test_a_relative_xdg_cache_home_is_ignored(tmp_path, monkeypatch):
    monkeypatch.setenv("XDG_CACHE_HOME", "relative/cache")
    monkeypatch.setenv("HOME", str(tmp_path))
    assert fonts.cache_folder() == tmp_path / ".cache" / "kneeboard"
    monkeypatch.delenv("XDG_CACHE_HOME")
    assert fonts.cache_folder() == tmp_path / ".cache" / "kneeboard"


def test_building_never_writes_into_the_installed_package(cache_home):
    package = fonts.source_file(fonts.REGULAR).parent.parent
    before = sorted((p.relative_to(package), p.stat().st_mtime_ns) for p in package.rglob("*"))
    fonts._load(fonts.REGULAR)
    after = sorted((p.relative_to(package), p.stat().st_mtime_ns) for p in package.rglob("*"))
    assert after == before


def test_the_build_is_the_same_every_time():
    source = fonts.source_file(fonts.REGULAR)
    assert fonts._build(source) == fonts._build(source)


def test_the_font_licence_travels_with_the_package():
    text = fonts.licence_file().read_text(encoding="utf-8")
    assert "SIL OPEN FONT LICENSE Version 1.1" in text
    assert "Mozilla Foundation" in text


# --- file names ---


@pytest.mark.parametrize("registration, name", [
    ("OK-ŘÍZ", "OK-ŘÍZ"),
    (unicodedata.normalize("NFD", "OK-ŘÍZ"), "OK-ŘÍZ"),  # typed with combining accents: one form on disk
    ("SP-ŁĄK", "SP-ŁĄK"),
    ("TC-ĞIŞ", "TC-ĞIŞ"),
    ("RA-Аэро1", "RA-Аэро1"),
    ("SX-ΑΒΓ", "SX-ΑΒΓ"),
    ("D_1234", "D_1234"),
    ("../etc/passwd", "etc_passwd"),
    ("a\\b/c", "a_b_c"),
    ('x<y>z:"w"|q?*', "x_y_z_w_q"),
    ("tab\there\x00nul\x1f", "tab_here_nul"),
    ("DEMO 01", "DEMO_01"),
    ("..", "card"),
    ("---", "card"),
    ("CON", "CON_"),
    ("com1", "com1_"),
])
def test_safe_name_keeps_letters_and_drops_what_file_systems_forbid(registration, name):
    assert safe_name(registration) == name


def _profiles(folder, registrations):
    folder.mkdir()
    text = (SAMPLES / "demo_trainer.toml").read_text(encoding="utf-8")
    paths = []
    for k, registration in enumerate(registrations):
        path = folder / f"aircraft{k}.toml"
        path.write_text(text.replace('registration = "DEMO-TRN"', f'registration = "{registration}"'), "utf-8")
        paths.append(path)
    return paths


def test_each_registration_gets_its_own_file_and_one_registration_in_two_forms_is_refused(tmp_path):
    paths = _profiles(tmp_path / "fleet", ("OK-ŘÍZ", "OK/ŘÍZA"))
    done = export_cards(paths, Styles(), each=tmp_path / "cards")
    assert sorted(p.name for p in done.written) == ["OK-ŘÍZ.pdf", "OK_ŘÍZA.pdf"]
    assert all(p.read_bytes().startswith(b"%PDF") for p in done.written)
    # the same registration in lower case, or with its accents decomposed, is the same aircraft: never a second,
    # numbered file beside the first, and neither card is written under the name both would take
    decomposed = unicodedata.normalize("NFD", "OK-ŘÍZ")
    for k, twin in enumerate(("ok-říz", decomposed)):
        pair = _profiles(tmp_path / f"twins{k}", ("OK-ŘÍZ", twin))
        done = export_cards(pair, Styles(), each=tmp_path / f"out{k}")
        assert len(done.clashes) == 2 and all("is also the registration of" in p.message for p in done.clashes)
        assert not list((tmp_path / f"out{k}").glob("*.pdf"))


@pytest.mark.parametrize("kind", ["fifo", "link to a fifo", "dangling link"])
def test_a_special_file_in_the_cache_is_replaced_never_waited_on(cache_home, tmp_path, kind):
    # a FIFO where a cached font belongs hung every card: the cache was read with a plain blocking read
    path = fonts.cached_file(fonts.REGULAR)
    path.parent.mkdir(parents=True)
    if kind == "fifo":
        os.mkfifo(path)
    elif kind == "link to a fifo":
        os.mkfifo(tmp_path / "elsewhere")
        path.symlink_to(tmp_path / "elsewhere")
    else:
        path.symlink_to(tmp_path / "nothing here")
    with hang_guard():
        font, data = fonts._load(fonts.REGULAR)
    assert font.face.charToGlyph[ord("Ř")] and data == fonts.font_bytes(fonts.REGULAR)
    assert not path.is_symlink() and path.is_file() and path.read_bytes() == data  # rebuilt as a regular file
    assert stat.S_ISFIFO(os.stat(tmp_path / "elsewhere").st_mode) if kind == "link to a fifo" else True


def test_an_oversized_cache_file_is_not_read(cache_home):
    path = fonts.cached_file(fonts.BOLD)
    path.parent.mkdir(parents=True)
    with open(path, "wb") as f:
        f.truncate(fonts.CACHED_FONT_LIMIT + 1)  # sparse: no disk is filled
    font, data = fonts._load(fonts.BOLD)
    assert font.face.charToGlyph[ord("Ж")] and path.read_bytes() == data == fonts.font_bytes(fonts.BOLD)
