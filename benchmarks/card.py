"""One card in-process, profile file to finished PDF bytes, beside reportlab alone drawing the same marks."""

import time
from pathlib import Path

from benchmarks import ink
from benchmarks.stats import figure, interleaved, ratios_of, summary

LARGEST = Path(__file__).resolve().parents[1] / "sample_aircraft" / "demo_tourer.toml"
MADE_ON = "2026-12-01"
FLOOR_IS = "reportlab alone drawing the card's strings, lines, rectangles and paths (same fonts, same pages)"


def font_files() -> dict[str, str]:
    """The card's font names and the installed files behind them (the floor registers its own copies)."""
    from kneeboard.card import fonts

    return {name: str(fonts.source_file(name)) for name in (fonts.REGULAR, fonts.BOLD)}


def card_ink(path: Path = LARGEST) -> list[dict]:
    """The marks of the card of `path`, as the floor draws them."""
    from kneeboard.pipeline import Styles, make_card, prepare_file

    return ink.ink_of(make_card(prepare_file(path, Styles()), made_on=MADE_ON).pages)


def floor_sampler(path: Path = LARGEST):
    """A callable that draws the floor of `path`'s card once and returns its time [ms]."""
    pages = card_ink(path)
    ink.register(font_files())
    ink.pdf(pages)  # the first drawing parses the fonts: a cost of start-up, not of a page

    def sample() -> float:
        t = time.perf_counter()
        ink.pdf(pages)
        return (time.perf_counter() - t) * 1000

    return sample


def run(smoke: bool = False, env: dict | None = None, work=None) -> dict:
    from kneeboard.pipeline import Styles, card_pdf, make_card, prepare_file

    repeats = 3 if smoke else 80
    styles = Styles()

    def ours() -> float:
        t = time.perf_counter()
        card_pdf(make_card(prepare_file(LARGEST, styles), made_on=MADE_ON))
        return (time.perf_counter() - t) * 1000

    prepared = prepare_file(LARGEST, styles)

    def layout() -> float:
        t = time.perf_counter()
        make_card(prepared, made_on=MADE_ON)
        return (time.perf_counter() - t) * 1000

    ours()  # the first card registers fonts and fills caches: start-up, not the steady cost
    floor = floor_sampler()
    a, b = interleaved(ours, floor, repeats)
    la, lb = interleaved(layout, floor, repeats)
    return {"one card": figure(summary(a, "ms"), summary(b, "ms"), ratios_of(a, b), FLOOR_IS, {"ratio p50": 1.7},
                               smoke, what="demo_tourer.toml to PDF bytes through kneeboard.pipeline, in-process"),
            "layout of one card": figure(summary(la, "ms"), summary(lb, "ms"), ratios_of(la, lb), FLOOR_IS,
                                         {"ratio p50": 0.3}, smoke,
                                         what="the layout alone (make_card of the prepared tourer): measuring, "
                                              "choosing the type size, drawing each piece once")}
