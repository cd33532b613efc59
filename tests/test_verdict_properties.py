"""Verdicts are only as strong as their rules (property tests over generated beams):
a beam whose every specification, building-code and project check passes never gets fail, and a
beam short of strength (composite flexure or web shear, AISC 360-22 I3.2a, G2.1) never gets pass.
The beams are invented; nothing here is a published value."""

from __future__ import annotations

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from engine.construction.evaluate import evaluate_construction
from engine.model.deck import DeckProfile, Slab
from engine.model.inputs import BeamInput, ConstructionSpec, StudSpec
from engine.model.results import BINDING, Level
from engine.model.shapes import find_shapes
from engine.pipeline import evaluate_beam

SHAPES = [s for s in find_shapes("W1*") + find_shapes("W2*") if s.d < 28.0]
DECK = DeckProfile("3in", 3.0, 7.0, 5.0, 12.0, 2.4)

beams = st.builds(
    lambda shape, span_ft, spacing_ft, live, count, screed: BeamInput(
        mark="G-1", shape=shape, span=span_ft * 12.0, fy=50.0, slab=Slab("s", DECK, 3.25, 145.0, 4.0, False),
        orientation="perpendicular", slab_left=spacing_ft * 6.0, slab_right=spacing_ft * 6.0,
        superimposed_dead_psf=20.0, live_psf=live, studs=StudSpec(0.75, 65.0, 5.25, "weak", count),
        construction=ConstructionSpec(screed=screed)),
    st.sampled_from(SHAPES), st.integers(16, 48), st.sampled_from([6, 8, 10]), st.sampled_from([50.0, 80.0, 125.0]),
    st.one_of(st.none(), st.integers(0, 60)), st.sampled_from(["constant-thickness", "level"]),
)


def binding_passed(checks) -> bool:
    return all(c.passed for c in checks if c.authority in BINDING and not c.advisory)


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(beams)
def test_verdict_follows_the_authority_of_the_rules(beam):
    r = evaluate_beam(beam)
    if binding_passed(r.checks):
        assert r.verdict != Level.FAIL
    else:
        assert r.verdict == Level.FAIL
    if not (r.check("flexure.composite").passed and r.check("shear.web").passed):
        assert r.verdict != Level.PASS
    c = evaluate_construction(beam)
    assert (c.verdict == Level.FAIL) == (not binding_passed(c.checks))
