"""Messages of the workbench: edits asked for by panes, results posted back by workers."""

from __future__ import annotations

from typing import Any

from textual.message import Message

from fieldcomp.tui.session import Path_


class EditRequested(Message):
    """Set the field at `path` from typed `text` (already validated inline)."""

    def __init__(self, path: Path_, text: str) -> None:
        super().__init__()
        self.path = path
        self.text = text


class RowsSet(Message):
    """Replace the rows of the table at `path` (pour stages, findings) as one edit."""

    def __init__(self, path: Path_, rows: list[dict[str, Any]], description: str) -> None:
        super().__init__()
        self.path = path
        self.rows = rows
        self.description = description


class RowRemoved(Message):
    """Remove row `index` of the table at `path`."""

    def __init__(self, path: Path_, index: int, description: str) -> None:
        super().__init__()
        self.path = path
        self.index = index
        self.description = description


class ResultsReady(Message):
    """A worker computed some beams of job `version` (first pass): `updates` holds (beam index,
    outcome) pairs, one batch per message; `started` is when the change reached the app."""

    def __init__(self, version: int, updates: list[tuple[int, Any]], started: float) -> None:
        super().__init__()
        self.version = version
        self.updates = updates
        self.started = started


class OutcomeFinished(Message):
    """The second pass (marks sheets, repair) finished the beams in `updates` of job `version`."""

    def __init__(self, version: int, updates: list[tuple[int, Any]], started: float) -> None:
        super().__init__()
        self.version = version
        self.updates = updates
        self.started = started


class BeamSelected(Message):
    """The beam list moved to beam `index`."""

    def __init__(self, index: int) -> None:
        super().__init__()
        self.index = index
