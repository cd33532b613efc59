"""Construction stage: loads while wet, pour stages, stiffness of earlier concrete, bare-steel
strength with the stated bracing, load combinations.

Check values are hand recomputations written out below: AISC Manual Table 3-23 case 1
(5wL^4/384EI, M = wL^2/8), AISC 360-22 Eq. F1-1 (Cb), ACI 209R-92 Eq. 2-1 (strength with age),
AISC 360-22 I2.1b (E_c), the transformed section by the parallel-axis theorem.
Units: kip, in, ksi. W21X50 from the AISC Shapes Database v16.0 (via engine.model.shapes):
Ix = 984 in^4, Zx = 110 in^3, Sx = 94.5 in^3, d = 20.8 in, weight 50 plf.
"""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest

from engine.codes.aisc360_22.f_flexure import flexure_strength
from engine.construction.bare_steel import bracing
from engine.construction.evaluate import evaluate_construction
from engine.model.deck import DeckProfile, Slab
from engine.model.inputs import BeamInput, CamberRules, ConstructionSpec, PointLoad, PourStage, StudSpec
from engine.construction.pours import check_stages, pour_plan
from engine.model.shapes import get_shape

E = 29_000.0
FT = 12.0
W21X50 = get_shape("W21X50")
DECK = DeckProfile("3in", 3.0, 7.0, 5.0, 12.0, 2.0)  # 6 in average rib at 12 in: half the rib zone is concrete
SLAB = Slab("NW", DECK, 3.25, 145.0, 4.0, lightweight=False)
NO_CAMBER = CamberRules(do_not_camber="test")


def beam(span: float = 40 * FT, shape=W21X50, slab: Slab = SLAB, orientation: str = "perpendicular",
         spacing: float = 10 * FT, **construction) -> BeamInput:
    spec = ConstructionSpec(**{"camber": NO_CAMBER, **construction})
    return BeamInput(mark="T-1", shape=shape, span=span, fy=50.0, slab=slab, orientation=orientation,
                     slab_left=spacing / 2, slab_right=spacing / 2, superimposed_dead_psf=0.0, live_psf=0.0,
                     studs=StudSpec(0.75, 65.0, 5.25, "weak", 30), construction=spec)


def test_shape_values_used_here():
    assert (W21X50.ix, W21X50.zx, W21X50.sx, W21X50.d, W21X50.weight_plf) == (984, 110, 94.5, 20.8, 50)


# hand: wet concrete 145 pcf x (3.25 + 3 x 6/12) in / 12 = 57.396 psf; + deck 2.0 psf; x 10 ft = 593.96 plf;
# + beam 50 plf = 643.96 plf (self-weight, deck, wet concrete from geometry)
W_DEAD = (145.0 * (3.25 + 3.0 * 6.0 / 12.0) / 12.0 + 2.0) * 10.0 / 12_000.0 + 50.0 / 12_000.0  # kip/in
W_LIVE = 25.0 * 10.0 / 12_000.0  # ASCE/SEI 37 light class, 25 psf over 10 ft


def test_single_whole_slab_stage_is_5wl4_over_384ei():
    # AISC Manual Table 3-23 case 1: midspan deflection 5 w L^4 / (384 E I), moment w L^2 / 8
    r = evaluate_construction(beam())
    L = 40 * FT
    assert r.at_midspan(r.wet_deflection) == pytest.approx(5 * W_DEAD * L**4 / (384 * E * 984), rel=1e-5)
    assert r.at_midspan(r.live_deflection) == pytest.approx(5 * W_LIVE * L**4 / (384 * E * 984), rel=1e-5)
    assert r.at_midspan(r.total_deflection) == pytest.approx(5 * (W_DEAD + W_LIVE) * L**4 / (384 * E * 984), rel=1e-5)
    # LRFD: max(1.4 D, 1.2 D + 1.6 L) (ASCE/SEI 7-22 2.3.1 as in DE16 Ex. I.1)
    assert r.mu == pytest.approx(max(1.4 * W_DEAD, 1.2 * W_DEAD + 1.6 * W_LIVE) * L**2 / 8, rel=1e-9)
    assert r.ma == pytest.approx((W_DEAD + W_LIVE) * L**2 / 8, rel=1e-9)
    assert r.vu == pytest.approx(max(1.4 * W_DEAD, 1.2 * W_DEAD + 1.6 * W_LIVE) * L / 2, rel=1e-9)
    # locked-in bottom-flange stress M / Sx of the service dead load
    assert r.stages[-1].stress == pytest.approx(W_DEAD * L**2 / 8 / 94.5, rel=1e-6)


