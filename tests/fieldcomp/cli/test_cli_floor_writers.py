"""Every writer is safe (issue 14 item 7): never onto an input, names from marks unique
case-insensitively, only regular files (FIFOs and devices refused), the path named in errors."""

from __future__ import annotations

import os
import shutil
from pathlib import Path

from hypothesis import given, settings
from hypothesis import strategies as st

from fieldcomp.cli.main import main
from fieldcomp.jobs.output_names import unique_names

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"


def test_names_that_collide_after_sanitising_stay_apart_case_insensitively():
    names = unique_names(["B_1", "B/1", "B_1-2", "b_1"])
    assert len({n.casefold() for n in names}) == 4
    assert names[0] == "B_1" and names[2] == "B_1-2"  # a mark that is already a safe name keeps it


def test_marks_all_writes_one_file_per_beam_even_for_colliding_marks(tmp_path, capsys):
    job = tmp_path / "job.toml"
    text = DEMO.read_text()
    for old, new in (("3B-101", "B_1"), ("3B-102", "B/1"), ("3B-103", "B_1-2"), ("3B-104", "b_1")):
        text = text.replace(f'mark = "{old}"', f'mark = "{new}"')
    job.write_text(text)
    assert main(["marks", str(job), "--all", "--dxf", str(tmp_path / "dxf"), "--svg", str(tmp_path / "svg")]) in (0, 1)
    for folder in ("dxf", "svg"):
        files = sorted(p.name.casefold() for p in (tmp_path / folder).iterdir())
        assert len(files) == text.count("\n[[beam]]") == len(set(files)), files


def test_no_output_lands_on_the_job_file(tmp_path, capsys):
    job = tmp_path / "job.toml"
    shutil.copyfile(DEMO, job)
    before = job.read_bytes()
    link = tmp_path / "link.toml"
    link.symlink_to(job)
    runs = [["marks", str(job), "--beam", "3B-101", "--svg", str(job)],
            ["marks", str(job), "--beam", "3B-101", "--pdf", str(link)],
            ["marks", str(job), "--beam", "3B-101", "--dxf", str(tmp_path / "." / "job.toml")],
            ["camber", str(job), "--csv", str(job)], ["camber", str(job), "--pdf", str(job)],
            ["check", str(job), "--pdf", str(job)], ["plan", str(job), "--svg", str(job)],
            ["findings", str(job), "--beam", "3B-103", "--pdf", str(job)],
            ["findings", str(job), "--beam", "3B-103", "--repair-svg", str(job)]]
    for argv in runs:
        assert main(argv) == 2, argv
        err = capsys.readouterr().err
        assert "is an input of this command" in err and str(tmp_path) in err, argv
    assert job.read_bytes() == before and not list(tmp_path.glob("*.bak"))


def test_new_writers_refuse_fifos_and_devices_and_name_missing_folders(tmp_path, capsys):
    job = tmp_path / "job.toml"
    shutil.copyfile(DEMO, job)
    fifo = tmp_path / "out.fifo"
    os.mkfifo(fifo)
    missing = tmp_path / "no" / "out.pdf"
    options = [["marks", str(job), "--beam", "3B-101", "--pdf"], ["marks", str(job), "--beam", "3B-101", "--dxf"],
               ["camber", str(job), "--pdf"], ["camber", str(job), "--order-csv"], ["check", str(job), "--pdf"],
               ["plan", str(job), "--pdf"], ["findings", str(job), "--beam", "3B-103", "--pdf"]]
    for argv in options:
        for target, words in ((fifo, "is a pipe or FIFO"), (Path("/dev/null"), "is a character device"),
                              (missing, f"the folder {missing.parent} does not exist")):
            assert main([*argv, str(target)]) == 2, argv
            assert f"error: {target}: {words}" in capsys.readouterr().err, (argv, target)
    assert fifo.is_fifo() and not missing.parent.exists()


def test_outputs_are_atomic_no_temporary_file_is_left(tmp_path, capsys):
    job = tmp_path / "job.toml"
    shutil.copyfile(DEMO, job)
    assert main(["camber", str(job), "--csv", str(tmp_path / "c.csv"), "--pdf", str(tmp_path / "c.pdf")]) in (0, 1, 3)
    assert sorted(p.name for p in tmp_path.iterdir()) == ["c.csv", "c.pdf", "job.toml"]
    assert (tmp_path / "c.pdf").read_bytes().startswith(b"%PDF-")


def test_a_full_disk_is_reported_naming_the_file_and_leaves_the_old_one(tmp_path, capsys, monkeypatch):
    import errno

    from fieldcomp.jobs import atomic

    job = tmp_path / "job.toml"
    shutil.copyfile(DEMO, job)
    target = tmp_path / "camber.pdf"
    target.write_bytes(b"old")

    def full(fd):
        raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))
    monkeypatch.setattr(atomic.os, "fsync", full)
    assert main(["camber", str(job), "--pdf", str(target)]) == 2
    err = capsys.readouterr().err
    assert f"error: {target}: cannot write: No space left on device" in err
    assert target.read_bytes() == b"old" and sorted(p.name for p in tmp_path.iterdir()) == ["camber.pdf", "job.toml"]


MARK_CHARS = st.sampled_from(list("Bb_-/ .1\\:2"))


@settings(max_examples=400, deadline=None)
@given(st.lists(st.text(MARK_CHARS, min_size=1, max_size=6), min_size=1, max_size=12))
def test_unique_names_are_unique_case_insensitively_and_safe_for_any_marks(marks):
    from fieldcomp.jobs.output_names import safe_name

    names = unique_names(marks)
    assert len(names) == len(marks)
    assert len({n.casefold() for n in names}) == len(names)  # a case-folding file system keeps every sheet
    for mark, name in zip(marks, names):
        assert name == safe_name(mark) or name.startswith(safe_name(mark) + "-")
        assert "/" not in name and "\\" not in name and ".." not in name
