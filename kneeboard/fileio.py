"""Reading and writing files safely: size limits before parsing, atomic replacement on write."""

import contextlib
import errno
import os
import stat
import tempfile
import time
from pathlib import Path

from kneeboard.i18n import N_, Msg
from kneeboard.problems import Told

MAX_FILE_BYTES = 1024 * 1024  #: profiles and styles larger than this are refused unread


def terminate_cleanly() -> None:
    """Turn SIGTERM into SystemExit, so an interrupted save or export still removes its temporary."""
    import signal

    def stop(signum, _frame):
        raise SystemExit(128 + signum)

    with contextlib.suppress(ValueError, OSError):  # not the main thread, or no such signal here
        signal.signal(signal.SIGTERM, stop)


#: errors of the device an output goes to, not of the output chosen: a full disk, a quota, a failing medium
DEVICE_FAILURES = frozenset({errno.ENOSPC, errno.EDQUOT, errno.EIO, errno.EROFS})


class FileProblem(Told):
    """A file that cannot be read or written; the message names the file and the reason.

    `errno` is the system's error number when one caused it (None otherwise); `device_failed` says the output's
    device failed (the command line's exit 74) rather than the file being unusable (exit 2).
    """

    def __init__(self, message: str = "", errno: int | None = None):
        super().__init__(message)
        self.errno = errno

    @property
    def device_failed(self) -> bool:
        return self.errno in DEVICE_FAILURES


def read_text(path: Path, limit: int = MAX_FILE_BYTES) -> str:
    """Text of a small UTF-8 regular file; raises FileProblem for anything else.

    A missing, huge, non-UTF-8 or special file (FIFO, device, socket, folder), a symbolic link
    loop or an impossible name each give a message; nothing ever waits on a FIFO.
    """
    path = Path(path)
    return decode_text(read_bytes(path, limit, N_("a profile is a few KiB")), path)


def decode_text(data: bytes, path: Path) -> str:
    """The text of a file's bytes as read_text decodes them; raises FileProblem when they are not UTF-8."""
    try:
        return data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise FileProblem(Msg("{file}: not UTF-8 text (byte {byte}); save it as UTF-8", file=str(path),
                              byte=str(exc.start))) from None


def read_bytes(path: Path, limit: int = MAX_FILE_BYTES, why: str = "") -> bytes:
    """The bytes of a regular file of at most `limit` bytes; raises FileProblem for anything else.

    The file is opened without blocking (a FIFO without a writer would otherwise wait forever,
    a device would stream without end), then the open descriptor itself is checked: only a
    regular file is read, and it is refused unread when it is larger than `limit`.
    """
    path = Path(path)
    flags = os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_BINARY", 0) | getattr(os, "O_CLOEXEC", 0)
    try:
        fd = os.open(path, flags)
    except ValueError:  # a NUL in the name: no file system has such a file
        raise FileProblem(_no_name(path)) from None
    except OSError as exc:
        raise FileProblem(_at(path, _open_failure(exc, "read"))) from None
    try:
        info = os.fstat(fd)
        if not stat.S_ISREG(info.st_mode):
            raise FileProblem(Msg("{file}: {kind}, not a regular file; refused", file=str(path),
                                  kind=_kind(info.st_mode)))
        if info.st_size > limit:
            raise FileProblem(_at(path, _too_large(limit, why)))
        chunks, size = [], 0
        while size <= limit:  # the size can change under us: read to the limit, never further
            chunk = os.read(fd, limit + 1 - size)
            if not chunk:
                break
            chunks.append(chunk)
            size += len(chunk)
    except BlockingIOError:
        raise FileProblem(Msg("{file}: cannot be read without waiting; refused", file=str(path))) from None
    except OSError as exc:
        raise FileProblem(Msg("{file}: cannot be read ({reason})", file=str(path), reason=_reason(exc))) from None
    finally:
        os.close(fd)
    if size > limit:
        raise FileProblem(_at(path, _too_large(limit, why)))
    return b"".join(chunks)


