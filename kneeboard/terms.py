"""One name per idea: the words the card, the app, the command line and Compare use for each figure.

`GLOSSARY` is the table of DEVELOPERS.md ("One name per idea"), and a test holds the card, the app and the command
line's texts to it: a figure is called by its name everywhere, and the words it replaced appear nowhere. Labels of
printed figures are built here (`label(...)`), so the same figure printed by two blocks carries the same label and
Compare matches it across cards. Spelling is American throughout, as the FAA's handbooks write it.
"""

SEP = " · "  #: between the parts of a figure's label: configuration, bank, figure

# The names, as a person reads them (lower case; a heading capitalises them).
CARD_WEIGHT = "card weight"
REFERENCE_WEIGHT = "reference weight"
MAX_WEIGHT_EXCEEDED = "maximum weight (exceeded)"
PATTERN = "pattern speed"
STALL = "stall speed"
MARGIN = "margin"
BUFFER = "buffer"
BUFFER_BANK = "buffer bank"
ZERO_MARGIN_BANK = "zero-margin bank"
LOAD_FACTOR = "load factor"
LIMIT_LOAD = "limit load factor"
LIMIT_BANK = "limit bank"
VA = "maneuvering speed VA"
FLAP_LIMIT = "flap limit speed VFE"
AVAILABLE_LOAD = "available load factor"
FINGERPRINT = "fingerprint"
PRESSURE_ALTITUDE = "pressure altitude"
TEMPERATURE = "temperature"
DENSITY_ALTITUDE = "density altitude"
TURN_RADIUS = "turn radius"
TURN_TIMES = "180°/360° time"
CIRCLING = "circling"
STRAIGHT = "straight"
SPEED = "speed"
SINK = "sink rate"
CIRCLE_TIME = "circle time"
LOSS_180 = "180° height loss"
TURN_BACK = "turn back"
HEIGHT_LOSS = "height loss"
REACTION = "reaction"

#: name -> (what it is, patterns of the words it replaced, which must not come back: regular expressions).
GLOSSARY: dict[str, tuple[str, tuple[str, ...]]] = {
    CARD_WEIGHT: ("the weight the card is computed for", (r"(?i)computed for \d",)),
    REFERENCE_WEIGHT: ("the weight the flight manual's speeds are published at", (r"(?i)speeds published at",)),
    PATTERN: ("the speed flown in the pattern, IAS", (r"\bfly \d", r"(?i)approach speed factor")),
    STALL: ("the power-off stall speed, IAS, at the card weight and bank", ()),
    MARGIN: ("pattern speed minus stall speed at a bank", (r"\d+ (kt|km/h|mph) left",)),
    BUFFER: ("the least margin the pilot wants to keep", ()),
    BUFFER_BANK: ("the bank where the margin falls to the buffer", (r"(?i)buffer (left at|kept to)",)),
    ZERO_MARGIN_BANK: ("the bank where the margin runs out", (r"(?i)(no|zero) margin (at|left)",)),
    LIMIT_LOAD: ("the structure's limit load factor in this configuration at the card weight", ()),
    LIMIT_BANK: ("the bank at which a level turn reaches the limit load factor: a structural figure, "
                 "not an allowed bank", (r"(?i)reached in a level turn at",)),
    FINGERPRINT: ("eight hex digits identifying the profile's data a card was made from",
                  (r"(?i)profile [0-9A-F]{8}\b",)),
}


def label(*parts: str) -> str:
    """A figure's label from its parts: label("Flaps up", "30°", MARGIN) -> "Flaps up · 30° · margin"."""
    return SEP.join(parts)


def at_bank(bank_text: str) -> str:
    return f"{bank_text}°"
