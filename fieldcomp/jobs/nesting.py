"""How deep a job file nests: refused past MAX_NESTING before the TOML reader or the validator
recurse into it (a few hundred levels of brackets would otherwise end in RecursionError)."""

from __future__ import annotations

import re
from typing import Any

MAX_NESTING = 10  # lists and tables inside one another
JOB_NESTING = 4  # the job's own deepest: [[beam]] -> point_loads -> one load's table

# What the bracket count skips: strings (multi-line first) and comments; then the brackets.
_TOKEN = re.compile(r'"""(?:[^\\]|\\.)*?"""|\'\'\'.*?\'\'\'|"(?:[^"\\\n]|\\.)*"|\'[^\'\n]*\'|#[^\n]*|[\[\]{}]', re.S)


_KEY = re.compile(r"\s*([A-Za-z0-9_.\-\"' ]+?)\s*=")
_HEADER = re.compile(r"^\s*(\[\[?[^\]\n]*\]\]?)", re.M)


def deep_line(text: str) -> str | None:
    """Where brackets ([ and {, outside strings and comments) first open more than MAX_NESTING
    deep ("line 31, key 'count' under [beam.studs]"), or None."""
    depth = 0
    for token in _TOKEN.finditer(text):
        mark = token.group()
        if mark in "[{":
            depth += 1
            if depth > MAX_NESTING:
                return _where(text, token.start())
        elif mark in "]}":
            depth = max(0, depth - 1)
    return None


def _where(text: str, pos: int) -> str:
    start = text.rfind("\n", 0, pos) + 1
    place = f"line {text.count(chr(10), 0, pos) + 1}"
    key = _KEY.match(text, start, pos)
    if key:
        place += f", key {key.group(1)[:40]!r}"
    headers = _HEADER.findall(text, 0, start)
    return place + (f" under {headers[-1][:60]}" if headers else "")


def deep_path(raw: Any) -> tuple[Any, ...] | None:
    """The path to a value nested more than MAX_NESTING lists and tables deep (dotted keys nest
    without brackets), or None. Iterative: the depth it measures cannot exhaust the stack."""
    stack: list[tuple[Any, tuple[Any, ...]]] = [(raw, ())]
    while stack:
        node, path = stack.pop()
        if len(path) > MAX_NESTING:
            return path
        if isinstance(node, dict):
            stack += [(value, path + (key,)) for key, value in node.items()]
        elif isinstance(node, list):
            stack += [(value, path + (i,)) for i, value in enumerate(node)]
    return None
