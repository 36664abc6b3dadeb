"""The table builder: computed results turned into the figures a card prints, in the card's units.

Every figure is rounded once, conservatively (see `kneeboard.rounding`), and carries its
printed text; the card layout prints these texts and never re-rounds. Full precision stays in
`kneeboard.compute.Results` for machine output.
"""

import math
from dataclasses import dataclass

import numpy as np

from kneeboard import rounding, units
from kneeboard.aero import turns
from kneeboard.compute import Results, compute
from kneeboard.profile import Profile

OK, BUFFER, STALL = "ok", "below-buffer", "stalled"  #: row states of a configuration table
SINK_UNIT = {"m": "m/s", "ft": "kt"}  #: sink rates as a variometer in that country reads them
SPEED_STEP = 1.0  #: printed speed resolution, in the speed unit
LOAD_STEP = 0.01
SINK_STEP = 0.1
LOAD_FACTORS = (1.5, 2.0, 2.5, 3.0)  #: load factors whose stall speeds the limits block prints [-]
#: Before a bank printed as its configuration's limit bank: the figure itself lies at or past that limit, so the
#: limit is printed in its place ("≥60"), never the figure as if it were a bank to fly.
LIMIT_MARK = "≥"


@dataclass(frozen=True)
class Printed:
    """A figure as printed: the conservatively rounded number and its text.

    `past_limit`: the figure lies at or past its configuration's own limit (a bank at or past the limit bank, a
    load factor above the limit load factor). A bank so flagged holds the limit bank with `LIMIT_MARK` in its text;
    any other flagged figure keeps its text and is printed with a mark that says so.
    """

    value: float
    text: str
    past_limit: bool = False


def _up(x, step=1.0) -> Printed:
    v = rounding.up(x, step)
    return Printed(v, rounding.text(v, step))


def _down(x, step=1.0) -> Printed:
    v = rounding.down(x, step)
    return Printed(v, rounding.text(v, step))


def _finite_up(x, step=1.0) -> Printed | None:
    return _up(x, step) if math.isfinite(x) else None


@dataclass(frozen=True)
class BankRow:
    bank_deg: float
    bank_text: str
    load_factor: Printed  #: rounded up
    stall_speed: Printed  #: rounded up
    margin: Printed  #: rounded down; negative when stalled
    state: str  #: OK, BUFFER (printed margin below the printed buffer) or STALL (printed margin 0 or less)
    over_limit: bool  #: load factor above this configuration's limit load factor
    turn_radius: Printed | None  #: at the pattern speed, rounded up; None at 0 bank
    time_180: Printed | None  #: [s] rounded up
    time_360: Printed | None  #: [s] rounded up


@dataclass(frozen=True)
class ConfigurationTable:
    name: str
    stall_speed: Printed  #: wings level at the card weight, rounded up
    pattern_speed: Printed  #: rounded up; every printed margin and bank is taken from this, the speed flown
    zero_margin_bank: Printed  #: at the printed pattern speed, rounded down; at or past the limit bank: that
    #: limit, marked (`Printed.past_limit`, text "≥60")
    buffer_bank: Printed | None  #: at the printed pattern speed, rounded down, marked like the zero-margin bank;
    #: None: below the buffer wings level
    flap_limit_speed: Printed | None  #: rounded down
    limit_load_factor: Printed  #: this configuration's, at the card weight, rounded down
    limit_bank: Printed  #: its level-turn bank, rounded down
    available_load_factor: Printed  #: (Vp / Vs)^2 at the pattern speed, rounded down
    stall_at_load: tuple[tuple[str, Printed], ...]  #: (load factor text, stall speed rounded up) at LOAD_FACTORS;
    #: past_limit where the load factor is above this configuration's limit load factor
    rows: tuple[BankRow, ...]

    @property
    def stalls_before_limit(self) -> bool:
        """At the pattern speed a pull stalls the wing before the structure reaches its limit (as intended)."""
        return self.available_load_factor.value < self.limit_load_factor.value


@dataclass(frozen=True)
class GliderRow:
    bank_deg: float
    bank_text: str
    speed: Printed  #: rounded up
    sink_rate: Printed  #: rounded up, in the sink unit
    turn_radius: Printed | None
    circle_time: Printed | None  #: [s]
    height_loss_180: Printed | None  #: in the distance unit


