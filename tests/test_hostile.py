"""Hostile profile files: whatever a file holds, the answer says where and what, and nothing else happens.

Broken files are generated (hypothesis, derandomized, no example database) by mutating the sample
aircraft and the minimal profile: text spliced, bytes that are not UTF-8, values of the wrong type,
dimension or magnitude, missing sections and keys, duplicate names, pattern speeds at or below the
stall speed, calibration tables and polars of the wrong shape, impossible banks, unit-string attacks,
huge strings and files over the size limit. For every case:

- the pipeline (`kneeboard check`) returns a Prepared: no profile means at least one error, every problem has a path
  and a message, every error names a field ("configuration[2].stall_speed") or "(file)"; a profile
  builds a table whose printed figures are finite, in text and JSON, with no numeric warning on the way;
- `kneeboard check` exits 0 and prints "ok" for the file, or exits 2 and prints error lines that each
  name the file and a field; it never raises, and nothing in a file can start an output line of its own;
- a case that runs away fails instead of hanging: hypothesis' deadline, an interval timer that raises in
  the test, and, for C code a signal cannot interrupt, faulthandler ending the run.

Mutations whose answer is known (a wrong value in a field) also check that an error names that field.
"""

import contextlib
import math
import os
import re
import subprocess
import sys
import tomllib
from unittest import mock

import pytest
import tomlkit
from conftest import MINIMAL, checked, checked_file
from hostile_cases import (
    BASE_TEXTS,
    BASES,
    CATEGORIES,
    FILLERS,
    NUMBER_TEXT,
    UNIT_ATTACKS,
    UNIT_TOKENS,
    allowed_extremes,
    bad_calibrations,
    bad_polars,
    byte_mutations,
    dotted,
    dump,
    fresh,
    put,
    spliced_texts,
    structure_mutations,
    variant,
    wrong_values,
)
from hostile_checks import (
    CASES,
    KILL_SECONDS,
    TERMINAL,
    answer,
    assert_check_output,
    assert_loaded,
    fuzz,
    hang_guard,
    names_field,
)
from hypothesis import given
from hypothesis import strategies as st

from kneeboard import units
from kneeboard.compute import compute
from kneeboard.fileio import MAX_FILE_BYTES


@pytest.fixture(scope="session", autouse=True)
def hostile_session(request):
    """Keeps the real stderr for the hang guard, and reports how many cases were generated."""
    capture = request.config.pluginmanager.get_plugin("capturemanager")
    with capture.global_and_fixture_disabled() if capture else contextlib.nullcontext():
        TERMINAL["fd"] = os.dup(sys.__stderr__.fileno())
    yield
    os.close(TERMINAL.pop("fd"))
    if CASES:
        line = f"test_hostile: {sum(CASES.values())} generated cases (" + ", ".join(
            f"{name} {n}" for name, n in sorted(CASES.items())) + ")"
        reporter = request.config.pluginmanager.get_plugin("terminalreporter")
        with capture.global_and_fixture_disabled() if capture else contextlib.nullcontext():
            if reporter is not None:
                reporter.write("\n" + line + "\n")


# --- the properties ---------------------------------------------------------------------------------------


@pytest.mark.parametrize("field, value", [
    ("configuration[1].stall_speed", "52 kg"), ("configuration[1].stall_speed", "5 degC"),
    ("aircraft.max_weight", "700 kt"), ("card.temperature", "15 kt"), ("card.buffer", "5 delta_degC"),
    ("card.temperature", "5 delta_degC"), ("configuration[1].stall_speed", "1e300 kt"),
    ("aircraft.max_weight", "1e-300 kg"), ("configuration[1].stall_speed", "1e999999 kt"),
    ("configuration[1].stall_speed", "10**10**10 kt"), ("configuration[1].stall_speed", "__import__('os') kt"),
    ("configuration[1].stall_speed", "5 kt**9**9**9"), ("configuration[1].stall_speed", "\u09ea0 kt"),
])
def test_named_hostile_values(tmp_path, capsys, field, value):
    """The values the issue names, always among the cases (the generated ones draw from the same lists)."""
    data = fresh("minimal")
    put(data, tuple(int(p) - 1 if p.isdigit() else p for p in re.split(r"[.\[\]]+", field) if p), value)
    loaded = answer(tmp_path, capsys, dump(data), None)
    assert loaded.profile is None and names_field(loaded, field), [str(p) for p in loaded.errors]


