"""What every answer to a hostile profile must look like, and the time bounds that keep a case from hanging."""

import contextlib
import faulthandler
import json
import math
import re
import signal
import sys
import unicodedata
import warnings
from collections import Counter
from dataclasses import fields, is_dataclass
from datetime import timedelta

import pytest
from conftest import checked_file
from hypothesis import HealthCheck, settings

from kneeboard import report
from kneeboard.cli import main
from kneeboard.inputs.schema import KNOWN_KEYS
from kneeboard.pipeline import PLACEHOLDER, Prepared
from kneeboard.tables import LIMIT_MARK, Printed, build
from kneeboard.texts import CAUTION

# --- counting the cases, bounding them in time ---------------------------------------------------------

CASES: Counter = Counter()  #: generated cases run, per property
TERMINAL = {}  #: "fd": a copy of the real stderr, where a run ended by the hang guard says why


CASE_DEADLINE = timedelta(seconds=2)  #: hypothesis fails a case slower than this
GUARD_SECONDS = 20  #: an interval timer raises in a case running this long (a Python loop that never ends)
KILL_SECONDS = 60  #: faulthandler ends the run: C code (a huge integer power) that the timer cannot interrupt


class RunawayCase(Exception):
    """A case that did not finish: it would have hung CI."""


@contextlib.contextmanager
def hang_guard(seconds: float = GUARD_SECONDS):
    def expire(signum, frame):
        raise RunawayCase(f"one case ran for more than {seconds} s")

    previous = signal.signal(signal.SIGALRM, expire)
    signal.setitimer(signal.ITIMER_REAL, seconds)
    faulthandler.dump_traceback_later(KILL_SECONDS, exit=True, file=TERMINAL.get("fd", sys.__stderr__))
    try:
        yield
    finally:
        signal.setitimer(signal.ITIMER_REAL, 0)
        signal.signal(signal.SIGALRM, previous)
        faulthandler.cancel_dump_traceback_later()


def fuzz(max_examples: int, deadline=CASE_DEADLINE):
    """Reproducible in CI: derandomized, no example database, a deadline per case."""
    return settings(
        max_examples=max_examples, deadline=deadline, derandomize=True, database=None, print_blob=False,
        suppress_health_check=[HealthCheck.function_scoped_fixture, HealthCheck.too_slow,
                               HealthCheck.data_too_large, HealthCheck.large_base_example],
    )


# --- what every answer must look like ---------------------------------------------------------------------

SECTIONS = ("schema", "aircraft", "weight", "configuration", "glider", "card")
FIELD_NAMES = set().union(*KNOWN_KEYS.values())
ERROR_PATH = re.compile(r"\(file\)|(?:" + "|".join(SECTIONS) + r")(?:\[\d+\])*(?:\.[a-z_]+(?:\[\d+\])*)*")
NOT_ON_ONE_LINE = {"Cc", "Cf", "Zl", "Zp"}
NON_FINITE = re.compile(r"(?i)\b(nan|inf|infinity)\b")


def assert_field_path(path: str) -> None:
    assert ERROR_PATH.fullmatch(path), f"error without a field path: {path!r}"
    assert all(name in FIELD_NAMES for name in re.findall(r"\.([a-z_]+)", path)), path


def assert_one_line(text: str) -> None:
    bad = [ch for ch in text if unicodedata.category(ch) in NOT_ON_ONE_LINE]
    assert not bad, f"a control character would reach the terminal: {text!r}"


def printed_figures(obj):
    """Every Printed figure of a CardTable (not the full-precision results or the chart's curves)."""
    if isinstance(obj, Printed):
        yield obj
    elif is_dataclass(obj):
        for f in fields(obj):
            if f.name not in ("results", "curves"):
                yield from printed_figures(getattr(obj, f.name))
    elif isinstance(obj, tuple | list):
        for item in obj:
            yield from printed_figures(item)


def refuse_constant(name):
    raise AssertionError(f"JSON output holds {name}")


def assert_bank_text(text: str, bank_deg: float) -> None:
    assert re.fullmatch(r"\d+(\.\d{1,2})?", text), f"bank printed as {text!r}"
    assert bank_deg - 0.01 - 1e-9 <= float(text) <= bank_deg + 1e-9, (text, bank_deg)


