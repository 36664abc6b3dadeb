"""Hostile profile files, generated: the sample aircraft and the minimal profile, mutated."""

import math
import re
import tomllib
from datetime import date

import tomlkit
from conftest import MINIMAL, SAMPLES
from hypothesis import strategies as st

from kneeboard import units
from kneeboard.inputs.schema import KNOWN_KEYS

BASE_TEXTS = {"minimal": MINIMAL} | {p.stem: p.read_text(encoding="utf-8") for p in sorted(SAMPLES.glob("*.toml"))}
BASES = st.sampled_from(sorted(BASE_TEXTS))


# --- building files ---------------------------------------------------------------------------------------


def dotted(path: tuple) -> str:
    """("configuration", 1, "stall_speed") -> "configuration[2].stall_speed", as messages count."""
    out = ""
    for part in path:
        out += f"[{part + 1}]" if isinstance(part, int) else (f".{part}" if out else part)
    return out


def node_paths(data, prefix=()):
    items = data.items() if isinstance(data, dict) else enumerate(data)
    for key, value in items:
        here = (*prefix, key)
        yield here
        if isinstance(value, dict | list):
            yield from node_paths(value, here)


def put(data, path: tuple, value) -> None:
    for part in path[:-1]:
        if isinstance(part, str) and part not in data:
            data[part] = {}
        data = data[part]
    data[path[-1]] = value


def get(data, path: tuple):
    for part in path:
        data = data[part]
    return data


def delete(data, path: tuple) -> None:
    del get(data, path[:-1])[path[-1]]


def fresh(base: str) -> dict:
    return tomllib.loads(BASE_TEXTS[base])  # a deep copy that keeps every type


def dump(data: dict) -> str:
    text = tomlkit.dumps(data)
    assert tomllib.loads(text) == data or repr(tomllib.loads(text)) == repr(data)  # the generator writes what it means
    return text


def type_class(value) -> str:
    if isinstance(value, bool):
        return "bool"
    if isinstance(value, int | float):
        return "number"
    return {str: "text", list: "list", dict: "table"}.get(type(value), "date")


# --- values -----------------------------------------------------------------------------------------------

