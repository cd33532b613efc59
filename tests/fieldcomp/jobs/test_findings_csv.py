"""fieldcomp/findings_csv.py and `fieldcomp findings --import`: inspection logs in, row-numbered
errors out, and the job file untouched unless every row is valid."""

from __future__ import annotations

import tomllib
from pathlib import Path

import pytest

from fieldcomp.cli.main import main
from fieldcomp.jobs.inspection_log import CsvImportError, parse_findings_csv

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"


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
    ("kind,rib,colour\n", "unknown column 'colour'"),
    ("rib,count\n", "a 'kind' column is required"),
    ("kind,count\n", "'rib' or a 'station' column"),
    ("kind,rib,rib\n", "more than once"),
])
def test_header_problems_name_row_1(header, words):
    with pytest.raises(CsvImportError) as err:
        parse_findings_csv(header + "missing,3\n")
    assert words in str(err.value) and all(row == 1 for row, _ in err.value.problems)


def test_empty_log_is_refused():
    with pytest.raises(CsvImportError, match="no findings"):
        parse_findings_csv("kind,rib\n\n")


def _occupied_ribs(mark: str) -> list[int]:
    """Rib numbers holding exactly one stud in the demo beam's layout (engine.studs.layout.design_layout)."""
    from engine.studs.design import design_layout
    from fieldcomp.jobs.jobfile import load_job
    from fieldcomp.jobs.to_engine import to_engine

    beam = next(b for b in to_engine(load_job(DEMO).job) if b.mark == mark)
    layout = design_layout(beam).layout
    return [int(n) for n, c in zip(layout.number, layout.count) if c == 1]


def _copy_demo(tmp_path) -> Path:
    job = tmp_path / "job.toml"
    job.write_bytes(DEMO.read_bytes())
    return job


def test_bad_log_leaves_the_job_untouched(tmp_path, capsys):
    job = _copy_demo(tmp_path)
    before = job.read_bytes()
    log = tmp_path / "log.csv"
    log.write_text("kind,rib\nmissing,5\nlost,6\n")
    assert main(["findings", str(job), "--beam", "3B-105", "--import", str(log)]) == 2
    assert "row 3" in capsys.readouterr().err
    assert job.read_bytes() == before and not (tmp_path / "job.toml.bak").exists()


def test_log_contradicting_the_layout_names_the_row_and_writes_nothing(tmp_path, capsys):
    job = _copy_demo(tmp_path)
    before = job.read_bytes()
    log = tmp_path / "log.csv"
    one, other = _occupied_ribs("3B-105")[:2]  # ribs holding one stud as laid out
    log.write_text(f"kind,rib,count\nmissing,{other},1\nmissing,{one},3\nadded,{one},1\n")
    assert main(["findings", str(job), "--beam", "3B-105", "--import", str(log)]) == 2
    err = capsys.readouterr().err
    # with the added stud the rib holds 2, still short of 3: only row 3 is wrong
    assert "row 3" in err and f"rib {one} holds 2" in err and "row 2" not in err and "row 4" not in err
    assert job.read_bytes() == before and not (tmp_path / "job.toml.bak").exists()


def test_good_log_is_saved_atomically_with_a_backup(tmp_path, capsys):
    job = _copy_demo(tmp_path)
    before = job.read_bytes()
    log = tmp_path / "log.csv"
    one, other = _occupied_ribs("3B-105")[:2]
    log.write_text(f"kind,rib,note,reported_by\nmissing,{one},not welded,QA\nfailed-test,{other},,QA\n")
    assert main(["findings", str(job), "--beam", "3B-105", "--import", str(log)]) in (0, 1)
    assert (tmp_path / "job.toml.bak").read_bytes() == before
    beam = next(b for b in tomllib.loads(job.read_text())["beam"] if b["mark"] == "3B-105")
    assert [(f["kind"], f["rib"]) for f in beam["finding"]] == [("missing", one), ("failed-test", other)]
    assert beam["finding"][0]["reported_by"] == "QA"
    assert "imported 2 finding(s)" in capsys.readouterr().err
