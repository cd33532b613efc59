"""Recovery files: the unsaved edits of a workbench, kept on disk so that a crash strands nothing.

Each workbench on a job has a recovery file of its own (a numbered slot held with a lock file
that names the holder: host, process, since when), so two workbenches on one job never write
over each other's edits, and the second is told who else has the job open. A recovery file holds
exactly the text a save would write (only the edits, no defaults). The next workbench to open the
job offers back what a crashed one left, also when the job file itself is gone. A recovery file
that cannot be written (read-only or full disk) is a warning, never a stop.
"""

from __future__ import annotations

import datetime
import hashlib
import os
import socket
import tempfile
from dataclasses import dataclass
from pathlib import Path

from fieldcomp.jobs.atomic import fsync_folder
from fieldcomp.jobs.file_kinds import read_regular
from fieldcomp.jobs.jobfile import BOM, MAX_BYTES, JobFileError, job_text, parse_job
from fieldcomp.jobs.model import Job
from fieldcomp.tui.session import JobSession, validate_job

SLOTS = 32  # workbenches on one job at once, each with its own recovery file


def default_state_dir() -> Path:
    """Where recovery files live: $FIELDCOMP_STATE_DIR, else $XDG_STATE_HOME/fieldcomp, else
    ~/.local/state/fieldcomp."""
    if os.environ.get("FIELDCOMP_STATE_DIR"):
        return Path(os.environ["FIELDCOMP_STATE_DIR"])
    base = os.environ.get("XDG_STATE_HOME") or str(Path.home() / ".local" / "state")
    return Path(base) / "fieldcomp"


def _key(job_path: Path | None) -> str:
    """File-name stem of a job's recovery files: its name and a hash of its absolute path."""
    if job_path is None:
        return "untitled"
    digest = hashlib.sha256(str(job_path.resolve()).encode("utf-8")).hexdigest()[:16]
    return f"{job_path.stem[:40]}-{digest}"


def recovery_path(state_dir: Path, job_path: Path | None, slot: int = 0) -> Path:
    """The recovery file of `job_path` in `slot` (the first workbench on a job has slot 0)."""
    return state_dir / (f"{_key(job_path)}.recover.toml" if slot == 0 else f"{_key(job_path)}.{slot}.recover.toml")


def _lock_path(state_dir: Path, job_path: Path | None, slot: int) -> Path:
    return state_dir / (f"{_key(job_path)}.lock" if slot == 0 else f"{_key(job_path)}.{slot}.lock")


def _try_lock(fd: int) -> bool:
    """Hold an exclusive lock on `fd` without waiting; the system drops it when the process ends."""
    try:
        import fcntl
    except ImportError:  # no advisory locks here: every slot counts as free
        return True
    try:
        fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
    except OSError:
        return False
    return True


@dataclass(frozen=True, slots=True)
class Holder:
    """Who holds a job in another workbench."""

    host: str
    pid: str
    since: str

    def __str__(self) -> str:
        return f"process {self.pid} on {self.host} (since {self.since})"


def _holder_of(lock: Path) -> Holder:
    try:
        host, pid, since = (read_regular(lock, 4096, "lock files").decode("utf-8", "replace").split("\n") + ["?"] * 3)[:3]
    except OSError:
        host, pid, since = "?", "?", "?"
    return Holder(host or "?", pid or "?", since or "?")


