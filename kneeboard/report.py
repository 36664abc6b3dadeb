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

from kneeboard import units
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
MARKS = {
    "STALL": "margin 0 or less: the configuration stalls at this bank (black on the card)",
    "<buffer": "margin below the buffer (hatched on the card)",
    ">limit": "load factor at or above the configuration's limit load factor (framed on the card); in the pull and "
              "turn-back figures, a load factor or bank past that configuration's limit",
    LIMIT_MARK: "a buffer or zero-margin bank at or past the configuration's limit bank: the limit is printed in its "
                "place, not a bank to fly",
}
PAST = ">limit"  #: the mark of a figure past its configuration's limit


def _mark(row) -> str:
    marks = {STALL: "STALL", BUFFER: "<buffer"}.get(row.state, "")
    if row.over_limit:
        marks += " >limit"
    return marks.strip()


def to_csv(table: CardTable, fingerprint: str = "", made_on: str = "") -> str:
    """One table a spreadsheet opens as it is: a line per configuration and bank with the figures as the card prints
    them, each line with the card weight, then a line per warning and one for the caution (their text in `note`).

    One header, the same columns on every line, so a sort or a filter keeps each figure with its weight; a text cell
    never starts a formula (`_cell`). `csv_file` adds the byte-order mark spreadsheet programs read UTF-8 by.
    """
    out = io.StringIO()
    w = csv.writer(out, lineterminator="\r\n")  # RFC 4180
    su, du, wu = table.speed_unit, table.distance_unit, table.weight_unit
    header = ["registration", f"card_weight_{wu}", "configuration", "bank_deg", "load_factor", f"stall_speed_{su}",
              f"pattern_speed_{su}", f"margin_{su}", f"turn_radius_{du}", "time_180_s", "time_360_s",
              "zero_margin_bank_deg", "buffer_bank_deg", "limit_load_factor", "limit_bank_deg", "fingerprint", "date",
              "note"]
    w.writerow(header)
    lead = [_cell(table.registration), table.weight.text]
    tail = [_cell(fingerprint), made_on]
    for c in table.configurations:
        banks = [c.zero_margin_bank.text, _text(c.buffer_bank), c.limit_load_factor.text, c.limit_bank.text]
        for row in c.rows:
            w.writerow([*lead, _cell(c.name), row.bank_text, row.load_factor.text, row.stall_speed.text,
                        c.pattern_speed.text, row.margin.text, *_turn(row), *banks, *tail, _mark(row)])
    blank = [""] * (len(header) - len(lead) - len(tail) - 1)
    for line in (*table.warnings, CAUTION):
        w.writerow([*lead, *blank, *tail, _cell(line)])
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
    """A plain-text table for a terminal, figures as the card prints them."""
    su, du = table.speed_unit, table.distance_unit
    made = ", ".join(part for part in (f"fingerprint {fingerprint}" if fingerprint else "", made_on) if part)
    lines = [
        f"{table.registration}  {table.model}" + (f"  ({made})" if made else ""),
        f"card weight {table.weight.text} {table.weight_unit} (reference weight {table.reference_weight.text} "
        f"{table.weight_unit}){'  ABOVE MAXIMUM WEIGHT' if table.over_max_weight else ''}",
        f"limit load factor {table.limit_load_factor.text} g, limit bank {table.limit_bank.text} deg (structural, "
        "not a bank to fly)"
        + (f"; maneuvering speed VA at this weight {table.maneuvering_speed.text} {su}" if table.maneuvering_speed
           else ""),
        f"turns at pressure altitude {table.pressure_altitude.text} {du}, {table.temperature_c.text} degC, "
        f"density altitude {table.density_altitude.text} {du}; buffer {table.buffer.text} {su}",
    ]
    for c in table.configurations:
        buffer_bank = _bank_text(c.buffer_bank) if c.buffer_bank else "none (margin below buffer)"
        lines += [
            "",
            f"{c.name}: stall speed {c.stall_speed.text} {su}, pattern speed {c.pattern_speed.text} {su}, "
            f"zero-margin bank {_bank_text(c.zero_margin_bank)}, buffer bank {buffer_bank}, "
            f"limit load factor {c.limit_load_factor.text} g, limit bank {c.limit_bank.text} deg"
            + (f", flap limit speed VFE {c.flap_limit_speed.text} {su}" if c.flap_limit_speed else ""),
            _pull_line(c, su),
            f"{'bank':>5} {'n':>5} {'stall':>6} {'margin':>7} {'radius':>7} {'180':>5} {'360':>5}",
            f"{'deg':>5} {'':>5} {su:>6} {su:>7} {du:>7} {'s':>5} {'s':>5}",
        ]
        for row in c.rows:
            radius, t180, t360 = _turn(row)
            lines.append(
                f"{row.bank_text:>5} {row.load_factor.text:>5} {row.stall_speed.text:>6} {row.margin.text:>7} "
                f"{radius:>7} {t180:>5} {t360:>5}  {_mark(row)}"
            )
    if table.glider:
        g = table.glider
        lines += [
            "",
            f"circling at minimum-sink angle of attack (straight: {g.min_sink_speed.text} {su}, "
            f"sink {g.min_sink_rate.text} {table.sink_unit})",
            f"{'bank':>5} {'speed':>6} {'sink':>5} {'radius':>7} {'circle':>7} {'180 loss':>9}",
            f"{'deg':>5} {su:>6} {table.sink_unit:>5} {du:>7} {'s':>7} {du:>9}",
        ]
        for row in g.rows:
            lines.append(f"{row.bank_text:>5} {row.speed.text:>6} {row.sink_rate.text:>5} "
                         f"{_text(row.turn_radius):>7} {_text(row.circle_time):>7} {_text(row.height_loss_180):>9}")
    if table.turn_back is not None and table.turn_back.rows:
        lines += ["", *_turn_back_lines(table)]
    if table.notes:
        lines += ["", f"notes: {table.notes}"]
    lines += ["", "marks: " + "; ".join(f"{mark} {meaning}" for mark, meaning in MARKS.items())]
    lines += table.warnings
    return "\n".join(lines) + "\n"


