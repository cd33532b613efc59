"""Clause tests for engine/aisc360/concrete.py and engine/aisc360/anchors.py.

Units: ksi, pcf, in, kip. Sources beside every check value.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from engine.codes.aci209r_92 import fc_at_age
from engine.codes.aisc360_22.i8_anchors import emid_ht, qn_concrete_limit, qn_stud, rg_rp, stud_area
from engine.codes.aisc360_22.i1_materials import E_STEEL, ec, fc_strength_range, modular_ratio

FU = 65.0  # ksi, stud tensile strength of AWS D1.1 Type B studs, as in AISC Design Examples v16.0
D34 = 0.75  # in, 3/4-in stud


# ---------------------------------------------------------------- concrete


def test_ec_normal_weight_145_pcf_4_ksi():
    # Hand: 145^1.5 = 145 * 12.0416 = 1746.03; * sqrt(4) = 3492.1 ksi (AISC 360-22 I2.1b formula)
    assert ec(145.0, 4.0) == pytest.approx(145.0 * math.sqrt(145.0) * 2.0, rel=1e-12)
    assert ec(145.0, 4.0) == pytest.approx(3492.1, abs=0.1)
    # AISC Design Examples v16.0 Ex. I.2 prints 3,490 ksi (V)
    assert ec(145.0, 4.0) == pytest.approx(3490.0, rel=0.001)


def test_ec_vectorised_and_rejects_nonpositive():
    got = ec(np.array([110.0, 145.0]), np.array([3.0, 3.0]))
    # Hand: 110^1.5 sqrt(3) = 1153.7 * 1.7321 = 1998; 145^1.5 sqrt(3) = 1746.0 * 1.7321 = 3024
    # (AISC 360-22 Eq. I8-1 recomputed by hand, D)
    assert got == pytest.approx([1998.0, 3024.0], abs=0.6)
    with pytest.raises(ValueError):
        ec(145.0, 0.0)


def test_modular_ratio():
    # AISC Design Examples v16.0 Ex. I.2: n = 8.31 with E_c = 3,490 ksi (V)
    assert modular_ratio(3490.0) == pytest.approx(8.31, abs=0.005)
    # Hand: 29,000 / 3,492.1 = 8.304
    assert modular_ratio(ec(145.0, 4.0)) == pytest.approx(29000.0 / 3492.07, rel=1e-5)
    assert E_STEEL == 29000.0  # AISC 360-22 Section B2
    with pytest.raises(ValueError):
        modular_ratio(0.0)


def test_fc_at_age_hand_values():
    # ACI 209R-92 Eq. 2-1, a = 4.0, beta = 0.85, recomputed by hand:
    # t = 7: 7 / (4 + 5.95) = 0.70352; t = 28: 28 / (4 + 23.8) = 1.00719; t = 0: 0
    got = fc_at_age(4.0, np.array([0.0, 7.0, 28.0]))
    assert got == pytest.approx([0.0, 4.0 * 0.70352, 4.0 * 1.00719], abs=1e-4)
    with pytest.raises(ValueError):
        fc_at_age(4.0, -1.0)


@given(st.floats(0.0, 3650.0), st.floats(0.01, 100.0))
def test_fc_at_age_increases_towards_its_limit(t, dt):
    # ACI 209R-92 Eq. 2-1 is increasing in t with limit f'c / beta = f'c / 0.85 (hand algebra)
    lo, hi = fc_at_age(4.0, [t, t + dt])
    assert lo <= hi < 4.0 / 0.85


def test_fc_strength_range_i1_3():
    # AISC 360-22 I1.3: NWC 3-10 ksi, LWC 3-6 ksi (V)
    assert fc_strength_range(False) == (3.0, 10.0)
    assert fc_strength_range(True) == (3.0, 6.0)


# ---------------------------------------------------------------- anchors


def test_stud_area():
    # Hand: pi * 0.75^2 / 4 = 0.44179 in^2; A_sa F_u = 28.72 kip (D)
    assert stud_area(D34) == pytest.approx(0.44179, abs=1e-5)
    assert stud_area(D34) * FU == pytest.approx(28.72, abs=0.005)
    with pytest.raises(ValueError):
        stud_area(0.0)


def test_emid_ht_reference_geometry():
    # AISC 360-22 I8.2a, emid-ht and the strong side, by hand (D): w = 6 in, e = 1.25 in, d = 3/4 in
    # strong 3 + 1.25 - 0.375 = 3.875 (3.9); weak 3 - 1.25 - 0.375 = 1.375 (1.4); centre 2.625
    got = emid_ht(6.0, 1.25, D34, np.array(["strong", "weak", "center"]))
    assert got == pytest.approx([3.875, 1.375, 2.625])
    assert float(emid_ht(6.0, 1.25, D34, "weak")) == pytest.approx(1.375)
    with pytest.raises(ValueError):
        emid_ht(6.0, 1.25, D34, "left")
    with pytest.raises(ValueError):  # shank would cross the rib wall: 1.0 - 1.0 - 0.375 < 0
        emid_ht(2.0, 1.0, D34, "weak")


# Each row: deck, studs, keyword arguments, Rg, Rp from the AISC 360-22 I8.2a text
# (AISC 360-22 I8.2a Rg/Rp values, V).
RG_RP_ROWS = [
    ("none", 1, {}, 1.0, 0.75),
    ("none", 3, {}, 1.0, 0.75),  # "any number ... welded in a row directly to the steel shape"
    ("parallel", 1, {"wr_over_hr": 2.0}, 1.0, 0.75),
    ("parallel", 1, {"wr_over_hr": 1.5}, 1.0, 0.75),  # limit is ">= 1.5"
    ("parallel", 1, {"wr_over_hr": 1.2}, 0.85, 0.75),
    ("parallel", 2, {"wr_over_hr": 1.2}, 0.85, 0.75),  # Spec silent on 2+; our documented choice
    ("perpendicular", 1, {"emid_ht": 1.4}, 1.0, 0.6),
    ("perpendicular", 2, {"emid_ht": 1.4}, 0.85, 0.6),
    ("perpendicular", 3, {"emid_ht": 1.4}, 0.7, 0.6),
    ("perpendicular", 4, {"emid_ht": 1.4}, 0.7, 0.6),  # "three or more"
    ("perpendicular", 1, {"emid_ht": 2.0}, 1.0, 0.75),  # limit is ">= 2 in"
    ("perpendicular", 2, {"emid_ht": 3.9}, 0.85, 0.75),
    ("perpendicular", 0, {"emid_ht": 3.9}, 1.0, 0.75),  # empty rib: Rg irrelevant, 1.0
]


@pytest.mark.parametrize(("deck", "studs", "kwargs", "rg", "rp"), RG_RP_ROWS)
def test_rg_rp_table(deck, studs, kwargs, rg, rp):
    got_rg, got_rp = rg_rp(deck, studs, **kwargs)
    assert float(got_rg) == rg and float(got_rp) == rp


def test_rg_rp_vectorised_over_ribs_and_bad_input():
    # A rib's Rg counts the studs actually in it (AISC 360-22 I8.2a); values per I8.2a
    rg, rp = rg_rp("perpendicular", np.array([1, 2, 1]), emid_ht=np.array([3.9, 3.9, 1.4]))
    assert rg.tolist() == [1.0, 0.85, 1.0] and rp.tolist() == [0.75, 0.75, 0.6]
    with pytest.raises(ValueError):
        rg_rp("ribbed", 1)
    with pytest.raises(ValueError):
        rg_rp("perpendicular", 1)  # no emid_ht
    with pytest.raises(ValueError):
        rg_rp("parallel", 1)  # no wr_over_hr
    with pytest.raises(ValueError):
        rg_rp("none", -1)


# AISC 360-22 Eq. I8-1 recomputed by hand (D), every cell: 3/4-in studs, Fu = 65 ksi.
# Columns: no deck / parallel >= 1.5, parallel < 1.5, perpendicular weak 1/2/3, strong 1/2/3.
# (wc pcf, f'c ksi, Ec, concrete limit, cells)
SECTION_8 = [
    (145.0, 3.0, 3024.0, 21.0, [21.0, 18.3, 17.2, 14.6, 12.1, 21.0, 18.3, 15.1]),
    (145.0, 4.0, 3492.0, 26.1, [21.5, 18.3, 17.2, 14.6, 12.1, 21.5, 18.3, 15.1]),
    (110.0, 3.0, 1998.0, 17.1, [17.1, 17.1, 17.1, 14.6, 12.1, 17.1, 17.1, 15.1]),
    (110.0, 4.0, 2307.0, 21.2, [21.2, 18.3, 17.2, 14.6, 12.1, 21.2, 18.3, 15.1]),
]
# Rg * Rp for each column, straight from the I8.2a text (hand, not from rg_rp)
RG_RP_PRODUCT = [1.0 * 0.75, 0.85 * 0.75, 1.0 * 0.6, 0.85 * 0.6, 0.7 * 0.6, 1.0 * 0.75, 0.85 * 0.75, 0.7 * 0.75]


def _section_8_cells(wc, fc):
    """Our functions' Qn for the eight stud cases of Eq. I8-1 recomputed by hand."""
    asa, e_c = stud_area(D34), ec(wc, fc)
    qn = lambda deck, n, **kw: float(qn_stud(asa, fc, e_c, FU, *rg_rp(deck, n, **kw)))  # noqa: E731
    return [
        qn("none", 1),
        qn("parallel", 1, wr_over_hr=1.2),
        *[qn("perpendicular", n, emid_ht=1.4) for n in (1, 2, 3)],
        *[qn("perpendicular", n, emid_ht=3.9) for n in (1, 2, 3)],
    ]


