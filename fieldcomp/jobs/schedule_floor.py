"""Beams from a framing schedule (CSV, or XLSX read with openpyxl): columns found by their header
name ("Mark", "Size", "Span (ft)" ...) or named with `--map key=Column`; values with units as
people write them (30'-0", 30 ft, 9144 mm; a bare number takes the unit its header gives, as in
"Span (ft)"). A row that cannot be read is reported by its row number and left out."""

from __future__ import annotations

import csv
import io
import os
import re
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from engine.model.errors import FieldcompError
from engine.model.shapes import ShapeNotFoundError, get_shape
from engine.model.units import UnitError, parse_length
from fieldcomp.jobs.file_kinds import FileKindError, read_regular
from fieldcomp.jobs.floor_job import ImportedBeam
from fieldcomp.jobs.model import coordinate_inches

MAX_BYTES = 20 * 1024 * 1024
MAX_ROWS = 5000
LENGTHS = ("span", "spacing", "spacing_left", "spacing_right", "edge_left", "edge_right")
COORDINATES = ("x1", "y1", "x2", "y2")
# Header names each key answers to, compared without case, spaces, punctuation or a unit in brackets.
HEADERS: dict[str, tuple[str, ...]] = {
    "mark": ("mark", "beam", "beammark", "piecemark", "membermark", "tag", "id"),
    "shape": ("shape", "size", "section", "profile", "beamsize", "membersize", "member"),
    "span": ("span", "length", "spanlength", "beamspan"),
    "spacing": ("spacing", "beamspacing", "spacingbothsides"),
    "spacing_left": ("spacingleft", "leftspacing"),
    "spacing_right": ("spacingright", "rightspacing"),
    "edge_left": ("edgeleft", "leftedge", "slabedgeleft", "edgedistanceleft"),
    "edge_right": ("edgeright", "rightedge", "slabedgeright", "edgedistanceright"),
    "level": ("level", "floor", "storey", "story"),
    "studs": ("studs", "studcount", "nstuds", "numberofstuds", "shearstuds"),
    "x1": ("x1", "startx", "xstart"), "y1": ("y1", "starty", "ystart"),
    "x2": ("x2", "endx", "xend"), "y2": ("y2", "endy", "yend"),
}
_UNIT = re.compile(r"[(\[]\s*(ft|feet|in|inch|inches|mm|cm|m)\s*[)\]]", re.IGNORECASE)
_UNIT_WORD = {"feet": "ft", "inch": "in", "inches": "in"}
_BARE = re.compile(r"[+-]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)")


class ScheduleError(FieldcompError, ValueError):
    """The schedule as a whole cannot be read (no header, a missing column); names the file."""

    def __init__(self, path: str | os.PathLike[str], reason: str):
        super().__init__(f"{path}: {reason}")


@dataclass(frozen=True, slots=True)
class Column:
    index: int
    header: str
    unit: str | None  # the unit a bare number in this column takes


def _key(header: str) -> str:
    return re.sub(r"[^a-z0-9]", "", _UNIT.sub("", header).lower())


def read_rows(path: str | os.PathLike[str]) -> list[list[str]]:
    """The schedule's cells as text, row by row (the header first)."""
    p = Path(path)
    try:
        data = read_regular(p, MAX_BYTES, "schedules")
    except FileKindError as exc:
        raise ScheduleError(p, exc.reason) from None
    if data[:2] == b"PK":
        return _xlsx_rows(p, data)
    try:
        text = data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise ScheduleError(p, f"not UTF-8 text (byte {exc.start}); save the schedule as CSV UTF-8 or as .xlsx") from None
    return [row for row in csv.reader(io.StringIO(text, newline=""))][: MAX_ROWS + 1]


def _cell(value: Any) -> str:
    if value is None:
        return ""
    if isinstance(value, float):
        return f"{value:g}"
    return str(value)


def _xlsx_rows(p: Path, data: bytes) -> list[list[str]]:
    import openpyxl

    try:
        book = openpyxl.load_workbook(io.BytesIO(data), read_only=True, data_only=True)
    except Exception as exc:
        raise ScheduleError(p, f"not readable as an .xlsx workbook: {exc}") from None
    sheet = book.worksheets[0]
    rows = [[_cell(v) for v in row] for row in sheet.iter_rows(values_only=True, max_row=MAX_ROWS + 1)]
    book.close()
    return rows


