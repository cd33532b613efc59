"""As-built studs from a stud inspection report, and the finished beam checked with what remains.

The layout as designed is changed slot by slot by each finding (AISC 360-22 I8.2a: R_g counts the
studs actually in the rib, R_p follows the side of the rib), then the beam is evaluated with
`engine.finished.evaluate.evaluate_beam` on the as-built studs (capacity envelope with C(x), I3.2d.1 /
I8.2c; I_LB deflection; degree of composite; spacing), plus deck anchorage by studs (I3.2c.1).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import cast

import numpy as np

from engine.codes.aisc360_22.i3_composite import DECK_ANCHOR_SPACING_MAX
from engine.model.results import Check, Flag, Level, verdict_of
from engine.finished.evaluate import BeamResult, governing_check
from engine.studs.evaluate import evaluate_studs
from engine.studs.layout import StudLayout
from engine.model.inputs import FINDING_KINDS, BeamInput, Finding
from engine.finished.slab_force import stud_qn
from engine.model.units import format_ft_in
from engine.model.errors import FieldcompError

LOSS_KINDS = ("missing", "failed-test", "awaiting-test", "off-rib", "short")
LEAVE_THE_RIB = ("missing", "off-rib")  # no longer welded in the rib: R_g recounted without them
RESOLVING_KINDS = ("bent-accepted", "replaced")  # a stud that works again: it cancels a loss reported at its rib

# kind -> (what the engine does with it, the clause that says so)
FINDING_EFFECTS: dict[str, tuple[str, str]] = {
    "missing": ("no strength; R_g of the rib recounted without it", "AISC 360-22 I8.2a (R_g by studs in the rib)"),
    "failed-test": ("no strength until replaced; kept in the rib's R_g count (conservative)",
                    "AWS D1.1 stud welding clause (bend test); AISC 360-22 I8.2a"),
    "off-rib": ("not welded to the flange in a rib: no strength; R_g of the rib recounted without it",
                "AISC 360-22 I8.2a, I3.2c.1 (studs welded through the deck in the ribs)"),
    "awaiting-test": ("incomplete flash, awaiting its bend test: counted as lost until tested; kept in the rib's "
                      "R_g count (conservative)",
                      "AWS D1.1 stud welding clause (studs without a full flash are tested; from memory: verify "
                      "against AWS D1.1); AISC 360-22 I8.2a"),
    "short": ("installed too short to qualify: no strength; kept in the rib's R_g count (conservative)",
              "AISC 360-22 I3.2c.1(b) (1 1/2 in above the deck, 1/2 in cover) and I8.2 (length >= 4 d_sa)"),
    "weak-side": ("R_p = 0.6 (e_mid-ht < 2 in) for the studs concerned", "AISC 360-22 I8.2a"),
    "added": ("counts, with R_g of the rib's new stud count", "AISC 360-22 I8.2a"),
    "bent-accepted": ("bent in its test and accepted: counts; it clears an awaiting-test finding at its rib",
                      "AWS D1.1 stud welding clause (bend test; from memory: verify against AWS D1.1)"),
    "replaced": ("replaced in kind: counts; it clears a loss reported at its rib (missing first, then failed or "
                 "short, awaiting test last)", "AWS D1.1 stud welding clause; AISC 360-22 I8.2a"),
}


class FindingError(FieldcompError, ValueError):
    """A finding that contradicts the layout; `index` is its 0-based place in the list."""

    def __init__(self, index: int, message: str):
        super().__init__(message)
        self.index = index


@dataclass(frozen=True, slots=True)
class RibState:
    """Studs per slot as built: `in_rib` welded in the slot (they set R_g), `effective` those
    that carry shear, `weak` effective studs standing on the weak side of the rib, `added`
    studs added in the field (reported or repair)."""

    in_rib: np.ndarray
    effective: np.ndarray
    weak: np.ndarray
    added: np.ndarray

    def with_added(self, studs: np.ndarray) -> RibState:
        """The same state with `studs` more working studs per slot (on the side as designed)."""
        return RibState(self.in_rib + studs, self.effective + studs, self.weak, self.added + studs)


def describe(f: Finding, index: int | None = None) -> str:
    """Short text naming a finding, e.g. "finding #3 (missing x2 at rib 12)"."""
    where = f"rib {f.rib}" if f.rib is not None else f"station {format_ft_in(f.station or 0.0)}"
    head = f"finding #{index + 1} " if index is not None else ""
    return f"{head}({f.kind} x{f.count} at {where})"


def finding_effect(designed: StudLayout, f: Finding, slot: int) -> tuple[str, str]:
    """(what the finding does to the studs at `slot`, the clause that says so)."""
    effect, clause = FINDING_EFFECTS[f.kind]
    if f.kind == "weak-side" and designed.position[slot] == "weak":
        effect = "no change: the design already took these studs on the weak side (R_p = 0.6)"
    return effect, clause


def finding_slot(designed: StudLayout, f: Finding, index: int) -> int:
    """0-based slot a finding points at: its rib number, or the slot nearest its station (within
    half the slot spacing). Raises FindingError naming the finding."""
    n = designed.x.size
    if n == 0:
        raise FindingError(index, f"{describe(f, index)}: the beam has no stud slots")
    if f.rib is not None:
        if not 1 <= f.rib <= n:
            raise FindingError(index, f"{describe(f, index)}: ribs are numbered 1 to {n} from the reference end")
        return f.rib - 1
    station = float(f.station if f.station is not None else -1.0)
    k = int(np.argmin(np.abs(designed.x - station)))
    half = 0.5 * float(np.diff(designed.x).min()) if n > 1 else float("inf")
    if abs(designed.x[k] - station) > half + 1e-6:
        raise FindingError(index, f"{describe(f, index)}: no rib there; the nearest, rib {k + 1}, is at "
                           f"{format_ft_in(float(designed.x[k]))}")
    return k


def apply_findings(beam: BeamInput, designed: StudLayout, findings: tuple[Finding, ...]) -> RibState:
    """Studs per slot after the findings; a finding that contradicts the layout raises FindingError.

    Added studs first (R_g of the new count, AISC 360-22 I8.2a; at most `max_count` per slot),
    then losses (never more than the slot holds), then studs accepted after a bend test or
    replaced (each clears a loss at its rib), then weak-side (only studs that still work).
    """
    count = designed.count.astype(int)
    added, gone, dead, weak = (np.zeros(count.size, dtype=int) for _ in range(4))
    slots = [finding_slot(designed, f, i) for i, f in enumerate(findings)]
    perpendicular = beam.slab.deck is not None and beam.orientation == "perpendicular"
    for i, (f, k) in enumerate(zip(findings, slots)):
        if f.kind not in FINDING_KINDS:
            raise FindingError(i, f"{describe(f, i)}: kind must be one of {', '.join(FINDING_KINDS)}")
        if f.count < 1:
            raise FindingError(i, f"{describe(f, i)}: count must be at least 1")
        if f.kind == "added":
            added[k] += f.count
            if count[k] + added[k] > designed.max_count[k]:
                raise FindingError(i, f"{describe(f, i)}: rib {k + 1} takes at most {int(designed.max_count[k])} "
                                   f"stud(s) (flange width, AISC 360-22 I8.2d, job limit, keep-out zones)")
    waiting = np.zeros(count.size, dtype=int)
    for i, (f, k) in enumerate(zip(findings, slots)):
        if f.kind in LOSS_KINDS:
            (gone if f.kind in LEAVE_THE_RIB else dead)[k] += f.count
            waiting[k] += f.count if f.kind == "awaiting-test" else 0
            held = count[k] + added[k]
            if gone[k] + dead[k] > held:
                raise FindingError(i, f"{describe(f, i)}: rib {k + 1} holds {held} stud(s) "
                                   f"({count[k]} as designed, {added[k]} added); the findings there account for "
                                   f"{gone[k] + dead[k]}")
    for i, (f, k) in enumerate(zip(findings, slots)):
        if f.kind in RESOLVING_KINDS:
            held = count[k] + added[k]
            if f.count > held:
                raise FindingError(i, f"{describe(f, i)}: rib {k + 1} holds {held} stud(s) "
                                   f"({count[k]} as designed, {added[k]} added)")
            if f.kind == "bent-accepted":
                n = min(f.count, waiting[k])
                waiting[k] -= n
                dead[k] -= n
            else:
                back = min(f.count, gone[k])
                gone[k] -= back
                n = min(f.count - back, dead[k])
                dead[k] -= n
                waiting[k] = min(waiting[k], dead[k])  # awaiting-test cleared last
    effective = count + added - gone - dead
    for i, (f, k) in enumerate(zip(findings, slots)):
        if f.kind == "weak-side":
            if not perpendicular:
                raise FindingError(i, f"{describe(f, i)}: weak side applies to studs in deck ribs perpendicular "
                                   "to the beam (AISC 360-22 I8.2a); this beam has "
                                   + ("a solid slab" if beam.slab.deck is None else "parallel deck"))
            weak[k] += f.count
            if weak[k] > effective[k]:
                raise FindingError(i, f"{describe(f, i)}: rib {k + 1} has {effective[k]} working stud(s) left; "
                                   f"the weak-side findings there account for {weak[k]}")
    return RibState(count + added - gone, effective, weak, added)


def slot_strength(beam: BeamInput, designed: StudLayout, state: RibState) -> np.ndarray:
    """Shear strength of each slot (kip): effective studs times Q_n with R_g by the studs in the
    rib and R_p by side. Slots left as designed keep the designed Q_n.

    AISC 360-22 Eq. I8-1, R_g and R_p per I8.2a.
    """
    q_side = stud_qn(beam, state.in_rib, designed.position)
    q_weak = stud_qn(beam, state.in_rib, "weak")
    strength = (state.effective - state.weak) * q_side + state.weak * q_weak
    untouched = (state.in_rib == designed.count) & (state.effective == designed.count) & (state.weak == 0)
    # cast: numpy's stubs type arithmetic on np.ndarray as Any
    return cast(np.ndarray, np.where(untouched, designed.count * designed.qn, strength))


def state_layout(beam: BeamInput, designed: StudLayout, state: RibState) -> StudLayout:
    """The as-built layout: effective studs per slot and the mean strength of one of them."""
    strength = slot_strength(beam, designed, state)
    eff = state.effective
    qn = np.divide(strength, eff, out=np.zeros(eff.size), where=eff > 0)
    all_weak = (state.weak == eff) & (eff > 0)
    position = np.where(all_weak, "weak", designed.position)
    return StudLayout(designed.x, eff.copy(), position, qn, designed.max_count, designed.x_flip)


def longest_anchor_gap(beam: BeamInput, layout: StudLayout) -> tuple[float, float]:
    """Longest distance between working studs along the beam, supports included, and the
    station where that gap starts (in). AISC 360-22 I3.2c.1 (deck anchored at <= 18 in)."""
    x = np.sort(layout.x[layout.count > 0])
    if x.size == 0:
        return beam.span, 0.0
    points = np.concatenate(([0.0], x, [beam.span]))
    gaps = np.diff(points)
    k = int(np.argmax(gaps))
    return float(gaps[k]), float(points[k])


@dataclass(frozen=True, slots=True)
class AsBuiltResult:
    """The finished beam with the studs as built. `checks` are those of `evaluate_beam` plus deck
    anchorage by studs where the design relied on studs alone for it."""

    beam: BeamInput
    designed: StudLayout
    state: RibState
    layout: StudLayout
    result: BeamResult
    checks: tuple[Check, ...]
    flags: tuple[Flag, ...]
    anchor_gap: float
    designed_anchor_gap: float

    @property
    def verdict(self) -> Level:
        """pass / review / fail: the worst level of the checks."""
        return verdict_of(self.checks)

    @property
    def governing(self) -> Check:
        return governing_check(self.checks)

    @property
    def strength_ratio(self) -> np.ndarray:
        """Capacity over demand at every station (inf where there is no demand)."""
        cap, dem = self.result.capacity, self.result.demand
        # cast: numpy's stubs type ufunc results as Any
        return cast(np.ndarray, np.divide(cap, dem, out=np.full(dem.size, np.inf), where=dem > 0.0))

    @property
    def min_strength_ratio(self) -> tuple[float, float]:
        """(least capacity / demand along the span, its station in)."""
        ratio = self.strength_ratio
        k = int(np.argmin(ratio))
        return float(ratio[k]), float(self.result.x[k])

    @property
    def lost(self) -> np.ndarray:
        """Studs per slot that no longer work: as designed plus added, less those working."""
        # cast: numpy's stubs type arithmetic on np.ndarray as Any
        return cast(np.ndarray, self.designed.count + self.state.added - self.state.effective)


def assess(beam: BeamInput, designed: StudLayout, state: RibState, designed_gap: float | None = None) -> AsBuiltResult:
    """Evaluate the finished beam with the studs of `state` (one `evaluate_beam` call)."""
    layout = state_layout(beam, designed, state)
    result = evaluate_studs(beam, layout.groups())
    if designed_gap is None:
        designed_gap = longest_anchor_gap(beam, designed)[0]
    gap, start = longest_anchor_gap(beam, layout)
    checks = list(result.checks)
    flags = list(result.flags)
    if beam.slab.deck is not None and beam.orientation == "perpendicular":
        if designed_gap <= DECK_ANCHOR_SPACING_MAX + 1e-9:
            checks.append(Check("deck.anchorage", "deck anchorage by studs as built (max 18 in)", "AISC 360-22 I3.2c.1(d)",
                                gap, DECK_ANCHOR_SPACING_MAX, "in", station=start, kind="detailing"))
        elif gap > designed_gap + 1e-9:
            flags.append(Flag("AISC 360-22 I3.2c.1(d)", f"losses open a {gap:.1f} in gap between working studs from "
                              f"{format_ft_in(start)} (the design already relied on other deck anchors beyond "
                              f"{designed_gap:.1f} in): confirm the deck is anchored there"))
    return AsBuiltResult(beam, designed, state, layout, result, tuple(checks), tuple(flags), gap, designed_gap)


def evaluate_as_built(beam: BeamInput, designed: StudLayout, findings: tuple[Finding, ...] | None = None) -> AsBuiltResult:
    """The beam with the studs as the inspection found them (default: the beam's own findings)."""
    findings = beam.findings if findings is None else tuple(findings)
    state = apply_findings(beam, designed, findings)
    return assess(beam, designed, state)
