"""Level screeding: concrete ponds into the sag (closed form after Ruddy, AISC
Engineering Journal 1986), solved as a linear problem on the station grid.

Check values: the exact solution of EI y'''' = q0 + k y on a simple span, derived by hand below;
the first-mode amplification 1 / (1 - Cc), Cc = k L^4 / (pi^4 EI) (closed form,
tag D); a dense linear solve of the same discrete operator built here column by column.
Units: kip, in. W18X35: Ix = 510 in^4 (AISC Shapes Database v16.0).
"""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest

from engine.construction.evaluate import evaluate_construction
from engine.model.deck import DeckProfile, Slab
from engine.model.inputs import BeamInput, CamberRules, ConstructionSpec, PourStage, StudSpec
from engine.mechanics.ponding import level_deflection, line_load_effects
from engine.construction.pours import bare_sections, pour_plan
from engine.model.shapes import get_shape
from engine.construction.staging import blend, run_stages
from engine.mechanics.statics import UniformLoad, deflection_from_curvature, stations

E = 29_000.0
L = 480.0
W18X35 = get_shape("W18X35")
SLAB = Slab("NW", DeckProfile("3in", 3.0, 7.0, 5.0, 12.0, 2.0), 3.25, 145.0, 4.0, lightweight=False)
GAMMA = 145.0 / 1_728_000.0  # kip/in^3
K = GAMMA * 120.0  # level placement adds gamma_c x s x sag (closed form after Ruddy, AISC Engineering Journal 1986), s = 10 ft
W_TOTAL = (145.0 * 4.75 / 12.0 + 2.0) * 10.0 / 12_000.0 + 35.0 / 12_000.0  # concrete + deck + steel, kip/in


def beam(shape=W18X35, screed: str = "level", camber: CamberRules | None = None, **kw) -> BeamInput:
    spec = ConstructionSpec(screed=screed, camber=camber or CamberRules(do_not_camber="test"), **kw)
    return BeamInput(mark="P-1", shape=shape, span=L, fy=50.0, slab=SLAB, orientation="perpendicular",
                     slab_left=60.0, slab_right=60.0, superimposed_dead_psf=0.0, live_psf=0.0,
                     studs=StudSpec(0.75, 65.0, 5.25, "weak", 30), construction=spec)


def closed_form(x: np.ndarray, q0: float, k: float, ei: float) -> np.ndarray:
    """EI y'''' = q0 + k y, y = y'' = 0 at both ends (hand): with beta^4 = k/EI, xi = x - L/2,
    u = beta L/2, y = (q0/k) [cosh(beta xi)/(2 cosh u) + cos(beta xi)/(2 cos u) - 1]."""
    beta = (k / ei) ** 0.25
    xi, u = x - L / 2, beta * L / 2
    return q0 / k * (np.cosh(beta * xi) / (2 * np.cosh(u)) + np.cos(beta * xi) / (2 * np.cos(u)) - 1)


def test_level_screed_matches_the_closed_form_and_first_mode_amplification():
    r = evaluate_construction(beam())
    ei = E * 510.0
    exact = closed_form(r.x, W_TOTAL, K, ei)
    # the sag under the steel and deck is filled too, so the whole dead load ponds: y = P(q0)
    assert np.allclose(r.wet_deflection[1:-1], exact[1:-1], rtol=5e-4)
    cc = K * L**4 / (math.pi**4 * ei)  # 0.371
    amplification = r.at_midspan(r.wet_deflection) / r.at_midspan(r.no_ponding)
    assert amplification == pytest.approx(1 / (1 - cc), rel=0.01)  # first mode, closed form after Ruddy, AISC EJ 1986
    assert r.at_midspan(r.no_ponding) == pytest.approx(5 * W_TOTAL * L**4 / (384 * ei), rel=1e-5)


