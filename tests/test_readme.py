"""The README and CI agree: the test command the README gives is the one .ci/run runs."""

from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def test_readme_test_command_is_what_ci_runs():
    readme = (ROOT / "README.md").read_text()
    ci = (ROOT / ".ci" / "run").read_text()
    test_line = next(line.strip() for line in ci.splitlines() if "pytest" in line)
    assert test_line in readme
