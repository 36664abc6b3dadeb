"""Read profile data (the plain dict of a TOML file) into a `Profile`, collecting every problem.

Nothing is thrown away: each field is read on its own, a bad field becomes a `Problem` naming
its path, what is wrong and what would be accepted, and reading goes on so that one run reports
everything. Errors make the profile unusable; warnings are shown but do not stop a card.
"""

import json
import math
import re
import unicodedata

from kneeboard import units
from kneeboard.aero.limits import default_limit_load
from kneeboard.problems import ERROR, WARNING, Problem
from kneeboard.profile import (
    AVGAS_DENSITY,
    CATEGORIES,
    DEFAULT_BANKS_DEG,
    DEFAULT_PATTERN_FACTOR,
    SPEED_BASES,
    Aircraft,
    Calibration,
    CardSettings,
    Configuration,
    Loading,
    Polar,
    Profile,
    WeightItem,
)

SCHEMA_VERSION = 1
KT = 1852.0 / 3600.0  # [m/s]
FT = 0.3048  # [m]

# Plausible ranges [SI]: beyond them a value is a typo, not an aircraft. The lower ends also keep
# the ratios the physics takes (card weight / reference weight, ...) far from overflow.
SPEED_RANGE = (1 * KT, 600 * KT, "above 1 kt and at most 600 kt")
SINK_RANGE = (0.1, 20.0, "above 0.1 m/s and at most 20 m/s")
MASS_RANGE = (1.0, 600_000.0, "above 1 kg and at most 600,000 kg")
OAT_RANGE = (173.15, 373.15, "an outside air temperature from -100 to +100 degC")  # [K]
ALTITUDE_RANGE = (-2_000 * FT, 11_000.0, "from -2,000 ft up to the tropopause at 36,089 ft (11,000 m)")
MAX_CONFIGURATIONS = 12
MAX_BANKS = 24
MAX_ITEMS = 40
MAX_POLAR_POINTS = 40
MAX_NOTES = 600

KNOWN_KEYS = {
    "": {"schema", "aircraft", "weight", "configuration", "glider", "card"},
    "aircraft": {
        "registration", "model", "category", "max_weight", "reference_weight", "limit_load_factor",
        "maneuvering_speed", "speed_basis", "calibration",
    },
    "weight": {"total", "empty", "item"},
    "weight.item": {"name", "mass", "volume", "density"},
    "configuration": {"name", "stall_speed", "pattern_factor", "pattern_speed", "flap_limit_speed", "calibration"},
    "glider": {"polar_weight", "polar"},
    "card": {
        "bank_angles", "speed_unit", "distance_unit", "weight_unit", "buffer", "pressure_altitude",
        "temperature", "notes",
    },
}


