"""`fieldcomp check JOB [--beam MARK] [--json]`: the finished-beam report and the construction stage."""

from __future__ import annotations

import argparse
import json

from fieldcomp import CAUTION, __version__
from fieldcomp.commands.common import EXIT_FAIL, EXIT_PASS, fail_input, load_inputs


def register(sub) -> None:
    c = sub.add_parser("check", help="evaluate the finished beams of a job file")
    c.add_argument("job", help="job file (.toml)")
    c.add_argument("--beam", metavar="MARK", help="only this beam")
    c.add_argument("--json", action="store_true", help="print one JSON object")


def run(args: argparse.Namespace) -> int:
    from engine.construction import evaluate_construction
    from engine.evaluate import evaluate_beam
    from fieldcomp.jobfile import JobFileError
    from fieldcomp.report import beam_json, beam_text, caution_block, not_checked_json, scope_block
    from fieldcomp.report_construction import construction_text, merge_into_check

    try:
        job, beams = load_inputs(args.job, args.beam)
        constructions = [evaluate_construction(b) for b in beams]
    except (JobFileError, ValueError) as exc:
        return fail_input(exc)
    results = [evaluate_beam(b) for b in beams]
    failed = [r.beam.mark for r, c in zip(results, constructions) if "fail" in (r.verdict, c.verdict)]
    if args.json:
        records = [merge_into_check(beam_json(r), c, r.checks) for r, c in zip(results, constructions)]
        out = {"job": job.project.name, "caution": CAUTION, "not_checked": not_checked_json(), "beams": records}
        print(json.dumps(out, indent=2))
    else:
        print(f"fieldcomp {__version__} - job '{job.project.name}' ({args.job})")
        print(caution_block())
        for r, c in zip(results, constructions):
            print()
            print(beam_text(r))
            print(construction_text(c))
        print()
        print(f"{len(results)} beam(s): {len(results) - len(failed)} pass, {len(failed)} fail"
              + (f" ({', '.join(failed)})" if failed else ""))
        print(scope_block())
        print(caution_block())
    return EXIT_FAIL if failed else EXIT_PASS