UNITS = {
    "speed": ["kt", "knot", "kts", "km/h", "kph", "mph", "m/s", "ft/min", "fpm"],
    "mass": ["kg", "lb", "pound", "g", "t"],
    "length": ["ft", "m", "km", "nmi"],
    "volume": ["L", "gal", "m**3", "liter"],
    "density": ["kg/L", "lb/gal", "kg/m**3"],
    "temperature": ["degC", "degF", "K", "°C", "kelvin"],
    "other": ["", "percent", "dozen", "radian", "s", "delta_degC", "delta_degF", "N", "Pa", "m/s**2", "W"],
}
UNIT_ATTACKS = [
    "kt**9**9**9", "kt^9^9^9", "kt**(9**9**9)", "(9**9**9)*kt", "((((nmi/mi)**99)**99)**99)**99*kt",
    "(nmi**99/mi**99)**99*kt", "kt*1e300", "kt/0", "kt**99", "kt**-9", "kt; import os", "__import__('os')",
    "k\u0442", "\uff4b\uff54", "kt\u200b", "\u202ekt", "\u212a", "kt\x00", "kt#", "kt\\n", "c", "speed_of_light",
    "planck_length/planck_time", "(" * 40 + "kt" + ")" * 40, "kt" + "*kt/kt" * 12, "kt" * 40, "m/s2", "kt.", "$kt",
]
WHOLE_ATTACKS = [
    "1e999999 kt", "-1e999999 kt", "10**10**10 kt", "__import__('os') kt", "nan kt", "inf kt", "-inf kt", "NaN kt",
    "0x10 kt", "1_000 kt", "\u09ea0 kt", "\uff15 kt", "\U0001d7d3 kt", "\u0665 kt", "5e kt", "5..0 kt", "--5 kt",
    "5 " + "kt*" * 300 + "kt", "", " ", "kt", "5", "52 kt kt", "fast", "1e300", "\x1b[2J5 kt", "5 kt\n6 kt",
]
ABSURD = {  # out of every plausible range of that field
    "speed": ["0 kt", "-5 kt", "-0 kt", "1e300 kt", "1e-300 kt", "601 kt", "1e-300 m/s", "0.5 kt"],
    "mass": ["0 kg", "-750 kg", "1e300 kg", "1e-300 kg", "600001 kg", "0.5 kg", "-1e-300 kg"],
    "item_mass": ["-1 kg", "1e300 kg", "600001 kg", "-80 lb"],
    "volume": ["-1 L", "1e300 L", "2000000 L"],
    "density": ["0 kg/L", "-1 kg/L", "1e300 kg/L", "1e-300 kg/L", "30 kg/L"],
    "buffer": ["-1 kt", "1e300 kt", "101 kt", "-1e300 kt"],
    "length": ["-3000 ft", "40000 ft", "1e300 ft", "-1e300 ft", "12 km"],
    "temperature": ["-300 degC", "-273.15 degC", "0 K", "-5 K", "1e300 K", "1e-300 K", "200 degC", "-150 degC",
                    "1e300 degF"],
}
QUANTITY_FIELDS = {  # (table, key): (kind the value must have, which absurd values)
    ("aircraft", "max_weight"): ("mass", "mass"),
    ("aircraft", "reference_weight"): ("mass", "mass"),
    ("aircraft", "maneuvering_speed"): ("speed", "speed"),
    ("weight", "total"): ("mass", "mass"),
    ("weight", "empty"): ("mass", "mass"),
    ("weight.item", "mass"): ("mass", "item_mass"),
    ("weight.item", "volume"): ("volume", "volume"),
    ("weight.item", "density"): ("density", "density"),
    ("configuration", "stall_speed"): ("speed", "speed"),
    ("configuration", "pattern_speed"): ("speed", "speed"),
    ("configuration", "flap_limit_speed"): ("speed", "speed"),
    ("glider", "polar_weight"): ("mass", "mass"),
    ("card", "buffer"): ("speed", "buffer"),
    ("card", "pressure_altitude"): ("length", "length"),
    ("card", "temperature"): ("temperature", "temperature"),
}
NUMBER_FIELDS = {("aircraft", "limit_load_factor"): (1.0, 20.0), ("configuration", "pattern_factor"): (1.0, 3.0)}
TEXT_FIELDS = {  # (table, key): (characters allowed, required, line breaks allowed)
    ("aircraft", "registration"): (16, True, False),
    ("aircraft", "model"): (80, True, False),
    ("configuration", "name"): (24, True, False),
    ("weight.item", "name"): (40, True, False),
    ("card", "notes"): (600, False, True),
}
CHOICE_FIELDS = {
    ("aircraft", "category"): ("normal", "utility", "acrobatic", "glider"),
    ("aircraft", "speed_basis"): ("IAS", "CAS"),
    ("card", "speed_unit"): units.SPEED_UNITS,
    ("card", "distance_unit"): units.DISTANCE_UNITS,
    ("card", "weight_unit"): units.WEIGHT_UNITS,
}

NUMBER_TEXT = st.one_of(st.sampled_from(["0", "5", "52", "47.5", ".5", "5.", "+5", "-5", "1e3", "750"]),
                        st.floats(allow_nan=False, allow_infinity=False).map(repr))
NOT_TEXT_VALUES = st.one_of(  # numbers where text is wanted, tables where values are
    st.integers(), st.floats(), st.booleans(), st.dates(),
    st.lists(st.integers(-5, 5), max_size=3),
    st.dictionaries(st.sampled_from(["a", "kt", "value"]), st.integers(), max_size=2),
)
NOT_NUMBER_VALUES = st.one_of(  # text where a number is wanted
    st.sampled_from(["3.8", "1.4", "3.8 g", "", "45 deg", [3.8], [], {"value": 3.8}, True, False]),
    st.text(max_size=8), st.dates(),
)
HUGE_INTEGERS = [10**400, -(10**400), 2**63 - 1, -(2**63)]
CONTROL = st.sampled_from(["\n", "\r", "\t", "\x00", "\x1b", "\x1b[2J", "\x7f", "\x85", "\u2028", "\u2029", "\u202e",
                           "\u200b", "\ufeff", "\x1b]0;title\x07", "\ue000"])
VISIBLE_CONTROL = CONTROL.filter(lambda c: not c.isspace())  # whitespace around a number and unit is just whitespace

#: What a wrong value may be wrong in; each category is a property run of its own, so each gets its share.
CATEGORIES = ("type", "dimension", "non-finite", "magnitude", "attack", "text")


