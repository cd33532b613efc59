"""Fuzzed job files: every file either loads and evaluates, or fails with JobFileError naming the
file (and, for beam-level problems, the beam and the field). No other exception, ever.

The default run keeps a small example count; `pytest -m slow` runs 10,000 examples.
"""

import contextlib
import math
import tomllib
from pathlib import Path

import pytest
import tomli_w
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from engine.construction.evaluate import evaluate_construction
from engine.model.scope import OutOfScopeError, check_scope
from engine.pipeline import evaluate_beam
from engine.field.as_built import FindingError, evaluate_as_built
from engine.studs.design import design_layout
from fieldcomp.jobs.jobfile import JobFileError, parse_job
from fieldcomp.jobs.to_engine import to_engine

DEMO = Path(__file__).resolve().parents[3] / "jobs" / "harbor_row_level3.toml"
BASE = tomllib.loads(DEMO.read_text())
PATH = "fuzz/level3.toml"

junk_values = st.one_of(
    st.none(), st.booleans(), st.integers(-10**12, 10**12), st.floats(allow_nan=True, allow_infinity=True),
    st.text(max_size=20), st.sampled_from(["", "0 in", "-3 in", "1e309 in", "12", "3/0 in", "nan in", "inf ft",
                                           "999999 ft", "W99X1", "D9", "design", "30'-14\"", "½ in", "١٢ in",
                                           "5 furlongs", "\x00", "ＷＷ"]),
    st.lists(st.integers(), max_size=3), st.dictionaries(st.text(max_size=5), st.integers(), max_size=2),
)


def _paths(node, prefix=()):
    if isinstance(node, dict):
        for key, value in node.items():
            yield prefix + (key,)
            yield from _paths(value, prefix + (key,))
    elif isinstance(node, list):
        for i, value in enumerate(node):
            yield prefix + (i,)
            yield from _paths(value, prefix + (i,))


ALL_PATHS = list(_paths(BASE))


@st.composite
def mutated_jobs(draw):
    import copy

    job = copy.deepcopy(BASE)
    for _ in range(draw(st.integers(0, 4))):
        path = draw(st.sampled_from(ALL_PATHS))
        parent = job
        try:
            for part in path[:-1]:
                parent = parent[part]
            key = path[-1]
            if not isinstance(parent, (dict, list)):
                continue  # an earlier mutation replaced this branch
            parent[key]  # still there?
        except (KeyError, IndexError, TypeError):
            continue
        action = draw(st.sampled_from(["replace", "delete", "rename", "add"]))
        if action == "replace":
            parent[key] = draw(junk_values)
        elif action == "delete":
            del parent[key]
        elif action == "rename" and isinstance(parent, dict):
            parent[draw(st.text(min_size=1, max_size=12))] = parent.pop(key)
        elif action == "add" and isinstance(parent, dict):
            parent[draw(st.text(min_size=1, max_size=12))] = draw(junk_values)
    return job


def _to_toml(job) -> str | None:
    try:
        return tomli_w.dumps(_drop_none(job))
    except (TypeError, ValueError):
        return None


def _drop_none(node):
    if isinstance(node, dict):
        return {k: _drop_none(v) for k, v in node.items() if v is not None and isinstance(k, str)}
    if isinstance(node, list):
        return [_drop_none(v) for v in node if v is not None]
    return node


def load_and_evaluate(text: str) -> None:
    """The CLI's path: parse, convert, refuse out-of-scope, then every computation a report
    makes (finished beam, construction stage, layout, findings); no NaN reaches a check."""
    job = parse_job(text, PATH)
    for beam in to_engine(job, PATH):
        try:
            check_scope(beam)
        except OutOfScopeError:
            continue
        checks = list(evaluate_beam(beam).checks) + list(evaluate_construction(beam).checks)
        checks += list(design_layout(beam).checks)
        if beam.findings:
            with contextlib.suppress(FindingError):  # a finding that contradicts the layout: reported as input error
                checks += list(evaluate_as_built(beam, design_layout(beam).layout).checks)
        for c in checks:
            assert not math.isnan(c.demand) and not math.isnan(c.capacity), c


def assert_clear(exc: JobFileError) -> None:
    assert exc.path == PATH and exc.problems
    for where, msg in exc.problems:
        assert msg
        if where.startswith("beam"):  # names the beam: its mark or its position
            assert "'" in where or "#" in where


def run_one(job) -> None:
    text = _to_toml(job)
    if text is None:
        return
    try:
        load_and_evaluate(text)
    except JobFileError as exc:
        assert_clear(exc)


@settings(max_examples=250, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(mutated_jobs())
def test_fuzzed_job_files_load_or_fail_clearly(job):
    run_one(job)


@pytest.mark.slow
@settings(max_examples=10_000, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(mutated_jobs())
def test_fuzzed_job_files_long_run(job):
    run_one(job)


@settings(max_examples=150, deadline=None)
@given(st.text(max_size=300))
def test_arbitrary_text_never_crashes(text):
    try:
        load_and_evaluate(text)
    except JobFileError as exc:
        assert_clear(exc)


def test_demo_itself_loads():
    load_and_evaluate(DEMO.read_text())
