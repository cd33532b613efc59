"""`fieldcomp new PATH`: write a commented starter job file."""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from fieldcomp.cli.common import EXIT_INPUT, EXIT_PASS, fail_input


def register(sub) -> None:
    n = sub.add_parser("new", help="write a commented starter job file")
    n.add_argument("path", help="where to write it (must not exist)")


def run(args: argparse.Namespace) -> int:
    from importlib.resources import files

    from fieldcomp.jobs.atomic import write_text_atomic
    from fieldcomp.jobs.file_kinds import check_output

    target = Path(args.path)
    if target.exists():
        print(f"error: {target} exists; not overwritten", file=sys.stderr)
        return EXIT_INPUT
    try:
        check_output(target)
        write_text_atomic(target, files("fieldcomp.jobs").joinpath("starter.toml").read_text(encoding="utf-8"))
    except OSError as exc:
        return fail_input(exc)
    print(f"wrote {target}: edit it, then run `fieldcomp check {target}`")
    return EXIT_PASS
