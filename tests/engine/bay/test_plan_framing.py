"""Bearings found on plan (geometry: the distance from a work point to a girder's line, and where
along the girder its foot falls)."""

from engine.bay.inputs import FAR_END, REFERENCE_END, Bearing, PlanLine
from engine.bay.plan_framing import plan_bearings

GIRDER = ("G-1", PlanLine(360.0, 0.0, 360.0, 360.0))  # north along x = 30 ft
SPANS = {"G-1": 360.0, "B-1": 360.0, "B-2": 360.0, "B-3": 360.0}


def test_a_beam_end_on_the_girder_line_rests_on_it_at_its_foot():
    plans = (GIRDER, ("B-1", PlanLine(0.0, 120.0, 360.4, 120.0)),  # 0.4 in off the line, at 10 ft
             ("B-2", PlanLine(360.0, 240.0, 720.0, 240.0)),  # reference end on it at 20 ft
             ("B-3", PlanLine(0.0, 360.0, 360.0, 360.0)))  # ends at the girder's end: a column, not a bearing
    found = plan_bearings(plans, SPANS, ())
    assert set(found) == {Bearing("B-1", FAR_END, "G-1", 120.0), Bearing("B-2", REFERENCE_END, "G-1", 240.0)}


def test_the_job_s_own_bearings_stand_and_a_far_line_is_not_a_bearing():
    plans = (GIRDER, ("B-1", PlanLine(0.0, 120.0, 358.0, 120.0)))  # 2 in short of the line
    assert plan_bearings(plans, SPANS, ()) == ()
    mine = (Bearing("B-1", FAR_END, "G-1", 121.0),)
    assert plan_bearings(plans, SPANS, mine) == ()
