"""A card that knows what it printed: its printed figures, as machine-readable data inside its own PDF.

Every card PDF embeds one JSON file per card (ISO 32000-1 embedded files) holding the registration, the
fingerprint, the date, the card weight (and, for a card made for a weight given on the command line or in an
export, that weight as given: `weight_given`) and every figure the laid-out card prints (the blocks' `ops.Figure`
tags), and carries the fingerprint in the document's keywords. `kneeboard compare CARD.pdf PROFILE` reads it back and
compares it with what the profile prints now. The data is compressed in a stream marked as a card's, so it is read
back with zlib and no PDF library, with its work bounded per file (see `read_card_data`): a PDF library would parse
the whole of a hostile file to find it. An embedded file whose mark another program dropped is still found; a PDF
that holds no card data is not a card.
"""

import json
import re
import zlib

from kneeboard.card.ops import Figure
from kneeboard.i18n import Msg
from kneeboard.problems import Told

DATA_VERSION = 1
MARKER = b'{"kneeboard_card": '  #: how every card's data begins (cards made before it was compressed: in clear)
#: The key that marks a card's compressed data stream in the PDF (a second-class name, ISO 32000-1 annex E)
COMPRESSED_MARK = "KNBD_CardData"
_COMPRESSED = f"/{COMPRESSED_MARK} /Card".encode()
MAX_DATA = 4 * 1024 * 1024  #: [bytes] the most one card's data may expand to (a few kilobytes in practice)


def card_data(card) -> dict:
    """The printed figures of `card` as plain data.

    Each figure's `key` is its identity (its English label: the same on a card in any language, so compare matches
    a German card with an English one), its `label` as the card's language says it, and its `text` the figure
    itself as it is in every language ("1.41 g"; the card prints "1,41" in German).
    """
    from kneeboard.i18n import translator

    tr = translator(card.table.language)
    return {
        "kneeboard_card": DATA_VERSION,
        "registration": card.registration,
        "model": card.table.model,
        "fingerprint": card.fingerprint,
        "made_on": card.made_on,
        "card_weight": f"{card.table.weight.text} {card.table.weight_unit}",
        "language": card.table.language,
        "figures": [{"key": f.identity, "label": tr.label(f.label), "text": f.text, "worse": f.worse,
                     **({"past_limit": True} if f.past_limit else {})}
                    for f in card.figures().values()],
        **({"weight_given": card.weight_given} if card.weight_given else {}),
    }


def card_json(card) -> bytes:
    # ASCII: escapes keep every byte of the data printable, so nothing in it can look like PDF syntax
    return json.dumps(card_data(card), ensure_ascii=True, separators=(",", ":")).replace(
        '{"kneeboard_card":', '{"kneeboard_card": ', 1).encode("ascii")


class CardDataProblem(Told, ValueError):
    """A PDF whose card data cannot be read within the reader's bounds; the message says why (not which file)."""


MAX_TOTAL = 32 * 1024 * 1024  #: [bytes] all card data of one PDF, inflated (largest sample card 22 KB: 1,500 cards)
MAX_CANDIDATES = 5000  #: streams tried in one PDF: a card's one, a fleet's one per card
MAX_NESTING = 32  #: JSON levels in one card's data (it has four)
#: a stream's dictionary either carries our mark, or is an embedded file (a card re-saved by another program may
#: have dropped the mark but keeps the file); `/EmbeddedFiles` (the name tree) is not a stream
_CANDIDATE = re.compile(rb"/" + COMPRESSED_MARK.encode() + rb"\s*/Card|/EmbeddedFile(?![A-Za-z0-9#_.-])")
_STRING = re.compile(r'"(?:[^"\\]|\\.)*+"', re.DOTALL)
_NOT_BRACKET = re.compile(r"[^\[\]{}]+")
_PAIR = re.compile(r"\{\}|\[\]")


