"""Tables as text, CSV and JSON: the command line's output and the app's CSV export.

Text and CSV print the card's rounded figures; JSON is the stable machine interface and
carries full precision (see the README for its keys). Each carries the card weight, the warnings and the caution,
and marks every figure the card marks as at or past its configuration's limit (`tables.Printed.past_limit`).
`fingerprint` and `made_on` are the card's (`kneeboard.pipeline`), given by the caller.
"""

import csv
import io
import json
import math

import numpy as np

from kneeboard import terms, units
from kneeboard.i18n import N_, Num, Translator, translator
from kneeboard.tables import BUFFER, LIMIT_MARK, STALL, CardTable
from kneeboard.texts import CAUTION, CAUTION_TURN_BACK

JSON_SCHEMA = 2


def _bank(bank_rad) -> float:
    """A bank as the profile gave it [deg]: the radians' round trip leaves binary noise (29.999999999999996)."""
    return round(float(np.degrees(bank_rad)), 9)


def _opt(x):
    return None if x is None or not math.isfinite(x) else float(x)


def to_json_data(table: CardTable, fingerprint: str = "", made_on: str = "") -> dict:
    """The machine interface: IAS in the chosen speed unit, distances in the distance unit, full precision."""
    r = table.results
    su, du = table.speed_unit, table.distance_unit

    def spd(x):
        return _opt(None if x is None else float(units.from_si(x, units.SPEED, su)))

    def dist(x):
        return _opt(float(units.from_si(x, units.LENGTH, du)))

    configurations = []
    for c, printed in zip(r.configurations, table.configurations):
        rows = [
            {
                "bank_deg": _bank(b),
                "load_factor": float(n),
                "stall_speed": spd(vs),
                "margin": spd(m),
                "turn_radius": dist(rad),
                "turn_rate_deg_s": float(np.degrees(rate)),
                "over_limit": bool(over),
            }
            for b, n, vs, m, rad, rate, over in zip(c.bank, c.load_factor, c.stall_speed, c.margin, c.turn_radius,
                                                    c.turn_rate, c.over_limit)
        ]
        configurations.append({
            "name": c.name,
            "stall_speed": spd(c.level_stall_speed),
            "pattern_speed": spd(c.pattern_speed),
            "zero_margin_bank_deg": float(np.degrees(c.zero_margin_bank)),
            "zero_margin_bank_past_limit": printed.zero_margin_bank.past_limit,
            "buffer_bank_deg": None if c.buffer_bank is None else float(np.degrees(c.buffer_bank)),
            "buffer_bank_past_limit": printed.buffer_bank is not None and printed.buffer_bank.past_limit,
            "limit_load_factor": float(c.limit_load_factor),
            "limit_bank_deg": float(np.degrees(c.limit_bank)),
            "available_load_factor": float(c.available_load_factor),
            "stall_at_load": [{"load_factor": float(n), "stall_speed": spd(c.level_stall_speed * math.sqrt(float(n))),
                               "past_limit": v.past_limit} for n, v in printed.stall_at_load],
            "rows": rows,
        })
    glider = None
    if r.glider is not None:
        g = r.glider
        glider = {
            "min_sink_speed": spd(g.min_sink_speed),
            "min_sink_rate_m_s": float(g.min_sink_rate),
            "rows": [
                {
                    "bank_deg": _bank(b),
                    "speed": spd(v),
                    "sink_rate_m_s": float(s),
                    "turn_radius": dist(rad),
                    "circle_time_s": _opt(float(t)),
                    "height_loss_180": dist(h),
                }
                for b, v, s, rad, t, h in zip(g.bank, g.speed, g.sink_rate, g.turn_radius, g.circle_time,
                                              g.height_loss_180)
            ],
        }
    return {
        "schema": JSON_SCHEMA,
        "registration": table.registration,
        "model": table.model,
        "fingerprint": fingerprint,
        "date": made_on,
        "weight_kg": float(r.weight),
        "speed_unit": su,
        "distance_unit": du,
        "buffer": spd(r.buffer),
        "pressure_altitude": dist(r.pressure_altitude),
        "temperature_c": float(r.temperature - 273.15),
        "density_altitude": dist(r.density_altitude),
        "over_max_weight": bool(r.over_max_weight),
        "limit_load_factor": float(r.limit_load_factor),
        "limit_bank_deg": float(np.degrees(r.limit_bank)),
        "maneuvering_speed": spd(r.maneuvering_speed),
        "configurations": configurations,
        "glider": glider,
        "turn_back": _turn_back_json(r.turn_back, table, spd, dist),
        "warnings": list(table.warnings),
        "caution": CAUTION,
    }


