"""As-detailed stud layout import: a marks CSV (fieldcomp's own, or any with a rib or station
column and a count column) read into `DetailedRibIn` rows for one beam.

Columns, case and spaces ignored: the rib as `rib` or `slot`; or the station as `station_in`
(inches, a number) or `station` (a length with units); the studs as `studs` or `count`. A `beam`
column, where present, keeps the rows of that beam only. Errors name the row as a spreadsheet
numbers it (header = row 1); nothing is returned unless every row is valid.
"""

from __future__ import annotations

import csv
import io
import os
from pathlib import Path

from pydantic import ValidationError

from engine.model.errors import FieldcompError
from fieldcomp.jobs.model import DetailedRibIn

RIB_COLUMNS, STATION_COLUMNS, COUNT_COLUMNS = ("rib", "slot"), ("station_in", "station"), ("studs", "count")
MAX_BYTES = 2 * 1024 * 1024


class DetailedCsvError(FieldcompError, ValueError):
    """Bad as-detailed marks file. `problems` lists (row number or None, message)."""

    def __init__(self, path: str | os.PathLike[str], problems: list[tuple[int | None, str]]):
        self.path = str(path)
        self.problems = problems
        super().__init__("\n".join(f"{self.path}: row {r}: {m}" if r else f"{self.path}: {m}" for r, m in problems))


def _first(header: list[str], names: tuple[str, ...]) -> str | None:
    return next((n for n in names if n in header), None)


def read_detailed_csv(path: str | os.PathLike[str], mark: str) -> list[DetailedRibIn]:
    """The as-detailed rows of beam `mark` in a marks CSV file; raises DetailedCsvError."""
    p = Path(path)
    try:
        if p.stat().st_size > MAX_BYTES:
            raise DetailedCsvError(p, [(None, "marks files over 2 MB are refused")])
        text = p.read_bytes().decode("utf-8-sig")
    except OSError as exc:
        raise DetailedCsvError(p, [(None, f"cannot read: {exc.strerror or exc}")]) from None
    except UnicodeDecodeError as exc:
        raise DetailedCsvError(p, [(None, f"not UTF-8 text (byte {exc.start})")]) from None
    return parse_detailed_csv(text, mark, p)


def parse_detailed_csv(text: str, mark: str, path: str | os.PathLike[str] = "<csv>") -> list[DetailedRibIn]:
    """Parse marks CSV text (see the module note)."""
    try:
        rows = list(csv.reader(io.StringIO(text, newline="")))
    except csv.Error as exc:
        raise DetailedCsvError(path, [(None, f"not readable as CSV: {exc}")]) from None
    if not rows:
        raise DetailedCsvError(path, [(None, "the file is empty")])
    header = [c.strip().lower().replace("-", "_").replace(" ", "_") for c in rows[0]]
    rib, station, count = (_first(header, names) for names in (RIB_COLUMNS, STATION_COLUMNS, COUNT_COLUMNS))
    if count is None or (rib is None and station is None):
        raise DetailedCsvError(path, [(1, "needs a rib (rib, slot) or station (station_in, station) column and a "
                                          "count column (studs, count)")])
    problems: list[tuple[int | None, str]] = []
    out: list[DetailedRibIn] = []
    for number, cells in enumerate(rows[1:], start=2):
        row = dict(zip(header, (c.strip() for c in cells)))
        if not any(row.values()) or ("beam" in row and row["beam"] != mark):
            continue
        try:
            place: dict[str, object] = ({"rib": int(row[rib])} if rib is not None and row.get(rib) else
                                        {"station": f"{float(row[station])} in"} if station == "station_in" else
                                        {"station": row.get(station or "", "")})
            out.append(DetailedRibIn(studs=int(row.get(count, "")), **place))  # type: ignore[arg-type]
        except (ValueError, ValidationError) as exc:
            problems.append((number, str(exc).splitlines()[-1] if isinstance(exc, ValidationError) else str(exc)))
    if problems:
        raise DetailedCsvError(path, problems)
    if not out:
        raise DetailedCsvError(path, [(None, f"no rows for beam {mark}")])
    return out
