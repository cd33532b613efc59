"""End-to-end: AISC Design Examples v16.0, Example I.2 (composite girder), construction stage,
through evaluate_construction.

Source values (REFERENCE.md sections 4 and 7, tag V = read in the publication): W24X76, Fy 50 ksi,
span 30 ft, beams framing in at the third points, deck parallel to the girder. Pre-composite
loads per point: PD = 36.0 kips, construction live PL = 11.3 kips. Construction: Mu = 624 kip-ft;
Lb = 10 ft, Cb = 1: phi Mn = 677 kip-ft; pre-composite deflection 1.00 in; camber 0.80 in,
specified 3/4 in. Tolerance 1% unless noted.
"""

import pytest

from engine.construction.evaluate import evaluate_construction

from de16_i2 import FT, girder  # shared input of the example (tests/de16_i2.py)


def test_precomposite_deflection_and_camber():
    r = evaluate_construction(girder())
    assert r.at_midspan(r.wet_deflection) == pytest.approx(1.00, rel=0.01)  # DE16 I.2: 1.00 in
    assert r.camber.target == pytest.approx(0.80, rel=0.01)  # 0.80 x 1.00 in
    assert r.camber.camber == 0.75  # specified 3/4 in
    assert r.camber.tolerance == 0.5  # 30 ft: -0/+1/2 in (AISC 303 6.4.4)


def test_construction_strength_braced_at_the_framing_beams():
    r = evaluate_construction(girder())
    assert r.flexure.demand / 12 == pytest.approx(624.0, rel=0.01)  # Mu = 624 kip-ft
    assert r.flexure.strength.lb == pytest.approx(10 * FT)
    assert r.flexure.strength.cb == pytest.approx(1.0, abs=0.01)  # constant moment between the loads
    assert r.flexure.available("LRFD") / 12 == pytest.approx(677.0, rel=0.01)  # phi Mn = 677 kip-ft
    assert r.verdict == "pass"