def test_wet_concrete_per_area_is_the_same_for_either_deck_orientation():
    # rib concrete averaged over a pitch: hr x w_avg / pitch, whichever way the ribs run
    a = evaluate_construction(beam(orientation="perpendicular"))
    b = evaluate_construction(beam(orientation="parallel", unbraced_length=0.0))
    assert np.allclose(a.wet_deflection, b.wet_deflection, rtol=1e-12)


def test_same_day_pieces_equal_the_single_stage():
    # superposition on one section: a slab placed at once, in pieces, with no curing between them
    pieces = (PourStage("A", 0.0, 160.0), PourStage("B left", 160.0, 480.0, "left"),
              PourStage("B right", 160.0, 480.0, "right"))
    one, split = evaluate_construction(beam()), evaluate_construction(beam(pours=pieces))
    assert np.allclose(split.wet_deflection, one.wet_deflection, rtol=1e-10, atol=1e-12)
    assert np.allclose(split.cured.total, one.wet_deflection, rtol=1e-10, atol=1e-12)
    assert sum(st.deflection for st in split.stages) == pytest.approx(split.at_midspan(split.wet_deflection))


def test_bare_steel_result_does_not_depend_on_the_schedule():
    # I3.1b: everything on the bare steel; linear, so the order and days do not matter
    a = evaluate_construction(beam(pours=(PourStage("L", 0, 480, "left", 0.0), PourStage("R", 0, 480, "right", 9.0))))
    b = evaluate_construction(beam(pours=(PourStage("R", 0, 480, "right", 0.0), PourStage("L", 0, 480, "left", 2.0))))
    assert np.allclose(a.wet_deflection, b.wet_deflection, rtol=1e-12)


def transformed_inertia_by_hand(b_over_n: float) -> float:
    """Steel W21X50 (A = 14.7 in^2) plus a concrete strip b/n wide and 3.25 in thick whose top is
    6.25 in above the steel (parallel-axis theorem; the neutral axis falls in the steel here)."""
    a_s, d, i_s = 14.7, 20.8, 984.0
    a_c, y_c = b_over_n * 3.25, d + 6.25 - 3.25 / 2
    y = (a_s * d / 2 + a_c * y_c) / (a_s + a_c)
    assert y < d + 3.0  # neutral axis below the concrete strip: all of it in compression
    return i_s + a_s * (y - d / 2) ** 2 + b_over_n * 3.25**3 / 12 + a_c * (y_c - y) ** 2


def test_stage_placed_after_cure_deflects_less_than_placed_first():
    first = evaluate_construction(beam(pours=(PourStage("R", 0, 480, "right", 0.0), PourStage("L", 0, 480, "left", 7.0))))
    later = evaluate_construction(beam(pours=(PourStage("L", 0, 480, "left", 0.0), PourStage("R", 0, 480, "right", 7.0))))
    r_first = first.stages[1].deflection  # R on the bare steel
    r_later = later.stages[2].deflection_cured  # R on steel + 7-day concrete of L
    assert r_later < r_first
    # hand: f'c(7) = 4 x 7 / (4 + 0.85 x 7) = 2.8141 ksi (ACI 209R-92 Eq. 2-1);
    # E_c = 145^1.5 sqrt(2.8141) = 2929 ksi (AISC 360-22 I2.1b); b = min(L/8, 60) = 60 in (I3.1a)
    n = E / (145.0**1.5 * math.sqrt(4 * 7 / (4 + 0.85 * 7)))
    i_tr = transformed_inertia_by_hand(60.0 / n)
    # EI uniform along the span (L covers the whole length): deflection scales by Ix / I_tr
    assert r_later == pytest.approx(r_first * 984 / i_tr, rel=1e-6)
    assert later.stages[2].deflection == pytest.approx(r_first, rel=1e-9)  # bare-steel bound unchanged