@fuzz(200)
@given(text=spliced_texts())
def test_spliced_text_gets_an_answer(tmp_path, capsys, text):
    loaded = answer(tmp_path, capsys, text, "spliced text")
    try:
        tomllib.loads(text.removeprefix("\ufeff"))
    except tomllib.TOMLDecodeError:
        assert [p.path for p in loaded.errors] == ["(file)"] and "not valid TOML" in loaded.errors[0].message


@fuzz(80)
@given(content=byte_mutations())
def test_bytes_that_are_not_utf8_get_an_answer(tmp_path, capsys, content):
    loaded = answer(tmp_path, capsys, content, "foreign bytes")
    try:
        content.decode("utf-8")
    except UnicodeDecodeError:
        (problem,) = loaded.problems
        assert problem.path == "(file)" and "UTF-8" in problem.message


@pytest.mark.parametrize("category", CATEGORIES)
@fuzz(60)
@given(data=st.data())
def test_a_wrong_value_is_named_at_its_field(tmp_path, capsys, category, data):
    text, field = data.draw(wrong_values(category))
    loaded = answer(tmp_path, capsys, text, f"wrong values: {category}")
    assert loaded.profile is None
    assert names_field(loaded, field), (field, [str(p) for p in loaded.errors])


@fuzz(100)
@given(text=allowed_extremes())
def test_allowed_extremes_print_finite_figures(tmp_path, capsys, text):
    answer(tmp_path, capsys, text, "allowed extremes")


@fuzz(200)
@given(case=structure_mutations())
def test_missing_mistyped_and_unknown_nodes_are_named(tmp_path, capsys, case):
    text, field, answer_wanted = case
    loaded = answer(tmp_path, capsys, text, "missing, mistyped or unknown")
    if answer_wanted == "error":
        assert names_field(loaded, field), (field, [str(p) for p in loaded.errors])
    elif answer_wanted == "warning":  # the unknown key, named inside its own table (a table of a list by number)
        prefix = f"{field}." if field else ""
        unknown = [p for p in loaded.warnings if p.path.startswith(prefix) and "unknown key" in p.message]
        assert unknown, (field, [str(p) for p in loaded.problems])


@fuzz(50)
@given(base=BASES, data=st.data())
def test_duplicate_configuration_names(tmp_path, capsys, base, data):
    profile = fresh(base)
    configurations = profile["configuration"]
    original = data.draw(st.sampled_from(configurations))
    how = data.draw(st.sampled_from(["same", "upper", "swapcase", "fullwidth", "spacing"]))
    configurations.append({"name": variant(original["name"], how), "stall_speed": original["stall_speed"]})
    loaded = answer(tmp_path, capsys, dump(profile), "duplicate names")
    assert f"configuration[{len(configurations)}].name" in [p.path for p in loaded.errors]


@fuzz(50)
@given(base=BASES, data=st.data())
def test_pattern_speed_at_or_below_the_stall_speed(tmp_path, capsys, base, data):
    profile = checked(BASE_TEXTS[base]).profile
    i = data.draw(st.integers(0, len(profile.configurations) - 1))
    c, r = profile.configurations[i], compute(profile).configurations[i]
    calibration = profile.calibration_for(c)
    # the stall speed at the card weight, written as the file writes speeds (IAS or CAS)
    level = r.level_stall_cas if profile.aircraft.speed_basis == "CAS" else r.level_stall_speed
    if calibration is None:  # exactly at the stall speed only where no table's interpolation rounds
        fraction = data.draw(st.sampled_from([1.0, 0.999, 0.7, 0.05]))
    else:
        fraction = data.draw(st.floats(0.05, 0.999))
    edited = fresh(base)
    configuration = edited["configuration"][i]
    configuration.pop("pattern_factor", None)
    configuration["pattern_speed"] = f"{level * fraction!r} m/s"
    loaded = answer(tmp_path, capsys, dump(edited), "pattern at or below stall")
    assert f"configuration[{i + 1}].pattern_speed" in [p.path for p in loaded.errors]


