"""`fieldcomp marks JOB (--beam MARK | --all) [--svg PATH] [--csv PATH] [--pdf PATH] [--dxf PATH]
[--schedule PATH] [--date TEXT] [--revision TEXT]`: the studs of each beam rib by rib, printed as
text and written as a printable SVG sheet, CSV, the erector's PDF sheet and a DXF elevation.

With --all, --svg, --csv and --dxf name folders: one file per beam, named from its mark
(sanitised, unique case-insensitively; files never land outside the folder); --pdf names one
booklet, a page per beam. --schedule writes the floor's stud schedule (.csv or .pdf). Files are
written atomically (temporary file, then replace), never onto the job file.
Exit codes: 0 every layout meets its requirement and the beam's flexure check, 1 some do not,
2 bad input.
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from fieldcomp import CAUTION, __version__
from fieldcomp.cli.common import EXIT_FAIL, EXIT_INPUT, EXIT_PASS, fail_input, fail_output
from fieldcomp.cli.outputs import add_issue_options

def register(sub) -> None:
    m = sub.add_parser("marks", help="stud marks rib by rib: text, printable SVG sheet, CSV")
    m.add_argument("job", help="job file (.toml)")
    which = m.add_mutually_exclusive_group()
    which.add_argument("--beam", metavar="MARK", help="the beam to lay out")
    which.add_argument("--all", action="store_true", help="every beam (then --svg / --csv name folders)")
    m.add_argument("--svg", metavar="PATH", help="write the sheet (SVG) here (a folder with --all)")
    m.add_argument("--csv", metavar="PATH", help="write the marks (CSV) here (a folder with --all)")
    m.add_argument("--pdf", metavar="PATH",
                   help="write the erector stud sheets (PDF) here: a page per beam, a booklet with --all")
    m.add_argument("--dxf", metavar="PATH", help="write the beam elevation (DXF, inches) here (a folder with --all)")
    m.add_argument("--schedule", metavar="PATH", help="write the stud schedule of these beams here (.csv or .pdf)")
    m.add_argument("--date", metavar="TEXT", help="date printed on the sheet (default: today, YYYY-MM-DD)")
    add_issue_options(m)


def run(args: argparse.Namespace) -> int:
    import datetime

    from engine.pipeline import erector_sheet
    from fieldcomp.views.marks_sheet import marks_text
    from fieldcomp.cli.common import load_inputs
    from fieldcomp.jobs.jobfile import JobFileError

    if not args.all and args.beam is None:
        print("error: give --beam MARK or --all", file=sys.stderr)
        return EXIT_INPUT
    try:
        job, beams = load_inputs(args.job, None if args.all else args.beam)
    except JobFileError as exc:
        return fail_input(exc)
    date = args.date if args.date is not None else datetime.date.today().isoformat()
    if args.schedule and Path(args.schedule).suffix.lower() not in (".csv", ".pdf"):
        return fail_input(f"{args.schedule}: --schedule writes .csv or .pdf")
    erectors = [erector_sheet(job.project.name, b, date, CAUTION) for b in beams]
    sheets = [(e.sheet, e.layout, e.flexure) for e in erectors]
    try:
        _write(args, erectors, job.project.name, date)
    except OSError as exc:
        return fail_output(exc)
    print(f"fieldcomp {__version__} - stud marks, job '{job.project.name}' ({args.job})")
    for sheet, _, _ in sheets:
        print()
        print(marks_text(sheet))
    short = [s.beam.mark for s, p, f in sheets if p.shortfall is not None or f.level == "fail"]
    print()
    print(f"{len(sheets)} beam(s): {len(sheets) - len(short)} laid out in full"
          + (f", {len(short)} short ({', '.join(short)})" if short else ""))
    return EXIT_FAIL if short else EXIT_PASS


def _write(args: argparse.Namespace, erectors: list, job_name: str, date: str) -> None:
    from fieldcomp.cli.outputs import issue_of, write_output, write_per_beam
    from fieldcomp.views.dxf_elevation import elevation_dxf
    from fieldcomp.views.marks_sheet import marks_csv
    from fieldcomp.views.erector_svg import erector_svg
    from fieldcomp.views.pdf_erector import erector_pdf
    from fieldcomp.views.schedules import stud_csv, stud_pdf

    inputs = [args.job]
    per_beam = ((args.svg, "--svg", erector_svg, ".svg"), (args.csv, "--csv", lambda e: marks_csv(e.sheet), ".csv"),
                (args.dxf, "--dxf", lambda e: elevation_dxf(e.sheet, e.lengths), ".dxf"))
    for option, name, render, ext in per_beam:
        if option is None:
            continue
        if args.all:
            write_per_beam(option, erectors, [e.sheet.beam.mark for e in erectors], ext, render, inputs, name)
        else:
            write_output(option, render(erectors[0]), inputs)
    if args.pdf:
        write_output(args.pdf, erector_pdf(issue_of(job_name, "ES", args.revision, date), erectors), inputs)
    if args.schedule:
        pdf = Path(args.schedule).suffix.lower() == ".pdf"
        data = stud_pdf(issue_of(job_name, "SS", args.revision, date), erectors) if pdf else stud_csv(erectors, CAUTION)
        write_output(args.schedule, data, inputs)
