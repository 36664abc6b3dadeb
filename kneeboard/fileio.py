"""Reading and writing files safely: size limits before parsing, atomic replacement on write."""

import contextlib
import os
import tempfile
from pathlib import Path

MAX_FILE_BYTES = 1024 * 1024  #: profiles and styles larger than this are refused unread


def terminate_cleanly() -> None:
    """Turn SIGTERM into SystemExit, so an interrupted save or export still removes its temporary."""
    import signal

    def stop(signum, _frame):
        raise SystemExit(128 + signum)

    with contextlib.suppress(ValueError, OSError):  # not the main thread, or no such signal here
        signal.signal(signal.SIGTERM, stop)


class FileProblem(Exception):
    """A file that cannot be read or written; the message names the file and the reason."""


def read_text(path: Path, limit: int = MAX_FILE_BYTES) -> str:
    """Text of a small UTF-8 file; raises FileProblem for a missing, huge or non-UTF-8 file."""
    path = Path(path)
    try:
        with path.open("rb") as f:
            data = f.read(limit + 1)
    except FileNotFoundError:
        raise FileProblem(f"{path}: no such file") from None
    except IsADirectoryError:
        raise FileProblem(f"{path}: is a folder, not a file") from None
    except OSError as exc:
        raise FileProblem(f"{path}: cannot be read ({exc.strerror or exc})") from None
    if len(data) > limit:
        raise FileProblem(f"{path}: larger than {limit // 1024} KiB; a profile is a few KiB, refused unread")
    try:
        return data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise FileProblem(f"{path}: not UTF-8 text (byte {exc.start}); save it as UTF-8") from None


TEMP_SUFFIX = ".part"


def _temp_prefix(path: Path, pid: int | str) -> str:
    return f".{path.name}.{pid}."


def remove_stale_temporaries(path: Path) -> list[Path]:
    """Remove temporaries of `path` left by writers that died before they could clean up.

    A temporary's name carries its writer's process id; one whose process is gone is stale.
    A writer that is still running (another save of the same file) is left alone.
    """
    removed = []
    try:
        candidates = list(path.parent.glob(f".{glob_escape(path.name)}.*{TEMP_SUFFIX}"))
    except OSError:
        return removed
    for tmp in candidates:
        pid = tmp.name[len(path.name) + 2:].split(".", 1)[0]
        if pid.isdigit() and not _alive(int(pid)):
            with contextlib.suppress(OSError):
                tmp.unlink()
                removed.append(tmp)
    return removed


def glob_escape(name: str) -> str:
    return "".join(f"[{c}]" if c in "*?[]" else c for c in name)


def _alive(pid: int) -> bool:
    if pid == os.getpid():
        return True
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except PermissionError:
        return True
    return True


def write_atomic(path: Path, data: bytes | str) -> None:
    """Write `data` to `path` so that the old file survives any failure.

    The bytes go to a temporary file in the same folder, are flushed to disk, and replace the
    target in one rename; on any error (or an interrupting signal) the temporary file is removed
    and the target untouched. A writer killed outright cannot clean up; its temporary is removed
    by the next write of the same file.
    """
    path = Path(path)
    if isinstance(data, str):
        data = data.encode("utf-8")
    remove_stale_temporaries(path)
    try:
        fd, tmp = tempfile.mkstemp(prefix=_temp_prefix(path, os.getpid()), suffix=TEMP_SUFFIX,
                                   dir=path.parent or ".")
    except OSError as exc:
        raise FileProblem(f"{path}: cannot write in {path.parent} ({exc.strerror or exc})") from None
    try:
        with os.fdopen(fd, "wb") as f:
            f.write(data)
            f.flush()
            os.fsync(f.fileno())
        _keep_mode(path, tmp)
        os.replace(tmp, path)
        _sync_folder(path.parent)
    except BaseException as exc:
        with contextlib.suppress(OSError):
            os.unlink(tmp)
        if isinstance(exc, OSError):
            raise FileProblem(f"{path}: cannot be written ({exc.strerror or exc})") from None
        raise


def _sync_folder(folder: Path) -> None:
    """Flush the rename itself to disk where the platform allows it (POSIX)."""
    try:
        fd = os.open(folder or ".", os.O_RDONLY)
    except OSError:
        return
    try:
        with contextlib.suppress(OSError):  # some file systems cannot sync a folder; the rename stands anyway
            os.fsync(fd)
    finally:
        os.close(fd)


def _keep_mode(path: Path, tmp: str) -> None:
    """A replaced file keeps its permissions; a new one gets the usual ones (mkstemp makes 0600)."""
    try:
        mode = path.stat().st_mode & 0o777
    except FileNotFoundError:
        umask = os.umask(0)
        os.umask(umask)
        mode = 0o666 & ~umask
    os.chmod(tmp, mode)
