"""Every field of a profile file, declared once: where it lives, what it holds, its bounds, its default and where
that default comes from, and how a person sees it.

The reader (`kneeboard.inputs.schema`) validates each value by its declaration and takes its default from it, the
known-keys check is derived from the declarations, the app's editor builds one input per declaration with its label,
placeholder (the default's words made from the default itself) and help, and tests/test_templates.py holds the
templates' comments to them. Adding a field is adding one `Field(...)` here, reading it into the profile in `schema`,
and (for a quantity the physics uses) carrying it through `compute`.
"""

from dataclasses import dataclass

from kneeboard import units
from kneeboard.i18n import LANGUAGES, N_
from kneeboard.profile import (
    AVGAS_DENSITY,
    CATEGORIES,
    DEFAULT_BANKS_DEG,
    DEFAULT_PATTERN_FACTOR,
    DEFAULT_REACTION_TIME,
    DEFAULT_TURN_BACK_DEG,
    EXTENDED,
    FLAPS,
    NOTHING,
    SPEED_BASES,
)

KT = 1852.0 / 3600.0  # [m/s]
FT = 0.3048  # [m]

# Plausible ranges [SI]: beyond them a value is a typo, not an aircraft. The lower ends also keep the ratios the
# physics takes (card weight / reference weight, ...) far from overflow.
SPEED_RANGE = (1 * KT, 600 * KT, N_("above 1 kt and at most 600 kt"))
SINK_RANGE = (0.1, 20.0, N_("above 0.1 m/s and at most 20 m/s"))
MASS_RANGE = (1.0, 600_000.0, N_("above 1 kg and at most 600,000 kg"))
ITEM_MASS_RANGE = (-1e-12, MASS_RANGE[1], N_("from 0 to 600,000 kg"))
VOLUME_RANGE = (-1e-12, 1000.0, N_("from 0 to 1,000,000 L"))
DENSITY_RANGE = (1.0, 20_000.0, N_("between 0.001 and 20 kg/L"))
BUFFER_RANGE = (-1e-12, 100 * KT, N_("from 0 to 100 kt"))
ALTITUDE_RANGE = (-2_000 * FT, 11_000.0, N_("from -2,000 ft up to the tropopause at 36,089 ft (11,000 m)"))
OAT_RANGE = (173.15, 373.15, N_("an outside air temperature from -100 to +100 degC"))  # [K]
MAX_BANK_DEG = 85.0  #: steeper than this a level turn's load factor (11.5 g) is no figure for a card

# The kinds of field, each read its own way.
TEXT, NOTES, CHOICE, QUANTITY, NUMBER, BANKS, PAIRS, ITEMS = (
    "text", "notes", "choice", "quantity", "number", "banks", "pairs", "items")


@dataclass(frozen=True)
class Field:
    """One key of a profile file."""

    section: str  #: "aircraft", "weight", "weight.item", "configuration", "glider" or "card"
    key: str
    kind: str  #: TEXT, NOTES, CHOICE, QUANTITY, NUMBER, BANKS, PAIRS or ITEMS
    label: str  #: what the editor calls it
    hint: str = ""  #: shown in an empty input, before the default's words (see `placeholder`)
    help: str = ""  #: a sentence on what it is and where it comes from
    required: bool = False
    quantity: units.Kind | None = None  #: QUANTITY: its kind
    bounds: tuple | None = None  #: QUANTITY: (low, high, wording) in SI, low exclusive; NUMBER: the same, plain;
    #: the wording (what would do, as a problem says it) marked with N_ so a problem tells it in the user's language
    limit: int = 0  #: TEXT / NOTES: most characters
    options: tuple = ()  #: CHOICE: the accepted values
    columns: tuple = ()  #: PAIRS: the two columns' names
    default: object = None  #: the value read when the key is absent (SI for a quantity); None: none, or by a rule
    default_rule: str = ""  #: a default that depends on other values, in words ("the maximum weight")
    default_source: str = ""  #: where the default comes from: a regulation, "common practice", "from memory"
    default_unit: str = ""  #: QUANTITY: the unit the default is shown in

    @property
    def path(self) -> str:
        return f"{self.section}.{self.key}"

    @property
    def default_text(self) -> str:
        """The default as a person would type it ("1.4", '"4 s"', "180, 270"); "" when there is none to show."""
        value = self.default
        if value is None:
            return ""
        if self.kind == QUANTITY:
            return f'"{units.from_si(value, self.quantity, self.default_unit):g} {self.default_unit}"'
        if self.kind == BANKS:
            return ", ".join(f"{b:g}" for b in value)
        if self.kind == NUMBER:
            return f"{value:g}"
        return str(value)

    @property
    def placeholder(self) -> str:
        """What an empty input shows: the hint, then the default ("default 1.4", "default: the maximum weight")."""
        if self.default_rule:
            said = f"default: {self.default_rule}"
        else:
            said = f"default {self.default_text}" if self.default_text else ""
        return ", ".join(part for part in (self.hint, said) if part)


