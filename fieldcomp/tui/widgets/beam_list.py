"""The beam list: every mark with its verdicts in labelled columns (as designed, construction,
as built when the beam has findings), each the level and its governing ratio.

Drawn line by line (a scroll view): a 2,000-beam job costs the lines on screen, and a result
replaces its own row only."""

from __future__ import annotations

from rich.segment import Segment
from rich.style import Style
from rich.text import Text
from textual import events
from textual.binding import Binding
from textual.geometry import Size
from textual.message import Message
from textual.scroll_view import ScrollView
from textual.strip import Strip

from engine.model.text import printable
from fieldcomp.tui.messages import BeamSelected
from fieldcomp.tui.outcome import BeamOutcome
from fieldcomp.tui.widgets.verdict import beam_cells

COLUMNS = ("beam", "as designed", "construction", "as built")
CELL = len("review 1.02")  # the widest verdict cell
MARK_WIDTH = (4, 16)  # the mark column fits the longest mark within these widths (longer marks scroll)


class BeamList(ScrollView, can_focus=True):
    """One row per beam under a header that stays; moving the cursor selects the beam for the
    panes, Enter picks it (on a narrow screen the list then gives the panes back)."""

    BINDINGS = [
        Binding("plus", "app.duplicate_beam", "Copy beam", id="beams.duplicate",
                tooltip="Copy the selected beam (new mark) after it."),
        Binding("minus", "app.remove_beam", "Remove beam", id="beams.remove",
                tooltip="Remove the selected beam (undo brings it back)."),
        Binding("up", "move(-1)", "Up", show=False),
        Binding("down", "move(1)", "Down", show=False),
        Binding("pageup", "move(-20)", "Page up", show=False),
        Binding("pagedown", "move(20)", "Page down", show=False),
        Binding("home", "move(-1000000)", "First", show=False),
        Binding("end", "move(1000000)", "Last", show=False),
        Binding("enter", "pick", "Pick", show=False),
    ]
    COMPONENT_CLASSES = {"beam-list--header", "beam-list--cursor", "beam-list--even"}

    class Picked(Message):
        """Enter on a beam."""

    def __init__(self, *, id: str | None = None) -> None:
        super().__init__(id=id)
        self.marks: list[str] = []
        self.rows: list[tuple[Text, Text, Text, Text]] = []
        self.cursor = 0
        self.widths = (MARK_WIDTH[0], *(max(CELL, len(c)) for c in COLUMNS[1:]))

    # -- data ---------------------------------------------------------------------------------------
    def show(self, marks: list[str], outcomes: list[BeamOutcome | None], selected: int,
             changed: list[int] | None = None) -> None:
        """Show the rows of `changed` beams (every row when None, or when the beams changed)."""
        if changed is None or marks != self.marks:
            self.marks = list(marks)
            self.rows = [(Text(printable(m)), *beam_cells(o)) for m, o in zip(marks, outcomes)]
            longest = max((len(r[0].plain) for r in self.rows), default=0)
            self.widths = (max(MARK_WIDTH[0], min(longest, MARK_WIDTH[1])), *self.widths[1:])
            self.virtual_size = Size(sum(self.widths) + 2 * len(self.widths), len(self.rows) + 1)
            self.refresh()
        else:
            for k in changed:
                self.rows[k] = (self.rows[k][0], *beam_cells(outcomes[k]))
                self._refresh_row(k)
        self.border_title = f"Beams ({len(marks)})"
        self._set_cursor(selected, announce=False)

    def row_cells(self, k: int) -> list[str]:
        """The text of row `k`'s cells (mark, as designed, construction, as built)."""
        return [cell.plain for cell in self.rows[k]]

    # -- cursor -------------------------------------------------------------------------------------
    def _set_cursor(self, k: int, announce: bool = True) -> None:
        if not self.rows:
            return
        k = max(0, min(k, len(self.rows) - 1))
        if k != self.cursor:
            old, self.cursor = self.cursor, k
            self._refresh_row(old)
            self._refresh_row(k)
            if announce:
                self.post_message(BeamSelected(k))
        body = max(1, self.scrollable_content_region.height - 1)
        top = int(self.scroll_y)
        if k < top:
            self.scroll_to(y=k, animate=False)
        elif k >= top + body:
            self.scroll_to(y=k - body + 1, animate=False)

    def action_move(self, step: int) -> None:
        self._set_cursor(self.cursor + step)

    def action_pick(self) -> None:
        self.post_message(self.Picked())

    def on_click(self, event: events.Click) -> None:
        if event.y >= 1:
            self._set_cursor(int(self.scroll_y) + event.y - 1)

    def _refresh_row(self, k: int) -> None:
        y = k - int(self.scroll_y) + 1
        if 1 <= y < self.size.height:
            self.refresh_line(y)

    # -- drawing ------------------------------------------------------------------------------------
    def _line(self, cells: tuple[Text, ...], style: Style) -> Strip:
        line = Text(style=style, no_wrap=True, overflow="crop", end="")
        for cell, width in zip(cells, self.widths):
            part = cell.copy()
            part.truncate(width, overflow="ellipsis", pad=True)
            line.append(" ")
            line.append_text(part)
            line.append(" ")
        segments = list(line.render(self.app.console))
        strip = Strip(segments).crop(int(self.scroll_x), int(self.scroll_x) + self.size.width)
        return strip.extend_cell_length(self.size.width, style)

    def render_line(self, y: int) -> Strip:
        base = self.rich_style
        if y == 0:
            header = tuple(Text(name) for name in COLUMNS)
            return self._line(header, base + self.get_component_rich_style("beam-list--header"))
        k = int(self.scroll_y) + y - 1
        if not 0 <= k < len(self.rows):
            return Strip([Segment(" " * self.size.width, base)])
        if k == self.cursor:
            style = base + self.get_component_rich_style("beam-list--cursor")
        elif k % 2:
            style = base + self.get_component_rich_style("beam-list--even")
        else:
            style = base
        return self._line(self.rows[k], style)
