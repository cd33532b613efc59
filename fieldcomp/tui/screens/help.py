"""Help screen: every key with what it does, the panes, how lengths are typed, the caution."""

from __future__ import annotations

from rich.table import Table
from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.screen import ModalScreen
from textual.widgets import Static

from fieldcomp import CAUTION

PANES = (
    ("Beam", "inputs of the beam and the finished-beam checks with the strength along the span"),
    ("Pour", "pour stages: add, edit, remove; deflection of each stage and in total"),
    ("Camber", "camber to order, the tolerance envelope, warnings"),
    ("Studs", "the beam drawn with its ribs and studs; the marks"),
    ("Findings", "inspection findings: enter or import; as-built strength, verdict, repair"),
    ("Sheet", "preview and write the marks sheet (SVG and CSV)"),
)
TYPING = (
    "Lengths carry units, as people write them: 32'-6 1/2\", 45 ft, 6.5 in, 3/4 in, 1650 mm.",
    "A field is checked a moment after the last key, with the job-file loader's own message; Enter or",
    "leaving the field applies it and the panes recompute. Keys typed in a field are text (1-6, [ and ]",
    "switch panes and beams only outside fields). Undo and redo step through the last edits.",
    "The beam list gives each beam's verdict as designed, during construction and as built (with",
    "findings): pass, review or fail with the governing ratio; f3 shows or hides it.",
)


class HelpScreen(ModalScreen[None]):
    CSS_PATH = "help.tcss"
    BINDINGS = [Binding("escape,f1,q", "dismiss", "Close", id="help.close", tooltip="Close the help screen.")]

    def __init__(self, bindings: list[Binding], local: list[tuple[str, list[Binding]]]) -> None:
        super().__init__()
        self.bindings, self.local = bindings, local

    def compose(self) -> ComposeResult:
        keys = Table(box=None, padding=(0, 2), show_header=True, header_style="bold")
        keys.add_column("key")
        keys.add_column("does")
        keys.add_column("")
        for b in self.bindings:
            keys.add_row(Text(self.app.get_key_display(b), style="bold"), b.description, Text(b.tooltip, style="dim"))
        for where, bindings in self.local:
            keys.add_row("", Text(f"in the {where}:", style="italic"), "")
            for b in bindings:
                keys.add_row(Text(self.app.get_key_display(b), style="bold"), b.description,
                             Text(b.tooltip, style="dim"))
        panes = Table(box=None, padding=(0, 2), show_header=False)
        for k, (name, what) in enumerate(PANES, start=1):
            panes.add_row(Text(f"{k}  {name}", style="bold"), what)
        with VerticalScroll(id="help-box"):
            yield Static(Text("fieldcomp workbench: keys", style="bold"), classes="help--title")
            yield Static(keys)
            yield Static(Text("Panes (keys 1-6 outside text fields)", style="bold"), classes="help--title")
            yield Static(panes)
            yield Static(Text("Typing values", style="bold"), classes="help--title")
            yield Static("\n".join(TYPING))
            yield Static(Text(f"Caution: {CAUTION}", style="bold"), classes="help--caution")
            yield Static(Text("Escape closes this screen.", style="dim"))
