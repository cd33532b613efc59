"""Point loads are stations: the finished demand is evaluated at every load point exactly, where
a concentrated load makes the moment peak. Check values by hand: simple-span statics (AISC Manual
Table 3-23: w x (L - x) / 2 for a uniform load, P a b / L under a point load) with the
ASCE/SEI 7-22 2.3.1 combinations 1.4 D and 1.2 D + 1.6 L."""

from __future__ import annotations

import numpy as np
import pytest

from engine.model.deck import DeckProfile, Slab
from engine.model.inputs import BeamInput, PointLoad, StudSpec
from engine.model.shapes import get_shape
from engine.pipeline import evaluate_beam

SPAN = 480.0
AT = 173.37  # in: between the 1.2 in stations of a 401-station grid


def beam() -> BeamInput:
    deck = DeckProfile("D3", 3.0, 7.0, 5.0, 12.0, 2.4)
    slab = Slab("S", deck, 3.25, 145.0, 4.0, False)
    return BeamInput(mark="P-1", shape=get_shape("W24X55"), span=SPAN, fy=50.0, slab=slab,
                     orientation="perpendicular", slab_left=60.0, slab_right=60.0, superimposed_dead_psf=15.0,
                     live_psf=50.0, studs=StudSpec(0.75, 65.0, 5.25, "weak", 40),
                     point_loads=(PointLoad(AT, dead=12.0, live=9.0, precomposite_dead=6.0),))


def test_demand_is_evaluated_under_the_point_load():
    b = beam()
    r = evaluate_beam(b)
    k = int(np.flatnonzero(np.isclose(r.x, AT))[0])  # the load's station is on the grid
    width = 120.0
    w_dead = b.shape.weight_plf / 12000.0 + (b.slab.dead_weight_psf() + 15.0) * width / 144000.0  # kip/in
    w_live = 50.0 * width / 144000.0
    uniform = AT * (SPAN - AT) / 2.0
    point = AT * (SPAN - AT) / SPAN
    dead, live = w_dead * uniform + 12.0 * point, w_live * uniform + 9.0 * point
    assert r.mu[k] == pytest.approx(max(1.4 * dead, 1.2 * dead + 1.6 * live), rel=1e-9)
    assert r.ma[k] == pytest.approx(dead + live, rel=1e-9)
