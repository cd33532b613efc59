"""End-to-end: AISC Design Examples v16.0, Example I.2 (composite girder), through evaluate_beam.

Source values (REFERENCE.md section 7, tag V = read in the publication):
W24X76, Fy 50 ksi, span 30 ft, beams framing in at the third points, deck parallel to the girder,
3 in deck + 4 1/2 in normal-weight concrete (145 pcf), f'c 4 ksi, b = 7.50 ft.
Composite loads per point: PD = 40.5 kips, PL = 45.0 kips -> Mu = 1,220 kip-ft, Vu = 122 kips.
Studs: 3/4 in, Qn = 21.5 kips; 26 studs from each end to its load; sum Qn = 560 kips at the load
(50% composite), Mn = 1,420 kip-ft; phi Vn = 315 kips.
Units: kip, in. Tolerance 1% unless noted.
"""

import numpy as np
import pytest

from engine.studs.evaluate import evaluate_studs
from engine.model.inputs import BeamInput
from engine.finished.slab_force import StudGroups, stud_qn

from de16_i2 import FT, girder  # shared input of the example (tests/de16_i2.py)


def example_studs(beam: BeamInput) -> StudGroups:
    """26 studs from each end to its load, 3 between the loads (55 total, as in the example);
    placed here in pairs 9 in apart (our arrangement: within I8.2d 6d along, 4d across)."""
    x = np.concatenate([np.linspace(6, 114, 13), np.array([150.0, 180.0, 210.0]), np.linspace(246, 354, 13)])
    count = np.concatenate([np.full(13, 2), np.ones(3, dtype=int), np.full(13, 2)])
    return StudGroups(x, count, stud_qn(beam, count))


@pytest.fixture(scope="module")
def result():
    beam = girder()
    return evaluate_studs(beam, example_studs(beam))


def test_example_i2_stud_strength(result):
    assert result.qn_per_stud == pytest.approx(21.5, rel=0.01)  # DE16 I.2: Qn = 21.5 kips


def test_example_i2_effective_width(result):
    assert result.b_eff == pytest.approx(7.50 * FT, rel=1e-9)  # DE16 I.2: b = 7.50 ft
    assert result.ac == pytest.approx(540.0, rel=0.01)  # DE16 I.2: Ac = 540 in^2


def test_example_i2_demand(result):
    assert result.mu.max() / FT == pytest.approx(1220.0, rel=0.01)  # DE16 I.2: Mu = 1,220 kip-ft
    assert result.vu == pytest.approx(122.0, rel=0.01)  # DE16 I.2: Vu = 122 kips


def test_example_i2_strength_at_the_load(result):
    i = int(np.argmin(np.abs(result.x - 10 * FT)))
    assert result.slab_force[i] == pytest.approx(560.0, rel=0.01)  # DE16 I.2: sum Qn = 560 kips
    assert result.mn[i] / FT == pytest.approx(1420.0, rel=0.01)  # DE16 I.2: Mn = 1,420 kip-ft
    assert result.phi_vn == pytest.approx(315.0, rel=0.01)  # DE16 I.2: phi Vn = 315 kips
    assert result.verdict == "pass"  # DE16 I.2: phi Mn = 1,280 > Mu = 1,220 kip-ft


def test_example_i2_live_deflection_matches_closed_form(result):
    """Two equal loads at the third points: delta = 23 P L^3 / (648 E I) (AISC Manual Table 3-23,
    case 9), recomputed by hand with the engine's own I_LB."""
    P, L = 45.0, 30 * FT
    expected = 23 * P * L**3 / (648 * 29000.0 * result.i_lb)
    assert result.live_deflection == pytest.approx(expected, rel=0.002)
    # DE16 I.2 prints 0.543 in with I_LB = 4,730 in^4 at sum Qn = 581 kips; ours uses 560 kips
    assert result.live_deflection == pytest.approx(0.543, rel=0.03)
