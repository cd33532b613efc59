"""Shared helpers of the CLI verbs: loading a job into engine inputs, exit codes, errors."""

from __future__ import annotations

import contextlib
import sys
from collections.abc import Iterator
from typing import TextIO

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


def fail_input(exc: Exception | str) -> int:
    print(f"error: {exc}", file=sys.stderr)
    return EXIT_INPUT


def fail_output(exc: OSError, path: object = None) -> int:
    """Exit 2 for an output that cannot be written, naming the file (FileKindError names it)."""
    from fieldcomp.jobs.file_kinds import FileKindError

    if isinstance(exc, FileKindError):
        return fail_input(exc)
    where = path if path is not None else exc.filename
    return fail_input(f"cannot write{f' {where}' if where else ''}: {exc.strerror or exc}")


class PrintableStream:
    """A text stream passing on only printable text and line breaks: names, marks and notes come
    from job files and logs, and an escape sequence in one must not reach the terminal."""

    def __init__(self, stream: TextIO) -> None:
        from engine.model.text import printable_lines

        self._stream, self._clean = stream, printable_lines

    def write(self, text: str) -> int:
        self._stream.write(self._clean(text))
        return len(text)

    def flush(self) -> None:
        self._stream.flush()


@contextlib.contextmanager
def printable_output() -> Iterator[None]:
    """stdout and stderr as PrintableStream while a report verb runs."""
    out, err = sys.stdout, sys.stderr
    sys.stdout, sys.stderr = PrintableStream(out), PrintableStream(err)  # type: ignore[assignment]
    try:
        yield
    finally:
        sys.stdout, sys.stderr = out, err