def test_level_screed_tends_to_constant_thickness_as_stiffness_grows():
    excess = []
    for factor in (1.0, 10.0, 100.0, 1000.0):
        r = evaluate_construction(beam(shape=replace(W18X35, ix=510.0 * factor)))
        excess.append(r.at_midspan(r.wet_deflection) / r.at_midspan(r.no_ponding) - 1.0)
        cc = K * L**4 / (math.pi**4 * E * 510.0 * factor)
        assert excess[-1] <= 1.05 * cc / (1 - cc)  # first-mode bound (closed form after Ruddy, AISC Engineering Journal 1986)
    assert excess == sorted(excess, reverse=True) and excess[-1] < 5e-4


def dense_operator(x: np.ndarray, ei: float) -> np.ndarray:
    """Column j: deflection under a unit station load at x_j, linear between stations
    (M exact by statics, then M/EI integrated exactly for linear curvature)."""
    cols = []
    for j in range(x.size):
        q = np.zeros_like(x)
        q[j] = 1.0
        cols.append(deflection_from_curvature(x, line_load_effects(x, q)[1] / ei))
    return np.array(cols).T


def test_known_load_pieces_agree_with_a_dense_solve():
    x = stations(L, 101)
    ei = E * 510.0
    k = np.where(x <= 300.0, K, 0.0)
    known = K * (0.6 * np.sin(np.pi * x / L) - 0.2 * (x / L) ** 2) * (x <= 300.0)
    a = dense_operator(x, ei)
    ponding = np.eye(x.size) - a @ np.diag(k)
    q = np.full_like(x, 0.05)
    # no known load: the same operator as engine.mechanics.statics.ponded_deflection (round-off only)
    y = level_deflection(x, L, [UniformLoad(0.05)], np.zeros_like(x), k, ei)
    assert np.allclose(y, np.linalg.solve(ponding, a @ q), rtol=1e-9, atol=1e-12)
    # a known station load enters as 8 pieces plus an unamplified remainder: 1e-4 of the deflection
    y = level_deflection(x, L, [UniformLoad(0.05)], known, k, ei)
    ref = np.linalg.solve(ponding, a @ (q + known))
    assert np.abs(y - ref).max() <= 2e-4 * np.abs(ref).max()


def test_runs_are_linear_in_the_camber():
    b = beam(pours=(PourStage("A", 0, 200), PourStage("B", 200, 480, day=4.0)))
    plan = pour_plan(b)
    sections = bare_sections(b, plan)
    at_zero, at_one = run_stages(plan, sections, 0.0), run_stages(plan, sections, 1.0)
    direct, mixed = run_stages(plan, sections, 0.37), blend(at_zero, at_one, 0.37)
    assert np.allclose(direct.dead, mixed.dead, rtol=1e-9, atol=1e-12)
    assert np.allclose(direct.ponded, mixed.ponded, rtol=1e-9, atol=1e-12)
    assert at_one.ponded.sum() < at_zero.ponded.sum()  # a cambered beam ponds less concrete


def test_ponded_volume_and_average_psf():
    r = evaluate_construction(beam())
    mean_sag = np.trapezoid(r.wet_deflection, r.x) / L  # single stage: concrete depth = final sag
    assert r.ponded_volume == pytest.approx(120.0 * mean_sag * L, rel=1e-6)  # width x sag x length
    assert r.ponding_extra_psf == pytest.approx(145.0 * mean_sag / 12.0, rel=1e-6)
    assert r.ponded_share == pytest.approx(mean_sag / 4.75, rel=1e-6)  # nominal 4.75 in of concrete


def test_pour_stage_screed_overrides_the_beam():
    mixed = evaluate_construction(beam(screed="constant-thickness",
                                       pours=(PourStage("A", 0, 240, screed="level"), PourStage("B", 240, 480))))
    flat = evaluate_construction(beam(screed="constant-thickness"))
    assert mixed.stages[1].ponded_volume > 0.0 and mixed.stages[2].ponded_volume == 0.0
    assert mixed.at_midspan(mixed.wet_deflection) > flat.at_midspan(flat.wet_deflection)
