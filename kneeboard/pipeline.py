"""The one way from a profile to its card: style, overrides, validation, physics once, table, layout, PDF.

Every route goes through here: `kneeboard check`, `table` and `card`, the fleet export and the app. So a profile
gives the same figures, in the same units and at the same banks, whichever way it is asked for:

1. **Style, by one rule** (`Styles`): `--style` (or the app's chosen style file) replaces everything; otherwise a
   profile inside a folder with a `fleet.style.toml` gets that style, whether it is given alone or with its
   folder; otherwise the shipped default.
2. **Style settings and overrides are written into the profile's data** (`--weight` as `weight.total`, `--bank` as
   `card.bank_angles`, the style's banks and units as the card settings) and read by the same reader with the same
   rules as the file's own values, so an override can never make a card the file itself could not. A problem an
   override causes names the override (`--weight`), not a field of the file.
3. **The physics runs once** (`compute.compute`: the card's banks and the chart's curves in one vectorised call);
   the checks that need it (`checks.physics_checks`) and the table builder read those same results.
4. The table, laid out by the one layout, drawn by the one renderer.

The fingerprint printed on a card covers everything its figures come from (`card_fingerprint`): the profile
file's data, and whatever the style or an override wrote into it (a weight given for this card, the banks, the
units). Without a style setting or an override it is the file's own fingerprint.
"""

import copy
import re
from dataclasses import dataclass, field, replace
from datetime import date
from pathlib import Path

from kneeboard import report
from kneeboard.card.style import CardStyle
from kneeboard.checks import physics_checks
from kneeboard.compute import Results, compute
from kneeboard.i18n import N_, Msg
from kneeboard.inputs import profile_keys
from kneeboard.inputs.profiles import Source, figure_data, fingerprint, read_source, source_from_text
from kneeboard.inputs.schema import profile_from_data
from kneeboard.inputs.styles import fleet_style_path, load_style
from kneeboard.problems import WARNING, Problem
from kneeboard.profile import Profile
from kneeboard.tables import CardTable, build


@dataclass(frozen=True)
class Overrides:
    """What a command line (or an export) changes for every card, as a person types it.

    Values are written into the profile's data and validated there, like the file's own values.
    """

    weight: str | None = None  #: a total weight as text, e.g. "690 kg"
    bank_angles: tuple[float, ...] | None = None  #: [deg]
    speed_unit: str | None = None
    distance_unit: str | None = None
    size: str | None = None  #: card size, replacing the style's
    landscape: bool | None = None
    language: str | None = None  #: the language of the card's words (`--language`), replacing the style's

    def styled(self, style: CardStyle) -> CardStyle:
        """The style with this run's size and orientation."""
        changes = {}
        if self.size is not None:
            changes["size"] = self.size
        if self.landscape is not None:
            changes["landscape"] = self.landscape
        return style.with_changes(**changes) if changes else style


NONE = Overrides()


class Styles:
    """The card style of each profile by the one rule, each style file read once per run.

    For cards (`cards`, the default) a style whose organization does not fit its card is refused, named at
    `organization` (`card.organization`, which measures with the card's fonts); `check` and `table` make no card and
    read styles without the card code (no fonts, no reportlab, no Qt).
    """

    def __init__(self, explicit: Path | None = None, overrides: Overrides = NONE, cards: bool = True):
        self.explicit = Path(explicit) if explicit is not None else None
        self.overrides = overrides
        self.cards = cards
        self._loaded: dict[Path | None, tuple[CardStyle | None, tuple[Problem, ...]]] = {}

    def path_for(self, profile_path: Path | None) -> Path | None:
        """The style file a profile's card uses; None for the shipped default."""
        if self.explicit is not None:
            return self.explicit
        return fleet_style_path(Path(profile_path).parent) if profile_path is not None else None

    def for_profile(self, profile_path: Path | None) -> tuple[CardStyle | None, tuple[Problem, ...]]:
        """(style or None when its file has errors, the style file's problems)."""
        key = self.path_for(profile_path)
        if key not in self._loaded:
            style, problems = load_style(key)
            if style is not None:
                style = self.overrides.styled(style)
            if self.cards:
                from kneeboard.card.organization import fitted

                # the organization must fit the card this run makes (its size and orientation included)
                style, problems = fitted(style, problems, str(style.source if style is not None else key or ""))
            self._loaded[key] = (style, tuple(problems))
        return self._loaded[key]

    def inputs(self) -> list[Path]:
        """Every style and logo file read so far: an output may never replace one."""
        found = []
        for key, (style, _) in self._loaded.items():
            if key is not None:
                found.append(key)
            if style is not None and style.logo is not None:
                found.append(style.logo)
        return found


