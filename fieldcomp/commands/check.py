"""`fieldcomp check JOB [--beam MARK] [--json]`: the finished-beam report."""

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
    from engine.evaluate import evaluate_beam
    from fieldcomp.jobfile import JobFileError
    from fieldcomp.report import beam_json, beam_text, caution_block

    try:
        job, beams = load_inputs(args.job, args.beam)
    except JobFileError as exc:
        return fail_input(exc)
    results = [evaluate_beam(b) for b in beams]
    if args.json:
        out = {"job": job.project.name, "caution": CAUTION, "beams": [beam_json(r) for r in results]}
        print(json.dumps(out, indent=2))
    else:
        print(f"fieldcomp {__version__} - job '{job.project.name}' ({args.job})")
        print(caution_block())
        for r in results:
            print()
            print(beam_text(r))
        failed = [r.beam.mark for r in results if r.verdict == "fail"]
        print()
        print(f"{len(results)} beam(s): {len(results) - len(failed)} pass, {len(failed)} fail"
              + (f" ({', '.join(failed)})" if failed else ""))
        print(caution_block())
    return EXIT_FAIL if any(r.verdict == "fail" for r in results) else EXIT_PASS
