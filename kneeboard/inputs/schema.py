"""Read profile data (the plain dict of a TOML file) into a `Profile`, collecting every problem.

Nothing is thrown away: each field is read on its own, a bad field becomes a `Problem` naming
its path, what is wrong and what would be accepted, and reading goes on so that one run reports
everything. Errors make the profile unusable; warnings are shown but do not stop a card.
"""

from kneeboard import units
from kneeboard.i18n import Msg, Num
from kneeboard.inputs import profile_keys
from kneeboard.inputs.banks import LIST_OF_NUMBERS, read_banks
from kneeboard.inputs.profile_keys import (
    OAT_RANGE,
    SINK_RANGE,
    SPEED_RANGE,
)
from kneeboard.inputs.values import MAX_POLAR_POINTS, Reader, finite
from kneeboard.problems import WARNING, Problem
from kneeboard.profile import (
    FLAPS,
    NOTHING,
    Aircraft,
    CardSettings,
    Configuration,
    Loading,
    Polar,
    Profile,
    WeightItem,
    name_key,
)

SCHEMA_VERSION = 1
MAX_CONFIGURATIONS = 12
MAX_ITEMS = 40

#: Section -> the keys a file may have there, derived from the field declarations.
KNOWN_KEYS = profile_keys.known_keys()
ONE_OF_THEM = Msg("one of them, never both")  #: what would do where a file gives two keys that exclude each other


def profile_from_data(data: dict) -> tuple[Profile | None, list[Problem]]:
    """Build a Profile from the plain data of a profile file; None when any error was found."""
    r = Reader()
    if not isinstance(data, dict):
        r.problem("(file)", Msg("is not a TOML table"), Msg("a profile file"))
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
    _flap_checks(r, data["configuration"], profile)
    if any(p.is_error for p in r.problems):
        return None, r.problems
    return profile, r.problems


def _read_schema(r, data):
    version = data.get("schema")
    wanted = f"schema = {SCHEMA_VERSION}"
    if version is None:
        r.problem("schema", Msg("is missing, so this is a format-0 file; it is read as format {version}, and saving "
                                "it from the app adds the number and keeps the original as a .format0.bak file",
                                version=str(SCHEMA_VERSION)),
                  wanted, severity=WARNING,
                  plain=Msg("Profile of the first file format: figures read as written; check them against the "
                            "flight manual once"))
    elif isinstance(version, bool) or not isinstance(version, int) or version < 1:
        r.problem("schema", Msg("is not a format number"), wanted, version)
    elif version > SCHEMA_VERSION:
        r.problem(
            "schema",
            Msg("the file is format {found}, written by a newer kneeboard; this version reads format {version}",
                found=str(version), version=str(SCHEMA_VERSION)),
            Msg("a newer kneeboard to open it"),
            version,
        )


def _read_aircraft(r, data):
    a = r.table(data, "aircraft", "aircraft", required=True)
    if a is None:
        return None
    r.unknown(a, KNOWN_KEYS["aircraft"], "aircraft")
    v = r.read_section("aircraft", a)
    best_glide, glide_ratio, best_glide_sink = v["best_glide_speed"], v["glide_ratio"], v["best_glide_sink"]
    if "glide_ratio" in a and "best_glide_sink" in a:
        r.problem("aircraft", Msg("gives both glide_ratio and best_glide_sink"), ONE_OF_THEM)
    elif ("glide_ratio" in a or "best_glide_sink" in a) != ("best_glide_speed" in a):
        r.problem("aircraft.best_glide_speed" if "best_glide_speed" not in a else "aircraft.glide_ratio",
                  Msg("the turn-back figures need both the best-glide speed and the glide ratio (or sink rate)"),
                  Msg("best_glide_speed with glide_ratio or best_glide_sink"), severity=WARNING,
                  plain=Msg("No turn back: it needs both the best-glide speed and the glide ratio (or sink rate), "
                            "and the profile gives one. Both are in the flight manual"))
        best_glide = glide_ratio = best_glide_sink = None
    calibration = r.calibration(a, "aircraft.calibration")
    max_weight = v["max_weight"]
    if max_weight is None:
        return None
    return Aircraft(
        registration=v["registration"],
        model=v["model"],
        category=v["category"],
        max_weight=max_weight,
        reference_weight=max_weight if v["reference_weight"] is None else v["reference_weight"],
        limit_load_factor=v["limit_load_factor"],
        maneuvering_speed=v["maneuvering_speed"],
        maneuvering_speed_weight=v["maneuvering_speed_weight"],
        best_glide_speed=best_glide,
        glide_ratio=glide_ratio,
        best_glide_sink=best_glide_sink,
        speed_basis=v["speed_basis"],
        calibration=calibration,
        glide_configuration=v["glide_configuration"] or None,
    )


