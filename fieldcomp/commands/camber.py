"""`fieldcomp camber JOB [--beam MARK] [--json] [--csv PATH]`: the camber schedule, with the
construction stage of every beam (pour stages, ponding, bare-steel checks, tolerance outcome)."""

from __future__ import annotations

import argparse
import json
import sys

from fieldcomp import CAUTION, __version__
from fieldcomp.commands.common import EXIT_FAIL, EXIT_INPUT, EXIT_PASS, fail_input, load_inputs


def register(sub) -> None:
    c = sub.add_parser("camber", help="camber schedule and construction-stage checks of a job file")
    c.add_argument("job", help="job file (.toml)")
    c.add_argument("--beam", metavar="MARK", help="only this beam")
    c.add_argument("--json", action="store_true", help="print one JSON object")
    c.add_argument("--csv", metavar="PATH", help="also write the schedule as CSV to PATH")


def run(args: argparse.Namespace) -> int:
    import csv

    from engine.construction import evaluate_construction
    from engine.units import format_ft_in
    from fieldcomp.jobfile import JobFileError
    from fieldcomp.report import caution_block
    from fieldcomp.report_construction import construction_json, construction_text, csv_rows, schedule_text

    try:
        job, beams = load_inputs(args.job, args.beam)
        results = [evaluate_construction(b) for b in beams]
    except (JobFileError, ValueError) as exc:
        return fail_input(exc)
    if args.csv:
        try:
            with open(args.csv, "w", newline="", encoding="utf-8") as fh:
                csv.writer(fh).writerows(csv_rows(results))
        except OSError as exc:
            print(f"error: cannot write {args.csv}: {exc.strerror or exc}", file=sys.stderr)
            return EXIT_INPUT
    if args.json:
        out = {"job": job.project.name, "caution": CAUTION, "beams": [construction_json(r) for r in results]}
        print(json.dumps(out, indent=2))
    else:
        print(f"fieldcomp {__version__} - camber schedule - job '{job.project.name}' ({args.job})")
        print(caution_block())
        print()
        print(schedule_text(results))
        for r in results:
            print()
            print(f"Beam {r.beam.mark}: {r.beam.shape.name}, span {format_ft_in(r.beam.span)}, {r.beam.method}")
            print(construction_text(r))
        failed = [r.beam.mark for r in results if r.verdict == "fail"]
        print()
        print(f"{len(results)} beam(s): construction stage {len(results) - len(failed)} pass, {len(failed)} fail"
              + (f" ({', '.join(failed)})" if failed else ""))
        if args.csv:
            print(f"wrote {args.csv}")
        print(caution_block())
    return EXIT_FAIL if any(r.verdict == "fail" for r in results) else EXIT_PASS
