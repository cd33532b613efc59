"""The caution, always on screen in full (one line on a wide terminal, wrapped on a narrow one)."""

from __future__ import annotations

from textual.widgets import Static

from fieldcomp import CAUTION


class CautionLine(Static):
    DEFAULT_CSS = """
    CautionLine { height: auto; max-height: 3; width: 1fr; padding: 0 1;
                  background: $warning 18%; color: $foreground; }
    """

    def __init__(self) -> None:
        super().__init__(CAUTION, id="caution", markup=False)
        self.tooltip = CAUTION