class _Reader:
    """Reads fields one by one and keeps every problem it finds."""

    def __init__(self):
        self.problems: list[Problem] = []

    def problem(self, path, message, expected="", value=None, severity=ERROR):
        self.problems.append(Problem(path, message, expected, value, severity))

    def table(self, data, key, path, required=False):
        value = data.get(key)
        if value is None:
            if required:
                self.problem(path, "the section is missing", f"a [{path}] section")
            return None
        if not isinstance(value, dict):
            self.problem(path, "must be a section (a [table])", f"a [{path}] section", value)
            return None
        return value

    def unknown(self, data, known_set, prefix):
        for key in data:
            if key not in known_set:
                path = f"{prefix}.{_key_text(key)}" if prefix else _key_text(key)
                self.problem(path, "unknown key, kept in the file but not used", value=data[key], severity=WARNING)

    def quantity(self, data, key, path, kind, bounds=None, required=False):
        if key not in data:
            if required:
                self.problem(path, "is required", f"a {kind.name} such as {kind.examples}")
            return None
        return self.quantity_value(data[key], path, kind, bounds)

    def quantity_value(self, raw, path, kind, bounds=None):
        try:
            value = units.parse(raw, kind)
        except units.QuantityError as exc:
            self.problem(path, str(exc), exc.expected, raw)
            return None
        if bounds is not None:
            low, high, wording = bounds
            if not low < value <= high:
                self.problem(path, "is out of range", f"a {kind.name} {wording}", raw)
                return None
        return value

    def number(self, data, key, path, low, high, wording, required=False):
        if key not in data:
            if required:
                self.problem(path, "is required", wording)
            return None
        raw = data[key]
        if isinstance(raw, bool) or not isinstance(raw, (int, float)):
            self.problem(path, "must be a plain number", wording, raw)
            return None
        if not (_finite(raw) and low < raw <= high):
            self.problem(path, "is out of range", wording, raw)
            return None
        return float(raw)

    def text(self, data, key, path, limit, required=False, default="", multiline=False):
        if key not in data:
            if required:
                self.problem(path, "is required", f"text of 1 to {limit} characters")
            return default
        raw = data[key]
        if not isinstance(raw, str):
            self.problem(path, "must be text in quotes", f"text of up to {limit} characters", raw)
            return default
        if len(raw) > limit:
            self.problem(path, f"is {len(raw)} characters long", f"text of up to {limit} characters", raw)
            return raw[:limit]
        bad = _not_text(raw, "\n" if multiline else "")
        if bad is not None:
            self.problem(path, f"contains the control character U+{ord(bad):04X}",
                         "printable text" + (" (line breaks are fine)" if multiline else " on one line"), raw)
            return default
        if required and not raw.strip():
            self.problem(path, "must not be empty", f"text of 1 to {limit} characters", raw)
        return raw.strip() if required else raw

    def choice(self, data, key, path, options, default):
        raw = data.get(key, default)
        if raw not in options:
            self.problem(path, "is not one of the accepted values", " | ".join(options), raw)
            return default
        return raw

    def calibration(self, data, path):
        raw = data.get("calibration")
        if raw is None:
            return None
        wanted = 'at least two [IAS, CAS] pairs, ascending, e.g. [["40 kt", "44 kt"], ["60 kt", "61 kt"]]'
        if not isinstance(raw, list) or len(raw) < 2 or len(raw) > MAX_POLAR_POINTS:
            self.problem(path, "must be a list of [IAS, CAS] pairs", wanted, raw)
            return None
        pairs = self.pairs(raw, path, (units.SPEED, SPEED_RANGE), (units.SPEED, SPEED_RANGE), wanted)
        if pairs is None:
            return None
        ias, cas = zip(*pairs)
        if any(b <= a for a, b in zip(ias, ias[1:])) or any(b <= a for a, b in zip(cas, cas[1:])):
            self.problem(path, "the pairs are not in strictly ascending order", wanted, raw)
            return None
        return Calibration(tuple(ias), tuple(cas))

    def pairs(self, raw, path, first, second, wanted):
        """[a, b] pairs; `first` and `second` are (kind, bounds) of a and b."""
        result = []
        for i, pair in enumerate(raw, start=1):
            here = f"{path}[{i}]"
            if not isinstance(pair, list) or len(pair) != 2:
                self.problem(here, "must be a pair of two quantities", wanted, pair)
                return None
            a = self.quantity_value(pair[0], f"{here}[1]", *first)
            b = self.quantity_value(pair[1], f"{here}[2]", *second)
            if a is None or b is None:
                return None
            result.append((a, b))
        return result


def profile_from_data(data: dict) -> tuple[Profile | None, list[Problem]]:
    """Build a Profile from the plain data of a profile file; None when any error was found."""
    r = _Reader()
    if not isinstance(data, dict):
        r.problem("(file)", "is not a TOML table", "a profile file")
        return None, r.problems
    _read_schema(r, data)
    r.unknown(data, KNOWN_KEYS[""], "")
    aircraft = _read_aircraft(r, data)
    loading = _read_loading(r, data)
    configurations = _read_configurations(r, data)
    glider = _read_glider(r, data)
    card = _read_card(r, data)
    if any(p.is_error for p in r.problems) or aircraft is None or not configurations:
        return None, r.problems
    profile = Profile(aircraft, tuple(configurations), card, loading, glider)
    _cross_checks(r, profile)
    if any(p.is_error for p in r.problems):
        return None, r.problems
    return profile, r.problems


def _read_schema(r, data):
    version = data.get("schema")
    wanted = f"schema = {SCHEMA_VERSION}"
    if version is None:
        r.problem("schema", f"is missing, so this is a format-0 file; it is read as format {SCHEMA_VERSION}, and "
                  "saving it from the app adds the number and keeps the original as a .format0.bak file",
                  wanted, severity=WARNING)
    elif isinstance(version, bool) or not isinstance(version, int) or version < 1:
        r.problem("schema", "is not a format number", wanted, version)
    elif version > SCHEMA_VERSION:
        r.problem(
            "schema",
            f"the file is format {version}, written by a newer kneeboard; this version reads format {SCHEMA_VERSION}",
            "a newer kneeboard to open it",
            version,
        )


