"""engine/findings.py: the as-built studs from an inspection report and the beam checked with them.

Check values are Eq. I8-1 and the plastic-moment closed form (AISC 360-22 Commentary I3.2a, as
written out in AISC 360-22 I8.2a) recomputed by hand here. Units: kip, in, ksi, kip-in.

Test beam (invented): W21X44 (A 13.0 in^2, d 20.7, bf 6.5, tf 0.45; AISC Shapes Database v16.0),
Fy 50 ksi, simple span 32 ft, beams 9'-6" apart each side, 3-in deck perpendicular (ribs 7 in top,
5 in bottom, 12 in pitch, first rib 6 in), 3 1/4 in of 145 pcf f'c 4 ksi concrete above the deck,
3/4-in studs Fu 65 ksi. 32 ribs at 6, 18, ..., 378 in; stations every 0.96 in never fall on a rib.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from engine.model.deck import DeckProfile, Slab
from engine.field.as_built import FindingError, apply_findings, evaluate_as_built
from engine.studs.layout import StudLayout
from engine.model.inputs import BeamInput, Finding, StudSpec
from engine.finished.slab_force import stud_qn
from engine.model.shapes import get_shape

SPAN = 384.0
RIBS = 6.0 + 12.0 * np.arange(32)
ASA_FU = math.pi * 0.75**2 / 4.0 * 65.0  # 28.716 kip (AISC 360-22 Eq. I8-1 recomputed by hand: Asa Fu = 28.72)
EC = 145.0**1.5 * math.sqrt(4.0)  # 3,492 ksi, AISC 360-22 I2.1b
CONCRETE = 0.5 * math.pi * 0.75**2 / 4.0 * math.sqrt(4.0 * EC)  # 26.1 kip, Eq. I8-1 first term
Q_WEAK_1 = min(CONCRETE, 1.0 * 0.6 * ASA_FU)  # 17.23 kip (AISC 360-22 Eq. I8-1 recomputed by hand: 17.2)
Q_WEAK_2 = min(CONCRETE, 0.85 * 0.6 * ASA_FU)  # 14.65 kip (AISC 360-22 Eq. I8-1 recomputed by hand: 14.6)
Q_STRONG_1 = min(CONCRETE, 1.0 * 0.75 * ASA_FU)  # 21.54 kip (AISC 360-22 Eq. I8-1 recomputed by hand: 21.5)
Q_STRONG_2 = min(CONCRETE, 0.85 * 0.75 * ASA_FU)  # 18.31 kip (AISC 360-22 Eq. I8-1 recomputed by hand: 18.3)
B_EFF = 2 * min(SPAN / 8.0, 57.0)  # 96 in, AISC 360-22 I3.1a
CAP = min(13.0 * 50.0, 0.85 * 4.0 * B_EFF * 3.25)  # 650 kip = As Fy governs (I3.2d.1)


def make_beam(live_psf: float = 100.0, shape: str = "W21X44", deck: bool = True) -> BeamInput:
    profile = DeckProfile("D3", 3.0, 7.0, 5.0, 12.0, 2.4) if deck else None
    slab = Slab("S", profile, 3.25 if deck else 6.0, 145.0, 4.0, False)
    return BeamInput(mark="T-1", shape=get_shape(shape), span=SPAN, fy=50.0, slab=slab,
                     orientation="perpendicular", slab_left=57.0, slab_right=57.0,
                     superimposed_dead_psf=35.0, live_psf=live_psf,
                     studs=StudSpec(0.75, 65.0, 5.25 if deck else 4.0, "weak", None, 2))


def make_layout(beam: BeamInput, count, position="weak", max_count=2) -> StudLayout:
    """A layout built directly (the designer's placement is not under test here)."""
    count = np.asarray(count, dtype=int)
    position = np.broadcast_to(np.asarray(position), count.shape).copy()
    qn = np.where(count > 0, stud_qn(beam, count, position), 0.0)
    return StudLayout(RIBS.copy(), count, position, qn, np.full(count.size, max_count))


def mn_hand(c: float) -> float:
    """Mn = C (d1 + d2) + Py (d3 - d2) for the test beam, PNA by equilibrium (Commentary I3.2a;
    AISC 360-22 I3.2a), shape modelled as two flanges and a web of area A - 2 bf tf."""
    area, d, bf, tf, fy = 13.0, 20.7, 6.5, 0.45, 50.0
    tw = (area - 2 * bf * tf) / (d - 2 * tf)
    py = area * fy
    c = min(c, py)
    a = c / (0.85 * 4.0 * B_EFF)
    d1 = 6.25 - a / 2
    cs = (py - c) / 2
    if cs <= bf * tf * fy:
        d2 = cs / (bf * fy) / 2
    else:
        yw = (cs - bf * tf * fy) / (tw * fy)
        d2 = (bf * tf**2 / 2 + tw * yw * (tf + yw / 2)) / (bf * tf + tw * yw)
    return c * (d1 + d2) + py * (d / 2 - d2)


def slot_strength_of(r, rib: int) -> float:
    return float(r.layout.count[rib - 1] * r.layout.qn[rib - 1])


# ---------------------------------------------------------------- R_g and R_p rules


def test_twin_missing_gives_rg_one():
    beam = make_beam()
    count = np.zeros(32, dtype=int)
    count[9] = 2  # rib 10 holds a pair
    designed = make_layout(beam, count)
    assert designed.qn[9] == pytest.approx(Q_WEAK_2, rel=1e-9)  # Eq. I8-1, R_g 0.85 R_p 0.6
    r = evaluate_as_built(beam, designed, (Finding("missing", rib=10),))
    # Eq. I8-1 by hand: the stud left alone, R_g 1.0 R_p 0.6: 0.6 x 28.72 = 17.23 kip
    assert r.layout.count[9] == 1
    assert slot_strength_of(r, 10) == pytest.approx(Q_WEAK_1, rel=1e-9)
    assert slot_strength_of(r, 10) == pytest.approx(17.23, abs=0.01)
    # off the rib (on the deck crest) likewise leaves the rib: same R_g 1.0 for the twin
    r = evaluate_as_built(beam, designed, (Finding("off-rib", rib=10),))
    assert slot_strength_of(r, 10) == pytest.approx(Q_WEAK_1, rel=1e-9)


def test_failed_and_short_studs_keep_rg_of_the_pair():
    beam = make_beam()
    count = np.zeros(32, dtype=int)
    count[9] = 2
    designed = make_layout(beam, count)
    for kind in ("failed-test", "short"):
        r = evaluate_as_built(beam, designed, (Finding(kind, rib=10),))
        # the broken or short stud stays welded in the rib: R_g 0.85 kept (conservative), 14.65 kip
        assert slot_strength_of(r, 10) == pytest.approx(Q_WEAK_2, rel=1e-9)
        assert r.state.in_rib[9] == 2 and r.state.effective[9] == 1


def test_weak_side_takes_rp_06():
    beam = make_beam()
    count = np.zeros(32, dtype=int)
    count[[4, 9]] = [1, 2]
    designed = make_layout(beam, count, position="strong")
    # e_mid-ht strong = 6/2 + 1.25 - 0.375 = 3.875 in >= 2 in -> R_p 0.75 (I8.2a): 21.54 kip
    assert designed.qn[4] == pytest.approx(Q_STRONG_1, rel=1e-9)
    r = evaluate_as_built(beam, designed, (Finding("weak-side", rib=5), Finding("weak-side", rib=10)))
    # weak: 3 - 1.25 - 0.375 = 1.375 in < 2 in -> R_p 0.6: 1.0 x 0.6 x 28.72 = 17.23 kip
    assert slot_strength_of(r, 5) == pytest.approx(Q_WEAK_1, rel=1e-9)
    assert r.layout.position[4] == "weak"
    # pair with one stud on the weak side: 0.85 x 0.75 x 28.72 + 0.85 x 0.6 x 28.72 = 18.31 + 14.65
    assert slot_strength_of(r, 10) == pytest.approx(Q_STRONG_2 + Q_WEAK_2, rel=1e-9)
    assert slot_strength_of(r, 10) == pytest.approx(32.96, abs=0.01)


def test_added_stud_counts_with_the_new_rg():
    beam = make_beam()
    count = np.zeros(32, dtype=int)
    count[9] = 1
    designed = make_layout(beam, count)
    r = evaluate_as_built(beam, designed, (Finding("added", rib=10),))
    # two studs now in the rib: R_g 0.85: 2 x 14.65 = 29.30 kip (not 17.23 + 17.23)
    assert slot_strength_of(r, 10) == pytest.approx(2 * Q_WEAK_2, rel=1e-9)
    assert r.state.added[9] == 1 and r.lost.sum() == 0


def test_station_finds_the_nearest_rib():
    beam = make_beam()
    designed = make_layout(beam, np.ones(32, dtype=int))
    state = apply_findings(beam, designed, (Finding("missing", station=100.0),))  # rib 9 is at 102 in
    assert state.effective[8] == 0 and state.effective.sum() == 31


# ---------------------------------------------------------------- contradictions are input errors


@pytest.mark.parametrize("findings, index, words", [
    ((Finding("missing", rib=3, count=3),), 0, ["finding #1", "rib 3 holds 1 stud"]),
    ((Finding("missing", rib=3), Finding("failed-test", rib=3)), 1, ["finding #2", "account for 2"]),
    ((Finding("added", rib=3, count=2),), 0, ["finding #1", "at most 2"]),
    ((Finding("missing", rib=33),), 0, ["numbered 1 to 32"]),
    ((Finding("short", station=390.0),), 0, ["no rib there", "rib 32"]),
    ((Finding("missing", rib=3), Finding("weak-side", rib=3)), 1, ["finding #2", "0 working stud"]),
])
def test_contradicting_finding_is_named(findings, index, words):
    beam = make_beam()
    designed = make_layout(beam, np.ones(32, dtype=int))
    with pytest.raises(FindingError) as err:
        apply_findings(beam, designed, findings)
    assert err.value.index == index
    for w in words:
        assert w in str(err.value)


def test_weak_side_refused_without_perpendicular_ribs():
    beam = make_beam(deck=False)
    designed = make_layout(beam, np.ones(32, dtype=int), position="center")
    with pytest.raises(FindingError, match="solid slab"):
        apply_findings(beam, designed, (Finding("weak-side", rib=3),))


# ---------------------------------------------------------------- envelope against the closed form


def test_uniform_loss_matches_closed_form():
    beam = make_beam()
    designed = make_layout(beam, np.ones(32, dtype=int))
    lost = tuple(Finding("failed-test", rib=k) for k in range(2, 33, 2))  # every even rib
    r = evaluate_as_built(beam, designed, lost)
    x, cap = r.result.x, r.result.capacity
    for station in (50.0, 96.0, 150.0, 192.0, 300.0, 370.0):
        i = int(np.argmin(np.abs(x - station)))
        # hand: odd ribs 1, 3, ... (at 6, 30, 54, ...) work, each Q_n = 17.23 kip
        working = RIBS[0::2]
        left = np.sum(working < x[i]) * Q_WEAK_1
        right = np.sum(working > x[i]) * Q_WEAK_1
        c = min(left, right, CAP)
        assert cap[i] == pytest.approx(0.9 * mn_hand(c), rel=1e-9), station
    # midspan: 8 working studs each side, C = 137.8 kip; composite 137.8 / 650 = 21 % (< 25 %)
    assert r.result.composite_ratio == pytest.approx(8 * Q_WEAK_1 / CAP, rel=1e-9)
    composite = next(c for c in r.checks if c.id == "composite.degree_min")
    assert not composite.passed and r.verdict == "fail"


def test_losses_near_one_support_lower_the_envelope_there_first():
    beam = make_beam()
    designed = make_layout(beam, np.ones(32, dtype=int))
    east = tuple(Finding("missing", rib=k) for k in (30, 31, 32))  # at 354, 366, 378 in
    before = evaluate_as_built(beam, designed, ())
    after = evaluate_as_built(beam, designed, east)
    x = after.result.x
    drop = before.result.capacity - after.result.capacity
    for station in (40.0, 120.0, 170.0):
        i = int(np.argmin(np.abs(x - station)))
        # hand: west of midspan the studs to the left govern and are all still there
        assert drop[i] == pytest.approx(0.0, abs=1e-9)
    for station in (200.0, 260.0, 330.0, 360.0, 380.0):
        i = int(np.argmin(np.abs(x - station)))
        left = np.sum(RIBS < x[i]) * Q_WEAK_1
        right = np.sum((RIBS > x[i]) & (RIBS < 350.0)) * Q_WEAK_1
        assert after.result.capacity[i] == pytest.approx(0.9 * mn_hand(min(left, right, CAP)), rel=1e-9)
        # lower wherever a lost stud stood east of the station (past rib 32 nothing was there)
        assert (drop[i] > 0.0) == (x[i] < 378.0)
    # past the last working stud (rib 29 at 342 in) the slab force is zero: bare steel, C = 0
    i = int(np.argmin(np.abs(x - 370.0)))
    assert after.result.capacity[i] == pytest.approx(0.9 * mn_hand(0.0), rel=1e-9)
    # the loss is largest (as a share of capacity) nearest the east support
    share = drop / before.result.capacity
    assert np.argmax(share[1:-1]) + 1 > np.argmin(np.abs(x - 342.0))


# ---------------------------------------------------------------- properties


@st.composite
def layouts_and_findings(draw, kinds):
    count = np.array(draw(st.lists(st.integers(0, 2), min_size=32, max_size=32)))
    strong = np.array(draw(st.lists(st.booleans(), min_size=32, max_size=32)))
    findings = []
    for k in range(32):
        n = draw(st.integers(0, 2 - count[k])) if kinds == ("added",) else draw(st.integers(0, count[k]))
        if n:
            findings.append(Finding(draw(st.sampled_from(kinds)), rib=k + 1, count=n))
    return count, np.where(strong, "strong", "weak"), tuple(findings)


@settings(max_examples=40, deadline=None)
@given(layouts_and_findings(("missing", "failed-test", "off-rib", "short", "weak-side")))
def test_removing_studs_never_raises_the_envelope(case):
    count, position, findings = case
    beam = make_beam()
    designed = make_layout(beam, count, position)
    before = evaluate_as_built(beam, designed, ())
    after = evaluate_as_built(beam, designed, findings)
    assert np.all(after.result.capacity <= before.result.capacity + 1e-9)
    assert np.all(after.result.slab_force <= before.result.slab_force + 1e-9)


@settings(max_examples=40, deadline=None)
@given(layouts_and_findings(("added",)))
def test_adding_studs_never_lowers_the_envelope(case):
    count, position, findings = case
    beam = make_beam()
    designed = make_layout(beam, count, position)
    before = evaluate_as_built(beam, designed, ())
    after = evaluate_as_built(beam, designed, findings)
    assert np.all(after.result.capacity >= before.result.capacity - 1e-9)
    assert after.layout.total == designed.total + sum(f.count for f in findings)


def test_no_findings_is_the_design():
    beam = make_beam()
    designed = make_layout(beam, np.ones(32, dtype=int))
    r = evaluate_as_built(beam, designed, ())
    assert np.array_equal(r.layout.qn, designed.qn) and r.lost.sum() == 0
    # hand: 16 studs each side of midspan x 17.23 = 275.7 kip, 42 % of 650 kip
    assert r.result.composite_ratio == pytest.approx(16 * Q_WEAK_1 / CAP, rel=1e-9)


def test_deck_anchorage_by_studs_checked_when_the_design_relied_on_it():
    beam = make_beam()
    designed = make_layout(beam, np.ones(32, dtype=int))  # studs every 12 in: anchorage by studs
    r = evaluate_as_built(beam, designed, (Finding("missing", rib=10), Finding("missing", rib=11)))
    anchor = next(c for c in r.checks if c.id == "deck.anchorage")
    # hand: ribs 9 and 12 at 102 and 138 in work: 36 in between anchors > 18 in (I3.2c.1)
    assert anchor.demand == pytest.approx(36.0) and not anchor.passed and anchor.station == pytest.approx(102.0)
