"""Special files: only regular files are read, and a write never destroys what is not a regular file.

Reads that could hang (a FIFO) run in a thread with a generous bound, so a regression fails the
test instead of hanging the suite; nothing here measures speed.
"""

import os
import socket
import stat
import tempfile
from pathlib import Path

import pytest
from hang_guard import promptly

from kneeboard import fileio
from kneeboard.fileio import FileProblem


def refused(function, *args) -> str:
    """The FileProblem message `function(*args)` ends in (promptly)."""
    outcome = promptly(function, *args)
    assert isinstance(outcome.get("error"), FileProblem), outcome
    return str(outcome["error"])


@pytest.fixture
def fifo(tmp_path):
    path = tmp_path / "pipe.toml"
    os.mkfifo(path)
    return path


@pytest.fixture
def unix_socket():
    # a socket's path must be short (108 bytes): a folder of its own under the system's temporary folder
    folder = Path(tempfile.mkdtemp(prefix="kb"))
    path = folder / "s.toml"
    server = socket.socket(socket.AF_UNIX, socket.SOCK_STREAM)
    server.bind(str(path))
    yield path
    server.close()
    path.unlink()
    folder.rmdir()


# --- reading ----------------------------------------------------------------------------------


def test_a_fifo_is_refused_without_waiting(fifo):
    assert "FIFO" in refused(fileio.read_text, fifo)
    assert "FIFO" in refused(fileio.read_bytes, fifo, 1000)


@pytest.mark.parametrize("device", ["/dev/null", "/dev/zero"])
def test_devices_are_refused(device):
    assert "is a device" in refused(fileio.read_text, Path(device))
    assert "is a device" in refused(fileio.read_bytes, Path(device), 1000)


def test_a_socket_is_refused(unix_socket):
    message = refused(fileio.read_text, unix_socket)
    assert "socket" in message and "not a regular file" in message


def test_a_folder_is_refused(tmp_path):
    assert "folder" in refused(fileio.read_text, tmp_path)


def test_a_symbolic_link_to_a_file_is_read(tmp_path):
    (tmp_path / "real.toml").write_text("schema = 1\n")
    (tmp_path / "link.toml").symlink_to("real.toml")
    assert fileio.read_text(tmp_path / "link.toml") == "schema = 1\n"


def test_a_symbolic_link_to_a_fifo_is_refused(tmp_path, fifo):
    (tmp_path / "link.toml").symlink_to(fifo)
    assert "FIFO" in refused(fileio.read_text, tmp_path / "link.toml")


def test_a_symbolic_link_loop_is_a_clear_problem(tmp_path):
    (tmp_path / "a.toml").symlink_to("b.toml")
    (tmp_path / "b.toml").symlink_to("a.toml")
    assert "loop" in refused(fileio.read_text, tmp_path / "a.toml")
    (tmp_path / "self.toml").symlink_to("self.toml")
    assert "loop" in refused(fileio.read_bytes, tmp_path / "self.toml", 100)


def test_a_dangling_link_is_no_such_file(tmp_path):
    (tmp_path / "gone.toml").symlink_to("nowhere.toml")
    assert "no such file" in refused(fileio.read_text, tmp_path / "gone.toml")


def test_a_nul_in_the_name_is_a_clear_problem(tmp_path):
    message = refused(fileio.read_text, tmp_path / "a\0b.toml")
    assert "NUL" in message and "\0" not in message


def test_read_bytes_keeps_to_its_limit(tmp_path):
    path = tmp_path / "logo.png"
    path.write_bytes(b"x" * 1001)
    assert fileio.read_bytes(path, 1001) == b"x" * 1001
    assert "larger than 1000 bytes" in refused(fileio.read_bytes, path, 1000)


# --- writing -----------------------------------------------------------------------------------


def test_writing_onto_a_link_writes_its_target_and_keeps_the_link(tmp_path):
    shared = tmp_path / "shared"
    shared.mkdir()
    (shared / "club.toml").write_text("old")
    link = tmp_path / "mine.toml"
    link.symlink_to(shared / "club.toml")
    fileio.write_atomic(link, "new")
    assert link.is_symlink() and os.readlink(link) == str(shared / "club.toml")
    assert (shared / "club.toml").read_text() == "new"
    assert sorted(p.name for p in shared.iterdir()) == ["club.toml"]  # no temporary left behind


