"""The bay through the pour: beams and the girders their ends rest on, solved together step by step.

A girder's deflection at a bearing lowers that beam end, so the beam's support line sags with it.
Struck off level with the columns, the concrete over a beam is deeper by the beam's own sag plus
that line (less the cambers): gamma_c b (y + settlement line - camber) (level screed after Ruddy,
"Ponding of Concrete Deck Floors", AISC Engineering Journal 23(3), 1986; engine.mechanics.ponding).
The beam's reactions, ponded concrete included, load the girder, whose deflection is the
settlement. On each pour day the bearing drops d solve the linear system

    (I - F B) d = g0 + F R0,

F: the girders' flexibility between bearings (with their own ponding), B: the change of each
beam's reactions with its end drops (through the concrete that ponds into the settlement line),
g0 and R0 the girders' drops and the beams' reactions at d = 0. F and B are non-negative, so
(Perron-Frobenius) an equilibrium with positive drops exists exactly when the spectral radius of
F B is under 1; otherwise the bay is unstable and PondingInstabilityError is raised.

Every member is taken on the bare steel (AISC 360-22 I3.1b); steps of one member on one day are
placed together. Statics of simple spans (engine.mechanics.statics).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import cast

import numpy as np

from engine.bay.inputs import Bearing
from engine.codes.aisc360_22.i1_materials import E_STEEL
from engine.construction.pours import PourPlan, Step
from engine.mechanics.ponding import camber_shape, level_deflections, line_load_effects
from engine.mechanics.statics import (
    Load, PointLoad, PondingInstabilityError, deflection_rows, ponded_rows, reactions, shear_moment,
)
from engine.model.inputs import BeamInput

ERECTION = "steel and deck"


@dataclass(frozen=True, slots=True)
class MemberRun:
    """One member through the level's steps (rows: the level's steps, erection first).

    dead (T, n): its own deflection added by each step (in, down +), ponding included;
    settle (T, 2): drop of its two ends added by each step (the girders' deflection there; 0 on a
    column); reaction (T, 2, 3): per step and end, the beam's reaction split as (nominal lasting
    load, ponded concrete, construction live load) (kip, up +); ponded_own / ponded_settle (T,):
    concrete ponded into its own sag / into the settlement line (kip); first_step (n,): the step
    that first placed concrete at each station; level_placed (n,): struck off level there."""

    mark: str
    x: np.ndarray
    span: float
    camber: float
    dead: np.ndarray
    settle: np.ndarray
    reaction: np.ndarray
    ponded_own: np.ndarray
    ponded_settle: np.ndarray
    first_step: np.ndarray
    level_placed: np.ndarray
    end_lift: tuple[float, float]  # the girders' camber at the two ends (in)
    names: tuple[str, ...]  # its own stages placed in each step ("" when none)

    def sag(self) -> np.ndarray:
        """Deflection below the line of the columns after each step (T, n): its own plus the
        settlement line between its ends (in, before camber)."""
        line = np.cumsum(self.settle, axis=0)
        t = self.x / self.span
        return cast(np.ndarray, np.cumsum(self.dead, axis=0) + line[:, :1] * (1.0 - t) + line[:, 1:] * t)

    def lift(self) -> np.ndarray:
        """Camber of the member plus the line between its ends' girder cambers (in, up +)."""
        t = self.x / self.span
        return cast(np.ndarray, self.camber * camber_shape(self.x, self.span)
                    + self.end_lift[0] * (1.0 - t) + self.end_lift[1] * t)


@dataclass(frozen=True, slots=True)
class BaySolution:
    """The level's steps (names and days) and each member's run, in the order given."""

    steps: tuple[str, ...]
    days: tuple[float, ...]
    members: tuple[MemberRun, ...]

    def member(self, mark: str) -> MemberRun:
        return next(m for m in self.members if m.mark == mark)