def _read_loading(r, data):
    w = r.table(data, "weight", "weight")
    if w is None:
        return None
    r.unknown(w, KNOWN_KEYS["weight"], "weight")
    total = r.read("weight.total", w)
    empty = r.read("weight.empty", w)
    raw_items = w.get("item", [])
    if "total" in w and ("empty" in w or raw_items):
        r.problem("weight", Msg("gives both a total and a build-up"),
                  Msg("either total, or empty with [[weight.item]] tables"))
        return None
    if "total" not in w and "empty" not in w:
        r.problem("weight", Msg("gives neither a total nor an empty weight"),
                  Msg('total = "690 kg", or empty = "480 kg" plus items'))
        return None
    if not isinstance(raw_items, list) or len(raw_items) > MAX_ITEMS:
        r.problem("weight.item", Msg("must be up to {most} [[weight.item]] tables", most=str(MAX_ITEMS)),
                  value=raw_items)
        return None
    items = [_read_item(r, raw, f"weight.item[{i}]") for i, raw in enumerate(raw_items, start=1)]
    if total is None and (empty is None or None in items):
        return None
    return Loading(total=total, empty=empty, items=tuple(items))


def _read_item(r, raw, path):
    if not isinstance(raw, dict):
        r.problem(path, Msg("must be a [[weight.item]] table"), Msg("name and mass, or name and volume"), raw)
        return None
    r.unknown(raw, KNOWN_KEYS["weight.item"], path)
    name = r.read("weight.item.name", raw, f"{path}.name")
    if ("mass" in raw) == ("volume" in raw):
        r.problem(path, Msg("needs exactly one of mass or volume"), Msg('mass = "80 kg", or volume = "60 L"'))
        return None
    if "mass" in raw:
        if "density" in raw:
            r.problem(f"{path}.density", Msg("goes with a volume, but this item gives a mass"),
                      Msg("mass alone, or volume and density"), raw["density"])
        mass = r.read("weight.item.mass", raw, f"{path}.mass")
        return None if mass is None else WeightItem(name, mass)
    volume = r.read("weight.item.volume", raw, f"{path}.volume")
    density = r.read("weight.item.density", raw, f"{path}.density")
    if volume is None or ("density" in raw and density is None):
        return None
    return WeightItem(name, volume * density, volume, density)


def _read_configurations(r, data):
    raw = data.get("configuration")
    wanted = Msg("one or more [[configuration]] tables with a name and a stall_speed")
    if raw is None:
        r.problem("configuration", Msg("no configuration is given"), wanted)
        return []
    if not isinstance(raw, list) or not raw or len(raw) > MAX_CONFIGURATIONS:
        r.problem("configuration", Msg("must be 1 to {most} [[configuration]] tables", most=str(MAX_CONFIGURATIONS)),
                  wanted, raw)
        return []
    result, seen = [], set()
    for i, c in enumerate(raw, start=1):
        path = f"configuration[{i}]"
        if not isinstance(c, dict):
            r.problem(path, Msg("must be a [[configuration]] table"), wanted, c)
            continue
        r.unknown(c, KNOWN_KEYS["configuration"], path)
        v = r.read_section("configuration", c, path, extended=FLAPS if "flap_limit_speed" in c else NOTHING)
        name = v["name"]
        if name and _name_key(name) in seen:
            r.problem(f"{path}.name", Msg("is used by an earlier configuration"), Msg("a name unique in this profile"),
                      name)
        seen.add(_name_key(name))
        if "pattern_factor" in c and "pattern_speed" in c:
            r.problem(path, Msg("gives both pattern_factor and pattern_speed"), ONE_OF_THEM)
        calibration = r.calibration(c, f"{path}.calibration")
        if v["stall_speed"] is None:
            continue
        fixed = v["pattern_speed"]  # without one, the factor: the file's, else the declared default
        result.append(Configuration(name, v["stall_speed"], None if fixed is not None else v["pattern_factor"], fixed,
                                    v["flap_limit_speed"], calibration, v["extended"], v["limit_load_factor"]))
    return result


