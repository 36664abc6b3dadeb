"""Tables as text, CSV and JSON: the command line's output and the app's CSV export.

Text and CSV print the card's rounded figures; JSON is the stable machine interface and
carries full precision (see the README for its keys).
"""

import csv
import io
import json
import math

import numpy as np

from kneeboard import units
from kneeboard.tables import BUFFER, STALL, CardTable
from kneeboard.texts import CAUTION, CAUTION_TURN_BACK

JSON_SCHEMA = 1


def _bank(bank_rad) -> float:
    """A bank as the profile gave it [deg]: the radians' round trip leaves binary noise (29.999999999999996)."""
    return round(float(np.degrees(bank_rad)), 9)


def _opt(x):
    return None if x is None or not math.isfinite(x) else float(x)


def to_json_data(table: CardTable) -> dict:
    """The machine interface: IAS in the chosen speed unit, distances in the distance unit, full precision."""
    r = table.results
    su, du = table.speed_unit, table.distance_unit

    def spd(x):
        return _opt(None if x is None else float(units.from_si(x, units.SPEED, su)))

    def dist(x):
        return _opt(float(units.from_si(x, units.LENGTH, du)))

    configurations = []
    for c in r.configurations:
        rows = [
            {
                "bank_deg": _bank(b),
                "load_factor": float(n),
                "stall_speed": spd(vs),
                "margin": spd(m),
                "turn_radius": dist(rad),
                "turn_rate_deg_s": float(np.degrees(rate)),
            }
            for b, n, vs, m, rad, rate in zip(c.bank, c.load_factor, c.stall_speed, c.margin, c.turn_radius,
                                              c.turn_rate)
        ]
        configurations.append({
            "name": c.name,
            "stall_speed": spd(c.level_stall_speed),
            "pattern_speed": spd(c.pattern_speed),
            "zero_margin_bank_deg": float(np.degrees(c.zero_margin_bank)),
            "buffer_bank_deg": None if c.buffer_bank is None else float(np.degrees(c.buffer_bank)),
            "limit_load_factor": float(c.limit_load_factor),
            "limit_bank_deg": float(np.degrees(c.limit_bank)),
            "available_load_factor": float(c.available_load_factor),
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
        "weight_kg": float(r.weight),
        "speed_unit": su,
        "distance_unit": du,
        "over_max_weight": bool(r.over_max_weight),
        "limit_load_factor": float(r.limit_load_factor),
        "limit_bank_deg": float(np.degrees(r.limit_bank)),
        "maneuvering_speed": spd(r.maneuvering_speed),
        "configurations": configurations,
        "glider": glider,
        "turn_back": _turn_back_json(r.turn_back, spd, dist),
        "warnings": list(table.warnings),
        "caution": CAUTION,
    }


def _turn_back_json(tb, spd, dist):
    if tb is None:
        return None
    return {
        "best_glide_speed": spd(tb.best_glide_speed),
        "glide_ratio": float(tb.glide_ratio),
        "headings_deg": [float(np.degrees(h)) for h in tb.headings],
        "reaction_time_s": float(tb.reaction_time),
        "reaction_height_loss": dist(tb.reaction_height_loss),
        "rows": [{"bank_deg": _bank(b), "speed": spd(v), "margin": spd(m),
                  "height_loss": [dist(h) for h in losses]}
                 for b, v, m, losses in zip(tb.bank, tb.speed, tb.margin, tb.height_loss)],
    }


def to_json(table: CardTable) -> str:
    return json.dumps(to_json_data(table), indent=2)


#: The marks of the text and CSV tables, and what each means: the card shows them as black fill, hatching, a frame.
MARKS = {
    "STALL": "margin 0 or less: the configuration stalls at this bank (black on the card)",
    "<buffer": "margin below the buffer (hatched on the card)",
    ">limit": "load factor at or above the configuration's limit load factor (framed on the card)",
}


def _mark(row) -> str:
    marks = {STALL: "STALL", BUFFER: "<buffer"}.get(row.state, "")
    if row.over_limit:
        marks += " >limit"
    return marks.strip()


def to_csv(table: CardTable) -> str:
    """One line per configuration and bank, rounded figures as printed on the card."""
    out = io.StringIO()
    w = csv.writer(out, lineterminator="\n")
    su, du = table.speed_unit, table.distance_unit
    w.writerow(["registration", "configuration", "bank_deg", "load_factor", f"stall_speed_{su}",
                f"pattern_speed_{su}", f"margin_{su}", f"turn_radius_{du}", "time_180_s", "time_360_s", "note"])
    for c in table.configurations:
        for row in c.rows:
            turn = _turn(row)
            w.writerow([_cell(table.registration), _cell(c.name), row.bank_text, row.load_factor.text,
                        row.stall_speed.text,
                        c.pattern_speed.text, row.margin.text, *turn, _mark(row)])
    return out.getvalue()


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


def to_text(table: CardTable) -> str:
    """A plain-text table for a terminal, figures as the card prints them."""
    su, du = table.speed_unit, table.distance_unit
    lines = [
        f"{table.registration}  {table.model}",
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
        buffer_bank = f"{c.buffer_bank.text} deg" if c.buffer_bank else "none (margin below buffer)"
        lines += [
            "",
            f"{c.name}: stall speed {c.stall_speed.text} {su}, pattern speed {c.pattern_speed.text} {su}, "
            f"zero-margin bank {c.zero_margin_bank.text} deg, buffer bank {buffer_bank}, "
            f"limit load factor {c.limit_load_factor.text} g"
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


def _pull_line(c, su: str) -> str:
    """The card's pull block for one configuration: the load factor that stalls the wing at the pattern speed."""
    first = "" if c.stalls_before_limit else " (the structure's limit load comes before the stall)"
    stalls = ", ".join(f"{v.text} {su} at {n} g" for n, v in c.stall_at_load)
    return f"  pattern stalls at {c.available_load_factor.text} g wings level{first}; stall speed {stalls}"


def _turn_back_lines(table: CardTable) -> list[str]:
    """The card's turn-back block: per bank the speed to fly, its margin and the height each heading change costs."""
    tb, su, du = table.turn_back, table.speed_unit, table.distance_unit
    what = "a launch failure" if table.category == "glider" else "engine failure"
    heads = [f"{h} deg" for h in tb.headings]
    lines = [
        f"turn back after {what}: best glide {tb.best_glide_speed.text} {su} IAS, ratio {tb.glide_ratio.text}; "
        f"{tb.reaction_time.text} s of reaction: {tb.reaction_height_loss.text} {du} first; height lost in the turn "
        f"alone, least at the bank marked; margin over {tb.clean}'s stall speed",
        f"{'bank':>5} {'speed':>6} {'margin':>7}" + "".join(f" {h:>8}" for h in heads),
        f"{'deg':>5} {su + ' IAS':>6} {su:>7}" + "".join(f" {du + ' loss':>8}" for _ in heads),
    ]
    for r in tb.rows:
        lines.append(f"{r.bank_text:>5} {r.speed.text:>6} {r.margin.text:>7}"
                     + "".join(f" {loss.text:>8}" for loss in r.height_loss) + ("  least" if r.least else ""))
    return lines + [CAUTION_TURN_BACK]