def _bank_text(bank) -> str:
    """A configuration's bank as printed, and, at or past its limit bank, saying so in words."""
    return f"{bank.text} deg (at or past its limit bank)" if bank.past_limit else f"{bank.text} deg"


def _pull_line(c, su: str) -> str:
    """The card's pull block for one configuration: the load factor that stalls the wing at the pattern speed."""
    first = "" if c.stalls_before_limit else " (the structure's limit load comes before the stall)"
    stalls = ", ".join(f"{v.text} {su} at {n} g" + (f" {PAST}" if v.past_limit else "") for n, v in c.stall_at_load)
    return f"  pattern stalls at {c.available_load_factor.text} g wings level{first}; stall speed {stalls}"


def _turn_back_lines(table: CardTable) -> list[str]:
    """The card's turn-back block: per bank the speed to fly, its margin and the height each heading change costs."""
    tb, su, du = table.turn_back, table.speed_unit, table.distance_unit
    what = "a launch failure" if table.category == "glider" else "engine failure"
    heads = [f"{h} deg" for h in tb.headings]
    lines = [
        f"turn back after {what}: best glide {tb.best_glide_speed.text} {su} IAS, ratio {tb.glide_ratio.text}; "
        f"{tb.reaction_time.text} s of reaction: {tb.reaction_height_loss.text} {du} first; height lost in the turn "
        f"alone, least at the bank marked; gliding in {tb.clean}: margin over its stall speed, {PAST} at or past its "
        f"limit bank {tb.limit_bank.text} deg",
        f"{'bank':>5} {'speed':>6} {'margin':>7}" + "".join(f" {h:>8}" for h in heads),
        f"{'deg':>5} {su + ' IAS':>6} {su:>7}" + "".join(f" {du + ' loss':>8}" for _ in heads),
    ]
    for r in tb.rows:
        lines.append(f"{r.bank_text:>5} {r.speed.text:>6} {r.margin.text:>7}"
                     + "".join(f" {loss.text:>8}" for loss in r.height_loss)
                     + "".join(f"  {m}" for m, on in (("least", r.least), (PAST, r.past_limit)) if on))
    return lines + [CAUTION_TURN_BACK]
