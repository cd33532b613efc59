"""The adversarial suite over job files: structure-aware mutations of the shipped jobs run through
every command, against the oracle in adversarial_cases.py (no traceback, exit 0/1/2 with a named
file, clean streams, strict JSON, XML-valid SVG, guarded CSV, imports that lose nothing, a
workbench that never shows an internal error, no hang).

CI runs a fixed slice of cases (well under a minute). `pytest -m slow -s` runs the long run on
four worker processes, each capped in memory, and prints its figures (cases, time, findings);
FIELDCOMP_ADVERSARIAL_CASES sets its size. A finding names its case number: make_case(number)
rebuilds the case exactly.
"""

from __future__ import annotations

import collections
import multiprocessing
import os
import resource
import tempfile
import time
from pathlib import Path

import pytest

from tests.fieldcomp.adversarial_cases import COMMANDS, Finding, make_case, run_case

CI_CASES = range(0, 350)
LONG_CASES = int(os.environ.get("FIELDCOMP_ADVERSARIAL_CASES", "40000"))
LONG_FIRST = 1_000_000  # the long run's cases do not repeat the CI slice's
WORKERS = 4  # two cores; the cases wait on fsync about half the time
WORKER_MEMORY = 4 * 2**30  # a case that would allocate more is a finding (MemoryError), not a dead machine


def _report(findings: list[Finding]) -> str:
    by_signature: dict[str, list[Finding]] = collections.defaultdict(list)
    for f in findings:
        by_signature[f.signature].append(f)
    lines = [f"{len(by_signature)} distinct findings in {len(findings)} runs:"]
    for signature, group in by_signature.items():
        lines.append(f"  [{len(group)}] {signature}: case {group[0].case} ({group[0].detail[:300]})")
    return "\n".join(lines)


def test_ci_slice_finds_nothing(tmp_path):
    findings: list[Finding] = []
    ran = collections.Counter()
    for number in CI_CASES:
        case = make_case(number)
        ran.update(case.commands)
        findings += run_case(case, tmp_path / str(number))
    assert not findings, _report(findings)
    assert set(ran) == set(COMMANDS) and min(ran.values()) >= 70, ran  # every command, many times


def _worker(numbers: range) -> tuple[int, list[Finding], dict[str, int]]:
    resource.setrlimit(resource.RLIMIT_AS, (WORKER_MEMORY, WORKER_MEMORY))
    found: list[Finding] = []
    ran: collections.Counter[str] = collections.Counter()
    with tempfile.TemporaryDirectory() as folder:
        for number in numbers:
            case = make_case(number)
            ran.update(case.commands)
            found += run_case(case, Path(folder) / str(number))
    return len(numbers), found, dict(ran)


@pytest.mark.slow
def test_long_run_finds_nothing():
    chunk = 200
    chunks = [range(start, min(start + chunk, LONG_FIRST + LONG_CASES))
              for start in range(LONG_FIRST, LONG_FIRST + LONG_CASES, chunk)]
    started = time.perf_counter()
    findings: list[Finding] = []
    cases = 0
    ran: collections.Counter[str] = collections.Counter()
    with multiprocessing.get_context("fork").Pool(WORKERS, maxtasksperchild=10) as pool:
        for count, found, commands in pool.imap_unordered(_worker, chunks):
            cases += count
            findings += found
            ran.update(commands)
    elapsed = time.perf_counter() - started
    print(f"\nadversarial long run: {cases} cases, {sum(ran.values())} command runs "
          f"({', '.join(f'{c} {n}' for c, n in sorted(ran.items()))}) in {elapsed:.0f} s; "
          f"{len({f.signature for f in findings})} distinct findings")
    assert not findings, _report(findings)