def _read_glider(r, data):
    g = r.table(data, "glider", "glider")
    if g is None:
        return None
    r.unknown(g, KNOWN_KEYS["glider"], "glider")
    weight = r.read("glider.polar_weight", g)
    raw = g.get("polar")
    wanted = Msg('at least three [speed, sink rate] points, e.g. [["80 km/h", "0.62 m/s"], ...]')
    if not isinstance(raw, list) or not 3 <= len(raw) <= MAX_POLAR_POINTS:
        r.problem("glider.polar", Msg("must be a list of {least} to {most} [speed, sink rate] points", least="3",
                                      most=str(MAX_POLAR_POINTS)), wanted, raw)
        return None
    points = r.pairs(raw, "glider.polar", (units.SPEED, SPEED_RANGE), (units.SPEED, SINK_RANGE), wanted)
    if points is None or weight is None:
        return None
    speeds, sinks = zip(*points)
    if len(set(speeds)) < 3:
        r.problem("glider.polar", Msg("needs at least three different speeds"), wanted, raw)
        return None
    return Polar(weight, tuple(speeds), tuple(sinks))


def _read_card(r, data):
    c = r.table(data, "card", "card") or {}
    r.unknown(c, KNOWN_KEYS["card"], "card")
    banks = ("bank_angles" in c and read_banks(c["bank_angles"], "card.bank_angles", r.problem)
             or profile_keys.default("card.bank_angles"))
    # the units' defaults follow rules; where a rule finds nothing, the declared default
    speed_unit = r.read("card.speed_unit", c, default=units.display_unit(_first_stall_speed(data), units.SPEED_UNITS))
    distance_unit = r.read("card.distance_unit", c, default=profile_keys.default_distance_unit(speed_unit))
    aircraft = data.get("aircraft") if isinstance(data.get("aircraft"), dict) else {}
    weight_unit = r.read("card.weight_unit", c,
                         default=units.display_unit(aircraft.get("max_weight"), units.WEIGHT_UNITS))
    buffer = r.read("card.buffer", c)
    altitude = r.read("card.pressure_altitude", c)
    temperature = r.read("card.temperature", c)
    if temperature is not None and temperature <= 0.0:
        r.problem("card.temperature", Msg("is at or below absolute zero"), Msg("a temperature above -273.15 degC"),
                  c["temperature"])
        temperature = None
    elif temperature is not None and not OAT_RANGE[0] <= temperature <= OAT_RANGE[1]:
        r.problem("card.temperature", Msg("is not an outside air temperature"), OAT_RANGE[2], c["temperature"])
        temperature = None
    elif temperature is not None and not 203.15 <= temperature <= 333.15:
        r.problem("card.temperature", Msg("is outside -70 to +60 degC; check it"), Msg("an outside air temperature"),
                  c["temperature"], WARNING,
                  plain=Msg("Temperature {temperature} °C is outside -70 to +60 °C: check the temperature of the "
                            "turn figures", temperature=Num(f"{temperature - 273.15:.0f}")))
    notes = r.read("card.notes", c)
    headings = _read_degrees(r, c, "card.turn_back_degrees", 6, lambda h: 0 < h <= 360,
                             Msg("a list of 1 to 6 heading changes in degrees, each above 0 and at most 360, "
                                 "e.g. [180, 270]"), Msg("is not a heading change"))
    reaction = r.read("card.reaction_time", c)
    language = r.read("card.language", c)
    return CardSettings(
        bank_angles_deg=banks,
        speed_unit=speed_unit,
        distance_unit=distance_unit,
        weight_unit=weight_unit,
        buffer=buffer,
        pressure_altitude=altitude,
        temperature=temperature,
        notes=notes,
        turn_back_deg=headings,
        reaction_time=reaction,
        language=language,
    )


