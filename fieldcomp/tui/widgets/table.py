"""A data table that knows its columns from the start."""

from __future__ import annotations

from rich.text import Text
from textual.widgets import DataTable

from engine.model.text import printable


class Table(DataTable):
    """Columns given at creation; text cells are shown as they are, never read as markup. Display
    tables (the default) take no focus and show no cursor; `rows=True` makes a table whose row
    cursor picks a row to edit."""

    DEFAULT_CSS = "Table { height: auto; max-height: 24; }"

    def __init__(self, *columns: str, id: str | None = None, rows: bool = False) -> None:
        super().__init__(id=id, cursor_type="row" if rows else "none", zebra_stripes=True)
        self.columns_wanted = columns
        self.can_focus = rows

    def on_mount(self) -> None:
        self.add_columns(*self.columns_wanted)

    shown: list[tuple] | None = None

    def set_rows(self, rows: list[tuple]) -> None:
        """Show `rows`; nothing is redrawn when they are the rows already shown."""
        if rows == self.shown:
            return
        self.shown = rows
        self.clear()
        for row in rows:
            self.add_row(*(Text(printable(cell), end="") if isinstance(cell, str) else cell for cell in row))
