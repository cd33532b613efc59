"""Pour plan of one beam: the loading steps in time order (steel and deck, then each pour stage),
where each stage places concrete, and the section each step's load acts on.

A step's loads act on the section that exists when it is applied. Two sections are offered:
the bare steel (AISC 360-22 I3.1b: it carries everything applied before the concrete reaches
0.75 f'c) and, as the stiff end of the range, the steel acting with the concrete of earlier
stages at its age (ACI 209R-92 strength gain, AISC 360-22 I2.1b modulus).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import cast

import numpy as np

from engine.codes.aci209r_92 import fc_at_age
from engine.codes.aisc360_22.i3_composite import effective_width, transformed_inertia
from engine.codes.aisc360_22.i1_materials import E_STEEL, ec, modular_ratio
from engine.codes.practice import CURED_AFTER_DAYS
from engine.model.deck import plf_to_kip_per_in, psf_to_kip_per_in
from engine.model.inputs import POUR_SIDES, SCREED_MODES, BeamInput, PourStage
from engine.model.inputs import PointLoad as PointLoadInput
from engine.mechanics.statics import Load, PointLoad, UniformLoad, stations
from engine.model.units import format_ft_in

KIP_PER_IN3_PER_PCF = 1.0 / 1_728_000.0  # 1 pcf = 1 lb/ft^3 = 1/(1000 * 1728) kip/in^3
DEFAULT_STAGE = "whole slab"


@dataclass(frozen=True, slots=True)
class Step:
    """One loading step. `kind` is "erection" (steel self-weight and deck) or "pour".

    `dead` are the service loads the step leaves on the beam (wet concrete of constant thickness,
    point loads placed with it); `live` is construction live load present only during the step.
    `placed` (2, n) is the share of each station's cell that receives concrete, left and right
    side; `k` (n,) is the level-screed ponding stiffness (kip/in of load per in of sag): unit
    weight times the width placed, zero for constant-thickness screeding.
    """

    name: str
    kind: str
    start: float
    end: float
    side: str
    day: float
    screed: str
    dead: tuple[Load, ...]
    live: tuple[Load, ...]
    placed: np.ndarray
    k: np.ndarray
    level: bool  # concrete ponds into the sag here: k > 0 somewhere
    settle: np.ndarray | None = None  # (n,) the supports' drop line by the end of the step (engine.bay), or None


@dataclass(frozen=True, slots=True)
class PourPlan:
    """Stations `x` (in) over `span` and the steps in time order (erection first)."""

    x: np.ndarray
    span: float
    steps: tuple[Step, ...]

    @property
    def midspan(self) -> int:
        """Index of the station nearest midspan (exact for an odd number of stations)."""
        return int(np.argmin(np.abs(self.x - 0.5 * self.span)))

    def first_placed(self, index: int) -> int:
        """Step that first placed concrete over the beam at station `index` (either side)."""
        for s, step in enumerate(self.steps):
            if step.kind == "pour" and step.placed[:, index].max() >= 0.5:
                return s
        return len(self.steps) - 1


@dataclass(frozen=True, slots=True)
class Sections:
    """Per step and station: EI (kip-in^2) and bottom-flange stress per unit moment (1/in^3)."""

    ei: np.ndarray
    stress_per_moment: np.ndarray


def first_difference(a: Sections, b: Sections) -> int:
    """First step whose section differs between `a` and `b` (the step count if none does)."""
    same = np.all(a.ei == b.ei, axis=1) & np.all(a.stress_per_moment == b.stress_per_moment, axis=1)
    return int(np.argmin(same)) if not same.all() else same.size


def side_widths(beam: BeamInput) -> tuple[float, float]:
    """Width of floor (in) whose concrete each side of the beam carries: the slab on that side,
    or `load_width` shared in the same proportion when the job sets it (0 for a girder)."""
    if beam.load_width is None:
        return beam.slab_left, beam.slab_right
    total = beam.slab_left + beam.slab_right
    if total <= 0.0:
        return 0.5 * beam.load_width, 0.5 * beam.load_width
    return beam.load_width * beam.slab_left / total, beam.load_width * beam.slab_right / total


def _cell_share(x: np.ndarray, start: float, end: float) -> np.ndarray:
    """Share of each station's cell (half-way to its neighbours) inside [start, end], so that a
    station array of shares integrates (linear between stations) to the length end - start."""
    edges = np.concatenate(([x[0]], 0.5 * (x[:-1] + x[1:]), [x[-1]]))
    inside = np.maximum(np.minimum(end, edges[1:]) - np.maximum(start, edges[:-1]), 0.0)
    return cast(np.ndarray, inside / (edges[1:] - edges[:-1]))  # cast: numpy's stubs type ufunc results as Any


def check_stages(stages: tuple[PourStage, ...], span: float) -> None:
    """Raise ValueError unless every stage lies in the span and the stages cover each side of the
    beam once, with no gap and no overlap."""
    tol = 1e-6 * span
    for st in stages:
        if st.side not in POUR_SIDES:
            raise ValueError(f"pour stage '{st.name}': side {st.side!r} must be one of {POUR_SIDES}")
        if st.screed is not None and st.screed not in SCREED_MODES:
            raise ValueError(f"pour stage '{st.name}': screed {st.screed!r} must be one of {SCREED_MODES}")
        if not (math.isfinite(st.day) and st.day >= 0.0):
            raise ValueError(f"pour stage '{st.name}': day {st.day} must be >= 0")
        if not (0.0 <= st.start < st.end <= span + tol):
            raise ValueError(f"pour stage '{st.name}' must run from 0 to the span {format_ft_in(span)} "
                             f"with start < end, got {format_ft_in(st.start)} to {format_ft_in(st.end)}")
    for side in ("left", "right"):
        spans = sorted((st.start, min(st.end, span), st.name) for st in stages if st.side in (side, "both"))
        reach = 0.0
        for start, end, name in spans:
            if start > reach + tol:
                raise ValueError(f"pour stages leave the {side} side from {format_ft_in(reach)} to "
                                 f"{format_ft_in(start)} without concrete")
            if start < reach - tol:
                raise ValueError(f"pour stage '{name}' places concrete on the {side} side from "
                                 f"{format_ft_in(start)} where an earlier-listed stage already did")
            reach = end
        if reach < span - tol:
            raise ValueError(f"pour stages leave the {side} side from {format_ft_in(reach)} to "
                             f"{format_ft_in(span)} without concrete")


def pour_plan(beam: BeamInput) -> PourPlan:
    """The beam's loading steps in time order: steel and deck, then the pour stages sorted by day.
    Loads by AISC 360-22 I3.1b (all on the steel while wet); one whole-slab stage by default.

    Within a day stages keep their listed order. Loads: self-weight and deck on the bare steel;
    wet concrete from geometry (engine.model.deck.Slab.wet_weight_psf: topping plus concrete in the
    ribs, averaged over the deck pitch, the same for ribs perpendicular or parallel to the beam)
    over each stage's stretch and side(s); construction live load over the same area during the
    stage; each point load with the first stage that places concrete at its station, except a
    framing beam's reactions (engine.bay): its own weight and deck at erection, its concrete with
    the pour of its day (the girder's first stage that day, or a step of that day placing no
    concrete on the girder, kind "framing").
    """
    span = beam.span
    con = beam.construction
    x = stations(span, beam.n_stations)
    stages = con.pours or (PourStage(DEFAULT_STAGE, 0.0, span),)
    check_stages(stages, span)
    order = sorted(range(len(stages)), key=lambda i: (stages[i].day, i))
    left, right = side_widths(beam)
    widths = {"left": (left, 0.0), "right": (0.0, right), "both": (left, right)}
    deck_psf = 0.0 if beam.slab.deck is None else beam.slab.deck.weight_psf
    erection_w = plf_to_kip_per_in(beam.shape.weight_plf) + psf_to_kip_per_in(deck_psf, left + right)
    zeros = np.zeros_like(x)
    steps = [Step("steel and deck", "erection", 0.0, span, "both", stages[order[0]].day, "constant-thickness",
                  (UniformLoad(erection_w),), (), np.zeros((2, x.size)), zeros, False)]
    unit_weight = beam.slab.concrete_pcf * KIP_PER_IN3_PER_PCF
    wet_psf = beam.slab.wet_weight_psf()
    dated = [j for j, p in enumerate(beam.point_loads) if p.erection or p.day is not None]
    taken: set[int] = set(dated)
    steps[0] = _with_loads(steps[0], [beam.point_loads[j] for j in dated if beam.point_loads[j].erection])
    days_placed = {stages[i].day for i in order}
    extra = sorted({p.day for p in beam.point_loads if p.day is not None and not p.erection} - days_placed)
    arrivals = [PourStage(f"{FRAMING_STAGE}, day {day:g}", 0.0, span, day=day) for day in extra]
    for i in order:
        st = stages[i]
        end = min(st.end, span)
        wl, wr = widths[st.side]
        dead: list[Load] = []
        live: list[Load] = []
        if wl + wr > 0.0:
            dead.append(UniformLoad(psf_to_kip_per_in(wet_psf, wl + wr), st.start, end))
            if con.live_psf > 0.0:
                live.append(UniformLoad(psf_to_kip_per_in(con.live_psf, wl + wr), st.start, end))
        for j, p in enumerate(beam.point_loads):
            if j not in taken and st.start - 1e-9 <= p.x <= end + 1e-9:
                taken.add(j)
                if p.precomposite_dead > 0.0:
                    dead.append(PointLoad(p.precomposite_dead, p.x))
                if p.construction_live > 0.0:
                    live.append(PointLoad(p.construction_live, p.x))
        share = _cell_share(x, st.start, end)
        placed = np.stack([share * (st.side != "right"), share * (st.side != "left")])
        screed = st.screed or con.screed
        k = unit_weight * (wl + wr) * share if screed == "level" else zeros
        first_today = all(stages[o].day != st.day for o in order[:order.index(i)])
        if first_today:
            _add_dated(dead, live, beam, dated, st.day)
        steps.append(Step(st.name, "pour", st.start, end, st.side, st.day, screed, tuple(dead), tuple(live),
                          placed, k, bool((k > 0.0).any())))
    for st in arrivals:  # days on which only framing beams' loads arrive: a step that places no concrete here
        dead, live = [], []
        _add_dated(dead, live, beam, dated, st.day)
        steps.append(Step(st.name, "framing", 0.0, span, "both", st.day, con.screed, tuple(dead), tuple(live),
                          np.zeros((2, x.size)), zeros, False))
    steps[1:] = sorted(steps[1:], key=lambda s: s.day)  # stable: within a day the listed order holds
    if con.settlement:
        steps = [replace(s, settle=settlement_line(x, span, con.settlement, s.day)) if s.level else s for s in steps]
    return PourPlan(x, span, tuple(steps))


def settlement_line(x: np.ndarray, span: float, settlement: tuple[tuple[float, float, float], ...],
                    day: float) -> np.ndarray:
    """The straight line between the two ends' drops by the end of `day` (the last entry on or
    before it; geometry: a rigid drop of the supports)."""
    known = [s for s in settlement if s[0] <= day + 1e-9]
    if not known:
        return np.zeros_like(x)
    _, ref, far = max(known, key=lambda s: s[0])
    return cast(np.ndarray, ref + (far - ref) * x / span)


FRAMING_STAGE = "loads of the framing beams"


def _with_loads(step: Step, loads: list[PointLoadInput]) -> Step:
    """The erection step with the framing beams' own weight and deck (statics: point loads)."""
    extra = tuple(PointLoad(p.precomposite_dead, p.x) for p in loads if p.precomposite_dead > 0.0)
    return replace(step, dead=step.dead + extra) if extra else step


