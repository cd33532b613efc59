"""Only regular files are read or written: folders, devices, pipes, FIFOs and sockets are refused
by their kind, before anything is opened that could block (a FIFO) or never end (/dev/zero has no
size to refuse it by)."""

from __future__ import annotations

import os
import stat
from pathlib import Path

from engine.model.errors import FieldcompError

_KINDS = ((stat.S_ISDIR, "a folder"), (stat.S_ISFIFO, "a pipe or FIFO"), (stat.S_ISCHR, "a character device"),
          (stat.S_ISBLK, "a block device"), (stat.S_ISSOCK, "a socket"))
_NO_WAIT = os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_NOCTTY", 0)


class FileKindError(FieldcompError, OSError):
    """A path fieldcomp will not read or write: not a regular file, too large, a missing folder.
    `reason` says why and what is allowed; the message is the path and the reason."""

    def __init__(self, path: Path, reason: str):
        super().__init__(f"{path}: {reason}")
        self.path, self.reason = str(path), reason

    def __str__(self) -> str:
        return f"{self.path}: {self.reason}"


def _kind(mode: int) -> str | None:
    """The kind of a file that is not regular ('a FIFO (named pipe)'), or None for a regular file."""
    if stat.S_ISREG(mode):
        return None
    return next((name for test, name in _KINDS if test(mode)), "not a regular file")


def read_regular(path: str | os.PathLike[str], limit: int, what: str) -> bytes:
    """The bytes of the regular file at `path` (symlinks followed), refused when it is another
    kind or larger than `limit` bytes. `what` names such files in messages ('job files')."""
    p = Path(path)
    try:
        kind = _kind(os.stat(p).st_mode)
        if kind is not None:
            raise FileKindError(p, f"is {kind}; {what} are read only from regular files")
        fd = os.open(p, _NO_WAIT)  # never waits for a writer, even if a FIFO took the file's place
    except FileKindError:
        raise
    except OSError as exc:
        raise FileKindError(p, f"cannot read: {exc.strerror or exc}") from None
    with os.fdopen(fd, "rb") as fh:
        info = os.fstat(fd)
        kind = _kind(info.st_mode)
        if kind is not None:
            raise FileKindError(p, f"is {kind}; {what} are read only from regular files")
        if info.st_size > limit:
            raise FileKindError(p, f"file is {info.st_size / 1e6:.1f} MB; {what} over {limit / 2**20:g} MB are refused")
        data = fh.read(limit + 1)  # a file still growing is cut off here, not read to the end
    if len(data) > limit:
        raise FileKindError(p, f"file is over {limit / 2**20:g} MB; {what} over {limit / 2**20:g} MB are refused")
    return data


def check_output(path: str | os.PathLike[str]) -> None:
    """Refuse to write `path` unless its folder exists and it is a regular file or new."""
    p = Path(path)
    folder = p.parent
    if not folder.is_dir():
        there = "is not a folder" if folder.exists() else "does not exist"
        raise FileKindError(p, f"the folder {folder} {there}; create it first or give another path")
    try:
        kind = _kind(os.stat(p).st_mode)
    except FileNotFoundError:
        return
    except OSError as exc:
        raise FileKindError(p, f"cannot write: {exc.strerror or exc}") from None
    if kind is not None:
        raise FileKindError(p, f"is {kind}; output is written only to regular files")
