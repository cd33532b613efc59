"""Plan layout of members: supports, work points, spans, sides and girder framing. Check values are
plane geometry worked by hand in each test (distances along and across straight lines)."""

import math

import pytest

from fieldcomp.jobs.floor_geometry import Member, Outline, Post, canonical, contains, lay_out

FT = 12.0


def member(mark, start, end, z=-15.0, d=18.0, bf=6.0):
    return Member(f"id-{mark}", mark, "W18X35", tuple(v * FT for v in start), tuple(v * FT for v in end), z, d, bf)


def post(mark, at):
    return Post(f"id-{mark}", mark, tuple(v * FT for v in at), -200.0, 200.0, 5.0)


SLAB = Outline("slab", ((-12.0, -12.0), (61 * FT, -12.0), (61 * FT, 37 * FT), (-12.0, 37 * FT)), 6.25)


def by_mark(beams):
    return {b.member.mark: b for b in beams}


def test_reference_end_is_towards_plus_x_then_plus_y():
    assert canonical(member("A", (10, 0), (0, 0))).start == (0.0, 0.0)
    assert canonical(member("B", (0, 36), (0, 0))).start == (0.0, 0.0)
    assert canonical(member("C", (0, 0), (0, 36))).start == (0.0, 0.0)


def test_infill_beam_cut_short_spans_girder_axis_to_girder_axis():
    """Girders on y = 0 and y = 36 ft; the beam is cut 0.7 in clear of each web: its span is the
    distance between the girder axes, 36 ft = 432 in; it frames into each girder 10 ft from the
    girder's reference end (x = 10 ft on a girder from x = 0)."""
    beams = by_mark(lay_out([member("G-1", (0, 0), (30, 0), d=23.6, bf=7.01), member("G-3", (0, 36), (30, 36), d=23.6, bf=7.01),
                             member("B-2", (10, 0.7 / FT), (10, 36 - 0.7 / FT))], [], [SLAB]))
    b = beams["B-2"]
    assert b.span == pytest.approx(432.0)
    assert b.supports == ("G-1", "G-3")
    g1, g3 = beams["G-1"].framing, beams["G-3"].framing
    assert [(f.mark, f.at, f.end, f.side) for f in g1] == [("B-2", pytest.approx(120.0), "reference-end", "left")]
    assert [(f.mark, f.at, f.end, f.side) for f in g3] == [("B-2", pytest.approx(120.0), "far-end", "right")]


def test_column_support_work_point_is_the_column_centre_on_the_beam_axis():
    """Beam cut 5 in short of two column centres 30 ft apart: span 360 in, work points at the
    column centres, 5 in from each end of the steel."""
    [b] = lay_out([member("G-1", (5 / FT, 0), (30 - 5 / FT, 0))], [post("C-1", (0, 0)), post("C-2", (30, 0))], [SLAB])
    assert b.span == pytest.approx(360.0)
    assert b.start == pytest.approx((0.0, 0.0)) and b.end == pytest.approx((360.0, 0.0))
    assert b.supports == ("column C-1", "column C-2")


def test_end_on_nothing_keeps_the_modelled_end():
    [b] = lay_out([member("B-9", (0, 0), (20, 0))], [], [SLAB])
    assert b.supports == ("", "") and b.span == pytest.approx(240.0)


def test_sides_are_the_nearest_parallel_beam_or_the_nearer_slab_edge():
    """Beams at x = 0, 10, 22 ft running +y: left is -x. x = 0: slab edge 1 ft to the left, 10 ft
    to the right; x = 10: 10 ft left, 12 ft right; x = 22: 12 ft left, slab edge at 61 ft -> 39 ft."""
    beams = by_mark(lay_out([member(m, (x, 0), (x, 36)) for m, x in (("A", 0), ("B", 10), ("C", 22))], [], [SLAB]))
    assert beams["A"].sides == {"left": ("edge", pytest.approx(12.0)), "right": ("spacing", pytest.approx(120.0))}
    assert beams["B"].sides == {"left": ("spacing", pytest.approx(120.0)), "right": ("spacing", pytest.approx(144.0))}
    assert beams["C"].sides == {"left": ("spacing", pytest.approx(144.0)), "right": ("edge", pytest.approx(39 * FT))}


def test_skewed_neighbour_distance_is_measured_square_to_the_beam():
    """A beam along y = 0 and a parallel one along y = 8 ft both rotated by 30 degrees: the square
    distance between them stays 8 ft = 96 in (rotation keeps distances)."""
    c, s = math.cos(math.radians(30)), math.sin(math.radians(30))

    def rot(x, y):
        return (x * c - y * s, x * s + y * c)

    big = Outline("slab", ((-5000.0, -5000.0), (5000.0, -5000.0), (5000.0, 5000.0), (-5000.0, 5000.0)), 6.0)
    beams = by_mark(lay_out([member("A", rot(0, 0), rot(30, 0)), member("B", rot(0, 8), rot(30, 8))], [], [big]))
    assert beams["A"].sides["left"] == ("spacing", pytest.approx(96.0))
    assert beams["B"].sides["right"] == ("spacing", pytest.approx(96.0))


def test_a_side_with_no_beam_and_no_slab_is_a_problem_not_a_guess():
    [b] = lay_out([member("R-1", (0, 0), (0, 36))], [], [])
    assert b.problems == ["left side: no parallel beam beside it and no slab edge found",
                          "right side: no parallel beam beside it and no slab edge found"]


def test_point_in_polygon():
    square = ((0.0, 0.0), (10.0, 0.0), (10.0, 10.0), (0.0, 10.0))
    assert contains(square, (5.0, 5.0)) and not contains(square, (15.0, 5.0))
