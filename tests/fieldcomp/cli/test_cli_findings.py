"""`fieldcomp findings`: verdict, repair and exit codes on the demo job's two inspected beams.

Demo (jobs/harbor_row_level3.toml): 3B-103 carries a report that fails (composite under 25 % and a
60 in stud gap, AISC 360-22 Commentary I3.2d and I8.2d); 3B-101 one that passes. `fieldcomp check`
evaluates the design, not the findings, so both beams pass it.
"""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from fieldcomp.cli.main import main

ROOT = Path(__file__).resolve().parents[3]
DEMO = str(ROOT / "jobs" / "harbor_row_level3.toml")
KEYS = {"mark", "sum_qn_kips_left", "sum_qn_kips_right", "min_strength_ratio", "min_ratio_station_in",
        "composite_ratio", "live_deflection_in", "verdict", "repair", "repair_studs_total", "caution",
        "governing", "findings", "checks"}


def findings_json(capsys, *args) -> tuple[int, dict]:
    code = main(["findings", *args, "--json"])
    return code, json.loads(capsys.readouterr().out)


def test_failing_demo_beam_gets_a_repair_that_passes_when_applied(tmp_path, capsys):
    code, out = findings_json(capsys, DEMO, "--beam", "3B-103")
    assert code == 1 and KEYS <= out.keys()
    assert out["verdict"] == "fail" and out["min_strength_ratio"] > 0
    assert out["repair"] and out["repair_studs_total"] == sum(r["added"] for r in out["repair"])
    assert out["after_repair"]["verdict"] == "pass"
    assert any("AWS D1.1" in c for c in out["caution"])
    # apply the repair from scratch: import it as "added" findings into a copy of the job
    job = tmp_path / "job.toml"
    job.write_bytes(Path(DEMO).read_bytes())
    log = tmp_path / "repair.csv"
    log.write_text("kind,rib,count,note\n" + "".join(f"added,{r['rib']},{r['added']},repair\n" for r in out["repair"]))
    assert main(["findings", str(job), "--beam", "3B-103", "--import", str(log)]) == 0
    capsys.readouterr()
    code, fixed = findings_json(capsys, str(job), "--beam", "3B-103")
    assert code == 0 and fixed["verdict"] == "pass" and fixed["repair_studs_total"] == 0


def test_passing_demo_beam_exits_0_with_no_repair(capsys):
    code, out = findings_json(capsys, DEMO, "--beam", "3B-101")
    assert code == 0 and out["verdict"] == "pass"
    assert out["repair"] == [] and out["repair_studs_total"] == 0 and out["min_strength_ratio"] >= 1.0


def test_design_check_still_passes_for_the_inspected_beams(capsys):
    for mark in ("3B-103", "3B-101"):
        assert main(["check", DEMO, "--beam", mark]) == 0
    capsys.readouterr()


def test_text_report_carries_the_cautions_and_the_repair(capsys):
    assert main(["findings", DEMO, "--beam", "3B-103"]) == 1
    text = capsys.readouterr().out
    assert "engineer of record" in text and "AWS D1.1" in text and "approved before work" in text
    assert "fewest studs that restore every check:" in text and "verdict (as built): FAIL" in text and "AISC 360-22 I8.2a" in text


def test_contradicting_finding_in_the_job_exits_2_naming_it(tmp_path, capsys):
    bad = tmp_path / "bad.toml"
    text = Path(DEMO).read_text()
    # the demo's rib 29 of 3B-103 holds one stud: two missing there contradicts the layout
    bad.write_text(text.replace('kind = "missing"\nrib = 29\n', 'kind = "missing"\nrib = 29\ncount = 2\n', 1))
    assert main(["findings", str(bad), "--beam", "3B-103"]) == 2
    err = capsys.readouterr().err
    assert "3B-103" in err and "finding[0]" in err and "rib 29 holds 1" in err


def test_unknown_beam_exits_2(capsys):
    assert main(["findings", DEMO, "--beam", "NOPE"]) == 2
    assert "no beam with mark 'NOPE'" in capsys.readouterr().err


def test_beam_is_required():
    with pytest.raises(SystemExit) as err:
        main(["findings", DEMO])
    assert err.value.code == 2


def test_repair_sheet_renders_existing_lost_and_added_studs_with_envelopes(tmp_path, capsys):
    import xml.etree.ElementTree as ET

    svg = tmp_path / "repair.svg"
    code, _ = findings_json(capsys, DEMO, "--beam", "3B-103", "--repair-svg", str(svg))
    assert code == 1
    text = svg.read_text()
    ET.fromstring(text)  # well-formed XML
    assert "stud lost" in text and "stud to add" in text  # legend beside the studs in place
    assert "capacity after" in text and "demand" in text  # envelopes as built and after the repair
    assert "AWS D1.1" in text and "3B-103" in text