def _too_large(limit: int, why: str) -> Msg:
    amount = Msg("{amount} KiB", amount=str(limit // 1024)) if limit >= 1024 else \
        Msg("{amount} bytes", amount=str(limit))
    if why:  # `why` a Word or Msg is told in the user's language too
        return Msg("larger than {amount}; {why}, refused unread", amount=amount, why=why)
    return Msg("larger than {amount}, refused unread", amount=amount)


def _at(path, problem: Msg) -> Msg:
    """A file's problem: its name (as it is), then what is wrong with it (told in the user's language)."""
    return Msg("{file}: {problem}", file=str(path), problem=problem)


def _reason(exc: OSError) -> str:
    """The system's own words for an error: a value of a message, as the system wrote it (never translated)."""
    return str(exc.strerror or exc)


def _no_name(path) -> Msg:
    return Msg("{file}: is not a possible file name (it holds a NUL character)", file=_shown(path))


def _shown(path) -> str:
    """A path for a message, with NULs and other controls escaped."""
    return repr(str(path))[1:-1]


def _kind(mode: int) -> str:
    """What a file that is not a regular file is, in words."""
    if stat.S_ISDIR(mode):
        return N_("is a folder")
    if stat.S_ISFIFO(mode):
        return N_("is a FIFO (named pipe)")
    if stat.S_ISSOCK(mode):
        return N_("is a socket")
    if stat.S_ISCHR(mode) or stat.S_ISBLK(mode):
        return N_("is a device")
    return N_("is a special file")


def _open_failure(exc: OSError, doing: str) -> Msg:
    """Why a file could not be opened, in words: `doing` is "read" or "written"."""
    if exc.errno == errno.ENOENT:
        return Msg("no such file")
    if exc.errno == errno.EISDIR:
        return Msg("is a folder, not a file")
    if exc.errno == errno.ELOOP:
        return Msg("its symbolic links form a loop; refused")
    if exc.errno == errno.ENXIO:  # opening a socket, or a FIFO for writing with no reader
        return Msg("is a socket or pipe, not a regular file; refused")
    if exc.errno == errno.ENAMETOOLONG:
        return Msg("the name is too long for the file system")
    if doing == "read":
        return Msg("cannot be read ({reason})", reason=_reason(exc))
    return Msg("cannot be written ({reason})", reason=_reason(exc))


TEMP_SUFFIX = ".part"
NAME_MAX = 255  #: bytes in a file name on every common file system; a temporary's name never exceeds it
_PID_WIDTH = 10  #: digits reserved for a writer's process id in a temporary's name
_RANDOM_WIDTH = 8  #: characters tempfile adds to make a temporary's name unique


def _name_max(folder: Path) -> int:
    try:
        return min(NAME_MAX, os.pathconf(folder or ".", "PC_NAME_MAX"))
    except (OSError, ValueError, AttributeError):  # no pathconf on this platform, or the folder is not there
        return NAME_MAX


def _temp_stem(path: Path) -> str:
    """The part of a file's name its temporaries carry: all of it, or its start when the whole would not fit.

    The temporary ".NAME.PID.RANDOM.part" must fit wherever NAME fits (a legal 250-byte name too),
    so a long NAME is cut, at a character boundary, leaving room for the widest process id.
    """
    budget = _name_max(path.parent) - (3 + _PID_WIDTH + _RANDOM_WIDTH + len(TEMP_SUFFIX))
    stem = path.name
    while len(os.fsencode(stem)) > budget:
        stem = stem[:-1]
    return stem


def _temp_prefix(path: Path, pid: int | str) -> str:
    return f".{_temp_stem(path)}.{pid}."


def remove_stale_temporaries(path: Path) -> list[Path]:
    """Remove temporaries of `path` left by writers that died before they could clean up.

    A temporary's name carries its writer's process id; one whose process is gone is stale.
    A writer that is still running (another save of the same file) is left alone.
    """
    removed = []
    stem = _temp_stem(path)
    try:
        candidates = list(path.parent.glob(f".{glob_escape(stem)}.*{TEMP_SUFFIX}"))
    except (OSError, ValueError):
        return removed
    for tmp in candidates:
        pid = tmp.name[len(stem) + 2:].split(".", 1)[0]
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
    except (PermissionError, OverflowError):
        return True
    return True


def write_target(path: Path) -> tuple[Path, os.stat_result | None]:
    """Where writing `path` really goes, and what is there now (None: nothing yet).

    A symbolic link is followed, so its target gets the new bytes and the link stays a link; a
    link loop, or anything at the end that is not a regular file (a folder, a device, a FIFO, a
    socket), raises FileProblem: replacing it would destroy it, writing into it could hang.
    """
    path = Path(path)
    try:
        os.stat(path)
    except ValueError:
        raise FileProblem(_no_name(path)) from None
    except FileNotFoundError:
        pass  # a new file, or a link to one not yet there: written at the link's target
    except OSError as exc:
        raise FileProblem(_at(path, _open_failure(exc, "written"))) from None
    target = Path(os.path.realpath(path))
    try:
        info = os.stat(target)
    except FileNotFoundError:
        return target, None
    except OSError as exc:
        raise FileProblem(_at(path, _open_failure(exc, "written"))) from None
    if not stat.S_ISREG(info.st_mode):
        raise FileProblem(Msg("{file}: {kind}, not a regular file; nothing was written", file=str(path),
                              kind=_kind(info.st_mode)))
    return target, info


def write_atomic(path: Path, data) -> None:
    """Write `data` (bytes, text, or a function that writes into the open binary file it is given) to `path` so
    that the old file survives any failure.

    The bytes go to a temporary file in the same folder, are flushed to disk, and replace the
    target in one rename; on any error (or an interrupting signal) the temporary file is removed
    and the target untouched. A writer killed outright cannot clean up; its temporary is removed
    by the next write of the same file. A symbolic link's target is written (the link stays);
    a folder, device, FIFO or socket is refused (see `write_target`); a replaced file keeps its
    owner, group and mode where the system allows.
    """
    path = Path(path)
    if isinstance(data, str):
        data = data.encode("utf-8")
    target, before = write_target(path)
    remove_stale_temporaries(target)
    try:
        fd, tmp = tempfile.mkstemp(prefix=_temp_prefix(target, os.getpid()), suffix=TEMP_SUFFIX,
                                   dir=target.parent or ".")
    except OSError as exc:
        raise FileProblem(Msg("{file}: cannot write in {folder} ({reason})", file=str(path), folder=str(target.parent),
                              reason=_reason(exc)), exc.errno) from None
    try:
        with os.fdopen(fd, "wb") as f:
            if callable(data):
                data(f)
            else:
                f.write(data)
            f.flush()
            os.fsync(f.fileno())
        _keep_owner_and_mode(before, tmp)
        os.replace(tmp, target)
        _sync_folder(target.parent)
    except BaseException as exc:
        with contextlib.suppress(OSError):
            os.unlink(tmp)
        if isinstance(exc, OSError):
            raise FileProblem(Msg("{file}: cannot be written ({reason})", file=str(path), reason=_reason(exc)),
                              exc.errno) from None
        raise


LOCK_WAIT_S = 10.0  #: [s] how long a save waits for another one in the same folder before it says so


@contextlib.contextmanager
def folder_lock(path: Path, wait_s: float | None = None):
    """Hold an advisory lock on the folder `path` is written in, across a check and the write that depends on it.

    Two saves of one file a few milliseconds apart each checked the file unchanged, then each wrote it: the later
    silently replaced the earlier. Under this lock the second save checks after the first has written, and sees
    the change. The folder is locked (flock), not the file: an atomic write replaces the file's inode, and a new
    file has none yet; no lock file is left in a fleet's folder. Where the system has no such locks (Windows, some
    network file systems), saves go on unlocked, as before.

    Raises
    ------
    FileProblem
        When another save holds the folder for longer than `wait_s` (default LOCK_WAIT_S).
    """
    try:
        import fcntl
    except ImportError:  # no advisory locks here
        yield
        return
    folder = Path(os.path.realpath(path)).parent
    try:
        fd = os.open(folder, os.O_RDONLY | getattr(os, "O_CLOEXEC", 0))
    except (OSError, ValueError):  # the write itself will say what is wrong with the folder
        yield
        return
    try:
        deadline = time.monotonic() + (LOCK_WAIT_S if wait_s is None else wait_s)
        while True:
            try:
                fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
                break
            except BlockingIOError:
                if time.monotonic() > deadline:
                    raise FileProblem(Msg("{file}: another save in {folder} has not finished; nothing was written, "
                                          "try again", file=str(path), folder=str(folder))) from None
                time.sleep(0.005)
            except OSError:  # a file system without locks: unlocked, as before
                break
        yield
    finally:
        os.close(fd)  # releases the lock


def same_file(a: Path, b: Path) -> bool:
    """Whether two paths reach one file (device and inode), whatever links or spellings lead there."""
    return _same_file(Path(a), Path(b))


def refuse_overwrite_of_inputs(output: Path, inputs) -> None:
    """Raise FileProblem when writing `output` would destroy one of `inputs` (profiles, a style, a logo).

    Refused: an output that is an input, or reaches one through a symbolic or hard link, and any
    output ending in ".toml" (the ending of profiles and styles: no card is ever written there).
    """
    output = Path(output)
    if output.name.lower().endswith(".toml"):
        raise FileProblem(Msg("{file}: ends in .toml like profiles and styles; choose another name for the output",
                              file=str(output)))
    real = _real(output)
    for given in inputs:
        given = Path(given)
        if _real(given) == real or _same_file(output, given):
            raise FileProblem(Msg("{file}: is the input {given}; an output never replaces an input", file=str(output),
                                  given=str(given)))


def _real(path: Path) -> str:
    try:
        return os.path.normcase(os.path.realpath(path))
    except (OSError, ValueError):
        return os.path.normcase(os.path.abspath(path))


def _same_file(a: Path, b: Path) -> bool:
    try:
        return os.path.samefile(a, b)
    except (OSError, ValueError):  # one of them does not exist (or cannot be reached): not the same file
        return False


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


def _keep_owner_and_mode(before: os.stat_result | None, tmp: str) -> None:
    """A replaced file keeps its owner, group and permissions; a new one gets the usual ones (mkstemp makes 0600).

    Only the superuser may give a file to someone else; a member of the file's group may still
    keep its group. Where neither is allowed the file becomes the saver's, as any editor does.
    """
    if before is None:
        umask = os.umask(0)
        os.umask(umask)
        os.chmod(tmp, 0o666 & ~umask)
        return
    chown = getattr(os, "chown", None)
    if chown is not None and (before.st_uid, before.st_gid) != (os.getuid(), os.getgid()):
        for uid, gid in ((before.st_uid, before.st_gid), (-1, before.st_gid)):
            try:
                chown(tmp, uid, gid)
                break
            except OSError:  # EPERM, or a file system without owners
                continue
    os.chmod(tmp, stat.S_IMODE(before.st_mode))