@dataclass(frozen=True)
class GliderTable:
    min_sink_speed: Printed
    min_sink_rate: Printed
    rows: tuple[GliderRow, ...]


@dataclass(frozen=True)
class TurnBackRow:
    bank_deg: float
    bank_text: str
    speed: Printed  #: IAS to fly in the turn, rounded up
    margin: Printed  #: printed speed - the glide configuration's printed stall speed at this bank
    height_loss: tuple[Printed, ...]  #: per heading change, the turn alone, rounded up
    least: bool  #: the bank of least height loss among the card's banks
    past_limit: bool = False  #: at or past the limit bank of the configuration it glides in (`TurnBackTable.clean`)


@dataclass(frozen=True)
class TurnBackTable:
    best_glide_speed: Printed  #: IAS at 1 g at the card weight, rounded up
    glide_ratio: Printed  #: rounded down
    headings: tuple[str, ...]  #: heading changes as printed, degrees
    reaction_time: Printed  #: [s]
    reaction_height_loss: Printed  #: rounded up
    clean: str  #: the configuration the turn back glides in: its stall speed the margins, its limit bank the marks
    rows: tuple[TurnBackRow, ...]
    limit_bank: Printed | None = None  #: that configuration's limit bank, rounded down


@dataclass(frozen=True)
class Curve:
    """Stall speed against bank for the chart, at full precision in the card's speed unit (plotted, not printed)."""

    name: str
    bank_deg: np.ndarray
    stall_speed: np.ndarray
    pattern_speed: float
    zero_margin_bank_deg: float
    buffer_bank_deg: float | None


@dataclass(frozen=True)
class CardTable:
    """Everything a card prints, already rounded and in the card's units."""

    registration: str
    model: str
    category: str  #: the aircraft's category (normal, utility, acrobatic, glider)
    speed_unit: str
    distance_unit: str
    weight_unit: str
    sink_unit: str
    weight: Printed  #: card weight, rounded up
    reference_weight: Printed  #: rounded to nearest (a datum, not a safety figure)
    max_weight: Printed
    over_max_weight: bool
    buffer: Printed
    limit_load_factor: Printed
    limit_bank: Printed  #: rounded down
    maneuvering_speed: Printed | None  #: at card weight, rounded down
    pressure_altitude: Printed
    temperature_c: Printed
    density_altitude: Printed  #: rounded up to 100 ft / 50 m
    configurations: tuple[ConfigurationTable, ...]
    glider: GliderTable | None
    notes: str
    results: Results  #: full precision, for machine output
    curves: tuple[Curve, ...]  #: for the chart
    warnings: tuple[str, ...] = ()  #: every warning about this card, one line each, printed on every page
    turn_back: TurnBackTable | None = None
    language: str = "en"  #: the language its words print in (`kneeboard.i18n`); its figures are the same in all


