"""The beam list: every mark with a one-word verdict and its governing ratio."""

from __future__ import annotations

from rich.text import Text
from textual.binding import Binding
from textual.widgets import OptionList
from textual.widgets.option_list import Option

from fieldcomp.tui.messages import BeamSelected
from fieldcomp.views.numbers import ratio_text


class BeamList(OptionList):
    """Marks with verdicts; moving the highlight selects the beam for the panes."""

    BINDINGS = [
        Binding("plus", "app.duplicate_beam", "Copy beam", id="beams.duplicate",
                tooltip="Copy the selected beam (new mark) after it."),
        Binding("minus", "app.remove_beam", "Remove beam", id="beams.remove",
                tooltip="Remove the selected beam (undo brings it back)."),
    ]

    DEFAULT_CSS = """
    BeamList { width: 26; height: 1fr; border: round $primary 40%; border-title-color: $foreground; }
    BeamList:focus { border: round $primary; }
    """

    def show(self, marks: list[str], verdicts: list[tuple[str, float | None]], selected: int) -> None:
        """Replace the rows; `verdicts` holds (word, governing ratio) per beam."""
        rows = []
        for k, (mark, (word, ratio)) in enumerate(zip(marks, verdicts)):
            text = Text(f"{mark:<11.11}")
            style = {"pass": "bold green", "review": "bold yellow", "fail": "bold red",
                     "error": "bold magenta"}.get(word, "dim")
            text.append(f" {word:<5}", style=style)
            if ratio is not None:
                text.append(f" {ratio_text(ratio):>4}", style="dim")
            rows.append(Option(text, id=f"beam-{k}"))
        with self.prevent(OptionList.OptionHighlighted):
            self.set_options(rows)
            if rows:
                self.highlighted = min(selected, len(rows) - 1)
        self.border_title = f"Beams ({len(rows)})"

    def on_option_list_option_highlighted(self, event: OptionList.OptionHighlighted) -> None:
        event.stop()
        if event.option_index is not None:
            self.post_message(BeamSelected(event.option_index))
