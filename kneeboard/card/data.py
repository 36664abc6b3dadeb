"""A card that knows what it printed: its printed figures, as machine-readable data inside its own PDF.

Every card PDF embeds one JSON file per card (ISO 32000-1 embedded files) holding the registration, the
fingerprint, the date, the card weight (and, for a card made for a weight given on the command line or in an
export, that weight as given: `weight_given`) and every figure the laid-out card prints (the blocks' `ops.Figure`
tags), and carries the fingerprint in the document's keywords. `kneeboard compare CARD.pdf PROFILE` reads it back and
compares it with what the profile prints now. The data is compressed in a stream marked as a card's, so it is read
back with zlib and no PDF library: a PDF that does not hold it (a card re-saved by another program, or any other
PDF) is not a card.
"""

import json
import zlib

from kneeboard.card.ops import Figure

DATA_VERSION = 1
MARKER = b'{"kneeboard_card": '  #: how every card's data begins (cards made before it was compressed: in clear)
#: The key that marks a card's compressed data stream in the PDF (a second-class name, ISO 32000-1 annex E)
COMPRESSED_MARK = "KNBD_CardData"
_COMPRESSED = f"/{COMPRESSED_MARK} /Card".encode()
MAX_DATA = 4 * 1024 * 1024  #: [bytes] the most one card's data may expand to (a few kilobytes in practice)


def card_data(card) -> dict:
    """The printed figures of `card` as plain data."""
    return {
        "kneeboard_card": DATA_VERSION,
        "registration": card.registration,
        "model": card.table.model,
        "fingerprint": card.fingerprint,
        "made_on": card.made_on,
        "card_weight": f"{card.table.weight.text} {card.table.weight_unit}",
        "figures": [{"key": f.identity, "label": f.label, "text": f.text, "worse": f.worse,
                     **({"past_limit": True} if f.past_limit else {})}
                    for f in card.figures().values()],
        **({"weight_given": card.weight_given} if card.weight_given else {}),
    }


def card_json(card) -> bytes:
    # ASCII: escapes keep every byte of the data printable, so nothing in it can look like PDF syntax
    return json.dumps(card_data(card), ensure_ascii=True, separators=(",", ":")).replace(
        '{"kneeboard_card":', '{"kneeboard_card": ', 1).encode("ascii")


def read_card_data(pdf: bytes) -> list[dict]:
    """Every card's data found in the bytes of a PDF, in the order they are stored (may be empty).

    Each card's data is a compressed stream marked `COMPRESSED_MARK` (read with zlib alone); cards made before the
    data was compressed hold it in clear, and are read too.
    """
    return [data for data in (_parse(chunk) for chunk in _compressed(pdf) + _clear(pdf)) if data is not None]


def _compressed(pdf: bytes) -> list[str]:
    found, start = [], 0
    while (at := pdf.find(_COMPRESSED, start)) >= 0:
        start = at + len(_COMPRESSED)
        begin = pdf.find(b"stream", start)
        if begin < 0:
            break
        begin += len(b"stream")
        begin += 2 if pdf[begin:begin + 2] == b"\r\n" else 1  # the end of line after the keyword
        try:
            inflate = zlib.decompressobj()
            text = inflate.decompress(pdf[begin:begin + MAX_DATA], MAX_DATA)  # a bomb stops at MAX_DATA
        except zlib.error:
            continue
        found.append(text.decode("ascii", errors="replace"))
    return found


def _clear(pdf: bytes) -> list[str]:
    found, start = [], 0
    while (at := pdf.find(MARKER, start)) >= 0:
        end = pdf.find(b"endstream", at)
        found.append(pdf[at:end if end > 0 else len(pdf)].decode("ascii", errors="replace"))
        start = at + len(MARKER)
    return found


def _parse(chunk: str) -> dict | None:
    try:
        data, _ = json.JSONDecoder().raw_decode(chunk.lstrip())
    except ValueError:
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
