"""Rows of a job table under a beam (pour stages, findings): a table, add/remove, a form for
the highlighted row."""

from __future__ import annotations

from typing import Any, Callable

from textual.app import ComposeResult
from textual.containers import Horizontal, Vertical
from textual.widgets import Button, DataTable, Static

from fieldcomp.messages import RowAdded, RowRemoved
from fieldcomp.session import JobSession, Path_, field_text
from fieldcomp.widgets.field_form import FieldForm, FieldSpec
from fieldcomp.widgets.table import Table


class RowEditor(Vertical):
    """Edits `beam[i].<table>`: `specs` are the row's fields (also the table's columns);
    `new_row(existing_rows)` gives the row the Add button appends."""

    DEFAULT_CSS = """
    RowEditor { height: auto; }
    RowEditor > DataTable { height: auto; max-height: 10; }
    RowEditor > Horizontal { height: auto; padding: 0 0 1 0; }
    RowEditor Button { margin-right: 2; }
    RowEditor > .rows--empty { color: $foreground-muted; }
    """

    def __init__(self, table: str, noun: str, specs: tuple[FieldSpec, ...],
                 new_row: Callable[[list[Any]], dict[str, Any]], *, id: str | None = None, empty: str = "") -> None:
        super().__init__(id=id)
        self.table, self.noun, self.specs, self.new_row, self.empty = table, noun, specs, new_row, empty
        self.session: JobSession | None = None
        self.beam_index = 0
        self.row = 0

    def compose(self) -> ComposeResult:
        yield Table("#", *(s.label for s in self.specs), id=f"{self.table}-rows", rows=True)
        yield Static(self.empty, classes="rows--empty")
        with Horizontal():
            yield Button(f"Add {self.noun}", id=f"{self.table}-add", variant="primary", compact=True)
            yield Button(f"Remove {self.noun}", id=f"{self.table}-remove", variant="error", compact=True)
            yield from self.extra_buttons()
        yield FieldForm(self.specs, id=f"{self.table}-form", columns=3)

    def extra_buttons(self) -> ComposeResult:
        yield from ()

    def rows(self) -> list[Any]:
        if self.session is None:
            return []
        return list(getattr(self.session.job.beam[self.beam_index], self.table))

    def base(self) -> Path_:
        return ("beam", self.beam_index, self.table)

    def show(self, session: JobSession, index: int) -> None:
        self.session, self.beam_index = session, index
        rows = self.rows()
        table = self.query_one(DataTable)
        table.clear()
        for k in range(len(rows)):
            cells = [field_text(session.job, self.base() + (k,) + s.key) for s in self.specs]
            table.add_row(str(k + 1), *cells)
        self.row = min(self.row, len(rows) - 1) if rows else 0
        self.query_one(".rows--empty", Static).display = not rows
        form = self.query_one(FieldForm)
        form.display = bool(rows)
        self.query_one(f"#{self.table}-remove", Button).disabled = not rows
        if rows:
            with table.prevent(DataTable.RowHighlighted):
                table.move_cursor(row=self.row)
            form.show(session, self.base() + (self.row,))

    def on_data_table_row_highlighted(self, event: DataTable.RowHighlighted) -> None:
        event.stop()
        if self.session is None or event.cursor_row == self.row:
            return
        self.row = event.cursor_row
        self.query_one(FieldForm).show(self.session, self.base() + (self.row,))

    def on_button_pressed(self, event: Button.Pressed) -> None:
        if event.button.id == f"{self.table}-add":
            event.stop()
            self.add()
        elif event.button.id == f"{self.table}-remove":
            event.stop()
            self.remove()

    def add(self, items: list[dict[str, Any]] | None = None, description: str = "") -> None:
        rows = self.rows()
        self.row = len(rows)
        self.post_message(RowAdded(self.base(), items or [self.new_row(rows)], description or f"add {self.noun}"))

    def remove(self) -> None:
        if self.rows():
            self.post_message(RowRemoved(self.base(), self.row, f"remove {self.noun} {self.row + 1}"))
