"""One guard for every CSV fieldcomp writes: user text cannot become a spreadsheet formula."""

from __future__ import annotations

from engine.model.text import printable

FORMULA_START = ("=", "+", "-", "@", "\t", "\r")  # spreadsheet formula triggers (OWASP CSV injection)


def csv_cell(value: str) -> str:
    """A user-text cell without control characters, a leading = + - @ escaped with ' so a
    spreadsheet does not run it as a formula; numbers are written by the caller as numbers."""
    value = printable(value)
    return "'" + value if value.startswith(FORMULA_START) else value
