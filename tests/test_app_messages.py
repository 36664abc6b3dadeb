"""The app's own problems and refusals are made as messages (`i18n.Msg`) and told in the app's language where they
are shown: their English reads as it always did, and a German app frames them in German ("Fehler") and writes a
figure with a decimal comma."""

import json
import re
from types import SimpleNamespace

import pytest
from PySide6.QtCore import Qt

from kneeboard.app import words
from kneeboard.app.document import ProfileDocument, SaveConflict
from kneeboard.app.fleet import MARK_COLUMN, PROBLEMS_ROLE, FleetModel
from kneeboard.app.recovery import Recovery
from kneeboard.fileio import FileProblem
from kneeboard.i18n import USER, Msg, Num
from kneeboard.problems import WARNING, Problem

FORMAT_SPEC = re.compile(r"\{[^{}]*[:!][^{}]*\}")  #: "{v:.1f}", "{x!r}": an f-string's leftovers in a template


def made_as_message(exc: Exception) -> Msg:
    """The refusal's message, checked to be a Msg whose template is one a catalogue can hold."""
    message = exc.args[0]
    assert isinstance(message, Msg), type(message)
    assert not FORMAT_SPEC.search(message.template), message.template
    return message


def test_the_documents_refusals_are_messages_that_read_as_before(qtbot, tmp_path, minimal_text):
    with pytest.raises(FileProblem) as nowhere:
        ProfileDocument(minimal_text).save()
    assert made_as_message(nowhere.value) == str(nowhere.value) == \
        "the profile has no file yet; choose where to save it"

    path = tmp_path / "trainer.toml"
    path.write_text(minimal_text, encoding="utf-8")
    doc = ProfileDocument.open(path)
    path.write_text(minimal_text + "\n# theirs\n", encoding="utf-8")  # someone else's change
    with pytest.raises(SaveConflict) as conflict:
        doc.save()
    assert made_as_message(conflict.value).params["path"] == str(path)  # the file's name: never translated
    assert str(conflict.value) == f"{path}: was changed on disk since it was opened; saving would overwrite that change"


def test_the_recoverys_refusals_are_messages_that_read_as_before(tmp_path):
    blocked = tmp_path / "blocked"
    blocked.write_text("a file where the folder belongs", encoding="utf-8")
    with pytest.raises(FileProblem) as made:
        Recovery(blocked / "recovery").save("key", None, "text")
    message = made_as_message(made.value)
    assert str(made.value).startswith(f"{blocked / 'recovery'}: cannot be made (") and message.params["reason"]

    folder = tmp_path / "records"
    folder.mkdir()
    (folder / "odd.json").write_text(json.dumps({"text": 12, "owner": None}), encoding="utf-8")
    recovery = Recovery(folder)
    assert recovery.pending() == []
    assert recovery.unreadable == [f"{folder / 'odd.json'}: unsaved edits that cannot be read back (its text is not "
                                   "text); the file is kept for you to open"]


def test_a_german_app_frames_a_problem_in_german_with_the_figures_comma(qapp, fleet):
    problem = Problem("card.buffer", Msg("{buffer} kt is less than the least buffer", buffer=Num("2.5")),
                      Msg("a speed of at least {least} kt", least=Num("3.5")), "2.5 kt", WARNING)
    english = "warning: card.buffer: 2.5 kt is less than the least buffer (found '2.5 kt'); expected a speed of at " \
              "least 3.5 kt"
    assert str(problem) == english
    model = FleetModel()
    model.list_folder(fleet)
    path = fleet / "demo_trainer.toml"
    error = Problem("aircraft.max_weight", Msg("{weight} kg is above any aircraft", weight=Num("600000.5")))
    model.set_checked(path, SimpleNamespace(errors=[error], warnings=[], fingerprint=""))  # as a check finds it
    row = model.row_of(path)
    words.use("de")
    assert USER.translator.language == "de"
    told = str(problem)
    assert told.startswith("Warnung: card.buffer: 2,5 kt") and "3,5 kt" in told and "'2.5 kt'" in told  # as written
    assert words.told(problem.message) == "2,5 kt is less than the least buffer"  # no catalogue has it yet
    tip = model.index(row, MARK_COLUMN).data(Qt.ItemDataRole.ToolTipRole)
    assert tip == "aircraft.max_weight: 600000,5 kg is above any aircraft"  # the fleet's tooltip, in German
    assert model.index(row, MARK_COLUMN).data(PROBLEMS_ROLE) == ["aircraft.max_weight: 600000.5 kg is above any "
                                                              "aircraft"]  # the role keeps the English
    words.use("en")
    assert str(problem) == english and model.index(row, MARK_COLUMN).data(Qt.ItemDataRole.ToolTipRole) == \
        "aircraft.max_weight: 600000.5 kg is above any aircraft"


def test_bytes_that_are_no_pdf_are_refused_with_a_message(qapp):
    from kneeboard.app.preview import PdfProblem, open_pdf

    with pytest.raises(PdfProblem) as refused:
        open_pdf(b"not a PDF at all")
    made_as_message(refused.value)
    assert isinstance(refused.value, ValueError)  # what the preview and the printing catch
    assert str(refused.value).startswith("the PDF could not be read (")
