"""The app makes every card at every size: the fleet of samples and invented test aircraft exported through the File
menu with the folder's style set to each card size and orientation, and to both ends of the type-size range."""

import shutil
from pathlib import Path

import pytest
from conftest import SAMPLES
from pypdf import PdfReader

from kneeboard.card.data import read_card_data
from kneeboard.card.geometry import CARD_SIZES

AIRCRAFT = Path(__file__).parent.parent / "aircraft"


@pytest.fixture
def mixed_fleet(tmp_path):
    folder = tmp_path / "mixed"
    shutil.copytree(SAMPLES, folder)
    for path in AIRCRAFT.glob("*.toml"):
        shutil.copy(path, folder / path.name)
    return folder


def test_the_fleet_export_makes_every_card_at_every_size(qtbot, window, mixed_fleet, tmp_path):
    window.open_folder(mixed_fleet)
    registrations = sorted(r[1] for r in window.fleet.rows())
    assert len(registrations) == len(list(mixed_fleet.glob("*.toml")))
    combos = [(size, orientation, scale) for size in CARD_SIZES for orientation in ("portrait", "landscape")
              for scale in ((0.7, 1.6) if size in ("a5", "4x6") else (1.0,))]
    for size, orientation, scale in combos:
        (mixed_fleet / "fleet.style.toml").write_text(
            f'size = "{size}"\norientation = "{orientation}"\nfont_scale = {scale}\n', encoding="utf-8")
        window.session.reload_styles()
        out = tmp_path / f"{size}-{orientation}-{scale}.pdf"
        window.ask_save_path = lambda *_, out=out: out
        window.act_export_fleet.trigger()
        assert not window.problems_seen, (size, orientation, window.problems_seen)
        found = read_card_data(out.read_bytes())
        assert sorted(d["registration"] for d in found) == registrations, (size, orientation, scale)
        pages = PdfReader(str(out)).pages
        assert len(pages) >= len(registrations)
        w, h = CARD_SIZES[size]
        if orientation == "landscape":
            w, h = h, w
        assert {(round(float(p.mediabox.width)), round(float(p.mediabox.height))) for p in pages} == {
            (round(w), round(h))}