@pytest.mark.parametrize(("wc", "fc", "ec_table", "limit_table", "cells"), SECTION_8)
def test_reference_section_8_every_cell(wc, fc, ec_table, limit_table, cells):
    """Recomputed by hand from AISC 360-22 Eq. I8-1 (derived values, D).

    Hand: Ec = wc^1.5 sqrt(f'c); concrete limit = 0.5 * 0.44179 * sqrt(f'c Ec);
    steel limit = Rg Rp * 0.44179 * 65 = Rg Rp * 28.716; Qn = min of the two.
    """
    asa = math.pi * 0.75**2 / 4.0
    e_hand = wc * math.sqrt(wc) * math.sqrt(fc)
    limit_hand = 0.5 * asa * math.sqrt(fc * e_hand)
    hand = [min(limit_hand, k * asa * 65.0) for k in RG_RP_PRODUCT]
    assert e_hand == pytest.approx(ec_table, abs=0.6)
    assert round(limit_hand, 1) == limit_table
    assert [round(v, 1) for v in hand] == cells
    assert float(qn_concrete_limit(asa, fc, ec(wc, fc))) == pytest.approx(limit_hand, rel=1e-12)
    assert _section_8_cells(wc, fc) == pytest.approx(hand, rel=1e-12)


def test_reference_section_8_unrounded_steel_limits():
    # AISC 360-22 Eq. I8-1 recomputed by hand (D): 21.54, 18.31, 17.23, 14.65, 12.06, 15.08 = Rg Rp * 28.716
    asa = stud_area(D34)
    got = [float(qn_stud(asa, 10.0, 5000.0, FU, rg, rp)) for rg, rp in
           [(1.0, 0.75), (0.85, 0.75), (1.0, 0.6), (0.85, 0.6), (0.7, 0.6), (0.7, 0.75)]]
    assert got == pytest.approx([21.54, 18.31, 17.23, 14.65, 12.06, 15.08], abs=0.006)


