"""The printed rows: every figure a card prints, block by block, declared once from the table builder's rounded
figures (`tables.CardTable`).

Each block's cells come from here, each carrying its figure's tag (`ops.Figure`: label, text with its unit, which
way is worse, past its configuration's limit): the card's blocks only place and draw them, the chart draws its
lines and markers at these printed values, compare and the card data read the tags back from the laid-out card,
the app's key figures show some of them, and `figures(table)` lists them all for the reports and their tests. So
what one output shows, another cannot silently lack.

A cell's text is written in the table's language ("1,41" in German: `i18n.Translator.number`); its figure's tag
keeps the figure as it is in every language (label and text in English: the identity compare matches on, and the
value the tests hold equal across languages).

Nothing here draws or measures: this module imports neither reportlab nor Qt.
"""

import functools
from dataclasses import dataclass, replace

from kneeboard import terms
from kneeboard.card.ops import FIGURE, HIGHER_IS_WORSE, LABEL, LOWER_IS_WORSE, Figure
from kneeboard.i18n import ENGLISH, Msg, Num, translator
from kneeboard.tables import BUFFER, STALL, CardTable

HATCHED, BLACK = "hatched", "black"
NO_VALUE = "–"  #: printed where a figure does not exist (no turn at 0 bank, stalled)
CIRCLING_KEY = "circling"  #: the circling block's own figures are keyed apart: a configuration may be so named


@dataclass(frozen=True)
class Cell:
    text: str
    bold: bool = False
    mark: str | None = None  #: HATCHED or BLACK background
    note: str = ""  #: a small suffix such as "!"
    role: str = FIGURE
    figure: Figure | None = None  #: the printed figure the cell shows
    framed: bool = False  #: a heavy frame: a mark of its own (the structure's limit), combinable with the others


def figure(label: str, printed, unit: str = "", worse: str | None = None, key: str = "",
           past_limit: bool | None = None) -> Figure | None:
    """The tag of a printed figure (`tables.Printed` or its text) shown with `unit`; None when nothing is printed.

    `key` tells the figure apart where its label could also be that of another (a configuration may be named like
    a block's own prefix); by default the label is the key. `past_limit` (by default the Printed figure's own flag)
    marks a figure at or past its configuration's limit.
    """
    if printed is None:
        return None
    text = printed if isinstance(printed, str) else printed.text
    if past_limit is None:
        past_limit = getattr(printed, "past_limit", False)
    # banks print as "53°"; every other unit follows its figure after a space
    return Figure(label, text + unit if unit == "°" else f"{text} {unit}".rstrip(), worse, key, past_limit)


def in_language(rows_of):
    """A function of the table's rows whose cells' texts are then written in the table's language."""

    @functools.wraps(rows_of)
    def rows(t: CardTable, *args):
        found = rows_of(t, *args)
        if t.language == ENGLISH:
            return found
        number = translator(t.language).number
        return [[replace(cell, text=number(cell.text)) for cell in row] for row in found]

    return rows


def weight_text(table: CardTable) -> str:
    return f"{table.weight.text} {table.weight_unit}"


# --- the header -----------------------------------------------------------------------------------------------


def header(t: CardTable) -> dict[str, Figure]:
    """The header's figures: the card weight, the reference weight, the maximum weight when it is exceeded."""
    out = {"weight": figure(terms.CARD_WEIGHT, weight_text(t)),
           "reference": figure(terms.REFERENCE_WEIGHT, t.reference_weight, t.weight_unit)}
    if t.over_max_weight:
        out["over"] = figure(terms.MAX_WEIGHT_EXCEEDED, t.max_weight, t.weight_unit)
    return out


# --- the margin table -----------------------------------------------------------------------------------------


def pattern(c, su: str) -> Figure:
    return figure(terms.label(c.name, terms.PATTERN), c.pattern_speed, su)


