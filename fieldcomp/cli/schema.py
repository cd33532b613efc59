"""`fieldcomp schema`: print the JSON Schema of job files."""

from __future__ import annotations

import argparse
import json

from fieldcomp.cli.common import EXIT_PASS


def register(sub) -> None:
    sub.add_parser("schema", help="print the JSON Schema of job files (for editors)")


def run(args: argparse.Namespace) -> int:
    from fieldcomp.jobs.schema import job_schema

    print(json.dumps(job_schema(), indent=2))
    return EXIT_PASS