@dataclass(frozen=True)
class Prepared:
    """One profile through the pipeline up to its printed table: everything `check`, `table` and a card need."""

    path: Path | None
    fingerprint: str  #: of what the card's figures come from (`card_fingerprint`); "" when unreadable
    style: CardStyle | None
    profile: Profile | None  #: as the card uses it (style settings and overrides applied); None on any error
    results: Results | None  #: full precision; None on any error
    table: CardTable | None  #: the printed figures; None on any error
    problems: tuple[Problem, ...]  #: the file's, the style's, the overrides' and the physics' problems
    style_problems: tuple[Problem, ...] = field(default=())
    weight_given: str | None = None  #: the weight given for this card (`Overrides.weight`), as typed

    @property
    def errors(self) -> list[Problem]:
        return [p for p in self.problems if p.is_error]

    @property
    def warnings(self) -> list[Problem]:
        return [p for p in self.problems if not p.is_error]

    @property
    def ok(self) -> bool:
        return self.table is not None


def prepare(source: Source, style: CardStyle | None, overrides: Overrides = NONE,
            style_problems: tuple[Problem, ...] = ()) -> Prepared:
    """Validate `source` with the style's settings and `overrides`, compute it once, and build its table."""
    where = str(source.path or "")
    if source.data is None:
        return Prepared(source.path, source.fingerprint, style, None, None, None, source.problems, style_problems)
    data, origins = _merged(source.data, style, overrides)
    mark = card_fingerprint(source, data, origins)
    profile, found = profile_from_data(data)
    found += placeholder_problems(source.data)
    problems = [_relabel(p, origins).in_file(where) for p in found]
    results = table = None
    if profile is not None:
        results = compute(profile)
        problems += [p.in_file(where) for p in physics_checks(profile, results) + glyph_problems(profile)]
    if style is None:
        problems += [p for p in style_problems if p.is_error]
    if any(p.is_error for p in problems):
        profile = results = None
    else:
        table = build(profile, results=results, warnings=card_warnings(problems, profile))
    return Prepared(source.path, mark, style, profile, results, table, tuple(problems), style_problems,
                    overrides.weight)


LANGUAGE = "card.language"  #: changes the card's words, never a figure: no part of its fingerprint


def card_fingerprint(source: Source, data: dict, origins: dict[str, str]) -> str:
    """The fingerprint of everything a card's figures come from: the file's data, and each value a style or an
    override wrote into it that differs from the file's own (the weight given for the card, banks, units).

    With nothing written over the file's values it is the file's own fingerprint, so a card made from the profile
    alone keeps the fingerprint `kneeboard check` prints for it.
    """
    written = {path: _at(data, path) for path in sorted(origins) if path != LANGUAGE}
    written = {path: value for path, value in written.items() if value != _at(source.data, path)}
    if not written:
        return source.fingerprint
    return fingerprint({"profile": figure_data(source.data), "written for the card": written})


def _at(data, path: str):
    """The value at a dotted path of plain data ("card.bank_angles"), or None."""
    for key in path.split("."):
        data = data.get(key) if isinstance(data, dict) else None
    return data


def prepare_file(path: Path, styles: Styles) -> Prepared:
    """Read the profile file at `path` and prepare it with its style by the one rule."""
    return prepare_source(read_source(Path(path)), styles)


def prepare_source(source: Source, styles: Styles) -> Prepared:
    """A profile file already read (`source.path` says where it is) prepared with its style by the one rule."""
    style, style_problems = styles.for_profile(source.path)
    return prepare(source, style, styles.overrides, style_problems)


def prepare_text(text: str, style: CardStyle, overrides: Overrides = NONE, path: Path | None = None) -> Prepared:
    """A profile given as text (a test, a template) through the same pipeline."""
    return prepare(source_from_text(text, path), style, overrides)


# --- the card ---------------------------------------------------------------------------------------------------


def make_card(prepared: Prepared, made_on: str | None = None):
    """The laid-out card of a prepared profile; raises LayoutError when it cannot be printed legibly."""
    from kneeboard.card import Card, layout_card

    if prepared.table is None:
        raise ValueError("a profile with errors has no card")
    _refuse_empty_card(prepared)
    layout = layout_card(prepared.table, prepared.style, prepared.fingerprint, made_on or today(),
                         card_logo(prepared.style))
    return Card(prepared.table.registration, prepared.table, layout, prepared.fingerprint, made_on or today(),
                prepared.weight_given)