def test_concrete_younger_than_a_day_adds_no_stiffness():
    r = evaluate_construction(beam(pours=(PourStage("L", 0, 480, "left", 0.0), PourStage("R", 0, 480, "right", 0.5))))
    assert r.stages[2].deflection_cured == pytest.approx(r.stages[2].deflection, rel=1e-12)


def test_earlier_strength_ratio_and_i3_1b_note():
    # ACI 209R-92: f'c(t)/f'c = t / (4 + 0.85 t): 10 days -> 0.8 >= 0.75 (I3.1b), 3 days -> 0.458
    r = evaluate_construction(beam(pours=(PourStage("A", 0, 240), PourStage("B", 240, 480, day=10.0))))
    assert r.stages[2].earlier_fc_ratio == pytest.approx(10 / (4 + 8.5), rel=1e-12)
    assert any("composite strength could be counted" in f.message for f in r.flags)
    r = evaluate_construction(beam(pours=(PourStage("A", 0, 240), PourStage("B", 240, 480, day=3.0))))
    assert r.stages[2].earlier_fc_ratio == pytest.approx(3 / (4 + 2.55), rel=1e-12)
    assert not any("composite strength could be counted" in f.message for f in r.flags)


def test_pour_stage_half_span_matches_table_3_23_partial_load():
    # a load over half the span deflects midspan by half the full-span value (superposition of the two
    # mirror-image halves, AISC Manual Table 3-23 case 1)
    r = evaluate_construction(beam(pours=(PourStage("A", 0, 240), PourStage("B", 240, 480))))
    concrete = 145.0 * 4.75 / 12.0 * 10.0 / 12_000.0  # wet concrete only (deck and steel are on at erection)
    full = 5 * concrete * 480.0**4 / (384 * E * 984)
    assert r.stages[1].deflection == pytest.approx(full / 2, rel=1e-5)


@pytest.mark.parametrize("stages, message", [
    ((PourStage("A", 0, 200),), "without concrete"),
    ((PourStage("A", 0, 300), PourStage("B", 200, 480)), "already did"),
    ((PourStage("A", 0, 480, "left"),), "right side"),
    ((PourStage("A", 0, 480, "middle"),), "side"),
])
def test_pour_plans_that_miss_or_repeat_concrete_are_refused(stages, message):
    with pytest.raises(ValueError, match=message):
        check_stages(stages, 480.0)


def test_point_loads_go_with_the_first_stage_that_covers_them():
    b = replace(beam(pours=(PourStage("A", 0, 240, day=0.0), PourStage("B", 240, 480, day=1.0))),
                point_loads=(PointLoad(100.0, 5.0, 0.0, 4.0, 1.0), PointLoad(240.0, 5.0, 0.0, 3.0, 0.0)))
    plan = pour_plan(b)
    loads_a = [ld for ld in plan.steps[1].dead if hasattr(ld, "p")]
    assert [(ld.p, ld.x) for ld in loads_a] == [(4.0, 100.0), (3.0, 240.0)]
    assert [ld.p for ld in plan.steps[1].live if hasattr(ld, "p")] == [1.0]
    assert not [ld for ld in plan.steps[2].dead if hasattr(ld, "p")]


# ---------------------------------------------------------------- bracing, Lb and Cb (F1, F2)

def test_fastened_perpendicular_deck_braces_continuously():
    r = evaluate_construction(beam())
    assert bracing(r.beam).points is None
    assert r.flexure.strength.lb == 0.0
    assert r.flexure.available("LRFD") == pytest.approx(0.9 * 50 * 110)  # phi Mp, AISC 360-22 Eq. F2-1


