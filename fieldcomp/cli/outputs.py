"""Writing a verb's outputs: never onto one of its inputs, only to regular files (or new ones in
folders that exist), each atomically (fieldcomp.jobs.atomic); per-beam files in a folder named
from the marks, unique case-insensitively (fieldcomp.jobs.output_names)."""

from __future__ import annotations

import datetime
from collections.abc import Callable, Sequence
from pathlib import Path


def write_output(path: str | Path, data: str | bytes, inputs: Sequence[str | Path]) -> None:
    """Write `data` to `path` atomically; refused when `path` is an input of the command.
    Raises OSError (FileKindError names the path)."""
    from fieldcomp.jobs.atomic import write_bytes_atomic
    from fieldcomp.jobs.output_names import refuse_inputs

    refuse_inputs(path, list(inputs))
    write_bytes_atomic(Path(path), data.encode("utf-8") if isinstance(data, str) else data)


def write_per_beam(folder: str | Path, items: Sequence, marks: list[str], ext: str,
                   render: Callable[[object], str | bytes], inputs: Sequence[str | Path], option: str) -> None:
    """One file per item in `folder` (created if missing), named from its mark."""
    from fieldcomp.jobs.file_kinds import FileKindError
    from fieldcomp.jobs.output_names import inside, unique_names

    target = Path(folder)
    if target.exists() and not target.is_dir():
        raise FileKindError(target, f"is not a folder (with --all, {option} names a folder)")
    target.mkdir(parents=True, exist_ok=True)
    for item, name in zip(items, unique_names(marks)):
        write_output(inside(target, name + ext), render(item), inputs)


def issue_of(job_name: str, prefix: str, revision: str | None, date: str | None):
    """The sheet set's job, number prefix, revision (default '0') and issue date (default today)."""
    from fieldcomp import CAUTION
    from fieldcomp.views.pdf_page import Issue

    return Issue(job_name, prefix, revision or "0", date or datetime.date.today().isoformat(), CAUTION)


def add_issue_options(parser) -> None:
    """--revision and (unless the verb has it) --date for the PDF title block."""
    parser.add_argument("--revision", metavar="TEXT", help="revision printed in the PDF title block (default 0)")
