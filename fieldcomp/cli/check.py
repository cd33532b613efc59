"""`fieldcomp check JOB [--beam MARK] [--json]`: the finished-beam report and the construction stage."""

from __future__ import annotations

import argparse
from functools import partial

from fieldcomp import CAUTION, __version__
from fieldcomp.cli.common import EXIT_FAIL, EXIT_PASS, fail_input, load_inputs


def register(sub) -> None:
    c = sub.add_parser("check", help="evaluate the finished beams of a job file")
    c.add_argument("job", help="job file (.toml)")
    c.add_argument("--beam", metavar="MARK", help="only this beam")
    c.add_argument("--json", action="store_true", help="print one JSON object")


def check_beam(beam, as_json: bool) -> tuple[str | None, bool, str]:
    """(input error or None, whether the beam fails, its report: a JSON list item or text) for
    one beam; run in worker processes for large jobs."""
    from engine.construction.evaluate import evaluate_construction
    from engine.pipeline import evaluate_beam
    from fieldcomp.cli.parallel import json_item
    from fieldcomp.jobs.jobfile import JobFileError
    from fieldcomp.views.finished_report import beam_json, beam_text
    from fieldcomp.views.construction_report import construction_text, merge_into_check

    try:
        c = evaluate_construction(beam)
    except (JobFileError, ValueError) as exc:
        return str(exc), False, ""
    r = evaluate_beam(beam)
    failed = "fail" in (r.verdict, c.verdict)
    if as_json:
        return None, failed, json_item(merge_into_check(beam_json(r), c, r.checks))
    return None, failed, beam_text(r) + "\n" + construction_text(c)


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
    failed = [b.mark for b, (_, fails, _) in zip(beams, done) if fails]
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
        print(f"{len(done)} beam(s): {len(done) - len(failed)} pass, {len(failed)} fail"
              + (f" ({', '.join(failed)})" if failed else ""))
        print(scope_block())
        print(caution_block())
    return EXIT_FAIL if failed else EXIT_PASS
