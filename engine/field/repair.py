"""Repair after a stud inspection: the fewest studs to add, in slots with room, that make every
check of the as-built beam pass again (each trial is `engine.field.as_built.assess`, one `evaluate_beam`).

Search: first the fewest studs that close every gap over the spacing limits (farthest reachable
slot, optimal on a line); then, one at a time, the stud that most reduces the shortfall (ties to
the slot nearest the deficit, then the emptier slot, so R_g stays high); then every stud the beam
passes without is taken out; then two studs are traded for one while the beam still passes.
Lower bound: at each station the studs left of it and those right of it are different studs, each
adding at most its best gain, against the slab force the station needs; and the gap studs. When
the repair meets the bound it is proven the fewest possible.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from itertools import combinations_with_replacement
from typing import cast

import numpy as np

from engine.codes.aisc360_22.i3_composite import DECK_ANCHOR_SPACING_MAX
from engine.studs.detailing import spacing_checks, spacing_limits
from engine.studs.evaluate import evaluate_studs
from engine.field.as_built import AsBuiltResult, RibState, assess, slot_strength, state_layout
from engine.model.inputs import BeamInput, Finding, Method
from engine.model.results import Level
from engine.finished.basis import available_strength, composite_strength, finished_basis
from engine.finished.slab_force import StudGroups, slab_force

_TOL = 1e-9


@dataclass(frozen=True, slots=True)
class Repair:
    """Studs to add per slot (`added`), the beam re-evaluated with them (`after`), the lower bound
    on any repair, whether the repair restores every check, options for the engineer of record
    when studs alone cannot (`alternatives`) and remarks on the repair (`notes`)."""

    added: np.ndarray
    after: AsBuiltResult
    lower_bound: int
    restores: bool
    alternatives: tuple[str, ...]
    notes: tuple[str, ...] = ()

    @property
    def total(self) -> int:
        return int(self.added.sum())

    @property
    def proven_fewest(self) -> bool:
        """True when no repair with fewer studs can exist (total equals the lower bound)."""
        return self.restores and self.total == self.lower_bound

    def as_findings(self) -> tuple[Finding, ...]:
        """The repair as "added" findings by rib number (to re-evaluate from scratch)."""
        return tuple(Finding("added", rib=int(k) + 1, count=int(n), note="repair")
                     for k, n in enumerate(self.added) if n > 0)


def shortfall(r: AsBuiltResult) -> float:
    """How far the beam is from passing: demand above capacity summed along the span (over the
    largest demand) plus every check's ratio above 1. Zero when every check passes."""
    cap, dem = r.result.capacity, r.result.demand
    top = float(dem.max()) if dem.size and dem.max() > 0.0 else 1.0
    over = float(np.maximum(dem - cap, 0.0).sum()) / top
    return over + sum(min(c.ratio - 1.0, 1e6) for c in r.checks if not c.passed)


def deficit_station(r: AsBuiltResult) -> float:
    """Where the as-built beam falls shortest: the governing check's station, else the point of
    maximum moment."""
    gov = r.governing
    return float(gov.station) if gov.station is not None else float(r.result.x[r.result.critical])


def _room(r: AsBuiltResult, state: RibState) -> np.ndarray:
    return cast(np.ndarray, np.maximum(r.designed.max_count - state.in_rib, 0))  # cast: numpy's stubs type ufunc results as Any


def _gains(r: AsBuiltResult, state: RibState) -> list[np.ndarray]:
    """For each slot, what each further stud it has room for adds (kip), in the order added."""
    room = _room(r, state)
    levels = [slot_strength(r.beam, r.designed, state.with_added(np.minimum(room, a)))
              for a in range(int(room.max(initial=0)) + 1)]
    steps = np.diff(np.array(levels), axis=0)
    return [steps[: room[k], k] for k in range(room.size)]


def _flat_groups(beam: BeamInput, t: float) -> StudGroups:
    """Two groups of t kip at the supports: C(x) = t at every station inside the span."""
    return StudGroups(np.array([0.0, beam.span]), np.array([1, 1]), np.array([t, t]))


