"""Placing studs in the slots of a beam, half by half.

The slab force needed at every station is the least C with phi Mn(C) >= Mu (AISC 360-22 I3.2a),
at least 25 % of C_f at the maximum moment (Commentary I3.2d, common practice). Each half runs
from an end to the maximum moment; slots are taken from that end, and the studs' cumulative
strength from the end must cover the force needed at every station up to the far end: this is
I3.2d.1 / I8.2c (between the maximum moment, each concentrated load and the nearest zero-moment
point) applied station by station, as `engine.finished.slab_force.slab_force` evaluates it.

Within a half: singles first, spread evenly over the half (I8.2d: uniform unless the drawings say
otherwise) but never later than the need allows; when singles in every slot are not enough, the
slots nearest the end take doubles, then triples. A beam whose loads are symmetric gets a
symmetric layout because both halves are filled by the same rule from their own end.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import lru_cache
from typing import cast

import numpy as np

from engine.codes.aisc360_22.i3_composite import plastic_moment
from engine.codes.practice import MIN_COMPOSITE
from engine.studs.detailing import spacing_limits
from engine.finished.basis import available_strength, composite_strength, finished_basis, method_strength
from engine.finished.slip import slip_floor
from engine.model.inputs import BeamInput, Method
from engine.model.shapes import WShape

_TOL = 1e-9
_C_GRID = 257  # slab forces tabulated between 0 and the topping limit to invert phi Mn(C)


@dataclass(frozen=True, slots=True)
class Need:
    """Slab force needed along the span. x: stations (in); demand: Mu or Ma (kip-in);
    c_req: least slab force with capacity >= demand (kip); short: stations where even full
    composite action falls short; x_max: station of the maximum moment (middle of a plateau)."""

    x: np.ndarray
    demand: np.ndarray
    c_req: np.ndarray
    short: np.ndarray
    x_max: float


def slab_force_needed(beam: BeamInput) -> Need:
    """The least slab force C(x) with available strength >= demand at every station.

    AISC 360-22 I3.2a (phi Mn of the plastic distribution for C), I3.2d.1; Mn grows with C, so
    C is found by inverting a table of phi Mn(C) (linear inverse; then raised where short).
    The demand is the beam's `moment_demand` at its stations (`finished_basis`), which include
    the point loads' stations, so the force each needs is taken at the load itself (I8.2c).
    """
    basis = finished_basis(beam)
    x, mu, ma = basis.x, basis.demand.mu, basis.demand.ma
    demand = mu if beam.method == Method.LRFD else ma
    top = float(demand.max())  # the maximum on the evaluation grid (point-load stations included)
    lim = basis.limits
    grid, cap = _capacity_table(beam.shape, beam.fy, beam.slab.fc_ksi, lim.b_eff, beam.slab.total_thickness,
                                lim.c_block, beam.method)
    c_req = np.interp(demand, cap, grid)
    low = available_strength(beam, composite_strength(beam, lim, c_req).mn) < demand * (1.0 - _TOL)
    if low.any():  # where the chord undershoots, take the next tabulated force up
        c_req[low] = grid[np.minimum(np.searchsorted(cap, demand[low], side="left"), grid.size - 1)]
    short = demand > cap[-1] * (1.0 + _TOL)
    peak = np.flatnonzero(demand >= top * (1.0 - _TOL)) if top > 0.0 else np.array([x.size // 2])
    x_max = 0.5 * float(x[peak[0]] + x[peak[-1]])
    floor = MIN_COMPOSITE * lim.cf
    if beam.studs.count is None:  # a design layout also meets the slip-capacity rules (I3.2d.1)
        floor = max(floor, slip_floor(beam, basis, basis.demand.mu if beam.method == Method.LRFD else basis.demand.ma))
    c_req[peak] = np.maximum(c_req[peak], floor)
    return Need(x, demand, c_req, short, x_max)


@lru_cache(maxsize=256)
def _capacity_table(shape: WShape, fy: float, fc: float, b_eff: float, y_con: float, c_block: float,
                    method: str) -> tuple[np.ndarray, np.ndarray]:
    """Slab forces 0..c_block and the available strength with each (made non-decreasing), once per
    section and method (read-only). AISC 360-22 I3.2a, via `engine.finished.evaluate.composite_strength`."""
    grid = np.linspace(0.0, c_block, _C_GRID)
    mn = plastic_moment(np.minimum(grid, c_block), shape, fy, fc, b_eff, y_con).mn
    cap = np.maximum.accumulate(method_strength(method, mn))
    for values in (grid, cap):
        values.flags.writeable = False
    return grid, cap


def half_needs(p: np.ndarray, xs: np.ndarray, c_req: np.ndarray) -> tuple[np.ndarray, float]:
    """Cumulative force needed through each slot of a half, and before its first slot.

    p: slot distances from the half's end (ascending); xs: station distances from that end;
    slot j must cover the stations after it up to the next slot (a station on a slot is taken
    as before it: conservative, since `slab_force` counts half a slot there).
    """
    j = np.searchsorted(p, xs - 1e-6, side="left") - 1
    need = np.zeros(p.size)
    after = j >= 0
    np.maximum.at(need, j[after], c_req[after])
    before = float(c_req[~after].max()) if (~after).any() else 0.0
    return need, before


def _meets(strength: np.ndarray, need: np.ndarray) -> bool:
    return bool((np.cumsum(strength) >= need - _TOL * np.maximum(need, 1.0)).all())


def level_arrangement(cap: np.ndarray, per_slot: np.ndarray, need: np.ndarray) -> np.ndarray | None:
    """Studs per slot when every slot takes L studs and the u slots nearest the end L + 1, for
    the least (L, u) that covers `need`; None when full slots cannot. `per_slot[c]` is the
    strength of a slot holding c studs."""
    n = cap.size
    order = np.arange(n)
    for level in range(1, int(cap.max(initial=0)) + 1):
        low, high = np.minimum(level, cap), np.minimum(level + 1, cap)

        def arrangement(u: int) -> np.ndarray:
            # cast: np.minimum (low, high) is Any in numpy's stubs; B023: it is called only within this iteration
            return cast(np.ndarray, np.where(order < u, high, low))  # noqa: B023

        if _meets(per_slot[arrangement(0)], need):
            return arrangement(0)
        if not _meets(per_slot[arrangement(n)], need):
            continue
        lo, hi = 0, n  # fails at lo, meets at hi
        while hi - lo > 1:
            mid = (lo + hi) // 2
            lo, hi = (lo, mid) if _meets(per_slot[arrangement(mid)], need) else (mid, hi)
        return arrangement(hi)
    return None


def spread_singles(p: np.ndarray, free: np.ndarray, k: int, length: float,
                   deadline_need: np.ndarray | None) -> np.ndarray | None:
    """Indices (into p) of k singles among the `free` slots, as even as the slots allow over
    `length` (targets at (i + 1/2) length / k from the end), the i-th no later than the first
    slot where `deadline_need` (singles needed through each free slot) reaches i + 1. None when
    the deadlines cannot all be met."""
    m = free.size
    if k == 0:
        return np.empty(0, dtype=int)
    if k > m:
        return None
    pos = p[free]
    targets = (np.arange(k) + 0.5) * length / k
    snap = np.clip(np.searchsorted(pos, targets), 0, m - 1)
    prev = np.maximum(snap - 1, 0)
    snap = np.where(np.abs(pos[prev] - targets) <= np.abs(pos[snap] - targets) + 1e-7, prev, snap)
    i = np.arange(k)
    s = i + np.maximum.accumulate(snap - i)  # strictly increasing, as near the targets as possible
    if deadline_need is not None and deadline_need.size:
        run = np.maximum.accumulate(deadline_need)
        s = np.minimum(s, np.searchsorted(run, i + 1, side="left"))
    s = np.minimum(s, m - 1)
    s = i + np.minimum.accumulate((s - i)[::-1])[::-1]  # pull earlier studs back to stay increasing
    return free[s] if s[0] >= 0 else None


def fill_half(p: np.ndarray, cap: np.ndarray, per_slot: np.ndarray, need: np.ndarray, length: float,
              target: int | None, least: int = 0) -> np.ndarray:
    """Studs per slot of one half. `target` None: the fewest that cover `need` (at least `least`
    singles for spacing), else exactly `target` studs (or as many as fit), placed the same way.
    Full slots when even that cannot cover `need` (the caller reports the shortfall)."""
    n = p.size
    counts = np.zeros(n, dtype=int)
    if n == 0:
        return counts
    if target is not None and target > int((cap >= 1).sum()):  # singles everywhere, then doubles from the end
        steps = [j for level in range(1, int(cap.max()) + 1) for j in range(n) if cap[j] >= level]
        np.add.at(counts, np.array(steps[:target], dtype=int), 1)
        return counts
    fixed = np.zeros(n, dtype=bool)
    if target is None:
        base = level_arrangement(cap, per_slot, need)
        if base is None:
            return cap.astype(int).copy()
        fixed = base > 1
        counts[fixed] = base[fixed]
    free = np.flatnonzero(~fixed & (cap >= 1))
    fixed_sum = np.cumsum(np.where(fixed, per_slot[np.minimum(counts, per_slot.size - 1)], 0.0))
    single = per_slot[1]
    rest = np.maximum(need - fixed_sum, 0.0)[free] if free.size else np.empty(0)
    needed = np.ceil(rest / single - 1e-9).astype(int) if single > 0 else np.zeros(free.size, dtype=int)
    if target is None:
        k = max(int(needed.max(initial=0)), least - int(fixed.sum()), 0)
        while k <= free.size:
            chosen = spread_singles(p, free, k, length, needed)
            if chosen is not None:
                break
            k += 1
        else:
            chosen = free
    else:
        k = min(target, free.size)
        chosen = spread_singles(p, free, k, length, np.minimum(needed, k))
        if chosen is None:
            chosen = spread_singles(p, free, k, length, None)
    counts[chosen] += 1
    return counts


@dataclass(frozen=True, slots=True)
class Slots:
    """The beam's slots and what a stud in them is worth: stations `x`, `cap` (max studs),
    position words, `per_slot[c]` strength of a slot holding c studs (kip)."""

    x: np.ndarray
    cap: np.ndarray
    words: np.ndarray
    per_slot: np.ndarray


@dataclass(frozen=True, slots=True)
class Arrangement:
    """Studs per slot and what the halves could not meet: `before` force needed ahead of the
    first usable slot of each half, `full` halves whose full slots fall short, `gaps` spacings
    over the limit that no empty slot can split (station, gap)."""

    counts: np.ndarray
    before: tuple[float, float]
    full: tuple[bool, bool]
    gaps: tuple[tuple[float, float], ...]


def arrange(beam: BeamInput, need: Need, slots: Slots, total: int | None) -> Arrangement:
    """Studs per slot for the whole beam: `total` studs (the drawings), or None for the fewest
    that cover `need`; design layouts then get singles in spacings over the I8.2d maximum."""
    x, cap, per_slot = slots.x, slots.cap, slots.per_slot
    tol = 1e-6 * beam.span
    counts = np.zeros(x.size, dtype=int)
    usable = cap > 0
    middle = np.flatnonzero(usable & (np.abs(x - need.x_max) <= tol))
    targets: list[int | None] = [None, None]
    if total is not None:
        rest = total
        if total % 2 and middle.size:
            counts[middle[0]] = 1
            rest -= 1
        targets = [rest - rest // 2, rest // 2]
    smax = spacing_limits(beam)[1]
    before, full = [0.0, 0.0], [False, False]
    for h, side in enumerate((usable & (x < need.x_max - tol), usable & (x > need.x_max + tol))):
        idx = np.flatnonzero(side)
        if h == 0:
            p, xs, c, length = x[idx], need.x, need.c_req, need.x_max
        else:
            idx = idx[::-1]
            p, xs, c, length = beam.span - x[idx], beam.span - need.x[::-1], need.c_req[::-1], beam.span - need.x_max
        demand, before[h] = half_needs(p, xs, c)
        least = math.ceil(length / smax - 1e-9) if total is None else 0
        got = fill_half(p, cap[idx], per_slot, demand, length, targets[h], least)
        full[h] = total is None and not _meets(per_slot[got], demand)
        counts[idx] = got
    gaps: tuple[tuple[float, float], ...] = ()
    if total is None:
        counts, gaps = close_gaps(x, cap, counts, smax, need.x_max)
    return Arrangement(counts, (before[0], before[1]), (full[0], full[1]), gaps)


def close_gaps(x: np.ndarray, cap: np.ndarray, counts: np.ndarray, smax: float,
               x_max: float) -> tuple[np.ndarray, tuple[tuple[float, float], ...]]:
    """Add singles in empty slots nearest the middle of each spacing over `smax` (AISC 360-22
    I8.2d); ties go to the slot nearer the maximum moment (both, if still tied). Returns the
    counts and the gaps that no empty slot can split."""
    counts = counts.copy()
    stuck: list[tuple[float, float]] = []
    while True:
        occ = np.flatnonzero(counts > 0)
        gaps = np.diff(x[occ])
        over = [i for i in np.flatnonzero(gaps > smax + 1e-9) if float(x[occ[i]]) not in {s for s, _ in stuck}]
        if not over:
            return counts, tuple(stuck)
        a, b = occ[over[0]], occ[over[0] + 1]
        inside = np.arange(a + 1, b)
        inside = inside[(cap[inside] > 0) & (counts[inside] == 0)]
        if inside.size == 0:
            stuck.append((float(x[a]), float(x[b] - x[a])))
            continue
        to_mid = np.abs(x[inside] - 0.5 * (x[a] + x[b]))
        to_max = np.abs(x[inside] - x_max)
        best = to_mid <= to_mid.min() + 1e-6
        best &= to_max <= to_max[best].min() + 1e-6
        counts[inside[best]] = 1  # a tie straddling the maximum moment takes both, for symmetry
