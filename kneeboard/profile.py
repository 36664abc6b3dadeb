"""Aircraft profiles: immutable data, SI floats, validated on creation by `kneeboard.inputs.schema`.

A profile holds what the flight manual publishes (stall speeds per configuration at a reference
weight, weights, limits, a glider's polar) and what the card is for (the weight flown, the bank
angles to print, units, the airfield's pressure altitude and temperature). Edits make new
objects with `dataclasses.replace`; nothing here reads files or computes flight mechanics.
"""

import unicodedata
from dataclasses import dataclass, replace

CATEGORIES = ("normal", "utility", "acrobatic", "glider")
SPEED_BASES = ("IAS", "CAS")
# The defaults of the profile's keys: each declared, with where it comes from, beside its key in
# kneeboard/inputs/profile_keys.py (the reader, the editor's placeholders and the templates' check take them there).
DEFAULT_BANKS_DEG = (0.0, 15.0, 30.0, 45.0, 60.0)
DEFAULT_PATTERN_FACTOR = 1.4  #: pattern speed / stall speed
DEFAULT_TURN_BACK_DEG = (180.0, 270.0)  #: heading changes of a turn back after an engine failure [deg]
DEFAULT_REACTION_TIME = 4.0  #: seconds of straight glide before the turn [s]
#: What a configuration has extended, for its limit load factor (14 CFR 23.345; CS 22.345).
NOTHING, FLAPS, AIR_BRAKES = "nothing", "flaps", "air brakes"
EXTENDED = (NOTHING, FLAPS, AIR_BRAKES)
AVGAS_DENSITY = 720.0  #: default density of an item given by volume [kg/m^3] (aviation gasoline, 0.72 kg/L)


@dataclass(frozen=True)
class Calibration:
    """Airspeed calibration pairs from the flight manual, both strictly ascending [m/s]."""

    ias: tuple[float, ...]
    cas: tuple[float, ...]


@dataclass(frozen=True)
class Configuration:
    """One flap/gear configuration and the speeds the manual gives for it.

    Speeds are in the profile's speed basis (IAS or CAS) [m/s] at the reference weight.
    """

    name: str
    stall_speed: float  #: power off, wings level [m/s]
    pattern_factor: float | None = DEFAULT_PATTERN_FACTOR  #: pattern speed / stall speed at card weight
    pattern_speed: float | None = None  #: fixed pattern speed [m/s], instead of the factor
    flap_limit_speed: float | None = None  #: VFE [m/s]
    calibration: Calibration | None = None  #: own table; None uses the aircraft's
    extended: str = NOTHING  #: one of EXTENDED: flaps when a VFE is given, unless the file says otherwise
    limit_load_factor: float | None = None  #: the flight manual's own limit in this configuration [-]


@dataclass(frozen=True)
class WeightItem:
    """One item of a weight build-up; fuel and water may be given by volume."""

    name: str
    mass: float  #: [kg]
    volume: float | None = None  #: [m^3] when the item was given by volume
    density: float | None = None  #: [kg/m^3] when given by volume


@dataclass(frozen=True)
class Loading:
    """The weight the card is made for: a total, or an empty weight plus items."""

    total: float | None = None  #: [kg]
    empty: float | None = None  #: [kg]
    items: tuple[WeightItem, ...] = ()

    @property
    def mass(self) -> float:
        """Total mass [kg]."""
        if self.total is not None:
            return self.total
        return (self.empty or 0.0) + sum(item.mass for item in self.items)


@dataclass(frozen=True)
class Aircraft:
    registration: str
    model: str
    category: str  #: one of CATEGORIES
    max_weight: float  #: [kg]
    reference_weight: float  #: weight the published speeds apply to [kg]
    limit_load_factor: float | None  #: positive limit manoeuvring load factor [-]; None: the category's
    maneuvering_speed: float | None = None  #: design VA [m/s], published at maneuvering_speed_weight
    maneuvering_speed_weight: float | None = None  #: weight VA is published at [kg]; None: the reference weight
    speed_basis: str = "IAS"  #: how the file's speeds are given, one of SPEED_BASES
    calibration: Calibration | None = None  #: flaps-up table, used by VA and configurations without one
    best_glide_speed: float | None = None  #: at the reference weight, in the speed basis [m/s]
    glide_ratio: float | None = None  #: best glide ratio L/D [-]
    best_glide_sink: float | None = None  #: sink rate at the best-glide speed, instead of the ratio [m/s]
    glide_configuration: str | None = None  #: the configuration the turn back glides in; None: the clean one


@dataclass(frozen=True)
class Polar:
    """A glider's measured speed polar: calibrated airspeed against sink rate [m/s]."""

    weight: float  #: weight the polar was measured at [kg]
    speeds: tuple[float, ...]
    sinks: tuple[float, ...]  #: positive downward


@dataclass(frozen=True)
class CardSettings:
    bank_angles_deg: tuple[float, ...] = DEFAULT_BANKS_DEG  #: ascending, each 0 <= b < 90
    speed_unit: str = "kt"
    distance_unit: str = "ft"
    weight_unit: str = "kg"
    buffer: float = 0.0  #: least margin the pilot wants to keep [m/s]
    pressure_altitude: float = 0.0  #: where the turn figures apply [m]
    temperature: float | None = None  #: outside air temperature [K]; None = standard
    notes: str = ""
    turn_back_deg: tuple[float, ...] = DEFAULT_TURN_BACK_DEG  #: heading changes of a turn back [deg]
    reaction_time: float = DEFAULT_REACTION_TIME  #: straight glide before the turn [s]
    language: str = "en"  #: the language the card and the reports print in (`kneeboard.i18n.LANGUAGES`)


@dataclass(frozen=True)
class Profile:
    aircraft: Aircraft
    configurations: tuple[Configuration, ...]
    card: CardSettings = CardSettings()
    loading: Loading | None = None  #: None: the card is for the reference weight
    glider: Polar | None = None

    @property
    def weight(self) -> float:
        """The weight the card is computed for [kg]."""
        return self.aircraft.reference_weight if self.loading is None else self.loading.mass

    def with_weight(self, weight: float) -> "Profile":
        """The same profile computed for another total weight [kg]."""
        return replace(self, loading=Loading(total=weight))

    def with_card(self, **changes) -> "Profile":
        return replace(self, card=replace(self.card, **changes))

    def calibration_for(self, configuration: Configuration) -> Calibration | None:
        return configuration.calibration or self.aircraft.calibration


def name_key(name: str) -> str:
    """What makes two configuration names the same on a card: case, character width and spacing do not count."""
    return " ".join(unicodedata.normalize("NFKC", name).casefold().split())
