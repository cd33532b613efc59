"""File names for sheets written per beam: built from beam marks, never a path out of the folder."""

from __future__ import annotations

import os
import re
from pathlib import Path

from fieldcomp.jobs.file_kinds import FileKindError

_RESERVED = {"CON", "PRN", "AUX", "NUL", *(f"COM{i}" for i in range(1, 10)), *(f"LPT{i}" for i in range(1, 10))}


def safe_name(mark: str) -> str:
    """A file name from a beam mark: letters, digits, '.', '_', '-' only (no path separators, no
    '..', no control characters), not hidden, not a reserved device name, at most 80 characters."""
    name = re.sub(r"[^A-Za-z0-9._-]+", "_", mark)
    name = re.sub(r"\.{2,}", ".", name).strip("._-")[:80] or "beam"
    return f"beam_{name}" if name.split(".")[0].upper() in _RESERVED else name


def unique_names(marks: list[str]) -> list[str]:
    """`safe_name` of each mark, with -2, -3 ... added where a name is already taken. Names are
    compared case-insensitively (case-folding file systems hold one of `B-1` and `b-1`), and a
    suffixed name never takes a name another mark gives (`B_1`, `B/1`, `B_1-2` -> `B_1`,
    `B_1-3`, `B_1-2`... whichever comes first keeps its own)."""
    bases = [safe_name(m) for m in marks]
    taken = {b.casefold() for b in bases}
    used: set[str] = set()
    out = []
    for base in bases:
        name, n = base, 1
        while name.casefold() in used or (n > 1 and name.casefold() in taken):
            n += 1
            name = f"{base}-{n}"
        used.add(name.casefold())
        out.append(name)
    return out


def refuse_inputs(target: str | os.PathLike[str], inputs: list[str | os.PathLike[str]]) -> None:
    """Refuse an output path that is one of the command's input files (the same file, by any
    name or link): a sheet written there would destroy the job it was made from."""
    t = Path(target)
    for source in inputs:
        s = Path(source)
        same = t.resolve() == s.resolve()
        if not same and t.exists() and s.exists():
            try:
                same = os.path.samefile(t, s)
            except OSError:
                same = False
        if same:
            raise FileKindError(t, f"is an input of this command ({s}); give another path for the output")


def inside(folder: Path, name: str) -> Path:
    """`folder / name`, refused unless it resolves to a file directly inside `folder`."""
    target = (folder / name).resolve()
    if target.parent != folder.resolve():
        raise OSError(f"{name!r} would land outside {folder}")
    return target
