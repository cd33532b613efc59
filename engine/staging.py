"""The beam's response to its pour plan, step by step: deflection, moment, end shears and
bottom-flange stress of each step's loads on the section existing when they are applied.

Every result is linear in the loads and in the camber (the camber changes only what level
screeding ponds), so a run at camber c is `blend(run_at_0, run_at_1, c)`.
"""

from __future__ import annotations

from dataclasses import dataclass, fields

import numpy as np

from engine.pours import PourPlan, Sections
from engine.ponding import camber_shape, level_deflection, line_load_effects
from engine.statics import deflection_from_curvature, shear_moment


@dataclass(frozen=True, slots=True)
class StagedRun:
    """Service-load response, one row per step of the plan, one column per station.

    dead: deflection added by the step's lasting loads (in, down +), ponded concrete included;
    live: deflection under the step's construction live load while it acts (in);
    dead_moment, live_moment: their moments (kip-in); dead_shear, live_shear: V at x = 0 and
    x = span (kip), columns 0 and 1; stress: bottom-flange stress added by the lasting loads
    (ksi, tension +); ponded: weight of concrete ponded beyond the nominal thickness (kip).
    """

    dead: np.ndarray
    live: np.ndarray
    dead_moment: np.ndarray
    live_moment: np.ndarray
    dead_shear: np.ndarray
    live_shear: np.ndarray
    stress: np.ndarray
    ponded: np.ndarray

    @property
    def cumulative(self) -> np.ndarray:
        """Deflection after each step (in): the running sum of `dead`."""
        return np.cumsum(self.dead, axis=0)

    @property
    def total(self) -> np.ndarray:
        """Pre-composite dead-load deflection once every step is placed (in)."""
        return self.dead.sum(axis=0)


def blend(at_zero: StagedRun, at_one: StagedRun, t: float) -> StagedRun:
    """The run at camber t from runs at cambers 0 and 1 (every field is linear in the camber)."""
    if at_zero is at_one:
        return at_zero
    return StagedRun(*(getattr(at_zero, f.name) + t * (getattr(at_one, f.name) - getattr(at_zero, f.name))
                       for f in fields(StagedRun)))


def run_stages(plan: PourPlan, sections: Sections, camber: float = 0.0, ponding: bool = True) -> StagedRun:
    """Apply the steps in order. A level-screeded step ponds concrete into the sag below the line
    of the supports at its placement: deflection so far, less the camber, plus its own deflection
    (engine.ponding.level_deflection). `ponding=False` places every step at constant thickness.

    Deflection by double integration of M/EI(x) (engine.statics); statics of a simple span.
    """
    x, span = plan.x, plan.span
    count, n = len(plan.steps), x.size
    rows = {name: np.zeros((count, n)) for name in ("dead", "live", "dead_moment", "live_moment", "stress")}
    ends = {name: np.zeros((count, 2)) for name in ("dead_shear", "live_shear")}
    ponded = np.zeros(count)
    shape = camber_shape(x, span)
    so_far = np.zeros(n)
    for s, step in enumerate(plan.steps):
        ei = sections.ei[s]
        shear, moment = shear_moment(x, span, step.dead) if step.dead else (np.zeros(n), np.zeros(n))
        if ponding and step.level:
            known = step.k * (so_far - camber * shape)
            y = level_deflection(x, span, step.dead, known, step.k, ei)
            extra = known + step.k * y
            extra_shear, extra_moment = line_load_effects(x, extra)
            shear, moment = shear + extra_shear, moment + extra_moment
            ponded[s] = float(np.sum(0.5 * np.diff(x) * (extra[:-1] + extra[1:])))
        else:
            y = deflection_from_curvature(x, moment / ei)
        rows["dead"][s], rows["dead_moment"][s] = y, moment
        rows["stress"][s] = moment * sections.stress_per_moment[s]
        ends["dead_shear"][s] = shear[0], shear[-1]
        if step.live:
            live_shear, live_moment = shear_moment(x, span, step.live)
            rows["live"][s] = deflection_from_curvature(x, live_moment / ei)
            rows["live_moment"][s] = live_moment
            ends["live_shear"][s] = live_shear[0], live_shear[-1]
        so_far = so_far + y
    return StagedRun(dead=rows["dead"], live=rows["live"], dead_moment=rows["dead_moment"],
                     live_moment=rows["live_moment"], dead_shear=ends["dead_shear"],
                     live_shear=ends["live_shear"], stress=rows["stress"], ponded=ponded)