def _read_aircraft(r, data):
    a = r.table(data, "aircraft", "aircraft", required=True)
    if a is None:
        return None
    r.unknown(a, KNOWN_KEYS["aircraft"], "aircraft")
    registration = r.text(a, "registration", "aircraft.registration", 16, required=True)
    model = r.text(a, "model", "aircraft.model", 80, required=True)
    category = r.choice(a, "category", "aircraft.category", CATEGORIES, "normal")
    max_weight = r.quantity(a, "max_weight", "aircraft.max_weight", units.MASS, MASS_RANGE, required=True)
    reference = r.quantity(a, "reference_weight", "aircraft.reference_weight", units.MASS, MASS_RANGE)
    n_limit = r.number(
        a, "limit_load_factor", "aircraft.limit_load_factor", 1.0, 20.0, "a number above 1 and at most 20, e.g. 3.8"
    )
    va = r.quantity(a, "maneuvering_speed", "aircraft.maneuvering_speed", units.SPEED, SPEED_RANGE)
    basis = r.choice(a, "speed_basis", "aircraft.speed_basis", SPEED_BASES, "IAS")
    calibration = r.calibration(a, "aircraft.calibration")
    if max_weight is None:
        return None
    return Aircraft(
        registration=registration,
        model=model,
        category=category,
        max_weight=max_weight,
        reference_weight=max_weight if reference is None else reference,
        limit_load_factor=default_limit_load(category, max_weight) if n_limit is None else n_limit,
        maneuvering_speed=va,
        speed_basis=basis,
        calibration=calibration,
    )


def _read_loading(r, data):
    w = r.table(data, "weight", "weight")
    if w is None:
        return None
    r.unknown(w, KNOWN_KEYS["weight"], "weight")
    total = r.quantity(w, "total", "weight.total", units.MASS, MASS_RANGE)
    empty = r.quantity(w, "empty", "weight.empty", units.MASS, MASS_RANGE)
    raw_items = w.get("item", [])
    if "total" in w and ("empty" in w or raw_items):
        r.problem("weight", "gives both a total and a build-up", "either total, or empty with [[weight.item]] tables")
        return None
    if "total" not in w and "empty" not in w:
        r.problem("weight", "gives neither a total nor an empty weight",
                  'total = "690 kg", or empty = "480 kg" plus items')
        return None
    if not isinstance(raw_items, list) or len(raw_items) > MAX_ITEMS:
        r.problem("weight.item", f"must be up to {MAX_ITEMS} [[weight.item]] tables", value=raw_items)
        return None
    items = [_read_item(r, raw, f"weight.item[{i}]") for i, raw in enumerate(raw_items, start=1)]
    if total is None and (empty is None or None in items):
        return None
    return Loading(total=total, empty=empty, items=tuple(items))


def _read_item(r, raw, path):
    if not isinstance(raw, dict):
        r.problem(path, "must be a [[weight.item]] table", "name and mass, or name and volume", raw)
        return None
    r.unknown(raw, KNOWN_KEYS["weight.item"], path)
    name = r.text(raw, "name", f"{path}.name", 40, required=True)
    if ("mass" in raw) == ("volume" in raw):
        r.problem(path, "needs exactly one of mass or volume", 'mass = "80 kg", or volume = "60 L"')
        return None
    if "mass" in raw:
        if "density" in raw:
            r.problem(f"{path}.density", "goes with a volume, but this item gives a mass", "mass alone, or volume and "
                      "density", raw["density"])
        mass = r.quantity(raw, "mass", f"{path}.mass", units.MASS, (-1e-12, MASS_RANGE[1], "from 0 to 600,000 kg"))
        return None if mass is None else WeightItem(name, mass)
    volume = r.quantity(raw, "volume", f"{path}.volume", units.VOLUME, (-1e-12, 1000.0, "from 0 to 1,000,000 L"))
    density = r.quantity(raw, "density", f"{path}.density", units.DENSITY, (1.0, 20_000.0, "between 0.001 and 20 kg/L"))
    if volume is None or ("density" in raw and density is None):
        return None
    density = AVGAS_DENSITY if density is None else density
    return WeightItem(name, volume * density, volume, density)