def _turn_back_json(tb, table: CardTable, spd, dist):
    if tb is None:
        return None
    glide = table.results.configurations[tb.configuration]
    past = [row.past_limit for row in table.turn_back.rows]
    return {
        "configuration": glide.name,
        "limit_bank_deg": float(np.degrees(glide.limit_bank)),
        "best_glide_speed": spd(tb.best_glide_speed),
        "glide_ratio": float(tb.glide_ratio),
        "headings_deg": [float(np.degrees(h)) for h in tb.headings],
        "reaction_time_s": float(tb.reaction_time),
        "reaction_height_loss": dist(tb.reaction_height_loss),
        "rows": [{"bank_deg": _bank(b), "speed": spd(v), "margin": spd(m),
                  "height_loss": [dist(h) for h in losses], "past_limit": bool(over)}
                 for b, v, m, losses, over in zip(tb.bank, tb.speed, tb.margin, tb.height_loss, past)],
    }


def to_json(table: CardTable, fingerprint: str = "", made_on: str = "") -> str:
    return json.dumps(to_json_data(table, fingerprint, made_on), indent=2)


#: The marks of the text and CSV tables, and what each means: the card shows them as black fill, hatching, a frame.
STALL_MARK, BUFFER_MARK, PAST = N_("STALL"), N_("<buffer"), N_(">limit")  #: PAST: a figure past its limit
MARKS = {
    STALL_MARK: N_("margin 0 or less: the configuration stalls at this bank (black on the card)"),
    BUFFER_MARK: N_("margin below the buffer (hatched on the card)"),
    PAST: N_("load factor at or above the configuration's limit load factor (framed on the card); in the pull and "
             "turn-back figures, a load factor or bank past that configuration's limit"),
    LIMIT_MARK: N_("a buffer or zero-margin bank at or past the configuration's limit bank: the limit is printed in "
                   "its place, not a bank to fly"),
}


def _mark(row, tr: Translator) -> str:
    marks = [tr(m) for m in ({STALL: STALL_MARK, BUFFER: BUFFER_MARK}.get(row.state),) if m]
    if row.over_limit:
        marks.append(tr(PAST))
    return " ".join(marks)


def to_csv(table: CardTable, fingerprint: str = "", made_on: str = "") -> str:
    """One table a spreadsheet opens as it is: a line per configuration and bank with the figures as the card prints
    them, each line with the card weight, then a line per warning and one for the caution (their text in `note`).

    One header, the same columns on every line, so a sort or a filter keeps each figure with its weight; a text cell
    never starts a formula (`_cell`). `csv_file` adds the byte-order mark spreadsheet programs read UTF-8 by.
    The column names are an interface, like the JSON's keys, and stay English; the figures' decimal separator, the
    marks, the warnings and the caution follow the table's language.
    """
    tr = translator(table.language)
    n = tr.number
    out = io.StringIO()
    w = csv.writer(out, lineterminator="\r\n")  # RFC 4180
    su, du, wu = table.speed_unit, table.distance_unit, table.weight_unit
    header = ["registration", f"card_weight_{wu}", "configuration", "bank_deg", "load_factor", f"stall_speed_{su}",
              f"pattern_speed_{su}", f"margin_{su}", f"turn_radius_{du}", "time_180_s", "time_360_s",
              "zero_margin_bank_deg", "buffer_bank_deg", "limit_load_factor", "limit_bank_deg", "fingerprint", "date",
              "note"]
    w.writerow(header)
    lead = [_cell(table.registration), n(table.weight.text)]
    tail = [_cell(fingerprint), made_on]
    for c in table.configurations:
        banks = [n(c.zero_margin_bank.text), n(_text(c.buffer_bank)), n(c.limit_load_factor.text),
                 n(c.limit_bank.text)]
        for row in c.rows:
            w.writerow([*lead, _cell(c.name), n(row.bank_text), n(row.load_factor.text), n(row.stall_speed.text),
                        n(c.pattern_speed.text), n(row.margin.text), *[n(x) for x in _turn(row)], *banks, *tail,
                        _mark(row, tr)])
    blank = [""] * (len(header) - len(lead) - len(tail) - 1)
    for line in (*table.warnings, CAUTION):
        w.writerow([*lead, *blank, *tail, _cell(tr(line))])
    return out.getvalue()