def assert_card_figures(profile) -> None:
    """The table of a valid profile: finite figures everywhere, stall speeds that make sense."""
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        table = build(profile)
        text = report.to_text(table)
        json.loads(report.to_json(table), parse_constant=refuse_constant)
    numeric = [w for w in caught if issubclass(w.category, RuntimeWarning)]
    assert not numeric, f"numeric trouble on the way to a card: {numeric[0].message}"
    figures = list(printed_figures(table))
    assert figures
    for p in figures:
        assert math.isfinite(p.value), p
        # a figure printed as its configuration's limit reads that limit after the mark ("≥60")
        shown = p.text.removeprefix(LIMIT_MARK) if p.past_limit else p.text
        assert not NON_FINITE.search(shown) and float(shown) == pytest.approx(p.value, abs=1e-6), p
    for c in table.configurations:
        stalls = [row.stall_speed.value for row in c.rows]
        assert 0 < c.stall_speed.value <= c.pattern_speed.value, c
        assert stalls == sorted(stalls) and stalls[0] > 0, stalls  # banks ascend, so do stall speeds
        for row in c.rows:
            assert_bank_text(row.bank_text, row.bank_deg)
            assert row.bank_text != "0" or row.turn_radius is row.time_180 is None, row  # printed level: no turn
    if table.glider is not None:
        assert table.glider.min_sink_speed.value > 0
        for row in table.glider.rows:
            assert_bank_text(row.bank_text, row.bank_deg)
            assert row.bank_text != "0" or row.turn_radius is row.circle_time is None, row
    for free in sorted({table.registration, table.model, table.notes, *(c.name for c in table.configurations)},
                       key=len, reverse=True):
        if free:
            text = text.replace(free, "")
    assert not NON_FINITE.search(text), text


def assert_loaded(loaded) -> None:
    assert isinstance(loaded, Prepared)
    if loaded.profile is None:
        assert loaded.errors, "no profile, and no error saying why"
    else:
        assert not loaded.errors
    for p in loaded.problems:
        assert p.path and p.message, p
        assert_one_line(str(p))
        if p.is_error:
            assert_field_path(p.path)
        elif p.message != PLACEHOLDER:  # the placeholders are gathered into one plain line of their own
            # the card and the app tell every warning in plain words: never a field path or an option name
            assert p.plain and not re.search(r"--|\w\.\w+_|\[\d+\]", p.plain), p
    if loaded.profile is not None:
        assert_card_figures(loaded.profile)


def assert_check_output(path, code: int, out: str, err: str) -> list[str]:
    """`kneeboard check FILE` output; returns the field paths of its error lines."""
    assert "Traceback" not in out + err and "internal error" not in err, out + err
    assert code in (0, 2), (code, out, err)
    head = f"{path}: "
    error_paths, ok = [], False
    for line in out.splitlines():
        if line == CAUTION:
            continue
        assert line.startswith(head), f"a line not about the file: {line!r}"  # nothing a file holds starts a line
        rest = line[len(head):]
        if rest.startswith("error: "):
            field, _, message = rest[len("error: "):].partition(": ")
            assert_field_path(field)
            assert message.strip(), line
            error_paths.append(field)
        elif rest.startswith("ok"):
            ok = True
        else:
            assert rest.startswith("warning: ") or re.fullmatch(r"\d+ error\(s\); no card can be made", rest), line
    if code == 0:
        assert ok and not error_paths, out
    else:
        assert error_paths and not ok, out
    return error_paths


def run_check(capsys, path) -> tuple[int, str, str]:
    capsys.readouterr()
    code = main(["check", str(path)])
    out, err = capsys.readouterr()
    return code, out, err


def answer(tmp_path, capsys, content: str | bytes, counter: str | None) -> Prepared:
    """Feed one case to the loader and to `kneeboard check`; every property of the module docstring holds.

    `counter` names the property whose generated cases are counted; None for a case written out by hand."""
    if counter is not None:
        CASES[counter] += 1
    path = tmp_path / "case.toml"
    path.write_bytes(content.encode("utf-8") if isinstance(content, str) else content)
    with hang_guard():
        loaded = checked_file(path)
        assert_loaded(loaded)
        code, out, err = run_check(capsys, path)
    error_paths = assert_check_output(path, code, out, err)
    assert (code == 0) == (loaded.profile is not None)
    assert sorted(error_paths) == sorted(p.path for p in loaded.errors)
    return loaded


def names_field(loaded: Prepared, field: str) -> bool:
    """Whether an error names `field` or a section or table that holds it."""
    return any(field == p.path or field.startswith((p.path + ".", p.path + "[")) for p in loaded.errors)
