"""The job being edited in the workbench: the validated `Job`, undo/redo, dirty flag, the file it
came from (path, digest and the text a save patches; recovery files: `fieldcomp.tui.recovery`).

Every edit goes through the job-file loader (`parse_job`, then `to_engine` and the engine's
scope check, as `fieldcomp check` does), so a rejected edit carries the loader's own messages.
"""

from __future__ import annotations

import hashlib
import os
from dataclasses import dataclass, field
from importlib.resources import files
from pathlib import Path
from typing import Any, Callable

import tomli_w

from fieldcomp.jobs.file_kinds import check_output, read_regular
from fieldcomp.jobs.jobfile import MAX_BYTES, JobFileError, dump_job, load_job, parse_job, write_job
from fieldcomp.jobs.model import Job
from fieldcomp.jobs.typed_text import value_from_text
from engine.model.errors import FieldcompError

Path_ = tuple[str | int, ...]  # ("beam", 0, "studs", "count")

# Setting one of these clears its partner, so switching e.g. from a spacing to a slab edge is
# one edit instead of two (the loader refuses both and neither).
PARTNERS = {"spacing_left": "edge_left", "edge_left": "spacing_left",
            "spacing_right": "edge_right", "edge_right": "spacing_right",
            "rib": "station", "station": "rib"}
UNDO_DEPTH = 200


class EditRejectedError(FieldcompError, ValueError):
    """An edit the loader refuses; `problems` are the loader's (where, message) pairs."""

    def __init__(self, problems: list[tuple[str, str]]):
        self.problems = problems
        super().__init__("; ".join(f"{w}: {m}" if w else m for w, m in problems))


def validate_job(job: Job, path: str | os.PathLike[str] = "<job>") -> None:
    """Raise JobFileError if the job would not load and compute (engine conversion, scope)."""
    from fieldcomp.jobs.to_engine import require_in_scope, to_engine

    require_in_scope(to_engine(job, path), path)


def field_text(job: Job, path: Path_) -> str:
    """The current value at `path` as the text a person would type ('' for none)."""
    node: Any = job
    for part in path:
        node = node[part] if isinstance(part, int) else getattr(node, part)
    if node is None:
        return ""
    if isinstance(node, bool):
        return "true" if node else "false"
    if isinstance(node, float) and node.is_integer():
        return str(int(node))
    return str(node)


def _raw(job: Job) -> dict[str, Any]:
    return job.model_dump(mode="json", exclude_none=True)


def _node(raw: dict[str, Any], path: Path_) -> Any:
    node: Any = raw
    for part in path:
        node = node[part]
    return node


