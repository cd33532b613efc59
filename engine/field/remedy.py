"""What the engineer of record can do about a stud report, in the world it was found in.

Before the pour: replacement in kind (every lost stud welded again in its own rib, or the nearest
open rib with room where its rib is under concrete) and the fewest studs that restore every check
(engine.field.repair), each re-evaluated. After the pour: no stud in a rib under placed concrete;
acceptance by analysis (the as-built checks and verdicts), and where that is not acceptable what
each remedy must supply: post-installed shear connectors (sum Qn missing on each shear span),
strengthening the steel (the moment shortfall along the span), or a load restriction (the live
load the beam carries as built). No product is named: the engineer of record chooses.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np

from engine.field.as_built import AsBuiltResult, RibState, assess
from engine.field.repair import Repair, find_repair, slab_force_needed
from engine.finished.slab_force import slab_force
from engine.model.results import Level

WELD_METHOD = ("arc stud welding through the deck to the top flange (AWS D1.1 stud welding clause); where the "
               "stud gun cannot be used, a fillet-welded stud, the fillet size per AWS D1.1 and the engineer of record")
RETEST = ("the inspector bend-tests each replaced or added stud and re-inspects the rib before the pour (AWS D1.1 "
          "stud welding clause; test angle and frequency from memory, verify against AWS D1.1)")


@dataclass(frozen=True, slots=True)
class InKind:
    """Studs welded per slot to replace the lost ones in kind (`weld`), the beam re-evaluated
    (`after`), how many of them moved from a rib under concrete to the nearest open rib with room
    (`moved`), and lost studs with no open rib with room for them (`unplaced`)."""

    weld: np.ndarray
    after: AsBuiltResult
    moved: int
    unplaced: int

    @property
    def total(self) -> int:
        return int(self.weld.sum())


@dataclass(frozen=True, slots=True)
class Acceptance:
    """The beam as built after the pour, and what each remedy must supply where it does not pass.

    qn_missing_left / _right: sum Qn (kip) the studs left / right of the maximum moment lack;
    qn_within_left / _right: stations (in) the connectors must lie between the support and;
    moment_shortfall: largest demand over capacity (kip-in) and the stations it spans;
    live_fraction: share of the live load the beam carries as built with every check that
    passed as designed passing (1.0 when it carries all)."""

    before: AsBuiltResult
    acceptable: bool
    qn_missing_left: float
    qn_missing_right: float
    qn_within_left: float
    qn_within_right: float
    connectors_suffice: bool
    moment_shortfall: float
    shortfall_from: float
    shortfall_to: float
    live_fraction: float


def as_designed(before: AsBuiltResult) -> AsBuiltResult:
    """The beam with the studs as detailed (no findings)."""
    d = before.designed
    zero = np.zeros(d.x.size, dtype=int)
    return assess(before.beam, d, RibState(d.count, d.count, zero, zero))


def in_kind(before: AsBuiltResult, closed: np.ndarray) -> InKind:
    """Replacement in kind: each lost or weak-side stud welded again in its own rib (the failed
    stud removed first), or, where its rib is under concrete, in the nearest open rib with room.
    With every rib open the studs are exactly as detailed (plus any added), so the strength is the
    as-detailed strength (AISC 360-22 I8.2a, Eq. I8-1). The slot grid keeps the I8.2d spacing."""
    d, s = before.designed, before.state
    wrong_side = np.where(d.position == "weak", 0, s.weak)
    lost = d.count + s.added - s.effective + wrong_side
    weld = np.where(closed, 0, lost).astype(int)
    in_rib = np.where(closed, s.in_rib, d.count + s.added)
    effective = np.where(closed, s.effective, d.count + s.added)
    weak = np.where(closed, s.weak, 0)
    moved_in = np.zeros(d.x.size, dtype=int)
    unplaced = 0
    for k in np.flatnonzero(closed & (lost > 0)):
        for _ in range(int(lost[k])):
            room = (~closed) & (np.maximum(d.max_count, d.count + s.added) - in_rib > 0)
            if not room.any():
                unplaced += 1
                continue
            j = int(np.flatnonzero(room)[np.argmin(np.abs(d.x[room] - d.x[k]))])
            weld[j] += 1
            in_rib[j] += 1
            effective[j] += 1
            moved_in[j] += 1
    state = RibState(in_rib, effective, weak, s.added + moved_in)
    return InKind(weld, assess(before.beam, d, state, before.designed_anchor_gap), int(moved_in.sum()), unplaced)


def fewest_studs(before: AsBuiltResult, closed: np.ndarray) -> Repair:
    """The fewest added studs (engine.field.repair.find_repair) in ribs not under concrete: a
    closed rib has no room."""
    d = before.designed
    open_layout = replace(d, max_count=np.where(closed, 0, d.max_count))
    return find_repair(replace(before, designed=open_layout))


def _passing(designed: AsBuiltResult) -> frozenset[str]:
    return frozenset(c.id for c in designed.checks if c.passed)


def _restored(r: AsBuiltResult, passing: frozenset[str]) -> bool:
    return all(c.passed for c in r.checks if c.id in passing) and r.verdict != Level.FAIL


def live_fraction(before: AsBuiltResult, passing: frozenset[str], steps: int = 30) -> float:
    """Largest share of the live load (area and point live loads together) under which every
    strength and serviceability check that passed as designed passes with the studs as built
    (bisection, one `evaluate_beam` a step; AISC 360-22 Chapter I checks, the beam's deflection
    limits). Detailing checks (spacing, degree of composite) do not depend on the load: 1.0 when
    only they fall short."""
    beam = before.beam
    passing = frozenset(c.id for c in before.checks if c.id in passing and c.kind != "detailing")

    def carries(f: float) -> bool:
        loads = tuple(replace(p, live=p.live * f) for p in beam.point_loads)
        trial = replace(beam, live_psf=beam.live_psf * f, point_loads=loads)
        checks = assess(trial, before.designed, before.state, before.designed_anchor_gap).checks
        return all(c.passed for c in checks if c.id in passing)

    if carries(1.0):
        return 1.0
    if not carries(0.0):
        return 0.0
    lo, hi = 0.0, 1.0
    for _ in range(steps):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if carries(mid) else (lo, mid)
    return lo


def acceptance(before: AsBuiltResult) -> Acceptance:
    """Acceptance by analysis after the pour (see the module note). The Qn each shear span lacks
    is the largest, over the stations that fall short, of the slab force the station needs less the
    studs between it and that support (AISC 360-22 I3.2d.1: C(x) the lesser of the studs each side,
    0.85 f'c A_c and A_s F_y); the moment shortfall is demand less design strength (I3.2a, B3)."""
    passing = _passing(as_designed(before))
    ok = _restored(before, passing)
    r = before.result
    x, xc = r.x, float(r.x[r.critical])
    gap = r.demand - r.capacity
    short = gap > 0.0
    m_short = float(gap.max()) if short.any() else 0.0
    s_from = float(x[short].min()) if short.any() else 0.0
    s_to = float(x[short].max()) if short.any() else 0.0
    qn_l = qn_r = 0.0
    w_l, w_r = 0.0, before.beam.span
    suffice = True
    if not ok:
        deficient = before.strength_ratio < 1.0
        deficient[r.critical] = True
        need = slab_force_needed(before, deficient)
        if need is None:
            suffice = False
        else:
            _, left, right = slab_force(x, before.layout.groups(), r.cf)
            lack_l = np.where((need >= 0.0) & (x <= xc), need - left, 0.0)
            lack_r = np.where((need >= 0.0) & (x >= xc), need - right, 0.0)
            if lack_l.max(initial=0.0) > 0.0:
                i = int(np.argmax(lack_l))
                qn_l, w_l = float(lack_l[i]), float(x[i])
            if lack_r.max(initial=0.0) > 0.0:
                i = int(np.argmax(lack_r))
                qn_r, w_r = float(lack_r[i]), float(x[i])
    fraction = 1.0 if ok else live_fraction(before, passing)
    return Acceptance(before, ok, qn_l, qn_r, w_l, w_r, suffice, m_short, s_from, s_to, fraction)
