"""Every shipped job file is a test: loaded, evaluated, and its CLI text reports (check, camber,
marks) compared with the golden files in tests/golden/ (regenerate with tools/update_golden.py
and read the diff)."""

import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT / "tools"))

from update_golden import golden_path, reports  # noqa: E402

JOBS = sorted((ROOT / "jobs").glob("*.toml"))


@pytest.mark.parametrize("job", JOBS, ids=[j.stem for j in JOBS])
def test_job_reports_match_golden(job):
    for verb, text in reports(job).items():
        expected = golden_path(job, verb)
        assert expected.exists(), f"no golden report {expected.name}: run tools/update_golden.py"
        assert text == expected.read_text(encoding="utf-8"), f"{expected.name} differs"


def test_every_job_has_six_or_more_beams_and_no_beam_fails_check():
    for job in JOBS:
        check = reports(job)["check"]
        assert check.startswith(("exit 0", "exit 3")), job.name  # pass, or review for the engineer of record
        assert check.count("\nBeam ") >= 6
