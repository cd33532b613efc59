"""`fieldcomp findings --import`: an inspection log (CSV) saved into the job file atomically with a
backup, and the job file untouched unless every row is valid (the log parser itself:
tests/fieldcomp/jobs/test_findings_csv.py)."""

from __future__ import annotations

import tomllib
from pathlib import Path

from fieldcomp.cli.main import main

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"


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
