"""The common shape of a workbench pane: shown a beam of the job, then its engine outcome.

A pane builds its widgets the first time it is shown (`ensure_built`), so panes nobody opens
cost nothing at start-up.
"""

from __future__ import annotations

import asyncio

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll

from fieldcomp.tui.outcome import BeamOutcome
from fieldcomp.tui.session import JobSession


ROW_KEYS = [
    Binding("f6", "add_row", "Add row", id="rows.add", tooltip="Add a row (a pour stage, a finding) to the beam."),
    Binding("f7", "remove_row", "Remove row", id="rows.remove", tooltip="Remove the highlighted row."),
]


class Pane(VerticalScroll):
    """Panes override `build` (their widgets), `show_job` (inputs changed: refill forms) and
    `show_outcome` (results)."""

    DEFAULT_CSS = """
    Pane { padding: 0 1; overflow-x: hidden; }
    Pane .pane--head { text-style: bold; padding: 0 0 1 0; }
    Pane .pane--section { color: $primary; text-style: bold; padding: 1 0 0 0; }
    Pane .pane--note { color: $foreground-muted; }
    Pane .pane--warn { color: $warning; }
    Pane .pane--error { color: $error; text-style: bold; }
    """

    built = False  # True once the widgets of `build` are mounted
    lists_every_beam = False  # True for panes that show something of every beam (the camber schedule)
    _building: asyncio.Event | None = None

    def build(self) -> ComposeResult:
        """The pane's widgets (nest containers by passing children, not with `with` blocks)."""
        yield from ()

    async def ensure_built(self) -> None:
        """Mount the pane's widgets once; a second caller waits for the first."""
        if self._building is None:
            self._building = asyncio.Event()
            await self.mount_all(list(self.build()))
            self.built = True
            self._building.set()
        else:
            await self._building.wait()

    def action_add_row(self) -> None:
        """Panes with a row editor (ROW_KEYS) add a row to it."""
        from fieldcomp.tui.widgets.row_editor import RowEditor

        self.query_one(RowEditor).add()

    def action_remove_row(self) -> None:
        from fieldcomp.tui.widgets.row_editor import RowEditor

        self.query_one(RowEditor).remove()

    def show_job(self, session: JobSession, index: int) -> None:
        """Fill the inputs from beam `index` of the session's job."""

    def show_outcome(self, outcome: BeamOutcome | None, outcomes: list[BeamOutcome]) -> None:
        """Draw the engine results of the selected beam (`outcomes`: every beam, for schedules)."""
