"""Command palette entries of the workbench: every bound action, each pane, each beam by mark.

The palette sees the app only through `PaletteHost`, so it does not import the app module.
"""

from __future__ import annotations

from functools import partial
from typing import Callable, Iterator, Protocol

from textual.command import DiscoveryHit, Hit, Hits, Provider

from fieldcomp.tui.session import JobSession


class PaletteHost(Protocol):
    """What the palette needs of the workbench app."""

    session: JobSession

    def palette_actions(self) -> Iterator[tuple[str, str, Callable[[], object]]]: ...

    def select_beam(self, index: int) -> None: ...


class WorkbenchCommands(Provider):
    """Actions from the app's and workbench's bindings, pane switches and beam selection."""

    def _commands(self) -> Iterator[tuple[str, str, Callable[[], object]]]:
        app: PaletteHost = self.app  # type: ignore[assignment]
        yield from app.palette_actions()
        for k, beam in enumerate(app.session.job.beam):
            yield f"Go to beam {beam.mark}", f"{beam.shape}, span {beam.span}", partial(app.select_beam, k)

    async def discover(self) -> Hits:
        for name, help_text, callback in self._commands():
            if not name.startswith("Go to beam"):
                yield DiscoveryHit(name, callback, help=help_text)

    async def search(self, query: str) -> Hits:
        matcher = self.matcher(query)
        for name, help_text, callback in self._commands():
            score = matcher.match(name)
            if score > 0:
                yield Hit(score, matcher.highlight(name), callback, help=help_text)
