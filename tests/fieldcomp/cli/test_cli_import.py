"""`fieldcomp import`: the invented building (tests/fieldcomp/jobs/ifc_building.py) and an
invented schedule go to a job that `check` evaluates; a re-import after moving one beam and
adding one prints what changed; inputs are never written; FIFOs and missing folders refused."""

import json
import os
from pathlib import Path

import pytest

from fieldcomp.cli.main import main
from tests.fieldcomp.cli.test_cli import DEMO
from tests.fieldcomp.jobs.ifc_building import moved_and_added, write_building


def run(args, capsys):
    code = main(args)
    captured = capsys.readouterr()
    return code, captured.out, captured.err


def test_ifc_to_a_checked_job(tmp_path, capsys):
    model = write_building(tmp_path / "annex.ifc", "IFC2X3", "ft")
    job = tmp_path / "level2.toml"
    code, out, _ = run(["import", str(model), "-o", str(job), "--level", "Level 2"], capsys)
    assert code == 3  # PL-1 not read, placeholders to confirm
    assert "not read: IfcBeam 000000000000000000000I 'PL-1': profile 'PL12X300' is not a W shape" in out
    assert "wrote" in out and "11 beam(s) (4 girder(s))" in out and "TO CONFIRM" in out
    text = job.read_text()
    assert "IFC2X3 model, length unit foot" in text and "centre to centre of supports" in text
    code, out, _ = run(["check", str(job), "--json"], capsys)
    assert code in (0, 1, 3)
    report = json.loads(out)
    assert [b["mark"] for b in report["beams"]][:5] == ["G-1", "G-2", "G-3", "G-4", "B-1"]
    spans = {b["mark"]: b["span_in"] for b in report["beams"]}
    assert spans["B-2"] == pytest.approx(432.0) and spans["G-1"] == pytest.approx(360.0)  # 36 ft and 30 ft c/c


def test_template_gives_deck_slab_studs_and_loads(tmp_path, capsys):
    model = write_building(tmp_path / "annex.ifc")
    job = tmp_path / "level2.toml"
    code, out, _ = run(["import", str(model), "-o", str(job), "--level", "Level 2", "--template", DEMO], capsys)
    assert code == 3
    text = job.read_text()
    assert 'name = "Harbor Row Lab Building - Level 3"' in text
    assert "from the model's slab 000000000000000000000o: 6 1/4\" overall less 3\" deck ribs" in text
    code, out, _ = run(["check", str(job)], capsys)
    assert code in (0, 1, 3) and "11 beam(s)" in out


def test_reimport_prints_what_changed_and_keeps_a_backup(tmp_path, capsys):
    job = tmp_path / "level2.toml"
    run(["import", str(write_building(tmp_path / "a.ifc")), "-o", str(job), "--level", "Level 2"], capsys)
    first = job.read_bytes()
    revised = write_building(tmp_path / "b.ifc", pieces=moved_and_added())
    code, out, _ = run(["import", str(revised), "-o", str(job), "--level", "Level 2"], capsys)
    assert code == 3  # PL-1 still not read
    assert "5 changed, 1 added, 0 no longer in the source, 6 unchanged" in out  # girders unchanged: the beams name them
    assert "  changed B-3: spacing_left 10'-0\" -> 12'-0\"; spacing_right 10'-0\" -> 8'-0\"; plan" in out
    assert "  added   B-8: W18X35, span 36'-0\"" in out
    assert (tmp_path / "level2.toml.bak").read_bytes() == first
    code, out, _ = run(["check", str(job), "--beam", "B-8"], capsys)
    assert code in (0, 1, 3) and "B-8" in out


def test_schedule_to_a_checked_job(tmp_path, capsys):
    schedule = tmp_path / "framing.csv"
    schedule.write_text("Mark,Size,Span (ft),Spacing,Studs\nB-1,W18X35,30,10 ft,24\nB-2,W18X35,30,10 ft,zero\n")
    job = tmp_path / "floor.toml"
    code, out, _ = run(["import", str(schedule), "-o", str(job)], capsys)
    assert code == 3 and "not read: row 3 (B-2): column 'Studs'" in out
    code, out, _ = run(["check", str(job)], capsys)
    assert code in (0, 1, 3) and "1 beam(s)" in out


def test_never_writes_onto_an_input(tmp_path, capsys):
    schedule = tmp_path / "framing.csv"
    schedule.write_text("Mark,Size,Span,Spacing\nB-1,W18X35,30 ft,10 ft\n")
    before = schedule.read_bytes()
    code, _, err = run(["import", str(schedule), "-o", str(schedule)], capsys)
    assert code == 2 and "would overwrite the input" in err and schedule.read_bytes() == before
    template = tmp_path / "t.toml"
    demo = Path(DEMO).read_bytes()
    template.write_bytes(demo)
    code, _, err = run(["import", str(schedule), "-o", str(template), "--template", str(template)], capsys)
    assert code == 2 and str(template) in err and template.read_bytes() == demo


@pytest.mark.skipif(not hasattr(os, "mkfifo"), reason="needs FIFOs")
def test_fifo_and_missing_folder_are_refused_naming_the_path(tmp_path, capsys):
    schedule = tmp_path / "framing.csv"
    schedule.write_text("Mark,Size,Span,Spacing\nB-1,W18X35,30 ft,10 ft\n")
    fifo = tmp_path / "out.toml"
    os.mkfifo(fifo)
    code, _, err = run(["import", str(schedule), "-o", str(fifo)], capsys)
    assert code == 2 and f"{fifo}: is a pipe or FIFO" in err
    missing = tmp_path / "nowhere" / "floor.toml"
    code, _, err = run(["import", str(schedule), "-o", str(missing)], capsys)
    assert code == 2 and str(missing) in err and "does not exist" in err
    code, _, err = run(["import", str(fifo), "-o", str(tmp_path / "x.toml")], capsys)
    assert code == 2 and "pipe or FIFO" in err


def test_import_help(capsys):
    with pytest.raises(SystemExit):
        main(["import", "--help"])
    assert "--template" in capsys.readouterr().out


def test_schedule_reimport_updates_the_span_and_keeps_the_studs(tmp_path, capsys):
    schedule = tmp_path / "framing.csv"
    schedule.write_text("Mark,Size,Span (ft),Spacing,Studs\nB-1,W18X35,30,10 ft,24\n")
    job = tmp_path / "floor.toml"
    run(["import", str(schedule), "-o", str(job)], capsys)
    job.write_text(job.read_text().replace("count = 24  # from the schedule", "count = 28  # S-201 rev 2"))
    schedule.write_text("Mark,Size,Span (ft),Spacing,Studs\nB-1,W18X35,31,10 ft,24\nB-2,W16X26,20,10 ft,\n")
    code, out, _ = run(["import", str(schedule), "-o", str(job)], capsys)
    assert code == 3  # B-2 took its loads and studs from B-1: to confirm
    assert "  changed B-1: span 30 ft -> 31 ft" in out and "  added   B-2: W16X26, span 20 ft" in out
    assert "count = 28  # S-201 rev 2" in job.read_text()