def timeline(plans: dict[str, PourPlan]) -> tuple[tuple[str, ...], tuple[float, ...]]:
    """Erection, then one step per pour day of any member, named by the stages placed that day."""
    days = sorted({s.day for p in plans.values() for s in p.steps[1:]})
    names = [", ".join(dict.fromkeys(s.name for p in plans.values() for s in p.steps[1:] if s.day == d)) for d in days]
    return (ERECTION, *names), (float("nan"), *days)


def _day_steps(plan: PourPlan, day: float | None) -> list[Step]:
    return [plan.steps[0]] if day is None else [s for s in plan.steps[1:] if s.day == day]


def solve_bay(members: tuple[BeamInput, ...], plans: dict[str, PourPlan], bearings: tuple[Bearing, ...],
              cambers: dict[str, float]) -> BaySolution:
    """Every member step by step with the bearing drops solved on each pour day (module docstring).
    `members`: the beams and girders of the bay; girders carry none of the framing beams' derived
    point loads (those are what this solves). `cambers`: camber ordered per mark (in)."""
    names, days = timeline(plans)
    girders = {b.girder for b in bearings}
    by_mark = {m.mark: m for m in members}
    states = {m.mark: _State(m, plans[m.mark], cambers.get(m.mark, 0.0), len(names)) for m in members}
    for m in members:  # girder cambers lift the beam ends
        lift = [0.0, 0.0]
        for b in bearings:
            if b.beam == m.mark:
                g = by_mark[b.girder]
                lift[b.end] = cambers.get(g.mark, 0.0) * float(camber_shape(np.array([b.at]), g.span)[0])
        states[m.mark].end_lift = (lift[0], lift[1])
    for t, day in enumerate(days):
        today = None if t == 0 else day
        beam_parts = {m.mark: states[m.mark].beam_step(_day_steps(plans[m.mark], today), bearings, t)
                      for m in members if m.mark not in girders}
        girder_parts = {g: states[g].girder_step(_day_steps(plans[g], today), bearings, t) for g in girders}
        drops = _drops(bearings, beam_parts, girder_parts)
        for m in members:
            if m.mark in girders:
                states[m.mark].finish_girder(girder_parts[m.mark], bearings, beam_parts, drops, t)
            else:
                states[m.mark].finish_beam(beam_parts[m.mark], bearings, drops, t)
    return BaySolution(names, days, tuple(states[m.mark].run() for m in members))


@dataclass(slots=True)
class _BeamStep:
    y0: np.ndarray  # own deflection at zero drops
    y_unit: np.ndarray  # (2, n) own deflection per unit drop of each end
    r0: np.ndarray  # (2,) lasting reactions at zero drops (nominal + ponded)
    r_nominal: np.ndarray  # (2,) reactions of the nominal loads
    r_unit: np.ndarray  # (2, 2): reactions [end] per unit drop of [end2]
    live: np.ndarray  # (2,) construction live reactions
    extra0: np.ndarray  # ponded line load at zero drops
    extra_unit: np.ndarray  # (2, n) per unit drop
    own_k: np.ndarray  # ponding stiffness of the step


@dataclass(slots=True)
class _GirderStep:
    x: np.ndarray
    g0: np.ndarray
    unit: dict[int, np.ndarray]  # bearing index -> deflection under a unit load there
    known: np.ndarray  # ponded load on the sag so far
    k: np.ndarray  # ponding stiffness of the step