def quantity_values(kind: str, absurd: str, category: str):
    """Values a quantity field of `kind` must refuse, of one category; None when there are none."""
    if category == "type":
        return NOT_TEXT_VALUES
    if category == "dimension":
        wrong_units = [u for k, us in UNITS.items() if k not in (kind, "other") for u in us]
        deltas = ["delta_degC", "delta_degF"] if kind == "temperature" else UNITS["other"]
        return st.builds(lambda n, u: f"{n} {u}".strip(), NUMBER_TEXT, st.sampled_from(wrong_units + deltas))
    if category == "non-finite":
        numbers = st.sampled_from(["1e999999", "-1e400", "1e309", "nan", "inf", "-inf"])
        return st.builds(lambda n, u: f"{n} {u}", numbers, st.sampled_from(UNITS[kind]))
    if category == "magnitude":
        return st.sampled_from(ABSURD[absurd])
    if category == "attack":
        return st.one_of(
            st.builds(lambda n, u: f"{n} {u}", st.sampled_from(["5", "52", "15"]), st.sampled_from(UNIT_ATTACKS)),
            st.sampled_from(WHOLE_ATTACKS),
            NUMBER_TEXT,  # no unit
            st.builds(lambda u, c, at: (f"52 {u}"[:at] + c + f"52 {u}"[at:]), st.sampled_from(UNITS[kind]),
                      VISIBLE_CONTROL, st.integers(0, 4)),
        )
    return None


def number_values(low: float, high: float, category: str):
    """Values a plain-number field (low, high] must refuse, of one category; None when there are none."""
    if category == "type":
        return NOT_NUMBER_VALUES
    if category == "non-finite":
        return st.sampled_from([math.nan, math.inf, -math.inf])
    if category == "magnitude":
        return st.one_of(st.sampled_from([low, low - 1, 0, -1, -0.0, high + 0.001, 1e300, -1e300, *HUGE_INTEGERS]),
                         st.floats(allow_nan=False).filter(lambda x: not low < x <= high),
                         st.integers().filter(lambda x: not low < x <= high))
    return None


def bank_values(category: str):
    """A bank no level turn can hold (or no bank at all), of one category; None when there are none."""
    if category == "type":
        return NOT_NUMBER_VALUES
    if category == "non-finite":
        return st.sampled_from([math.nan, math.inf, -math.inf])
    if category == "magnitude":
        return st.one_of(st.sampled_from([90, 90.0, 91, 180, 360, -1, -0.5, -1e-300, 1e300, *HUGE_INTEGERS]),
                         st.floats(min_value=90, allow_infinity=False), st.floats(max_value=-1e-300))
    return None


def text_values(limit: int, required: bool, multiline: bool, category: str):
    """Text a text field must refuse: not text, too long, control characters, or empty where required."""
    if category == "type":
        return NOT_TEXT_VALUES
    if category != "text":
        return None

    def spliced(text, control, at):
        return text[:at] + control + text[at:]

    controls = CONTROL.filter(lambda c: not (multiline and c == "\n"))
    values = [
        st.integers(limit + 1, limit + 2000).map(lambda n: "x" * n),
        st.builds(spliced, st.text(st.characters(codec="utf-8"), max_size=limit - 16), controls, st.integers(0, 8)),
    ]
    if required:
        values.append(st.sampled_from(["", " ", "\t", "   "]))
    return st.one_of(*values)


def choice_values(options, category: str):
    if category == "type":
        return NOT_TEXT_VALUES
    if category == "text":
        return st.one_of(st.text(max_size=12).filter(lambda t: t not in options),
                         st.sampled_from([o.upper() + " " for o in options] + [o.lower() + "s" for o in options]))
    return None


def schema_values(category: str):
    if category == "type":
        return st.sampled_from(["1", 1.0, True, [1], {"v": 1}, date(2020, 1, 1)])
    if category == "non-finite":
        return st.sampled_from([math.nan, math.inf])
    if category == "magnitude":
        return st.sampled_from([0, -1, 2, 10**400, -(10**400)])
    return None


def tables_of(data: dict, table: str) -> list[tuple]:
    """Where a table of that name is (or may be created) in `data`: paths of the tables themselves."""
    if table in ("aircraft", "glider"):
        return [(table,)] if isinstance(data.get(table), dict) else []
    if table in ("weight", "card"):
        return [(table,)]
    if table == "configuration":
        return [("configuration", i) for i in range(len(data.get("configuration", [])))]
    items = data.get("weight", {}).get("item", [])
    return [("weight", "item", i) for i in range(len(items))]


