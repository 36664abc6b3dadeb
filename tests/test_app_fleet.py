"""The fleet list as a Qt item model, read through its named roles without a view. The aircraft are invented samples."""

import shutil

import pytest
from conftest import checked_file
from PySide6.QtCore import Qt

from kneeboard.app.fleet import (
    CHECKED_ROLE,
    DUPLICATE,
    ERROR,
    FINGERPRINT_ROLE,
    MARK_COLUMN,
    MARK_ROLE,
    MODEL_COLUMN,
    MODEL_ROLE,
    PATH_ROLE,
    PROBLEMS_ROLE,
    REGISTRATION_COLUMN,
    REGISTRATION_ROLE,
    UNREADABLE,
    WARNING,
    FleetModel,
)


@pytest.fixture
def model(qapp):
    made = FleetModel()
    yield made
    made.deleteLater()


def rows(model: FleetModel, role) -> dict[str, object]:
    """file name -> the value of `role`, per row."""
    return {model.index(i, 0).data(PATH_ROLE).name: model.index(i, 0).data(role) for i in range(model.rowCount())}


def test_a_folder_is_listed_by_registration_with_each_role(model, fleet):
    model.list_folder(fleet)
    assert model.rowCount() == 5 and model.columnCount() == 3
    registrations = [model.index(i, 0).data(REGISTRATION_ROLE) for i in range(5)]
    assert registrations == sorted(registrations) and "DEMO-TRN" in registrations
    i = registrations.index("DEMO-TRN")
    assert model.index(i, REGISTRATION_COLUMN).data() == "DEMO-TRN"
    assert model.index(i, MODEL_COLUMN).data() == model.index(i, 0).data(MODEL_ROLE)
    assert "invented" in model.index(i, 0).data(MODEL_ROLE)
    assert model.index(i, 0).data(PATH_ROLE) == fleet / "demo_trainer.toml"
    assert model.paths()[i] == fleet / "demo_trainer.toml" and model.row_of(fleet / "demo_trainer.toml") == i
    # nothing checked yet: no mark, no problems, no fingerprint
    assert set(rows(model, MARK_ROLE).values()) == {""} and set(rows(model, CHECKED_ROLE).values()) == {False}
    assert all(p == [] for p in rows(model, PROBLEMS_ROLE).values())
    assert model.headerData(REGISTRATION_COLUMN, Qt.Orientation.Horizontal) == "Registration"


def test_a_shared_registration_is_marked_on_both_at_once_and_after_a_check(model, fleet):
    shutil.copy(fleet / "demo_trainer.toml", fleet / "demo_trainer copy.toml")
    model.list_folder(fleet)
    marks = rows(model, MARK_ROLE)
    assert marks["demo_trainer.toml"] == marks["demo_trainer copy.toml"] == DUPLICATE  # before any check
    assert marks["demo_tourer.toml"] == ""
    tips = {name: model.index(model.row_of(fleet / name), MARK_COLUMN).data(Qt.ItemDataRole.ToolTipRole)
            for name in ("demo_trainer.toml", "demo_trainer copy.toml")}
    assert "demo_trainer copy.toml" in tips["demo_trainer.toml"] and "DEMO-TRN" in tips["demo_trainer.toml"]
    assert str(fleet / "demo_trainer.toml") in tips["demo_trainer copy.toml"]
    for name in ("demo_trainer.toml", "demo_trainer copy.toml"):
        model.set_checked(fleet / name, checked_file(fleet / name))
    assert rows(model, MARK_ROLE)["demo_trainer copy.toml"] == DUPLICATE  # a clean check keeps the mark
    model.forget_checks()  # the style changed: checked again, and the mark stays meanwhile
    assert rows(model, MARK_ROLE)["demo_trainer copy.toml"] == DUPLICATE


def test_a_check_gives_the_mark_the_reasons_and_the_fingerprint(model, fleet):
    (fleet / "zz_broken.toml").write_text("[aircraft\n", encoding="utf-8")
    text = (fleet / "demo_trainer.toml").read_text(encoding="utf-8")
    (fleet / "zz_values.toml").write_text(text.replace('"48 kt"', '"48 kg"').replace("DEMO-TRN", "DEMO-VAL"),
                                          encoding="utf-8")
    (fleet / "zz_slow.toml").write_text(text.replace("pattern_factor = 1.4", "pattern_factor = 1.2", 1)
                                        .replace("DEMO-TRN", "DEMO-SLOW"), encoding="utf-8")
    model.list_folder(fleet)
    assert rows(model, MODEL_ROLE)["zz_broken.toml"] == UNREADABLE
    assert rows(model, REGISTRATION_ROLE)["zz_broken.toml"] == "zz_broken"  # named by its file
    changed = []
    model.dataChanged.connect(lambda first, last: changed.append((first.row(), last.row())))
    for path in model.paths():
        model.set_checked(path, checked_file(path))
    assert len(changed) == model.rowCount()
    marks, problems = rows(model, MARK_ROLE), rows(model, PROBLEMS_ROLE)
    assert marks["zz_broken.toml"] == marks["zz_values.toml"] == ERROR
    assert any("configuration[1].stall_speed" in line for line in problems["zz_values.toml"])
    assert marks["zz_slow.toml"] == WARNING and problems["zz_slow.toml"]
    assert marks["demo_trainer.toml"] == "" and problems["demo_trainer.toml"] == []
    fingerprint = rows(model, FINGERPRINT_ROLE)["demo_trainer.toml"]
    assert len(fingerprint) == 8 and fingerprint == checked_file(fleet / "demo_trainer.toml").fingerprint
    tip = model.index(model.row_of(fleet / "demo_trainer.toml"), REGISTRATION_COLUMN).data(Qt.ItemDataRole.ToolTipRole)
    assert tip.count("fingerprint") == 1 and fingerprint in tip
    assert set(rows(model, CHECKED_ROLE).values()) == {True}


def test_each_file_is_read_once_for_the_list_and_its_check(model, fleet, monkeypatch):
    from kneeboard.app import fleet as fleet_module

    read = []
    real = fleet_module.read_source
    monkeypatch.setattr(fleet_module, "read_source", lambda path: read.append(path) or real(path))
    model.list_folder(fleet)
    sources = [model.source(path) for path in model.paths()]
    assert len(read) == 5 and all(s.data is not None for s in sources)  # the check takes these, not the files
