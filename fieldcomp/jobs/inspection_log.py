"""Inspection log import: a CSV file of stud findings read into `FindingIn` models, as logs really
are written.

Columns (header row required, any order, case and spaces ignored): `kind` (required), `rib` or
`station` (one per row), `count`, `note`, `date`, `reported_by`, `found`, `report`. Any other
column is ignored with a warning (a log often carries the inspector's own columns). The
separator, comma, semicolon or tab, is detected from the header row and named in every error.
Errors name the row as a spreadsheet numbers it (header = row 1). Nothing is returned unless
every row is valid.
"""

from __future__ import annotations

import csv
import io
import os
import re
from dataclasses import dataclass
from pathlib import Path

from pydantic import ValidationError

from fieldcomp.jobs.file_kinds import FileKindError, read_regular
from fieldcomp.jobs.model import FindingIn
from engine.model.errors import FieldcompError

_WHOLE = re.compile(r"[0-9]+")
COLUMNS = ("kind", "rib", "station", "count", "note", "date", "reported_by", "found", "report")
SEPARATORS = {",": "comma", ";": "semicolon", "\t": "tab"}
MAX_BYTES = 2 * 1024 * 1024
MAX_ROWS = 5000


class CsvImportError(FieldcompError, ValueError):
    """Bad inspection log. `problems` lists (row number or None, message); `separator` names the
    separator the log was read with (None when it was not read that far)."""

    def __init__(self, path: str | os.PathLike[str], problems: list[tuple[int | None, str]],
                 separator: str | None = None):
        self.path = str(path)
        self.problems = problems
        self.separator = separator
        lines = [f"{self.path}: row {row}: {msg}" if row else f"{self.path}: {msg}" for row, msg in problems]
        if separator is not None:
            lines.append(f"{self.path}: read as {SEPARATORS[separator]}-separated (detected from the header row)")
        super().__init__("\n".join(lines))


@dataclass(frozen=True, slots=True)
class InspectionLog:
    """A log read in full: (row number, finding) pairs, warnings (columns ignored), the separator."""

    rows: list[tuple[int, FindingIn]]
    warnings: list[str]
    separator: str

    @property
    def separator_name(self) -> str:
        return SEPARATORS[self.separator]


def read_log(path: str | os.PathLike[str]) -> InspectionLog:
    """Read an inspection log file (a regular file of 2 MB at most, UTF-8 with or without a
    byte-order mark) or raise CsvImportError."""
    p = Path(path)
    try:
        data = read_regular(p, MAX_BYTES, "inspection logs")
    except FileKindError as exc:
        raise CsvImportError(p, [(None, exc.reason)]) from None
    try:
        text = data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise CsvImportError(p, [(None, f"not UTF-8 text (byte {exc.start})")]) from None
    return parse_log(text, p)


def read_findings_csv(path: str | os.PathLike[str]) -> list[tuple[int, FindingIn]]:
    """The (row number, finding) pairs of `read_log`."""
    return read_log(path).rows


def parse_findings_csv(text: str, path: str | os.PathLike[str] = "<csv>") -> list[tuple[int, FindingIn]]:
    """The (row number, finding) pairs of `parse_log`."""
    return parse_log(text, path).rows


def _column(name: str) -> str:
    return name.strip().lower().replace("-", "_").replace(" ", "_")


def detect_separator(text: str) -> str:
    """The separator of the header row (the first line that is not blank): the one of comma,
    semicolon and tab that splits it into the most known column names; on a tie the one it holds
    most often; a header of one column is comma-separated."""
    first = next((line for line in text.splitlines() if line.strip()), "")

    def score(sep: str) -> tuple[int, int]:
        cells = next(csv.reader([first], delimiter=sep), [])
        return sum(_column(c) in COLUMNS for c in cells), first.count(sep)

    return max(SEPARATORS, key=score)


def _rows(text: str, path: str | os.PathLike[str], sep: str) -> list[list[str]]:
    """The CSV records, one per line. A quote left open would swallow the rows after it into
    one cell: an unclosed quote, a quote closing mid-cell and a cell running over lines are
    refused, naming the row (one row per line, as a spreadsheet numbers them)."""
    reader = csv.reader(io.StringIO(text, newline=""), delimiter=sep, strict=True)
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
            raise CsvImportError(path, [(start, why)], sep) from None
        if reader.line_num > start:
            raise CsvImportError(path, [(start, f"a cell runs over lines {start}-{reader.line_num} (a quote left open?); "
                                                "each cell of an inspection log is one line")], sep)
        rows.append(cells)


def _header(names: list[str]) -> tuple[list[str | None], list[str], list[tuple[int | None, str]]]:
    """Each column's name (None: ignored), the warnings for ignored columns, header problems."""
    header: list[str | None] = []
    warnings: list[str] = []
    problems: list[tuple[int | None, str]] = []
    for i, raw in enumerate(names, start=1):
        name = _column(raw)
        if name in COLUMNS:
            if name in header:
                problems.append((1, f"column {name!r} appears more than once"))
            header.append(name)
            continue
        header.append(None)
        label = f"column {i} ({_short(raw.strip())})" if raw.strip() else f"column {i} (no name)"
        warnings.append(f"{label} ignored: not an inspection-log column ({', '.join(COLUMNS)})")
    if "kind" not in header:
        problems.append((1, "a 'kind' column is required"))
    if "rib" not in header and "station" not in header:
        problems.append((1, "a 'rib' or a 'station' column is required"))
    return header, warnings, problems


def _other_separator(cells: list[str], sep: str) -> str | None:
    """The separator a one-cell row seems to be written with, when it is not the log's."""
    if len(cells) != 1:
        return None
    return next((s for s in SEPARATORS if s != sep and s in cells[0]), None)


def parse_log(text: str, path: str | os.PathLike[str] = "<csv>") -> InspectionLog:
    """Parse inspection-log text; every bad row is reported at once, with its row number."""
    text = text.removeprefix("\ufeff")
    sep = detect_separator(text)
    rows = _rows(text, path, sep)
    if not rows:
        raise CsvImportError(path, [(None, "the file is empty; it needs a header row: " + ", ".join(COLUMNS))])
    header, warnings, problems = _header(rows[0])
    if len(rows) - 1 > MAX_ROWS:
        problems.append((None, f"{len(rows) - 1} rows; at most {MAX_ROWS} are read"))
    if problems:
        raise CsvImportError(path, sorted(set(problems), key=lambda p: (p[0] or 0, p[1])), sep)
    found: list[tuple[int, FindingIn]] = []
    for number, cells in enumerate(rows[1:], start=2):
        if not any(c.strip() for c in cells):
            continue
        other = _other_separator(cells, sep)
        if other is not None and len(header) > 1:
            problems.append((number, f"one cell holding {SEPARATORS[other]}s: the log is {SEPARATORS[sep]}-separated "
                                     f"(its header row); write this row with {SEPARATORS[sep]}s"))
            continue
        if len(cells) > len(header):
            problems.append((number, f"{len(cells)} cells but the header has {len(header)} columns"))
            continue
        known = {name: c.strip() for name, c in zip(header, cells) if name is not None}
        try:
            found.append((number, _finding(known)))
        except _RowProblemError as exc:
            problems.extend((number, msg) for msg in exc.messages)
    if problems:
        raise CsvImportError(path, problems, sep)
    if not found:
        raise CsvImportError(path, [(None, "no findings in the file (only a header or blank rows)")], sep)
    return InspectionLog(found, warnings, sep)


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
        elif name == "found":
            raw[name] = value.lower().replace(" ", "-")
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
