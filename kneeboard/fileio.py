"""Reading and writing files safely: size limits before parsing, atomic replacement on write."""

import contextlib
import os
import tempfile
from pathlib import Path

MAX_FILE_BYTES = 1024 * 1024  #: profiles and styles larger than this are refused unread


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


def write_atomic(path: Path, data: bytes | str) -> None:
    """Write `data` to `path` so that the old file survives any failure.

    The bytes go to a temporary file in the same folder, are flushed to disk, and replace the
    target in one rename; on any error the temporary file is removed and the target untouched.
    """
    path = Path(path)
    if isinstance(data, str):
        data = data.encode("utf-8")
    try:
        fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".part", dir=path.parent or ".")
    except OSError as exc:
        raise FileProblem(f"{path}: cannot write in {path.parent} ({exc.strerror or exc})") from None
    try:
        with os.fdopen(fd, "wb") as f:
            f.write(data)
            f.flush()
            os.fsync(f.fileno())
        _keep_mode(path, tmp)
        os.replace(tmp, path)
    except BaseException as exc:
        with contextlib.suppress(OSError):
            os.unlink(tmp)
        if isinstance(exc, OSError):
            raise FileProblem(f"{path}: cannot be written ({exc.strerror or exc})") from None
        raise


def _keep_mode(path: Path, tmp: str) -> None:
    """A replaced file keeps its permissions; a new one gets the usual ones (mkstemp makes 0600)."""
    try:
        mode = path.stat().st_mode & 0o777
    except FileNotFoundError:
        umask = os.umask(0)
        os.umask(umask)
        mode = 0o666 & ~umask
    os.chmod(tmp, mode)