@in_language
def margin_rows(t: CardTable, configs) -> list[list[Cell]]:
    """Per bank: the bank, its load factor, and for each of `configs` its stall speed and margin (hatched under the
    buffer, black at none, framed at or past its limit load)."""
    su = t.speed_unit
    rows = []
    for i in range(len(configs[0].rows)):
        first = configs[0].rows[i]
        bank = terms.at_bank(first.bank_text)
        row = [Cell(f"{first.bank_text}°", bold=True),
               Cell(first.load_factor.text,
                    figure=figure(terms.label(bank, terms.LOAD_FACTOR), first.load_factor, "g"))]
        for c in configs:
            r = c.rows[i]
            mark = {BUFFER: HATCHED, STALL: BLACK}.get(r.state)
            row += [Cell(r.stall_speed.text, framed=r.over_limit,
                         figure=figure(terms.label(c.name, bank, terms.STALL), r.stall_speed, su, HIGHER_IS_WORSE,
                                       past_limit=r.over_limit)),
                    Cell(r.margin.text, bold=True, mark=mark, framed=r.over_limit,
                         figure=figure(terms.label(c.name, bank, terms.MARGIN), r.margin, su, LOWER_IS_WORSE,
                                       past_limit=r.over_limit))]
        rows.append(row)
    return rows


def buffer(t: CardTable) -> Figure:
    return figure(terms.BUFFER, t.buffer, t.speed_unit)


# --- the chart's legend ---------------------------------------------------------------------------------------


def chart_legend(c) -> dict[str, Figure | None]:
    """One configuration's figures in the chart's legend: its zero-margin, buffer and limit banks."""
    return {"zero": figure(terms.label(c.name, terms.ZERO_MARGIN_BANK), c.zero_margin_bank, "°", LOWER_IS_WORSE),
            "buffer": figure(terms.label(c.name, terms.BUFFER_BANK), c.buffer_bank, "°", LOWER_IS_WORSE),
            "limit": figure(terms.label(c.name, terms.LIMIT_BANK), c.limit_bank, "°", LOWER_IS_WORSE)}


def aircraft_limit_bank(t: CardTable) -> Figure:
    return figure(terms.LIMIT_BANK, t.limit_bank, "°", LOWER_IS_WORSE)


# --- limits -----------------------------------------------------------------------------------------------------


def limits_heading(t: CardTable) -> tuple[Figure | None, ...]:
    """The aircraft's limit load factor and limit bank, and VA at this weight."""
    return (figure(terms.LIMIT_LOAD, t.limit_load_factor, "g", LOWER_IS_WORSE), aircraft_limit_bank(t),
            figure(terms.VA, t.maneuvering_speed, t.speed_unit))


def _bank(bank, label: str) -> Cell:
    """A buffer or zero-margin bank: bold, or, at or past its configuration's limit bank, that limit ("≥60°") in a
    heavy frame, not bold: never read as a bank to fly."""
    return Cell(f"{bank.text}°", bold=not bank.past_limit, framed=bank.past_limit,
                figure=figure(label, bank, "°", LOWER_IS_WORSE))


@in_language
def limit_rows(t: CardTable) -> list[list[Cell]]:
    """Per configuration: stall and pattern speeds, buffer and zero-margin banks, VFE, its own limit."""
    su = t.speed_unit
    rows = []
    for c in t.configurations:
        rows.append([
            Cell(c.stall_speed.text, figure=figure(terms.label(c.name, terms.STALL), c.stall_speed, su,
                                                   HIGHER_IS_WORSE)),
            Cell(c.pattern_speed.text, bold=True, figure=pattern(c, su)),
            _bank(c.buffer_bank, terms.label(c.name, terms.BUFFER_BANK)) if c.buffer_bank
            else Cell(NO_VALUE, role=LABEL),
            _bank(c.zero_margin_bank, terms.label(c.name, terms.ZERO_MARGIN_BANK)),
            Cell(c.flap_limit_speed.text, figure=figure(terms.label(c.name, terms.FLAP_LIMIT), c.flap_limit_speed,
                                                        su))
            if c.flap_limit_speed else Cell(NO_VALUE, role=LABEL),
            Cell(f"{c.limit_load_factor.text}/{c.limit_bank.text}°",
                 figure=figure(terms.label(c.name, terms.LIMIT_LOAD),
                               f"{c.limit_load_factor.text} g / {c.limit_bank.text}°", worse=None)),
        ])
    return rows


