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
        """The figures a pilot checks first, in the card's words (`kneeboard.terms`), as the card prints them."""
        from kneeboard.tables import LIMIT_MARK  # loaded with the first table, not at start-up

        su = t.speed_unit
        figures = {terms.CARD_WEIGHT: f"{t.weight.text} {t.weight_unit}",
                   terms.LIMIT_BANK: f"{t.limit_bank.text}°"}
        if fingerprint:
            figures[terms.FINGERPRINT] = fingerprint
        if t.maneuvering_speed is not None:
            figures["VA"] = f"{t.maneuvering_speed.text} {su}"
        warning = (f"<p style='color:#A11D1D'><b>Above the maximum weight of {t.max_weight.text} "
                   f"{t.weight_unit}: the limits are lowered for this weight.</b></p>" if t.over_max_weight else "")
        for line in t.warnings:
            warning += f"<p style='color:#A11D1D'>{_esc(line)}</p>"
        rows = []
        limited = False
        for c in t.configurations:
            buffer = f"{c.buffer_bank.text}°" if c.buffer_bank else "none"
            limit = f"{c.limit_load_factor.text} g / {c.limit_bank.text}°"
            figures[f"{c.name} {terms.ZERO_MARGIN_BANK}"] = f"{c.zero_margin_bank.text}°"
            figures[f"{c.name} {terms.BUFFER_BANK}"] = buffer
            figures[f"{c.name} {terms.LIMIT_LOAD}"] = limit
            limited |= c.zero_margin_bank.past_limit or bool(c.buffer_bank and c.buffer_bank.past_limit)
            rows.append(f"<tr><td><b>{_esc(c.name)}</b></td><td align=right>{c.stall_speed.text}</td>"
                        f"<td align=right><b>{c.pattern_speed.text}</b></td>"
                        f"<td align=right><b>{_bank(c.buffer_bank, buffer)}</b></td>"
                        f"<td align=right><b>{_bank(c.zero_margin_bank, f'{c.zero_margin_bank.text}°')}</b></td>"
                        f"<td align=right>{limit}</td></tr>")
        va = f" · VA <b>{t.maneuvering_speed.text} {su}</b>" if t.maneuvering_speed else ""
        head = "".join(f"<th align={'left' if i == 0 else 'right'}>{h}</th>" for i, h in enumerate(
            (f"{su} IAS", terms.STALL, terms.PATTERN, f"{terms.BUFFER_BANK} ({t.buffer.text} {su})",
             terms.ZERO_MARGIN_BANK, "limit g / bank")))
        legend = (f"<p style='color:#555'>{LIMIT_MARK}: a bank at or past the configuration's own limit bank; its "
                  "limit is shown in its place, not a bank to fly</p>" if limited else "")
        stamp = (f"<p style='color:#555'>{terms.FINGERPRINT} {fingerprint}: the same on the card printed from "
                 "this profile as it stands</p>" if fingerprint else "")
        self.label.setText(
            f"{warning}<p>{terms.CARD_WEIGHT.capitalize()} <b>{t.weight.text} {t.weight_unit}</b>{va} · "
            f"{terms.LIMIT_LOAD} {t.limit_load_factor.text} g, {terms.LIMIT_BANK} <b>{t.limit_bank.text}°</b></p>"
            f"<table cellspacing=0 cellpadding=3><tr>{head}</tr>{''.join(rows)}</table>{legend}{stamp}"
        )
        self.figures = figures


def _bank(printed, text: str) -> str:
    """A bank, in red where it is its configuration's limit shown in its place (`tables.Printed.past_limit`)."""
    return f"<span style='color:#A11D1D'>{text}</span>" if printed is not None and printed.past_limit else text


def _esc(text: str) -> str:
    return text.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")
