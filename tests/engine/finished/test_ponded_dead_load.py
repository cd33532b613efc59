"""Level screed: the concrete that ponds into the sag of the bare steel is part of the
pre-composite dead load of the finished beam (engine.pipeline.as_poured). Check values are
recomputed here by hand from the ponded line load: simple-span statics (AISC Manual Table 3-23,
superposition) and the ASCE/SEI 7-22 2.3.1 factor 1.2 on dead load."""

from __future__ import annotations

from dataclasses import replace

import numpy as np
import pytest

from engine.model.deck import DeckProfile, Slab
from engine.model.inputs import BeamInput, ConstructionSpec, StudSpec
from engine.model.shapes import get_shape
from engine.pipeline import as_poured, evaluate_beam


def level_beam() -> BeamInput:
    """An invented 40 ft W21X44 at 10 ft, 3 in deck + 3 1/4 in topping, screeded level."""
    deck = DeckProfile("D3", 3.0, 7.0, 5.0, 12.0, 2.4)
    slab = Slab("S", deck, 3.25, 145.0, 4.0, False)
    return BeamInput(mark="L-1", shape=get_shape("W21X44"), span=480.0, fy=50.0, slab=slab,
                     orientation="perpendicular", slab_left=60.0, slab_right=60.0, superimposed_dead_psf=20.0,
                     live_psf=80.0, studs=StudSpec(0.75, 65.0, 5.25, "weak", 30),
                     construction=ConstructionSpec(screed="level"))


def hand_midspan_moment(x: np.ndarray, q: np.ndarray, span: float) -> float:
    """M at midspan of a simple span under line load q(x) >= 0: R_left L/2 - integral to midspan
    of q (L/2 - xi) d xi (statics), trapezoid rule."""
    q = np.maximum(q, 0.0)
    seg = 0.5 * (q[:-1] + q[1:]) * np.diff(x)
    centres = 0.5 * (x[:-1] + x[1:])
    r_left = float(np.sum(seg * (span - centres)) / span)
    left = centres < span / 2
    return r_left * span / 2 - float(np.sum(seg[left] * (span / 2 - centres[left])))


def test_finished_demand_carries_the_ponded_concrete():
    beam = level_beam()
    poured, construction = as_poured(beam)
    assert poured.ponded is not None and construction.ponded_weight > 0.0
    x, q = np.asarray(poured.ponded.x), np.asarray(poured.ponded.q)
    with_ponding = evaluate_beam(poured)
    without = evaluate_beam(replace(poured, ponded=None))
    mid = int(np.argmin(np.abs(with_ponding.x - beam.span / 2)))
    hand = 1.2 * hand_midspan_moment(x, q, beam.span)  # 1.2 D + 1.6 L governs here
    assert with_ponding.mu[mid] - without.mu[mid] == pytest.approx(hand, rel=0.005)
    assert with_ponding.mu[mid] > without.mu[mid]


def test_constant_thickness_beams_are_unchanged():
    beam = replace(level_beam(), construction=ConstructionSpec())
    poured, _ = as_poured(beam)
    assert poured is beam and poured.ponded is None
