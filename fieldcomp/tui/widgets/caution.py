"""The caution, always on screen in one line."""

from __future__ import annotations

from textual.widgets import Static

from fieldcomp import CAUTION


class CautionLine(Static):
    DEFAULT_CSS = """
    CautionLine { height: 1; width: 1fr; padding: 0 1; text-wrap: nowrap; text-overflow: ellipsis;
                  background: $warning 18%; color: $foreground; }
    """

    def __init__(self) -> None:
        super().__init__(CAUTION, id="caution", markup=False)
        self.tooltip = CAUTION