class _State:
    """A member's running state through the steps (mutable, private to solve_bay)."""

    def __init__(self, member: BeamInput, plan: PourPlan, camber: float, count: int) -> None:
        n = plan.x.size
        self.member, self.plan, self.camber = member, plan, camber
        self.x, self.span = plan.x, plan.span
        self.ei = np.full(n, E_STEEL * member.shape.ix)
        self.so_far, self.settled = np.zeros(n), np.zeros(2)
        self.end_lift = (0.0, 0.0)
        self.dead, self.settle = np.zeros((count, n)), np.zeros((count, 2))
        self.reaction = np.zeros((count, 2, 3))
        self.ponded_own, self.ponded_settle = np.zeros(count), np.zeros(count)
        self.first, self.level = np.full(n, count - 1), np.zeros(n, dtype=bool)
        self.placed = np.zeros(n, dtype=bool)
        self.names = [""] * count

    def _lift(self) -> np.ndarray:
        t = self.x / self.span
        return cast(np.ndarray, self.camber * camber_shape(self.x, self.span)
                    + self.end_lift[0] * (1.0 - t) + self.end_lift[1] * t)

    def _line(self, ends: np.ndarray) -> np.ndarray:
        t = self.x / self.span
        return cast(np.ndarray, ends[..., :1] * (1.0 - t) + ends[..., 1:] * t)

    def _mark_placed(self, steps: list[Step], t: int) -> None:
        self.names[t] = ", ".join(dict.fromkeys(s.name for s in steps))
        for step in steps:
            new = (step.placed.max(axis=0) >= 0.5) & ~self.placed
            self.first[new], self.level[new] = t, step.level
            self.placed |= new

    def beam_step(self, steps: list[Step], bearings: tuple[Bearing, ...], t: int) -> _BeamStep:
        x, span, n = self.x, self.span, self.x.size
        self._mark_placed(steps, t)
        loads: list[Load] = [ld for s in steps for ld in s.dead]
        live: list[Load] = [ld for s in steps for ld in s.live]
        k = np.sum([s.k for s in steps], axis=0) if steps else np.zeros(n)
        ponds = bool(any(s.level for s in steps))
        moment = shear_moment(x, span, loads)[1]
        nominal = np.array(reactions(span, loads))
        lv = np.array(reactions(span, live)) if live else np.zeros(2)
        if not ponds:
            y0 = deflection_rows(x, (moment / self.ei)[None, :])[0]
            zero = np.zeros((2, n))
            return _BeamStep(y0, zero, nominal, nominal, np.zeros((2, 2)), lv, np.zeros(n), zero, k)
        known = k * (self.so_far + self._line(self.settled) - self._lift())
        y0 = level_deflections(x, span, loads, known[None, :], k, self.ei, moment)[0]
        rests = [any(b.beam == self.member.mark and b.end == e for b in bearings) for e in (0, 1)]
        basis = np.stack([k * (1.0 - x / span) * rests[0], k * (x / span) * rests[1]])
        y_unit = np.zeros((2, n))
        if basis.any():
            y_unit = level_deflections(x, span, (), basis, k, self.ei, np.zeros(n))
        extra0, extra_unit = known + k * y0, basis + k * y_unit
        v0 = line_load_effects(x, extra0)[0]
        vu = line_load_effects(x, extra_unit)[0]
        r_unit = np.stack([vu[:, 0], -vu[:, -1]])  # [end][unit drop of end2]
        return _BeamStep(y0, y_unit, nominal + np.array([v0[0], -v0[-1]]), nominal, r_unit, lv, extra0, extra_unit, k)

    def girder_step(self, steps: list[Step], bearings: tuple[Bearing, ...], t: int) -> _GirderStep:
        x, span, n = self.x, self.span, self.x.size
        self._mark_placed(steps, t)
        loads: list[Load] = [ld for s in steps for ld in s.dead]
        k = np.sum([s.k for s in steps], axis=0) if steps else np.zeros(n)
        moment = shear_moment(x, span, loads)[1]
        mine = [i for i, b in enumerate(bearings) if b.girder == self.member.mark]
        units = np.array([shear_moment(x, span, [PointLoad(1.0, bearings[i].at)])[1] for i in mine]).reshape(len(mine), n)
        known = k * (self.so_far - self._lift())
        if k.any():
            g0 = level_deflections(x, span, loads, known[None, :], k, self.ei, moment)[0]
            unit = ponded_rows(x, span, units, 1.0 / self.ei, k) if mine else np.zeros((0, n))
        else:
            g0 = deflection_rows(x, (moment / self.ei)[None, :])[0]
            unit = deflection_rows(x, units / self.ei) if mine else np.zeros((0, n))
        return _GirderStep(x, g0, dict(zip(mine, unit)), known, k)

    def finish_beam(self, part: _BeamStep, bearings: tuple[Bearing, ...], drops: np.ndarray, t: int) -> None:
        d = np.zeros(2)
        for i, b in enumerate(bearings):
            if b.beam == self.member.mark:
                d[b.end] = drops[i]
        y = part.y0 + d @ part.y_unit
        extra = part.extra0 + d @ part.extra_unit
        r = part.r0 + part.r_unit @ d
        self.reaction[t, :, 0], self.reaction[t, :, 1], self.reaction[t, :, 2] = part.r_nominal, r - part.r_nominal, part.live
        settle_line = part.own_k * (self._line(self.settled + d) - self._line(np.array(self.end_lift)))
        total = _weight(self.x, extra)
        self.ponded_settle[t] = _weight(self.x, settle_line) if part.own_k.any() else 0.0
        self.ponded_own[t] = total - self.ponded_settle[t]
        self.dead[t], self.settle[t] = y, d
        self.so_far, self.settled = self.so_far + y, self.settled + d

    def finish_girder(self, part: _GirderStep, bearings: tuple[Bearing, ...], beam_parts: dict[str, _BeamStep],
                      drops: np.ndarray, t: int) -> None:
        g = part.g0.copy()
        for i, unit in part.unit.items():
            g += _bearing_load(bearings, beam_parts, drops, i) * unit
        if part.k.any():
            self.ponded_own[t] = _weight(self.x, part.known + part.k * g)
        self.dead[t] = g
        self.so_far = self.so_far + g

    def run(self) -> MemberRun:
        return MemberRun(self.member.mark, self.x, self.span, self.camber, self.dead, self.settle, self.reaction,
                         self.ponded_own, self.ponded_settle, self.first, self.level, self.end_lift, tuple(self.names))


