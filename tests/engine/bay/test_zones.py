"""Pour stages from pour zones: a member's stretch inside an outline on plan (geometry: a segment
cut at every edge it crosses, pieces kept whose middle lies inside, even-odd rule)."""

from __future__ import annotations

import pytest

from engine.bay.inputs import LevelInput, PlanLine, PourZone
from engine.bay.zones import ZoneError, member_stages, stretches
from tests.engine.bay.test_girder_loads import member

FT = 12.0
SOUTH = ((-12.0, -12.0), (732.0, -12.0), (732.0, 180.0), (-12.0, 180.0))  # y under 15 ft
NORTH = ((-12.0, 180.0), (732.0, 180.0), (732.0, 372.0), (-12.0, 372.0))


def test_a_girder_across_a_pour_break_is_placed_in_two_stretches():
    girder = PlanLine(360.0, 0.0, 360.0, 360.0)  # 30 ft north along x = 30 ft
    assert stretches(girder, 360.0, SOUTH) == [(0.0, 180.0)]
    assert stretches(girder, 360.0, NORTH) == [(180.0, 360.0)]
    # an L-shaped outline the member leaves and re-enters: two pieces (hand-drawn: x 0-10 ft and 20-30 ft inside)
    ell = ((-12.0, -12.0), (120.0, -12.0), (120.0, 60.0), (240.0, 60.0), (240.0, -12.0), (372.0, -12.0),
           (372.0, 120.0), (-12.0, 120.0))
    assert stretches(PlanLine(0.0, 0.0, 360.0, 0.0), 360.0, ell) == [(0.0, 120.0), (240.0, 360.0)]


def test_member_stages_by_day_and_a_gap_refused():
    g = member("G-1", "W24X62", load_width=0.0)
    level = LevelInput("L3", (g,), plans=(("G-1", PlanLine(360.0, 0.0, 360.0, 360.0)),),
                       zones=(PourZone("3D", 3.0, outline=NORTH), PourZone("3C", 0.0, outline=SOUTH)))
    stages = member_stages(level, g)
    assert [(s.name, s.start, s.end, s.day) for s in stages] == [("3C", 0.0, 180.0, 0.0), ("3D", 180.0, 360.0, 3.0)]
    with pytest.raises(ZoneError, match=r"beam 'G-1'.*without concrete"):
        member_stages(LevelInput("L3", (g,), plans=level.plans, zones=level.zones[:1]), g)
