"""Inspection-log import edges: a quote left open cannot swallow the rows after it, numbers are
written with 0-9 only, a byte-order mark is fine, a device or FIFO is refused by kind; on any
error the job file is left byte for byte as it was (and no .bak appears)."""

from __future__ import annotations

import os
import shutil
import signal
from pathlib import Path

import pytest

from fieldcomp.cli.main import main
from fieldcomp.jobs.inspection_log import CsvImportError, parse_findings_csv, read_findings_csv

ROOT = Path(__file__).resolve().parents[2]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
HEAD = "kind,rib,note\n"


def rows_of(text: str) -> list[tuple[int, object]]:
    return parse_findings_csv(text, "log.csv")


def refused(text: str) -> str:
    with pytest.raises(CsvImportError) as info:
        rows_of(text)
    return str(info.value)


def test_an_unterminated_quote_is_refused_at_its_row_not_read_as_one_row():
    # RFC 4180 2.5-2.7: a quoted field ends at the next lone quote; without one, the rest of the
    # file would be one cell (three rows read as one)
    text = HEAD + 'missing,3,"no stud\nmissing,4,x\nmissing,5,y\n'
    assert refused(text).splitlines() == ["log.csv: row 2: a quote opened there is never closed",
                                          "log.csv: read as comma-separated (detected from the header row)"]


def test_a_quote_closed_rows_later_is_refused_as_a_cell_over_several_lines():
    text = HEAD + 'missing,3,"no stud\nmissing,4,x\nmissing,5,y"\nmissing,6,z\n'
    assert refused(text).splitlines()[0] == ("log.csv: row 2: a cell runs over lines 2-4 (a quote left open?); "
                                             "each cell of an inspection log is one line")


def test_a_quote_closing_mid_cell_is_refused_with_how_to_write_one():
    assert 'a quote inside a quoted cell is written twice ("")' in refused(HEAD + 'missing,3,"a"b\n')


def test_doubled_quotes_inside_a_quoted_cell_are_one_quote():
    ((_, finding),) = rows_of(HEAD + 'missing,3,"said ""no stud"", twice"\n')
    assert finding.note == 'said "no stud", twice'  # RFC 4180 2.7


@pytest.mark.parametrize("cell", ["1_0", "١٠", "１０", "+10", "10.0", "1e1"])
def test_rib_numbers_are_digits_0_to_9_only(cell):
    # Python's int() reads '1_0', '١٠' and '+10' as 10; a rib number is written 10
    assert f"row 2: column 'rib': {cell!r} is not a whole number (digits 0-9)" in refused(HEAD + f"missing,{cell},x\n")


def test_a_byte_order_mark_and_crlf_are_read(tmp_path):
    log = tmp_path / "log.csv"
    log.write_bytes(b"\xef\xbb\xbf" + (HEAD + "missing,3,x\nmissing,4,y\n").replace("\n", "\r\n").encode())
    assert [row for row, _ in read_findings_csv(log)] == [2, 3]


@pytest.fixture
def job(tmp_path) -> Path:
    path = tmp_path / "job.toml"
    shutil.copyfile(DEMO, path)
    return path


@pytest.mark.parametrize("log_text", [HEAD + 'missing,3,"open\nmissing,4,x\n', HEAD + "missing,1_0,x\n",
                                      HEAD + "missing,3,\x1b[2Jcleared\n", "\x00\x01\x02"])
def test_a_refused_log_leaves_the_job_untouched(job, tmp_path, capsys, log_text):
    log = tmp_path / "log.csv"
    log.write_text(log_text)
    before = job.read_bytes()
    assert main(["findings", str(job), "--beam", "3B-101", "--import", str(log)]) == 2
    err = capsys.readouterr().err
    assert err.startswith(f"error: {log}: ") and "\x1b" not in err
    assert job.read_bytes() == before and not job.with_name("job.toml.bak").exists()


def test_a_fifo_or_device_as_the_log_is_refused_without_waiting(job, tmp_path, capsys):
    fifo = tmp_path / "log.csv"
    os.mkfifo(fifo)

    def hung(signum, frame):
        raise AssertionError("the import waited on the FIFO")
    previous = signal.signal(signal.SIGALRM, hung)
    signal.alarm(10)
    try:
        for log, kind in ((fifo, "a pipe or FIFO"), (Path("/dev/zero"), "a character device")):
            assert main(["findings", str(job), "--beam", "3B-101", "--import", str(log)]) == 2
            assert f"error: {log}: is {kind}; inspection logs are read only from regular files" in capsys.readouterr().err
    finally:
        signal.alarm(0)
        signal.signal(signal.SIGALRM, previous)