def test_writing_onto_a_chain_of_relative_links_writes_the_end(tmp_path):
    (tmp_path / "end.pdf").write_bytes(b"old")
    (tmp_path / "middle.pdf").symlink_to("end.pdf")
    (tmp_path / "start.pdf").symlink_to("middle.pdf")
    fileio.write_atomic(tmp_path / "start.pdf", b"new")
    assert (tmp_path / "start.pdf").is_symlink() and (tmp_path / "middle.pdf").is_symlink()
    assert (tmp_path / "end.pdf").read_bytes() == b"new"


def test_writing_onto_a_dangling_link_creates_its_target(tmp_path):
    (tmp_path / "card.pdf").symlink_to("made.pdf")
    fileio.write_atomic(tmp_path / "card.pdf", b"card")
    assert (tmp_path / "card.pdf").is_symlink() and (tmp_path / "made.pdf").read_bytes() == b"card"


def test_writing_onto_a_link_loop_is_refused(tmp_path):
    (tmp_path / "a.pdf").symlink_to("b.pdf")
    (tmp_path / "b.pdf").symlink_to("a.pdf")
    assert "loop" in refused(fileio.write_atomic, tmp_path / "a.pdf", b"x")
    assert (tmp_path / "a.pdf").is_symlink() and (tmp_path / "b.pdf").is_symlink()


def test_writing_onto_a_fifo_is_refused_and_the_fifo_stays(fifo):
    assert "FIFO" in refused(fileio.write_atomic, fifo, b"card")
    assert stat.S_ISFIFO(os.lstat(fifo).st_mode)
    assert sorted(p.name for p in fifo.parent.iterdir()) == [fifo.name]


def test_writing_onto_a_socket_or_folder_is_refused(unix_socket, tmp_path):
    assert "socket" in refused(fileio.write_atomic, unix_socket, b"card")
    assert stat.S_ISSOCK(os.lstat(unix_socket).st_mode)
    folder = tmp_path / "cards.pdf"
    folder.mkdir()
    assert "folder" in refused(fileio.write_atomic, folder, b"card")
    assert folder.is_dir()


@pytest.mark.parametrize("device", ["/dev/null", "/dev/zero"])
def test_writing_onto_a_device_is_refused_before_anything_is_replaced(device, monkeypatch):
    replaced = []
    monkeypatch.setattr(os, "replace", lambda *args: replaced.append(args))  # a regression replaces nothing
    assert "is a device" in refused(fileio.write_atomic, Path(device), b"card")
    assert replaced == []
    assert stat.S_ISCHR(os.stat(device).st_mode)


def test_writing_through_a_link_to_a_device_is_refused(tmp_path, monkeypatch):
    monkeypatch.setattr(os, "replace", lambda *args: pytest.fail("replaced"))
    (tmp_path / "out.pdf").symlink_to("/dev/null")
    assert "is a device" in refused(fileio.write_atomic, tmp_path / "out.pdf", b"card")
    assert (tmp_path / "out.pdf").is_symlink()


def test_a_replaced_file_keeps_its_mode(tmp_path):
    target = tmp_path / "p.toml"
    target.write_text("old")
    target.chmod(0o640)
    fileio.write_atomic(target, "new")
    assert stat.S_IMODE(target.stat().st_mode) == 0o640 and target.read_text() == "new"


def test_a_replaced_file_keeps_its_owner_where_the_system_allows(tmp_path):
    target = tmp_path / "p.toml"
    target.write_text("old")
    nobody = 65534
    try:
        os.chown(target, nobody, nobody)
    except PermissionError:  # not the superuser: nobody may give files away, the save still works
        fileio.write_atomic(target, "new")
        assert target.read_text() == "new" and target.stat().st_uid == os.getuid()
        return
    fileio.write_atomic(target, "new")
    info = target.stat()
    assert (info.st_uid, info.st_gid) == (nobody, nobody) and target.read_text() == "new"