def read_card_data(pdf: bytes) -> list[dict]:
    """Every card's data found in the bytes of a PDF, in the order they are stored (may be empty).

    Each card's data is a compressed embedded file (read with zlib alone), marked `COMPRESSED_MARK`; an embedded
    file without the mark is tried too. Cards made before the data was compressed hold it in clear, and are read
    too. The work is bounded per file, whatever the file holds: each stream is read once however many marks point
    at it, at most MAX_CANDIDATES streams and MAX_TOTAL decompressed bytes in all, and data nested more than
    MAX_NESTING levels is refused.

    Raises
    ------
    CardDataProblem
        When the PDF holds more than those bounds allow.
    """
    budget = _Budget()
    found = []
    for chunk in _compressed(pdf, budget) + _clear(pdf, budget):
        data = _parse(chunk)
        if data is not None:
            found.append(data)
    return found


class _Budget:
    """What one PDF may still cost: candidate streams and decompressed bytes."""

    def __init__(self):
        self.candidates, self.left = MAX_CANDIDATES, MAX_TOTAL

    def take_candidate(self) -> None:
        self.candidates -= 1
        if self.candidates < 0:
            raise CardDataProblem(Msg("holds more than {most} streams that may be card data; refused",
                                      most=str(MAX_CANDIDATES)))

    def take(self, size: int) -> None:
        self.left -= size
        if self.left < 0:
            raise CardDataProblem(Msg("holds more than {most} MiB of card data; refused",
                                      most=str(MAX_TOTAL // (1024 * 1024))))


def _compressed(pdf: bytes, budget: _Budget) -> list[str]:
    found, position, view = [], 0, memoryview(pdf)
    while (mark := _CANDIDATE.search(pdf, position)) is not None:
        begin = pdf.find(b"stream", mark.end())
        if begin < 0:
            break
        begin += len(b"stream")
        begin += 2 if pdf[begin:begin + 2] == b"\r\n" else 1  # the end of line after the keyword
        # the search goes on after this stream's keyword: many marks before one stream make one candidate, and no
        # byte is searched twice
        position = begin
        budget.take_candidate()
        data = view[begin:begin + MAX_DATA]  # a view: thousands of candidates copy nothing
        try:
            head = zlib.decompressobj().decompress(data, len(MARKER) + 16)
            if not head.lstrip().startswith(MARKER):
                continue  # another embedded file: not inflated further
            text = zlib.decompressobj().decompress(data, min(MAX_DATA, budget.left + 1))
        except zlib.error:
            continue
        budget.take(len(text))
        found.append(text.decode("ascii", errors="replace"))
    return found


def _clear(pdf: bytes, budget: _Budget) -> list[str]:
    found, start = [], 0
    while (at := pdf.find(MARKER, start)) >= 0:
        end = pdf.find(b"endstream", at)
        end = end if end > 0 else len(pdf)
        budget.take_candidate()
        budget.take(end - at)
        found.append(pdf[at:end].decode("ascii", errors="replace"))
        start = max(end, at + len(MARKER))  # a second marker inside the same stream is the same data
    return found


def _nesting_within(text: str, limit: int) -> bool:
    """Whether the JSON text nests at most `limit` levels: strings dropped, then innermost pairs removed level by
    level (linear passes, no recursion)."""
    brackets = _NOT_BRACKET.sub("", _STRING.sub("", text))
    for _level in range(limit):
        if not brackets:
            return True
        brackets, removed = _PAIR.subn("", brackets)
        if not removed:
            return True  # unbalanced: not nesting, and json says what is wrong
    return not brackets


def _parse(chunk: str) -> dict | None:
    if not _nesting_within(chunk, MAX_NESTING):
        raise CardDataProblem(Msg("holds card data nested more than {most} levels deep; refused",
                                  most=str(MAX_NESTING)))
    try:
        data, _ = json.JSONDecoder().raw_decode(chunk.lstrip())
    except (ValueError, RecursionError):
        return None
    if isinstance(data, dict) and data.get("kneeboard_card") == DATA_VERSION and isinstance(data.get("figures"), list):
        return data
    return None


def figures_of(data: dict) -> dict[str, Figure]:
    """A card's stored figures, as `Card.figures()` gives them (identity -> Figure)."""
    out = {}
    for f in data["figures"]:
        if isinstance(f, dict) and all(isinstance(f.get(k), str) for k in ("key", "label", "text")):
            out[f["key"]] = Figure(f["label"], f["text"], f.get("worse"), f["key"] if f["key"] != f["label"] else "",
                                   f.get("past_limit") is True)
    return out
