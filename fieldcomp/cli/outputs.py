"""Writing a verb's outputs: never onto one of its inputs, only to regular files (or new ones in
folders that exist), each atomically (fieldcomp.jobs.atomic); per-beam files in a folder named
from the marks, unique case-insensitively (fieldcomp.jobs.output_names)."""

from __future__ import annotations

import datetime
from collections.abc import Callable, Sequence
from pathlib import Path


def write_output(path: str | Path, data: str | bytes, inputs: Sequence[str | Path]) -> None:
    """Write `data` to `path` atomically; refused when `path` is an input of the command.
    Raises FileKindError (an OSError) naming the path, whatever went wrong."""
    from fieldcomp.jobs.atomic import write_bytes_atomic
    from fieldcomp.jobs.output_names import refuse_inputs

    from fieldcomp.jobs.file_kinds import FileKindError

    refuse_inputs(path, list(inputs))
    try:
        write_bytes_atomic(Path(path), data.encode("utf-8") if isinstance(data, str) else data)
    except FileKindError:
        raise
    except OSError as exc:  # a full disk or a lost mount: the error names the file, not only the reason
        raise FileKindError(Path(path), f"cannot write: {exc.strerror or exc}; the previous file, if any, is unchanged") from None


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


def add_issue_options(parser, with_date: bool = False) -> None:
    """--revision and (unless the verb has it) --date for the PDF title block."""
    parser.add_argument("--revision", metavar="TEXT", help="revision printed in the PDF title block (default 0)")
    if with_date:
        parser.add_argument("--date", metavar="TEXT", help="issue date printed in the PDF title block (default: today)")


def calc_package(path: str, job_path: str, job_name: str, beams, revision: str | None, date: str | None) -> None:
    """The calculation package (PDF) of `beams` for the engineer of record."""
    from engine.pipeline import as_poured, evaluate_beam
    from fieldcomp.views.pdf_calc import calc_pdf

    results = []
    for b in beams:
        poured, construction = as_poured(b)
        results.append((evaluate_beam(poured), construction))
    write_output(path, calc_pdf(issue_of(job_name, "CP", revision, date), results), [job_path])


def camber_order(pdf_path: str | None, csv_path: str | None, job_path: str, job_name: str, beams,
                 revision: str | None, date: str | None) -> None:
    """The fabricator's camber order list as PDF and / or CSV."""
    from fieldcomp import CAUTION
    from engine.construction.evaluate import evaluate_construction
    from fieldcomp.views.schedules import camber_csv, camber_pdf

    pieces = [(b, evaluate_construction(b).camber) for b in beams]
    if pdf_path:
        write_output(pdf_path, camber_pdf(issue_of(job_name, "CL", revision, date), pieces), [job_path])
    if csv_path:
        write_output(csv_path, camber_csv(pieces, CAUTION), [job_path])
