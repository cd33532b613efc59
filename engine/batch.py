"""Many beams at once: repeated beam types evaluated once and relabelled.

A floor repeats its beam types: beams identical in every input but their mark get the same
results, because no stage of the engine reads the mark (it is the beam's name in reports only).
`repeats` groups a batch by its input less the mark; `relabel` gives a result the mark of another
beam of its group; `evaluate_beams` is `evaluate_beam` over a batch, each type computed once.
"""

from __future__ import annotations

from dataclasses import fields, is_dataclass, replace
from typing import Any, TypeVar

from engine.finished.evaluate import BeamResult
from engine.model.inputs import BeamInput
from engine.pipeline import evaluate_beam

T = TypeVar("T")


def beam_type(beam: BeamInput) -> BeamInput:
    """What the engine computes `beam` from: its input with the mark left out."""
    return replace(beam, mark="")


def repeats(beams: list[BeamInput] | tuple[BeamInput, ...]) -> tuple[list[BeamInput], list[int]]:
    """(the first beam of each type, in input order; for each beam the index of its type there)."""
    index: dict[BeamInput, int] = {}
    first: list[BeamInput] = []
    which: list[int] = []
    for beam in beams:
        key = beam_type(beam)
        k = index.setdefault(key, len(first))
        if k == len(first):
            first.append(beam)
        which.append(k)
    return first, which


def relabel(value: T, mark: str) -> T:
    """`value` (a result, or a tuple or list of results) with every beam input in it carrying
    `mark`; parts without a beam input are shared, not copied."""
    out: Any = value
    if isinstance(value, BeamInput):
        out = value if value.mark == mark else replace(value, mark=mark)
    elif isinstance(value, (tuple, list)):
        items = [relabel(v, mark) for v in value]
        if any(a is not b for a, b in zip(items, value)):
            out = type(value)(items)
    elif is_dataclass(value) and not isinstance(value, type):
        changes = {}
        for f in fields(value):
            old = getattr(value, f.name)
            new = relabel(old, mark)
            if new is not old:
                changes[f.name] = new
        if changes:
            out = replace(value, **changes)
    return out  # type: ignore[no-any-return]


def evaluate_beams(beams: list[BeamInput] | tuple[BeamInput, ...]) -> tuple[BeamResult, ...]:
    """`engine.pipeline.evaluate_beam` of each beam, in order; each beam type (`repeats`) is
    evaluated once and its result relabelled for the other beams of the type. The result of a
    batch of one is `evaluate_beam`'s. AISC 360-22 Chapter I (see engine.finished.evaluate)."""
    first, which = repeats(beams)
    results = [evaluate_beam(b) for b in first]
    return tuple(relabel(results[k], beam.mark) for beam, k in zip(beams, which))
