"""Typed text to job-file values: what a person types in a field ('50', 'true', '30 ft') becomes
the value the job file would hold there (a number, a boolean, text), so typed edits meet the same
strict loader as files. Text that is not of the field's kind stays text, and the loader says
what was expected."""

from __future__ import annotations

import re
import types
import typing
from typing import Any

from pydantic import BaseModel

from fieldcomp.jobs.model import Job

_WHOLE = re.compile(r"[+-]?[0-9]+")
_DECIMAL = re.compile(r"[+-]?(?:[0-9]+\.?[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]+)?")


def _kinds(annotation: Any) -> list[Any]:
    """The plain types an annotation allows (unions, Optional, Annotated and list unwrapped)."""
    origin = typing.get_origin(annotation)
    if origin is typing.Annotated:
        return _kinds(typing.get_args(annotation)[0])
    if origin in (typing.Union, types.UnionType, list):
        return [k for arg in typing.get_args(annotation) for k in _kinds(arg)]
    return [annotation]


def field_kinds(path: tuple[str | int, ...]) -> list[Any]:
    """The types the job model allows at `path` (("beam", 0, "studs", "count") -> [int, Literal]);
    [] when the path names no field."""
    model: type[BaseModel] | None = Job
    kinds: list[Any] = []
    for part in path:
        if isinstance(part, int):
            continue
        if model is None or part not in model.model_fields:
            return []
        kinds = _kinds(model.model_fields[part].annotation)
        model = next((k for k in kinds if isinstance(k, type) and issubclass(k, BaseModel)), None)
    return kinds


def value_from_text(path: tuple[str | int, ...], text: str) -> Any:
    """The value for typed `text` at `path`: a boolean for true/false, a number where the field
    takes numbers (ASCII digits only), otherwise the text itself."""
    kinds = field_kinds(path)
    if bool in kinds and text.lower() in ("true", "false"):
        return text.lower() == "true"
    if int in kinds and _WHOLE.fullmatch(text):
        return int(text)
    if float in kinds and _DECIMAL.fullmatch(text):
        return float(text)
    return text
