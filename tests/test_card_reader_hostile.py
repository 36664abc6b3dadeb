"""The card reader (`kneeboard compare`, Card › Compare with the printed card) bounds its work per file.

Hostile PDFs are built here byte by byte: marks of card data repeated before one stream, streams that each inflate
to the per-stream limit, thousands of candidate streams, data nested far deeper than a card's, a FIFO among a
folder's cards. Each must end in exit 2 naming the file (or a verdict per file), in bounded memory, never a traceback.
"""

import io
import os
import shutil
import tracemalloc
import zlib

import pytest
from conftest import SAMPLES
from hostile_checks import hang_guard
from pypdf import PdfReader, PdfWriter

from kneeboard.card.data import (
    COMPRESSED_MARK,
    MARKER,
    MAX_CANDIDATES,
    MAX_DATA,
    MAX_NESTING,
    MAX_TOTAL,
    CardDataProblem,
    read_card_data,
)
from kneeboard.cli import main

MARK = f"/{COMPRESSED_MARK} /Card ".encode()


def run(capsys, *args):
    code = main([str(a) for a in args])
    out, err = capsys.readouterr()
    return code, out, err


@pytest.fixture
def card(tmp_path, capsys):
    """A genuine card of the demo trainer, made by the command line, and its profile."""
    out = tmp_path / "trn.pdf"
    assert run(capsys, "card", SAMPLES / "demo_trainer.toml", "-o", out)[0] == 0
    return out


def stream(payload: bytes, marks: int = 1) -> bytes:
    return MARK * marks + b"<< /Type /EmbeddedFile /Filter /FlateDecode >>\nstream\n" + zlib.compress(payload) \
        + b"\nendstream\n"


def pdf_of(*parts: bytes) -> bytes:
    return b"%PDF-1.4\n" + b"".join(parts) + b"%%EOF\n"


def genuine_json(card) -> bytes:
    (data,) = read_card_data(card.read_bytes())
    import json

    return MARKER + json.dumps(data, ensure_ascii=True, separators=(",", ":"))[len('{"kneeboard_card":'):].encode()


def test_many_marks_before_one_stream_inflate_it_once(card):
    # 18 KB of marks before one stream that inflates to the per-stream limit: each mark inflated it again and every
    # copy was kept (300 copies: 1.25 GB)
    payload = genuine_json(card)
    pdf = pdf_of(stream(payload + b" " * (MAX_DATA - len(payload)), marks=300))
    tracemalloc.start()
    try:
        found = read_card_data(pdf)
        peak = tracemalloc.get_traced_memory()[1]
    finally:
        tracemalloc.stop()
    assert [d["registration"] for d in found] == ["DEMO-TRN"]
    assert peak < 4 * MAX_DATA, f"{peak / 2**20:.0f} MiB for one card's data"


def test_total_inflated_bytes_are_capped_per_file(tmp_path, capsys, card):
    payload = genuine_json(card)
    big = payload + b" " * (MAX_DATA - len(payload))
    hostile = tmp_path / "bomb.pdf"
    hostile.write_bytes(pdf_of(*[stream(big) for _ in range(MAX_TOTAL // MAX_DATA + 2)]))
    with pytest.raises(CardDataProblem, match="MiB of card data"):
        read_card_data(hostile.read_bytes())
    code, _out, err = run(capsys, "compare", hostile, SAMPLES / "demo_trainer.toml")
    assert code == 2 and str(hostile) in err and "refused" in err and "Traceback" not in err


def test_candidate_streams_are_capped_per_file(tmp_path, capsys):
    hostile = tmp_path / "many.pdf"
    hostile.write_bytes(pdf_of(*[stream(b"x") for _ in range(MAX_CANDIDATES + 1)]))
    with pytest.raises(CardDataProblem, match="streams"):
        read_card_data(hostile.read_bytes())
    code, _out, err = run(capsys, "compare", hostile, SAMPLES / "demo_trainer.toml")
    assert code == 2 and str(hostile) in err


@pytest.mark.parametrize("compressed", [True, False])
def test_card_data_nested_200000_deep_is_exit_2_naming_the_file(tmp_path, capsys, compressed):
    # it was "internal error" (exit 70): the JSON reader recursed
    deep = MARKER + b"[" * 200_000 + b"]" * 200_000 + b"}"
    hostile = tmp_path / "deep.pdf"
    hostile.write_bytes(pdf_of(stream(deep) if compressed else b"stream\n" + deep + b"\nendstream\n"))
    with hang_guard():
        code, _out, err = run(capsys, "compare", hostile, SAMPLES / "demo_trainer.toml")
    assert code == 2 and str(hostile) in err and f"more than {MAX_NESTING} levels" in err
    assert "internal error" not in err


def test_a_card_nested_as_deep_as_allowed_is_still_read_as_data(card):
    # the limit refuses attacks, not cards: a genuine card's data is read whatever sits around it
    pdf = card.read_bytes()
    assert [d["registration"] for d in read_card_data(pdf + pdf_of(stream(b"[" * 10 + b"]" * 10)))] == ["DEMO-TRN"]


def test_a_folder_gives_each_file_its_own_verdict(tmp_path, capsys, card):
    folder = tmp_path / "cards"
    folder.mkdir()
    shutil.copy(card, folder / "a_trn.pdf")
    os.mkfifo(folder / "b_stuck.pdf")  # a FIFO among the cards stopped the whole folder
    (folder / "c_deep.pdf").write_bytes(pdf_of(stream(MARKER + b"[" * 5000 + b"]" * 5000 + b"}")))
    shutil.copy(card, folder / "d_trn_again.pdf")
    with hang_guard():
        code, out, err = run(capsys, "compare", folder, SAMPLES)
    assert code == 2  # an unusable input, and said
    assert "b_stuck.pdf" in err and "FIFO" in err and "skipped" in err
    assert "c_deep.pdf" in err and "levels deep" in err
    assert out.count("current: every printed figure reads the same") == 2  # both genuine cards compared
    assert "a_trn.pdf" in out and "d_trn_again.pdf" in out


def test_a_card_resaved_by_another_program_still_reads(tmp_path, card):
    # another PDF program writes the file anew; one that drops the mark still keeps the embedded file
    writer = PdfWriter(clone_from=PdfReader(card))
    buffer = io.BytesIO()
    writer.write(buffer)
    resaved = buffer.getvalue()
    assert resaved != card.read_bytes()
    assert [d["registration"] for d in read_card_data(resaved)] == ["DEMO-TRN"]
    unmarked = resaved.replace(f"/{COMPRESSED_MARK} /Card".encode(), b" " * len(MARK.rstrip()))
    unmarked = unmarked.replace(f"/{COMPRESSED_MARK}/Card".encode(), b" " * (len(MARK) - 2))
    assert COMPRESSED_MARK.encode() not in unmarked
    assert [d["registration"] for d in read_card_data(unmarked)] == ["DEMO-TRN"]