def _add_dated(dead: list[Load], live: list[Load], beam: BeamInput, dated: list[int], day: float) -> None:
    """The framing beams' reactions placed on `day`: their lasting part and construction live load."""
    for j in dated:
        p = beam.point_loads[j]
        if not p.erection and p.day == day:
            if p.precomposite_dead > 0.0:
                dead.append(PointLoad(p.precomposite_dead, p.x))
            if p.construction_live > 0.0:
                live.append(PointLoad(p.construction_live, p.x))


def earlier_strength_ratio(plan: PourPlan, s: int) -> float | None:
    """Least f'c(t)/f'c of concrete placed by earlier steps when step `s` is applied, None if none.
    ACI 209R-92 Eq. 2-1 (moist-cured, Type I cement)."""
    step = plan.steps[s]
    ages = [step.day - e.day for e in plan.steps[1:s] if e.kind == "pour"]
    if step.kind != "pour" or not ages:
        return None
    return float(min(fc_at_age(1.0, max(a, 0.0)) for a in ages))


def bare_sections(beam: BeamInput, plan: PourPlan) -> Sections:
    """The bare steel for every step: EI = E I_x, bottom-flange stress M / S_x.
    AISC 360-22 I3.1b (steel alone before the concrete reaches 0.75 f'c)."""
    shape = (len(plan.steps), plan.x.size)
    return Sections(np.full(shape, E_STEEL * beam.shape.ix), np.full(shape, 1.0 / beam.shape.sx))


