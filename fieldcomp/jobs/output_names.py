"""File names for sheets written per beam: built from beam marks, never a path out of the folder."""

from __future__ import annotations

import re
from pathlib import Path

_RESERVED = {"CON", "PRN", "AUX", "NUL", *(f"COM{i}" for i in range(1, 10)), *(f"LPT{i}" for i in range(1, 10))}


def safe_name(mark: str) -> str:
    """A file name from a beam mark: letters, digits, '.', '_', '-' only (no path separators, no
    '..', no control characters), not hidden, not a reserved device name, at most 80 characters."""
    name = re.sub(r"[^A-Za-z0-9._-]+", "_", mark)
    name = re.sub(r"\.{2,}", ".", name).strip("._-")[:80] or "beam"
    return f"beam_{name}" if name.split(".")[0].upper() in _RESERVED else name


def unique_names(marks: list[str]) -> list[str]:
    """`safe_name` of each mark, with -2, -3 ... added where two marks give the same name."""
    seen: dict[str, int] = {}
    out = []
    for mark in marks:
        base = safe_name(mark)
        key = base.lower()
        seen[key] = seen.get(key, 0) + 1
        out.append(base if seen[key] == 1 else f"{base}-{seen[key]}")
    return out


def inside(folder: Path, name: str) -> Path:
    """`folder / name`, refused unless it resolves to a file directly inside `folder`."""
    target = (folder / name).resolve()
    if target.parent != folder.resolve():
        raise OSError(f"{name!r} would land outside {folder}")
    return target
