"""`fieldcomp camber JOB [--beam MARK] [--json] [--csv PATH]`: the camber schedule, with the
construction stage of every beam (pour stages, ponding, bare-steel checks, tolerance outcome)."""

from __future__ import annotations

import argparse
from functools import partial

from fieldcomp import CAUTION, __version__
from fieldcomp.cli.common import EXIT_INPUT, exit_code, fail_input, fail_output, load_inputs, tally


def register(sub) -> None:
    c = sub.add_parser("camber", help="camber schedule and construction-stage checks of a job file")
    c.add_argument("job", help="job file (.toml)")
    c.add_argument("--beam", metavar="MARK", help="only this beam")
    c.add_argument("--json", action="store_true", help="print one JSON object")
    c.add_argument("--csv", metavar="PATH", help="also write the schedule as CSV to PATH")


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
    rows = csv_rows([r])[2:]  # below the caution and header rows
    if as_json:
        return None, str(r.verdict), line, rows, json_item(construction_json(r))
    text = f"Beam {r.beam.mark}: {r.beam.shape.name}, span {format_ft_in(r.beam.span)}, {r.beam.method}\n"
    return None, str(r.verdict), line, rows, text + construction_text(r)


def level_bays(job, beams):
    """The level's bays and concrete (engine.pipeline.evaluate_level) when some beam end rests on
    a girder or the job has pour zones, else None."""
    if not job.zone and not job.project.framing_from_plan and not any(b.left_on or b.right_on for b in job.beam):
        return None
    from engine.pipeline import evaluate_level
    from fieldcomp.jobs.to_engine import level_input

    return evaluate_level(level_input(job, beams))


def run(args: argparse.Namespace) -> int:
    import csv
    import io

    from fieldcomp.jobs.atomic import write_text_atomic
    from fieldcomp.cli.parallel import json_with_list, map_beams
    from fieldcomp.jobs.jobfile import JobFileError
    from fieldcomp.views.finished_report import caution_block
    from fieldcomp.views.bay_report import bay_json, bay_text
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
        csv.writer(sheet).writerows(csv_rows([]) + [row for d in done for row in d[3]])
        try:
            write_text_atomic(args.csv, sheet.getvalue())
        except OSError as exc:
            return fail_output(exc, args.csv)
    bays = level_bays(job, beams) if args.beam is None else None
    if args.json:
        head = {"job": job.project.name, "caution": CAUTION} | ({} if bays is None else {"level": bay_json(bays)})
        print(json_with_list(head, "beams", [d[4] for d in done]))
    else:
        print(f"fieldcomp {__version__} - camber schedule - job '{job.project.name}' ({args.job})")
        print(caution_block())
        print()
        print("\n".join([schedule_text([])] + [d[2] for d in done]))
        for d in done:
            print()
            print(d[4])
        if bays is not None:
            print()
            print(bay_text(bays))
        print()
        print("construction stage, " + tally([b.mark for b in beams], verdicts))
        if args.csv:
            print(f"wrote {args.csv}")
        print(caution_block())
    return exit_code(verdicts)