def build(profile: Profile, weight: float | None = None, banks_deg=None, speed_unit=None,
          distance_unit=None, results: Results | None = None, warnings: tuple[str, ...] = ()) -> CardTable:
    """Turn the results of `profile` into printed figures; units default to the profile's card settings.

    `results` are those of `compute(profile)` when the caller has them already (the pipeline does, so a card runs
    the physics once); otherwise they are computed here, at `weight` [kg] and `banks_deg` if given.
    """
    if results is None:
        results = compute(profile, weight, banks_deg)
    card = profile.card
    su = speed_unit or card.speed_unit
    du = distance_unit or card.distance_unit
    wu = card.weight_unit
    sink_unit = SINK_UNIT[du]

    def spd(x):
        return float(units.from_si(x, units.SPEED, su))

    def dist(x):
        return float(units.from_si(x, units.LENGTH, du))

    def mass(x):
        return float(units.from_si(x, units.MASS, wu))

    buffer = _up(spd(card.buffer))
    configurations = tuple(_configuration(r, buffer, spd, dist, su) for r in results.configurations)
    glider = None
    if results.glider is not None:
        g = results.glider

        def sink(x):
            return float(units.from_si(x, units.SPEED, sink_unit))

        glider = GliderTable(
            min_sink_speed=_up(spd(g.min_sink_speed)),
            min_sink_rate=_up(sink(g.min_sink_rate), SINK_STEP),
            rows=tuple(
                GliderRow(
                    bank_deg=float(np.degrees(b)),
                    bank_text=_bank_text(b),
                    speed=_up(spd(v)),
                    sink_rate=_up(sink(s), SINK_STEP),
                    turn_radius=None if _bank_text(b) == "0" else _finite_up(dist(r)),  # printed level: no turn
                    circle_time=None if _bank_text(b) == "0" else _finite_up(float(t)),
                    height_loss_180=None if _bank_text(b) == "0" else _finite_up(dist(h)),
                )
                for b, v, s, r, t, h in zip(g.bank, g.speed, g.sink_rate, g.turn_radius, g.circle_time,
                                            g.height_loss_180)
            ),
        )
    alt_step = 100.0 if du == "ft" else 50.0
    return CardTable(
        registration=profile.aircraft.registration,
        model=profile.aircraft.model,
        category=profile.aircraft.category,
        speed_unit=su,
        distance_unit=du,
        weight_unit=wu,
        sink_unit=sink_unit,
        weight=_up(mass(results.weight)),
        reference_weight=Printed(rounding.nearest(mass(results.reference_weight)),
                                 rounding.text(rounding.nearest(mass(results.reference_weight)), 1)),
        max_weight=_down(mass(results.max_weight)),
        over_max_weight=results.over_max_weight,
        buffer=buffer,
        limit_load_factor=_down(results.limit_load_factor, 0.1),
        limit_bank=_down(math.degrees(results.limit_bank)),
        maneuvering_speed=None if results.maneuvering_speed is None else _down(spd(results.maneuvering_speed)),
        pressure_altitude=_up(dist(results.pressure_altitude), 1.0),
        temperature_c=Printed(round(results.temperature - 273.15), f"{round(results.temperature - 273.15):.0f}"),
        density_altitude=_up(dist(results.density_altitude), alt_step),
        configurations=configurations,
        glider=glider,
        notes=card.notes,
        results=results,
        curves=_curves(results, su),
        warnings=tuple(warnings),
        turn_back=None if results.turn_back is None else _turn_back(
            results.turn_back, configurations[results.turn_back.configuration], spd, dist, du),
        language=card.language,
    )


HEIGHT_STEP = {"ft": 10.0, "m": 5.0}  #: printed height resolution, in the distance unit


def _turn_back(tb, clean: ConfigurationTable, spd, dist, du: str) -> TurnBackTable:
    """The turn back's printed figures: speeds and heights up, the margin over the printed stall speed down."""
    step = HEIGHT_STEP[du]
    stalls = {row.bank_text: row.stall_speed for row in clean.rows}
    over = {row.bank_text: row.over_limit for row in clean.rows}
    rows, exact = [], []
    for i, b in enumerate(tb.bank):
        bank_text = _bank_text(b)
        speed = _up(spd(tb.speed[i]))
        stall = stalls.get(bank_text) or _up(spd(tb.speed[i] - tb.margin[i]))
        margin = speed.value - stall.value
        rows.append((bank_text, b, speed, Printed(margin, rounding.text(margin, SPEED_STEP)),
                     tuple(_up(dist(h), step) for h in tb.height_loss[i])))
        exact.append(float(tb.height_loss[i][0]))
    least = int(np.argmin(exact)) if exact else -1
    return TurnBackTable(
        best_glide_speed=_up(spd(tb.best_glide_speed)),
        glide_ratio=_down(tb.glide_ratio, 0.1),
        headings=tuple(f"{rounding.nearest(math.degrees(h)):.0f}" for h in tb.headings),
        reaction_time=Printed(tb.reaction_time, rounding.text(rounding.up(tb.reaction_time, 1.0), 1.0)),
        reaction_height_loss=_up(dist(tb.reaction_height_loss), step),
        clean=clean.name,
        rows=tuple(TurnBackRow(float(np.degrees(b)), text, speed, margin, heights, i == least,
                               over.get(text, False) or math.degrees(b) >= clean.limit_bank.value)
                   for i, (text, b, speed, margin, heights) in enumerate(rows)),
        limit_bank=clean.limit_bank,
    )


