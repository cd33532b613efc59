"""Camber for the bay, hand-worked on the third-point bay of test_girder_loads (constant thickness,
so camber changes no load): the beams' share rule cambers each beam for its own deflection plus
the girder's under its midspan, rounded down to 1/4 in, none under 3/4 in (common practice,
"Specifying Camber", Modern Steel Construction, July 2006); the floor at mid-bay is then the
deflection less the camber there (geometry)."""

from __future__ import annotations

import math
from dataclasses import replace

import pytest

from engine.model.inputs import CamberRules
from engine.model.shapes import get_shape
from engine.pipeline import evaluate_level
from tests.engine.bay.test_girder_loads import L, WET_PSF, third_point_bay

E = 29_000.0


def cambering_allowed(level, girder: str = "W21X44"):
    """The bay with the camber rules of practice on every member, the girder a W21X44 (I = 843 in^4,
    AISC Shapes Database v16.0, 44 plf) so the girders' share lifts the beams over the minimum."""
    beams = tuple(replace(b, construction=replace(b.construction, camber=CamberRules()),
                          shape=get_shape(girder) if b.mark == "G-1" else b.shape) for b in level.beams)
    return replace(level, beams=beams)


def test_beams_cambered_for_the_girders_share_by_hand():
    result = evaluate_level(cambering_allowed(third_point_bay()))
    bay = result.bays[0]
    w = (WET_PSF + 2.0) * 10.0 / 12_000.0 + 35.0 / 12_000.0  # kip/in on each beam
    own = 5.0 * w * L**4 / (384.0 * E * 510.0)  # AISC Manual Table 3-23 case 1: 0.70 in
    x = L / 3.0
    drop = (5.0 * (w * L / 2) * L**3 / (162.0 * E * 843.0)  # case 9 at a load; case 1 for its own 44 plf
            + (44.0 / 12_000.0) * x * (L**3 - 2 * L * x**2 + x**3) / (24 * E * 843.0))
    total = own + drop / 2.0
    first = bay.alternatives[0]
    assert first.deflection == pytest.approx(total, rel=2e-3)
    assert dict(first.cambers)["B-1"] == 0.0  # 0.8 x 0.70 = 0.56 in: under the 3/4 in minimum
    share = next(a for a in bay.alternatives if a.label == "beams cambered for the girders' share")
    expected = math.floor(0.8 * total / 0.25 + 1e-9) * 0.25
    assert expected >= 0.75 and dict(share.cambers)["B-1"] == expected
    assert share.net == pytest.approx(total - expected, rel=5e-3)  # the camber is 1 at midspan: 4x(L-x)/L^2
    assert share.deflection == pytest.approx(first.deflection, rel=1e-9)  # constant thickness: loads unchanged
    assert bay.remark and "together sag" in bay.remark
