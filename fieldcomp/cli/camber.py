"""`fieldcomp camber JOB [--beam MARK] [--json] [--csv PATH]`: the camber schedule, with the
construction stage of every beam (pour stages, ponding, bare-steel checks, tolerance outcome)."""

from __future__ import annotations

import argparse
from functools import partial

from fieldcomp import CAUTION, __version__
from fieldcomp.cli.common import exit_code, fail_input, fail_output, load_inputs, tally
from fieldcomp.cli.outputs import add_issue_options


def register(sub) -> None:
    c = sub.add_parser("camber", help="camber schedule and construction-stage checks of a job file")
    c.add_argument("job", help="job file (.toml)")
    c.add_argument("--beam", metavar="MARK", help="only this beam")
    c.add_argument("--json", action="store_true", help="print one JSON object")
    c.add_argument("--csv", metavar="PATH", help="also write the schedule as CSV to PATH")
    c.add_argument("--pdf", metavar="PATH", help="also write the fabricator's camber order list (PDF) to PATH")
    c.add_argument("--order-csv", metavar="PATH", help="also write the camber order list (mark, shape, length, camber, "
                   "tolerance) as CSV to PATH")
    add_issue_options(c, with_date=True)


def camber_beam(beam, as_json: bool) -> tuple[str | None, bool, str, list, str]:
    """(input error or None, whether the construction stage fails, the beam's schedule line, its
    CSV rows, its report: a JSON list item or text) for one beam; run in worker processes for
    large jobs."""
    from engine.construction.evaluate import evaluate_construction
    from engine.model.units import format_ft_in
    from fieldcomp.cli.parallel import json_item
    from fieldcomp.jobs.jobfile import JobFileError
    from fieldcomp.views.construction_report import construction_json, construction_text, csv_rows, schedule_text

    try:
        r = evaluate_construction(beam)
    except (JobFileError, ValueError) as exc:
        return str(exc), "fail", "", [], ""
    line = schedule_text([r]).split("\n", 2)[2]  # below the table head
    rows = csv_rows([r])[1:-1]  # below the header row, above the caution row
    if as_json:
        return None, str(r.verdict), line, rows, json_item(construction_json(r))
    text = f"Beam {r.beam.mark}: {r.beam.shape.name}, span {format_ft_in(r.beam.span)}, {r.beam.method}\n"
    return None, str(r.verdict), line, rows, text + construction_text(r)


def run(args: argparse.Namespace) -> int:
    import csv
    import io

    from fieldcomp.cli.outputs import write_output
    from fieldcomp.cli.parallel import json_with_list, map_beams
    from fieldcomp.jobs.jobfile import JobFileError
    from fieldcomp.views.finished_report import caution_block
    from fieldcomp.views.construction_report import csv_rows, schedule_text

    try:
        job, beams = load_inputs(args.job, args.beam)
    except (JobFileError, ValueError) as exc:
        return fail_input(exc)
    done = map_beams(partial(camber_beam, as_json=args.json), beams)
    error = next((d[0] for d in done if d[0] is not None), None)
    if error is not None:
        return fail_input(ValueError(error))
    verdicts = [d[1] for d in done]
    if args.csv:
        sheet = io.StringIO()
        head, caution = csv_rows([])
        csv.writer(sheet).writerows([head] + [row for d in done for row in d[3]] + [caution])
        try:
            write_output(args.csv, sheet.getvalue(), [args.job])
        except OSError as exc:
            return fail_output(exc, args.csv)
    if args.pdf or args.order_csv:
        from fieldcomp.cli.outputs import camber_order

        try:
            camber_order(args.pdf, args.order_csv, args.job, job.project.name, beams, args.revision, args.date)
        except OSError as exc:
            return fail_output(exc, args.pdf or args.order_csv)
    if args.json:
        print(json_with_list({"job": job.project.name, "caution": CAUTION}, "beams", [d[4] for d in done]))
    else:
        print(f"fieldcomp {__version__} - camber schedule - job '{job.project.name}' ({args.job})")
        print(caution_block())
        print()
        print("\n".join([schedule_text([])] + [d[2] for d in done]))
        for d in done:
            print()
            print(d[4])
        print()
        print("construction stage, " + tally([b.mark for b in beams], verdicts))
        if args.csv:
            print(f"wrote {args.csv}")
        print(caution_block())
    return exit_code(verdicts)
