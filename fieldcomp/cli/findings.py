"""`fieldcomp findings JOB --beam MARK [--json] [--repair-svg PATH] [--import CSV]`: does the beam
still work with the studs the inspector found, and which studs would restore it.

Exit codes: 0 the beam passes as built, 1 it fails (a repair is proposed), 3 it needs review, 2 bad input.
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from fieldcomp import CAUTION
from fieldcomp.cli.common import exit_code, fail_input, fail_output
from fieldcomp.cli.outputs import add_issue_options


def register(sub) -> None:
    f = sub.add_parser("findings", help="check one beam against its stud inspection findings; propose a repair")
    f.add_argument("job", help="job file (.toml)")
    which = f.add_mutually_exclusive_group(required=True)
    which.add_argument("--beam", metavar="MARK", help="the beam inspected")
    which.add_argument("--all", action="store_true",
                       help="the floor summary: every beam's reports, open findings, as-built verdict, repair, disposition")
    f.add_argument("--csv", metavar="PATH", help="with --all: also write the floor summary as CSV to PATH")
    f.add_argument("--json", action="store_true", help="print one JSON object")
    f.add_argument("--repair-svg", metavar="PATH", help="write the repair marks sheet (SVG) here")
    f.add_argument("--pdf", metavar="PATH", help="write the crew's repair sheet (PDF) here")
    add_issue_options(f, with_date=True)
    f.add_argument("--import", dest="import_csv", metavar="CSV",
                   help="first add the findings of an inspection log (CSV: comma, semicolon or tab) to the beam; "
                        "rows already recorded are not added again")
    f.add_argument("--as-detailed", dest="detailed_csv", metavar="CSV",
                   help="first set the beam's as-detailed studs (shop drawings) from a marks CSV (rib or station, "
                        "and count columns) and save the job")


def run(args: argparse.Namespace) -> int:
    if args.all:
        if args.import_csv or args.detailed_csv or args.repair_svg or args.pdf:
            return fail_input("--all reads the job only: --import, --as-detailed, --repair-svg and --pdf need --beam")
        return run_all(args)
    from engine.field.as_built import FindingError
    from engine.field.detailed import DetailedLayoutError
    from engine.pipeline import field_review
    from fieldcomp.cli.common import load_inputs
    from fieldcomp.jobs.inspection_log import CsvImportError
    from fieldcomp.jobs.jobfile import ChangedOnDiskError, JobFileError
    from fieldcomp.views.findings_report import findings_json, findings_text
    from fieldcomp.views.numbers import json_text

    from fieldcomp.jobs.detailed_csv import DetailedCsvError

    try:
        if args.detailed_csv:
            print(import_detailed(args.job, args.beam, args.detailed_csv), file=sys.stderr)
        if args.import_csv:
            print(import_log(args.job, args.beam, args.import_csv), file=sys.stderr)
    except (JobFileError, CsvImportError, ChangedOnDiskError, DetailedCsvError) as exc:
        return fail_input(exc)
    except OSError as exc:
        return fail_input(f"cannot save {args.job}: {exc.strerror or exc}")
    try:
        job, beams = load_inputs(args.job, args.beam)
        try:
            review = field_review(beams[0])
        except FindingError as exc:
            field = "as_detailed" if isinstance(exc, DetailedLayoutError) else "finding"
            raise JobFileError(args.job, [(f"beam '{beams[0].mark}', field '{field}[{exc.index}]'", str(exc))]) from None
    except JobFileError as exc:
        return fail_input(exc)
    before = review.before
    if args.repair_svg:
        try:
            write_sheet(args.repair_svg, job.project.name, review, args.job)
        except OSError as exc:
            return fail_output(exc, args.repair_svg)
    if args.pdf:
        try:
            write_repair_pdf(args, job.project.name, review)
        except OSError as exc:
            return fail_output(exc, args.pdf)
    records = finding_records(next(b for b in job.beam if b.mark == args.beam))
    if args.json:
        print(json_text(findings_json(job.project.name, review, records), indent=2))
    else:
        print(findings_text(job.project.name, args.job, review, records))
    return exit_code([str(before.verdict)])


def finding_records(beam) -> list[dict[str, str]]:
    """Each finding's report number and governing disposition (fieldcomp.jobs.records)."""
    from fieldcomp.jobs.records import finding_disposition

    out = []
    for f in beam.finding:
        d = finding_disposition(beam, f)
        out.append({"report": f.report, "disposition": "open" if d is None else d.status,
                    "disposition_by": "" if d is None else d.by, "disposition_on": "" if d is None else d.on})
    return out