def _read_configurations(r, data):
    raw = data.get("configuration")
    wanted = 'one or more [[configuration]] tables with a name and a stall_speed'
    if raw is None:
        r.problem("configuration", "no configuration is given", wanted)
        return []
    if not isinstance(raw, list) or not raw or len(raw) > MAX_CONFIGURATIONS:
        r.problem("configuration", f"must be 1 to {MAX_CONFIGURATIONS} [[configuration]] tables", wanted, raw)
        return []
    result, seen = [], set()
    for i, c in enumerate(raw, start=1):
        path = f"configuration[{i}]"
        if not isinstance(c, dict):
            r.problem(path, "must be a [[configuration]] table", wanted, c)
            continue
        r.unknown(c, KNOWN_KEYS["configuration"], path)
        name = r.text(c, "name", f"{path}.name", 24, required=True)
        if name and _name_key(name) in seen:
            r.problem(f"{path}.name", "is used by an earlier configuration", "a name unique in this profile", name)
        seen.add(_name_key(name))
        stall = r.quantity(c, "stall_speed", f"{path}.stall_speed", units.SPEED, SPEED_RANGE, required=True)
        factor = r.number(
            c, "pattern_factor", f"{path}.pattern_factor", 1.0, 3.0,
            "a number above 1 and at most 3 (pattern speed / stall speed), e.g. 1.4",
        )
        fixed = r.quantity(c, "pattern_speed", f"{path}.pattern_speed", units.SPEED, SPEED_RANGE)
        if "pattern_factor" in c and "pattern_speed" in c:
            r.problem(path, "gives both pattern_factor and pattern_speed", "one of them, never both")
        if factor is not None and factor < 1.3:
            r.problem(
                f"{path}.pattern_factor", "is below 1.3, the least usual approach speed factor (FAA-H-8083-3)",
                "1.3 or more", c["pattern_factor"], WARNING,
            )
        vfe = r.quantity(c, "flap_limit_speed", f"{path}.flap_limit_speed", units.SPEED, SPEED_RANGE)
        calibration = r.calibration(c, f"{path}.calibration")
        if stall is None:
            continue
        if fixed is None and factor is None:
            factor = DEFAULT_PATTERN_FACTOR
        result.append(Configuration(name, stall, None if fixed is not None else factor, fixed, vfe, calibration))
    return result


def _read_glider(r, data):
    g = r.table(data, "glider", "glider")
    if g is None:
        return None
    r.unknown(g, KNOWN_KEYS["glider"], "glider")
    weight = r.quantity(g, "polar_weight", "glider.polar_weight", units.MASS, MASS_RANGE, required=True)
    raw = g.get("polar")
    wanted = 'at least three [speed, sink rate] points, e.g. [["80 km/h", "0.62 m/s"], ...]'
    if not isinstance(raw, list) or not 3 <= len(raw) <= MAX_POLAR_POINTS:
        r.problem("glider.polar", "must be a list of 3 to 40 [speed, sink rate] points", wanted, raw)
        return None
    points = r.pairs(raw, "glider.polar", (units.SPEED, SPEED_RANGE), (units.SPEED, SINK_RANGE), wanted)
    if points is None or weight is None:
        return None
    speeds, sinks = zip(*points)
    if len(set(speeds)) < 3:
        r.problem("glider.polar", "needs at least three different speeds", wanted, raw)
        return None
    return Polar(weight, tuple(speeds), tuple(sinks))


