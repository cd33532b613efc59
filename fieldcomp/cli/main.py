"""`fieldcomp` command line. Start-up stays light: numpy, pydantic and the engine are imported
inside the verbs that need them, Textual only by `open`.

Exit codes: 0 every beam passes, 1 some beam fails a check, 2 the input is invalid.
"""

from __future__ import annotations

import argparse
import importlib
import sys

from fieldcomp import CAUTION, __version__
from fieldcomp.cli import VERBS


def build_parser() -> tuple[argparse.ArgumentParser, dict]:
    p = argparse.ArgumentParser(
        prog="fieldcomp",
        description="Construction-phase engineering of unshored composite steel floor beams.",
        epilog=f"Caution: {CAUTION}",
    )
    p.add_argument("--version", action="version", version=f"fieldcomp {__version__}")
    sub = p.add_subparsers(dest="command", metavar="COMMAND")
    modules = {}
    for verb in VERBS:
        module = importlib.import_module(f"fieldcomp.cli.{verb}")
        module.register(sub)
        modules[verb] = module
    return p, modules


def main(argv: list[str] | None = None) -> int:
    parser, modules = build_parser()
    args = parser.parse_args(argv)
    if args.command is None:
        parser.print_help()
        return 0
    from fieldcomp.cli.common import printable_output

    try:
        if args.command == "open":  # the workbench draws the terminal itself
            return modules[args.command].run(args)
        with printable_output():
            return modules[args.command].run(args)
    except BrokenPipeError:  # e.g. piped into `head`
        return 0


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
