"""One name per idea: the words the card, the app, the command line and Compare use for each figure.

`TERMS` is the table of DEVELOPERS.md ("One name per idea"): for each name, the words a person meets for it in the
profile file, on the card, and in the app and the command line (`markdown_table()` prints it). `GLOSSARY` adds the
words each name replaced, and a test (tests/test_docs.py) holds the card, the app and the command line's texts to
it: a figure is called by its name everywhere, and the words it replaced appear nowhere. Labels of printed figures
are built here (`label(...)`), so the same figure printed by two blocks carries the same label and Compare matches it
across cards. Spelling is American throughout, as the FAA's handbooks write it.
"""

from dataclasses import dataclass

from kneeboard.i18n import N_, Label, Num

SEP = " · "  #: between the parts of a figure's label: configuration, bank, figure

# The names, as a person reads them (lower case; a heading capitalises them). Each is a `Word`: its English text
# is what the code compares and matches on; a card in another language shows its catalogue's translation.
CARD_WEIGHT = N_("card weight")
REFERENCE_WEIGHT = N_("reference weight")
MAX_WEIGHT_EXCEEDED = N_("maximum weight (exceeded)")
PATTERN = N_("pattern speed")
STALL = N_("stall speed")
MARGIN = N_("margin")
BUFFER = N_("buffer")
BUFFER_BANK = N_("buffer bank")
ZERO_MARGIN_BANK = N_("zero-margin bank")
LOAD_FACTOR = N_("load factor")
LIMIT_LOAD = N_("limit load factor")
LIMIT_BANK = N_("limit bank")
VA = N_("maneuvering speed VA")
FLAP_LIMIT = N_("flap limit speed VFE")
AVAILABLE_LOAD = N_("available load factor")
FINGERPRINT = N_("fingerprint")
PRESSURE_ALTITUDE = N_("pressure altitude")
TEMPERATURE = N_("temperature")
DENSITY_ALTITUDE = N_("density altitude")
TURN_RADIUS = N_("turn radius")
TURN_TIMES = N_("180°/360° time")
CIRCLING = N_("circling")
STRAIGHT = N_("straight")
SPEED = N_("speed")
SINK = N_("sink rate")
CIRCLE_TIME = N_("circle time")
LOSS_180 = N_("180° height loss")
TURN_BACK = N_("turn back")
HEIGHT_LOSS = N_("height loss")
REACTION = N_("reaction")

BEST_GLIDE = N_("best glide speed")
GLIDE_RATIO = N_("glide ratio")


@dataclass(frozen=True)
class Term:
    """One idea and the words for it in each place a person meets it.

    Every string in `file_keys`, `card` and `app` is written exactly as it appears there (a test finds each one in
    the profile fields, on the sample cards, in the command line's output and the editor's labels), so the table in
    DEVELOPERS.md cannot promise a word the program does not use.
    """

    name: str  #: the one name (a constant above)
    idea: str  #: what it is, in a sentence
    file_keys: tuple[str, ...] = ()  #: the profile keys that give it; () when it is computed
    card: tuple[str, ...] = ()  #: the words the card prints for it
    app: tuple[str, ...] = ()  #: the words the app's editor and the command line (text, CSV, JSON, help) use


