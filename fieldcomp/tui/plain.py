"""Text the workbench shows as it is: never read as Textual markup (a mark such as "[/]" would
stop the app) and without control characters (paths and system messages are not job text, which
the loader already keeps printable)."""

from __future__ import annotations

from textual.content import Content

from engine.model.text import printable_lines


def plain(text: object) -> Content:
    """`text` as literal content for a Static, a Label or a dialog."""
    return Content(printable_lines(text))
