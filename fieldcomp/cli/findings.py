"""`fieldcomp findings JOB --beam MARK [--json] [--repair-svg PATH] [--import CSV]`: does the beam
still work with the studs the inspector found, and which studs would restore it.

Exit codes: 0 the beam passes as built, 1 it fails (a repair is proposed), 2 bad input.
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from fieldcomp import CAUTION
from fieldcomp.cli.common import EXIT_FAIL, EXIT_PASS, fail_input, fail_output

def register(sub) -> None:
    f = sub.add_parser("findings", help="check one beam against its stud inspection findings; propose a repair")
    f.add_argument("job", help="job file (.toml)")
    f.add_argument("--beam", metavar="MARK", required=True, help="the beam inspected")
    f.add_argument("--json", action="store_true", help="print one JSON object")
    f.add_argument("--repair-svg", metavar="PATH", help="write the repair marks sheet (SVG) here")
    f.add_argument("--import", dest="import_csv", metavar="CSV",
                   help="first add the findings of an inspection log (CSV) to the beam and save the job")


def run(args: argparse.Namespace) -> int:
    from engine.field.as_built import FindingError, evaluate_as_built
    from engine.studs.design import design_layout
    from engine.field.repair import find_repair
    from fieldcomp.cli.common import load_inputs
    from fieldcomp.jobs.inspection_log import CsvImportError
    from fieldcomp.jobs.jobfile import ChangedOnDiskError, JobFileError
    from fieldcomp.views.findings_report import findings_json, findings_text
    from fieldcomp.views.numbers import json_text

    try:
        if args.import_csv:
            print(import_log(args.job, args.beam, args.import_csv), file=sys.stderr)
    except (JobFileError, CsvImportError, ChangedOnDiskError) as exc:
        return fail_input(exc)
    except OSError as exc:
        return fail_input(f"cannot save {args.job}: {exc.strerror or exc}")
    try:
        job, beams = load_inputs(args.job, args.beam)
        beam = beams[0]
        designed = design_layout(beam).layout
        try:
            before = evaluate_as_built(beam, designed)
        except FindingError as exc:
            raise JobFileError(args.job, [(f"beam '{beam.mark}', field 'finding[{exc.index}]'", str(exc))]) from None
    except JobFileError as exc:
        return fail_input(exc)
    repair = find_repair(before)
    if args.repair_svg:
        try:
            write_sheet(args.repair_svg, job.project.name, before, repair)
        except OSError as exc:
            return fail_output(exc, args.repair_svg)
    if args.json:
        print(json_text(findings_json(job.project.name, before, repair), indent=2))
    else:
        print(findings_text(job.project.name, args.job, before, repair))
    return EXIT_PASS if before.verdict == "pass" else EXIT_FAIL


def import_log(job_path: str, mark: str, csv_path: str) -> str:
    """Add the findings of an inspection log to one beam and save the job (atomic, .bak kept).
    Every row is checked first, against the file format and against the beam's layout; on any
    error nothing is written. Returns a one-line summary."""
    from engine.field.as_built import FindingError, apply_findings
    from engine.studs.design import design_layout
    from fieldcomp.cli.common import load_inputs
    from fieldcomp.jobs.inspection_log import CsvImportError, read_findings_csv
    from fieldcomp.jobs.jobfile import load_job, save_job
    from fieldcomp.jobs.to_engine import to_engine

    loaded = load_job(job_path)
    _, (beam,) = load_inputs(job_path, mark)
    rows = read_findings_csv(csv_path)
    job = loaded.job
    updated = job.model_copy(update={"beam": [
        b.model_copy(update={"finding": b.finding + [f for _, f in rows]}) if b.mark == mark else b for b in job.beam]})
    merged = next(b for b in to_engine(updated, job_path) if b.mark == mark)
    designed = design_layout(beam).layout
    try:
        apply_findings(merged, designed, merged.findings)
    except FindingError:
        existing, new = list(beam.findings), list(merged.findings[len(beam.findings):])
        raise CsvImportError(csv_path, _rows_against_layout(beam, designed, existing, rows, new)) from None
    save_job(updated, job_path, expected_digest=loaded.digest)
    return (f"imported {len(rows)} finding(s) into beam {mark} of {job_path} "
            f"(previous version kept as {Path(job_path).name}.bak)")


def _rows_against_layout(beam, designed, existing, rows, new) -> list[tuple[int | None, str]]:
    """Every log row that contradicts the layout: added studs first, then the rest in order, each
    kept only if it fits with what came before."""
    from engine.field.as_built import FindingError, apply_findings

    problems: list[tuple[int | None, str]] = []
    try:
        apply_findings(beam, designed, tuple(existing))
    except FindingError as exc:
        return [(None, f"the job's own findings for beam {beam.mark} contradict the layout: {exc}")]
    kept = list(existing)
    order = sorted(range(len(new)), key=lambda i: (new[i].kind != "added", i))
    for i in order:
        try:
            apply_findings(beam, designed, tuple(kept + [new[i]]))
            kept.append(new[i])
        except FindingError as exc:
            problems.append((rows[i][0], str(exc).split(": ", 1)[-1] + f" (beam {beam.mark})"))
    return sorted(problems, key=lambda p: p[0] or 0)


def write_sheet(path: str, job_name: str, before, repair) -> None:
    """Write the repair marks sheet (SVG) atomically."""
    import datetime

    from engine.pipeline import repair_sheet
    from fieldcomp.jobs.atomic import write_text_atomic
    from fieldcomp.views.findings_report import REPAIR_CAUTION
    from fieldcomp.views.marks_svg import marks_svg

    sheet = repair_sheet(job_name, datetime.date.today().isoformat(), before, repair, f"{CAUTION} {REPAIR_CAUTION}")
    write_text_atomic(Path(path), marks_svg(sheet))
