"""Crash-safe saves: a child process is killed (os._exit) at every line executed on the write
path of `save_job` (backup, temporary file, fsync, replace); afterwards the job file holds
either the old or the new content, never a torn one, and the .bak, when present, holds a
complete earlier version."""

import subprocess
import sys
from pathlib import Path

import pytest

from fieldcomp.jobs.jobfile import load_job

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"

CHILD = r"""
import os, sys
sys.path.insert(0, {root!r})
from fieldcomp.jobs.jobfile import load_job, save_job

path, kill_at = sys.argv[1], int(sys.argv[2])
loaded = load_job(path)
job = loaded.job.model_copy(update={{"project": loaded.job.project.model_copy(update={{"name": "NEW VERSION"}})}})
count = 0
# every line that runs once the new text exists: backup, temp file, fsync, replace (the text
# rendering before it writes nothing, so a kill there cannot tear a file)
WRITE_PATH = {{"save_job", "write_job", "_keep_backup", "write_bytes_atomic", "_mode_for", "fsync_folder"}}

def tracer(frame, event, arg):
    global count
    if frame.f_code.co_name in WRITE_PATH and event == "line":
        count += 1
        if count == kill_at:
            os._exit(9)
    return tracer

sys.settrace(tracer)
save_job(job, path)
sys.settrace(None)
print("LINES", count)
"""


def run_child(path: Path, kill_at: int) -> subprocess.CompletedProcess:
    code = CHILD.format(root=str(ROOT))
    return subprocess.run([sys.executable, "-c", code, str(path), str(kill_at)], capture_output=True, text=True, check=False)


def test_kill_at_every_line_of_a_save_leaves_old_or_new(tmp_path):
    original = DEMO.read_text()
    probe = tmp_path / "probe.toml"
    probe.write_text(original)
    done = run_child(probe, 10**9)
    assert done.returncode == 0, done.stderr
    lines = int(done.stdout.split("LINES")[1])
    new_text = probe.read_text()
    assert "NEW VERSION" in new_text
    assert lines > 10
    outcomes = set()
    for kill_at in range(1, lines + 1):
        folder = tmp_path / f"k{kill_at}"
        folder.mkdir()
        job = folder / "job.toml"
        job.write_text(original)
        result = run_child(job, kill_at)
        assert result.returncode == 9, (kill_at, result.stderr)
        text = job.read_text()
        assert text in (original, new_text), f"torn file after kill at line {kill_at}"
        outcomes.add("new" if text == new_text else "old")
        load_job(job)  # always loads
        bak = folder / "job.toml.bak"
        if bak.exists():
            assert bak.read_text() == original
    assert outcomes == {"old", "new"}  # the kills reached both sides of the replace


@pytest.mark.parametrize("fail", ["write", "fsync", "replace"])
def test_injected_os_failures_keep_the_old_file(tmp_path, monkeypatch, fail):

    import fieldcomp.jobs.atomic as at
    import fieldcomp.jobs.jobfile as jf

    path = tmp_path / "job.toml"
    original = DEMO.read_text()
    path.write_text(original)
    loaded = load_job(path)
    job = loaded.job.model_copy(update={"project": loaded.job.project.model_copy(update={"name": "X"})})

    def boom(*args, **kwargs):
        raise OSError(28, "No space left on device")

    if fail == "write":
        monkeypatch.setattr(jf, "patch_blocks", boom)  # rendering the new text fails
    else:
        monkeypatch.setattr(at.os, fail, boom)
    with pytest.raises(OSError):
        jf.save_job(job, path)
    monkeypatch.undo()
    assert path.read_text() == original
    assert not list(tmp_path.glob(".*.tmp"))