@fuzz(80)
@given(base=BASES, data=st.data())
def test_calibration_pairs_out_of_order_or_shape(tmp_path, capsys, base, data):
    profile = fresh(base)
    calibration = data.draw(bad_calibrations(profile["aircraft"].get("speed_basis", "IAS")))
    at = data.draw(st.sampled_from([("aircraft", "calibration")] + [
        ("configuration", i, "calibration") for i in range(len(profile["configuration"]))]))
    put(profile, at, calibration)
    loaded = answer(tmp_path, capsys, dump(profile), "calibration")
    field = dotted(at)
    assert any(p.path.startswith(field) for p in loaded.errors), (field, [str(p) for p in loaded.errors])


@fuzz(60)
@given(base=BASES, polar=bad_polars())
def test_polar_without_three_points_or_a_minimum(tmp_path, capsys, base, polar):
    profile = fresh(base)
    profile.setdefault("glider", {"polar_weight": "400 kg"})["polar"] = polar
    loaded = answer(tmp_path, capsys, dump(profile), "polar")
    assert any(p.path.startswith("glider.polar") for p in loaded.errors), [str(p) for p in loaded.errors]


# --- size ---------------------------------------------------------------------------------------------------


@fuzz(12, deadline=None)  # tomllib parses a megabyte of escapes in seconds on a loaded machine; hang_guard bounds it
@given(base=BASES, filler=FILLERS, size=st.integers(10_000, MAX_FILE_BYTES - 4_000),  # past every text limit
       where=st.sampled_from(["aircraft.registration", "aircraft.model", "card.notes", "comment", "unknown key"]))
