"""One name per idea: the words the card, the app, the command line and Compare use for each figure.

Labels of printed figures are built here (`label(...)`), so the same figure printed by two blocks (the pattern speed
in the margin table and in the limits block) carries the same label, and Compare matches it across cards.
"""

SEP = " · "  #: between the parts of a figure's label: configuration, bank, figure

WEIGHT = "weight"
REFERENCE_WEIGHT = "speeds published at"
MAX_WEIGHT_EXCEEDED = "maximum weight (exceeded)"
BUFFER = "buffer"
LIMIT_LOAD = "limit load factor"
LIMIT_BANK = "limit bank"
VA = "maneuvering speed VA"
PRESSURE_ALTITUDE = "pressure altitude"
TEMPERATURE = "temperature"
DENSITY_ALTITUDE = "density altitude"
STALL = "stall"
PATTERN = "fly (pattern speed)"
BUFFER_BANK = "buffer left at"
ZERO_MARGIN_BANK = "no margin at"
FLAP_LIMIT = "flap limit"
LOAD_FACTOR = "load factor"
MARGIN = "margin"
TURN_RADIUS = "turn radius"
TURN_TIMES = "180°/360° time"
CIRCLING = "circling"
STRAIGHT = "straight"
SPEED = "speed"
SINK = "sink"
CIRCLE_TIME = "circle time"
LOSS_180 = "180° loss"


def label(*parts: str) -> str:
    """A figure's label from its parts: label("Flaps up", "30°", MARGIN) -> "Flaps up · 30° · margin"."""
    return SEP.join(parts)


def at_bank(bank_text: str) -> str:
    return f"{bank_text}°"
