"""User text made safe to print: names, marks and notes come from job files and inspection logs."""

from __future__ import annotations


def printable(text: object) -> str:
    """The text without control characters (kept out of terminals, XML, CSV and PDF)."""
    return "".join(ch for ch in str(text) if ch.isprintable())


def printable_lines(text: object) -> str:
    """The text without control characters but its line breaks (multi-line reports)."""
    return "\n".join(line if line.isprintable() else printable(line) for line in str(text).split("\n"))
