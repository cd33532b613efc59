"""Minimal edits to the [[beam]] blocks of a job file's text: one key's value replaced in its own
line (the comment after it kept), a key added after the beam's last key or its line removed.
Every other line stays byte for byte as it was."""

from __future__ import annotations

import re
from dataclasses import dataclass
from typing import Any

from engine.model.errors import FieldcompError
from fieldcomp.jobs.floor_text import value_text

_HEADER = re.compile(r"^\s*(\[\[?)\s*([A-Za-z0-9_.\-]+)\s*\]\]?\s*(?:#.*)?$")
_KEY = r"^(\s*{key}\s*=\s*)"


class BeamTextError(FieldcompError, ValueError):
    """A job's text has a form the minimal edit does not handle (the file is left unchanged)."""


@dataclass(frozen=True, slots=True)
class Span:
    start: int  # the [[beam]] header line
    end: int  # one past the block's last line (comments just above the next header excluded)


def _headers(lines: list[str]) -> list[tuple[int, str, bool]]:
    """(line index, table name, is an array of tables) of every header outside multi-line strings."""
    found, inside = [], False
    for i, line in enumerate(lines):
        quotes = line.count('"""') + line.count("'''")
        if not inside:
            m = _HEADER.match(line)
            if m:
                found.append((i, m.group(2), m.group(1) == "[["))
        if quotes % 2:
            inside = not inside
    return found


def _trim(lines: list[str], start: int, end: int) -> int:
    """`end` moved up past blank and comment lines (they belong to what follows)."""
    while end > start + 1 and (not lines[end - 1].strip() or lines[end - 1].lstrip().startswith("#")):
        end -= 1
    return end


def beam_spans(lines: list[str]) -> list[Span]:
    heads = _headers(lines)
    spans = []
    for n, (i, name, array) in enumerate(heads):
        if name == "beam" and array:
            nxt = next((j for j, other, _ in heads[n + 1:] if not other.startswith("beam.")), len(lines))
            spans.append(Span(i, _trim(lines, i, nxt)))
    return spans


def _own_end(block: list[str]) -> int:
    """One past the beam's own last key line (before its first sub-table)."""
    first_sub = next((i for i, _, _ in _headers(block) if i > 0), len(block))
    return _trim(block, 0, first_sub)


def _value_end(line: str, pos: int) -> int:
    """Index just past the TOML value starting at `pos` on this line."""
    depth, i, quote = 0, pos, ""
    while i < len(line):
        ch = line[i]
        if quote:
            if ch == "\\" and quote == '"':
                i += 1
            elif ch == quote:
                quote = ""
                if depth == 0:
                    return i + 1
        elif ch in "\"'":
            quote = ch
        elif ch in "[{":
            depth += 1
        elif ch in "]}":
            depth -= 1
            if depth == 0:
                return i + 1
        elif depth == 0 and (ch.isspace() or ch == "#"):
            return i
        i += 1
    if quote or depth:
        raise BeamTextError("a value runs over more than one line")
    return i


def _key_line(block: list[str], key: str) -> int | None:
    pattern = re.compile(_KEY.format(key=re.escape(key)))
    return next((i for i in range(1, _own_end(block)) if pattern.match(block[i])), None)


def set_key(block: list[str], key: str, value: Any) -> None:
    """Replace the value on `key`'s line, keeping the rest of the line; or add the key."""
    text = value_text(value)
    i = _key_line(block, key)
    if i is None:
        if any(name == f"beam.{key}" for _, name, _ in _headers(block)):
            raise BeamTextError(f"'{key}' is written as a [beam.{key}] table; write it as {key} = ... to re-import")
        block.insert(_own_end(block), f"{key} = {text}\n")
        return
    line = block[i]
    m = re.match(_KEY.format(key=re.escape(key)), line)
    assert m is not None
    try:
        end = _value_end(line, m.end())
    except BeamTextError:
        raise BeamTextError(f"'{key}' runs over more than one line; write it on one line to re-import") from None
    block[i] = line[: m.end()] + text + line[end:]


def delete_key(block: list[str], key: str) -> None:
    i = _key_line(block, key)
    if i is not None:
        block.pop(i)
