"""A whole process timed from outside: wall seconds from its start to its reaping, and its own peak memory.

Linux keeps, as a process's peak (ru_maxrss), the largest of its own and that of the process it was forked from at
the moment of the fork, even across exec. A benchmark that has loaded Qt and the card machinery would lend every
child its own hundred megabytes. So the processes are started by a small launcher (this module run as a script,
nothing but the standard library loaded), started once, which the benchmark asks for each run.
"""

import json
import os
import subprocess
import sys
import tempfile
import threading
import time
from dataclasses import asdict, dataclass
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


@dataclass(frozen=True)
class Run:
    seconds: float  #: wall time, start to exit [s]
    peak_mb: float  #: the child's largest resident set (ru_maxrss) [MiB]
    returncode: int
    stdout: str
    stderr: str


def measure(command: list[str], env: dict | None = None, timeout: float = 600.0) -> Run:
    """Run `command` in the repository's folder, its output kept in files (a pipe could stall it), and reap it with
    wait4 so the memory figure is this child's alone, not the largest of every child so far."""
    with tempfile.TemporaryFile() as out, tempfile.TemporaryFile() as err:
        start = time.perf_counter()
        proc = subprocess.Popen(command, stdin=subprocess.DEVNULL, stdout=out, stderr=err, env=env, cwd=ROOT)
        killer = threading.Timer(timeout, proc.kill)
        killer.start()
        try:
            _, status, usage = os.wait4(proc.pid, 0)
        finally:
            killer.cancel()
        seconds = time.perf_counter() - start
        proc.returncode = os.waitstatus_to_exitcode(status)  # reaped here: Popen must not wait for it again
        out.seek(0)
        err.seek(0)
        return Run(seconds, usage.ru_maxrss / 1024, proc.returncode, out.read().decode(errors="replace"),
                   err.read().decode(errors="replace"))


_launcher: subprocess.Popen | None = None
_lock = threading.Lock()


def start_launcher() -> None:
    """Start the launcher now (best while this process is still small; later works too, as it execs afresh)."""
    global _launcher
    if _launcher is None or _launcher.poll() is not None:
        _launcher = subprocess.Popen([sys.executable, __file__], stdin=subprocess.PIPE, stdout=subprocess.PIPE,
                                     text=True, cwd=ROOT)


def run(command: list[str], env: dict | None = None, timeout: float = 600.0) -> Run:
    """`measure`, done by the launcher."""
    with _lock:
        start_launcher()
        _launcher.stdin.write(json.dumps({"command": command, "env": env, "timeout": timeout}) + "\n")
        _launcher.stdin.flush()
        answer = _launcher.stdout.readline()
    if not answer:
        raise RuntimeError("the benchmark's process launcher ended")
    return Run(**json.loads(answer))


def stop_launcher() -> None:
    global _launcher
    if _launcher is not None:
        _launcher.stdin.close()
        _launcher.wait(10)
        _launcher = None


def checked(command: list[str], what: str, env: dict | None = None, timeout: float = 600.0) -> Run:
    """`run`, raising with the end of its error output when the process failed."""
    result = run(command, env, timeout)
    if result.returncode != 0:
        raise RuntimeError(f"{what} failed (exit {result.returncode}): {result.stderr[-800:]}")
    return result


def _serve() -> None:
    for line in sys.stdin:
        request = json.loads(line)
        try:
            result = measure(request["command"], request["env"], request["timeout"])
        except OSError as exc:  # a command that cannot start is a failed run, as a shell reports it
            result = Run(0.0, 0.0, 127, "", f"{request['command'][0]}: {exc}")
        sys.stdout.write(json.dumps(asdict(result)) + "\n")
        sys.stdout.flush()


if __name__ == "__main__":
    _serve()
