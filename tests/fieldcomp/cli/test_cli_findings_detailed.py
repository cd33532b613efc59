"""`fieldcomp findings --as-detailed CSV`: the studs as detailed on the shop drawings, from a marks
CSV with rib and count columns, saved into the job; findings then apply to that layout.

The demo beam 3B-101 (W21X44, 32 ft, 3-in deck, 12 in pitch: ribs 1-30 on this beam) is
detailed here with one stud in every rib; fieldcomp's own layout leaves some ribs empty, so a stud
missing at such a rib is refused on fieldcomp's layout and accepted on the drawings'.
"""

from __future__ import annotations

import json
import tomllib
from pathlib import Path

from fieldcomp.cli.main import main
from tests.fieldcomp.cli.test_cli_findings_import import _copy_demo, _occupied_ribs


def test_as_detailed_csv_sets_the_layout_findings_apply_to(tmp_path, capsys):
    empty = next(n for n in range(1, 31) if n not in _occupied_ribs("3B-101"))
    job = _copy_demo(tmp_path)
    marks = tmp_path / "drawings.csv"
    marks.write_text("Rib,Count\n" + "".join(f"{k},1\n" for k in range(1, 31)))
    assert main(["findings", str(job), "--beam", "3B-101", "--as-detailed", str(marks), "--json"]) in (0, 1, 3)
    out = json.loads(capsys.readouterr().out)
    assert out["layout_source"].startswith("as detailed") and out["studs_designed"] == 30
    saved = tomllib.loads(job.read_text())
    beam = next(b for b in saved["beam"] if b["mark"] == "3B-101")
    assert len(beam["as_detailed"]) == 30 and Path(str(job) + ".bak").exists()
    # a finding at a rib fieldcomp leaves empty is a loss on the drawings' layout
    beam_text = job.read_text().replace('[[beam.finding]]               # stud inspection report SI-07: accepted as built',
                                        f'[[beam.finding]]\nkind = "missing"\nrib = {empty}\n[[beam.finding]]', 1)
    job.write_text(beam_text)
    assert main(["findings", str(job), "--beam", "3B-101", "--json"]) in (0, 1, 3)
    out = json.loads(capsys.readouterr().out)
    assert out["findings"][0]["rib"] == empty and out["studs_lost"] == 4


def test_as_detailed_csv_needs_rib_and_count(tmp_path, capsys):
    job = _copy_demo(tmp_path)
    before = job.read_bytes()
    bad = tmp_path / "bad.csv"
    bad.write_text("mark,qty\n1,1\n")
    assert main(["findings", str(job), "--beam", "3B-101", "--as-detailed", str(bad)]) == 2
    assert "count column" in capsys.readouterr().err and job.read_bytes() == before


def test_as_detailed_rows_off_the_beam_are_refused_and_nothing_saved(tmp_path, capsys):
    job = _copy_demo(tmp_path)
    before = job.read_bytes()
    marks = tmp_path / "drawings.csv"
    marks.write_text("rib,studs\n31,1\n")  # 3B-101 has 30 ribs
    assert main(["findings", str(job), "--beam", "3B-101", "--as-detailed", str(marks)]) == 2
    assert "ribs are numbered 1 to 30" in capsys.readouterr().err and job.read_bytes() == before
