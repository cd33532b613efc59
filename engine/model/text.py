"""User text made safe to print: names, marks and notes come from job files and inspection logs."""

from __future__ import annotations

import re

_ASCII_CONTROL = re.compile(r"[\x00-\x09\x0b-\x1f\x7f]")  # what str.isprintable refuses in ASCII, less the line break


def printable(text: object) -> str:
    """The text without control characters (kept out of terminals, XML, CSV and PDF)."""
    text = str(text)
    return text if text.isprintable() else "".join(ch for ch in text if ch.isprintable())


def printable_lines(text: object) -> str:
    """The text without control characters but its line breaks (multi-line reports)."""
    text = str(text)
    if text.isascii() and _ASCII_CONTROL.search(text) is None:
        return text
    return "\n".join(line if line.isprintable() else printable(line) for line in text.split("\n"))
