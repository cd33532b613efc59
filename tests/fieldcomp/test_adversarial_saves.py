"""kill -9 at random moments during every kind of save: the job file (workbench save), an
inspection-log import, the recovery file, marks sheets, the camber CSV, the repair sheet and a new
starter. A forked child (the engine already imported) saves and is killed with SIGKILL, either at a
random line of the write path (seeded, so every moment is reproducible) or after a random delay
(any moment, inside a write or an fsync too). Afterwards every file is whole: the old version or
the new one, never torn; a job file still loads and its .bak is a whole earlier version.

CI kills each kind of save a few times; `pytest -m slow -s` kills each one hundreds of times and
prints the figures.
"""

from __future__ import annotations

import os
import random
import re
import shutil
import signal
import sys
import time
from collections.abc import Callable
from dataclasses import dataclass
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
WRITE_PATH = {"save_job", "write_job", "_keep_backup", "write", "write_bytes_atomic", "write_text_atomic", "fsync_folder",
              "_mode_for", "check_output"}


@dataclass
class Save:
    """One kind of save: `act` writes into `folder`; `outputs` are the files it writes."""

    name: str
    act: Callable[[Path], None]
    outputs: Callable[[Path], list[Path]]


def _cli(*argv: str) -> None:
    from fieldcomp.cli.main import main

    main(list(argv))


def _workbench_save(folder: Path) -> None:
    from fieldcomp.tui.session import JobSession

    session = JobSession.open(folder / "job.toml")
    session.set_text(("project", "name"), "Saved by the workbench")
    session.save()


def _recovery(folder: Path) -> None:
    from fieldcomp.tui.recovery import RecoveryFile
    from fieldcomp.tui.session import JobSession

    session = JobSession.open(folder / "job.toml")
    job = session.job.model_copy(update={"project": session.job.project.model_copy(update={"name": "Recovered"})})
    RecoveryFile(folder / "state", folder / "job.toml").write(session.render(job))


SAVES = [
    Save("workbench save", _workbench_save, lambda f: [f / "job.toml", f / "job.toml.bak"]),
    Save("inspection-log import",
         lambda f: _cli("findings", str(f / "job.toml"), "--beam", "3B-101", "--import", str(f / "log.csv")),
         lambda f: [f / "job.toml", f / "job.toml.bak"]),
    Save("recovery file", _recovery, lambda f: sorted((f / "state").glob("*.recover.toml"))),
    Save("marks sheets", lambda f: _cli("marks", str(f / "job.toml"), "--all", "--svg", str(f / "svg"), "--csv", str(f / "csv"),
                                        "--date", "2024-06-01"),
         lambda f: sorted((f / "svg").glob("*.svg")) + sorted((f / "csv").glob("*.csv"))),
    Save("camber CSV", lambda f: _cli("camber", str(f / "job.toml"), "--csv", str(f / "camber.csv")),
         lambda f: [f / "camber.csv"]),
    Save("repair sheet",
         lambda f: _cli("findings", str(f / "job.toml"), "--beam", "3B-103", "--repair-svg", str(f / "repair.svg")),
         lambda f: [f / "repair.svg"]),
    Save("new starter", lambda f: _cli("new", str(f / "new.toml")), lambda f: [f / "new.toml"]),
]
LOG = "kind,rib,note\nmissing,5,not welded\n"


def _fresh(folder: Path) -> None:
    folder.mkdir(parents=True)
    shutil.copyfile(DEMO, folder / "job.toml")
    (folder / "log.csv").write_text(LOG)


def _contents(save: Save, folder: Path) -> dict[str, bytes]:
    """Each output by its name in the folder; a recovery file's name and header carry the job's
    absolute path, which differs from folder to folder, so that part is taken out."""
    return {re.sub(r"-[0-9a-f]{16}\.recover", ".recover", p.relative_to(folder).as_posix()):
            p.read_bytes().replace(str(folder).encode(), b"<folder>") for p in save.outputs(folder) if p.exists()}


def _child(save: Save, folder: Path, kill_at: int | None) -> int:
    """Fork; the child saves (killing itself with SIGKILL at line `kill_at` of the write path, if
    given); returns the child's wait status."""
    pid = os.fork()
    if pid:
        return os.waitpid(pid, 0)[1]
    try:  # the child: quiet, then save
        null = os.open(os.devnull, os.O_WRONLY)
        os.dup2(null, 1)
        os.dup2(null, 2)
        count = 0

        def lines(frame, event, arg):
            nonlocal count
            if event == "line":
                count += 1
                if count == kill_at:
                    os.kill(os.getpid(), signal.SIGKILL)
            return lines

        def calls(frame, event, arg):
            return lines if frame.f_code.co_name in WRITE_PATH else None

        if kill_at is not None:
            sys.settrace(calls)
        save.act(folder)
        sys.settrace(None)
        (folder.parent / f"{folder.name}.lines").write_text(str(count))  # how many lines the write path ran
        os._exit(0)
    finally:
        os._exit(3)


def _expected(save: Save, tmp_path: Path, tag: str) -> tuple[dict[str, bytes], dict[str, bytes], int]:
    """(contents before, contents after an uninterrupted save, lines on the write path)."""
    folder = tmp_path / f"{save.name} probe {tag}"
    _fresh(folder)
    old = _seed_old_outputs(save, folder)
    status = _child(save, folder, kill_at=10**9)
    assert os.WIFEXITED(status) and os.WEXITSTATUS(status) == 0, status
    return old, _contents(save, folder), int((folder.parent / f"{folder.name}.lines").read_text())