def _read_degrees(r, c, name: str, most: int, accepted, wanted: str, refused: str) -> tuple[float, ...]:
    """A list of 1 to `most` angles [deg] (the turn back's heading changes), each `accepted`, ascending, each once;
    the declared default when the file gives none (or none that can be read). Naming each angle refused."""
    default = profile_keys.default(name)
    key = name.split(".")[1]
    if key not in c:
        return default
    raw = c[key]
    if not isinstance(raw, list) or not 1 <= len(raw) <= most:
        r.problem(name, LIST_OF_NUMBERS, wanted, raw)
        return default
    angles = []
    for i, a in enumerate(raw, start=1):
        if isinstance(a, bool) or not isinstance(a, (int, float)) or not (finite(a) and accepted(a)):
            r.problem(f"{name}[{i}]", refused, wanted, a)
            continue
        angles.append(float(a))
    return tuple(sorted(set(angles))) or default


def _first_stall_speed(data):
    configurations = data.get("configuration")
    if isinstance(configurations, list) and configurations and isinstance(configurations[0], dict):
        return configurations[0].get("stall_speed")
    return None


def _name_key(name: str) -> str:
    """What makes two configuration names the same on a card: case, character width and spacing do not count."""
    return name_key(name)


def _cross_checks(r, profile):
    """Checks that need more than one field; the ones needing flight mechanics live in `kneeboard.checks`."""
    a = profile.aircraft
    if profile.weight > a.max_weight * (1 + 1e-9):
        unit = profile.card.weight_unit
        weight = units.format_quantity(profile.weight, units.MASS, unit)
        most = units.format_quantity(a.max_weight, units.MASS, unit)
        r.problem(
            "weight", Msg("{weight} is above the maximum weight of {most}; limit loads are reduced in proportion",
                          weight=Num(weight), most=Num(most)),
            Msg("a weight at or below aircraft.max_weight"), severity=WARNING,
            plain=Msg("Card weight {weight} is above the maximum weight of {most}: limit load factors lowered in "
                      "proportion. The flight manual's weight limits govern", weight=Num(weight), most=Num(most)),
        )
    names = [c.name for c in profile.configurations]
    if a.glide_configuration is not None and name_key(a.glide_configuration) not in {name_key(n) for n in names}:
        r.problem("aircraft.glide_configuration", Msg("names no configuration of this profile"),
                  Msg("the name of one of its configurations: {names}", names=", ".join(names)), a.glide_configuration)
    if a.reference_weight > a.max_weight * (1 + 1e-9):
        r.problem("aircraft.reference_weight", Msg("is above the maximum weight"), Msg("at most aircraft.max_weight"),
                  severity=WARNING,
                  plain=Msg("The stall speeds' published weight is above the maximum weight: check both in the "
                            "flight manual"))


def _flap_checks(r, raw: list, profile) -> None:
    """A configuration that stalls slower than the clean wing has something extended; one that says neither what
    (`extended`), nor its flap limit speed, nor its own limit load factor gets the clean wing's limit load factor,
    where 14 CFR 23.345 (before amendment 23-64) gives +2.0 with the flaps extended: warned, naming it."""
    clean = [c for c in profile.configurations if c.extended == NOTHING]
    if not clean:
        return
    fastest = max(clean, key=lambda c: c.stall_speed)
    for i, (c, written) in enumerate(zip(profile.configurations, raw), start=1):
        if c.stall_speed >= fastest.stall_speed or any(
                key in written for key in ("extended", "flap_limit_speed", "limit_load_factor")):
            continue
        r.problem(f"configuration[{i}]", Msg("stalls slower than {fastest} but gives neither a flap limit speed nor "
                                             "what it extends, so its limit load factor is taken as the clean wing's",
                                             fastest=fastest.name),
                  Msg('flap_limit_speed and extended = "flaps" (or "air brakes"), its own limit_load_factor, or '
                      'extended = "nothing" when nothing is extended'), severity=WARNING,
                  plain=Msg("{name} stalls slower than {fastest} but has no flap limit speed: its limit load factor "
                            "is the clean wing's, more than flaps may allow (14 CFR 23.345: +2.0). Check its VFE and "
                            "limits", name=c.name, fastest=fastest.name))