def card_logo(style: CardStyle) -> bytes | None:
    """The logo a card of `style` prints, drawn from the bytes checked when the style was read (Qt for an SVG, once
    per logo); LayoutError naming `logo` when it cannot be drawn after all."""
    from kneeboard.card import LayoutError
    from kneeboard.card.logo import LogoProblem, drawn_logo

    try:
        return drawn_logo(style)
    except LogoProblem as exc:
        raise LayoutError("logo", Msg("The card style's logo {problem}; the card is not made without it.",
                                      problem=exc.args[0] if exc.args else str(exc))) from None


def _refuse_empty_card(prepared: Prepared) -> None:
    """A style whose blocks none apply to this aircraft (a glider's circling alone, for an aeroplane) would print a
    card of its caution and footer alone, and say nothing."""
    from kneeboard.card import LayoutError, blocks
    from kneeboard.card.layout import block_order

    front, back = block_order(prepared.style)
    if not any(blocks.get(name).applies(prepared.table) for name in front + back):
        listed = ", ".join(front + back) or N_("none")
        raise LayoutError("front", Msg("The card style's front and back show no block this aircraft's card can "
                                       "print (listed: {listed}); list at least one more, e.g. header, margin_table.",
                                       listed=listed))


def today() -> str:
    """The date a card is made, as printed on it."""
    return date.today().isoformat()


def card_pdf(card) -> bytes:
    """The PDF of one card: what is previewed, exported and printed."""
    from kneeboard.card import card_pdf as draw

    return draw(card)


def fleet_pdf(cards, sheet: str | None = None) -> bytes:
    """Every card in one PDF, page after page or imposed on `sheet` ("letter" | "a4")."""
    from kneeboard.card import fleet_pdf as draw

    return draw(cards, sheet)


# --- the reports ------------------------------------------------------------------------------------------------

REPORTS = {"text": report.to_text, "csv": report.to_csv, "json": report.to_json}


def report_text(prepared: Prepared, form: str, made_on: str | None = None) -> str:
    """The table as "text", "csv" or "json" (see `kneeboard.report`), with the card's fingerprint and date."""
    return REPORTS[form](prepared.table, prepared.fingerprint, made_on or today())


# --- checks of the data that are neither the reader's nor the physics' ----------------------------------------

PLACEHOLDER = Msg("is the template's placeholder, not a figure from this aircraft's flight manual")


def placeholder_problems(data: dict) -> list[Problem]:
    """Every value of a profile made from a template (it says `template = "..."`) still equal to the template's."""
    from kneeboard.shipped import template_data

    template = template_data(data.get("template")) if isinstance(data.get("template"), str) else None
    if template is None:
        return []
    found = []

    def walk(ours, theirs, path, section):
        for key, value in theirs.items():
            if key not in ours:
                continue
            here = f"{path}.{key}" if path else key
            if isinstance(value, dict):
                walk(ours[key], value, here, key if not path else section) if isinstance(ours[key], dict) else None
            elif isinstance(value, list) and value and isinstance(value[0], dict):
                if isinstance(ours[key], list):
                    for i, (a, b) in enumerate(zip(ours[key], value), start=1):
                        if isinstance(a, dict):
                            walk(a, b, f"{here}[{i}]", section or key)
            elif ours[key] == value and f"{section or key}.{key}" not in profile_keys.NOT_PLACEHOLDERS:
                found.append(Problem(here, PLACEHOLDER, Msg("this aircraft's own figure"), value, WARNING))

    for section in profile_keys.PLACEHOLDER_SECTIONS:
        if isinstance(data.get(section), (dict, list)) and section in template:
            ours, theirs = data[section], template[section]
            if isinstance(theirs, dict) and isinstance(ours, dict):
                walk(ours, theirs, section, section)
            elif isinstance(theirs, list) and isinstance(ours, list):
                for i, (a, b) in enumerate(zip(ours, theirs), start=1):
                    if isinstance(a, dict) and isinstance(b, dict):
                        walk(a, b, f"{section}[{i}]", section)
    return found


def glyph_problems(profile: Profile) -> list[Problem]:
    """Text the card prints with a character its fonts cannot draw (it prints as a box): named at its field."""
    from kneeboard.card import fonts

    texts = [("aircraft.registration", profile.aircraft.registration), ("aircraft.model", profile.aircraft.model)]
    texts += [(f"configuration[{i}].name", c.name) for i, c in enumerate(profile.configurations, start=1)]
    texts.append(("card.notes", profile.card.notes))
    found = []
    for path, text in texts:
        missing = fonts.missing(text)
        if missing:
            shown = ", ".join(missing[:8]) + (", ..." if len(missing) > 8 else "")
            found.append(Problem(path, Msg("holds characters the card's fonts cannot draw ({shown}); they print as "
                                           "{substitute}", shown=shown, substitute=fonts.substitute()),
                                 Msg("Latin, Greek or Cyrillic letters"), severity=WARNING,
                                 plain=Msg("Characters the card's fonts cannot draw print as {substitute}",
                                           substitute=fonts.substitute())))
    return found