def test_refused_ownership_does_not_stop_the_save(tmp_path, monkeypatch):
    target = tmp_path / "p.toml"
    target.write_text("old")
    calls = []

    def chown(path, uid, gid):
        calls.append((uid, gid))
        raise PermissionError(1, "Operation not permitted")

    monkeypatch.setattr(os, "chown", chown)
    monkeypatch.setattr(os, "getuid", lambda: target.stat().st_uid + 1)  # as if someone else owned the file
    fileio.write_atomic(target, "new")
    info = target.stat()
    assert calls == [(info.st_uid, info.st_gid), (-1, info.st_gid)]  # the owner, then at least the group
    assert target.read_text() == "new"


@pytest.mark.parametrize("name", [
    "c" * 236 + ".pdf",
    "p" * 250 + ".toml",
    "x" * 255,
    "é" * 127,  # 254 bytes of UTF-8
])
def test_the_longest_legal_names_can_be_written(tmp_path, name):
    target = tmp_path / name
    fileio.write_atomic(target, "first")
    fileio.write_atomic(target, "second")
    assert target.read_text() == "second"
    assert [p.name for p in tmp_path.iterdir()] == [name]


def test_temporaries_of_long_names_fit_and_are_cleaned_up(tmp_path):
    target = tmp_path / ("n" * 254)
    prefix = fileio._temp_prefix(target, 4_294_967_295)
    assert len(os.fsencode(prefix)) + 8 + len(fileio.TEMP_SUFFIX) <= 255
    stale = tmp_path / f"{fileio._temp_prefix(target, 2**22 + 1)}abcdefgh{fileio.TEMP_SUFFIX}"  # above pid_max
    stale.write_text("left by a writer that died")
    fileio.write_atomic(target, "x")
    assert [p.name for p in tmp_path.iterdir()] == [target.name]


# --- outputs onto inputs ---------------------------------------------------------------------------


@pytest.fixture
def inputs(tmp_path):
    profile = tmp_path / "p.toml"
    profile.write_text("schema = 1\n")
    logo = tmp_path / "logo.png"
    logo.write_bytes(b"\x89PNG")
    return profile, logo


def test_an_output_onto_an_input_is_refused(tmp_path, inputs):
    profile, logo = inputs
    with pytest.raises(FileProblem, match="is the input"):
        fileio.refuse_overwrite_of_inputs(logo, [profile, logo])
    with pytest.raises(FileProblem, match="is the input"):
        fileio.refuse_overwrite_of_inputs(tmp_path / "." / "logo.png", [profile, logo])


def test_an_output_reaching_an_input_through_a_link_is_refused(tmp_path, inputs):
    profile, logo = inputs
    (tmp_path / "card.pdf").symlink_to(logo)
    os.link(logo, tmp_path / "hard.pdf")
    for output in (tmp_path / "card.pdf", tmp_path / "hard.pdf"):
        with pytest.raises(FileProblem, match="is the input"):
            fileio.refuse_overwrite_of_inputs(output, [profile, logo])


@pytest.mark.parametrize("name", ["p.toml", "fleet.style.toml", "NEW.TOML", "other.toml"])
def test_an_output_ending_in_toml_is_refused(tmp_path, inputs, name):
    with pytest.raises(FileProblem, match=r"\.toml"):
        fileio.refuse_overwrite_of_inputs(tmp_path / name, list(inputs))


def test_other_outputs_pass(tmp_path, inputs):
    fileio.refuse_overwrite_of_inputs(tmp_path / "card.pdf", list(inputs))
    (tmp_path / "old.pdf").write_bytes(b"an earlier card")
    fileio.refuse_overwrite_of_inputs(tmp_path / "old.pdf", list(inputs))
    assert (tmp_path / "old.pdf").read_bytes() == b"an earlier card"  # checking writes nothing


# --- the profile loader on special files ---------------------------------------------------------------


@pytest.mark.parametrize("special", ["fifo", "/dev/null", "/dev/zero", "loop"])
def test_the_profile_loader_names_special_files_without_waiting(tmp_path, fifo, special):
    from conftest import checked_file

    if special == "fifo":
        path = fifo
    elif special == "loop":
        path = tmp_path / "loop.toml"
        path.symlink_to("loop.toml")
    else:
        path = Path(special)
    outcome = promptly(checked_file, path)
    loaded = outcome["value"]
    assert loaded.profile is None and [p.path for p in loaded.problems] == ["(file)"]
    assert any(word in loaded.problems[0].message for word in ("FIFO", "device", "loop"))
