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


def camber_beam(beam, as_json: bool, keep: bool = True) -> tuple[str | None, str, object, str]:
    """(input error or None, the construction stage's verdict, its result (None unless `keep`),
    its report: a JSON list item or text) for one beam; run in worker processes for large jobs."""
    from engine.construction.evaluate import evaluate_construction
    from engine.model.units import format_ft_in
    from fieldcomp.cli.parallel import json_item
    from fieldcomp.jobs.jobfile import JobFileError
    from fieldcomp.views.construction_report import construction_json, construction_text

    try:
        r = evaluate_construction(beam)
    except (JobFileError, ValueError) as exc:
        return str(exc), "fail", None, ""
    kept = r if keep else None
    if as_json:
        return None, str(r.verdict), kept, json_item(construction_json(r))
    text = f"Beam {r.beam.mark}: {r.beam.shape.name}, span {format_ft_in(r.beam.span)}, {r.beam.method}\n"
    return None, str(r.verdict), kept, text + construction_text(r)


def level_bays(job, beams):
    """The level's bays and concrete (engine.pipeline.evaluate_level) when some beam end rests on
    a girder or the job has pour zones, else None."""
    from fieldcomp.jobs.to_engine import has_level, level_input

    if not has_level(job):
        return None
    from engine.pipeline import evaluate_level

    return evaluate_level(level_input(job, beams))


def run(args: argparse.Namespace) -> int:
    import csv
    import io
    import sys
    from dataclasses import replace

    from engine.batch import relabel, repeats
    from fieldcomp.cli.outputs import write_output
    from fieldcomp.cli.parallel import MARK_STAND_IN, map_beams, relabel_report, write_json_with_list
    from fieldcomp.jobs.jobfile import JobFileError
    from fieldcomp.views.finished_report import caution_block
    from fieldcomp.views.bay_report import bay_json, bay_text
    from fieldcomp.views.construction_report import csv_rows, schedule_text

    try:
        job, beams = load_inputs(args.job, args.beam)
    except (JobFileError, ValueError) as exc:
        return fail_input(exc)
    types, which = repeats(beams)  # each beam type computed once, under a stand-in mark
    keep = bool(args.csv) or not args.json  # the schedule lines and CSV rows are made from the results
    stand_ins = [replace(b, mark=MARK_STAND_IN) for b in types]
    done = map_beams(partial(camber_beam, as_json=args.json, keep=keep), stand_ins, pooled=False)  # see map_beams
    error = next((relabel_report(d[0], types[k].mark, False) for k, d in enumerate(done) if d[0] is not None), None)
    if error is not None:
        return fail_input(ValueError(error))
    verdicts = [done[k][1] for k in which]
    results = (relabel(done[k][2], b.mark) for b, k in zip(beams, which))
    reports = (relabel_report(done[k][3], b.mark, args.json) for b, k in zip(beams, which))
    if args.csv:
        sheet = io.StringIO()
        head, caution = csv_rows([])
        rows = [row for r in results for row in csv_rows([r])[1:-1]]  # below the header row, above the caution row
        csv.writer(sheet).writerows([head, *rows, caution])
        try:
            write_output(args.csv, sheet.getvalue(), [args.job])
        except OSError as exc:
            return fail_output(exc, args.csv)
    bays = level_bays(job, beams) if args.beam is None else None
    if args.pdf or args.order_csv:
        from fieldcomp.cli.outputs import camber_order

        try:
            camber_order(args.pdf, args.order_csv, args.job, job.project.name, beams, args.revision, args.date)
        except OSError as exc:
            return fail_output(exc, args.pdf or args.order_csv)
    if args.json:
        head = {"job": job.project.name, "caution": CAUTION} | ({} if bays is None else {"level": bay_json(bays)})
        write_json_with_list(sys.stdout, head, "beams", reports)
    else:
        print(f"fieldcomp {__version__} - camber schedule - job '{job.project.name}' ({args.job})")
        print(caution_block())
        print()
        lines = (schedule_text([relabel(done[k][2], b.mark)]).split("\n", 2)[2] for b, k in zip(beams, which))
        print("\n".join([schedule_text([]), *lines]))  # each beam's line below the table head
        for report in reports:
            print()
            print(report)
        if bays is not None:
            print()
            print(bay_text(bays))
        print()
        print("construction stage, " + tally([b.mark for b in beams], verdicts))
        if args.csv:
            print(f"wrote {args.csv}")
        print(caution_block())
    return exit_code(verdicts)