def run_all(args: argparse.Namespace) -> int:
    """The floor summary as text or JSON (and CSV with --csv); exit code by the worst as-built verdict."""
    from engine.field.as_built import FindingError
    from engine.pipeline import field_review
    from fieldcomp.cli.common import load_inputs
    from fieldcomp.cli.outputs import write_output
    from fieldcomp.jobs.jobfile import JobFileError
    from fieldcomp.views.floor_findings import floor_csv, floor_json, floor_rows, floor_text
    from fieldcomp.views.numbers import json_text

    try:
        job, beams = load_inputs(args.job)
        reviews = {}
        for b in beams:
            if b.findings:
                try:
                    reviews[b.mark] = field_review(b)
                except FindingError as exc:
                    raise JobFileError(args.job, [(f"beam '{b.mark}', field 'finding[{exc.index}]'", str(exc))]) from None
    except JobFileError as exc:
        return fail_input(exc)
    rows = floor_rows(job, reviews)
    if args.csv:
        try:
            write_output(args.csv, floor_csv(rows), [args.job])
        except OSError as exc:
            return fail_output(exc, args.csv)
    print(json_text(floor_json(job.project.name, rows), indent=2) if args.json
          else floor_text(job.project.name, args.job, rows))
    return exit_code([str(r.before.verdict) for r in reviews.values()])


def import_detailed(job_path: str, mark: str, csv_path: str) -> str:
    """Set one beam's as-detailed studs from a marks CSV and save the job (atomic, .bak kept);
    the beam is converted first, so on any error nothing is written. Returns a one-line summary."""
    from fieldcomp.cli.common import load_inputs
    from engine.field.detailed import DetailedLayoutError
    from engine.pipeline import as_poured, field_layout
    from fieldcomp.jobs.detailed_csv import DetailedCsvError, read_detailed_csv
    from fieldcomp.jobs.jobfile import load_job, save_job
    from fieldcomp.jobs.to_engine import to_engine

    loaded = load_job(job_path)
    load_inputs(job_path, mark)
    rows = read_detailed_csv(csv_path, mark)
    job = loaded.job
    updated = job.model_copy(update={"beam": [
        b.model_copy(update={"as_detailed": rows}) if b.mark == mark else b for b in job.beam]})
    merged = next(b for b in to_engine(updated, job_path) if b.mark == mark)
    try:
        field_layout(as_poured(merged)[0])
    except DetailedLayoutError as exc:
        raise DetailedCsvError(csv_path, [(None, f"{exc} (beam {mark})")]) from None
    save_job(updated, job_path, expected_digest=loaded.digest)
    return (f"set {sum(r.studs for r in rows)} as-detailed stud(s) in {len(rows)} rib(s) of beam {mark} in {job_path} "
            f"(previous version kept as {Path(job_path).name}.bak)")


def import_log(job_path: str, mark: str, csv_path: str) -> str:
    """Add the new findings of an inspection log to one beam (fieldcomp.jobs.log_import: rows
    already recorded are not added again; only the new tables are appended to the file, atomic,
    .bak kept); on any error nothing is written. Returns what it did, warnings first."""
    from fieldcomp.jobs.log_import import import_log as add_log

    return add_log(job_path, mark, csv_path).summary()


def write_repair_pdf(args: argparse.Namespace, job_name: str, review) -> None:
    """Write the crew's repair sheet as a PDF page (the sheet of `write_sheet`)."""
    from engine.pipeline import field_sheet
    from engine.studs.stud_lengths import stud_lengths
    from fieldcomp.cli.outputs import issue_of, write_output
    from fieldcomp.views.findings_report import REPAIR_CAUTION
    from fieldcomp.views.pdf_erector import repair_pdf

    issue = issue_of(job_name, "RS", args.revision, args.date)
    sheet = field_sheet(job_name, issue.date, review, f"{CAUTION} {REPAIR_CAUTION}")
    write_output(args.pdf, repair_pdf(issue, sheet, stud_lengths(review.before.beam)), [args.job])


def write_sheet(path: str, job_name: str, review, job_path: str) -> None:
    """Write the crew's repair sheet (SVG) atomically: before the pour the replacement in kind,
    after it (or when the timing is not known) no stud to weld (engine.pipeline.field_sheet)."""
    import datetime

    from engine.pipeline import field_sheet
    from fieldcomp.cli.outputs import write_output
    from fieldcomp.views.findings_report import REPAIR_CAUTION
    from fieldcomp.views.marks_svg import marks_svg

    sheet = field_sheet(job_name, datetime.date.today().isoformat(), review, f"{CAUTION} {REPAIR_CAUTION}")
    write_output(path, marks_svg(sheet), [job_path])
