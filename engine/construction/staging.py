"""The beam's response to its pour plan, step by step: deflection, moment, end shears and
bottom-flange stress of each step's loads on the section existing when they are applied.

Every result is linear in the loads and in the camber (the camber changes only what level
screeding ponds), so a run at camber c is `blend(run_at_0, run_at_1, c)`.
"""

from __future__ import annotations

from dataclasses import dataclass, fields
from typing import cast

import numpy as np

from engine.construction.pours import PourPlan, Sections
from engine.mechanics.ponding import camber_shape, level_deflections, line_load_effects
from engine.mechanics.statics import deflection_rows, grouped_shear_moment


@dataclass(frozen=True, slots=True)
class StagedRun:
    """Service-load response, one row per step of the plan, one column per station.

    dead: deflection added by the step's lasting loads (in, down +), ponded concrete included;
    live: deflection under the step's construction live load while it acts (in);
    dead_moment, live_moment: their moments (kip-in); dead_shear, live_shear: V at x = 0 and
    x = span (kip), columns 0 and 1; stress: bottom-flange stress added by the lasting loads
    (ksi, tension +); ponded: weight of concrete ponded beyond the nominal thickness (kip);
    ponded_load: that concrete as a line load along the span (kip/in at the stations).
    """

    dead: np.ndarray
    live: np.ndarray
    dead_moment: np.ndarray
    live_moment: np.ndarray
    dead_shear: np.ndarray
    live_shear: np.ndarray
    stress: np.ndarray
    ponded: np.ndarray
    ponded_load: np.ndarray

    @property
    def cumulative(self) -> np.ndarray:
        """Deflection after each step (in): the running sum of `dead`."""
        return np.cumsum(self.dead, axis=0)

    @property
    def total(self) -> np.ndarray:
        """Pre-composite dead-load deflection once every step is placed (in)."""
        return cast(np.ndarray, self.dead.sum(axis=0))  # cast: ndarray.sum is Any in numpy's stubs


def blend(at_zero: StagedRun, at_one: StagedRun, t: float) -> StagedRun:
    """The run at camber t from runs at cambers 0 and 1 (every field is linear in the camber)."""
    if at_zero is at_one:
        return at_zero
    return StagedRun(*(getattr(at_zero, f.name) + t * (getattr(at_one, f.name) - getattr(at_zero, f.name))
                       for f in fields(StagedRun)))


def run_stages(plan: PourPlan, sections: Sections, camber: float = 0.0, ponding: bool = True) -> StagedRun:
    """Apply the steps in order. A level-screeded step ponds concrete into the sag below the line
    of the supports at its placement: deflection so far, less the camber, plus its own deflection
    (engine.mechanics.ponding.level_deflection), plus the line of the supports' drop where the
    beam rests on girders (engine.bay). `ponding=False` places every step at constant thickness.

    Deflection by double integration of M/EI(x) (engine.mechanics.statics); statics of a simple span.
    """
    return run_stages_at(plan, sections, (camber,), ponding)[0]


@dataclass(frozen=True, slots=True)
class StepEffects:
    """V and M (kip, kip-in; one row per step, one column per station) of each step's lasting
    loads (`dead_*`) and construction live load (`live_*`), without ponding."""

    dead_shear: np.ndarray
    dead_moment: np.ndarray
    live_shear: np.ndarray
    live_moment: np.ndarray


def step_effects(plan: PourPlan) -> StepEffects:
    """Shear and moment of every step's loads, at the plan's stations. Statics of a simple span."""
    count = len(plan.steps)
    shear, moment = grouped_shear_moment(plan.x, plan.span, [step.dead for step in plan.steps]
                                         + [step.live for step in plan.steps])
    return StepEffects(shear[:count], moment[:count], shear[count:], moment[count:])


