"""The key figures beside the editor: what a pilot checks first, from the same table the card prints."""

from typing import TYPE_CHECKING

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QLabel, QVBoxLayout, QWidget

from kneeboard import terms

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
        self.show_nothing("Open a profile to see its figures.")

    def show_nothing(self, why: str) -> None:
        self.label.setText(f"<i>{why}</i>")
        self.figures: dict[str, str] = {}

    def show_table(self, t: "CardTable", fingerprint: str = "") -> None:
        """The figures a pilot checks first: the header's weight, the limits block's heading and its rows, each
        from the card's own printed rows (`kneeboard.printed`), so the key figures are the card's."""
        from kneeboard import printed  # loaded with the first table, not at start-up
        from kneeboard.tables import LIMIT_MARK

        su = t.speed_unit
        weight = printed.header(t)["weight"]
        limit_load, limit_bank, va = printed.limits_heading(t)
        figures = {f.label: f.text for f in (weight, limit_load, limit_bank, va) if f is not None}
        if fingerprint:
            figures[terms.FINGERPRINT] = fingerprint
        warning = (f"<p style='color:#A11D1D'><b>Above the maximum weight of {t.max_weight.text} "
                   f"{t.weight_unit}: the limits are lowered for this weight.</b></p>" if t.over_max_weight else "")
        for line in t.warnings:
            warning += f"<p style='color:#A11D1D'>{_esc(line)}</p>"
        rows = []
        limited = False
        for c, cells in zip(t.configurations, printed.limit_rows(t)):
            shown = []
            for cell in cells:
                if cell.figure is not None:
                    figures[cell.figure.label] = cell.figure.text
                limited |= cell.framed
                text = _esc(cell.text)
                text = f"<b>{text}</b>" if cell.bold else text
                shown.append(f"<td align=right>{_red(text) if cell.framed else text}</td>")
            rows.append(f"<tr><td><b>{_esc(c.name)}</b></td>{''.join(shown)}</tr>")
        va_text = f" · VA <b>{va.text}</b>" if va is not None else ""
        head = "".join(f"<th align={'left' if i == 0 else 'right'}>{h}</th>" for i, h in enumerate(
            (f"{su} IAS", terms.STALL, terms.PATTERN, f"{terms.BUFFER_BANK} ({t.buffer.text} {su})",
             terms.ZERO_MARGIN_BANK, "VFE", "limit g / bank")))
        legend = (f"<p style='color:#555'>{LIMIT_MARK}: a bank at or past the configuration's own limit bank; its "
                  "limit is shown in its place, not a bank to fly</p>" if limited else "")
        stamp = (f"<p style='color:#555'>{terms.FINGERPRINT} {fingerprint}: the same on the card printed from "
                 "this profile as it stands</p>" if fingerprint else "")
        self.label.setText(
            f"{warning}<p>{terms.CARD_WEIGHT.capitalize()} <b>{weight.text}</b>{va_text} · "
            f"{terms.LIMIT_LOAD} {limit_load.text}, {terms.LIMIT_BANK} <b>{limit_bank.text}</b></p>"
            f"<table cellspacing=0 cellpadding=3><tr>{head}</tr>{''.join(rows)}</table>{legend}{stamp}"
        )
        self.figures = figures


def _red(text: str) -> str:
    """A figure in red where it is its configuration's limit shown in its place, or past it."""
    return f"<span style='color:#A11D1D'>{text}</span>"


def _esc(text: str) -> str:
    return text.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")
