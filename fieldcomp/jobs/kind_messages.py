"""What a job-file value of the wrong kind is told: the kind expected, in the file's own terms
(numbers, whole numbers, true/false, text in quotes), and how to write it."""

from __future__ import annotations

import datetime
from typing import Any

KIND_ERRORS = ("float_type", "float_parsing", "int_type", "int_parsing", "int_from_float", "bool_type",
               "bool_parsing", "string_type", "literal_error")


def _numeric_text(value: Any) -> bool:
    try:
        float(value)
    except (TypeError, ValueError):
        return False
    return isinstance(value, str)


def kind_message(kind: str, message: str, value: Any) -> str:
    """The message for a pydantic error of type `kind` (one of KIND_ERRORS) on `value`."""
    if kind.startswith("float"):
        expected = "must be a number"
    elif kind.startswith("int"):
        expected = "must be a whole number"
    elif kind.startswith("bool"):
        return "must be true or false" + (", without quotes" if value in ("true", "false") else "")
    elif kind == "string_type":
        if isinstance(value, (datetime.date, datetime.time)):
            return "must be text in quotes (TOML reads a bare date or time as a date, not text)"
        return "must be text in quotes"
    else:
        return message.replace("Input should be", "must be")
    if isinstance(value, bool):
        return f"{expected}, not true or false"
    if _numeric_text(value):
        return f"{expected}, without quotes"
    return expected