def csv_file(table: CardTable, fingerprint: str = "", made_on: str = "") -> str:
    """`to_csv` as a file's text: led by the byte-order mark by which spreadsheet programs know UTF-8 (a degree
    sign, a limit mark or a registration's accents would otherwise read as another encoding's characters)."""
    return "\ufeff" + to_csv(table, fingerprint, made_on)


def _cell(text: str) -> str:
    """A text cell a spreadsheet will not read as a formula: one starting with = + - @ (or a tab or carriage
    return) is led by an apostrophe, as spreadsheets expect for text (OWASP, CSV injection)."""
    return f"'{text}" if text[:1] in ("=", "+", "-", "@", "\t", "\r") else text


def _text(printed) -> str:
    return "" if printed is None else printed.text


def _turn(row) -> list[str]:
    """Radius and the 180/360 degree times as the card prints them: nothing where the configuration has stalled."""
    if row.state == STALL:
        return ["", "", ""]
    return [_text(row.turn_radius), _text(row.time_180), _text(row.time_360)]


def to_text(table: CardTable, fingerprint: str = "", made_on: str = "") -> str:
    """A plain-text table for a terminal, figures as the card prints them, in the table's language."""
    tr = translator(table.language)
    n = tr.number
    su, du, wu = table.speed_unit, table.distance_unit, table.weight_unit
    made = ", ".join(part for part in (f"{tr(terms.FINGERPRINT)} {fingerprint}" if fingerprint else "", made_on)
                     if part)
    weight = tr("card weight {weight} {unit} (reference weight {reference} {unit})", weight=table.weight, unit=wu,
                reference=table.reference_weight)
    limits = tr("limit load factor {load} g, limit bank {bank} deg (structural, not a bank to fly)",
                load=table.limit_load_factor, bank=table.limit_bank)
    if table.maneuvering_speed:
        limits += "; " + tr("maneuvering speed VA at this weight {speed} {unit}", speed=table.maneuvering_speed,
                            unit=su)
    lines = [
        f"{table.registration}  {table.model}" + (f"  ({made})" if made else ""),
        weight + ("  " + tr("ABOVE MAXIMUM WEIGHT") if table.over_max_weight else ""),
        limits,
        tr("turns at pressure altitude {pressure} {unit}, {temperature} degC, density altitude {density} {unit}; "
           "buffer {buffer} {speed_unit}", pressure=table.pressure_altitude, unit=du, temperature=table.temperature_c,
           density=table.density_altitude, buffer=table.buffer, speed_unit=su),
    ]
    heads = [tr("bank"), "n", tr("stall"), tr("margin"), tr("radius"), "180", "360"]
    for c in table.configurations:
        buffer_bank = _bank_text(c.buffer_bank, tr) if c.buffer_bank else tr("none (margin below buffer)")
        line = tr("{name}: stall speed {stall} {unit}, pattern speed {pattern} {unit}, zero-margin bank {zero}, "
                  "buffer bank {buffer}, limit load factor {load} g, limit bank {bank} deg", name=c.name,
                  stall=c.stall_speed, unit=su, pattern=c.pattern_speed, zero=_bank_text(c.zero_margin_bank, tr),
                  buffer=buffer_bank, load=c.limit_load_factor, bank=c.limit_bank)
        if c.flap_limit_speed:
            line += ", " + tr("flap limit speed VFE {speed} {unit}", speed=c.flap_limit_speed, unit=su)
        rows = [[n(row.bank_text), n(row.load_factor.text), row.stall_speed.text, row.margin.text, *_turn(row)]
                for row in c.rows]
        lines += ["", line, _pull_line(c, su, tr)]
        lines += _aligned([heads, [tr("deg"), "", su, su, du, "s", "s"]], rows, (5, 5, 6, 7, 7, 5, 5),
                          [f"  {_mark(row, tr)}" for row in c.rows])
    if table.glider:
        g = table.glider
        sink = table.sink_unit
        lines += [
            "",
            tr("circling at minimum-sink angle of attack (straight: {speed} {unit}, sink {sink} {sink_unit})",
               speed=g.min_sink_speed, unit=su, sink=g.min_sink_rate, sink_unit=sink),
        ]
        rows = [[n(row.bank_text), row.speed.text, n(row.sink_rate.text), _text(row.turn_radius),
                 _text(row.circle_time), _text(row.height_loss_180)] for row in g.rows]
        lines += _aligned([[tr("bank"), tr("speed"), tr("sink"), tr("radius"), tr("circle"), tr("180 loss")],
                           [tr("deg"), su, sink, du, "s", du]], rows, (5, 6, 5, 7, 7, 9))
    if table.turn_back is not None and table.turn_back.rows:
        lines += ["", *_turn_back_lines(table, tr)]
    if table.notes:
        lines += ["", tr("notes: {notes}", notes=table.notes)]
    lines += ["", tr("marks: {marks}", marks="; ".join(f"{tr(mark)} {tr(meaning)}" for mark, meaning in MARKS.items()))]
    lines += [tr(w) for w in table.warnings]
    return "\n".join(lines) + "\n"


