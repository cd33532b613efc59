"""`fieldcomp plan`: beams without plan coordinates are listed, not guessed; an unknown level is
refused naming the levels; grid lines come only from beam ends named for grids."""

from __future__ import annotations

import re
import xml.etree.ElementTree as ET
from pathlib import Path

from fieldcomp.cli.main import main
from fieldcomp.views.plan_view import PlanBeam, grid_lines

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"


def test_a_beam_without_plan_coordinates_is_listed_not_drawn(tmp_path, capsys):
    job = tmp_path / "job.toml"
    job.write_text(re.sub(r'(mark = "3B-104"\nlevel = "Level 3"\n)plan = [^\n]*\n', r"\1", DEMO.read_text()))
    assert main(["plan", str(job), "--svg", str(tmp_path / "p.svg")]) == 1  # 3B-103 fails as built
    out = capsys.readouterr().out
    assert "not on the plan (no plan coordinates): 3B-104" in out
    root = ET.fromstring((tmp_path / "p.svg").read_bytes())
    words = " ".join(t.text or "" for t in root.iter("{http://www.w3.org/2000/svg}text"))
    assert "3B-104 W14X22" not in words and "NOT ON THE PLAN" in words and "3B-104" in words


def test_an_unknown_level_is_refused_naming_the_levels(capsys):
    assert main(["plan", str(DEMO), "--level", "Level 9"]) == 2
    assert "no beam on level 'Level 9'; levels: Level 3" in capsys.readouterr().err


def test_grid_lines_from_named_ends_square_to_the_beam():
    # a beam along y from (0, 0) to (0, 360) between grids 1 and 2: both grid lines run along x
    b = PlanBeam("B", "W16X26", 0.0, 0.0, 0.0, 360.0, 10, 0.0, "pass", "grid 1", "Grid 2")
    lines = grid_lines([b, PlanBeam("C", "W16X26", 0.0, 0.0, 300.0, 0.0, 10, 0.0, "pass", "north wall", "col 7")])
    assert [(n, p) for n, p, _ in lines] == [("1", (0.0, 0.0)), ("2", (0.0, 360.0))]
    for _, _, (dx, dy) in lines:
        assert abs(dy) < 1e-12 and abs(abs(dx) - 1.0) < 1e-12