# --- pull -----------------------------------------------------------------------------------------------------


@in_language
def pull_rows(t: CardTable) -> list[list[Cell]]:
    """Per configuration: the load factor that stalls the wing at the pattern speed ("!" where the structure's limit
    comes first), and the stall speed at each load factor (framed above its limit load)."""
    su = t.speed_unit
    rows = []
    for c in t.configurations:
        row = [Cell(f"{c.available_load_factor.text} g", bold=True, note="" if c.stalls_before_limit else "!",
                    figure=figure(terms.label(c.name, terms.AVAILABLE_LOAD), c.available_load_factor, "g"))]
        row += [Cell(v.text, framed=v.past_limit,
                     figure=figure(terms.label(c.name, Msg("{load} g", load=Num(n)), terms.STALL), v, su,
                                   HIGHER_IS_WORSE))
                for n, v in c.stall_at_load]
        rows.append(row)
    return rows


# --- turns ----------------------------------------------------------------------------------------------------


def turns_heading(t: CardTable) -> tuple[Figure, ...]:
    du = t.distance_unit
    return (figure(terms.DENSITY_ALTITUDE, t.density_altitude, du),
            figure(terms.PRESSURE_ALTITUDE, t.pressure_altitude, du),
            figure(terms.TEMPERATURE, t.temperature_c, "°C"))


@in_language
def turn_rows(t: CardTable, configs) -> list[list[Cell]]:
    """Per bank with a turn (above 0 and not stalled in every one of `configs`): radius and 180°/360° times."""
    du = t.distance_unit
    rows = []
    for i, first in enumerate(configs[0].rows):
        if first.turn_radius is None or all(c.rows[i].state == STALL for c in configs):
            continue
        bank = terms.at_bank(first.bank_text)
        row = [Cell(f"{first.bank_text}°", bold=True)]
        for c in configs:
            r = c.rows[i]
            if r.state == STALL:
                row += [Cell(NO_VALUE, role=LABEL), Cell(NO_VALUE, role=LABEL)]
            else:
                times = f"{r.time_180.text}/{r.time_360.text}"
                row += [Cell(r.turn_radius.text, figure=figure(terms.label(c.name, bank, terms.TURN_RADIUS),
                                                               r.turn_radius, du)),
                        Cell(times, figure=figure(terms.label(c.name, bank, terms.TURN_TIMES), times, "s"))]
        rows.append(row)
    return rows


# --- circling -------------------------------------------------------------------------------------------------


def _circling_tag(label, printed, unit, worse=None) -> Figure:
    # a configuration may be named "circling": the block's own figures get a key no configuration can have
    return figure(label, printed, unit, worse, key=f"{CIRCLING_KEY}\n{label}")


def circling_heading(t: CardTable) -> tuple[Figure, ...]:
    g = t.glider
    straight = terms.label(terms.CIRCLING, terms.STRAIGHT)
    return (_circling_tag(terms.label(straight, terms.SPEED), g.min_sink_speed, t.speed_unit),
            _circling_tag(terms.label(straight, terms.SINK), g.min_sink_rate, t.sink_unit, HIGHER_IS_WORSE))


