"""Nothing a person made is lost: a style file that cannot be read, saves a few milliseconds apart, a restore over a
file another program changed, a recovery folder that cannot be written."""

import pytest


@pytest.mark.parametrize("broken", ['front = ["header"\n', "= 1\n", "[a]\n[a]\n"])
def test_an_unreadable_style_file_is_said_and_the_entries_are_kept(qtbot, window, fleet, broken):
    # saving into a style file that is not valid TOML raised an uncaught error: nothing saved, nothing shown
    target = fleet / "fleet.style.toml"
    target.write_text("# the club's style, half edited\n" + broken, encoding="utf-8")
    shown = []

    def answer(dialog):
        shown.append(dialog.values())
        if len(shown) == 1:
            dialog.organization.setText("Aeroklub Říčany (invented)")
            dialog.accent.setText("#224466")
        return len(shown) == 1  # saved the first time; cancelled when it comes back

    window.ask_style = answer
    window.act_edit_style.trigger()
    assert len(shown) == 2  # the dialog came back after the message
    assert shown[1]["organization"] == "Aeroklub Říčany (invented)" and shown[1]["accent"] == "#224466"
    title, text = window.problems_seen[-1]
    assert title == "The style was not saved" and "fleet.style.toml" in text and "not valid TOML" in text
    assert target.read_text(encoding="utf-8") == "# the club's style, half edited\n" + broken  # untouched
    assert window.isVisible()
