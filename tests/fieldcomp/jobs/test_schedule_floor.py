"""Framing schedules (CSV and XLSX, invented for these tests) to beams: header names, --map,
units as written or from the header, errors by row number (row 1 is the header)."""

import openpyxl
import pytest

from engine.model.units import parse_length
from fieldcomp.jobs.schedule_floor import ScheduleError, read_schedule

CSV = (
    "Mark,Size,Span (ft),Spacing,Edge Left,Level,Studs,Remarks\n"
    "B-10,W18X35,30,10 ft,,Level 2,24,typ\n"
    "B-11,w18x35,30'-6\",,,Level 2,,\n"
    "B-12,W21X44,9144 mm,\"10'-0\"\"\",,Level 2,design,\n"
    "B-13,W18X36,30 ft,10 ft,,Level 2,,\n"
    ",,,,,,,\n"
    "B-15,W16X26,28 ft,10 ft,1 ft,Level 2,,\n"
    "B-10,W16X26,28 ft,10 ft,,Level 2,,\n"
)


def write(tmp_path, text, name="sched.csv"):
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return path


def test_csv_by_header_names_with_units_as_written(tmp_path):
    beams, _, notes = read_schedule(write(tmp_path, CSV), {})
    by = {b.mark: b for b in beams}
    assert sorted(by) == ["B-10", "B-12", "B-15"]
    assert by["B-10"].values["span"] == "30 ft"  # a bare number takes the header's unit
    assert parse_length(by["B-12"].values["span"]) == pytest.approx(360.0)  # 9144 mm / 25.4 mm per in
    assert by["B-12"].values["spacing_left"] == by["B-12"].values["spacing_right"] == "10'-0\""
    assert (by["B-15"].values["edge_left"], by["B-15"].values["spacing_right"]) == ("1 ft", "10 ft")
    assert "spacing_left" not in by["B-15"].values
    assert (by["B-10"].studs, by["B-12"].studs, by["B-15"].studs) == (24, "design", None)
    assert by["B-10"].values["level"] == "Level 2" and by["B-10"].values["source_id"] == "B-10"
    assert "columns not used: 'Remarks'" in notes


def test_errors_name_the_row(tmp_path):
    _, problems, _ = read_schedule(write(tmp_path, CSV), {})
    assert problems[0].startswith("row 3 (B-11): give one of spacing_left")
    assert problems[1].startswith("row 5 (B-13): column 'Size': no W-shape named 'W18X36'")
    assert problems[2].startswith("row 8 (B-10): mark 'B-10' again (first on row 2)")
    assert len(problems) == 3


def test_a_bare_number_without_a_header_unit_is_refused(tmp_path):
    _, problems, _ = read_schedule(write(tmp_path, "Mark,Size,Span,Spacing\nB-1,W18X35,30,10 ft\n"), {})
    assert problems == ["row 2 (B-1): column 'Span': cannot read '30' as a length: a length needs a unit, e.g. "
                        "32'-6 1/2\", 6.5 in or 1650 mm. Accepted forms: 45'-6 1/2\", 45' 6\", 45', 6 1/2\", 3/4\", "
                        "45 ft, 45.5 ft, 45 ft 6 1/2 in, 6.5 in, 1 3/4 in, 1650 mm, 16.5 cm, 1.65 m; or give the unit "
                        "in the header, e.g. 'Span (ft)'; beam not written"]


def test_map_names_columns_the_headers_do_not(tmp_path):
    text = "Piece,Member Size,L,Trib Spacing,X Start,Y Start,X End,Y End\nB-1,W18X35,30 ft,8 ft,0 ft,-4 ft,30 ft,-4 ft\n"
    path = write(tmp_path, text)
    with pytest.raises(ScheduleError, match="no column for mark, span"):
        read_schedule(path, {})
    [b], problems, _ = read_schedule(path, {"mark": "Piece", "span": "L", "spacing": "Trib Spacing"})
    assert problems == []
    assert b.values["plan"] == {"x1": "0 ft", "y1": "-4 ft", "x2": "30 ft", "y2": "-4 ft"}
    with pytest.raises(ScheduleError, match="--map span=Length: no column 'Length'"):
        read_schedule(path, {"mark": "Piece", "span": "Length"})
    with pytest.raises(ScheduleError, match="unknown key 'camber'"):
        read_schedule(path, {"camber": "L"})


def test_xlsx_numbers_and_text(tmp_path):
    book = openpyxl.Workbook()
    sheet = book.active
    sheet.append(["Beam Mark", "Size", "Length [mm]", "Spacing", "Level"])
    sheet.append(["C-1", "W16X26", 8534.4, "2.5 m", "Level 3"])
    sheet.append(["C-2", "W16X26", "28'-0\"", 8, "Level 3"])
    path = tmp_path / "sched.xlsx"
    book.save(path)
    beams, problems, _ = read_schedule(path, {})
    assert [b.mark for b in beams] == ["C-1"]
    assert parse_length(beams[0].values["span"]) == pytest.approx(336.0)  # 8534.4 mm = 28 ft exactly
    assert problems[0].startswith("row 3 (C-2): column 'Spacing': cannot read '8' as a length")


def test_no_header(tmp_path):
    with pytest.raises(ScheduleError, match="no header row"):
        read_schedule(write(tmp_path, "\n"), {})
