"""Properties of the stud layout over random decks, spans, keep-outs, loads and stud counts.

Whatever the input, no placed stud breaks a limit (AISC 360-22 I8.1, I8.2d, I3.2c.3; keep-out
zones), and either the requirement is met with the real Q_n of each rib (checked here by
recomputing the capacity envelope with `evaluate_beam`) or a shortfall is reported.
"""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from engine.model.deck import DeckProfile, Slab
from engine.studs.detailing import off_web_allowed, spacing_limits, studs_per_slot
from engine.studs.evaluate import evaluate_studs
from engine.studs.design import design_layout
from engine.studs.layout import layout_qn
from engine.model.inputs import BeamInput, PointLoad, RibSettings, StudSpec
from engine.studs.ribs import in_keep_out
from engine.finished.slab_force import slab_force
from engine.model.shapes import get_shape

SHAPES = ("W12X14", "W14X22", "W16X26", "W18X35", "W21X44", "W24X55", "W27X84", "W10X12")


@st.composite
def beams(draw) -> BeamInput:
    kind = draw(st.sampled_from(["perpendicular", "parallel", "none"]))
    d = draw(st.sampled_from([0.5, 0.625, 0.75]))
    deck = None
    if kind != "none":
        rib_height = draw(st.sampled_from([1.5, 2.0, 3.0]))
        pitch = draw(st.floats(4.0, 15.0))
        offset = draw(st.sampled_from([0.0, 0.75, 1.25]))
        bottom = draw(st.floats(2.0 * offset + d + 0.5, pitch * 0.6)) if 2.0 * offset + d + 0.5 < pitch * 0.6 else None
        if bottom is None:
            offset, bottom = 0.0, max(d + 0.5, 0.6 * pitch)
        top = draw(st.floats(bottom, min(pitch, bottom + 3.0)))
        deck = DeckProfile("D", rib_height, top, bottom, pitch, 2.0, offset)
    slab = Slab("S", deck, draw(st.floats(2.0, 5.0)), 145.0, draw(st.floats(3.0, 6.0)), False)
    span = draw(st.floats(12.0 * 12, 60.0 * 12))
    keep = draw(st.tuples(st.floats(0.0, 36.0), st.floats(0.0, 36.0)))
    first = draw(st.one_of(st.none(), st.floats(0.25, 20.0)))
    count = draw(st.one_of(st.none(), st.integers(0, 90)))
    studs = StudSpec(d, 65.0, max(4.0 * d, slab.total_thickness - 1.0), draw(st.sampled_from(["strong", "weak", "center"])),
                     count, draw(st.integers(1, 3)))
    points = tuple(PointLoad(draw(st.floats(0.05, 0.95)) * span, p, 0.5 * p, p) for p in
                   draw(st.lists(st.floats(0.0, 40.0), max_size=2)))
    return BeamInput(
        mark="P", shape=get_shape(draw(st.sampled_from(SHAPES))), span=span, fy=50.0, slab=slab,
        orientation="parallel" if kind == "parallel" else "perpendicular",
        slab_left=draw(st.floats(24.0, 90.0)), slab_right=draw(st.floats(24.0, 90.0)),
        superimposed_dead_psf=draw(st.floats(0.0, 50.0)), live_psf=draw(st.floats(0.0, 200.0)), studs=studs,
        method=draw(st.sampled_from(["LRFD", "ASD"])), point_loads=points,
        ribs=RibSettings("west", "east", first, keep[0], keep[1]), n_stations=201,
    )


def _limits_hold(beam: BeamInput, lay) -> None:
    """No placed stud breaks a limit (each line names its rule)."""
    count, cap = lay.count, lay.max_count
    assert np.all(count >= 0) and np.all(count <= cap)  # slot capacity
    assert np.all(cap <= studs_per_slot(beam))  # 4d transverse, flute width, job limit (I8.2d, I3.2c.3)
    assert np.all(count[in_keep_out(beam, lay.x)] == 0)  # keep-out zones
    if not off_web_allowed(beam):
        assert np.all(count <= 1)  # d <= 2.5 tf unless over the web (I8.1)
    occupied = lay.x[count > 0]
    smin, _ = spacing_limits(beam)
    if occupied.size > 1:
        assert np.diff(occupied).min() >= smin - 1e-9  # 4d / 6d minimum spacing (I8.2d)
    assert np.allclose(lay.qn, layout_qn(beam, count, lay.position))  # real per-rib Qn (I8.2a)


@settings(max_examples=150, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(beams())
def test_no_limit_broken_and_requirement_met_or_shortfall_reported(beam):
    result = design_layout(beam)
    lay = result.layout
    _limits_hold(beam, lay)
    groups = lay.groups()
    left, right = (float(v[0]) for v in slab_force(np.array([lay.x_flip]), groups, math.inf)[1:])
    assert math.isclose(left, result.provided_left, abs_tol=1e-6)
    assert math.isclose(right, result.provided_right, abs_tol=1e-6)
    if result.shortfall is not None:
        assert result.shortfall.strip()
        return
    r = evaluate_studs(beam, groups)
    occupied = lay.x[lay.count > 0]
    if occupied.size > 1:
        assert np.diff(occupied).max() <= spacing_limits(beam)[1] + 1e-9  # I8.2d maximum
    if beam.studs.count is None:
        # phi Mn >= Mu at every station with the placed studs, recomputed by evaluate_beam
        assert np.all(r.capacity >= r.demand * (1.0 - 1e-9))
        assert r.composite_ratio >= 0.25 - 1e-9
    else:
        assert lay.total == beam.studs.count
        assert min(left, right) >= result.required_sum_qn * (1.0 - 1e-9)
        assert np.all(r.capacity >= r.demand * (1.0 - 1e-9))


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(beams())
def test_symmetric_loads_and_slots_give_a_symmetric_layout(beam):
    even = None if beam.studs.count is None else 2 * (beam.studs.count // 2)  # an odd count cannot be symmetric
    beam = replace(beam, point_loads=(), ribs=replace(beam.ribs, keep_out_end=beam.ribs.keep_out_start),
                   studs=replace(beam.studs, count=even))
    if beam.deck_case == "perpendicular":  # ribs symmetric about midspan
        pitch = beam.slab.deck.pitch
        beam = replace(beam, span=pitch * round(beam.span / pitch), ribs=replace(beam.ribs, first_rib=0.5 * pitch))
    lay = design_layout(beam).layout
    assert np.allclose(lay.x + lay.x[::-1], beam.span)
    assert np.array_equal(lay.count, lay.count[::-1])
