"""The demo's bay (girder 3G-201 with four level-screeded beams at its third points, a pour break
across it at 15 ft): the derived girder loads equal each beam's own end shears from its construction
stage (engine.construction.staging, a separate code path), the mid-bay deflection is the beam's
share plus the girders', and the report and `fieldcomp camber` show them with the concrete to order."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from engine.construction.evaluate import evaluate_construction
from engine.pipeline import evaluate_level
from fieldcomp import CAUTION
from fieldcomp.cli.main import main
from fieldcomp.jobs.jobfile import JobFileError, load_job, parse_job
from fieldcomp.jobs.to_engine import level_input, to_engine
from fieldcomp.views.bay_report import bay_json, bay_lines, bay_text, concrete_lines, girder_load_lines

DEMO = Path(__file__).resolve().parents[3] / "jobs" / "harbor_row_level3.toml"


@pytest.fixture(scope="module")
def level():
    job = load_job(DEMO).job
    return evaluate_level(level_input(job, to_engine(job, DEMO)))


def test_girder_loads_are_the_beams_end_shears_stage_by_stage(level):
    for mark, end in (("3B-107", 1), ("3B-108", 1), ("3B-109", 0), ("3B-110", 0)):
        own = evaluate_construction(level.member(mark))
        pour = own.run.dead_shear[1:].sum(axis=0)  # the pour steps' end shears, ponded concrete included
        reaction = pour[0] if end == 0 else -pour[1]  # statics: R_left = V(0), R_right = -V(L)
        derived = [g for g in level.loads if g.beam == mark and g.day is not None]
        assert sum(g.wet_concrete + g.ponded_concrete for g in derived) == pytest.approx(reaction, rel=1e-4)
        assert len({g.day for g in derived}) == 1  # each beam lies in one zone
    days = {g.day for g in level.loads if g.day is not None}
    assert days == {0.0, 3.0}  # the girder is loaded on two days across the pour break
    girder = level.member("3G-201")
    assert {p.day for p in girder.point_loads if p.day is not None} == {0.0, 3.0}
    assert [s.name for s in girder.construction.pours] == ["pour 3C", "pour 3D"]


def test_mid_bay_is_beam_plus_girder_and_the_report_shows_it(level):
    record = bay_json(level)
    bay = record["bays"][0]
    assert bay["mid_bay_deflection_in"] == pytest.approx(bay["beam_share_in"] + bay["girder_share_in"], abs=2e-4)
    assert bay["remark"]  # each member under its own minimum, together over it: said, not silent
    choices = [a["choice"] for a in bay["alternatives"]]
    assert choices[0] == "each member's own rule" and "beams cambered for the girders' share" in choices
    level_row = record["concrete"][-1]
    assert level_row["zone"] == "level"
    assert level_row["total_yd3"] == pytest.approx(sum(level_row[k] for k in (
        "nominal_yd3", "ponded_own_sag_yd3", "ponded_girder_sag_yd3", "deck_sag_yd3")), abs=0.02)
    assert record["caution"] == CAUTION and record["deck_sag_method"]
    text = bay_text(level)
    assert "mid-bay wet deflection" in text and "Concrete to order" in text and "pour 3D (day 3)" in text


def test_camber_prints_the_bay_and_its_json(capsys):
    assert main(["camber", str(DEMO)]) in (0, 3)
    out = capsys.readouterr().out
    assert "Bay of girder 3G-201" in out and "Girder loads derived" in out
    assert main(["camber", str(DEMO), "--json"]) in (0, 3)
    record = json.loads(capsys.readouterr().out)
    assert record["level"]["bays"][0]["girder"] == "3G-201" and record["level"]["plan"]


def test_a_bearing_outside_the_girder_is_refused():
    text = DEMO.read_text().replace('right_on = { girder = "3G-201", at = "10\'-0\\""',
                                    'right_on = { girder = "3G-201", at = "31 ft"', 1)
    with pytest.raises(JobFileError, match=r"beam '3B-107' #\d+, field 'right_on\.at'.*not inside the span of girder"):
        to_engine(parse_job(text))


def test_zones_without_girders_still_give_the_concrete_to_order():
    """The demo without its bearings: the zones place the four beams (tributary strips 30 ft x
    10 ft each, half of each 10 ft spacing, 6.25 in slab less the void of the ribs: 57.40 psf / 145 pcf x 12 = 4.75 in)."""
    text = DEMO.read_text()
    for line in [ln for ln in text.splitlines() if ln.startswith(("left_on", "right_on"))]:
        text = text.replace(line + "\n", "")
    job = parse_job(text)
    result = evaluate_level(level_input(job, to_engine(job)))
    assert result.bays == () and result.loads == ()
    zones = {z.zone: z for z in result.concrete}
    assert zones["pour 3C"].nominal == pytest.approx(2 * 360.0 * 120.0 * 4.75, rel=1e-3)  # in^3, 3B-107 and 3B-109
    out = bay_text(result)
    assert out.startswith("Concrete to order") and "Bay of girder" not in out


def test_bay_lines_pick_the_bay_of_a_girder_or_of_a_beam_on_it(level):
    """`bay_lines`, `girder_load_lines` and `concrete_lines` select lines of `bay_text` (the same
    numbers, not a second formatting): the demo's bay of girder 3G-201 (beams 3B-107..3B-110 on it),
    none for 3B-101, which rests on no girder and carries none."""
    text = bay_text(level).splitlines()
    for mark in ("3G-201", "3B-107", "3B-110"):
        lines = bay_lines(level, mark)
        assert lines[0].startswith("  Bay of girder 3G-201: beams 3B-107, 3B-108, 3B-109, 3B-110")
        assert any("mid-bay wet deflection" in line for line in lines)
        assert all(line in text for line in lines)
        start = text.index(lines[0])
        assert text[start:start + len(lines)] == lines  # the whole block, in order
        loads = girder_load_lines(level, mark)
        assert len(loads) == 1 + len([g for g in level.loads if g.girder == "3G-201"])  # header + a row each
        assert all(line in text for line in loads)
    assert bay_lines(level, "3B-101") == [] and girder_load_lines(level, "3B-101") == []
    concrete = concrete_lines(level)
    assert concrete[0].startswith("Concrete to order") and all(line in text for line in concrete)
    assert [z.zone for z in level.concrete] == ["pour 3C", "pour 3D", "outside the pour zones", "level"]
    assert len(concrete) == 1 + len(level.concrete) + (1 if level.level.deck_sag else 0)
