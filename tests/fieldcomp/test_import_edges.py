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
    assert refused(text) == "log.csv: row 2: a quote opened there is never closed"


def test_a_quote_closed_rows_later_is_refused_as_a_cell_over_several_lines():
    text = HEAD + 'missing,3,"no stud\nmissing,4,x\nmissing,5,y"\nmissing,6,z\n'
    assert refused(text) == ("log.csv: row 2: a cell runs over lines 2-4 (a quote left open?); "
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
