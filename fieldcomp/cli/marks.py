"""`fieldcomp marks JOB (--beam MARK | --all) [--svg PATH] [--csv PATH] [--date TEXT]`: the studs
of each beam rib by rib, printed as text and written as a printable SVG sheet and CSV.

With --all, --svg and --csv name folders: one file per beam, named from its mark (sanitised; files
never land outside the folder). Files are written atomically (temporary file, then replace).
Exit codes: 0 every layout meets its requirement and the beam's flexure check, 1 some do not,
2 bad input.
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from fieldcomp import CAUTION, __version__
from fieldcomp.cli.common import EXIT_FAIL, EXIT_INPUT, EXIT_PASS, fail_input, fail_output

def register(sub) -> None:
    m = sub.add_parser("marks", help="stud marks rib by rib: text, printable SVG sheet, CSV")
    m.add_argument("job", help="job file (.toml)")
    which = m.add_mutually_exclusive_group()
    which.add_argument("--beam", metavar="MARK", help="the beam to lay out")
    which.add_argument("--all", action="store_true", help="every beam (then --svg / --csv name folders)")
    m.add_argument("--svg", metavar="PATH", help="write the sheet (SVG) here (a folder with --all)")
    m.add_argument("--csv", metavar="PATH", help="write the marks (CSV) here (a folder with --all)")
    m.add_argument("--date", metavar="TEXT", help="date printed on the sheet (default: today, YYYY-MM-DD)")


def run(args: argparse.Namespace) -> int:
    import datetime

    from engine.pipeline import marks_sheet
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
    sheets = [marks_sheet(job.project.name, b, date, CAUTION) for b in beams]
    try:
        _write(args, [s for s, _, _ in sheets])
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


def _write(args: argparse.Namespace, sheets: list) -> None:
    from fieldcomp.jobs.atomic import write_text_atomic
    from fieldcomp.jobs.file_kinds import FileKindError
    from fieldcomp.jobs.output_names import inside, unique_names
    from fieldcomp.views.marks_sheet import marks_csv
    from fieldcomp.views.marks_svg import marks_svg

    for option, render, ext in ((args.svg, marks_svg, ".svg"), (args.csv, marks_csv, ".csv")):
        if option is None:
            continue
        if not args.all:
            write_text_atomic(Path(option), render(sheets[0]))
            continue
        folder = Path(option)
        if folder.exists() and not folder.is_dir():
            raise FileKindError(folder, "is not a folder (with --all, --svg and --csv name folders)")
        folder.mkdir(parents=True, exist_ok=True)
        for sheet, name in zip(sheets, unique_names([s.beam.mark for s in sheets])):
            write_text_atomic(inside(folder, name + ext), render(sheet))
