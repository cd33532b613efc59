"""Shared helpers of the CLI verbs: loading a job into engine inputs, exit codes, errors."""

from __future__ import annotations

import sys

EXIT_PASS, EXIT_FAIL, EXIT_INPUT, EXIT_REVIEW = 0, 1, 2, 3


def exit_code(verdicts: list[str]) -> int:
    """0 all pass, 1 some beam fails, 3 none fails but some need the engineer of record's review."""
    if "fail" in verdicts:
        return EXIT_FAIL
    return EXIT_REVIEW if "review" in verdicts else EXIT_PASS


def tally(marks: list[str], verdicts: list[str]) -> str:
    """'N beam(s): a pass, b review (marks), c fail (marks)'."""
    parts = []
    for word in ("pass", "review", "fail"):
        which = [m for m, v in zip(marks, verdicts) if v == word]
        parts.append(f"{len(which)} {word}" + (f" ({', '.join(which)})" if which and word != "pass" else ""))
    return f"{len(marks)} beam(s): " + ", ".join(parts)


def load_inputs(path: str, only: str | None = None):
    """(job model, beam inputs) or raise JobFileError; `only` selects one beam by mark.
    Inputs outside the engine's scope are refused here, naming beam, field and clause."""
    from fieldcomp.jobs.jobfile import JobFileError, load_job
    from fieldcomp.jobs.to_engine import require_in_scope, to_engine

    loaded = load_job(path)
    beams = to_engine(loaded.job, path)
    if only is not None:
        beams = [b for b in beams if b.mark == only]
        if not beams:
            marks = ", ".join(b.mark for b in loaded.job.beam)
            raise JobFileError(path, [("", f"no beam with mark {only!r}; marks: {marks}")])
    require_in_scope(beams, path)
    return loaded.job, beams


def fail_input(exc: Exception) -> int:
    print(f"error: {exc}", file=sys.stderr)
    return EXIT_INPUT
