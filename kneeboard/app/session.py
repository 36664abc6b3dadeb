"""What the app works on, without a widget: the fleet folder, the card style by the one rule, the open profile
through the pipeline, and the figures of the cards this session printed.

The controller (`app.controller.Controller`) works through a `Session`, and so do its tests, without any window.
Every figure the app shows comes from `kneeboard.pipeline`, exactly as the command line gets it: the same style rule
(`Styles`: a chosen style file, else the folder's `fleet.style.toml`, else the shipped default), the same
validation, the same card.
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path
from typing import TYPE_CHECKING

from kneeboard import registrations

if TYPE_CHECKING:  # the pipeline loads numpy, pint and the card package: at the first profile, not at start-up
    from kneeboard.card.ops import Figure
    from kneeboard.inputs.profiles import Source
    from kneeboard.pipeline import Prepared, Styles

UNTITLED = "untitled.toml"  #: the name a new profile's style is looked up by, in the open folder


@dataclass(frozen=True)
class Printed:
    """A card as it left the app (exported or printed): what it printed, and where it went."""

    figures: dict[str, Figure]
    made_on: str
    fingerprint: str
    where: str  #: the file written, or "the printer"
    weight_given: str | None = None  #: the weight the card was made for, when one was given for it ("1985 lb")


class Session:
    def __init__(self) -> None:
        self.folder: Path | None = None
        self.style_file: Path | None = None  #: chosen by the person; None: by the one rule
        self._styles: Styles | None = None
        self.printed: dict[str, Printed] = {}  #: registration (`registrations.key`) -> the card last printed here

    # --- the fleet and its style ------------------------------------------------------------------
    def use_folder(self, folder: Path | None) -> None:
        self.folder = Path(folder) if folder is not None else None
        self.reload_styles()

    def use_style_file(self, path: Path | None) -> None:
        """Use one style file for every card (None: back to the folder's style or the default)."""
        self.style_file = Path(path) if path is not None else None
        self.reload_styles()

    def reload_styles(self) -> None:
        """Forget the styles read so far (a style file was edited)."""
        self._styles = None

    @property
    def styles(self) -> Styles:
        """The style of each profile by the one rule, each style file read once until `reload_styles`."""
        if self._styles is None:
            from kneeboard.pipeline import Styles

            self._styles = Styles(self.style_file)
        return self._styles

    def style_path(self, profile_path: Path | None = None) -> Path | None:
        """The style file the open profile's card uses (None: the shipped default)."""
        return self.styles.path_for(self._style_key(profile_path))

    def fleet_style_file(self) -> Path | None:
        """Where the open folder's style is (or would be) saved."""
        from kneeboard.inputs.styles import FLEET_STYLE

        return self.folder / FLEET_STYLE if self.folder is not None else None

    def style_for(self, profile_path: Path | None = None):
        """(style or None when its file has errors, the style file's problems)."""
        return self.styles.for_profile(self._style_key(profile_path))

    def _style_key(self, profile_path: Path | None) -> Path | None:
        if profile_path is not None:
            return Path(profile_path)
        return self.folder / UNTITLED if self.folder is not None else None

    # --- a profile through the pipeline ---------------------------------------------------------------
    def prepare_source(self, source: Source, weight: str | None = None) -> Prepared:
        """`source` through the pipeline with its style; at `weight` (as typed) instead of its own when given."""
        from kneeboard.pipeline import NONE, Overrides, prepare

        style, style_problems = self.style_for(source.path)
        overrides = NONE if weight is None else Overrides(weight=weight)
        return prepare(source, style, overrides, style_problems=style_problems)

    def prepare_plain(self, data: dict, path: Path | None = None, weight: str | None = None) -> Prepared:
        from kneeboard.inputs.profiles import source_from_plain

        return self.prepare_source(source_from_plain(data, path), weight)

    def prepare_text(self, text: str, path: Path | None = None) -> Prepared:
        from kneeboard.inputs.profiles import source_from_text

        return self.prepare_source(source_from_text(text, path))

    @staticmethod
    def card(prepared: Prepared, made_on: str | None = None):
        """The laid-out card (raises LayoutError when it cannot be printed legibly)."""
        from kneeboard.pipeline import make_card

        return make_card(prepared, made_on)

    # --- what was printed -----------------------------------------------------------------------------
    def remember_printed(self, card, where: str) -> Printed:
        printed = Printed(card.figures(), card.made_on, card.fingerprint, where, card.weight_given)
        self.printed[registrations.key(card.registration)] = printed
        return printed

    def remember_printed_data(self, data: dict, where: str) -> Printed:
        """A card read back from its PDF (`kneeboard.card.data`)."""
        from kneeboard.card.data import figures_of

        given = data.get("weight_given")
        printed = Printed(figures_of(data), str(data.get("made_on", "")), str(data.get("fingerprint", "")), where,
                          given if isinstance(given, str) and given else None)
        self.printed[registrations.key(str(data.get("registration", "")))] = printed
        return printed

    def last_printed(self, registration: str) -> Printed | None:
        return self.printed.get(registrations.key(registration))

    def changes_since_printed(self, printed: Printed, prepared: Prepared):
        """Every printed figure that reads differently on the card `prepared` makes now."""
        from kneeboard.compare import compare_figures

        return compare_figures(printed.figures, self.card(prepared).figures())
