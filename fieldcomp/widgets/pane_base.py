"""The common shape of a workbench pane: shown a beam of the job, then its engine outcome.

A pane builds its widgets the first time it is shown (`ensure_built`), so panes nobody opens
cost nothing at start-up.
"""

from __future__ import annotations

from textual.app import ComposeResult
from textual.containers import VerticalScroll

from fieldcomp.outcome import BeamOutcome
from fieldcomp.session import JobSession


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

    built = False

    def build(self) -> ComposeResult:
        """The pane's widgets (nest containers by passing children, not with `with` blocks)."""
        yield from ()

    async def ensure_built(self) -> None:
        if not self.built:
            self.built = True
            await self.mount_all(list(self.build()))

    def show_job(self, session: JobSession, index: int) -> None:
        """Fill the inputs from beam `index` of the session's job."""

    def show_outcome(self, outcome: BeamOutcome | None, outcomes: list[BeamOutcome]) -> None:
        """Draw the engine results of the selected beam (`outcomes`: every beam, for schedules)."""
