"""The app's flows without a widget: the open profile, its files, the fleet's checks and the card's renders.

The window shows a `Controller` and wires its menus to it; tests drive one without any window. It asks a person
its questions through `ui`, an object with these methods (the window answers with dialogs, a test with answers):

- ``ask_unsaved() -> "save" | "discard" | "cancel"``; ``ask_conflict() -> "reload" | "overwrite" | "save-as" |
  "cancel"`` (the open file changed on disk);
- ``ask_save_path(title, start, filters)``, ``ask_open_path(title, start, filters)``, ``ask_folder(title, start)``
  ``-> Path | None``; ``ask_category(current) -> str | None``;
- ``ask_restore(pending) -> bool`` and ``ask_restore_changed(pending) -> "restore" | "theirs" | "later"`` (crash
  recovery); ``show_problems(title, text)``;
- ``progress(total)`` (an object with setValue, setLabelText, wasCanceled and close) and ``print_pdf(pdf, name) ->
  bool`` (the print dialog).

What the window shows comes as signals: the document to edit, the title, the key figures, the card's PDF (the
very bytes an export writes), status messages. Every figure comes from `kneeboard.pipeline` through the `Session`.
The core is imported inside the functions that use it: the first frame needs neither pint, numpy nor reportlab.
"""

from dataclasses import dataclass
from pathlib import Path

from PySide6.QtCore import QObject, QSettings, QTimer, Signal

from kneeboard import shipped
from kneeboard.app import words
from kneeboard.app.fleet import FleetModel
from kneeboard.app.outputs import CardOutputs
from kneeboard.app.preview_jobs import Renders
from kneeboard.app.recovery import AUTOSAVE_MS, Recovery
from kneeboard.app.safekeeping import Safekeeping
from kneeboard.app.session import Session
from kneeboard.app.words import tr
from kneeboard.fileio import FileProblem
from kneeboard.i18n import LANGUAGES, N_

MAX_RECENT = 8
DEBOUNCE_MS = 0  #: edits of one event-loop turn share a render; the renders drop stale results themselves
CHECK_DELAY_MS = 50  #: [ms] from listing a folder to checking its first profile, so the list is drawn first
MODES = ("card", "letter", "a4")  #: what the preview renders: the card, or a sheet of it
NO_PROFILE = N_("No profile open: choose one in the fleet, or make one with File › New profile.")


@dataclass(frozen=True)
class Shown:
    """The card's PDF last rendered for the preview, and which render it was."""

    generation: int
    pdf: bytes