def test_huge_strings_up_to_the_size_limit(tmp_path, capsys, base, filler, size, where):
    data = fresh(base)
    per_char = len(tomlkit.dumps({"a": filler * 10}).encode("utf-8")) - len(tomlkit.dumps({"a": ""}).encode("utf-8"))
    text_value = filler * (size * 10 // per_char)
    if where == "comment":
        text = BASE_TEXTS[base] + "# " + text_value.replace("\\", "/") + "\n"
    else:
        put(data, ("card", "colour") if where == "unknown key" else tuple(where.split(".")), text_value)
        text = dump(data)
    assert len(text.encode("utf-8")) <= MAX_FILE_BYTES
    loaded = answer(tmp_path, capsys, text, "huge strings")
    if where in ("comment", "unknown key"):
        assert loaded.profile is not None  # a big file within the limit is read like any other
    else:
        assert where in [p.path for p in loaded.errors] and "characters long" in str(loaded.errors)


@fuzz(6, deadline=None)
@given(base=BASES, extra=st.integers(1, 200_000), filler=FILLERS)
def test_files_over_the_limit_are_refused_unread(tmp_path, capsys, base, extra, filler):
    text = BASE_TEXTS[base] + "# " + filler * (MAX_FILE_BYTES // len(filler.encode("utf-8")))
    content = text.encode("utf-8")[: MAX_FILE_BYTES + extra].ljust(MAX_FILE_BYTES + extra, b" ")
    real_loads = tomllib.loads

    def loads(text, *args, **kwargs):  # the card style is read as usual; the oversized profile must never be
        if len(text) > MAX_FILE_BYTES // 2:
            raise AssertionError("a file over the limit was parsed")
        return real_loads(text, *args, **kwargs)

    with mock.patch("tomllib.loads", side_effect=loads):
        loaded = answer(tmp_path, capsys, content, "over the limit")
    (problem,) = loaded.problems
    assert problem.path == "(file)" and "refused unread" in problem.message
    assert f"{MAX_FILE_BYTES // 1024} KiB" in problem.message


# --- quantity strings -------------------------------------------------------------------------------------


@fuzz(250)
@given(number=st.one_of(NUMBER_TEXT, st.sampled_from(["1e999999", "nan", "\u09ea", "\uff15", "10**10**10", ""])),
       unit=st.one_of(st.lists(UNIT_TOKENS, max_size=14).map("".join), st.sampled_from(UNIT_ATTACKS)),
       kind=st.sampled_from([units.SPEED, units.MASS, units.LENGTH, units.VOLUME, units.DENSITY, units.TEMPERATURE]))
def test_quantity_strings_give_a_finite_number_or_a_reason(number, unit, kind):
    CASES["quantity strings"] += 1
    text = f"{number} {unit}"
    with hang_guard():
        try:
            value = units.parse(text, kind)
        except units.QuantityError as exc:
            assert str(exc) and kind.name in exc.expected
            return
    assert isinstance(value, float) and math.isfinite(value)
    assert re.fullmatch(r"\s*[-+]?[0-9.]+(e[-+]?[0-9]+)?\s+.*", text, re.IGNORECASE | re.DOTALL), text
    if kind is not units.TEMPERATURE:  # a quantity scales with its number: nothing but the number is read
        unit_read = units.split(text)[1]
        assert units.parse(f"2 {unit_read}", kind) == pytest.approx(2 * units.parse(f"1 {unit_read}", kind), rel=1e-12)


# --- the real command ---------------------------------------------------------------------------------------


@fuzz(8, deadline=None)
@given(content=st.one_of(spliced_texts(), wrong_values("attack").map(lambda case: case[0]),
                         structure_mutations().map(lambda case: case[0]), byte_mutations()))
def test_real_process_check(tmp_path, content):
    """`python -m kneeboard check FILE` as a person runs it: exit 0 or 2, no traceback, nothing on stderr."""
    CASES["real process"] += 1
    path = tmp_path / "case.toml"
    path.write_bytes(content.encode("utf-8") if isinstance(content, str) else content)
    proc = subprocess.run([sys.executable, "-m", "kneeboard", "check", str(path)], capture_output=True, text=True,
                          timeout=KILL_SECONDS)  # a hang guard, not a timing assertion
    assert proc.stderr == "", proc.stderr  # no warning, no traceback, no library noise
    assert_check_output(path, proc.returncode, proc.stdout, proc.stderr)
    assert (proc.returncode == 0) == (checked_file(path).profile is not None)


# --- files the TOML reader itself must survive -------------------------------------------------------------


def test_integer_longer_than_python_converts_gets_an_answer():
    loaded = checked(MINIMAL.replace("schema = 1", "schema = " + "1" * 5000))
    assert_loaded(loaded)
    assert loaded.profile is None


def test_keys_nested_deeper_than_python_recurses_get_an_answer():
    loaded = checked(MINIMAL + ".".join(["a"] * 1200) + " = 1\n")
    assert_loaded(loaded)


def test_dotted_keys_too_deep_are_refused_before_parsing():
    # tomllib's time grows with the square of a dotted key's depth; 20,000 levels took 7 s
    loaded = checked(MINIMAL + ".".join(["a"] * 20_000) + " = 1\n")
    assert loaded.profile is None and "nested more than" in loaded.errors[0].message


def test_dots_in_comments_and_strings_are_no_keys_nesting():
    # dotted leaders in a comment, as a pilot lines up figures, and dots in a string value: a valid profile
    text = MINIMAL.replace('max_weight = "750 kg"', 'max_weight = "750 kg"  # MTOW ' + "." * 40 + " 750 kg") + (
        "# Vr ......... 55 kt\n# Vx .......................... 62 kt\n"
        'notes = "' + "." * 200 + '"\n')
    loaded = checked(text)
    assert_loaded(loaded)
    assert not [p for p in loaded.errors if "nested" in p.message], loaded.errors


@pytest.mark.parametrize("key", ['"a"', "'a'", "a"])
def test_dotted_keys_of_quoted_parts_too_deep_are_refused_before_parsing(key):
    loaded = checked(MINIMAL + " . ".join([key] * 20_000) + " = 1\n")
    assert loaded.profile is None and "nested more than" in loaded.errors[0].message


@pytest.mark.parametrize("junk", ['"\\', '"\\\n', "'", '"""\\', '"""a"', '""', "'''a'"])
def test_unterminated_strings_are_measured_in_one_pass(junk):
    # a start that failed to find its closing quote was tried again at every later quote: hours for a megabyte
    with hang_guard():
        loaded = checked(junk * (600_000 // len(junk)))
    assert_loaded(loaded)
    assert loaded.profile is None