TERMS: tuple[Term, ...] = (
    Term(CARD_WEIGHT, "the weight the card is computed for", ("weight.total", "weight.empty", "weight.item"),
         ("card weight", "LIMITS AT"), ("card weight", "--weight", "weight_kg")),
    Term(REFERENCE_WEIGHT, "the weight the flight manual's speeds are published at", ("aircraft.reference_weight",),
         ("reference weight",), ("reference weight",)),
    Term(MAX_WEIGHT_EXCEEDED, "a card weight above the maximum weight: limit loads are reduced in proportion",
         ("aircraft.max_weight",), ("ABOVE THE MAXIMUM WEIGHT OF",),
         ("Maximum weight", "ABOVE MAXIMUM WEIGHT", "over_max_weight")),
    Term(PATTERN, "the speed flown in the pattern, IAS",
         ("configuration.pattern_factor", "configuration.pattern_speed"),
         ("pattern", "TURNS AT PATTERN SPEED"), ("pattern speed", "pattern_speed")),
    Term(STALL, "the power-off stall speed, IAS, at the card weight and bank", ("configuration.stall_speed",),
         ("stall", "stall speed"), ("Stall speed", "stall speed", "stall_speed")),
    Term(MARGIN, "pattern speed minus stall speed at a bank", (), ("margin",), ("margin",)),
    Term(BUFFER, "the least margin the pilot wants to keep", ("card.buffer",), ("buffer",), ("Buffer", "buffer")),
    Term(BUFFER_BANK, "the bank where the margin falls to the buffer", (), ("buffer bank",),
         ("buffer bank", "buffer_bank_deg")),
    Term(ZERO_MARGIN_BANK, "the bank where the margin runs out", (), ("zero-margin", "zero-margin bank"),
         ("zero-margin bank", "zero_margin_bank_deg")),
    Term(LOAD_FACTOR, "1 / cos(bank) in a level, coordinated turn", (), ("load",), ("load_factor",)),
    Term(LIMIT_LOAD, "the structure's limit load factor in this configuration at the card weight",
         ("aircraft.category", "aircraft.limit_load_factor", "configuration.extended",
          "configuration.limit_load_factor"),
         ("limit load factor", "limit g / bank"), ("Limit load factor", "limit load factor", "limit_load_factor")),
    Term(LIMIT_BANK, "the bank at which a level turn reaches the limit load factor: a structural figure, not an "
         "allowed bank", (), ("limit bank",), ("limit bank", "limit_bank_deg")),
    Term(VA, "the design maneuvering speed, IAS, at the card weight, never above the published VA",
         ("aircraft.maneuvering_speed", "aircraft.maneuvering_speed_weight"), ("VA at this weight",),
         ("Maneuvering speed VA", "maneuvering speed VA", "maneuvering_speed")),
    Term(FLAP_LIMIT, "the flap extended speed limit, IAS", ("configuration.flap_limit_speed",), ("VFE",),
         ("Flap limit VFE", "flap limit speed VFE")),
    Term(AVAILABLE_LOAD, "the load factor that stalls the wing at the pattern speed, wings level: (Vp / Vs)^2", (),
         ("pattern stalls at",), ("available_load_factor",)),
    Term(FINGERPRINT, "eight hex digits identifying the profile's data a card was made from", (), ("fingerprint",),
         ("fingerprint",)),
    Term(PRESSURE_ALTITUDE, "where the turn figures apply", ("card.pressure_altitude",), ("pressure altitude",),
         ("Pressure altitude", "pressure altitude")),
    Term(TEMPERATURE, "the outside air temperature there (default: the standard atmosphere's)", ("card.temperature",),
         ("°C",), ("Temperature", "degC")),
    Term(DENSITY_ALTITUDE, "the standard-atmosphere altitude of the air's density", (), ("density altitude",),
         ("density altitude",)),
    Term(TURN_RADIUS, "radius of a level turn at the true airspeed", (), ("radius",), ("radius", "turn_radius")),
    Term(TURN_TIMES, "seconds for a heading change of 180 and of 360 degrees", (), ("180°/360° s",),
         ("time_180_s", "time_360_s")),
    Term(CIRCLING, "a glider circling at the minimum-sink angle of attack", ("glider.polar", "glider.polar_weight"),
         ("CIRCLING AT MINIMUM SINK",), ("circling at minimum-sink angle of attack", "glider")),
    Term(STRAIGHT, "wings level, at the same angle of attack", (), ("straight flight",), ("straight:",)),
    Term(SPEED, "the IAS flown in a turn at one angle of attack (circling, turn back)", (), ("speed kt IAS",),
         ("speed",)),
    Term(SINK, "true sink rate", ("aircraft.best_glide_sink",), ("sink",), ("sink", "sink_rate_m_s")),
    Term(CIRCLE_TIME, "seconds for a full circle", (), ("circle s",), ("circle", "circle_time_s")),
    Term(LOSS_180, "height a circling glider loses turning through 180 degrees", (), ("180° loss",),
         ("180 loss", "height_loss_180")),
    Term(TURN_BACK, "the gliding turn back to the runway after an engine (or launch) failure",
         ("card.turn_back_degrees",), ("TURN BACK AFTER ENGINE FAILURE",), ("Turn-back headings", "turn_back")),
    Term(HEIGHT_LOSS, "height lost in the gliding turn, the turn alone", (), ("loss", "Height lost in the turn"),
         ("height_loss",)),
    Term(REACTION, "seconds of straight glide before the turn back begins", ("card.reaction_time",),
         ("of reaction",), ("Reaction time", "reaction_time_s", "reaction_height_loss")),
    Term(BEST_GLIDE, "the flight manual's best-glide speed, engine off, clean", ("aircraft.best_glide_speed",),
         ("best glide",), ("Best glide speed", "best_glide_speed")),
    Term(GLIDE_RATIO, "distance gained per height lost at best glide",
         ("aircraft.glide_ratio", "aircraft.best_glide_sink"),
         ("ratio",), ("Glide ratio", "glide_ratio")),
)