def _flat_flexure(r: AsBuiltResult, ts: np.ndarray) -> np.ndarray:
    """Where flexure passes (trials x stations) with C(x) = t inside the span, every t of `ts` at
    once: the arithmetic of the flexure check of `evaluate_studs` (slab force, plastic strength
    for it, phi Mn or Mn / Omega against the demand; AISC 360-22 I3.2a, I3.2d.1) on a
    (trials x stations) array, elementwise, so each row is that check's own result."""
    beam = r.beam
    basis = finished_basis(beam)
    c = np.array([slab_force(basis.x, _flat_groups(beam, float(t)), basis.limits.cf)[0] for t in ts])
    capacity = available_strength(beam, composite_strength(beam, basis.limits, c).mn)
    demand = basis.demand.mu if beam.method == Method.LRFD else basis.demand.ma
    return cast(np.ndarray, demand[None, :] <= capacity * (1.0 + _TOL))  # cast: numpy's stubs type comparisons as Any


def _flat_others(r: AsBuiltResult, t: float) -> bool:
    """Whether the stud-dependent checks other than flexure and the spacing pass with C(x) = t."""
    beam = r.beam
    groups = _flat_groups(beam, t)
    trial = evaluate_studs(beam, groups)
    geometric = {c.id for c in spacing_checks(beam, groups)[0]}
    return all(c.passed for c in trial.checks if c.id not in geometric and c.id != "flexure.composite")


def slab_force_needed(r: AsBuiltResult, deficient: np.ndarray, levels: int = 32) -> np.ndarray | None:
    """Slab force (kip) each station must exceed (-1 where any will do): flexure everywhere, and
    at the point of maximum moment also degree of composite and deflection. None when even C_f is
    not enough. `deficient` stations are resolved to C_f / 512, the others to C_f / 32.

    Found with the finished-beam evaluation itself (AISC 360-22 I3.2a, I3.2d.1, Commentary I3.2)
    on a grid of flat slab forces, flexure for the whole grid at once (`_flat_flexure`); the value
    kept is the highest level that still fails, never overstating. The other checks are
    evaluated from the lowest level up to the first that passes them.
    """
    ts = np.linspace(0.0, r.result.cf, levels + 1)
    flexure_ok = _flat_flexure(r, ts)
    if not (flexure_ok[-1].all() and _flat_others(r, float(ts[-1]))):
        return None
    first = np.argmax(flexure_ok, axis=0)
    need = np.where(first == 0, -1.0, ts[np.maximum(first - 1, 0)])
    for i in np.unique(first[deficient & (first > 0)]):
        here = deficient & (first == i)
        finer = np.linspace(ts[i - 1], ts[i], 17)[1:-1]
        for t, ok in zip(finer, _flat_flexure(r, finer)):
            fails = here & ~ok
            need[fails] = np.maximum(need[fails], t)
    j = next(i for i in range(ts.size) if _flat_others(r, float(ts[i])))  # the first level passing them
    serve = -1.0
    if j > 0:
        lo, hi = float(ts[j - 1]), float(ts[j])
        while hi - lo > 1e-3 * r.result.cf / levels:
            mid = 0.5 * (lo + hi)
            lo, hi = (lo, mid) if _flat_others(r, mid) else (mid, hi)
        serve = lo
    k = r.result.critical
    need[k] = max(need[k], serve)
    return need


def strength_bound(r: AsBuiltResult, need: np.ndarray) -> int | None:
    """Fewest studs the strength, composite and deflection checks need (see the module note);
    None when every slot with room filled is still not enough."""
    _, left, right = slab_force(r.result.x, r.layout.groups(), r.result.cf)
    gains = _gains(r, r.state)
    x, stations = r.designed.x, r.result.x
    bound = 0
    for i in np.flatnonzero((left <= need + _TOL) | (right <= need + _TOL)):
        studs = 0
        for have, side in ((left[i], x <= stations[i]), (right[i], x >= stations[i])):
            short = need[i] - have
            if short < -_TOL:
                continue
            best = np.sort(np.concatenate([np.zeros(0)] + [gains[k] for k in np.flatnonzero(side)]))[::-1]
            enough = np.flatnonzero(np.cumsum(best) > short + _TOL)
            if enough.size == 0:
                return None
            studs += int(enough[0]) + 1
        bound = max(bound, studs)
    return bound