def _weight(x: np.ndarray, q: np.ndarray) -> float:
    """Resultant of a line load given at stations, linear between them (trapezoid rule)."""
    return float(np.sum(0.5 * np.diff(x) * (q[:-1] + q[1:])))


def _bearing_load(bearings: tuple[Bearing, ...], beam_parts: dict[str, _BeamStep], drops: np.ndarray, i: int) -> float:
    """The lasting reaction the beam of bearing i puts on its girder at the solved drops (kip)."""
    b = bearings[i]
    part = beam_parts[b.beam]
    d = np.zeros(2)
    for j, other in enumerate(bearings):
        if other.beam == b.beam:
            d[other.end] = drops[j]
    return float(part.r0[b.end] + part.r_unit[b.end] @ d)


def _drops(bearings: tuple[Bearing, ...], beams: dict[str, _BeamStep], girders: dict[str, _GirderStep]) -> np.ndarray:
    """Solve (I - F B) d = g0 + F R0 for the bearing drops of one step (module docstring)."""
    count = len(bearings)
    if count == 0:
        return np.zeros(0)
    f, b_mat = np.zeros((count, count)), np.zeros((count, count))
    g0, r0 = np.zeros(count), np.zeros(count)
    for i, b in enumerate(bearings):
        gp = girders[b.girder]
        x = gp.x
        g0[i] = np.interp(b.at, x, gp.g0)
        for j, unit in gp.unit.items():
            f[i, j] = np.interp(b.at, x, unit)
        part = beams[b.beam]
        r0[i] = part.r0[b.end]
        for j, other in enumerate(bearings):
            if other.beam == b.beam:
                b_mat[i, j] = part.r_unit[b.end, other.end]
    coupling = f @ b_mat
    if coupling.any():
        radius = float(np.max(np.abs(np.linalg.eigvals(coupling))))
        if radius >= 1.0:
            raise PondingInstabilityError(
                f"the bay is unstable under level screeding: the girders' sag ponds more concrete on the beams "
                f"than the girders can carry (spectral radius of the coupling {radius:.3g} >= 1)")
    return cast(np.ndarray, np.linalg.solve(np.eye(count) - coupling, g0 + f @ r0))