def field_values(field: tuple, category: str):
    """The strategy of wrong values of one category for a (table, key) field, or None."""
    if field in QUANTITY_FIELDS:
        return quantity_values(*QUANTITY_FIELDS[field], category)
    if field in NUMBER_FIELDS:
        return number_values(*NUMBER_FIELDS[field], category)
    if field in TEXT_FIELDS:
        return text_values(*TEXT_FIELDS[field], category)
    if field in CHOICE_FIELDS:
        return choice_values(CHOICE_FIELDS[field], category)
    return schema_values(category) if field == ("", "schema") else bank_values(category)


ALL_FIELDS = [*QUANTITY_FIELDS, *NUMBER_FIELDS, *TEXT_FIELDS, *CHOICE_FIELDS, ("", "schema"), ("card", "bank")]


@st.composite
def wrong_values(draw, category: str):
    """A valid profile with one field set to a value that field must refuse: (text, field path)."""
    data = fresh(draw(BASES))
    candidates = [(table_path + (key,), (table, key)) for table, key in ALL_FIELDS
                  if field_values((table, key), category) is not None
                  for table_path in ([()] if table == "" else tables_of(data, table))]
    path, field = draw(st.sampled_from(candidates))
    value = draw(field_values(field, category))
    if field == ("card", "bank"):  # one bank among good ones
        banks = list(data.get("card", {}).get("bank_angles", [0, 15, 30, 45, 60]))
        at = draw(st.integers(0, len(banks)))
        banks.insert(at, value)
        put(data, ("card", "bank_angles"), banks)
        return dump(data), dotted(("card", "bank_angles", at))
    put(data, path, value)
    return dump(data), dotted(path)


@st.composite
def allowed_extremes(draw):
    """Values every field accepts, drawn toward the ends of their ranges: the card must still print finite figures."""
    data = fresh(draw(BASES))
    kt, kg = "kt", "kg"

    def quantity(low, high, unit, exclude_min=True):
        return st.floats(low, high, exclude_min=exclude_min).map(lambda x: f"{x!r} {unit}")

    edits = {
        ("card", "bank_angles"): st.lists(st.floats(0, 90, exclude_max=True), min_size=1, max_size=24, unique=True),
        ("aircraft", "max_weight"): quantity(1, 600_000, kg),
        ("aircraft", "reference_weight"): quantity(1, 600_000, kg),
        ("aircraft", "limit_load_factor"): st.floats(1, 20, exclude_min=True),
        ("aircraft", "maneuvering_speed"): quantity(1, 600, kt),
        ("aircraft", "calibration"): st.lists(st.floats(1.001, 600), min_size=4, max_size=8, unique=True).map(
            lambda xs: [[f"{a!r} kt", f"{b!r} kt"] for a, b in zip(sorted(xs[::2]), sorted(xs[1::2]))]),
        ("weight", "total"): quantity(1, 600_000, kg),
        ("card", "buffer"): quantity(0, 100, kt, exclude_min=False),
        ("card", "pressure_altitude"): quantity(-2000, 36_089, "ft", exclude_min=False),
        ("card", "temperature"): quantity(-100, 100, "degC", exclude_min=False),
        ("card", "speed_unit"): st.sampled_from(units.SPEED_UNITS),
        ("card", "distance_unit"): st.sampled_from(units.DISTANCE_UNITS),
        ("configuration", 0, "stall_speed"): quantity(1, 600, kt),
        ("configuration", 0, "pattern_factor"): st.floats(1, 3, exclude_min=True),
        ("configuration", 0, "flap_limit_speed"): quantity(1, 600, kt),
    }
    for path in draw(st.lists(st.sampled_from(sorted(edits, key=str)), min_size=1, max_size=5, unique=True)):
        if path == ("weight", "total"):
            data["weight"] = {}
        put(data, path, draw(edits[path]))
    return dump(data)