def run_stages_at(plan: PourPlan, sections: Sections, cambers: tuple[float, ...], ponding: bool = True,
                  earlier: StagedRun | tuple[StagedRun, ...] | None = None, start: int = 0,
                  effects: StepEffects | None = None) -> tuple[StagedRun, ...]:
    """`run_stages` at each of `cambers` in one pass: each level-screeded step solves its ponding
    operator once for every camber. Steps before `start` are taken from `earlier`, a run of the
    same plan at the same (single) camber, or one such run per camber, in their order, with the
    same `ponding`, whose sections agree with `sections` up to there: those steps then come out
    exactly as a fresh run computes them.
    `effects`: the plan's `step_effects`, when the caller has them.

    Deflection by double integration of M/EI(x) (engine.mechanics.statics); statics of a simple span.
    """
    x, span = plan.x, plan.span
    effects = step_effects(plan) if effects is None else effects
    count, n, runs = len(plan.steps), x.size, len(cambers)
    dead, dead_moment, stress = np.zeros((runs, count, n)), np.zeros((runs, count, n)), np.zeros((runs, count, n))
    dead_shear, ponded = np.zeros((runs, count, 2)), np.zeros((runs, count))
    ponded_load = np.zeros((runs, count, n))
    live, live_moment, live_shear = np.zeros((count, n)), np.zeros((count, n)), np.zeros((count, 2))
    shape = camber_shape(x, span)
    lift = np.asarray(cambers, dtype=float)[:, None] * shape
    so_far = np.zeros((runs, n))
    if earlier is not None and start > 0:
        given = (earlier,) if isinstance(earlier, StagedRun) else earlier
        if len(given) not in (1, runs):
            raise ValueError(f"{len(given)} earlier runs for {runs} cambers")
        def stacked(name: str) -> np.ndarray:  # (1 or runs, steps, ...)
            return np.stack([getattr(e, name)[:start] for e in given])
        for mine, name in ((dead, "dead"), (dead_moment, "dead_moment"), (stress, "stress"),
                           (dead_shear, "dead_shear"), (ponded, "ponded"), (ponded_load, "ponded_load")):
            mine[:, :start] = stacked(name)
        for mine, theirs in ((live, given[0].live), (live_moment, given[0].live_moment),
                             (live_shear, given[0].live_shear)):
            mine[:start] = theirs[:start]
        before = stacked("dead")
        for s in range(start):
            so_far = so_far + before[:, s]
    first = start if earlier is not None else 0
    ei = sections.ei[first:]
    plain = deflection_rows(x, effects.dead_moment[first:] / ei)  # every step at constant thickness
    dead_moment[:, first:] = effects.dead_moment[first:]
    dead_shear[:, first:, 0], dead_shear[:, first:, 1] = effects.dead_shear[first:, 0], effects.dead_shear[first:, -1]
    with_live = [s for s in range(first, count) if plan.steps[s].live]
    if with_live:
        live[with_live] = deflection_rows(x, effects.live_moment[with_live] / sections.ei[with_live])
        live_moment[with_live] = effects.live_moment[with_live]
        live_shear[with_live, 0], live_shear[with_live, 1] = (effects.live_shear[with_live, 0],
                                                              effects.live_shear[with_live, -1])
    for s in range(first, count):
        step = plan.steps[s]
        if ponding and step.level:
            known = step.k * (so_far - lift if step.settle is None else so_far + step.settle - lift)
            y = level_deflections(x, span, step.dead, known, step.k, sections.ei[s], effects.dead_moment[s])
            extra = known + step.k * y
            extra_shear, extra_moment = line_load_effects(x, extra)
            shear, moment = effects.dead_shear[s] + extra_shear, effects.dead_moment[s] + extra_moment
            ponded[:, s] = (0.5 * (x[1:] - x[:-1]) * (extra[:, :-1] + extra[:, 1:])).sum(axis=1)
            ponded_load[:, s] = extra
            dead_moment[:, s] = moment
            dead_shear[:, s, 0], dead_shear[:, s, 1] = shear[:, 0], shear[:, -1]
        else:
            y = plain[s - first]
        dead[:, s] = y
        so_far = so_far + y
    stress[:, first:] = dead_moment[:, first:] * sections.stress_per_moment[first:]
    return tuple(StagedRun(dead=dead[i], live=live, dead_moment=dead_moment[i], live_moment=live_moment,
                           dead_shear=dead_shear[i], live_shear=live_shear, stress=stress[i], ponded=ponded[i],
                           ponded_load=ponded_load[i])
                 for i in range(runs))


def constant_thickness_total(plan: PourPlan, sections: Sections, effects: StepEffects | None = None) -> np.ndarray:
    """`run_stages(plan, sections, ponding=False).total`: every step at constant thickness.
    Deflection by double integration of M/EI(x) (engine.mechanics.statics); statics of a simple span."""
    effects = step_effects(plan) if effects is None else effects
    # cast: ndarray.sum is Any in numpy's stubs
    return cast(np.ndarray, deflection_rows(plan.x, effects.dead_moment / sections.ei).sum(axis=0))
