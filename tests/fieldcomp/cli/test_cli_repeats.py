"""`check` and `camber` compute each beam type once (engine.batch.repeats) and relabel it: their
output is the output of computing every beam on its own, byte for byte, for JSON, text and CSV
(both sides come from the same engine; no engineering values here)."""

from __future__ import annotations

import csv
import io
import json
import sys
from pathlib import Path

from fieldcomp import CAUTION
from fieldcomp.cli import parallel
from fieldcomp.cli.camber import camber_beam
from fieldcomp.cli.check import check_beam
from fieldcomp.cli.common import load_inputs
from fieldcomp.cli.main import main
from fieldcomp.views.construction_report import csv_rows, schedule_text
from fieldcomp.views.finished_report import not_checked_json

sys.path.insert(0, str(Path(__file__).resolve().parents[3] / "tools"))

from bench import generated_job  # the benchmark's floor: repeats of 8 beam types

# marks a stand-in could be confused with: quotes, backslashes, an escape written out, unicode
ODD = ['Q"1', "back\\slash", "\\u0000mark\\u0000", "é-7", "=SUM(A1)"]


def floor(tmp_path: Path, count: int = 30) -> Path:
    text = generated_job(count)
    for i, mark in enumerate(ODD):
        old = f'-{i:05d}"'
        head, _, tail = text.partition(old)
        start = head.rfind('mark = "') + len('mark = "')
        was, written = head[start:] + old[:-1], mark.replace("\\", "\\\\").replace('"', '\\"')
        text = (head[:start] + written + '"' + tail).replace(f'girder = "{was}"', f'girder = "{written}"')
    job = tmp_path / "floor.toml"
    job.write_text(text, encoding="utf-8")
    return job


def out_of(args: list[str], capsys) -> str:
    main(args)
    return capsys.readouterr().out


def test_check_json_equals_each_beam_computed(tmp_path, capsys):
    job = floor(tmp_path)
    loaded, beams = load_inputs(str(job))
    assert {b.mark for b in beams} >= set(ODD)
    items = [check_beam(b, True)[2] for b in beams]
    head = {"job": loaded.project.name, "caution": CAUTION, "not_checked": not_checked_json()}
    expected = parallel.json_with_list(head, "beams", items) + "\n"
    got = out_of(["check", str(job), "--json"], capsys)
    assert got == expected
    assert [b["mark"] for b in json.loads(got)["beams"]] == [b.mark for b in beams]


def test_check_text_holds_each_beam_computed(tmp_path, capsys):
    job = floor(tmp_path)
    _, beams = load_inputs(str(job))
    got = out_of(["check", str(job)], capsys)
    assert "\n\n".join(check_beam(b, False)[2] for b in beams) in got


def test_camber_json_text_csv_equal_each_beam_computed(tmp_path, capsys):
    job = floor(tmp_path)
    loaded, beams = load_inputs(str(job))
    done = [camber_beam(b, True) for b in beams]
    from fieldcomp.cli.camber import level_bays
    from fieldcomp.views.bay_report import bay_json

    head = {"job": loaded.project.name, "caution": CAUTION, "level": bay_json(level_bays(loaded, beams))}
    expected = parallel.json_with_list(head, "beams", [d[3] for d in done]) + "\n"
    assert out_of(["camber", str(job), "--json"], capsys) == expected
    sheet = tmp_path / "sched.csv"
    text = out_of(["camber", str(job), "--csv", str(sheet)], capsys)
    results = [d[2] for d in done]
    rows = io.StringIO()
    csv.writer(rows).writerows(csv_rows(results))
    assert sheet.read_bytes() == rows.getvalue().encode("utf-8")
    assert schedule_text(results) in text
    assert "\n\n".join(camber_beam(b, False)[3] for b in beams) in text
