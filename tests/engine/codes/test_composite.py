"""Clause tests for engine/aisc360/composite.py (AISC 360-22 I3.1a, I3.2a, Commentary I3.2).

Units: kip, in, ksi, kip-in. Hand recomputations are written out in each docstring and again as
plain arithmetic in the test body (forces and lever arms about the PNA, not the module's formula).
Shape properties: AISC Shapes Database v16.0 (W24X76 as published; the
property tests read every W-shape from the copy of the database packaged in efficalc 1.2.7).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
import pytest
from efficalc.sections import ALL_AISC_WIDE_FLANGE_NAMES, get_aisc_wide_flange
from hypothesis import given
from hypothesis import strategies as st

from engine.codes.aisc360_22.i3_composite import (
    b_eff,
    cf_force,
    effective_width,
    equivalent_inertia,
    lower_bound_ena,
    lower_bound_inertia,
    model_web_thickness,
    plastic_moment,
    pna_label,
    transformed_inertia,
)


@dataclass(frozen=True, slots=True)
class Shape:
    """The W-shape attributes the clause layer reads."""

    name: str
    area: float
    d: float
    bf: float
    tf: float
    tw: float
    ix: float
    zx: float


# AISC Shapes Database v16.0 (V); Zx = 200 in^3 from the same database
# (efficalc 1.2.7 copy).
W24X76 = Shape("W24X76", area=22.4, d=23.9, bf=8.99, tf=0.680, tw=0.440, ix=2100.0, zx=200.0)


def _database_w_shapes():
    rows = (get_aisc_wide_flange(name) for name in ALL_AISC_WIDE_FLANGE_NAMES)
    return [Shape(r.AISC_name, r.A, r.d, r.bf, r.tf, r.tw, r.Ix, r.Zx) for r in rows if r.Type == "W"]


W_SHAPES = _database_w_shapes()
FY, FC, B, YCON = 50.0, 4.0, 90.0, 7.5


def _moment_about_pna(c, cs_depth_flange, yw, shape, fy, fc, b, ycon):
    """Hand statics: sum of |force| x lever arm about the PNA (compression above, tension below)."""
    tw = (shape.area - 2 * shape.bf * shape.tf) / (shape.d - 2 * shape.tf)
    a = c / (0.85 * fc * b)
    if yw == 0.0:  # PNA in the top flange at depth cs_depth_flange
        p = cs_depth_flange
        forces = [
            (c, ycon - a / 2 + p),  # concrete
            (shape.bf * p * fy, p / 2),  # flange above PNA, compression
            (shape.bf * (shape.tf - p) * fy, (shape.tf - p) / 2),  # flange below PNA, tension
            (tw * (shape.d - 2 * shape.tf) * fy, shape.d / 2 - p),  # whole web, tension
            (shape.bf * shape.tf * fy, shape.d - shape.tf / 2 - p),  # bottom flange, tension
        ]
    else:  # PNA in the web, yw below the flange
        p = shape.tf + yw
        below = shape.d - 2 * shape.tf - yw
        forces = [
            (c, ycon - a / 2 + p),
            (shape.bf * shape.tf * fy, p - shape.tf / 2),
            (tw * yw * fy, yw / 2),
            (tw * below * fy, below / 2),
            (shape.bf * shape.tf * fy, shape.d - shape.tf / 2 - p),
        ]
    return sum(f * lever for f, lever in forces)


def test_plastic_moment_pna_in_slab():
    """W24X76, Fy 50, f'c 4, b 90, Ycon 7.5, C = As Fy = 22.4 * 50 = 1120 kip.

    a = 1120 / (0.85 * 4 * 90) = 1120 / 306 = 3.660 in; concrete force 3.660/2 = 1.830 below the
    slab top, 7.5 - 1.830 = 5.670 in above the steel top; steel all in tension at d/2 = 11.95 below
    the steel top. Mn = 1120 * (5.670 + 11.95) = 1120 * 17.620 = 19,734 kip-in.
    """
    pm = plastic_moment(1120.0, W24X76, FY, FC, B, YCON)
    a = 1120.0 / (0.85 * 4.0 * 90.0)
    hand = 1120.0 * ((7.5 - a / 2) + 23.9 / 2)
    assert float(pm.mn) == pytest.approx(hand, rel=1e-9)
    assert float(pm.mn) == pytest.approx(19734.0, abs=1.0)
    assert int(pm.pna) == 0 and pna_label(pm.pna) == "slab"
    assert float(pm.a) == pytest.approx(3.660, abs=5e-4) and float(pm.pna_depth) == 0.0
    assert float(pm.d2) == 0.0


def test_plastic_moment_pna_in_top_flange():
    """W24X76, C = 560 kip (the DE16 Ex. I.2 case, hand arithmetic here).

    Steel compression Cs = (1120 - 560)/2 = 280 kip <= bf tf Fy = 8.99 * 0.68 * 50 = 305.66: flange.
    x = 280 / (8.99 * 50) = 0.6229 in. a = 560/306 = 1.8301 in.
    About the PNA: concrete 560 * (7.5 - 0.9150 + 0.6229) = 560 * 7.2079 = 4036.4
    flange above 8.99*0.6229*50 = 280.0 * 0.3115 = 87.2; flange below 8.99*0.0571*50 = 25.66 * 0.0285
    = 0.7; web tw_model = (22.4 - 12.2264)/22.54 = 0.45136 in, 0.45136*22.54*50 = 508.68 *
    (11.95 - 0.6229) = 5761.8; bottom flange 305.66 * (23.9 - 0.34 - 0.6229) = 305.66 * 22.9371 = 7010.9.
    Mn = 4036.4 + 87.2 + 0.7 + 5761.8 + 7010.9 = 16,897 kip-in.
    """
    pm = plastic_moment(560.0, W24X76, FY, FC, B, YCON)
    x = 280.0 / (8.99 * 50.0)
    hand = _moment_about_pna(560.0, x, 0.0, W24X76, FY, FC, B, YCON)
    assert float(pm.mn) == pytest.approx(hand, rel=1e-9)
    assert float(pm.mn) == pytest.approx(16897.0, abs=1.0)
    assert pna_label(pm.pna) == "flange"
    assert float(pm.pna_depth) == pytest.approx(0.6229, abs=1e-4)
    assert float(pm.d2) == pytest.approx(0.6229 / 2, abs=1e-4)


def test_plastic_moment_pna_in_web():
    """W24X76, C = 200 kip.

    Cs = (1120 - 200)/2 = 460 > 305.66: web. Web part 460 - 305.66 = 154.34 kip;
    yw = 154.34 / (0.45136 * 50) = 6.8389 in; PNA 0.68 + 6.8389 = 7.5189 in below the steel top.
    a = 200/306 = 0.6536 in. About the PNA: concrete 200 * (7.5 - 0.3268 + 7.5189) = 2938.4;
    top flange 305.66 * (7.5189 - 0.34) = 2194.3; web in compression 154.34 * 3.4195 = 527.8;
    web in tension 0.45136*50*(22.54 - 6.8389) = 354.34 * 7.8506 = 2781.8; bottom flange
    305.66 * (23.9 - 7.5189 - 0.34) = 4903.1. Mn = 13,345 kip-in. (Check: 200 + 305.66 + 154.34 =
    660 = 354.34 + 305.66.)
    """
    pm = plastic_moment(200.0, W24X76, FY, FC, B, YCON)
    tw = (22.4 - 2 * 8.99 * 0.68) / (23.9 - 2 * 0.68)
    yw = (460.0 - 8.99 * 0.68 * 50.0) / (tw * 50.0)
    hand = _moment_about_pna(200.0, 0.0, yw, W24X76, FY, FC, B, YCON)
    assert float(pm.mn) == pytest.approx(hand, rel=1e-9)
    assert float(pm.mn) == pytest.approx(13345.0, abs=1.0)
    assert pna_label(pm.pna) == "web"
    assert float(pm.pna_depth) == pytest.approx(7.5189, abs=1e-3)
    assert model_web_thickness(W24X76) == pytest.approx(0.45136, abs=1e-5)


def test_plastic_moment_is_vectorised_clips_and_rejects_negative():
    c = np.array([0.0, 200.0, 560.0, 1120.0, 5000.0])
    pm = plastic_moment(c, W24X76, FY, FC, B, YCON)
    assert pm.mn.shape == c.shape and pm.pna.tolist() == [2, 2, 1, 0, 0]
    assert pm.c[-1] == pytest.approx(22.4 * 50.0)  # clipped to As Fy (I3.2d.1)
    assert pm.mn[-1] == pm.mn[-2]
    with pytest.raises(ValueError):
        plastic_moment(np.array([100.0, -1.0]), W24X76, FY, FC, B, YCON)


def test_mn_at_zero_slab_force_matches_tabulated_zx():
    """C = 0 gives the bare-steel plastic moment of the model (flanges bf x tf, web thickness set
    to match the tabulated A). Against Zx Fy of every W-shape in the AISC Shapes Database
    (efficalc 1.2.7 copy): within 3 %. Why 3 %: folding the fillets into a uniform web moves their
    area toward the neutral axis (the model is up to about 2 % low for light shapes) and the
    tabulated Zx is rounded to three significant figures (up to 0.5 %)."""
    worst = 0.0
    for shape in W_SHAPES:
        mn0 = float(plastic_moment(0.0, shape, FY, FC, B, YCON).mn)
        worst = max(worst, abs(mn0 / (shape.zx * FY) - 1.0))
    assert len(W_SHAPES) > 250 and worst <= 0.03


def _concrete_can_carry(shape, fc, b, ycon, fy):
    return min(shape.area * fy, 0.85 * fc * b * ycon)


SLAB = dict(
    shape=st.sampled_from(W_SHAPES),
    fy=st.sampled_from([36.0, 50.0, 65.0]),
    fc=st.floats(3.0, 10.0),
    b=st.floats(24.0, 180.0),
    ycon=st.floats(2.0, 9.0),
)


@given(**SLAB, fractions=st.lists(st.floats(0.0, 1.0), min_size=2, max_size=12))
def test_mn_nondecreasing_and_pna_moves_down_as_c_falls(shape, fy, fc, b, ycon, fractions):
    # dMn/dC = (Ycon - a) + PNA depth >= 0 while the stress block stays in the slab, so C is drawn
    # up to min(As Fy, 0.85 f'c b Ycon) (hand derivation from the plastic distribution).
    c = np.sort(np.array(fractions)) * _concrete_can_carry(shape, fc, b, ycon, fy)
    pm = plastic_moment(c, shape, fy, fc, b, ycon)
    assert np.all(np.diff(pm.mn) >= -1e-9 * pm.mn[-1])
    assert np.all(np.diff(pm.pna) <= 0)  # code: 2 web -> 1 flange -> 0 slab as C grows
    assert np.all(np.diff(pm.pna_depth) <= 1e-12)


@given(**SLAB)
def test_full_steel_force_puts_pna_in_slab(shape, fy, fc, b, ycon):
    pm = plastic_moment(shape.area * fy, shape, fy, fc, b, ycon)
    assert int(pm.pna) == 0 and float(pm.d2) == 0.0


def test_effective_width_i3_1a():
    # AISC 360-22 I3.1a, hand: span 30 ft = 360 in, span/8 = 45 in
    # left: half the beam spacing 60 in > 45, so span/8 governs; right: slab edge 20 in governs
    left, right = effective_width(360.0, 60.0, 20.0)
    assert (float(left), float(right)) == (45.0, 20.0)
    assert float(b_eff(360.0, 60.0, 20.0)) == 65.0
    with pytest.raises(ValueError):
        effective_width(360.0, -1.0, 20.0)


def test_cf_force():
    # Hand: min(1120, 0.85 * 4 * 540 = 1836) = 1120; min(1120, 0.85 * 4 * 300 = 1020) = 1020
    assert cf_force(1120.0, 4.0, np.array([540.0, 300.0])).tolist() == pytest.approx([1120.0, 1020.0])


def test_transformed_inertia_ena_in_steel():
    """W24X76, b 90, n 9, 4.5-in concrete on 3-in deck (Ycon 7.5).

    b/n = 10 in; concrete 45 in^2 at 23.9 + 7.5 - 2.25 = 29.15 in above the steel bottom.
    y = (22.4 * 11.95 + 45 * 29.15) / 67.4 = (267.68 + 1311.75) / 67.4 = 23.434 in < 23.9: in steel.
    I = 2100 + 22.4 * (23.434 - 11.95)^2 + 10 * 4.5^3/12 + 45 * (29.15 - 23.434)^2
      = 2100 + 2954.0 + 75.9 + 1470.5 = 6600.4 in^4.
    """
    i_tr, y = transformed_inertia(W24X76, 90.0, 9.0, 4.5, 7.5)
    y_hand = (22.4 * 11.95 + 45.0 * 29.15) / 67.4
    i_hand = 2100.0 + 22.4 * (y_hand - 11.95) ** 2 + 10.0 * 4.5**3 / 12 + 45.0 * (29.15 - y_hand) ** 2
    assert float(y) == pytest.approx(y_hand, rel=1e-12) and float(y) == pytest.approx(23.434, abs=1e-3)
    assert float(i_tr) == pytest.approx(i_hand, rel=1e-12) and float(i_tr) == pytest.approx(6600.4, abs=0.1)


def test_transformed_inertia_ena_in_slab_ignores_cracked_concrete():
    """W24X76 under a 7.5-in solid slab, b 120, n 6: b/n = 20 in, top of slab H = 31.4 in.

    Uncracked y = (267.68 + 150 * 27.65)/172.4 = 25.61 > 23.9: in the concrete, so crack it.
    Compression depth x: 20 x^2 / 2 = 22.4 (31.4 - 11.95 - x) -> 10 x^2 + 22.4 x - 435.68 = 0,
    x = (-22.4 + sqrt(22.4^2 + 40 * 435.68)) / 20 = (-22.4 + 133.899) / 20 = 5.5750 in.
    I about the ENA = 2100 + 22.4 * (31.4 - 5.575 - 11.95)^2 + 20 * 5.575^3 / 3
      = 2100 + 4312.4 + 1155.1 = 7567.5 in^4 (concrete block about its own edge: b x^3/3).
    """
    i_tr, y = transformed_inertia(W24X76, 120.0, 6.0, 7.5, 7.5)
    x = (-22.4 + math.sqrt(22.4**2 + 40.0 * 435.68)) / 20.0
    i_hand = 2100.0 + 22.4 * (31.4 - x - 11.95) ** 2 + 20.0 * x**3 / 3.0
    assert x == pytest.approx(5.5750, abs=1e-4)
    assert float(y) == pytest.approx(31.4 - x, rel=1e-12)
    assert float(i_tr) == pytest.approx(i_hand, rel=1e-12) and float(i_tr) == pytest.approx(7567.5, abs=0.5)
    with pytest.raises(ValueError):
        transformed_inertia(W24X76, 120.0, 6.0, 8.0, 7.5)  # concrete thicker than the slab


def test_lower_bound_inertia_c_i3_1():
    """W24X76, sum Qn 300 kip, Fy 50, Ycon 6.5, a 1.2 (Commentary Eq. C-I3-1, by hand).

    Qn/Fy = 6.0 in^2; d1 = 6.5 - 0.6 = 5.9; d3 = 11.95; 2 d3 + d1 = 29.8.
    Y_ENA = (22.4 * 11.95 + 6 * 29.8) / 28.4 = (267.68 + 178.8) / 28.4 = 15.7211 in.
    I_LB = 2100 + 22.4 * (15.7211 - 11.95)^2 + 6 * (29.8 - 15.7211)^2 = 2100 + 318.55 + 1189.30
         = 3607.9 in^4.
    """
    y_hand = (22.4 * 11.95 + 6.0 * 29.8) / 28.4
    i_hand = 2100.0 + 22.4 * (y_hand - 11.95) ** 2 + 6.0 * (29.8 - y_hand) ** 2
    assert float(lower_bound_ena(W24X76, 300.0, 50.0, 6.5, 1.2)) == pytest.approx(y_hand, rel=1e-12)
    got = lower_bound_inertia(W24X76, np.array([0.0, 300.0]), 50.0, 6.5, 1.2)
    assert got[0] == pytest.approx(2100.0)  # no studs: bare steel
    assert got[1] == pytest.approx(i_hand, rel=1e-12) and got[1] == pytest.approx(3607.9, abs=0.1)


def test_equivalent_inertia_c_i3_3_and_cap():
    # Commentary Eq. C-I3-3 by hand: 2000 + sqrt(300/1200) * (6000 - 2000) = 2000 + 0.5 * 4000 = 4000
    got = equivalent_inertia(2000.0, 6000.0, np.array([0.0, 300.0, 1200.0, 2400.0]), 1200.0)
    assert got.tolist() == pytest.approx([2000.0, 4000.0, 6000.0, 6000.0])  # ratio capped at 1.0
    with pytest.raises(ValueError):
        equivalent_inertia(2000.0, 6000.0, -1.0, 1200.0)
