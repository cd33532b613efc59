"""Per-beam work of the batch verbs (`check`, `camber`) over many beams: each beam type once
(engine.batch.repeats), in this process for small jobs, in a pool of worker processes for large
ones. Results come back in input order, so the output is the same whichever way it ran; the JSON
is written beam by beam, never joined in memory."""

from __future__ import annotations

import json
import multiprocessing
import os
from collections.abc import Callable, Iterable, Sequence
from concurrent.futures import ProcessPoolExecutor
from typing import Any, TextIO, TypeVar

from fieldcomp.views.numbers import json_text

T = TypeVar("T")
R = TypeVar("R")

POOL_MIN_BEAMS = 200  # below this, starting workers costs more than it saves
POOL_WORKERS = 2

# The mark a beam type is computed and reported under, replaced by each beam's own mark after.
# It holds NUL, which no job text may hold (fieldcomp.jobs.model) and no JSON string holds
# unescaped; the engine never reads a mark, so every place it shows in a report is a view
# printing the mark as it is (JSON: encoded as a string).
MARK_STAND_IN = "\x00mark\x00"
_MARK_STAND_IN_JSON = json.dumps(MARK_STAND_IN)[1:-1]


def map_beams(fn: Callable[[T], R], items: Sequence[T], pooled: bool = True) -> list[R]:
    """[fn(item) for item in items], on POOL_WORKERS processes when `pooled`, there are
    POOL_MIN_BEAMS items or more and the machine has the cores. `fn` must be a module-level
    function (or a partial of one) and its results picklable. tools/bench.py times each verb
    with the pool on and off: it pays for `check`, not for the lighter `camber`."""
    workers = min(POOL_WORKERS, _cores())
    if not pooled or len(items) < POOL_MIN_BEAMS or workers < 2:
        return [fn(item) for item in items]
    # fork starts workers with the engine already imported; elsewhere the platform default
    context = multiprocessing.get_context("fork") if "fork" in multiprocessing.get_all_start_methods() else None
    with ProcessPoolExecutor(max_workers=workers, mp_context=context) as pool:
        return list(pool.map(fn, items, chunksize=max(1, len(items) // (32 * workers))))


def relabel_report(report: str, mark: str, as_json: bool) -> str:
    """A report made under MARK_STAND_IN, for the beam `mark`: JSON (an escaped stand-in, which
    no other escaped JSON string contains: its backslashes open escapes) or plain text."""
    if as_json:
        return report.replace(_MARK_STAND_IN_JSON, json.dumps(mark)[1:-1])
    return report.replace(MARK_STAND_IN, mark)


def _cores() -> int:
    try:
        return len(os.sched_getaffinity(0))
    except AttributeError:  # not on every platform
        return os.cpu_count() or 1


def json_item(item: Any) -> str:
    """One item of a JSON list on one line (one beam per line: easy to grep and diff, and the
    C encoder is several times faster than the indenting one)."""
    return "    " + json_text(item, separators=(", ", ": "))


def json_with_list(head: dict[str, Any], key: str, items: list[str]) -> str:
    """`{**head, key: [...]}` as JSON: the head indented, the list given as `json_item` texts (so
    the items can be encoded where they were computed, one per line); `key` comes last."""
    text = json.dumps({**head, key: []}, indent=2)
    if not items:
        return text
    return text[: -len("[]\n}")] + "[\n" + ",\n".join(items) + "\n  ]\n}"


def write_json_with_list(out: TextIO, head: dict[str, Any], key: str, items: Iterable[str]) -> None:
    """`print(json_with_list(head, key, list(items)), file=out)`, written item by item."""
    text = json.dumps({**head, key: []}, indent=2)
    first = True
    for item in items:
        out.write((text[: -len("[]\n}")] + "[\n" if first else ",\n") + item)
        first = False
    out.write(text + "\n" if first else "\n  ]\n}\n")