FIELDS: tuple[Field, ...] = (
    # --- the aircraft, as its flight manual gives it ---
    Field("aircraft", "registration", TEXT, "Registration", "e.g. DEMO-01", required=True, limit=16,
          help="As painted on the aircraft; printed large at the top of the card."),
    Field("aircraft", "model", TEXT, "Model", "what the card calls it", required=True, limit=80),
    Field("aircraft", "category", CHOICE, "Category", options=CATEGORIES, default="normal",
          default_source="most light aeroplanes are certified in it (common practice)",
          help="Sets the limit load factor when none is given (14 CFR 23.337; CS 22.337 for gliders)."),
    Field("aircraft", "max_weight", QUANTITY, "Maximum weight", 'e.g. "750 kg" or "1650 lb"', required=True,
          quantity=units.MASS, bounds=MASS_RANGE),
    Field("aircraft", "reference_weight", QUANTITY, "Speeds published at",
          quantity=units.MASS, bounds=MASS_RANGE, default_rule="maximum weight",
          default_source="flight manuals publish stall speeds at the maximum weight (common practice)",
          help="The weight the flight manual's stall speeds apply to."),
    Field("aircraft", "limit_load_factor", NUMBER, "Limit load factor",
          bounds=(1.0, 20.0, N_("a number above 1 and at most 20, e.g. 3.8")), default_rule="by the category",
          default_source="14 CFR 23.337; CS 22.337 for gliders"),
    Field("aircraft", "maneuvering_speed", QUANTITY, "Maneuvering speed VA", "optional",
          quantity=units.SPEED, bounds=SPEED_RANGE,
          help="The design VA. At a lighter weight the card scales it down; it is never raised above this figure."),
    Field("aircraft", "maneuvering_speed_weight", QUANTITY, "VA published at",
          quantity=units.MASS, bounds=MASS_RANGE, help="The weight the flight manual gives VA for.",
          default_rule="the speeds' weight", default_source="kneeboard's choice"),
    Field("aircraft", "speed_basis", CHOICE, "Speeds given as", options=SPEED_BASES, default="IAS",
          default_source="flight manuals give indicated airspeeds (common practice)",
          help="Whether the file's speeds are indicated (IAS) or calibrated (CAS) airspeeds."),
    Field("aircraft", "calibration", PAIRS, "Calibration, flaps up", columns=("IAS", "CAS"),
          help="The flight manual's airspeed calibration table: indicated against calibrated airspeed."),
    Field("aircraft", "best_glide_speed", QUANTITY, "Best glide speed", "optional, at the reference weight",
          quantity=units.SPEED, bounds=SPEED_RANGE,
          help="The flight manual's best-glide speed, engine off, clean; with the glide ratio it gives the "
               "turn-back figures."),
    Field("aircraft", "glide_ratio", NUMBER, "Glide ratio", "e.g. 9 (or give the best-glide sink rate)",
          bounds=(2.0, 80.0, N_("a number above 2 and at most 80 (distance gained per height lost), e.g. 9"))),
    Field("aircraft", "best_glide_sink", QUANTITY, "Best-glide sink rate", 'instead of the ratio, e.g. "750 fpm"',
          quantity=units.SPEED, bounds=SINK_RANGE,
          help="The sink rate at the best-glide speed; converted to a glide ratio at that speed."),
    Field("aircraft", "glide_configuration", TEXT, "Glide configuration", limit=24,
          default_rule="the clean one", default_source="kneeboard's choice",
          help="The configuration the turn back glides in, by its name. Default: the one with nothing extended "
               "(of several, the one that stalls fastest)."),
    # --- the weight the card is for ---
    Field("weight", "total", QUANTITY, "Total", 'e.g. "690 kg"', quantity=units.MASS, bounds=MASS_RANGE),
    Field("weight", "empty", QUANTITY, "Empty weight", 'e.g. "480 kg"', quantity=units.MASS, bounds=MASS_RANGE),
    Field("weight", "item", ITEMS, "Items"),
    Field("weight.item", "name", TEXT, "Item", required=True, limit=40),
    Field("weight.item", "mass", QUANTITY, "Mass", quantity=units.MASS, bounds=ITEM_MASS_RANGE),
    Field("weight.item", "volume", QUANTITY, "Volume", quantity=units.VOLUME, bounds=VOLUME_RANGE),
    Field("weight.item", "density", QUANTITY, "Density", quantity=units.DENSITY, bounds=DENSITY_RANGE,
          default=AVGAS_DENSITY, default_unit="kg/L", default_source="aviation gasoline (from memory)",
          help="Of what a volume holds: fuel or water."),
    # --- each configuration ---
    Field("configuration", "name", TEXT, "Name", "e.g. Flaps up", required=True, limit=24),
    Field("configuration", "stall_speed", QUANTITY, "Stall speed", "power off, wings level", required=True,
          quantity=units.SPEED, bounds=SPEED_RANGE),
    Field("configuration", "pattern_factor", NUMBER, "Factor",
          bounds=(1.0, 3.0, N_("a number above 1 and at most 3 (pattern speed / stall speed), e.g. 1.4")),
          default=DEFAULT_PATTERN_FACTOR,
          default_source="common practice; FAA-H-8083-3 gives about 1.3 VSO on final",
          help="The pattern speed as a factor of the stall speed at the card weight."),
    Field("configuration", "pattern_speed", QUANTITY, "Fixed speed", 'e.g. "68 kt"', quantity=units.SPEED,
          bounds=SPEED_RANGE),
    Field("configuration", "flap_limit_speed", QUANTITY, "Flap limit VFE", "optional", quantity=units.SPEED,
          bounds=SPEED_RANGE, help="The flight manual's VFE. With the flaps extended the limit load factor is lower "
                                   "(14 CFR 23.345)."),
    Field("configuration", "calibration", PAIRS, "Calibration", columns=("IAS", "CAS"),
          help="This configuration's own calibration table; without one the flaps-up table is used."),
    Field("configuration", "extended", CHOICE, "Extended", options=EXTENDED, default=NOTHING,
          default_rule=f"{FLAPS} when a flap limit speed is given, else {NOTHING}", default_source="kneeboard's choice",
          help="Flaps (the default when a flap limit is given) or air brakes lower the limit load factor "
               "(14 CFR 23.345: +2.0 for aeroplanes; CS 22.345: +4.0 with landing flaps, +3.5 with air brakes)."),
    Field("configuration", "limit_load_factor", NUMBER, "Limit load factor",
          bounds=(1.0, 20.0, N_("a number above 1 and at most 20, e.g. 2.0")), default_rule="by the regulation",
          default_source="14 CFR 23.345; CS 22.345",
          help="The flight manual's own limit load factor in this configuration, if it gives one."),
    # --- a glider's polar ---
    Field("glider", "polar_weight", QUANTITY, "Measured at", 'e.g. "400 kg"', required=True, quantity=units.MASS,
          bounds=MASS_RANGE),
    Field("glider", "polar", PAIRS, "Polar", columns=("speed", "sink rate"),
          help="At least three measured points of the speed polar: airspeed against sink rate."),
    # --- what the card shows ---
    Field("card", "bank_angles", BANKS, "Bank angles", "degrees", default=DEFAULT_BANKS_DEG,
          default_source="kneeboard's choice"),
    Field("card", "speed_unit", CHOICE, "Speed unit", options=units.SPEED_UNITS, default="kt",
          default_rule="the unit of the first stall speed", default_source="kneeboard's choice"),
    Field("card", "distance_unit", CHOICE, "Distance unit", options=units.DISTANCE_UNITS, default="ft",
          default_rule="m with km/h, else ft", default_source="kneeboard's choice"),
    Field("card", "weight_unit", CHOICE, "Weight unit", options=units.WEIGHT_UNITS, default="kg",
          default_rule="the unit of the maximum weight", default_source="kneeboard's choice"),
    Field("card", "buffer", QUANTITY, "Buffer", 'the least margin to keep, e.g. "5 kt"', quantity=units.SPEED,
          bounds=BUFFER_RANGE, default=0.0, default_unit="kt",
          default_source="none unless one is given (kneeboard's choice)"),
    Field("card", "pressure_altitude", QUANTITY, "Pressure altitude", 'e.g. "1000 ft"', quantity=units.LENGTH,
          bounds=ALTITUDE_RANGE, default=0.0, default_unit="ft", default_source="sea level (kneeboard's choice)"),
    Field("card", "temperature", QUANTITY, "Temperature", quantity=units.TEMPERATURE,
          default_rule="standard atmosphere", default_source="ICAO standard atmosphere"),
    Field("card", "notes", NOTES, "Notes", limit=600),
    Field("card", "turn_back_degrees", BANKS, "Turn-back headings", "degrees", default=DEFAULT_TURN_BACK_DEG,
          default_source="FAA-H-8083-3 (engine failure after take-off: more than 180); 270 common practice",
          help="Heading changes of a turn back to the runway after an engine failure: more than 180 are needed."),
    Field("card", "reaction_time", QUANTITY, "Reaction time", quantity=units.TIME,
          bounds=(-1e-12, 60.0, N_("from 0 to 60 s")), default=DEFAULT_REACTION_TIME, default_unit="s",
          default_source="common practice",
          help="Seconds of straight glide before the turn back begins."),
    Field("card", "language", CHOICE, "Language", options=tuple(LANGUAGES), default="en",
          default_source="kneeboard's choice",
          help="The language the card and the reports print in (en, de, fr, es, cs, pl); figures are the same in "
               "every language. Default en."),
)

