"""The plan of a titled table that may break between its rows (limits, pull, turn back, circling): its heading (or
the continued title), its column heads, the rows of the piece placed, and its foot once at the end."""

from kneeboard.card.draw import GREY, Draw, Measure, Piece, Plan, Section
from kneeboard.card.ops import SMALL


class TablePlan(Plan):
    """A subclass sets `ctx`, `heading` (a `grid.Heading`) and `heads` (`grid.ColumnHeads`), and draws its rows
    (`rows_drawn`) and its foot (`foot_drawn`)."""

    def draw(self, piece: Piece):
        d = Draw(self.ctx)
        y = self.heading.draw(d, 0.0) if piece.lead else self.heading.draw_again(d, 0.0) if piece.again else 0.0
        y = self.heads.draw(d, y)
        y = self.rows_drawn(d, y, piece.start, piece.stop)
        if piece.foot:
            y = self.foot_drawn(d, y)
        return d.block(self.name, -y)

    def rows_drawn(self, d: Draw, top: float, start: int, stop: int) -> float:
        """Rows `start:stop` drawn from `top` down; returns the y below them."""
        raise NotImplementedError

    def foot_drawn(self, d: Draw, top: float) -> float:
        return top


class NamedTable(TablePlan):
    """A table of the configurations' rows (`grid.NamedRow`s in `rows`) with a note of small lines at its foot (maybe
    none): then `self.measure = self.measured()`."""

    note_color = GREY

    def measured(self) -> Measure:
        ss = self.ctx.size(SMALL)
        return Measure((Section(self.heads.height, tuple(r.height for r in self.rows)),),
                       lead=self.heading.height, foot=ss * 1.2 * len(self.note) + ss * 0.8, again=self.heading.again)

    def rows_drawn(self, d: Draw, top: float, start: int, stop: int) -> float:
        for row in self.rows[start:stop]:
            top = row.draw(d, top)
        return top

    def foot_drawn(self, d: Draw, top: float) -> float:
        ss = self.ctx.size(SMALL)
        for line in self.note:
            top -= ss * 1.2
            d.text(0, top, line, SMALL, color=self.note_color)
        return top - ss * 0.8