@st.composite
def spliced_texts(draw):
    """Valid text with characters, quotes, brackets and section headers spliced in, cut out or cut off."""
    text = BASE_TEXTS[draw(BASES)]
    pieces = st.one_of(
        st.text(max_size=12),
        st.sampled_from(['"', "'", '"""', "'''", "[", "]", "[[", "]]", "{", "}", "=", ",", "\n", "\\", "\\u", "#",
                         "\x00", "\x1b", "\ufeff", "\r", "[aircraft", "[aircraft]\n", "\n[[configuration]]\n",
                         'x = "', "= nan", "= inf", "= -inf", "1e999", "0x", "1979-05-27", "a.b.c = 1", "= []"]),
    )
    for _ in range(draw(st.integers(1, 3))):
        at = draw(st.integers(0, len(text)))
        op = draw(st.sampled_from(["insert", "delete", "truncate", "replace"]))
        if op == "insert":
            text = text[:at] + draw(pieces) + text[at:]
        elif op == "delete":
            text = text[:at] + text[at + draw(st.integers(1, 60)):]
        elif op == "truncate":
            text = text[:at]
        else:
            text = text[:at] + draw(pieces) + text[at + draw(st.integers(1, 10)):]
    return text


@st.composite
def byte_mutations(draw):
    """A sample file's bytes with foreign bytes spliced in: latin-1, UTF-16, stray continuation bytes."""
    data = BASE_TEXTS[draw(BASES)].encode("utf-8")
    kind = draw(st.sampled_from(["splice", "latin-1", "utf-16", "random"]))
    if kind == "latin-1":
        return data.replace(b"demo", "d\u00e9mo \u00b0".encode("latin-1"))
    if kind == "utf-16":
        return BASE_TEXTS[draw(BASES)].encode("utf-16")
    if kind == "random":
        return draw(st.binary(max_size=400))
    at = draw(st.integers(0, len(data)))
    return data[:at] + draw(st.binary(min_size=1, max_size=8)) + data[at:]


KEYS = st.text(st.characters(codec="utf-8"), min_size=1, max_size=30)


@st.composite
def structure_mutations(draw):
    """A node deleted, replaced by a value of another type, or a key no profile knows added:
    (text, field path, "error" when the field must be refused or "warning" when the key must be reported)."""
    data = fresh(draw(BASES))
    op = draw(st.sampled_from(["delete", "replace", "unknown key"]))
    if op == "unknown key":
        tables = [()] + [path for path in node_paths(data) if isinstance(get(data, path), dict)]
        table = draw(st.sampled_from(tables))
        known = KNOWN_KEYS[re.sub(r"\[\d+\]", "", dotted(tuple(p for p in table if isinstance(p, str))))]
        key = draw(KEYS.filter(lambda k: k not in known and k not in get(data, table)))
        get(data, table)[key] = draw(st.one_of(st.integers(), st.text(max_size=10), st.lists(st.booleans())))
        return dump(data), dotted(table), "warning"
    path = draw(st.sampled_from(list(node_paths(data))))
    field = dotted(path)
    if op == "delete":
        delete(data, path)
        required = re.sub(r"\[\d+\]", "[]", field) in {
            "aircraft", "aircraft.registration", "aircraft.model", "aircraft.max_weight", "configuration",
            "configuration[].name", "configuration[].stall_speed", "glider.polar_weight", "glider.polar",
            "weight.item[].name",
        }
        return dump(data), field, "error" if required else ""
    old = get(data, path)
    value = draw(st.one_of(
        st.integers(), st.floats(), st.booleans(), st.text(max_size=20), st.dates(),
        st.lists(st.one_of(st.integers(), st.text(max_size=5)), max_size=4),
        st.lists(st.lists(st.text(max_size=5), max_size=3), max_size=3),
        st.dictionaries(st.sampled_from(["name", "stall_speed", "x"]), st.text(max_size=6), max_size=2),
    ).filter(lambda v: type_class(v) != type_class(old)))
    put(data, path, value)
    return dump(data), field, "error"


def variant(name: str, how: str) -> str:
    if how == "upper":
        return name.upper()
    if how == "swapcase":
        return name.swapcase()
    if how == "fullwidth":
        return "".join(chr(ord(c) + 0xFEE0) if "!" <= c <= "~" else c for c in name)
    if how == "spacing":
        return " " + name.replace(" ", "  ") + " "
    return name


GOOD_CALIBRATION = [["40 kt", "44 kt"], ["60 kt", "61 kt"], ["90 kt", "90 kt"], ["140 kt", "138 kt"]]