def gap_limits(beam: BeamInput, designed_gap: float) -> tuple[float, float]:
    """(longest distance allowed between neighbouring working studs, from a support to the nearest
    one), in. AISC 360-22 I8.2d (max spacing min(8 t, 36 in)); where the design anchored the
    deck by studs alone, I3.2c.1 (18 in, supports included)."""
    between, ends = spacing_limits(beam)[1], float("inf")
    perpendicular = beam.slab.deck is not None and beam.orientation == "perpendicular"
    if perpendicular and designed_gap <= DECK_ANCHOR_SPACING_MAX + _TOL:
        between, ends = min(between, DECK_ANCHOR_SPACING_MAX), DECK_ANCHOR_SPACING_MAX
    return between, ends


def cover_gaps(r: AsBuiltResult, state: RibState) -> np.ndarray | None:
    """Fewest studs per slot that bring every gap within `gap_limits` (each new stud in the
    farthest slot with room that the limit reaches, optimal on a line); None if no slot reaches."""
    x, beam = r.designed.x, r.beam
    between, ends = gap_limits(beam, r.designed_anchor_gap)
    room = _room(r, state)
    add = np.zeros(x.size, dtype=int)
    studs = list(np.sort(x[state.effective > 0]))
    if not studs and not np.isfinite(ends):
        return add
    cur, at_support = (0.0, True) if np.isfinite(ends) else (studs.pop(0), False)
    targets = studs + ([beam.span] if np.isfinite(ends) else [])
    for t, target in enumerate(targets):
        last = t == len(targets) - 1 and np.isfinite(ends)
        while target - cur > (ends if (at_support or last) else between) + _TOL:
            reach = cur + (ends if at_support else between)
            ok = np.flatnonzero((room - add > 0) & (x > cur + _TOL) & (x <= reach + _TOL) & (x < target - _TOL))
            if ok.size == 0:
                return None
            k = int(ok[np.argmax(x[ok])])
            add[k] += 1
            cur, at_support = float(x[k]), False
        cur, at_support = float(target), False
    return add


def find_repair(before: AsBuiltResult, max_studs: int = 200) -> Repair:
    """The fewest added studs the search finds (see the module note) that restore the beam: every
    check that passes as designed passes again (a review the design itself carries stays the
    engineer of record's), placed where the envelope falls short."""
    beam, designed = before.beam, before.designed
    zero = np.zeros(designed.x.size, dtype=int)
    as_designed = assess(beam, designed, RibState(designed.count, designed.count, zero, zero))
    if as_designed.verdict == Level.FAIL:
        return Repair(zero, before, 0, False, _alternatives(as_designed, "design-fails"))
    passing = frozenset(c.id for c in as_designed.checks if c.passed)

    def restored(r: AsBuiltResult) -> bool:
        return all(c.passed for c in r.checks if c.id in passing) and r.verdict != Level.FAIL

    if restored(before):
        return Repair(zero, before, 0, True, ())
    deficient = before.strength_ratio < 1.0
    deficient[before.result.critical] = True
    need = slab_force_needed(before, deficient)
    bound = None if need is None else strength_bound(before, need)
    cover = cover_gaps(before, before.state)
    if bound is None or cover is None:
        return Repair(zero, before, 0, False, _alternatives(before, "no-room" if cover is None else "studs-cannot"))
    bound = max(bound, int(cover.sum()), 1)  # the beam fails as built: at least one stud
    near = np.abs(designed.x - deficit_station(before))

    def trial(added: np.ndarray) -> AsBuiltResult:
        return assess(beam, designed, before.state.with_added(added), before.designed_anchor_gap)

    def may_pass(added: np.ndarray) -> bool:
        """Cheap screen: False only when the beam surely fails (a station at or below its need,
        or a gap still open)."""
        state = before.state.with_added(added)
        c, _, _ = slab_force(before.result.x, state_layout(beam, designed, state).groups(), before.result.cf)
        gaps = cover_gaps(before, state)
        # cast: need is not None here (it is None only when bound is, and then find_repair returned)
        return bool(np.all((c > need) | (cast(np.ndarray, need) < 0.0))) and gaps is not None and gaps.sum() == 0

    k: int | np.intp  # a slot index, from np.flatnonzero and then from `scored`
    added, current = cover, trial(cover)
    while not restored(current) and added.sum() < max_studs:
        room = _room(before, before.state.with_added(added))
        scored = []
        for k in np.flatnonzero(room > 0):
            one = added.copy()
            one[k] += 1
            r = trial(one)
            scored.append((shortfall(r), float(near[k]), int(before.state.in_rib[k] + added[k]), int(k), r))
        if not scored or min(scored, key=lambda s: s[:4])[0] >= shortfall(current) - _TOL:
            return Repair(zero, before, bound, False, _alternatives(before, "no-room"))
        _, _, _, k, current = min(scored, key=lambda s: s[:4])
        added = added.copy()
        added[k] += 1
    added = _prune(trial, restored, added, near)
    added = _trade(trial, restored, may_pass, before, added, bound, near)
    after = trial(added)
    notes: tuple[str, ...] = ()
    if cover.sum() and np.isfinite(gap_limits(beam, before.designed_anchor_gap)[1]):
        notes = ("studs added to close deck-anchorage gaps (AISC 360-22 I3.2c.1, 18 in) may be replaced by "
                 "puddle welds or other anchors the project specifies, if the engineer of record accepts",)
    return Repair(added, after, bound, restored(after), (), notes)


