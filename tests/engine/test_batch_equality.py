"""The batch (engine.batch.evaluate_beams) gives each beam what the single-beam call gives it,
within 1e-9, on every shipped job and on generated floors holding every path: level screed, pour
stages, a layout that falls short, findings, a girder with point loads. Both sides come from the
engine; the single-beam results are checked against published values elsewhere (tests/validation,
tests/golden).
"""

from __future__ import annotations

import sys
from dataclasses import fields, is_dataclass, replace
from pathlib import Path

import numpy as np
import pytest

from engine.batch import beam_type, relabel, repeats, evaluate_beams
from engine.construction.evaluate import evaluate_construction
from engine.model.inputs import BeamInput
from engine.pipeline import as_poured, evaluate_beam
from engine.studs.design import design_layout
from fieldcomp.jobs.jobfile import load_job, parse_job
from fieldcomp.jobs.to_engine import to_engine

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT / "tools"))

from bench import DEMO, generated_job  # noqa: E402  (the benchmark's floors)

TOL = 1e-9
JOBS = sorted((ROOT / "jobs").glob("*.toml"))


def assert_same(a, b, where: str = "result") -> None:
    """Equal trees of results: numbers and arrays within TOL (relative to 1, or to the value),
    everything else exactly."""
    assert type(a) is type(b), where
    if isinstance(a, np.ndarray):
        assert a.shape == b.shape, where
        if a.dtype.kind in "fc":
            assert np.allclose(a, b, rtol=TOL, atol=TOL, equal_nan=True), where
        else:
            assert (a == b).all(), where
    elif isinstance(a, float):
        assert (np.isnan(a) and np.isnan(b)) or a == pytest.approx(b, rel=TOL, abs=TOL), where
    elif isinstance(a, (tuple, list)):
        assert len(a) == len(b), where
        for i, (x, y) in enumerate(zip(a, b)):
            assert_same(x, y, f"{where}[{i}]")
    elif is_dataclass(a) and not isinstance(a, type):
        for f in fields(a):
            assert_same(getattr(a, f.name), getattr(b, f.name), f"{where}.{f.name}")
    else:
        assert a == b, where


def floors() -> list[tuple[str, list[BeamInput]]]:
    shipped = [(job.stem, to_engine(load_job(job).job)) for job in JOBS]
    generated = [("mixed-40", to_engine(parse_job(generated_job(40)))),
                 ("distinct-24", to_engine(parse_job(generated_job(24, distinct=True))))]
    return shipped + generated


FLOORS = floors()


@pytest.mark.parametrize("name,beams", FLOORS, ids=[f[0] for f in FLOORS])
def test_batch_equals_each_beam_alone(name, beams):
    poured = [as_poured(b)[0] for b in beams]
    batch = evaluate_beams(poured)
    assert len(batch) == len(poured)
    for b, r in zip(poured, batch):
        alone = evaluate_beam(b)
        assert r.beam.mark == b.mark
        assert_same(r, alone, b.mark)


def test_floors_hold_every_path():
    beams = dict(FLOORS)["mixed-40"]
    assert any(b.construction.screed == "level" for b in beams)
    assert any(b.construction.pours for b in beams)
    assert any(b.findings for b in beams)
    assert any(b.point_loads for b in beams)
    assert any(design_layout(as_poured(b)[0]).shortfall is not None for b in beams)


def test_batch_of_one_is_the_single_call():
    for _, beams in FLOORS[:1]:
        for b in beams:
            (r,) = evaluate_beams([b])
            assert_same(r, evaluate_beam(b), b.mark)


def test_beams_differing_only_by_mark_are_one_type():
    beams = dict(FLOORS)["mixed-40"]
    first, which = repeats(beams)
    demo_beams = DEMO.read_text().count("\n[[beam]]")
    assert len(first) == demo_beams + 1 and len(which) == len(beams)  # the demo's beams and the short one
    assert all(beam_type(b) == beam_type(first[k]) for b, k in zip(beams, which))
    distinct = dict(FLOORS)["distinct-24"]
    assert len(repeats(distinct)[0]) == len(distinct)


def test_relabelled_result_is_the_result_of_the_renamed_beam():
    b = dict(FLOORS)["mixed-40"][1]  # the level-screed beam: ponded concrete, pour stages
    c = evaluate_construction(b)
    other = replace(b, mark="9Z-999")
    assert_same(relabel(c, "9Z-999"), evaluate_construction(other))
    assert relabel(c, b.mark) is c  # nothing to change: shared, not copied
