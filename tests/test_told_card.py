"""The card's refusals and problems told in the user's language: a refused logo, a card that does not fit, a sheet
too small, an organization too wide. Each is made as a `Msg` whose English text is the line it always was; told in
another language, the whole line is (the layout's reason for a block that does not fit included) and its decimals
take the language's comma. The catalogues may not hold these messages yet: a small catalogue of the test's own
stands in where a translation is needed to tell the line apart from English."""

import ast
import gettext
import re
from dataclasses import replace
from pathlib import Path

import pytest
from card_helpers import MADE_ON, card_of, default_style, loaded

from kneeboard.card.layout import LayoutError, layout_card
from kneeboard.card.logocheck import LogoProblem, check_logo
from kneeboard.card.organization import organization_problems
from kneeboard.card.sheets import SheetError, grid_for
from kneeboard.card.svgcheck import SvgProblem, check_svg
from kneeboard.i18n import USER, Msg, Num, Translator

CARD = Path(__file__).resolve().parent.parent / "kneeboard" / "card"
#: a value filled in with a format spec or a conversion ("{w:.0f}", "{x!r}"): a template carries neither
FORMATTED = re.compile(r"\{[^{}]*[:!][^{}]*\}")


class _Catalogue(gettext.NullTranslations):
    """A German catalogue of the test's own: the few lines it translates, every other as it is."""

    WORDS = {
        "The {block} block cannot be printed on a {card} card even at the smallest legible type ({reason}). "
        "Choose a larger card size, or a shorter text.":
            "Der Block {block} passt selbst in der kleinsten lesbaren Schrift nicht auf eine {card}-Karte "
            "({reason}). Wählen Sie eine größere Karte oder einen kürzeren Text.",
        "the registration is wider than the card": "das Kennzeichen ist breiter als die Karte",
        "{size} landscape": "{size} quer",
    }

    def gettext(self, message):
        return self.WORDS.get(message, message)


def _clean(message: Msg) -> None:
    """A message made to be told later: a Msg, its template without a format spec, its values Msgs, words,
    figures or plain text, none of them a figure formatted inside the sentence."""
    assert isinstance(message, Msg), repr(message)
    assert not FORMATTED.search(message.template), message.template
    for value in message.params.values():
        assert isinstance(value, str), (message.template, value)
        if isinstance(value, Msg):
            _clean(value)


def _too_wide_registration() -> LayoutError:
    table = replace(loaded("demo_tourer").table, registration="W" * 60)
    with pytest.raises(LayoutError) as err:
        layout_card(table, default_style().with_changes(size="4x6", landscape=True), "fp", MADE_ON)
    return err.value


def test_a_block_that_does_not_fit_is_told_in_one_language_reason_included():
    error = _too_wide_registration()
    message = error.args[0]
    _clean(message)
    assert isinstance(message.params["reason"], Msg) and isinstance(message.params["card"], Msg)
    english = ("The header block cannot be printed on a 4x6 landscape card even at the smallest legible type (the "
               "registration is wider than the card). Choose a larger card size, or a shorter text.")
    assert str(error) == english and message == english
    USER.translator = Translator("de", _Catalogue())
    told = str(error)
    assert told == ("Der Block header passt selbst in der kleinsten lesbaren Schrift nicht auf eine 4x6 quer-Karte "
                    "(das Kennzeichen ist breiter als die Karte). Wählen Sie eine größere Karte oder einen kürzeren "
                    "Text.")
    assert message == english  # the refusal itself is unchanged: told again in English whenever asked
    USER.use("en")
    assert str(error) == english


def test_the_faces_cap_is_one_sentence_with_the_blocks_left_out_as_the_style_names_them():
    many = tuple(float(b) for b in range(0, 72, 3))
    with pytest.raises(LayoutError) as err:
        card_of("demo_tourer", default_style().with_changes(size="4x6", max_faces=2), bank_angles=many)
    message = err.value.args[0]
    _clean(message)
    assert message.params["left_out"] == ", ".join(err.value.left_out)
    assert str(err.value).startswith("This card needs ") and str(err.value).endswith(
        "Choose one: allow " + message.params["faces"] + " faces (max_faces); a larger card size; fewer bank "
        "angles; fewer blocks in the style.")


