"""Shared helpers for the card tests: build cards of the samples once per test session."""

from functools import cache
from pathlib import Path

from conftest import SAMPLES

from kneeboard.card import build_card, card_pdf
from kneeboard.card.style import CardStyle, load_style
from kneeboard.profile_io import load_profile

MADE_ON = "2026-12-01"


@cache
def default_style() -> CardStyle:
    style, problems = load_style()
    assert style is not None, problems
    return style


@cache
def loaded(name: str):
    return load_profile(SAMPLES / f"{name}.toml")


@cache
def card(name: str, size: str = "a5", landscape: bool = False, binding: str = "none"):
    lp = loaded(name)
    style = default_style().with_changes(size=size, landscape=landscape, binding=binding)
    return build_card(lp.profile, style, lp.fingerprint, made_on=MADE_ON)


@cache
def pdf(name: str, size: str = "a5", landscape: bool = False) -> bytes:
    return card_pdf(card(name, size, landscape))


SAMPLE_NAMES = tuple(p.stem for p in sorted(Path(SAMPLES).glob("*.toml")))