def cured_sections(beam: BeamInput, plan: PourPlan) -> Sections | None:
    """Steel plus the concrete of earlier stages at its age, where that concrete lies.
    AISC 360-22 Commentary I3.2 (transformed section), I3.1a (b_eff), I2.1b (E_c); ACI 209R-92 Eq. 2-1.

    Full interaction with the topping, effective width per side, E_c from f'c(t): an upper bound
    on the stiffness. None when no step finds concrete at least CURED_AFTER_DAYS old.
    """
    shape, slab = beam.shape, beam.slab
    sections = bare_sections(beam, plan)
    b_side = effective_width(beam.span, beam.slab_left, beam.slab_right)
    found = False
    for s, step in enumerate(plan.steps):
        width = np.zeros_like(plan.x)
        for earlier in plan.steps[1:s]:
            age = step.day - earlier.day
            if earlier.kind != "pour" or age < CURED_AFTER_DAYS:
                continue
            n = float(modular_ratio(ec(slab.concrete_pcf, fc_at_age(slab.fc_ksi, age))))
            width += (earlier.placed[0] * float(b_side[0]) + earlier.placed[1] * float(b_side[1])) / n
        has = width > 0.0
        if not has.any():
            continue
        found = True
        i_tr, y_na = transformed_inertia(shape, width[has], 1.0, slab.topping, slab.total_thickness)
        sections.ei[s, has] = E_STEEL * i_tr
        sections.stress_per_moment[s, has] = y_na / i_tr
    return sections if found else None