def test_an_organization_too_wide_is_a_problem_told_with_the_languages_frame_words():
    name = " ".join(["Mmmm"] * 24)
    style = default_style().with_changes(organization=name, size="4x6", landscape=True, binding="left")
    (problem,) = organization_problems(style)
    _clean(problem.message)
    _clean(problem.expected)
    room = problem.message.params["room"]
    assert re.fullmatch(r"\d+", room)
    english = str(problem)
    assert english.startswith(f"error: organization: does not fit in two lines of {room} pt beside the registration "
                              "on a 4x6 landscape (bound left) card, even at the smallest type (found 'Mmmm Mmmm ")
    assert english.endswith("; expected a shorter name, or a larger card")
    USER.use("de")
    told = str(problem)
    assert told.startswith("Fehler: organization: ") and "'Mmmm Mmmm " in told  # the field and the value as written
    assert told != english


def test_a_sheet_too_small_writes_the_cards_inches_with_the_languages_comma():
    with pytest.raises(SheetError) as err:
        grid_for(8.3 * 72, 11.7 * 72, "a4")
    message = err.value.args[0]
    _clean(message)
    assert isinstance(message.params["width"], Num)
    assert str(err.value) == "a 8.3 x 11.7 in card does not fit on a a4 sheet with room to cut it"
    USER.use("de")
    assert "8,3" in str(err.value) and "11,7" in str(err.value) and "a4" in str(err.value)


def test_a_refused_logo_keeps_the_svgs_message_and_its_decimal():
    svg = b'<svg xmlns="http://www.w3.org/2000/svg" width="2100.5" height="10"></svg>'
    with pytest.raises(LogoProblem) as err:
        check_logo(svg, "svg")
    message = err.value.args[0]
    _clean(message)
    assert str(err.value) == "is 2100.5 x 10 units: a logo's sides differ at most 20 times"
    USER.use("de")
    assert str(err.value).startswith("ist 2100,5 x 10 ")  # the size as the SVG wrote it, with the German comma
    assert "Logo" in str(err.value) and "sides" not in str(err.value)


@pytest.mark.parametrize("data, kind, english", [
    (b"", "png", "is not a PNG image (the file is empty)"),
    (b"<svg/>", "png", "is not a PNG image (it is text, perhaps an SVG named .png: rename it to .svg)"),
    (b"\x89PNG\r\n\x1a\n" + b"\0" * 40, "svg", "is a PNG image named .svg; rename it to .png"),
])
def test_a_logo_refusal_is_a_msg_whose_english_is_unchanged(data, kind, english):
    with pytest.raises(LogoProblem) as err:
        check_logo(data, kind)
    _clean(err.value.args[0])
    assert str(err.value) == english


def test_an_svg_refusal_names_where_it_found_the_reference_as_a_part_of_its_sentence():
    with pytest.raises(SvgProblem) as err:
        check_svg(b'<svg xmlns="http://www.w3.org/2000/svg"><style>@import "x.css";</style></svg>')
    message = err.value.args[0]
    _clean(message)
    assert isinstance(message.params["where"], Msg)
    assert str(err.value) == "its <style> element imports another style sheet; a logo may not"
    with pytest.raises(SvgProblem) as err:
        check_svg(b'<svg xmlns="http://www.w3.org/2000/svg">' + b"<g>" * 60 + b"</g>" * 60 + b"</svg>")
    _clean(err.value.args[0])
    assert str(err.value) == "nests elements more than 50 deep"


#: the refusals a person reads, and which of a call's arguments is the message
_REFUSALS = {"SvgProblem": 0, "LogoProblem": 0, "FontProblem": 0, "CardDataProblem": 0, "SheetError": 0,
             "LayoutError": 1, "DoesNotFit": 1, "Problem": 1}


def test_no_refusal_of_the_card_is_made_of_english_text_alone():
    """Every refusal, problem and reason for not fitting raised in kneeboard/card is given something other than a
    string literal, an f-string or a joined string: a Msg (or what makes one), told in the user's language."""
    found = 0
    for path in sorted(CARD.rglob("*.py")):
        for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
            if not (isinstance(node, ast.Call) and isinstance(node.func, ast.Name) and node.func.id in _REFUSALS):
                continue
            at = _REFUSALS[node.func.id]
            if len(node.args) <= at:
                continue
            found += 1
            argument = node.args[at]
            plain = isinstance(argument, (ast.JoinedStr, ast.BinOp)) or (
                isinstance(argument, ast.Constant) and isinstance(argument.value, str))
            assert not plain, f"{path.name}:{node.lineno}: {node.func.id} is given English text, not a Msg"
    assert found > 50  # the walk does see the card's refusals
