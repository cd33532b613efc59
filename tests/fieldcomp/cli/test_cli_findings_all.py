"""Inspection records and the floor summary: findings grouped by inspection report, dispositions
with who and when kept in the job file, `fieldcomp findings JOB --all` as text, JSON and CSV.

Demo job (invented): beam 3B-101 has three findings; here the first is put under report SI-07,
which the engineer of record accepted on 2024-05-16; the other two stay open. Beam 3B-103 fails as
built (tests/golden, `fieldcomp findings --beam 3B-103`), so the floor exit code is 1.
"""

from __future__ import annotations

import csv
import io
import json

from fieldcomp.cli.main import main
from tests.fieldcomp.cli.test_cli_findings_import import DEMO

SI_07 = '''[[beam.report]]
number = "SI-07"
date = "2024-05-14"
inspector = "special inspector"
[[beam.report.history]]
status = "accepted-by-eor"
by = "A. Engineer"
on = "2024-05-16"
[[beam.finding]]               # stud inspection report SI-07: accepted as built
report = "SI-07"
kind = "missing"'''


def _job(tmp_path, text: str | None = None):
    job = tmp_path / "job.toml"
    demo = DEMO.read_text()
    job.write_text(demo.replace('[[beam.finding]]               # stud inspection report SI-07: accepted as built\n'
                                'kind = "missing"', SI_07, 1) if text is None else text)
    return job


def test_dispositions_govern_their_findings(tmp_path, capsys):
    job = _job(tmp_path)
    assert main(["findings", str(job), "--beam", "3B-101", "--json"]) == 0
    found = json.loads(capsys.readouterr().out)["findings"]
    assert [f["disposition"] for f in found] == ["accepted-by-eor", "open", "open"]
    assert found[0]["report"] == "SI-07" and found[0]["disposition_by"] == "A. Engineer"


def test_floor_summary_text_json_csv(tmp_path, capsys):
    job = _job(tmp_path)
    out_csv = tmp_path / "floor.csv"
    assert main(["findings", str(job), "--all", "--csv", str(out_csv)]) == 1
    text = capsys.readouterr().out
    assert "whole floor" in text and "engineer of record" in text and "3B-103" in text
    assert main(["findings", str(job), "--all", "--json"]) == 1
    rows = {r["beam"]: r for r in json.loads(capsys.readouterr().out)["beams"]}
    assert rows["3B-101"]["open"] == 2 and rows["3B-101"]["reports"].startswith("SI-07")
    assert rows["3B-103"]["verdict_as_built"] == "fail" and rows["3B-102"]["findings"] == 0
    table = list(csv.reader(io.StringIO(out_csv.read_text())))
    assert table[0][0] == "beam" and table[-1][0].startswith("CAUTION")


def test_a_finding_naming_an_unknown_report_is_refused(tmp_path, capsys):
    job = _job(tmp_path, DEMO.read_text().replace('kind = "missing"\nrib = 2', 'report = "SI-99"\nkind = "missing"\nrib = 2', 1))
    assert main(["findings", str(job), "--all"]) == 2
    assert "SI-99" in capsys.readouterr().err
