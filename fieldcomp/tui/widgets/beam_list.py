"""The beam list: every mark with its verdicts in labelled columns (as designed, construction,
as built when the beam has findings), each the level and its governing ratio."""

from __future__ import annotations

from rich.text import Text
from textual.binding import Binding
from textual.coordinate import Coordinate
from textual.widgets import DataTable

from engine.model.text import printable
from fieldcomp.tui.messages import BeamSelected
from fieldcomp.tui.outcome import BeamOutcome
from fieldcomp.tui.widgets.verdict import beam_cells

COLUMNS = ("beam", "as designed", "construction", "as built")


class BeamList(DataTable):
    """One row per beam; moving the cursor selects the beam for the panes. Rows are replaced one
    by one as results arrive (a 2,000-beam job is never redrawn whole for one edit)."""

    BINDINGS = [
        Binding("plus", "app.duplicate_beam", "Copy beam", id="beams.duplicate",
                tooltip="Copy the selected beam (new mark) after it."),
        Binding("minus", "app.remove_beam", "Remove beam", id="beams.remove",
                tooltip="Remove the selected beam (undo brings it back)."),
    ]

    def __init__(self, *, id: str | None = None) -> None:
        super().__init__(id=id, cursor_type="row", zebra_stripes=True)
        self.marks: list[str] = []

    def on_mount(self) -> None:
        self.add_columns(*COLUMNS)

    def show(self, marks: list[str], outcomes: list[BeamOutcome | None], selected: int,
             changed: list[int] | None = None) -> None:
        """Show the rows of `changed` beams (every row when None, or when the beams changed)."""
        with self.prevent(DataTable.RowHighlighted):
            if changed is None or marks != self.marks:
                self.clear()
                self.add_rows([(Text(printable(m), end=""), *beam_cells(o)) for m, o in zip(marks, outcomes)])
                self.marks = list(marks)
            else:
                for k in changed:
                    for c, cell in enumerate(beam_cells(outcomes[k]), start=1):
                        self.update_cell_at(Coordinate(k, c), cell, update_width=True)
            if marks and self.cursor_row != min(selected, len(marks) - 1):
                self.move_cursor(row=min(selected, len(marks) - 1))
        self.border_title = f"Beams ({len(marks)})"

    def on_data_table_row_highlighted(self, event: DataTable.RowHighlighted) -> None:
        event.stop()
        self.post_message(BeamSelected(event.cursor_row))