# --- logs as they are written: separators, columns of the inspector's own, the same log twice ---
# Rib numbers below hold one stud each in beam 3B-105's layout as fieldcomp lays it out
# (tests/fieldcomp/cli/test_cli_findings_import._occupied_ribs): 1, 3, 4, 6, 7, 9.
MARK = "3B-105"


def _import(job: Path, log: Path) -> tuple[int, str]:
    import contextlib
    import io

    err = io.StringIO()
    with contextlib.redirect_stderr(err), contextlib.redirect_stdout(io.StringIO()):
        rc = main(["findings", str(job), "--beam", MARK, "--import", str(log)])
    return rc, err.getvalue()


def _findings(job: Path) -> list[dict]:
    import tomllib

    return next(b for b in tomllib.loads(job.read_text(encoding="utf-8-sig"))["beam"] if b["mark"] == MARK).get("finding", [])


def test_ribs_used_here_hold_one_stud_each():
    from tests.fieldcomp.cli.test_cli_findings_import import _occupied_ribs

    assert {1, 3, 4, 6, 7, 9} <= set(_occupied_ribs(MARK))


@pytest.mark.parametrize("sep, name", [(",", "comma"), (";", "semicolon"), ("\t", "tab")])
def test_comma_semicolon_and_tab_logs_are_read_and_the_separator_named(job, tmp_path, sep, name):
    log = tmp_path / "log.csv"
    log.write_text(sep.join(["kind", "rib", "note"]) + "\n" + sep.join(["missing", "3", "no stud, gun misfired"]) + "\n"
                   if sep != "," else 'kind,rib,note\nmissing,3,"no stud, gun misfired"\n')
    rc, err = _import(job, log)
    assert rc in (0, 1) and f"({name}-separated)" in err
    assert [(f["kind"], f["rib"], f["note"]) for f in _findings(job)] == [("missing", 3, "no stud, gun misfired")]


def test_a_row_written_with_another_separator_is_refused_naming_both(job, tmp_path):
    log = tmp_path / "log.csv"
    log.write_text("kind;rib;note\nmissing;3;x\nmissing,4,y\n")
    before = job.read_bytes()
    rc, err = _import(job, log)
    assert rc == 2
    assert "row 3: one cell holding commas: the log is semicolon-separated (its header row)" in err
    assert "read as semicolon-separated (detected from the header row)" in err
    assert job.read_bytes() == before and not job.with_name("job.toml.bak").exists()


def test_unknown_columns_are_ignored_with_a_warning_not_a_refusal(job, tmp_path):
    log = tmp_path / "log.csv"
    log.write_text("Kind,Rib,Weather,Reported By\nmissing,3,rain,QA\n")
    rc, err = _import(job, log)
    assert rc in (0, 1)
    assert f"warning: {log}: column 3 ('Weather') ignored: not an inspection-log column" in err
    assert _findings(job) == [{"kind": "missing", "rib": 3, "reported_by": "QA"}]


def test_the_import_reports_each_row_it_added(job, tmp_path):
    log = tmp_path / "log.csv"
    log.write_text("kind,rib,count,report,reported_by,date\nmissing,3,1,SI-09,J. Ortiz,2026-03-02\n"
                   "failed-test,4,1,SI-09,J. Ortiz,2026-03-02\n")
    rc, err = _import(job, log)
    assert rc in (0, 1)
    assert f"imported 2 finding(s) from {log} (comma-separated) into beam {MARK} of {job}" in err
    assert "  row 2: missing x1 at rib 3, report SI-09\n  row 3: failed-test x1 at rib 4, report SI-09\n" in err
    assert "  new inspection report SI-09" in err
    import tomllib

    beam = next(b for b in tomllib.loads(job.read_text())["beam"] if b["mark"] == MARK)
    assert beam["report"] == [{"number": "SI-09", "date": "2026-03-02", "inspector": "J. Ortiz"}]


