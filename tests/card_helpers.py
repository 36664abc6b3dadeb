"""Shared helpers for the card tests: cards of the samples through the one pipeline, built once per session."""

from functools import cache
from pathlib import Path

from conftest import SAMPLES

from kneeboard.card import card_pdf
from kneeboard.card.style import CardStyle
from kneeboard.inputs.profiles import read_source, source_from_text
from kneeboard.inputs.styles import load_style
from kneeboard.pipeline import Overrides, make_card, prepare

MADE_ON = "2026-12-01"
#: The blocks a 4x6 card holds for the powered samples (every block would not fit: the layout says so by name).
SMALL_CARD = ("header", "margin-table", "limits", "turns", "margin-chart", "notes")


@cache
def default_style() -> CardStyle:
    style, problems = load_style()
    assert style is not None, problems
    return style


@cache
def loaded(name: str):
    """A sample (by file stem) through the pipeline with the shipped style, prepared once per session."""
    return prepared(name)


def prepared(name: str, style: CardStyle | None = None, **overrides):
    """A sample (by file stem) through the pipeline with `style` (default: the shipped one) and overrides."""
    p = prepare(read_source(SAMPLES / f"{name}.toml"), style or default_style(), Overrides(**overrides))
    assert p.table is not None, p.problems
    return p


def card_of(name: str, style: CardStyle | None = None, **overrides):
    """The card of a sample; raises LayoutError when it cannot be laid out."""
    return make_card(prepared(name, style, **overrides), MADE_ON)


def card_from_text(text: str, style: CardStyle | None = None, **overrides):
    p = prepare(source_from_text(text), style or default_style(), Overrides(**overrides))
    assert p.table is not None, p.problems
    return make_card(p, MADE_ON)


@cache
def card(name: str, size: str = "a5", landscape: bool = False, binding: str = "none", front=None):
    return card_of(name, default_style().with_changes(size=size, landscape=landscape, binding=binding, front=front))


@cache
def pdf(name: str, size: str = "a5", landscape: bool = False) -> bytes:
    return card_pdf(card(name, size, landscape))


SAMPLE_NAMES = tuple(p.stem for p in sorted(Path(SAMPLES).glob("*.toml")))
