"""The key figures beside the editor: what a pilot checks first, from the same table the card prints."""

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QLabel, QVBoxLayout, QWidget

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

    def show_table(self, t: CardTable) -> None:
        su = t.speed_unit
        figures = {"weight": f"{t.weight.text} {t.weight_unit}",
                   "limit bank": f"{t.limit_bank.text}°"}
        if t.maneuvering_speed is not None:
            figures["VA"] = f"{t.maneuvering_speed.text} {su}"
        warning = (f"<p style='color:#A11D1D'><b>Above the maximum weight of {t.max_weight.text} "
                   f"{t.weight_unit}.</b></p>" if t.over_max_weight else "")
        rows = []
        for c in t.configurations:
            buffer = f"{c.buffer_bank.text}°" if c.buffer_bank else "none"
            figures[f"{c.name} zero margin"] = f"{c.zero_margin_bank.text}°"
            figures[f"{c.name} buffer"] = buffer
            rows.append(f"<tr><td><b>{_esc(c.name)}</b></td><td align=right>{c.stall_speed.text}</td>"
                        f"<td align=right><b>{c.pattern_speed.text}</b></td><td align=right><b>{buffer}</b></td>"
                        f"<td align=right><b>{c.zero_margin_bank.text}°</b></td></tr>")
        va = f" · VA at this weight <b>{t.maneuvering_speed.text} {su}</b>" if t.maneuvering_speed else ""
        self.label.setText(
            f"{warning}<p>For <b>{t.weight.text} {t.weight_unit}</b>{va} · limit load "
            f"{t.limit_load_factor.text} g at <b>{t.limit_bank.text}°</b> bank</p>"
            f"<table cellspacing=0 cellpadding=3><tr><th align=left>{su} IAS</th><th>stall</th><th>fly</th>"
            f"<th>{t.buffer.text} {su} left at</th><th>no margin at</th></tr>{''.join(rows)}</table>"
        )
        self.figures = figures


def _esc(text: str) -> str:
    return text.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")