def test_manual_values_via_de16():
    """AISC Design Examples v16.0 (V): 3/4-in studs, NWC 145 pcf,
    f'c = 4 ksi: 17.2 (weak, 1 per rib), 14.6 (weak, 2 per rib), 21.5 (welded directly)."""
    asa, fc = stud_area(D34), 4.0
    e_c = ec(145.0, fc)
    weak = qn_stud(asa, fc, e_c, FU, *rg_rp("perpendicular", np.array([1, 2]), emid_ht=1.0))
    direct = qn_stud(asa, fc, e_c, FU, *rg_rp("none", 1))
    assert weak == pytest.approx([17.2, 14.6], abs=0.05)
    assert float(direct) == pytest.approx(21.5, abs=0.05)


@given(
    st.floats(90.0, 155.0), st.floats(3.0, 10.0), st.integers(0, 5), st.floats(0.5, 5.0)
)
def test_qn_never_exceeds_either_limit_and_drops_with_more_studs(wc, fc, n, e):
    # Eq. I8-1 is the minimum of two limits; Rg is nonincreasing in the studs per rib (I8.2a)
    asa, e_c = stud_area(D34), ec(wc, fc)
    one, more = (
        qn_stud(asa, fc, e_c, FU, *rg_rp("perpendicular", k, emid_ht=e)) for k in (n, n + 1)
    )
    assert one <= qn_concrete_limit(asa, fc, e_c) + 1e-12
    assert one <= 0.75 * asa * FU + 1e-12
    assert more <= one + 1e-12