#: The sections of a profile file (tables, or arrays of tables) and the top-level keys.
SECTIONS = ("aircraft", "weight", "configuration", "glider", "card")
TOP_LEVEL = ("schema", "template") + SECTIONS  #: template: the template a new profile was made from

#: The keys whose template values are placeholders for the aircraft's own figures (the card settings are defaults).
PLACEHOLDER_SECTIONS = ("aircraft", "weight", "configuration", "glider")
NOT_PLACEHOLDERS = {"aircraft.category", "aircraft.speed_basis", "configuration.name", "configuration.pattern_factor",
                    "configuration.extended"}

BY_PATH: dict[str, Field] = {f.path: f for f in FIELDS}


def default(path: str):
    """The declared default of "section.key" (None where there is none, or it follows a rule the reader applies)."""
    return BY_PATH[path].default


def distance_unit_with(speed_unit: str | None) -> str | None:
    """The distance unit a speed unit brings along where no distance unit is given: metres with km/h; None with the
    others (the file's own distance unit stands, else the declared default). The one place this rule is written."""
    return "m" if speed_unit == "km/h" else None


def default_distance_unit(speed_unit: str) -> str:
    """The distance unit of a card in `speed_unit` whose profile names none."""
    return distance_unit_with(speed_unit) or BY_PATH["card.distance_unit"].default


def in_section(section: str) -> tuple[Field, ...]:
    return tuple(f for f in FIELDS if f.section == section)


def known_keys() -> dict[str, set[str]]:
    """Section -> the keys a file may have there ("" is the top level)."""
    known = {"": set(TOP_LEVEL)}
    for f in FIELDS:
        known.setdefault(f.section, set()).add(f.key)
    return known


def field(path: str) -> Field:
    """The declaration of "section.key" (an indexed path "configuration[2].name" finds "configuration.name")."""
    import re

    return BY_PATH[re.sub(r"\[\d+\]", "", path)]