class Controller(QObject):
    documentChanged = Signal(object)  #: the profile to edit (a ProfileDocument), or None: none open
    restyled = Signal()  #: the open profile was prepared again (the card style changed): its fields to show again
    titleChanged = Signal(str, bool)  #: the window's title, and whether there are unsaved edits
    highlight = Signal(object)  #: the fleet's profile being edited (a Path), or None: a new one, or none
    figuresShown = Signal(object, str)  #: the key figures: the card's table and its fingerprint
    figuresWithheld = Signal(str)  #: why there are no figures to show
    cardReady = Signal(int, object, float)  #: a render's generation, its PDF bytes, [ms] from request to result
    cardFailed = Signal(str)  #: the newest card could not be made: why
    cardStale = Signal(str, str)  #: the card shown is not current: a note for beside it, the words over it
    cardCleared = Signal()  #: no card to show
    fleetChecked = Signal()  #: every profile of the fleet has its mark
    status = Signal(str, int)  #: a passing message, and how long it shows [ms]
    exported = Signal(str, object)  #: what was exported, and the file written (a Path)
    recoveryNote = Signal(str, str)  #: crash recovery is off: why, and more; ("", "") when it works again
    recentChanged = Signal()
    languageChanged = Signal(str)  #: the app's words are now in this language (a code of i18n.LANGUAGES)

    def __init__(self, ui, settings: QSettings | None = None, recovery_dir: Path | None = None, parent=None):
        super().__init__(parent)
        self.ui = ui
        self.settings = settings or QSettings("kneeboard", "kneeboard")
        words.start(self.settings)  # the app's own language: the setting's, else the system's
        if recovery_dir is None:
            from kneeboard.app.places import data_folder

            recovery_dir = data_folder() / "recovery"
        self.session = Session()  #: the folder, the style, what was printed
        self.recovery = Recovery(recovery_dir)
        self.fleet = FleetModel(self)
        self.renders = Renders(self)
        self.renders.done.connect(self._rendered)
        self.renders.failed.connect(self._render_failed)
        self.doc = None  #: the open profile (app.document.ProfileDocument), or None
        self.preview_mode = "card"
        self.shown: Shown | None = None
        self.card_generation = 0  #: the render of the open profile's card as it prints (0: none, or a sheet)
        self._requested = None  #: what the newest render draws: (fingerprint, style, logo, mode, date)
        self._failed = False  #: the newest render failed
        self._unchecked: list[Path] = []  #: listed profiles not yet marked
        self.safe = Safekeeping(self)
        self.outputs = CardOutputs(self)
        self.timer = QTimer(self, singleShot=True, interval=DEBOUNCE_MS)
        self.timer.timeout.connect(self._update_card)
        self._check_timer = QTimer(self, singleShot=True, interval=0)
        self._check_timer.timeout.connect(self._check_next)
        self.autosave_timer = QTimer(self, interval=AUTOSAVE_MS)
        self.autosave_timer.timeout.connect(self.autosave)
        self.autosave_timer.start()

    # --- the app's language ---------------------------------------------------------------------
    def chosen_language(self) -> str:
        """The language chosen in Settings › Language; "" when the app follows the system's."""
        return words.chosen(self.settings)

    def set_language(self, code: str) -> None:
        """Settings › Language: speak `code` (a code of i18n.LANGUAGES) from now on, or "" to follow the system's;
        kept in the settings for the next start, and every text shown again in it at once. The card's own
        language is the style's or the profile's, and does not change."""
        if code and code not in LANGUAGES:
            raise ValueError(f"no catalogue for language {code!r}; expected one of {', '.join(LANGUAGES)}")
        self.settings.setValue(words.SETTING, code)
        words.use(code or words.system_language())
        self.languageChanged.emit(words.language())
        self._update_title()
        if self.doc is None:
            self.figuresWithheld.emit(tr(NO_PROFILE))
        else:
            self._requested = None  # the note over a card that is not current is said again in the new language
            self.schedule_preview()

    # --- the fleet -------------------------------------------------------------------------------
    def show_fleet(self, path: Path) -> None:
        """List the fleet of `path` (a folder, or a profile's folder) without reading any profile's figures:
        what the first frame shows, before the units library and the card machinery are loaded."""
        path = Path(path).resolve()
        self._list_fleet(path if path.is_dir() else path.parent)
        self.highlight.emit(None if path.is_dir() else path)

    def reload_fleet(self) -> None:
        if self.fleet.folder is not None:
            self._list_fleet(self.fleet.folder)

    def _list_fleet(self, folder: Path) -> None:
        self.fleet.list_folder(folder)
        self._unchecked = self.fleet.paths()
        self._check_timer.start(CHECK_DELAY_MS)  # the list paints first; then one profile per turn

    def _recheck_fleet(self) -> None:
        self.fleet.forget_checks()
        self._unchecked = self.fleet.paths()
        self._check_timer.start(0)

    @property
    def checks_pending(self) -> int:
        """Profiles of the fleet still to be marked."""
        return len(self._unchecked)

    def _check_next(self) -> None:
        if not self._unchecked:
            self.fleetChecked.emit()
            return
        path = self._unchecked.pop(0)
        doc, source = self.doc, self.fleet.source(path)
        if source is not None:  # None: the row left the list (a reload) before its turn came
            same = doc is not None and doc.path == path and not doc.modified and doc.plain() == source.data
            # the open profile as saved is prepared once, not again
            self.fleet.set_checked(path, doc.loaded if same else self.session.prepare_source(source))
        self._check_timer.start(0)

    # --- opening ---------------------------------------------------------------------------------
    def open_path(self, path: Path) -> None:
        """A profile file, or a folder (its first profile opens)."""
        path = Path(path)
        if path.is_dir():
            self.open_folder(path)
        else:
            self.open_profile(path)

    def open_folder(self, folder: Path) -> None:
        folder = Path(folder).resolve()
        self.session.use_folder(folder)
        self._forget_prepared()
        if self.fleet.folder != folder:  # listed already when the window first showed it
            self._list_fleet(folder)
        self.settings.setValue("last_folder", str(folder))
        if self.doc is not None and self.doc.path is not None and self.doc.path.parent == folder:
            return
        paths = self.fleet.paths()
        if paths:
            self.open_profile(paths[0])
        elif self.doc is not None and self.maybe_save():
            self.close_document()  # the aircraft of another folder must not look like one of this fleet

    def open_profile(self, path: Path) -> bool:
        path = Path(path).resolve()
        if self.doc is not None and self.doc.path == path:
            return True
        if not self.maybe_save():
            self._highlight_open()  # the click is undone: the profile still edited stays highlighted
            return False
        if self.session.folder != path.parent:
            self.session.use_folder(path.parent)
        from kneeboard.app.document import ProfileDocument

        try:
            doc = ProfileDocument.open(path, self, self.session)
        except FileProblem as exc:
            self.ui.show_problems(tr("Cannot open {name}", name=path.name), str(exc))
            self._highlight_open()
            return False
        if self.fleet.folder != path.parent:
            self._list_fleet(path.parent)
            self.settings.setValue("last_folder", str(path.parent))
        self.set_document(doc)
        self._remember(path)
        if doc.loaded.errors:
            self.ui.show_problems(tr("{name} has problems", name=path.name),
                                  "\n".join(str(p).removeprefix(f"{path}: ") for p in doc.loaded.errors))
        return True

    def open_asked(self) -> None:
        """File › Open profile: the file the person picks."""
        path = self.ui.ask_open_path(tr("Open profile"), str(self.start_folder()),
                                    tr("Profiles ({pattern})", pattern="*.toml"))
        if path is not None:
            self.open_profile(path)

    def open_folder_asked(self) -> None:
        path = self.ui.ask_folder(tr("Open fleet folder"), str(self.start_folder()))
        if path is not None:
            self.open_folder(path)

    def start_folder(self) -> Path:
        """Where file dialogs start: the open fleet's folder, else the home folder."""
        return self.fleet.folder or Path.home()

    def new_profile_asked(self) -> None:
        """File › New profile (Ctrl+N): a template of the category asked for, the open profile's by default."""
        profile = self.doc.loaded.profile if self.doc is not None else None
        category = self.ui.ask_category(profile.aircraft.category if profile is not None else "normal")
        if category is not None:
            self.new_profile(category)

    def new_profile(self, category: str) -> None:
        if not self.maybe_save():
            return
        from kneeboard.app.document import ProfileDocument

        text = shipped.template_path(category).read_text(encoding="utf-8")
        self.set_document(ProfileDocument(text, None, self, session=self.session))
        name = tr(words.CATEGORY_NAMES.get(category, category))
        self.status.emit(tr("A new profile from the template “{category}”: type your aircraft's flight-manual "
                            "figures over its placeholders.", category=name), 12000)

    def set_document(self, doc) -> None:
        old, self.doc = self.doc, doc
        doc.changed.connect(self.schedule_preview)
        doc.changed.connect(self._update_title)
        doc.modifiedChanged.connect(self._update_title)
        doc.changedOnDisk.connect(self.safe.changed_on_disk)
        self.documentChanged.emit(doc)
        if old is not None:
            old.deleteLater()  # after its editor was replaced
        self._highlight_open()
        self._update_title()
        self.schedule_preview()

    def close_document(self) -> None:
        """No profile open: an empty editor, no figures, no card."""
        old, self.doc = self.doc, None
        self.documentChanged.emit(None)
        if old is not None:
            old.deleteLater()
        self.renders.cancel()
        self.shown, self._requested, self.card_generation = None, None, 0
        self.cardCleared.emit()
        self.figuresWithheld.emit(tr(NO_PROFILE))
        self._update_title()

    def _highlight_open(self) -> None:
        """The fleet highlights the profile being edited; a new one, not yet saved in the fleet, highlights none."""
        self.highlight.emit(self.doc.path if self.doc is not None else None)

    def _update_title(self, *_args) -> None:
        if self.doc is None:
            self.titleChanged.emit("kneeboard", False)
            return
        name = self.doc.path.name if self.doc.path else tr("new profile")
        profile = self.doc.loaded.profile
        reg = profile.aircraft.registration if profile else ""
        self.titleChanged.emit(f"{reg + ' — ' if reg else ''}{name}[*] — kneeboard", self.doc.modified)

    # --- the card style --------------------------------------------------------------------------
    def restyle(self) -> None:
        """The style may have changed: every figure is prepared again, and every profile of the fleet checked."""
        self.session.reload_styles()
        self._forget_prepared()

    def _forget_prepared(self) -> None:
        self._recheck_fleet()
        if self.doc is not None:
            self.doc.forget()
            self.restyled.emit()
        self.schedule_preview()

    def use_style_file(self, path: Path | None) -> None:
        """One style file for every card; None: back to the one rule (the folder's fleet.style.toml, else the
        shipped default)."""
        self.session.use_style_file(path)
        self._forget_prepared()
        self.status.emit(tr("Every card now uses the style {name}.", name=Path(path).name) if path is not None
                         else self._style_name(), 6000)

    def _style_name(self) -> str:
        path = self.session.style_path(self.doc.path if self.doc is not None else None)
        return (tr("The cards use the style {name}.", name=path.name) if path is not None else
                tr("The cards use the default style."))

    # --- saving ------------------------------------------------------------------------------------
    def save(self) -> bool:
        if self.doc is None:
            return True
        if self.doc.path is None:
            return self.save_as()
        return self._save_to(None)

    def save_as(self) -> bool:
        if self.doc is None:
            return True
        start = self.doc.path or self.start_folder() / "new_profile.toml"
        path = self.ui.ask_save_path(tr("Save profile as"), str(start), tr("Profiles ({pattern})", pattern="*.toml"))
        return False if path is None else self._save_to(path)

    def _save_to(self, path: Path | None) -> bool:
        from kneeboard.app.document import SaveConflict

        try:
            self.doc.save(path)
        except SaveConflict:  # also the open file itself reached by another path by Save as: asked as Save is
            return self.safe.settle_conflict()
        except FileProblem as exc:
            self.ui.show_problems(tr("The profile was not saved"), f"{exc}\n" + tr("Your changes are still here."))
            return False
        self.after_save()
        return True

    def after_save(self) -> None:
        self.safe.forget_autosave()
        self._remember(self.doc.path)
        self._list_fleet(self.doc.path.parent)  # a new file of the fleet, or the open one's new mark
        self._highlight_open()
        self._update_title()

    def maybe_save(self) -> bool:
        """True when it is fine to drop the open document (saved, discarded, or nothing to save)."""
        if self.doc is None or not self.doc.modified:
            return True
        answer = self.ui.ask_unsaved()
        if answer == "save":
            return self.save()
        if answer == "discard":
            self.safe.forget_autosave()
            return True
        return False

    def close(self) -> bool:
        """The app is closing: False when the person keeps it open (unsaved edits, and Cancel)."""
        if not self.maybe_save():
            return False
        self.safe.forget_autosave()
        self.autosave_timer.stop()
        self.timer.stop()
        self._check_timer.stop()
        self._unchecked = []
        self.renders.cancel()
        return True

    # --- crash recovery ------------------------------------------------------------------------------
    def autosave(self) -> Path | None:
        """Copy unsaved edits aside (every AUTOSAVE_MS); nothing is written when nothing changed."""
        return self.safe.autosave()

    def offer_recovery(self) -> int:
        """After a crash: offer each autosaved set of edits back; returns how many were restored."""
        return self.safe.offer_recovery()

    # --- recent files ------------------------------------------------------------------------------
    def _remember(self, path: Path) -> None:
        path = Path(path).resolve()  # absolute: Open recent works from any folder the app is started in
        recent = [p for p in self.recent() if p != str(path)]
        self.settings.setValue("recent", [str(path)] + recent[: MAX_RECENT - 1])
        self.recentChanged.emit()

    def recent(self) -> list[str]:
        value = self.settings.value("recent") or []
        return [value] if isinstance(value, str) else list(value)

    # --- the card as it prints -------------------------------------------------------------------------
    def schedule_preview(self, *_args) -> None:
        self.timer.start()

    def set_preview_mode(self, mode: str) -> None:
        """"card", or a sheet of it: "letter" or "a4"."""
        if mode not in MODES:
            raise ValueError(f"unknown preview mode {mode!r}; expected one of {list(MODES)}")
        self.preview_mode = mode
        self.schedule_preview()

    def card_job(self, prepared, mode: str = "card"):
        """A render: the card of `prepared` (or a sheet of it) as PDF bytes, from immutable inputs."""
        session = self.session

        def job() -> bytes:
            from kneeboard.pipeline import card_pdf, fleet_pdf

            card = session.card(prepared)
            return card_pdf(card) if mode == "card" else fleet_pdf([card], mode)

        return job

    def _update_card(self) -> None:
        if self.doc is None:
            return
        prepared = self.doc.loaded
        if prepared.table is None:
            n = len(prepared.errors)
            # the card on show was made before the error: greyed and named as not current, never left as if it were
            before = (tr("This is the card as it was before them; it is neither exported nor printed.")
                      if self.shown is not None else tr("No card until they are fixed."))
            self.renders.cancel()  # every render still running is of data older than the error
            self._requested = None
            self.cardStale.emit(tr("The card is not updated: the profile has {n} error(s) (see Problems).", n=n),
                                tr("NOT CURRENT: the profile has {n} error(s) (see Problems).", n=n) + " " + before)
            self.figuresWithheld.emit(tr("Fix the problems marked in the editor to see the figures."))
            return
        self.figuresShown.emit(prepared.table, prepared.fingerprint)
        from kneeboard.pipeline import today

        # the card is a function of the data (its fingerprint), the style, the sheet and the date: an edit that
        # changes none of them ("1182.0 kg" for "1182 kg") prints the very same card, so nothing is drawn
        style, mode = prepared.style, self.preview_mode
        key = (prepared.fingerprint, style, hash(style.logo_bytes), mode, today())
        if key == self._requested and not self._failed:
            return
        self._requested = key
        generation = self.renders.request(self.card_job(prepared, mode))
        self.card_generation = generation if mode == "card" else 0

    def _rendered(self, generation: int, pdf: bytes, ms: float) -> None:
        self.shown, self._failed = Shown(generation, pdf), False
        self.cardReady.emit(generation, pdf, ms)

    def _render_failed(self, _generation: int, message: str) -> None:
        self._failed = True
        self.cardFailed.emit(message)

    def current_pdf(self) -> bytes:
        """The open profile's card PDF: the very bytes the preview shows when it shows the current card."""
        shown = self.shown
        if shown is not None and self.card_generation and shown.generation == self.card_generation \
                and not self._failed:
            return shown.pdf
        from kneeboard.pipeline import card_pdf

        return card_pdf(self.session.card(self.doc.loaded))
