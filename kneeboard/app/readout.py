"""The key figures beside the editor: what a pilot checks first, from the same table the card prints."""

from typing import TYPE_CHECKING

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QLabel, QVBoxLayout, QWidget

from kneeboard import terms
from kneeboard.app.words import tr, translated
from kneeboard.i18n import N_

NO_FIGURES = N_("Open a profile to see its figures.")

if TYPE_CHECKING:
    from kneeboard.tables import CardTable


class Readout(QWidget):
    def __init__(self, parent=None):
        super().__init__(parent)
        self.label = QLabel()
        self.label.setTextFormat(Qt.TextFormat.RichText)
        self.label.setWordWrap(True)
        self.label.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        box = QVBoxLayout(self)
        box.setContentsMargins(4, 4, 4, 4)
        box.addWidget(self.label)
        self._shown: tuple = (NO_FIGURES,)  #: what is shown: (why,) or (table, fingerprint), to show again
        self.show_nothing(tr(NO_FIGURES))

    def show_nothing(self, why: str) -> None:
        """No figures, and why (in the app's language)."""
        self._shown = (why,)
        self.label.setText(f"<i>{_esc(why)}</i>")
        self.figures: dict[str, str] = {}

    def retranslate(self) -> None:
        """The app's language changed: the figures' words in it (a reason given by the controller is said again
        by the controller)."""
        if len(self._shown) == 2:
            self.show_table(*self._shown)
        elif self._shown == (NO_FIGURES,) or self._shown[0] == tr(NO_FIGURES):
            self.show_nothing(tr(NO_FIGURES))

    def show_table(self, t: "CardTable", fingerprint: str = "") -> None:
        """The figures a pilot checks first: the header's weight, the limits block's heading and its rows, each
        from the card's own printed rows (`kneeboard.printed`), so the key figures are the card's."""
        from kneeboard import printed  # loaded with the first table, not at start-up
        from kneeboard.tables import LIMIT_MARK

        self._shown = (t, fingerprint)
        words, number = translated(), translated().number  # the app's language; the figures as the card prints them
        su = t.speed_unit
        weight = printed.header(t)["weight"]
        limit_load, limit_bank, va = printed.limits_heading(t)
        figures = {f.label: f.text for f in (weight, limit_load, limit_bank, va) if f is not None}
        if fingerprint:
            figures[terms.FINGERPRINT] = fingerprint
        warning = ("<p style='color:#A11D1D'><b>" + _esc(tr(
            "Above the maximum weight of {weight} {unit}: the limits are lowered for this weight.",
            weight=t.max_weight, unit=t.weight_unit)) + "</b></p>" if t.over_max_weight else "")
        for line in t.warnings:
            warning += f"<p style='color:#A11D1D'>{_esc(words(line))}</p>"
        rows = []
        limited = False
        for c, cells in zip(t.configurations, printed.limit_rows(t)):
            shown = []
            for cell in cells:
                if cell.figure is not None:
                    figures[cell.figure.label] = cell.figure.text
                limited |= cell.framed
                text = _esc(number(cell.text))
                text = f"<b>{text}</b>" if cell.bold else text
                shown.append(f"<td align=right>{_red(text) if cell.framed else text}</td>")
            rows.append(f"<tr><td><b>{_esc(c.name)}</b></td>{''.join(shown)}</tr>")
        va_text = f" · VA <b>{_esc(number(va.text))}</b>" if va is not None else ""
        head = "".join(f"<th align={'left' if i == 0 else 'right'}>{_esc(h)}</th>" for i, h in enumerate(
            (f"{su} IAS", tr(terms.STALL), tr(terms.PATTERN),
             f"{tr(terms.BUFFER_BANK)} ({number(t.buffer.text)} {su})", tr(terms.ZERO_MARGIN_BANK), "VFE",
             tr("limit g / bank"))))
        legend = ("<p style='color:#555'>" + _esc(tr(
            "{mark}: a bank at or past the configuration's own limit bank; its limit is shown in its place, not a "
            "bank to fly", mark=LIMIT_MARK)) + "</p>" if limited else "")
        stamp = ("<p style='color:#555'>" + _esc(tr(
            "{fingerprint} {value}: the same on the card printed from this profile as it stands",
            fingerprint=tr(terms.FINGERPRINT), value=fingerprint)) + "</p>" if fingerprint else "")
        card_weight = tr(terms.CARD_WEIGHT)
        self.label.setText(
            f"{warning}<p>{_esc(card_weight[:1].upper() + card_weight[1:])} <b>{_esc(number(weight.text))}</b>"
            f"{va_text} · {_esc(tr(terms.LIMIT_LOAD))} {_esc(number(limit_load.text))}, {_esc(tr(terms.LIMIT_BANK))} "
            f"<b>{_esc(number(limit_bank.text))}</b></p>"
            f"<table cellspacing=0 cellpadding=3><tr>{head}</tr>{''.join(rows)}</table>{legend}{stamp}"
        )
        self.figures = figures


def _red(text: str) -> str:
    """A figure in red where it is its configuration's limit shown in its place, or past it."""
    return f"<span style='color:#A11D1D'>{text}</span>"


def _esc(text: str) -> str:
    return text.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")
