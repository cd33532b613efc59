"""Small modal dialogs: a question with buttons, and a file name prompt."""

from __future__ import annotations

from pathlib import Path

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.screen import ModalScreen
from textual.widgets import Button, Input, Label, Static

from fieldcomp.tui.plain import plain


class Choice(ModalScreen[str]):
    """Ask a question; dismisses with the id of the button pressed ("cancel" on Escape)."""

    CSS_PATH = "dialogs.tcss"
    BINDINGS = [Binding("escape", "dismiss('cancel')", "Cancel", id="dialog.cancel",
                        tooltip="Close this question without doing anything.")]

    def __init__(self, title: str, text: str, buttons: list[tuple[str, str, str]], *, id: str | None = None) -> None:
        """`buttons`: (id, label, variant) in order; the first one has the focus."""
        super().__init__(id=id)
        self.title_text, self.text, self.buttons = title, text, buttons

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog"):
            yield Label(plain(self.title_text), classes="dialog--title")
            yield Static(plain(self.text), classes="dialog--text")
            with Horizontal(classes="dialog--buttons"):
                for key, label, variant in self.buttons:
                    yield Button(label, id=key, variant=variant)  # type: ignore[arg-type]

    def on_mount(self) -> None:
        self.query(Button).first().focus()

    def on_button_pressed(self, event: Button.Pressed) -> None:
        event.stop()
        self.dismiss(event.button.id or "cancel")


class AskPath(ModalScreen[Path | None]):
    """Ask for a file name; dismisses with the path, or None on Escape."""

    CSS_PATH = "dialogs.tcss"
    BINDINGS = [Binding("escape", "dismiss(None)", "Cancel", id="dialog.cancel",
                        tooltip="Close without choosing a file.")]

    def __init__(self, title: str, initial: str, hint: str = "") -> None:
        super().__init__()
        self.title_text, self.initial, self.hint = title, initial, hint

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog"):
            yield Label(plain(self.title_text), classes="dialog--title")
            yield Input(self.initial, id="path")
            yield Static(plain(self.hint or "Enter accepts, Escape cancels."), classes="dialog--text")

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        text = event.value.strip()
        self.dismiss(Path(text).expanduser() if text else None)