@dataclass
class JobSession:
    """One open job. `job` is always valid (it loads and computes); edits that are not stay out."""

    job: Job
    path: Path | None = None
    digest: str | None = None
    saved: Job | None = None
    undo_stack: list[tuple[Job, str]] = field(default_factory=list)
    redo_stack: list[tuple[Job, str]] = field(default_factory=list)
    version: int = 0  # bumps on every change of `job`
    text: str | None = None  # the file's text as loaded or saved last: a save changes only the edits in it

    @classmethod
    def open(cls, path: str | os.PathLike[str]) -> "JobSession":
        """Load a job file; raises JobFileError with the loader's messages."""
        loaded = load_job(path)
        validate_job(loaded.job, loaded.path)
        return cls(loaded.job, loaded.path, loaded.digest, loaded.job, text=loaded.text)

    @classmethod
    def untitled(cls) -> "JobSession":
        """A new job from the starter file, not yet saved anywhere."""
        text = files("fieldcomp.jobs").joinpath("starter.toml").read_text(encoding="utf-8")
        job = parse_job(text, "starter.toml")
        return cls(job, None, None, job, text=text)

    @property
    def dirty(self) -> bool:
        return self.saved is None or self.job != self.saved

    @property
    def name(self) -> str:
        return self.path.name if self.path is not None else "untitled"

    @property
    def where(self) -> str:
        return str(self.path) if self.path is not None else "<untitled>"

    # -- edits -------------------------------------------------------------------------------
    def candidate(self, change: Callable[[dict[str, Any]], None]) -> Job:
        """The job after `change` (applied to a plain copy), validated like a loaded file."""
        raw = _raw(self.job)
        change(raw)
        try:
            job = parse_job(tomli_w.dumps(raw), self.where)
            validate_job(job, self.where)
        except JobFileError as exc:
            raise EditRejectedError(exc.problems) from None
        return job

    def apply(self, change: Callable[[dict[str, Any]], None], description: str) -> bool:
        """Apply a change if the loader accepts it; False when it changes nothing."""
        job = self.candidate(change)
        if job == self.job:
            return False
        self._replace(job, description)
        return True

    def set_text(self, path: Path_, text: str) -> bool:
        """Set one field from typed text (lengths with units, numbers, words); '' clears an
        optional field. Raises EditRejectedError with the loader's messages."""
        return self.apply(_setter(path, text), f"{self.label(path)} = {text.strip() or '(none)'}")

    def check_text(self, path: Path_, text: str) -> list[tuple[str, str]]:
        """The loader's problems if `path` were set to `text` ([] when it would be accepted)."""
        try:
            self.candidate(_setter(path, text))
        except EditRejectedError as exc:
            return exc.problems
        return []

    def set_rows(self, path: Path_, rows: list[dict[str, Any]], description: str) -> bool:
        """Replace the rows of a table (pour stages, findings) at `path` as one edit."""
        def change(raw: dict[str, Any]) -> None:
            _node(raw, path[:-1])[path[-1]] = rows
        return self.apply(change, description)

    def remove(self, path: Path_, index: int, description: str) -> bool:
        def change(raw: dict[str, Any]) -> None:
            del _node(raw, path)[index]
        return self.apply(change, description)

    def replace_job(self, job: Job, description: str) -> None:
        """Take a whole validated job (restored recovery, reloaded file) as one undoable edit."""
        validate_job(job, self.where)
        if job != self.job:
            self._replace(job, description)

    def _replace(self, job: Job, description: str) -> None:
        self.undo_stack.append((self.job, description))
        del self.undo_stack[:-UNDO_DEPTH]
        self.redo_stack.clear()
        self.job = job
        self.version += 1

    def undo(self) -> str | None:
        """Undo the last edit; returns its description, or None with nothing to undo."""
        if not self.undo_stack:
            return None
        job, description = self.undo_stack.pop()
        self.redo_stack.append((self.job, description))
        self.job = job
        self.version += 1
        return description

    def redo(self) -> str | None:
        if not self.redo_stack:
            return None
        job, description = self.redo_stack.pop()
        self.undo_stack.append((self.job, description))
        self.job = job
        self.version += 1
        return description

    def label(self, path: Path_) -> str:
        """'3B-101 studs.count' style name of a field for messages and the undo list."""
        if path[0] == "beam" and len(path) > 2 and isinstance(path[1], int):
            return f"{self.job.beam[path[1]].mark} " + ".".join(str(p) for p in path[2:])
        return ".".join(str(p) for p in path)

    # -- files -------------------------------------------------------------------------------
    def save(self, path: str | os.PathLike[str] | None = None, overwrite: bool = False) -> Path:
        """Save atomically (previous version kept as .bak). Saving to the file it was loaded
        from raises ChangedOnDiskError if someone else changed it, unless `overwrite`."""
        target = Path(path) if path is not None else self.path
        if target is None:
            raise ValueError("an untitled job needs a file name: use save as")
        check_output(target)  # a FIFO or device is refused before anything reads or writes it
        same = self.path is not None and target.resolve() == self.path.resolve()
        expected = self.digest if same and not overwrite else None
        text = self.render()
        self.digest = write_job(target, text.encode("utf-8"), expected_digest=expected)
        self.path, self.saved, self.text = target, self.job, text
        return target

    def render(self, job: Job | None = None) -> str:
        """The text a save would write: the file's text with only the edits changed."""
        return dump_job(self.job if job is None else job, self.text)

    def changed_on_disk(self) -> bool:
        """True if the file no longer holds the bytes loaded or saved last."""
        if self.path is None or self.digest is None:
            return False
        try:
            return hashlib.sha256(read_regular(self.path, MAX_BYTES, "job files")).hexdigest() != self.digest
        except OSError:  # gone, unreadable, or no longer a regular file
            return True

    def reload(self) -> None:
        """Read the file again (losing unsaved edits; the old job stays on the undo stack)."""
        if self.path is None:
            raise ValueError("an untitled job has no file to reopen")
        loaded = load_job(self.path)
        validate_job(loaded.job, loaded.path)
        if loaded.job != self.job:
            self._replace(loaded.job, f"reopen {self.path.name}")
        self.digest, self.saved, self.text = loaded.digest, loaded.job, loaded.text


def _setter(path: Path_, text: str) -> Callable[[dict[str, Any]], None]:
    def change(raw: dict[str, Any]) -> None:
        parent = _node(raw, path[:-1])
        key = path[-1]
        value = text.strip()
        if value == "":
            parent.pop(key, None)
            return
        parent[key] = value_from_text(path, value)
        partner = PARTNERS.get(str(key))
        if partner is not None:
            parent.pop(partner, None)
    return change
