"""`fieldcomp check JOB [--beam MARK] [--json]`: the finished-beam report and the construction stage."""

from __future__ import annotations

import argparse
from functools import partial

from fieldcomp import CAUTION, __version__
from fieldcomp.cli.common import exit_code, fail_input, fail_output, load_inputs, tally
from fieldcomp.cli.outputs import add_issue_options


def register(sub) -> None:
    c = sub.add_parser("check", help="evaluate the finished beams of a job file")
    c.add_argument("job", help="job file (.toml)")
    c.add_argument("--beam", metavar="MARK", help="only this beam")
    c.add_argument("--json", action="store_true", help="print one JSON object")
    c.add_argument("--pdf", metavar="PATH", help="also write the calculation package (PDF) for the engineer of record")
    add_issue_options(c, with_date=True)


def check_beam(beam, as_json: bool) -> tuple[str | None, str, str]:
    """(input error or None, the beam's verdict over the finished beam and the construction stage,
    its report: a JSON list item or text) for one beam; run in worker processes for large jobs."""
    from engine.model.results import worst
    from engine.pipeline import as_poured, evaluate_beam
    from fieldcomp.cli.parallel import json_item
    from fieldcomp.jobs.jobfile import JobFileError
    from fieldcomp.views.finished_report import beam_json, beam_text
    from fieldcomp.views.construction_report import construction_text, merge_into_check

    try:
        beam, c = as_poured(beam)
    except (JobFileError, ValueError) as exc:
        return str(exc), "fail", ""
    r = evaluate_beam(beam)
    verdict = str(worst((r.verdict, c.verdict)))
    if as_json:
        return None, verdict, json_item(merge_into_check(beam_json(r), c, r.checks))
    return None, verdict, beam_text(r) + "\n" + construction_text(c)


def run(args: argparse.Namespace) -> int:
    from fieldcomp.cli.parallel import json_with_list, map_beams
    from fieldcomp.jobs.jobfile import JobFileError
    from fieldcomp.views.finished_report import caution_block, not_checked_json, scope_block

    try:
        job, beams = load_inputs(args.job, args.beam)
    except (JobFileError, ValueError) as exc:
        return fail_input(exc)
    done = map_beams(partial(check_beam, as_json=args.json), beams)
    error = next((e for e, _, _ in done if e is not None), None)
    if error is not None:
        return fail_input(ValueError(error))
    verdicts = [v for _, v, _ in done]
    if args.pdf:
        from fieldcomp.cli.outputs import calc_package

        try:
            calc_package(args.pdf, args.job, job.project.name, beams, args.revision, args.date)
        except OSError as exc:
            return fail_output(exc, args.pdf)
    if args.json:
        head = {"job": job.project.name, "caution": CAUTION, "not_checked": not_checked_json()}
        print(json_with_list(head, "beams", [report for _, _, report in done]))
    else:
        print(f"fieldcomp {__version__} - job '{job.project.name}' ({args.job})")
        print(caution_block())
        for _, _, report in done:
            print()
            print(report)
        print()
        print(tally([b.mark for b in beams], verdicts))
        print(scope_block())
        print(caution_block())
    return exit_code(verdicts)