def _aligned(heads: list[list[str]], rows: list[list[str]], least: tuple[int, ...],
             tails: list[str] | None = None) -> list[str]:
    """Head lines and rows of cells right-aligned in columns at least `least` wide, each column as wide as its widest
    head or cell, so a translated head that is longer than the English widens its column and never pushes the
    figures under it out of line; `tails`: text after each row (its marks)."""
    widths = [max(w, *(len(r[j]) for r in heads + rows)) for j, w in enumerate(least)]
    out = [" ".join(f"{cell:>{w}}" for cell, w in zip(r, widths)) for r in heads]
    return out + [" ".join(f"{cell:>{w}}" for cell, w in zip(r, widths)) + (tails[i] if tails else "")
                  for i, r in enumerate(rows)]


def _bank_text(bank, tr: Translator) -> str:
    """A configuration's bank as printed, and, at or past its limit bank, saying so in words."""
    if bank.past_limit:
        return tr("{bank} deg (at or past its limit bank)", bank=bank)
    return tr("{bank} deg", bank=bank)


def _pull_line(c, su: str, tr: Translator) -> str:
    """The card's pull block for one configuration: the load factor that stalls the wing at the pattern speed."""
    stalls = ", ".join(tr("{speed} {unit} at {load} g", speed=v, unit=su, load=Num(load))
                       + (f" {tr(PAST)}" if v.past_limit else "") for load, v in c.stall_at_load)
    if c.stalls_before_limit:
        return "  " + tr("pattern stalls at {load} g wings level; stall speed {stalls}", load=c.available_load_factor,
                         stalls=stalls)
    return "  " + tr("pattern stalls at {load} g wings level (the structure's limit load comes before the stall); "
                     "stall speed {stalls}", load=c.available_load_factor, stalls=stalls)


def _turn_back_lines(table: CardTable, tr: Translator) -> list[str]:
    """The card's turn-back block: per bank the speed to fly, its margin and the height each heading change costs."""
    tb, su, du = table.turn_back, table.speed_unit, table.distance_unit
    values = dict(speed=tb.best_glide_speed, unit=su, ratio=tb.glide_ratio, time=tb.reaction_time,
                  loss=tb.reaction_height_loss, distance_unit=du, configuration=tb.clean, mark=tr(PAST),
                  bank=tb.limit_bank)
    if table.category == "glider":
        first = tr("turn back after a launch failure: best glide {speed} {unit} IAS, ratio {ratio}; {time} s of "
                   "reaction: {loss} {distance_unit} first; height lost in the turn alone, least at the bank marked; "
                   "gliding in {configuration}: margin over its stall speed, {mark} at or past its limit bank {bank} "
                   "deg", **values)
    else:
        first = tr("turn back after engine failure: best glide {speed} {unit} IAS, ratio {ratio}; {time} s of "
                   "reaction: {loss} {distance_unit} first; height lost in the turn alone, least at the bank marked; "
                   "gliding in {configuration}: margin over its stall speed, {mark} at or past its limit bank {bank} "
                   "deg", **values)
    heads = [tr("{heading} deg", heading=Num(h)) for h in tb.headings]
    rows = [[tr.number(r.bank_text), r.speed.text, r.margin.text, *(loss.text for loss in r.height_loss)]
            for r in tb.rows]
    tails = ["".join(f"  {tr(m)}" for m, on in ((N_("least"), r.least), (PAST, r.past_limit)) if on) for r in tb.rows]
    lines = [first]
    lines += _aligned([[tr("bank"), tr("speed"), tr("margin"), *heads],
                       [tr("deg"), tr("{unit} IAS", unit=su), su, *[tr("{unit} loss", unit=du) for _ in heads]]],
                      rows, (5, 6, 7) + (8,) * len(heads), tails)
    return lines + [tr(CAUTION_TURN_BACK)]
