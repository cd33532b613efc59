"""Atomic file writes: a temporary file beside the target, flushed and fsynced, then an atomic
replace; a crash at any point leaves the old file or the new one, never a torn one."""

from __future__ import annotations

import os
import tempfile
from pathlib import Path

from fieldcomp.jobs.file_kinds import check_output


def write_bytes_atomic(path: str | os.PathLike[str], data: bytes, mode: int | None = None) -> None:
    """Replace `path` with `data` atomically. The file keeps its permissions (or gets `mode`);
    new files get the usual ones (umask). A symbolic link is followed: its target is replaced and
    the link stays a link. Only a regular file (or a new one, in a folder that exists) is
    written: never a FIFO or device."""
    p = Path(path)
    if p.is_symlink():
        p = Path(os.path.realpath(p))
    check_output(p)
    if mode is None:
        mode = _mode_for(p)
    fd, tmp = tempfile.mkstemp(prefix=f".{p.name}.", suffix=".tmp", dir=p.parent)
    try:
        with os.fdopen(fd, "wb") as fh:
            fh.write(data)
            fh.flush()
            os.fsync(fh.fileno())
        os.chmod(tmp, mode)
        os.replace(tmp, p)
    except BaseException:
        Path(tmp).unlink(missing_ok=True)
        raise
    fsync_folder(p.parent)


def write_text_atomic(path: str | os.PathLike[str], text: str) -> None:
    write_bytes_atomic(path, text.encode("utf-8"))


def fsync_folder(folder: Path) -> None:
    """Make the rename itself durable (best effort: not every file system allows it)."""
    try:
        fd = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        pass
    finally:
        os.close(fd)


def _mode_for(p: Path) -> int:
    """Keep an existing file's permissions; a new file gets 0o666 less the process umask."""
    try:
        return p.stat().st_mode & 0o777
    except OSError:
        umask = os.umask(0)
        os.umask(umask)
        return 0o666 & ~umask