def test_the_same_log_imported_twice_is_already_recorded_and_nothing_is_written(job, tmp_path):
    log = tmp_path / "log.csv"
    log.write_text("kind,rib,note\nmissing,3,no stud\nweak-side,4,\n")
    assert _import(job, log)[0] in (0, 1)
    once, bak = job.read_bytes(), job.with_name("job.toml.bak").read_bytes()
    # the same log again, saved by another program: semicolons, CRLF and a byte-order mark
    again = tmp_path / "again.csv"
    again.write_bytes(b"\xef\xbb\xbf" + b"KIND;Rib;Note\r\nmissing;3;no stud\r\nweak-side;4;\r\n")
    for second in (log, again):
        rc, err = _import(job, second)
        assert rc in (0, 1)
        assert (f"already recorded: every row of {second} is a finding of beam {MARK} already "
                "(row 2 = finding #1, row 3 = finding #2); nothing added") in err
        assert job.read_bytes() == once and job.with_name("job.toml.bak").read_bytes() == bak
    assert len(_findings(job)) == 2


def test_a_log_that_grew_adds_only_its_new_rows_and_a_station_matches_its_rib(job, tmp_path):
    from fieldcomp.jobs.jobfile import load_job
    from fieldcomp.jobs.to_engine import to_engine
    from engine.pipeline import field_layout

    log = tmp_path / "log.csv"
    log.write_text("kind,rib,station\nmissing,3,\n")
    assert _import(job, log)[0] in (0, 1)
    beam = next(b for b in to_engine(load_job(job).job) if b.mark == MARK)
    x3 = f"{float(field_layout(beam)[0].x[2]):.2f} in"  # rib 3 by its station (origin at the support here)
    log.write_text(f'kind,rib,station\nmissing,,{x3}\nmissing,6,\nmissing,6,\n')
    rc, err = _import(job, log)
    # row 2 is finding #1 (the same rib); rib 6 holds one stud, so two missing there is refused
    assert rc == 2 and "row 4" in err and "row 3" not in err
    log.write_text(f'kind,rib,station\nmissing,,{x3}\nmissing,6,\n')
    rc, err = _import(job, log)
    assert rc in (0, 1) and "row 3: missing x1 at rib 6" in err and "row 2 (finding #1)" in err
    assert [(f.get("rib"), f.get("station")) for f in _findings(job)] == [(3, None), (6, None)]


def _strip_added(after: bytes, before: bytes) -> bytes:
    """`after` less the lines it has and `before` lacks (one contiguous block)."""
    a, b = after.split(b"\n"), before.split(b"\n")
    start = next(i for i, (x, y) in enumerate(zip(a, b)) if x != y)
    extra = len(a) - len(b)
    assert a[start + extra:] == b[start:]
    return b"\n".join(a[:start] + a[start + extra:])


def test_the_import_appends_only_its_tables_keeping_comments_crlf_and_bom(job, tmp_path):
    text = job.read_text().replace("\n", "\r\n")
    job.write_bytes(b"\xef\xbb\xbf" + text.encode())
    before = job.read_bytes()
    log = tmp_path / "log.csv"
    log.write_text('kind,rib,note\nmissing,3,"quote "" and \\ backslash"\n')
    assert _import(job, log)[0] in (0, 1)
    after = job.read_bytes()
    assert after.startswith(b"\xef\xbb\xbf") and after.count(b"\n") == after.count(b"\r\n")
    assert _strip_added(after, before) == before  # every byte outside the added block as it was
    assert _findings(job)[-1]["note"] == 'quote " and \\ backslash'
    assert job.with_name("job.toml.bak").read_bytes() == before


def test_findings_written_inline_fall_back_to_the_general_save(job, tmp_path):
    from fieldcomp.jobs.jobfile import load_job

    text = job.read_text()
    at = text.index('mark = "3B-105"')
    job.write_text(text[:at] + 'finding = [{kind = "missing", rib = 1}]\n' + text[at:])
    log = tmp_path / "log.csv"
    log.write_text("kind,rib\nmissing,3\n")
    rc, err = _import(job, log)
    assert rc in (0, 1) and "saved whole" in err
    beam = next(b for b in load_job(job).job.beam if b.mark == MARK)
    assert [(f.kind, f.rib) for f in beam.finding] == [("missing", 1), ("missing", 3)]
