"""Whole-table sweeps: every W shape x deck profiles (1.5, 2, 3 in; perpendicular and parallel;
solid slab) x spans 10-60 ft x slab force from zero to full composite.

Properties (no published values; these are consequences of AISC 360-22 I3.2a plastic stress
distribution and of beam theory): results finite; Mn nondecreasing in the slab force (stud count)
and in slab thickness; deflection increasing with span; out-of-scope inputs refused with the clause.
"""

import numpy as np
import pytest

from engine.codes.aisc360_22.i8_anchors import qn_stud, rg_rp, stud_area
from engine.codes.aisc360_22.i3_composite import effective_width, plastic_moment
from engine.codes.aisc360_22.i1_materials import ec
from engine.model.deck import DeckProfile, Slab
from engine.model.scope import OutOfScopeError, check_scope
from engine.pipeline import evaluate_beam
from engine.model.inputs import BeamInput, StudSpec
from engine.model.shapes import find_shapes
from engine.mechanics.statics import UniformLoad, deflection, stations

SHAPES = find_shapes("*")
DECKS = {  # rib height, top, bottom, pitch (common profiles; geometry from memory of deck catalogues)
    "1.5in": DeckProfile("1.5in", 1.5, 2.5, 1.75, 6.0, 1.8),
    "2in": DeckProfile("2in", 2.0, 7.0, 5.0, 12.0, 2.0),
    "3in": DeckProfile("3in", 3.0, 7.0, 5.0, 12.0, 2.4),
}
CASES = [(None, "perpendicular")] + [(d, o) for d in DECKS for o in ("perpendicular", "parallel")]
SPANS_FT = np.arange(10, 61, 5)


def slab_for(deck_key, topping=3.25):
    deck = None if deck_key is None else DECKS[deck_key]
    return Slab("s", deck, topping if deck else topping + 2.0, 145.0, 4.0, lightweight=False)


@pytest.mark.parametrize("deck_key, orientation", CASES)
def test_strength_finite_and_monotone_in_slab_force_for_every_shape(deck_key, orientation):
    slab = slab_for(deck_key)
    for shape in SHAPES:
        for span_ft in SPANS_FT:
            b = sum(effective_width(span_ft * 12.0, 60.0, 60.0))
            ac = slab.strength_concrete_area(b, orientation)
            cf = min(shape.area * 50.0, 0.85 * 4.0 * ac, 0.85 * 4.0 * b * slab.topping)
            c = np.linspace(0.0, cf, 25)
            pm = plastic_moment(c, shape, 50.0, 4.0, b, slab.total_thickness)
            assert np.all(np.isfinite(pm.mn)) and np.all(pm.mn > 0), shape.name
            assert np.all(np.diff(pm.mn) >= -1e-6 * pm.mn[-1]), (shape.name, span_ft)


def test_strength_nondecreasing_in_slab_thickness_for_every_shape():
    for shape in SHAPES:
        previous = None
        for topping in (2.0, 2.5, 3.0, 3.5, 4.5, 6.0):
            slab = slab_for("3in", topping)
            b = 90.0
            cf = min(shape.area * 50.0, 0.85 * 4.0 * slab.strength_concrete_area(b, "perpendicular"))
            mn = float(plastic_moment(np.array([cf]), shape, 50.0, 4.0, b, slab.total_thickness).mn[0])
            assert np.isfinite(mn)
            if previous is not None:
                assert mn >= previous - 1e-9, (shape.name, topping)
            previous = mn


def test_stud_strength_finite_for_every_deck_case():
    asa = stud_area(0.75)
    for deck_key, orientation in CASES:
        n = np.arange(0, 4)
        if deck_key is None:
            rg, rp = rg_rp("none", n)
        elif orientation == "parallel":
            d = DECKS[deck_key]
            rg, rp = rg_rp("parallel", n, wr_over_hr=d.rib_average_width / d.rib_height)
        else:
            rg, rp = rg_rp("perpendicular", n, emid_ht=np.full(4, 2.5))
        q = qn_stud(asa, 4.0, ec(145.0, 4.0), 65.0, rg, rp)
        assert np.all(np.isfinite(q)) and np.all(q > 0)


def test_deflection_increases_with_span_for_every_shape():
    for shape in SHAPES:
        d = [float(deflection(stations(L * 12.0, 201), L * 12.0, (UniformLoad(0.1),), 29000.0 * shape.ix).max())
             for L in SPANS_FT]
        assert np.all(np.isfinite(d)) and np.all(np.diff(d) > 0), shape.name


def beam(shape, deck_key, orientation, span_ft, studs) -> BeamInput:
    return BeamInput(
        mark=f"{shape.name}-{span_ft}", shape=shape, span=span_ft * 12.0, fy=50.0, slab=slab_for(deck_key),
        orientation=orientation, slab_left=60.0, slab_right=60.0, superimposed_dead_psf=20.0, live_psf=80.0,
        studs=StudSpec(0.75, 65.0, 5.25 if deck_key != "3in" else 5.0, "weak", studs),
    )


def test_end_to_end_every_shape_no_nan():
    rng = np.random.default_rng(20261201)
    for shape in SHAPES:
        deck_key, orientation = CASES[rng.integers(len(CASES))]
        span_ft = int(rng.choice(SPANS_FT))
        r = evaluate_beam(beam(shape, deck_key, orientation, span_ft, int(rng.integers(0, 40))))
        for arr in (r.mu, r.ma, r.mn, r.slab_force):
            assert np.all(np.isfinite(arr)), shape.name
        for c in r.checks:
            assert np.isfinite(c.demand) and np.isfinite(c.capacity), (shape.name, c)
        assert r.verdict in ("pass", "review", "fail")


def test_more_studs_never_lower_strength_end_to_end():
    shape = next(s for s in SHAPES if s.name == "W21X50")
    previous = None
    for n in range(0, 61, 4):
        r = evaluate_beam(beam(shape, "3in", "perpendicular", 35, n))
        if previous is not None:
            assert np.all(r.mn >= previous - 1e-6), n
        previous = r.mn


@pytest.mark.parametrize("change, clause", [
    ({"rib_height": 3.5}, "I3.2c.1"),
    ({"fc": 2.5}, "I1.3"),
    ({"fc": 11.0}, "I1.3"),
])
def test_out_of_scope_inputs_refused_with_clause(change, clause):
    shape = SHAPES[100]
    deck = DeckProfile("x", change.get("rib_height", 3.0), 7.0, 5.0, 12.0, 2.4)
    slab = Slab("s", deck, 3.5, 145.0, change.get("fc", 4.0), lightweight=False)
    b = BeamInput(mark="X", shape=shape, span=360.0, fy=50.0, slab=slab, orientation="perpendicular",
                  slab_left=60.0, slab_right=60.0, superimposed_dead_psf=0.0, live_psf=50.0,
                  studs=StudSpec(0.75, 65.0, 5.0, "weak", 20))
    with pytest.raises(OutOfScopeError, match=clause):
        check_scope(b)
    with pytest.raises(OutOfScopeError):
        evaluate_beam(b)