@in_language
def circling_rows(t: CardTable) -> list[list[Cell]]:
    """Per bank above 0: speed, sink, radius, time per circle, height lost in 180°."""
    su, du, sink = t.speed_unit, t.distance_unit, t.sink_unit
    rows = []
    for r in t.glider.rows:
        if r.turn_radius is None:
            continue  # wings level: printed above as the straight-flight figures
        at = terms.label(terms.CIRCLING, terms.at_bank(r.bank_text))
        rows.append([
            Cell(f"{r.bank_text}°", bold=True),
            Cell(r.speed.text, bold=True, figure=_circling_tag(terms.label(at, terms.SPEED), r.speed, su)),
            Cell(r.sink_rate.text, figure=_circling_tag(terms.label(at, terms.SINK), r.sink_rate, sink,
                                                        HIGHER_IS_WORSE)),
            Cell(r.turn_radius.text, figure=_circling_tag(terms.label(at, terms.TURN_RADIUS), r.turn_radius, du)),
            Cell(r.circle_time.text, figure=_circling_tag(terms.label(at, terms.CIRCLE_TIME), r.circle_time, "s")),
            Cell(r.height_loss_180.text, figure=_circling_tag(terms.label(at, terms.LOSS_180), r.height_loss_180,
                                                              du, HIGHER_IS_WORSE)),
        ])
    return rows


# --- turn back ------------------------------------------------------------------------------------------------


def turn_back_heading(t: CardTable) -> tuple[Figure, ...]:
    tb, at = t.turn_back, terms.TURN_BACK
    return (figure(terms.label(at, terms.BEST_GLIDE), tb.best_glide_speed, t.speed_unit),
            figure(terms.label(at, terms.GLIDE_RATIO), tb.glide_ratio, "", LOWER_IS_WORSE),
            figure(terms.label(at, terms.REACTION, terms.HEIGHT_LOSS), tb.reaction_height_loss, t.distance_unit,
                   HIGHER_IS_WORSE))


@in_language
def turn_back_rows(t: CardTable) -> list[list[Cell]]:
    """Per bank: the speed to fly in the gliding turn, its margin, the height each heading change costs; the bank of
    least loss in bold, a row at or past the glide configuration's limit bank framed whole."""
    tb, at = t.turn_back, terms.TURN_BACK
    su, du = t.speed_unit, t.distance_unit
    rows = []
    for r in tb.rows:
        bank = terms.at_bank(r.bank_text)
        past = r.past_limit
        row = [Cell(f"{r.bank_text}°", bold=True, framed=past),
               Cell(r.speed.text, bold=r.least, framed=past,
                    figure=figure(terms.label(at, bank, terms.SPEED), r.speed, su, past_limit=past)),
               Cell(r.margin.text, bold=r.least, framed=past,
                    figure=figure(terms.label(at, bank, terms.MARGIN), r.margin, su, LOWER_IS_WORSE,
                                  past_limit=past))]
        for h, loss in zip(tb.headings, r.height_loss):
            row.append(Cell(loss.text, bold=r.least, framed=past,
                            figure=figure(terms.label(at, bank, Msg("{heading}° height loss", heading=Num(h))), loss,
                                          du, HIGHER_IS_WORSE, past_limit=past)))
        rows.append(row)
    return rows


# --- every printed figure -------------------------------------------------------------------------------------


def figures(t: CardTable) -> dict[str, Figure]:
    """Every figure a card with every block prints, by its identity, in print order: what the reports carry."""
    found: list[Figure | None] = list(header(t).values())
    configs = t.configurations
    found += [pattern(c, t.speed_unit) for c in configs]
    found += [cell.figure for row in margin_rows(t, configs) for cell in row]
    found.append(buffer(t))
    found += list(limits_heading(t))
    found += [cell.figure for row in limit_rows(t) for cell in row]
    found += [cell.figure for row in pull_rows(t) for cell in row]
    found += list(turns_heading(t))
    found += [cell.figure for row in turn_rows(t, configs) for cell in row]
    if t.glider is not None:
        found += list(circling_heading(t)) + [cell.figure for row in circling_rows(t) for cell in row]
    if t.turn_back is not None and t.turn_back.rows:
        found += list(turn_back_heading(t)) + [cell.figure for row in turn_back_rows(t) for cell in row]
    for c in configs:
        found += list(chart_legend(c).values())
    out: dict[str, Figure] = {}
    for f in found:
        if f is not None:
            out.setdefault(f.identity, f)
    return out