@st.composite
def bad_calibrations(draw, basis="IAS"):
    pairs = [list(p) for p in GOOD_CALIBRATION[: draw(st.integers(2, 4))]]
    how = draw(st.sampled_from(["reversed", "swap", "repeat", "short", "long", "not pairs", "scalar member",
                                "wrong kind", "not a list", "too few", "offset below zero"]))
    if how == "reversed":
        return pairs[::-1]
    if how == "swap":
        at = draw(st.integers(0, len(pairs) - 2))
        pairs[at], pairs[at + 1] = pairs[at + 1], pairs[at]
        return pairs
    if how == "repeat":
        at = draw(st.integers(0, len(pairs) - 1))
        return pairs[: at + 1] + [pairs[at]] + pairs[at + 1:]
    if how in ("short", "long"):
        at = draw(st.integers(0, len(pairs) - 1))
        pairs[at] = pairs[at][:1] if how == "short" else pairs[at] + ["70 kt"]
        return pairs
    if how == "not pairs":
        pairs[draw(st.integers(0, len(pairs) - 1))] = draw(st.sampled_from(["40 kt", 40, [], {"ias": "40 kt"}]))
        return pairs
    if how in ("scalar member", "wrong kind"):
        at, member = draw(st.integers(0, len(pairs) - 1)), draw(st.integers(0, 1))
        if how == "scalar member":
            pairs[at][member] = draw(st.sampled_from([40, 40.0, True, [40], "fast", "40", "nan kt"]))
        else:
            pairs[at][member] = draw(st.sampled_from(["40 kg", "40 degC", "40 ft", "0 kt", "-40 kt", "1e300 kt"]))
        return pairs
    if how == "not a list":
        return draw(st.sampled_from(["40 kt", 40, {"ias": "40 kt"}, True]))
    if how == "too few":
        return pairs[: draw(st.integers(0, 1))]
    # ascending, but the speeds written in the file (IAS or CAS) so far above the others that the stall
    # speeds become speeds at or below zero on the other side of the table
    start = draw(st.integers(100, 400))
    low = draw(st.floats(1.5, 2.0))
    pairs = [[f"{start + 40 * k} kt", f"{low + 40 * k} kt"] for k in range(draw(st.integers(2, 4)))]
    return pairs if basis == "IAS" else [pair[::-1] for pair in pairs]


@st.composite
def bad_polars(draw):
    how = draw(st.sampled_from(["few", "concave", "straight", "same speeds", "not pairs", "sink out of range"]))
    speeds = sorted(draw(st.lists(st.integers(60, 220), min_size=3, max_size=8, unique=True)))
    if how == "few":
        return [[f"{v} km/h", "0.7 m/s"] for v in speeds[: draw(st.integers(0, 2))]]
    if how in ("concave", "straight"):
        mid, spread = (speeds[0] + speeds[-1]) / 2, max((v - speeds[0]) ** 2 for v in speeds) or 1
        slope = draw(st.floats(0.001, 0.005)) * draw(st.sampled_from([-1, 1]))  # never flat: that fit is noise
        sinks = [2.0 + slope * (v - mid) - (2.5 * (v - mid) ** 2 / spread if how == "concave" else 0) for v in speeds]
        return [[f"{v} km/h", f"{s!r} m/s"] for v, s in zip(speeds, sinks)]
    if how == "same speeds":
        return [[f"{speeds[0]} km/h", f"{0.6 + 0.1 * k} m/s"] for k in range(draw(st.integers(3, 5)))]
    points = [[f"{v} km/h", f"{0.5 + (v - 100) ** 2 / 5000} m/s"] for v in speeds]
    at = draw(st.integers(0, len(points) - 1))
    if how == "not pairs":
        points[at] = draw(st.sampled_from([["80 km/h"], ["80 km/h", "0.7 m/s", "1 m/s"], "80 km/h", 80, {}]))
    else:
        points[at][1] = draw(st.sampled_from(["0 m/s", "-0.5 m/s", "1e-300 m/s", "300 kt", "1e300 m/s", "0.7 kg"]))
    return points


FILLERS = st.sampled_from(["x", " ", "\u00e9", "\u00b0", "\u20ac", "\U0001f600", "ab", "\\"])


UNIT_TOKENS = st.sampled_from(
    [u for us in UNITS.values() for u in us if u] + ["*", "/", "**", "^", "(", ")", " ", "-", "2", "9", "99", "1e3",
                                                     ".", "\u00b5", "\u00b0", "delta_", "k", "\u0442", "\uff4b"]
    + ["c", "planck_length", "percent", "mile", "nmi", "hour", "minute", "second"])