#: name -> patterns of the words it replaced, which must not come back (regular expressions).
REPLACED: dict[str, tuple[str, ...]] = {
    CARD_WEIGHT: (r"(?i)computed for \d",),
    REFERENCE_WEIGHT: (r"(?i)speeds published at",),
    PATTERN: (r"\bfly \d", r"(?i)approach speed factor"),
    MARGIN: (r"\d+ (kt|km/h|mph) left",),
    BUFFER_BANK: (r"(?i)buffer (left at|kept to)",),
    ZERO_MARGIN_BANK: (r"(?i)(no|zero) margin (at|left)",),
    LIMIT_BANK: (r"(?i)reached in a level turn at",),
    FINGERPRINT: (r"(?i)profile [0-9A-F]{8}\b",),
}

#: name -> (what it is, patterns of the words it replaced, which must not come back: regular expressions).
GLOSSARY: dict[str, tuple[str, tuple[str, ...]]] = {t.name: (t.idea, REPLACED.get(t.name, ())) for t in TERMS}


def _code(text: str) -> str:
    return "`" + text.replace("|", "\\|") + "`"  # a bar inside a table cell is escaped, even in code


def _cell(words: tuple[str, ...]) -> str:
    return ", ".join(_code(w) for w in words) if words else "(computed)"


def markdown_table() -> str:
    """The table of DEVELOPERS.md, "One name per idea" (print it with `python -m kneeboard.terms`)."""
    lines = ["| idea | file key | on the card | in the app and command line |", "|---|---|---|---|"]
    for t in TERMS:
        lines.append(f"| **{t.name}**: {t.idea} | {_cell(t.file_keys)} | {_cell(t.card)} | {_cell(t.app)} |")
    lines += ["", "| name | replaced words (regular expressions that must not come back) |", "|---|---|"]
    for name, patterns in REPLACED.items():
        lines.append(f"| {name} | {', '.join(_code(p) for p in patterns)} |")
    return "\n".join(lines) + "\n"


def label(*parts: str) -> Label:
    """A figure's label from its parts: label("Flaps up", "30°", MARGIN) -> "Flaps up · 30° · margin".

    Its English text is the figure's identity in every language (what compare matches on); the parts stay with it,
    so a card in another language shows its words (the `Word`s, `Msg`s) translated and the names as written."""
    return Label(parts, SEP)


def at_bank(bank_text: str) -> Num:
    """A bank as a label's part ("30°"); a decimal bank is written with the label's language's separator."""
    return Num(f"{bank_text}°")


if __name__ == "__main__":
    print(markdown_table(), end="")