def _seed_old_outputs(save: Save, folder: Path) -> dict[str, bytes]:
    """Outputs as an earlier run left them, so that a save replaces something (the job file is
    already there; sheets and CSVs get an older complete version)."""
    if save.name in ("marks sheets", "camber CSV", "repair sheet"):
        pid = os.fork()
        if not pid:
            null = os.open(os.devnull, os.O_WRONLY)
            os.dup2(null, 1)
            os.dup2(null, 2)
            if save.name == "marks sheets":
                _cli("marks", str(folder / "job.toml"), "--all", "--svg", str(folder / "svg"), "--csv", str(folder / "csv"),
                     "--date", "2024-01-01")
            else:
                save.act(folder)
                for path in save.outputs(folder):
                    path.write_bytes(path.read_bytes() + b"\nan older run\n")
            os._exit(0)
        os.waitpid(pid, 0)
    return _contents(save, folder)


def _check_whole(save: Save, folder: Path, old: dict[str, bytes], new: dict[str, bytes], moment: str) -> str:
    """Every output is its old or its new version; a job file loads. Returns 'old', 'new' or 'mixed'."""
    from fieldcomp.jobs.jobfile import load_job

    now = _contents(save, folder)
    sides = set()
    for name, data in now.items():
        if name.endswith(".bak"):
            assert data == old.get("job.toml"), f"{save.name}: torn or foreign .bak after {moment}"
            continue
        assert data in (old.get(name), new.get(name)), f"{save.name}: {name} torn after {moment}"
        sides.add("new" if data == new.get(name) and data != old.get(name) else "old")
    if (folder / "job.toml").exists():
        load_job(folder / "job.toml")
    return "mixed" if len(sides) > 1 else sides.pop() if sides else "old"


def _kill_at_random_lines(save: Save, tmp_path: Path, kills: int) -> tuple[set[str], int, int]:
    """Kills at `kills` random lines of the write path (the first and last among them); returns
    the outcomes seen, the distinct lines killed at and the lines the write path runs."""
    old, new, lines = _expected(save, tmp_path, "lines")
    assert new != old and lines > 5, (save.name, lines)
    rng = random.Random(save.name)
    moments = sorted({1, lines, *(rng.randint(1, lines) for _ in range(kills - 2))})
    outcomes = set()
    for k in moments:
        folder = tmp_path / f"{save.name} line {k}"
        _fresh(folder)
        _seed_old_outputs(save, folder)
        status = _child(save, folder, kill_at=k)
        assert os.WIFSIGNALED(status) and os.WTERMSIG(status) == signal.SIGKILL, (save.name, k, status)
        outcomes.add(_check_whole(save, folder, old, new, f"kill -9 at write-path line {k} of {lines}"))
    return outcomes, len(moments), lines


def _kill_after_random_delays(save: Save, tmp_path: Path, kills: int) -> int:
    """SIGKILL after a random delay within an uninterrupted save's duration; returns the kills
    that landed while the child was still running."""
    old, new, _ = _expected(save, tmp_path, "timed")
    folder = tmp_path / f"{save.name} timed"
    _fresh(folder)
    started = time.perf_counter()
    _child(save, folder, kill_at=None)
    duration = time.perf_counter() - started
    rng = random.Random(f"{save.name} timed")
    landed = 0
    for i in range(kills):
        folder = tmp_path / f"{save.name} timed {i}"
        _fresh(folder)
        _seed_old_outputs(save, folder)
        pid = os.fork()
        if not pid:
            null = os.open(os.devnull, os.O_WRONLY)
            os.dup2(null, 1)
            os.dup2(null, 2)
            save.act(folder)
            os._exit(0)
        time.sleep(rng.uniform(0.0, duration))
        os.kill(pid, signal.SIGKILL)
        status = os.waitpid(pid, 0)[1]
        landed += os.WIFSIGNALED(status)
        _check_whole(save, folder, old, new, f"kill -9 after a random delay (#{i})")
    return landed


@pytest.mark.parametrize("save", SAVES, ids=[s.name for s in SAVES])
def test_kill_9_at_random_moments_leaves_every_file_whole(save, tmp_path):
    outcomes, _, _ = _kill_at_random_lines(save, tmp_path, kills=5)
    assert "old" in outcomes and ({"new", "mixed"} & outcomes), outcomes  # the kills reached both sides
    _kill_after_random_delays(save, tmp_path, kills=2)


@pytest.mark.slow
def test_kill_9_long_run(tmp_path):
    started = time.perf_counter()
    figures = []
    for save in SAVES:
        outcomes, killed, lines = _kill_at_random_lines(save, tmp_path, kills=100)
        landed = _kill_after_random_delays(save, tmp_path, kills=100)
        figures.append(f"{save.name}: kills at {killed} of its {lines} write-path lines ({', '.join(sorted(outcomes))}), "
                       f"100 after random delays ({landed} landed mid-save)")
    print(f"\nkill -9 long run in {time.perf_counter() - started:.0f} s:\n  " + "\n  ".join(figures))