def _read_card(r, data):
    c = r.table(data, "card", "card") or {}
    r.unknown(c, KNOWN_KEYS["card"], "card")
    banks = _read_banks(r, c)
    speed_unit = r.choice(c, "speed_unit", "card.speed_unit", units.SPEED_UNITS,
                          units.display_unit(_first_stall_speed(data), units.SPEED_UNITS) or "kt")
    distance_unit = r.choice(c, "distance_unit", "card.distance_unit", units.DISTANCE_UNITS,
                             "m" if speed_unit == "km/h" else "ft")
    aircraft = data.get("aircraft") if isinstance(data.get("aircraft"), dict) else {}
    weight_unit = r.choice(c, "weight_unit", "card.weight_unit", units.WEIGHT_UNITS,
                           units.display_unit(aircraft.get("max_weight"), units.WEIGHT_UNITS) or "kg")
    buffer = r.quantity(c, "buffer", "card.buffer", units.SPEED, (-1e-12, 100 * KT, "from 0 to 100 kt"))
    altitude = r.quantity(c, "pressure_altitude", "card.pressure_altitude", units.LENGTH, ALTITUDE_RANGE)
    temperature = r.quantity(c, "temperature", "card.temperature", units.TEMPERATURE)
    if temperature is not None and temperature <= 0.0:
        r.problem("card.temperature", "is at or below absolute zero", "a temperature above -273.15 degC",
                  c["temperature"])
        temperature = None
    elif temperature is not None and not OAT_RANGE[0] <= temperature <= OAT_RANGE[1]:
        r.problem("card.temperature", "is not an outside air temperature", OAT_RANGE[2], c["temperature"])
        temperature = None
    elif temperature is not None and not 203.15 <= temperature <= 333.15:
        r.problem("card.temperature", "is outside -70 to +60 degC; check it", "an outside air temperature",
                  c["temperature"], WARNING)
    notes = r.text(c, "notes", "card.notes", MAX_NOTES, multiline=True)
    return CardSettings(
        bank_angles_deg=banks,
        speed_unit=speed_unit,
        distance_unit=distance_unit,
        weight_unit=weight_unit,
        buffer=buffer or 0.0,
        pressure_altitude=altitude or 0.0,
        temperature=temperature,
        notes=notes,
    )


def _first_stall_speed(data):
    configurations = data.get("configuration")
    if isinstance(configurations, list) and configurations and isinstance(configurations[0], dict):
        return configurations[0].get("stall_speed")
    return None


def _read_banks(r, c):
    if "bank_angles" not in c:
        return DEFAULT_BANKS_DEG
    raw = c["bank_angles"]
    wanted = f"a list of 1 to {MAX_BANKS} bank angles in degrees, each 0 <= b < 90, e.g. [0, 15, 30, 45, 60]"
    if not isinstance(raw, list) or not 1 <= len(raw) <= MAX_BANKS:
        r.problem("card.bank_angles", "must be a list of numbers", wanted, raw)
        return DEFAULT_BANKS_DEG
    banks = []
    for i, b in enumerate(raw, start=1):
        if isinstance(b, bool) or not isinstance(b, (int, float)) or not (_finite(b) and 0 <= b < 90):
            r.problem(f"card.bank_angles[{i}]", "is not a bank angle a level turn can hold", wanted, b)
            continue
        banks.append(float(b))
    if len(set(banks)) != len(banks):
        r.problem("card.bank_angles", "lists a bank twice; it is printed once", "each bank once", raw, WARNING)
    return tuple(sorted(set(banks))) or DEFAULT_BANKS_DEG


def _finite(x) -> bool:
    """math.isfinite that also answers for integers too large for a float (TOML has no limit on them)."""
    try:
        return math.isfinite(x)
    except OverflowError:
        return False


_NOT_TEXT = {"Cc", "Cf", "Cs", "Co", "Cn", "Zl", "Zp"}  #: controls, bidi and zero-width marks, line separators


def _not_text(text: str, allowed: str = "") -> str | None:
    """The first character of `text` that is not printable text (it would reach a terminal or card raw), or None."""
    return next((ch for ch in text if ch not in allowed and unicodedata.category(ch) in _NOT_TEXT), None)


def _key_text(key: str) -> str:
    """A key as a field path shows it: a plain name as is, anything else quoted with its controls escaped."""
    if re.fullmatch(r"[A-Za-z0-9_-]{1,40}", key):
        return key
    shown = key if len(key) <= 40 else key[:37] + "..."
    return json.dumps(shown, ensure_ascii=not shown.isprintable())


def _name_key(name: str) -> str:
    """What makes two configuration names the same on a card: case, character width and spacing do not count."""
    return " ".join(unicodedata.normalize("NFKC", name).casefold().split())


def _cross_checks(r, profile):
    """Checks that need more than one field; the ones needing flight mechanics live in `compute`."""
    from kneeboard.compute import profile_checks

    a = profile.aircraft
    if profile.weight > a.max_weight * (1 + 1e-9):
        r.problem(
            "weight", f"{profile.weight:.0f} kg is above the maximum weight of {a.max_weight:.0f} kg",
            "a weight at or below aircraft.max_weight", severity=WARNING,
        )
    if a.reference_weight > a.max_weight * (1 + 1e-9):
        r.problem("aircraft.reference_weight", "is above the maximum weight", "at most aircraft.max_weight",
                  severity=WARNING)
    r.problems.extend(profile_checks(profile))
