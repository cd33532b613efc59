"""New tables appended to one beam of a job file's text, every other byte left as it was.

An import adds findings (and the inspection reports they name) to a beam: the new `[[beam.finding]]`
and `[[beam.report]]` tables are written at the end of that beam's section (after its last
table, before any comment lines that lead into the next beam), in the file's own line ending,
its byte-order mark kept. Nothing else is re-written: comments, order, spacing and quoting of the
rest of the file are the bytes it had. TOML 1.0 (array of tables): a `[[beam.finding]]` header
adds an element to the `finding` array of the last `[[beam]]` above it.
"""

from __future__ import annotations

import re
from dataclasses import dataclass
from typing import Any

import tomli_w

from engine.model.errors import FieldcompError

_BOM = b"\xef\xbb\xbf"
_HEADER = re.compile(r"\s*(\[\[?)\s*([A-Za-z0-9_-]+(?:\s*\.\s*[A-Za-z0-9_-]+)*)\s*(\]\]?)\s*(?:#.*)?\r?")


class AppendError(FieldcompError, ValueError):
    """The beam's section cannot be found in the text (e.g. beams written as an inline array)."""


@dataclass(frozen=True, slots=True)
class Header:
    line: int  # 0-based line index
    name: str | None  # dotted name without spaces; None where quoted keys make it unreadable here
    array: bool  # [[...]]


def _line_starts_header(line: str) -> bool:
    return line.lstrip(" \t").startswith("[")


def headers(text: str) -> list[Header]:
    """The table headers of TOML text, line by line: a line starting with `[` outside any
    string, multi-line string or multi-line array value."""
    out: list[Header] = []
    quote: str | None = None  # the open string's delimiter: " ' \"\"\" '''
    depth = 0  # open brackets and braces of a value
    for number, line in enumerate(text.split("\n")):
        if quote in ('"', "'"):
            quote = None  # a one-line string cannot run over lines
        if quote is None and depth == 0 and _line_starts_header(line):
            m = _HEADER.fullmatch(line)
            name = re.sub(r"\s+", "", m.group(2)) if m and (m.group(1) == "[[") == (m.group(3) == "]]") else None
            out.append(Header(number, name, line.lstrip(" \t").startswith("[[")))
            continue
        i = 0
        while i < len(line):
            ch = line[i]
            if quote is None:
                if ch == "#":
                    break
                if ch in "\"'":
                    quote = ch * 3 if line.startswith(ch * 3, i) else ch
                    i += len(quote)
                    continue
                depth += 1 if ch in "[{" else -1 if ch in "]}" else 0
            elif quote in ('"', '"""') and ch == "\\":
                i += 2
                continue
            elif line.startswith(quote, i):
                run = len(line[i:]) - len(line[i:].lstrip(quote[0]))
                i += max(run, len(quote)) if len(quote) == 3 else 1
                quote = None
                continue
            i += 1
    return out


def beam_section(text: str, index: int, beams: int) -> tuple[int, int]:
    """(first line, line after the last) of the `index`-th of `beams` `[[beam]]` sections."""
    found = headers(text)
    if any(h.name is None for h in found):
        raise AppendError("a table header with quoted keys is not read here")
    starts = [h for h in found if h.name == "beam" and h.array]
    if len(starts) != beams:
        raise AppendError(f"{len(starts)} [[beam]] headers for {beams} beams (beams written inline?)")
    start = starts[index].line
    after = [h.line for h in found if h.line > start and not h.name.startswith("beam.")]  # type: ignore[union-attr]
    return start, after[0] if after else len(text.split("\n"))


def _newline(text: str) -> str:
    crlf = text.count("\r\n")
    return "\r\n" if crlf and crlf * 2 >= text.count("\n") else "\n"


def table_text(name: str, values: dict[str, Any], newline: str = "\n") -> str:
    """One `[[beam.NAME]]` table with its keys (tomli_w renders the values), ending in a newline."""
    body = tomli_w.dumps(values)
    return f"[[beam.{name}]]\n{body}".replace("\n", newline)


def append_tables(data: bytes, index: int, beams: int, tables: list[tuple[str, dict[str, Any]]]) -> bytes:
    """`data` (a job file's bytes, UTF-8 with or without a byte-order mark) with `tables`
    ((array name, values) pairs, e.g. ("finding", {...})) appended to beam `index` of `beams`.
    Raises AppendError where the section cannot be found; every other byte is kept."""
    bom = _BOM if data.startswith(_BOM) else b""
    text = data[len(bom):].decode("utf-8")
    newline = _newline(text)
    if text and not text.endswith("\n"):
        text += newline  # the last line gets its line ending, so the new tables start on a line of their own
    start, end = beam_section(text, index, beams)
    lines = text.split("\n")
    at = end
    while at - 1 > start and (not lines[at - 1].strip() or lines[at - 1].lstrip().startswith("#")):
        at -= 1
    block = "".join(table_text(name, values, newline) for name, values in tables)
    new = block.split("\n")[:-1]  # one entry per line, each keeping its "\r" where the file has CRLF
    return bom + "\n".join(lines[:at] + new + lines[at:]).encode("utf-8")
