"""Rows of a job table under a beam (pour stages, findings): a table, add/remove, a form for
the highlighted row."""

from __future__ import annotations

from typing import Any, Callable

from textual.app import ComposeResult
from textual.containers import Horizontal, Vertical
from textual.widgets import Button, DataTable, Static

from fieldcomp.tui.messages import RowRemoved, RowsSet
from fieldcomp.tui.session import JobSession, Path_, field_text
from fieldcomp.tui.widgets.field_form import FieldForm, FieldSpec
from fieldcomp.tui.widgets.table import Table


class RowEditor(Vertical):
    """Edits `beam[i].<table>`: `specs` are the row's fields (also the table's columns);
    `with_new_row(rows, beam)` gives the table after Add: the rows as plain data plus a new one
    (a new pour stage may take part of the last one)."""

    DEFAULT_CSS = """
    RowEditor { height: auto; }
    RowEditor > DataTable { height: auto; max-height: 10; }
    RowEditor > Horizontal { height: auto; padding: 0 0 1 0; }
    RowEditor Button { margin-right: 2; }
    RowEditor > .rows--empty { color: $foreground-muted; }
    """

    def __init__(self, table: str, noun: str, specs: tuple[FieldSpec, ...],
                 with_new_row: Callable[[list[dict[str, Any]], Any], list[dict[str, Any]]], *,
                 id: str | None = None, empty: str = "") -> None:
        super().__init__(id=id)
        self.table, self.noun, self.specs, self.with_new_row, self.empty = table, noun, specs, with_new_row, empty
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
        yield FieldForm(self.specs, id=f"{self.table}-form", columns=3, table=self.table)

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
        table = self.query_one(Table)
        with table.prevent(DataTable.RowHighlighted):
            table.set_rows([(str(k + 1), *(field_text(session.job, self.base() + (k,) + s.key) for s in self.specs))
                            for k in range(len(rows))])
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

    def plain_rows(self) -> list[dict[str, Any]]:
        return [r.model_dump(mode="json", exclude_none=True) for r in self.rows()]

    def add(self, items: list[dict[str, Any]] | None = None, description: str = "") -> None:
        """Add a new row, or `items` (imported rows), as one edit."""
        if self.session is None:
            return
        rows = self.plain_rows()
        new = rows + items if items else self.with_new_row(rows, self.session.job.beam[self.beam_index])
        self.row = len(new) - 1
        self.post_message(RowsSet(self.base(), new, description or f"add {self.noun}"))

    def remove(self) -> None:
        if self.rows():
            self.post_message(RowRemoved(self.base(), self.row, f"remove {self.noun} {self.row + 1}"))