class RecoveryFile:
    """The recovery file of this workbench on one job. `others` lists the other workbenches that
    have the job open; `problem` says why unsaved edits cannot be kept (None when they can)."""

    def __init__(self, state_dir: Path, job_path: Path | None):
        self.state_dir, self.job_path = state_dir, job_path
        self.path: Path | None = None
        self.others: list[Holder] = []
        self.problem: str | None = None
        self._fd: int | None = None
        try:
            state_dir.mkdir(parents=True, exist_ok=True)
            self._claim()
        except OSError as exc:
            self.problem = f"unsaved edits cannot be kept in {state_dir}: {exc.strerror or exc}"

    def _claim(self) -> None:
        """Take the first slot no live workbench holds and no crashed one left edits in."""
        for slot in range(SLOTS):
            lock = _lock_path(self.state_dir, self.job_path, slot)
            fd = os.open(lock, os.O_RDWR | os.O_CREAT, 0o600)
            if not _try_lock(fd):
                os.close(fd)
                self.others.append(_holder_of(lock))
                continue
            if recovery_path(self.state_dir, self.job_path, slot).exists():
                os.close(fd)  # a crashed workbench's edits: kept to be offered, not written over
                continue
            since = datetime.datetime.now().astimezone().isoformat(timespec="seconds")
            os.ftruncate(fd, 0)
            os.write(fd, f"{socket.gethostname()}\n{os.getpid()}\n{since}\n".encode("utf-8"))
            self._fd, self.path = fd, recovery_path(self.state_dir, self.job_path, slot)
            return
        self.problem = f"unsaved edits cannot be kept: {SLOTS} recovery files of this job are in use in {self.state_dir}"

    def write(self, text: str) -> str | None:
        """Keep `text` (what a save would write) atomically; returns a warning when it cannot."""
        if self.path is None:
            return self.problem
        fd, tmp = -1, ""
        try:
            fd, tmp = tempfile.mkstemp(prefix=".recover.", suffix=".tmp", dir=self.state_dir)
            with os.fdopen(fd, "wb") as fh:
                fd = -1
                fh.write(text.encode("utf-8"))
                fh.flush()
                os.fsync(fh.fileno())
            os.replace(tmp, self.path)
        except OSError as exc:
            if fd >= 0:
                os.close(fd)
            if tmp:
                Path(tmp).unlink(missing_ok=True)
            return f"unsaved edits cannot be kept in {self.path}: {exc.strerror or exc}"
        fsync_folder(self.state_dir)
        return None

    def discard(self) -> None:
        if self.path is not None:
            self.path.unlink(missing_ok=True)

    def release(self) -> None:
        """Let the slot go (at quit or when another job is opened); the file stays if unsaved."""
        if self._fd is not None:
            os.close(self._fd)
            self._fd = None

    def leftovers(self) -> list[Path]:
        """Recovery files of this job that no live workbench holds (a crash left them), newest first."""
        return leftovers(self.state_dir, self.job_path, mine=self.path)


def leftovers(state_dir: Path, job_path: Path | None, mine: Path | None = None) -> list[Path]:
    found = []
    for slot in range(SLOTS):
        path = recovery_path(state_dir, job_path, slot)
        if path == mine or not path.exists():
            continue
        try:
            fd = os.open(_lock_path(state_dir, job_path, slot), os.O_RDWR | os.O_CREAT, 0o600)
        except OSError:
            fd = -1
        try:
            if fd < 0 or _try_lock(fd):  # held by nobody: a crashed workbench's
                found.append(path)
        finally:
            if fd >= 0:
                os.close(fd)  # closing drops the lock just taken
    return sorted(found, key=lambda p: p.stat().st_mtime, reverse=True)


def read_recovery(path: Path) -> tuple[Job, str] | None:
    """The job a recovery file holds and its text, or None if it no longer loads."""
    try:
        text = job_text(read_regular(path, MAX_BYTES, "recovery files"))
        job = parse_job(text.removeprefix(BOM), path)
        validate_job(job, path)
    except (OSError, UnicodeDecodeError, JobFileError):
        return None
    return job, text


def recovered_session(state_dir: Path, job_path: Path) -> JobSession | None:
    """A job file that is gone, opened from the newest unsaved edits kept for it (unsaved: a save
    writes the file again); None when there are none."""
    if job_path.exists():
        return None
    for path in leftovers(state_dir, job_path):
        found = read_recovery(path)
        if found is not None:
            return JobSession(found[0], job_path, None, None, text=found[1])
    return None
