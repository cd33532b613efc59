"""A level converts group by group: beams joined through bearings on girders form one group, and
converting one group alone gives its members as converting the whole job does (the bay solve
couples only what rests on what). The workbench relies on this to convert only the edited
beam's bay. The reference is the whole job's own conversion (`to_engine`)."""

from __future__ import annotations

import dataclasses
import sys
from pathlib import Path

import numpy as np

from fieldcomp.jobs.jobfile import load_job, parse_job
from fieldcomp.jobs.to_engine import level_group, level_groups, one_beam_to_engine, to_engine

ROOT = Path(__file__).resolve().parents[3]
sys.path.insert(0, str(ROOT / "tools"))
from bench import generated_job  # noqa: E402  (the benchmark's floors)


def assert_close(a, b, where: str = "") -> None:
    """Equal field by field; floats and arrays to 1e-12 relative (the level's linear solve over
    more members rounds in the last bit)."""
    if dataclasses.is_dataclass(a):
        for f in dataclasses.fields(a):
            assert_close(getattr(a, f.name), getattr(b, f.name), f"{where}.{f.name}")
    elif isinstance(a, tuple):
        assert len(a) == len(b), where
        for k, (x, y) in enumerate(zip(a, b)):
            assert_close(x, y, f"{where}[{k}]")
    elif isinstance(a, np.ndarray):
        assert np.allclose(a, b, rtol=1e-12, atol=1e-12), where
    elif isinstance(a, float):
        assert abs(a - b) <= 1e-12 * max(1.0, abs(b)), where
    else:
        assert a == b, where


def test_the_demo_bay_is_one_group_and_every_other_beam_its_own():
    job = load_job(ROOT / "jobs" / "harbor_row_level3.toml").job
    marks = [b.mark for b in job.beam]
    bay = sorted(marks[k] for k in level_group(job, marks.index("3G-201")))
    assert bay == ["3B-107", "3B-108", "3B-109", "3B-110", "3G-201"]
    assert sum(len(g) for g in level_groups(job)) == len(marks)
    assert [marks[k] for k in level_group(job, marks.index("3B-101"))] == ["3B-101"]


def test_one_beam_of_a_level_converts_as_the_whole_job_gives_it():
    for job in (load_job(ROOT / "jobs" / "harbor_row_level3.toml").job, parse_job(generated_job(120))):
        whole = to_engine(job)
        for k in range(len(job.beam)):
            assert_close(one_beam_to_engine(job, k), whole[k], job.beam[k].mark)
