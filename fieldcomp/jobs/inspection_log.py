"""Inspection log import: a CSV file of stud findings read into `FindingIn` models.

Columns (header row required, any order, case and spaces ignored): `kind` (required), `rib` or
`station` (one per row), `count`, `note`, `date`, `reported_by`. Errors name the row as a
spreadsheet numbers it (header = row 1). Nothing is returned unless every row is valid.
"""

from __future__ import annotations

import csv
import io
import os
import re
from pathlib import Path

from pydantic import ValidationError

from fieldcomp.jobs.file_kinds import FileKindError, read_regular
from fieldcomp.jobs.model import FindingIn
from engine.model.errors import FieldcompError

_WHOLE = re.compile(r"[0-9]+")
COLUMNS = ("kind", "rib", "station", "count", "note", "date", "reported_by")
MAX_BYTES = 2 * 1024 * 1024
MAX_ROWS = 5000


class CsvImportError(FieldcompError, ValueError):
    """Bad inspection log. `problems` lists (row number or None, message)."""

    def __init__(self, path: str | os.PathLike[str], problems: list[tuple[int | None, str]]):
        self.path = str(path)
        self.problems = problems
        lines = [f"{self.path}: row {row}: {msg}" if row else f"{self.path}: {msg}" for row, msg in problems]
        super().__init__("\n".join(lines))


def read_findings_csv(path: str | os.PathLike[str]) -> list[tuple[int, FindingIn]]:
    """Read an inspection log file (a regular file of 2 MB at most); returns (row number,
    finding) pairs or raises CsvImportError."""
    p = Path(path)
    try:
        data = read_regular(p, MAX_BYTES, "inspection logs")
    except FileKindError as exc:
        raise CsvImportError(p, [(None, exc.reason)]) from None
    try:
        text = data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise CsvImportError(p, [(None, f"not UTF-8 text (byte {exc.start})")]) from None
    return parse_findings_csv(text, p)


def _column(name: str) -> str:
    return name.strip().lower().replace("-", "_").replace(" ", "_")


def _rows(text: str, path: str | os.PathLike[str]) -> list[list[str]]:
    """The CSV records, one per line. A quote left open would swallow the rows after it into
    one cell: an unclosed quote, a quote closing mid-cell and a cell running over lines are
    refused, naming the row (one row per line, as a spreadsheet numbers them)."""
    reader = csv.reader(io.StringIO(text, newline=""), strict=True)
    rows: list[list[str]] = []
    while True:
        start = reader.line_num + 1
        try:
            cells = next(reader)
        except StopIteration:
            return rows
        except csv.Error as exc:
            why = ("a quote opened there is never closed" if "end of data" in str(exc)
                   else f"{exc}: a quote inside a quoted cell is written twice (\"\")" if "expected after" in str(exc)
                   else f"not readable as CSV: {exc}")
            raise CsvImportError(path, [(start, why)]) from None
        if reader.line_num > start:
            raise CsvImportError(path, [(start, f"a cell runs over lines {start}-{reader.line_num} (a quote left open?); "
                                                "each cell of an inspection log is one line")])
        rows.append(cells)


def parse_findings_csv(text: str, path: str | os.PathLike[str] = "<csv>") -> list[tuple[int, FindingIn]]:
    """Parse inspection-log text; every bad row is reported at once, with its row number."""
    rows = _rows(text.removeprefix("\ufeff"), path)
    if not rows:
        raise CsvImportError(path, [(None, "the file is empty; it needs a header row: " + ", ".join(COLUMNS))])
    header = [_column(c) for c in rows[0]]
    problems: list[tuple[int | None, str]] = []
    for name in header:
        if name not in COLUMNS:
            problems.append((1, f"unknown column {name!r}; columns are {', '.join(COLUMNS)}"))
        elif header.count(name) > 1:
            problems.append((1, f"column {name!r} appears more than once"))
    if "kind" not in header:
        problems.append((1, "a 'kind' column is required"))
    if "rib" not in header and "station" not in header:
        problems.append((1, "a 'rib' or a 'station' column is required"))
    if len(rows) - 1 > MAX_ROWS:
        problems.append((None, f"{len(rows) - 1} rows; at most {MAX_ROWS} are read"))
    if problems:
        raise CsvImportError(path, sorted(set(problems), key=lambda p: (p[0] or 0, p[1])))
    found: list[tuple[int, FindingIn]] = []
    for number, cells in enumerate(rows[1:], start=2):
        if not any(c.strip() for c in cells):
            continue
        if len(cells) > len(header):
            problems.append((number, f"{len(cells)} cells but the header has {len(header)} columns"))
            continue
        try:
            found.append((number, _finding(dict(zip(header, (c.strip() for c in cells))))))
        except _RowProblemError as exc:
            problems.extend((number, msg) for msg in exc.messages)
    if problems:
        raise CsvImportError(path, problems)
    if not found:
        raise CsvImportError(path, [(None, "no findings in the file (only a header or blank rows)")])
    return found


class _RowProblemError(FieldcompError, ValueError):
    def __init__(self, messages: list[str]):
        super().__init__("; ".join(messages))
        self.messages = messages


def _short(value: object) -> str:
    text = repr(value)
    return text if len(text) <= 60 else text[:57] + "..."


def _finding(cells: dict[str, str]) -> FindingIn:
    raw: dict[str, object] = {}
    messages: list[str] = []
    for name, value in cells.items():
        if value == "":
            continue
        if name in ("rib", "count"):
            if _WHOLE.fullmatch(value):
                raw[name] = int(value)
            else:
                messages.append(f"column '{name}': {_short(value)} is not a whole number (digits 0-9)")
        elif name == "kind":
            raw[name] = value.lower()
        else:
            raw[name] = value
    if messages:
        raise _RowProblemError(messages)
    try:
        return FindingIn.model_validate(raw)
    except ValidationError as exc:
        for err in exc.errors():
            field = ".".join(str(x) for x in err["loc"])
            msg = err["msg"].removeprefix("Value error, ")
            if err["type"] == "missing":
                msg = "required, left blank"
            elif "input" in err and field:
                msg = f"{msg} (got {_short(err['input'])})"
            messages.append(f"column '{field}': {msg}" if field else msg)
        raise _RowProblemError(messages) from None
