"""Regenerate the golden CLI reports of every shipped job (tests/golden/). Read the diff before
committing: a changed number is a changed answer.

    python tools/update_golden.py
"""

from __future__ import annotations

import contextlib
import io
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

GOLDEN_DATE = "2026-12-01"


def reports(job: Path) -> dict[str, str]:
    """The text reports of `check`, `camber` and `marks --all` for one job, run from the repo root."""
    import os

    from fieldcomp.cli.main import main

    rel = job.relative_to(ROOT).as_posix()
    out = {}
    here = os.getcwd()
    os.chdir(ROOT)
    try:
        for verb, args in (("check", ["check", rel]), ("camber", ["camber", rel]),
                           ("marks", ["marks", rel, "--all", "--date", GOLDEN_DATE])):
            buf = io.StringIO()
            with contextlib.redirect_stdout(buf):
                code = main(args)
            out[verb] = f"exit {code}\n" + buf.getvalue()
    finally:
        os.chdir(here)
    return out


def golden_path(job: Path, verb: str) -> Path:
    return ROOT / "tests" / "golden" / f"{job.stem}.{verb}.txt"


def main() -> None:
    for job in sorted((ROOT / "jobs").glob("*.toml")):
        for verb, text in reports(job).items():
            golden_path(job, verb).write_text(text, encoding="utf-8")
            print(f"wrote {golden_path(job, verb).relative_to(ROOT)}")


if __name__ == "__main__":
    main()
