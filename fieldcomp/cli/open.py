"""`fieldcomp open [JOB]`: the terminal workbench on a job (no JOB: a new untitled job from the
starter). Textual is imported here only, inside `run`."""

from __future__ import annotations

import argparse

from fieldcomp.cli.common import EXIT_PASS, fail_input


def register(sub) -> None:
    o = sub.add_parser("open", help="open the terminal workbench on a job file")
    o.add_argument("job", nargs="?", help="job file (.toml); leave out for a new untitled job")
    o.add_argument("--theme", choices=("dark", "light"), default="dark", help="colour theme (ctrl+t switches)")


def run(args: argparse.Namespace) -> int:
    from pathlib import Path

    from fieldcomp.jobs.jobfile import JobFileError
    from fieldcomp.tui.recovery import default_state_dir, recovered_session
    from fieldcomp.tui.session import JobSession

    try:
        session = JobSession.open(args.job) if args.job else JobSession.untitled()
    except JobFileError as exc:
        found = recovered_session(default_state_dir(), Path(args.job))  # a deleted job's unsaved edits
        if found is None:
            return fail_input(exc)
        session = found
    from fieldcomp.tui.app import FieldcompApp

    FieldcompApp(session, theme=args.theme).run()
    return EXIT_PASS
