"""`fieldcomp marks`: one sheet per beam with --all, text / CSV / SVG agree, safe file names,
exit codes."""

from __future__ import annotations

import csv
import xml.etree.ElementTree as ET
from pathlib import Path

import pytest

from fieldcomp.cli.main import main
from fieldcomp.jobs.output_names import inside, safe_name, unique_names

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
SVG_G = "{http://www.w3.org/2000/svg}g"


def demo_marks() -> list[str]:
    return [line.split('"')[1] for line in DEMO.read_text().splitlines() if line.startswith("mark = ")]


def test_all_writes_one_sheet_and_csv_per_beam_that_agree_with_the_text(tmp_path, capsys):
    out = tmp_path / "out"
    assert main(["marks", str(DEMO), "--all", "--svg", str(out), "--csv", str(out), "--date", "2025-01-15"]) == 0
    text = capsys.readouterr().out
    marks = demo_marks()
    assert sorted(p.name for p in out.iterdir()) == sorted([m + ".svg" for m in marks] + [m + ".csv" for m in marks])
    for mark in marks:
        root = ET.fromstring((out / f"{mark}.svg").read_text())
        svg_rows = [(int(g.get("data-slot")), float(g.get("data-station-in")), int(g.get("data-studs")))
                    for g in root.iter(SVG_G) if g.get("class") == "mark-row"]
        with open(out / f"{mark}.csv", newline="", encoding="utf-8") as fh:
            csv_rows = [(int(r["slot"]), float(r["station_in"]), int(r["studs"])) for r in csv.DictReader(fh)]
        assert svg_rows == [(s, pytest.approx(x, abs=1e-3), n) for s, x, n in csv_rows]
        assert f"beam {mark}," in text and "2025-01-15" in (out / f"{mark}.svg").read_text()
    assert text.count("CAUTION") == len(marks)


def test_one_beam_to_named_files(tmp_path, capsys):
    svg, table = tmp_path / "b.svg", tmp_path / "b.csv"
    assert main(["marks", str(DEMO), "--beam", "3B-101", "--svg", str(svg), "--csv", str(table)]) == 0
    assert ET.fromstring(svg.read_text()).tag.endswith("svg")
    assert table.read_text().startswith("job,beam,slot,")
    assert "3B-101" in capsys.readouterr().out
    assert not list(tmp_path.glob(".*.tmp"))  # no temporary file left behind


def test_neither_beam_nor_all_is_an_input_error(capsys):
    assert main(["marks", str(DEMO)]) == 2
    assert "--beam" in capsys.readouterr().err


def test_a_layout_short_of_its_count_exits_1(tmp_path, capsys):
    job = tmp_path / "many.toml"
    job.write_text(DEMO.read_text().replace("count = 26", "count = 80", 1))
    assert main(["marks", str(job), "--beam", "3B-101"]) == 1
    assert "only 60 of the 80 studs" in capsys.readouterr().out  # 30 ribs x 2 across the W18X35 flange


def test_hostile_marks_stay_inside_the_folder(tmp_path, capsys):
    job = tmp_path / "evil.toml"
    text = DEMO.read_text().replace('mark = "3B-101"', 'mark = "../../escape"', 1)
    job.write_text(text.replace('mark = "3B-102"', 'mark = "a/b\\\\c"', 1))
    out = tmp_path / "sheets"
    assert main(["marks", str(job), "--all", "--svg", str(out)]) in (0, 1)
    names = sorted(p.name for p in out.iterdir())
    assert "escape.svg" in names and "a_b_c.svg" in names
    assert not (tmp_path / "escape.svg").exists() and not (tmp_path.parent / "escape.svg").exists()


def test_all_with_a_file_where_the_folder_should_be_is_an_input_error(tmp_path, capsys):
    clash = tmp_path / "clash"
    clash.write_text("x")
    assert main(["marks", str(DEMO), "--all", "--svg", str(clash)]) == 2


@pytest.mark.parametrize("mark, name", [
    ("3B-101", "3B-101"), ("../x", "x"), ("a/b\\c", "a_b_c"), ("..", "beam"), ("x\x00y\ny", "x_y_y"),
    ("CON", "beam_CON"), (" .hidden", "hidden"), ("a..b", "a.b"),
])
def test_safe_name(mark, name):
    assert safe_name(mark) == name


def test_unique_names_and_inside(tmp_path):
    assert unique_names(["A/1", "A_1", "a 1"]) == ["A_1", "A_1-2", "a_1-3"]
    assert inside(tmp_path, "ok.svg").parent == tmp_path.resolve()
    with pytest.raises(OSError):
        inside(tmp_path, "../out.svg")
