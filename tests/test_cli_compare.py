"""kneeboard compare: a printed card against what its profile prints now; a fleet's printed cards against the fleet."""

import io
import json
import shutil

from conftest import SAMPLES
from pypdf import PdfReader

from kneeboard.card.data import read_card_data
from kneeboard.cli import main


def run(capsys, *args):
    code = main([str(a) for a in args])
    out, err = capsys.readouterr()
    return code, out, err


def test_a_card_pdf_carries_its_printed_figures_and_fingerprint(capsys, tmp_path):
    out = tmp_path / "trn.pdf"
    assert run(capsys, "card", SAMPLES / "demo_trainer.toml", "-o", out)[0] == 0
    reader = PdfReader(io.BytesIO(out.read_bytes()))
    (name,) = reader.attachments  # an embedded file a PDF reader lists
    data = json.loads(reader.attachments[name][0])
    assert data["registration"] == "DEMO-TRN" and data["card_weight"] == "1560 lb"
    assert {"key": "Flaps up · 30° · margin", "label": "Flaps up · 30° · margin", "text": "15 kt",
            "worse": "lower"} in data["figures"]
    assert data["fingerprint"] in reader.metadata["/Keywords"]
    assert read_card_data(out.read_bytes()) == [data]  # read back without a PDF library


def test_a_fresh_card_is_current_and_a_weight_change_is_listed(capsys, tmp_path):
    profile = tmp_path / "trn.toml"
    shutil.copy(SAMPLES / "demo_trainer.toml", profile)
    card = tmp_path / "trn.pdf"
    run(capsys, "card", profile, "-o", card)
    code, out, _ = run(capsys, "compare", card, profile)
    assert code == 0 and "current" in out
    profile.write_text(profile.read_text().replace('total = "1560 lb"', 'total = "1640 lb"'))
    code, out, _ = run(capsys, "compare", card, profile)
    assert code == 1 and "OUT OF DATE" in out
    assert "  card weight: 1560 lb -> 1640 lb" in out.splitlines()
    assert "  ! less room: Flaps up · 0° · stall speed: 47 kt -> 48 kt" in out.splitlines()


def test_bad_input_is_exit_2(capsys, tmp_path):
    not_a_card = tmp_path / "other.pdf"
    not_a_card.write_bytes(b"%PDF-1.4\n% nothing of ours\n")
    assert run(capsys, "compare", not_a_card, SAMPLES / "demo_trainer.toml")[0] == 2
    broken = tmp_path / "broken.toml"
    broken.write_text('schema = 1\n[aircraft]\nregistration = "X"\n')
    card = tmp_path / "trn.pdf"
    run(capsys, "card", SAMPLES / "demo_trainer.toml", "-o", card)
    code, _, err = run(capsys, "compare", card, broken)
    assert code == 2 and "error" in err


def test_a_fleet_check_names_every_printed_card_that_no_longer_matches(capsys, tmp_path):
    fleet = tmp_path / "fleet"
    shutil.copytree(SAMPLES, fleet, ignore=shutil.ignore_patterns("__init__.py"))
    printed = tmp_path / "printed"
    assert run(capsys, "card", fleet, "--each", printed)[0] == 0
    (fleet / "demo_tourer.toml").write_text((fleet / "demo_tourer.toml").read_text().replace('"5 kt"', '"8 kt"'))
    code, out, _ = run(capsys, "compare", printed, fleet)
    assert code == 1
    lines = [line for line in out.splitlines() if line.startswith(str(printed))]
    assert len(lines) == 5
    assert [line.split(" (")[0].rsplit("/", 1)[1] for line in lines if "OUT OF DATE" in line] == ["DEMO-TOUR.pdf"]


def test_card_data_is_compressed_and_cards_with_data_in_clear_are_still_read(tmp_path):
    from card_helpers import card_of

    from kneeboard.card import card_pdf
    from kneeboard.card.data import MARKER, card_data, card_json

    card = card_of("demo_trainer")
    pdf = card_pdf(card)
    assert MARKER not in pdf  # the figures are compressed in the file ...
    assert read_card_data(pdf) == [card_data(card)]  # ... and read back with zlib alone
    # a card made before the data was compressed carries it in clear: still a card
    older = pdf + b"\n9 0 obj\n<< /Type /EmbeddedFile >>\nstream\n" + card_json(card) + b"\nendstream\nendobj\n"
    assert read_card_data(older) == [card_data(card), card_data(card)]
    # damaged compressed data is no card, never an exception
    broken = pdf.replace(b"/KNBD_CardData /Card /Length", b"/KNBD_CardData /Card /Lxngth")
    assert read_card_data(broken[: broken.find(b"KNBD_CardData") + 60]) == []
