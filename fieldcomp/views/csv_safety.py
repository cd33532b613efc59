"""One guard for every CSV fieldcomp writes: user text cannot become a spreadsheet formula."""

from __future__ import annotations

from engine.model.text import printable

# spreadsheet formula triggers (OWASP CSV injection), and their full-width forms (common practice)
FORMULA_START = ("=", "+", "-", "@", "\t", "\r", "\uff1d", "\uff0b", "\uff0d", "\uff20")


def csv_cell(value: str) -> str:
    """A user-text cell without control characters, a leading = + - @ escaped with ' so a
    spreadsheet does not run it as a formula; numbers are written by the caller as numbers."""
    value = printable(value)
    return "'" + value if value.startswith(FORMULA_START) else value