def test_no_bracing_uses_cb_of_a_uniform_load():
    # one segment over the span, uniform load: Cb = 12.5 / (2.5 + 3 x 0.75 + 4 + 3 x 0.75) = 1.136 (Eq. F1-1)
    r = evaluate_construction(beam(unbraced_length=40 * FT))
    s = r.flexure.strength
    assert (s.lb, s.cb) == (pytest.approx(480.0), pytest.approx(12.5 / 11.0, rel=1e-4))
    assert r.flexure.available("LRFD") == pytest.approx(flexure_strength(W21X50, 50.0, 480.0, 12.5 / 11.0).phi_mn,
                                                         rel=1e-4)


def test_midspan_brace_gives_cb_1_30():
    # segment [0, L/2] of a parabola: Mmax 0.25, MA 7/64, MB 3/16, MC 15/64 (x L^2 w/2):
    # Cb = 12.5 x 0.25 / (2.5 x 0.25 + 3 x 7/64 + 4 x 3/16 + 3 x 15/64) = 1.2987 (Eq. F1-1)
    r = evaluate_construction(beam(unbraced_length=20 * FT))
    assert r.flexure.strength.lb == pytest.approx(240.0)
    assert r.flexure.strength.cb == pytest.approx(3.125 / 2.40625, rel=1e-3)


def test_stated_unbraced_length_places_braces_from_the_reference_end():
    assert bracing(beam(span=32 * FT, unbraced_length=10 * FT)).points.tolist() == [120.0, 240.0, 360.0]


def test_parallel_deck_girder_is_braced_at_its_point_loads():
    g = replace(beam(orientation="parallel", spacing=0.0),
                point_loads=(PointLoad(160.0, 20.0, 0.0, 20.0, 2.0), PointLoad(320.0, 20.0, 0.0, 20.0, 2.0)))
    r = evaluate_construction(g)
    assert bracing(g).points.tolist() == [160.0, 320.0]
    assert r.flexure.strength.lb == pytest.approx(160.0)
    assert r.flexure.strength.cb == pytest.approx(1.0, abs=0.01)  # near-constant moment between the loads


def test_solid_slab_without_stated_bracing_is_braced_only_at_supports():
    solid = Slab("solid", None, 6.0, 145.0, 4.0, lightweight=False)
    r = evaluate_construction(beam(slab=solid))
    assert r.flexure.strength.lb == pytest.approx(480.0)  # forms brace nothing (AISC 360-22 Commentary I3.1b)


# ---------------------------------------------------------------- combinations, load classes

def test_job_combinations_replace_the_defaults():
    L = 40 * FT
    r = evaluate_construction(beam(combinations=((1.3, 1.5),)))
    assert r.flexure.demand == pytest.approx((1.3 * W_DEAD + 1.5 * W_LIVE) * L**2 / 8, rel=1e-6)
    asd = evaluate_construction(replace(beam(), method="ASD"))
    assert asd.flexure.demand == pytest.approx((W_DEAD + W_LIVE) * L**2 / 8, rel=1e-6)
    assert asd.flexure.available("ASD") == pytest.approx(50 * 110 / 1.67)  # Mp / Omega_b (F1)


def test_construction_live_load_acts_only_over_the_stage_being_placed():
    # stage B (right half) alone carries live load while it is placed: Table 3-23 case 3 moment at
    # midspan for w over the right half = w L^2 / 16
    r = evaluate_construction(beam(pours=(PourStage("A", 0, 240), PourStage("B", 240, 480, day=1.0))))
    assert r.run.live_moment[2, r.plan.midspan] == pytest.approx(W_LIVE * 480.0**2 / 16, rel=1e-9)


def test_unstable_level_screed_is_a_failed_check_not_an_exception():
    # W8X10 (Ix = 30.8 in^4) over 40 ft at 15 ft spacing: Cc = k L^4/(pi^4 EI) >> 1 (closed form after Ruddy, AISC EJ 1986)
    r = evaluate_construction(beam(shape=get_shape("W8X10"), spacing=15 * FT, screed="level", unbraced_length=0.0))
    stability = next(c for c in r.checks if c.id == "construction.ponding_stability")
    assert not r.ponding_stable and not stability.passed and r.verdict == "fail"
    assert any("unstable" in f.message for f in r.flags)