# --- warnings as the card prints them --------------------------------------------------------------------------


def card_warnings(problems, profile: Profile) -> tuple[str, ...]:
    """The card's WARNING lines in plain words (`Problem.plain`): one per warning, the same words once with their
    count (unknown entries, unreadable characters), the template's placeholders gathered into one line.

    Each line is a `Msg`: English as text, told in the card's language where it is printed."""
    warnings = [p for p in problems if not p.is_error]
    placeholders = [p for p in warnings if p.message == PLACEHOLDER]
    counts: dict[str, list] = {}  # the English line -> [the line, how many times]
    for p in warnings:
        if p.message != PLACEHOLDER:
            line = warning_line(p, profile)
            counts.setdefault(line, [line, 0])[1] += 1
    lines = [line if n == 1 else Msg("{warning} ({n} times)", warning=line, n=n) for line, n in counts.values()]
    if placeholders:
        lines.append(Msg("WARNING placeholder values from a template, not from a flight manual ({n}): replace them "
                         "with this aircraft's figures", n=len(placeholders)))
    return tuple(lines)


def warning_line(problem: Problem, profile: Profile) -> Msg:
    """A warning as a line a pilot reads on the card: "WARNING Flaps 30: ...", no file paths or option names.

    Every warning says it in plain words (`Problem.plain`); one that does not is named by its field's label."""
    if problem.plain:
        return Msg("WARNING {warning}.", warning=problem.plain if isinstance(problem.plain, Msg) else
                   Msg(problem.plain))
    where = problem.path
    m = re.match(r"configuration\[(\d+)\](?:\.(\w+))?(.*)", where)
    if m and int(m.group(1)) <= len(profile.configurations):
        name = profile.configurations[int(m.group(1)) - 1].name
        key = m.group(2)
        declared = profile_keys.BY_PATH.get(f"configuration.{key}")
        label = declared.label.lower() if declared is not None else (key or "")
        where = f"{name}, {label}{m.group(3)}" if label else name
    elif where in profile_keys.BY_PATH:
        where = profile_keys.BY_PATH[where].label.lower()
    return Msg("WARNING {field}: {message}", field=where, message=problem.message)


# --- applying style settings and overrides to the data ------------------------------------------------------------


def _merged(data: dict, style: CardStyle | None, overrides: Overrides) -> tuple[dict, dict[str, str]]:
    """A copy of the profile's data with the style's card settings and the overrides written in.

    Returns the data and, for every path written, who wrote it (to name it in problems).
    """
    if style is None and overrides == NONE:
        return data, {}
    data = copy.deepcopy(data)
    origins: dict[str, str] = {}

    def card_setting(key: str, value, origin: str) -> None:
        card = data.get("card")
        if not isinstance(card, dict):
            card = data["card"] = {}
        card[key] = value
        origins[f"card.{key}"] = origin

    def settings(bank_angles, speed_unit, distance_unit, language, origin) -> None:
        """The card settings a style or the command line gives, in the profile's place, each with its origin."""
        if bank_angles is not None:
            card_setting("bank_angles", list(bank_angles), origin("bank_angles"))
        if speed_unit is not None:
            card_setting("speed_unit", speed_unit, origin("speed_unit"))
            if distance_unit is None and profile_keys.distance_unit_with(speed_unit):
                card_setting("distance_unit", profile_keys.distance_unit_with(speed_unit), origin("speed_unit"))
        if distance_unit is not None:
            card_setting("distance_unit", distance_unit, origin("distance_unit"))
        if language is not None:
            card_setting("language", language, origin("language"))

    if style is not None:
        settings(style.bank_angles_deg, style.speed_unit, style.distance_unit, style.language,
                 lambda key: f"the card style's {key}")
    options = {"bank_angles": "--bank", "speed_unit": "--speed-unit", "distance_unit": "--distance-unit",
               "language": "--language"}
    settings(overrides.bank_angles, overrides.speed_unit, overrides.distance_unit, overrides.language, options.get)
    if overrides.weight is not None:
        data["weight"] = {"total": overrides.weight}
        origins["weight"] = "--weight"
    return data, origins


def _relabel(problem: Problem, origins: dict[str, str]) -> Problem:
    """A problem of a value an override or the style wrote names that override."""
    for path, origin in origins.items():
        if problem.path == path or problem.path.startswith((path + ".", path + "[")):
            return replace(problem, path=f"{origin} ({problem.path})")
    return problem