def _curves(results: Results, speed_unit: str) -> tuple[Curve, ...]:
    return tuple(
        Curve(
            name=c.name,
            bank_deg=results.curve_bank_deg,
            stall_speed=np.asarray(units.from_si(c.curve_stall_speed, units.SPEED, speed_unit)),
            pattern_speed=float(units.from_si(c.pattern_speed, units.SPEED, speed_unit)),
            zero_margin_bank_deg=math.degrees(c.zero_margin_bank),
            buffer_bank_deg=None if c.buffer_bank is None else math.degrees(c.buffer_bank),
        )
        for c in results.configurations
    )


def _bank_text(bank_rad: float) -> str:
    """The bank as printed: rounded down to 0.01 degree, so it never exceeds the bank the row was computed for
    (89.9999 prints 89.99, not 90), and never in exponent notation."""
    return f"{rounding.down(math.degrees(bank_rad), 0.01):.2f}".rstrip("0").rstrip(".")


def _bank_deg(stall: float, speed: float) -> float:
    """Bank [deg] where the stall speed rises to `speed`; 0 when it is there already (a printed speed may lie a
    rounding's hair under the stall speed it was taken from)."""
    bank = float(turns.bank_at_stall_speed(stall, speed))
    return math.degrees(bank) if math.isfinite(bank) else 0.0


def _configuration(r, buffer: Printed, spd, dist, speed_unit: str) -> ConfigurationTable:
    """One configuration's printed figures. Margins and banks come from the printed pattern speed, the speed the
    pilot flies: printed pattern - printed stall = printed margin on every row (stall up, so margins err low)."""
    pattern = _up(spd(r.pattern_speed))
    vp = units.to_si(pattern.value, units.SPEED, speed_unit)  # the printed figure, back in m/s
    rows = []
    for i, b in enumerate(r.bank):
        stall = _up(spd(r.stall_speed[i]))
        margin = pattern.value - stall.value
        state = STALL if margin <= 0.0 else BUFFER if margin < buffer.value else OK
        bank_text = _bank_text(b)
        level = bank_text == "0"  # a row printed as wings level shows no turn, whatever the hundredths hid
        rows.append(BankRow(
            bank_deg=float(np.degrees(b)),
            bank_text=bank_text,
            load_factor=_up(float(r.load_factor[i]), LOAD_STEP),
            stall_speed=stall,
            margin=Printed(margin, rounding.text(margin, SPEED_STEP)),
            state=state,
            over_limit=bool(r.over_limit[i]),
            turn_radius=None if level else _finite_up(dist(r.turn_radius[i])),
            time_180=None if level else _finite_up(float(r.time_180[i])),
            time_360=None if level else _finite_up(float(r.time_360[i])),
        ))
    limit_bank = _down(math.degrees(r.limit_bank))
    vb = vp - units.to_si(buffer.value, units.SPEED, speed_unit)
    buffer_bank = None
    if vb >= r.level_stall_speed:
        buffer_bank = _within(_down(_bank_deg(r.level_stall_speed, vb)), limit_bank)
    return ConfigurationTable(
        name=r.name,
        stall_speed=_up(spd(r.level_stall_speed)),
        pattern_speed=pattern,
        zero_margin_bank=_within(_down(_bank_deg(r.level_stall_speed, vp)), limit_bank),
        buffer_bank=buffer_bank,
        flap_limit_speed=None if r.flap_limit_speed is None else _down(spd(r.flap_limit_speed)),
        limit_load_factor=_down(r.limit_load_factor, 0.1),
        limit_bank=limit_bank,
        available_load_factor=_down(r.available_load_factor, 0.1),
        stall_at_load=tuple((f"{n:g}", _past(_up(spd(r.level_stall_speed * math.sqrt(n))),
                                             n > r.limit_load_factor * (1 + 1e-9))) for n in LOAD_FACTORS),
        rows=tuple(rows),
    )


def _within(bank: Printed, limit: Printed) -> Printed:
    """A bank as printed beside its configuration's limit bank: at or past it (as both print), the limit, marked.

    Both are rounded down, so a bank that prints equal to the limit is marked too: a reader cannot tell it apart."""
    if bank.value >= limit.value:
        return Printed(limit.value, LIMIT_MARK + limit.text, past_limit=True)
    return bank


def _past(printed: Printed, past: bool) -> Printed:
    return Printed(printed.value, printed.text, past_limit=True) if past else printed
