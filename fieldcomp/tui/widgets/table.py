"""Tables of the panes. `TextTable` (results: checks, stages, marks) wraps its cells to the width
it has, so no clause, reason or number is ever cut; `Table` (a data table) scrolls sideways and
picks rows (rows of a job table, the schedule of every beam)."""

from __future__ import annotations

from rich.table import Table as RichTable
from rich.text import Text
from textual.coordinate import Coordinate
from textual.geometry import Size
from textual.strip import Strip
from textual.widget import Widget
from textual.widgets import DataTable

from engine.model.text import printable


def cell_text(cell: object) -> Text:
    """A cell as literal text (job text is never read as markup)."""
    return cell if isinstance(cell, Text) else Text(printable(cell), end="")


class TextTable(Widget):
    """Columns given at creation; `keep` names the columns never wrapped (short words and numbers),
    the others wrap at spaces (and fold inside a word longer than the column). Drawn once per
    set of rows and width, then line by line from that drawing."""

    DEFAULT_CSS = "TextTable { height: auto; width: 1fr; }"

    def __init__(self, *columns: str, id: str | None = None, keep: tuple[str, ...] = ()) -> None:
        super().__init__(id=id)
        self.columns_wanted, self.keep = columns, keep
        self.shown: list[tuple] | None = None
        self._table: RichTable | None = None
        self._drawn: tuple[int, list[Strip]] | None = None

    def set_rows(self, rows: list[tuple]) -> None:
        """Show `rows`; nothing is redrawn when they are the rows already shown."""
        if rows == self.shown:
            return
        self.shown = rows
        table = RichTable(box=None, expand=False, show_edge=False, padding=(0, 1), header_style="bold underline",
                          pad_edge=False)
        for name in self.columns_wanted:
            fixed = name in self.keep
            table.add_column(name, no_wrap=fixed, overflow="fold" if not fixed else "ellipsis")
        for row in rows:
            table.add_row(*(cell_text(c) for c in row))
        self._table = table if rows else None
        self._drawn = None
        self.refresh(layout=True)

    def notify_style_update(self) -> None:
        super().notify_style_update()
        self._drawn = None

    def _strips(self, width: int) -> list[Strip]:
        if self._table is None or width <= 0:
            return []
        if self._drawn is None or self._drawn[0] != width:
            console = self.app.console
            lines = console.render_lines(self._table, console.options.update(width=width, highlight=False), pad=True)
            self._drawn = (width, [Strip(line) for line in lines])
        return self._drawn[1]

    def get_content_height(self, container: Size, viewport: Size, width: int) -> int:
        return len(self._strips(width))

    def render_line(self, y: int) -> Strip:
        strips = self._strips(self.size.width)
        if y >= len(strips):
            return Strip.blank(self.size.width, self.rich_style)
        return strips[y].apply_style(self.rich_style)


class Table(DataTable):
    """Columns given at creation; text cells are shown as they are, never read as markup. Display
    tables (the default) take the focus only to scroll; `rows=True` makes a table whose row
    cursor picks a row to edit."""

    DEFAULT_CSS = "Table { height: auto; max-height: 24; }"

    def __init__(self, *columns: str, id: str | None = None, rows: bool = False) -> None:
        super().__init__(id=id, cursor_type="row" if rows else "none", zebra_stripes=True)
        self.columns_wanted = columns

    def on_mount(self) -> None:
        self.add_columns(*self.columns_wanted)

    shown: list[tuple] | None = None

    def set_rows(self, rows: list[tuple]) -> None:
        """Show `rows`: rows that differ from those shown are replaced one by one (a long table is
        not rebuilt for one changed row); nothing is redrawn when none differs."""
        if rows == self.shown:
            return
        old, self.shown = self.shown, rows
        if old is None or len(old) != len(rows):
            self.clear()
            self.add_rows([tuple(cell_text(c) for c in row) for row in rows])
            return
        for k, (was, now) in enumerate(zip(old, rows)):
            if was != now:
                for c, cell in enumerate(now):
                    if c >= len(was) or was[c] != cell:
                        self.update_cell_at(Coordinate(k, c), cell_text(cell), update_width=True)
