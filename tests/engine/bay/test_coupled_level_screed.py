"""A level-screeded beam resting on a girder, solved together, against a general FE frame package.

Bay: beam B-1 (W18X35, 30 ft, 10 ft strip, level screed) whose far end rests on girder G-1 (W24X62,
30 ft, load width 0) at its midspan; its reference end sits on a column. The girder carries only
this beam, so during the pour it acts on the beam's far end as a spring of stiffness 48 E I / L^3
(AISC Manual Table 3-23 case 7, a central point load). The concrete ponds into the total sag:
gamma_c b (sag so far + y) with y the beam's own deflection plus the settlement line (after
Ruddy, AISC Engineering Journal 1986).

Reference: anastruct (a general 2D frame FE solver, Euler-Bernoulli elements): 180 elements, the
far end on a spring 48 E I_g / L^3, the ponding k y as negative nodal springs k x tributary length
(as tests/engine/mechanics/test_statics.py), the sag before the pour (steel and deck on beam and
girder, closed forms of Table 3-23 cases 1 and 7) as a known load k s0. FE lumps k y at nodes:
agreement to about 1e-3.
"""

from __future__ import annotations

import itertools
import warnings

import numpy as np
import pytest

from engine.bay.inputs import FAR_END, Bearing, LevelInput
from engine.model.shapes import get_shape
from engine.pipeline import evaluate_level
from tests.engine.bay.test_girder_loads import L, WET_PSF, member

E = 29_000.0
GAMMA = 145.0 / 1_728_000.0  # kip/in^3
K = GAMMA * 120.0  # kip/in per in of sag: a 10 ft strip
EI_B, EI_G = E * get_shape("W18X35").ix, E * get_shape("W24X62").ix


def before_the_pour(x: np.ndarray) -> np.ndarray:
    """Sag of the beam line below the columns under steel and deck (in): the beam's own
    (Table 3-23 case 1) plus the girder's drop at midspan (cases 1 and 7) along the line x/L."""
    w = (35.0 + 2.0 * 10.0) / 12_000.0  # kip/in: W18X35 and 2 psf deck on 10 ft
    own = w * x * (L**3 - 2 * L * x**2 + x**3) / (24 * EI_B)
    drop = (w * L / 2) * L**3 / (48 * EI_G) + 5 * (62.0 / 12_000.0) * L**4 / (384 * EI_G)
    return own + drop * x / L


def fe_pour_step(n: int = 180) -> tuple[np.ndarray, np.ndarray, float]:
    """(nodes, deflection added by the pour (down +), spring force) from anastruct."""
    from anastruct import SystemElements

    nodes = np.linspace(0.0, L, n + 1)
    h = L / n
    spring = 48 * EI_G / L**3
    system = SystemElements(EA=1e9, EI=1.0)
    for a, b in itertools.pairwise(nodes):
        system.add_element([[a, 0.0], [b, 0.0]], EA=1e9, EI=EI_B)
    system.add_support_hinged(1)
    w_wet = WET_PSF * 10.0 / 12_000.0
    s0 = before_the_pour(nodes)
    for i in range(n):
        q = w_wet + K * 0.5 * (s0[i] + s0[i + 1])
        system.q_load(q=-q, element_id=i + 1, direction="y")
    for i in range(1, n):
        system.add_support_spring(i + 1, 2, -K * h)
    system.add_support_spring(n + 1, 2, spring - K * h / 2)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        system.solve()
    y = -np.array(system.get_node_result_range("uy"))
    return nodes, y, spring * y[-1]


def test_coupled_level_screed_matches_frame_fe_with_a_spring():
    beam = member("B-1", "W18X35", "level")
    level = LevelInput("test", (beam, member("G-1", "W24X62", load_width=0.0)), (Bearing("B-1", FAR_END, "G-1", 180.0),))
    result = evaluate_level(level, with_bays=False)
    run = result.solution.member("B-1")
    pour = run.dead[1] + run.settle[1, 0] * (1 - run.x / L) + run.settle[1, 1] * run.x / L
    nodes, y_fe, force = fe_pour_step()
    for xp in (90.0, 180.0, 270.0, 360.0):
        assert np.interp(xp, run.x, pour) == pytest.approx(np.interp(xp, nodes, y_fe), rel=1.5e-3)
    # the girder's load from the pour, ponded concrete included, is the spring force
    pour_load = next(g for g in result.loads if g.day is not None)
    assert pour_load.wet_concrete + pour_load.ponded_concrete == pytest.approx(force, rel=1.5e-3)
    assert pour_load.ponded_concrete > 0.05 * pour_load.wet_concrete  # ponding matters here
    # the girder's own evaluation on its derived loads sees the same drop
    g = result.solution.member("G-1")
    assert g.sag()[-1, g.x.size // 2] == pytest.approx(run.sag()[-1, -1], rel=1e-6)


def test_the_beam_alone_with_its_ends_drop_ponds_what_the_bay_ponds():
    """The beam's own construction stage, given the drop of its far end by day (from the bay),
    ponds the same concrete and deflects the same as in the bay solve (the same linear problem)."""
    from engine.construction.evaluate import evaluate_construction

    level = LevelInput("test", (member("B-1", "W18X35", "level"), member("G-1", "W24X62", load_width=0.0)),
                       (Bearing("B-1", FAR_END, "G-1", 180.0),))
    result = evaluate_level(level, with_bays=False)
    alone = evaluate_construction(result.member("B-1"))
    run = result.solution.member("B-1")
    assert alone.run.dead[1] == pytest.approx(run.dead[1], rel=1e-4, abs=1e-7)
    assert alone.ponded_weight == pytest.approx(run.ponded_own.sum() + run.ponded_settle.sum(), rel=1e-4)
    assert run.ponded_settle.sum() > 0.2 * run.ponded_own.sum()  # the girder's sag ponds a real share