def _prune(trial: Callable[[np.ndarray], AsBuiltResult], restored: Callable[[AsBuiltResult], bool],
           added: np.ndarray, near: np.ndarray) -> np.ndarray:
    """Take out, farthest from the deficit first, every added stud the beam passes without."""
    added = added.copy()
    for k in sorted(np.flatnonzero(added), key=lambda k: -near[k]):
        while added[k] > 0:
            added[k] -= 1
            if not restored(trial(added)):
                added[k] += 1
                break
    return added


def _trade(trial: Callable[[np.ndarray], AsBuiltResult], restored: Callable[[AsBuiltResult], bool],
           may_pass: Callable[[np.ndarray], bool], before: AsBuiltResult, added: np.ndarray, bound: int,
           near: np.ndarray) -> np.ndarray:
    """Replace two added studs by one, nearest the deficit first, while the beam still passes."""
    improved = True
    while improved and int(added.sum()) > bound:
        improved = False
        for i, j in combinations_with_replacement(np.flatnonzero(added), 2):
            fewer = added.copy()
            fewer[i] -= 1
            fewer[j] -= 1
            if fewer.min() < 0:
                continue
            room = _room(before, before.state.with_added(fewer))
            for k in sorted(np.flatnonzero(room > 0), key=lambda k: near[k]):
                one = fewer.copy()
                one[k] += 1
                if may_pass(one) and restored(trial(one)):
                    added, improved = one, True
                    break
            if improved:
                break
    return added


def _alternatives(before: AsBuiltResult, why: str) -> tuple[str, ...]:
    """Options for the engineer of record when added studs alone do not restore the beam."""
    failing = ", ".join(c.name for c in before.checks if not c.passed)
    if why == "design-fails":
        out = [f"the layout as designed already fails: {failing}; the design needs the engineer of record "
               "before any field repair"]
    elif why == "studs-cannot":
        out = [f"studs in every slot with room would still leave failing: {failing}; consider a heavier "
               "section, strengthening the beam, or reduced loads (engineer of record)"]
    else:
        room = _room(before, before.state)
        closed = np.flatnonzero(before.designed.max_count == 0)
        nearest = closed[np.argsort(np.abs(before.designed.x[closed] - deficit_station(before)))][:3] + 1
        outside = (f"studs in ribs outside the layout (keep-out or too close: nearest {', '.join(map(str, nearest))}) "
                   "if the connection detail allows, or " if nearest.size else "")
        out = [f"the {int((room > 0).sum())} rib(s) with room (at most {int(before.designed.max_count.max(initial=0))} "
               f"studs per rib) cannot restore: {failing}; consider {outside}a heavier section (engineer of record)"]
    if (before.state.in_rib > before.state.effective).any():
        out.append("failed or short studs still occupy their ribs: removing and replacing them in place "
                   "(AWS D1.1, stud welding clause) frees room the count above does not assume")
    return tuple(out)
