"""Command palette entries of the workbench: every bound action, each pane, each beam by mark.

The palette sees the app only through `PaletteHost`, so it does not import the app module.
"""

from __future__ import annotations

from functools import partial
from typing import Callable, Iterator, Protocol

from textual.command import DiscoveryHit, Hit, Hits, Provider
from textual.content import Content
from textual.fuzzy import Matcher
from textual.markup import escape

from engine.model.text import printable

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
                yield DiscoveryHit(Content(printable(name)), callback, text=name, help=escape(printable(help_text)))

    async def search(self, query: str) -> Hits:
        matcher = self.matcher(query)
        for name, help_text, callback in self._commands():
            score = matcher.match(name)
            if score > 0:
                yield Hit(score, literal_highlight(matcher, name), callback, text=name, help=escape(printable(help_text)))


def literal_highlight(matcher: Matcher, name: str) -> Content:
    """`name` with the matched letters styled, as literal text (a mark such as "[/]" is never
    read as markup, which Matcher.highlight would do)."""
    name = printable(name)
    content = Content(name)
    _, offsets = matcher.fuzzy_search.match(matcher.query, name)
    for at in offsets:
        if not name[at].isspace():
            content = content.stylize(matcher.match_style, at, at + 1)
    return content
