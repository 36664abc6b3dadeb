"""What the editor shows beside and inside its fields, worked out from the document and its preparation, with no
widget: the card's units, a value typed in another unit in the card's, the limit load factor a card uses when none
is given, and the value a changed way of giving the pattern speed or the weight starts from.

The editor only shows these; every figure comes from the pipeline's preparation of the open profile (`Prepared`)
and the one units registry, so what a field shows beside it is what the card computes with.
"""

from kneeboard import units
from kneeboard.aero.limits import CATEGORY_LIMIT_LOAD
from kneeboard.app.words import CATEGORY_WORDS, tr


def card_units(prepared, card: dict | None) -> tuple[str, str, str]:
    """Speed, distance and weight units of the card: the profile's as prepared, else those its `card` table names
    (only the known ones: the file may hold anything), else the declared defaults (metres with km/h, as the reader
    has it)."""
    from kneeboard.inputs import profile_keys

    if prepared.profile is not None:
        c = prepared.profile.card
        return c.speed_unit, c.distance_unit, c.weight_unit
    card = card if isinstance(card, dict) else {}

    def named(key, options, default):
        return card.get(key) if card.get(key) in options else default

    speed = named("speed_unit", units.SPEED_UNITS, profile_keys.default("card.speed_unit"))
    return (speed, named("distance_unit", units.DISTANCE_UNITS, profile_keys.default_distance_unit(speed)),
            named("weight_unit", units.WEIGHT_UNITS, profile_keys.default("card.weight_unit")))


def target_unit(kind: units.Kind, sink: bool, shown: tuple[str, str, str]) -> str | None:
    """The unit a value of `kind` is shown in beside its field on a card of units `shown`; a sink rate in the
    card's sink unit, not its speed unit."""
    from kneeboard.tables import SINK_UNIT

    speed, distance, weight = shown
    if sink:
        return SINK_UNIT.get(distance)
    return {units.SPEED.name: speed, units.MASS.name: weight, units.LENGTH.name: distance,
            units.TEMPERATURE.name: "degC"}.get(kind.name)


def converted(text: str, kind: units.Kind, unit: str | None) -> str:
    """ "= 25.4 kt" for a valid entry in another unit than the card's; "" otherwise."""
    if not unit or not isinstance(text, str) or not text.strip():
        return ""
    try:
        si = units.parse(text, kind)
    except units.QuantityError:
        return ""
    if units.display_unit(text, (unit,)) == unit:
        return ""
    value = units.from_si(si, kind, unit)
    shown = "°C" if unit == "degC" else unit
    return f"= {value:.1f} {shown}" if abs(value) < 100 else f"= {value:.0f} {shown}"


def limit_load_hint(prepared, category: str) -> str | None:
    """The limit load factor the card uses when the profile gives none: the category's (by maximum weight for the
    normal category, as computed); None for a category the program does not know."""
    if prepared.results is not None:
        n = f"{prepared.results.design_limit_load_factor:.2f}".rstrip("0").rstrip(".")
        return tr("{n} for the {category} category at this maximum weight", n=n,
                  category=tr(CATEGORY_WORDS.get(category, category)))
    if category in CATEGORY_LIMIT_LOAD:
        return tr("{n} for the {category} category", n=CATEGORY_LIMIT_LOAD[category],
                  category=tr(CATEGORY_WORDS.get(category, category)))
    return None


def pattern_speed_text(prepared, index: int, unit: str) -> str:
    """A fixed pattern speed to start from: the speed configuration `index` is printed with now."""
    table = prepared.table
    if table is not None and 0 <= index < len(table.configurations):
        return f"{table.configurations[index].pattern_speed.text} {table.speed_unit}"
    return f"70 {unit}"


def weight_text(prepared, unit: str) -> str | None:
    """The card weight as a total to start from, in `unit`; None while the profile cannot be read."""
    if prepared.profile is None:
        return None
    return units.format_quantity(prepared.profile.weight, units.MASS, unit)


def is_volume(text: str) -> bool:
    """Whether an item's amount is a volume ("60 L"): then it is fuel or water, weighed by its density."""
    try:
        units.parse(text, units.VOLUME)
        return True
    except units.QuantityError:
        return False
