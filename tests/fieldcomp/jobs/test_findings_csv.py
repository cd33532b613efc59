"""fieldcomp/jobs/inspection_log.py: inspection logs (CSV) in, row-numbered errors out. Importing a
log into a job file (`fieldcomp findings --import`): tests/fieldcomp/cli/test_cli_findings_import.py."""

from __future__ import annotations

import pytest

from fieldcomp.jobs.inspection_log import CsvImportError, parse_findings_csv


def test_good_log_reads_every_row_with_its_row_number():
    text = ("Kind,Rib,Station,Count,Note,Date,Reported By\n"
            "missing,4,,1,no stud,2024-05-14,QA\n"
            "\n"  # blank rows are skipped
            "failed-test,,12'-6\",2,bend test,,\n"
            "Weak-Side,7,,,,,\n")
    rows = parse_findings_csv(text)
    assert [n for n, _ in rows] == [2, 4, 5]
    first, second, third = (f for _, f in rows)
    assert (first.kind, first.rib, first.count, first.reported_by) == ("missing", 4, 1, "QA")
    assert (second.station, second.count) == ("12'-6\"", 2)
    assert third.kind == "weak-side" and third.count == 1


def test_byte_order_mark_from_spreadsheets_is_accepted(tmp_path):
    from fieldcomp.jobs.inspection_log import read_findings_csv

    log = tmp_path / "log.csv"
    log.write_bytes("kind,rib\nmissing,3\n".encode("utf-8-sig"))
    assert read_findings_csv(log)[0][1].rib == 3


def test_every_bad_row_is_reported_with_its_row_number():
    text = ("kind,rib,station,count,note\n"
            "missing,3,,,\n"          # row 2 fine
            "gone,3,,,\n"             # row 3 unknown kind
            "missing,2.5,,,\n"        # row 4 rib not whole
            "missing,3,10 ft,,\n"     # row 5 both rib and station
            "missing,,,,\n"           # row 6 neither
            "missing,,120,,\n"        # row 7 station without unit
            "missing,3,,4,\n"         # row 8 count over 3
            "missing,3,,1,x,extra\n")  # row 9 too many cells
    with pytest.raises(CsvImportError) as err:
        parse_findings_csv(text, "log.csv")
    rows = sorted({row for row, _ in err.value.problems})
    assert rows == [3, 4, 5, 6, 7, 8, 9]
    message = str(err.value)
    assert "log.csv: row 3: column 'kind'" in message and "row 4: column 'rib': '2.5' is not a whole number" in message
    assert "exactly one of rib or station" in message and "needs a unit" in message


@pytest.mark.parametrize("header, words", [
    ("rib,count\n", "a 'kind' column is required"),
    ("kind,count\n", "'rib' or a 'station' column"),
    ("kind,rib,rib\n", "more than once"),
])
def test_header_problems_name_row_1(header, words):
    with pytest.raises(CsvImportError) as err:
        parse_findings_csv(header + "missing,3\n")
    assert words in str(err.value) and all(row == 1 for row, _ in err.value.problems)


def test_unknown_columns_are_ignored_with_a_warning_naming_each():
    from fieldcomp.jobs.inspection_log import parse_log

    log = parse_log("Kind,Colour,Rib,,Inspector stamp\nmissing,red,3,,ok\n")
    assert [(n, f.kind, f.rib) for n, f in log.rows] == [(2, "missing", 3)]
    assert [w.split(" ignored")[0] for w in log.warnings] == ["column 2 ('Colour')", "column 4 (no name)",
                                                               "column 5 ('Inspector stamp')"]


def test_found_and_report_columns_are_read():
    ((_, f),) = parse_findings_csv("kind,rib,found,report\nmissing,3,After Pour,SI-09\n")
    assert (f.found, f.report) == ("after-pour", "SI-09")


def test_empty_log_is_refused():
    with pytest.raises(CsvImportError, match="no findings"):
        parse_findings_csv("kind,rib\n\n")