def columns(path: str | os.PathLike[str], header: list[str], mapping: dict[str, str]) -> dict[str, Column]:
    """Which column holds each key: `mapping` (key -> header text) first, then the header names."""
    index: dict[str, int] = {}
    by_key = {_key(h): i for i, h in enumerate(header) if h.strip()}
    for key, name in mapping.items():
        if key not in HEADERS:
            raise ScheduleError(path, f"--map {key}={name}: unknown key {key!r}; keys: {', '.join(HEADERS)}")
        if _key(name) not in by_key:
            raise ScheduleError(path, f"--map {key}={name}: no column {name!r}; columns: {', '.join(h for h in header if h)}")
        index[key] = by_key[_key(name)]
    for key, names in HEADERS.items():
        if key not in index:
            hit = next((by_key[n] for n in names if n in by_key and by_key[n] not in index.values()), None)
            if hit is not None:
                index[key] = hit
    out: dict[str, Column] = {}
    for key, i in index.items():
        unit = _UNIT.search(header[i])
        word = unit.group(1).lower() if unit else None
        out[key] = Column(i, header[i], _UNIT_WORD.get(word, word) if word else None)
    missing = [k for k in ("mark", "shape", "span") if k not in out]
    if missing:
        raise ScheduleError(path, f"no column for {', '.join(missing)} (headers: {', '.join(h for h in header if h)}); "
                                  "name it with --map KEY=Column")
    return out


def _length(text: str, column: Column, signed: bool = False) -> str:
    value = text.strip()
    if _BARE.fullmatch(value) and column.unit:
        value = f"{value} {column.unit}"
    try:
        (coordinate_inches if signed else parse_length)(value)
    except UnitError as exc:
        hint = "" if column.unit else "; or give the unit in the header, e.g. 'Span (ft)'"
        raise ValueError(f"{exc}{hint}") from None
    return value


def _beam(cells: dict[str, str], cols: dict[str, Column]) -> ImportedBeam:
    values: dict[str, Any] = {}
    mark = cells["mark"].strip()
    if len(mark) > 40 or any(not ch.isprintable() for ch in mark):
        raise ValueError(f"column {cols['mark'].header!r}: a mark is up to 40 printable characters")
    try:
        values["shape"] = get_shape(cells["shape"]).name
    except ShapeNotFoundError as exc:
        raise ValueError(f"column {cols['shape'].header!r}: {exc}") from None
    for key in LENGTHS + COORDINATES:
        if cells.get(key, "").strip():
            try:
                values[key] = _length(cells[key], cols[key], key in COORDINATES)
            except ValueError as exc:
                raise ValueError(f"column {cols[key].header!r}: {exc}") from None
    both = values.pop("spacing", None)
    for side in ("left", "right"):
        if both is not None and f"spacing_{side}" not in values and f"edge_{side}" not in values:
            values[f"spacing_{side}"] = both
        if (f"spacing_{side}" in values) == (f"edge_{side}" in values):
            raise ValueError(f"give one of spacing_{side} (or spacing) or edge_{side} on the {side}")
    coordinates = [values.pop(k, None) for k in COORDINATES]
    if any(coordinates):
        if not all(coordinates):
            raise ValueError("plan coordinates need all four of x1, y1, x2, y2")
        values["plan"] = dict(zip(COORDINATES, coordinates))
    if cells.get("level", "").strip():
        values["level"] = cells["level"].strip()
    values["source_id"] = cells["mark"].strip()
    record = ImportedBeam(cells["mark"].strip(), values)
    studs = cells.get("studs", "").strip()
    if studs:
        if not (studs.isdigit() or studs.lower() == "design"):
            raise ValueError(f"column {cols['studs'].header!r}: {studs!r} is not a stud count (a whole number, or design)")
        record.studs = int(studs) if studs.isdigit() else "design"
    return record


def read_schedule(path: str | os.PathLike[str], mapping: dict[str, str]) -> tuple[list[ImportedBeam], list[str], list[str]]:
    """(beams, problems by row number, notes: columns found and columns not used)."""
    rows = read_rows(path)
    if not rows or not any(c.strip() for c in rows[0]):
        raise ScheduleError(path, "no header row: the first row names the columns (Mark, Size, Span ...)")
    header = [c.strip() for c in rows[0]]
    cols = columns(path, header, mapping)
    used = {c.index for c in cols.values()}
    notes = [f"columns: {', '.join(f'{k} = {c.header!r}' for k, c in cols.items())}"]
    unused = [h for i, h in enumerate(header) if h and i not in used]
    if unused:
        notes.append(f"columns not used: {', '.join(repr(h) for h in unused)}")
    beams: list[ImportedBeam] = []
    problems: list[str] = []
    marks: dict[str, int] = {}
    for n, row in enumerate(rows[1:], start=2):
        if not any(c.strip() for c in row):
            continue
        cells = {k: (row[c.index] if c.index < len(row) else "") for k, c in cols.items()}
        mark = cells["mark"].strip()
        try:
            if not mark:
                raise ValueError(f"column {cols['mark'].header!r} is empty")
            if mark in marks:
                raise ValueError(f"mark {mark!r} again (first on row {marks[mark]})")
            beams.append(_beam(cells, cols))
            marks[mark] = n
        except ValueError as exc:
            problems.append(f"row {n}{f' ({mark})' if mark else ''}: {exc}; beam not written")
    if len(rows) > MAX_ROWS + 1:
        problems.append(f"rows after {MAX_ROWS + 1} not read")
    return beams, problems, notes
