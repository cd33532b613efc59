"""The camber decision and what the floor looks like if the shop delivers it at either end of
its delivered band, and the neighbouring cambers the engineer may choose instead.

Camber is ordered as a share of the predicted pre-composite dead-load deflection, rounded down
(common practice; AISC Design Examples v16.0 Chapter I orders 80%, rounded down to 1/4 in),
within the job's thresholds. A beam may arrive with 75 % of the order (it needs no further
cambering) up to the order plus the tolerance (AISC 303 Section 6.4.4).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

import numpy as np

from engine.codes.aisc303_16 import camber_tolerance, delivered_band
from engine.codes.aisc360_22.i3_composite import STUD_COVER_MIN
from engine.model.inputs import BeamInput, CamberRules
from engine.construction.pours import KIP_PER_IN3_PER_PCF, PourPlan
from engine.construction.staging import StagedRun
from engine.model.units import format_ft_in, format_inches


def round_down(value: float, increment: float) -> float:
    """Largest multiple of `increment` not above `value` (common practice: camber is rounded down)."""
    if not increment > 0.0:
        raise ValueError(f"camber increment {increment} in must be > 0")
    return math.floor(value / increment + 1e-9) * increment


def nominal_depth(beam: BeamInput) -> float:
    """Nominal depth of the W shape (in), from its designation: W14X22 -> 14."""
    return float(beam.shape.name[1:].upper().split("X")[0])


@dataclass(frozen=True, slots=True)
class CamberDecision:
    """Camber to order (in, 0 for none) and why; `target` is the unrounded share of the predicted
    deflection; `predicted` the pre-composite dead-load deflection at midspan with this camber;
    `tolerance` the shop's over-camber allowance (0 when none is ordered)."""

    camber: float
    reason: str
    target: float
    predicted: float
    tolerance: float


def _ruled_out(beam: BeamInput) -> str | None:
    """Why the job's rules forbid camber on this beam, or None (common practice)."""
    rules = beam.construction.camber
    if rules.do_not_camber:
        return rules.do_not_camber
    if beam.span < rules.min_length - 1e-9:
        return f"span {format_ft_in(beam.span)} under {format_ft_in(rules.min_length)}"
    if nominal_depth(beam) < rules.min_depth - 1e-9:
        return f"{nominal_depth(beam):g} in nominal depth under {format_inches(rules.min_depth)}"
    if beam.shape.tw <= rules.thin_web + 1e-9:
        return f"web {format_inches(beam.shape.tw)} thick, {format_inches(rules.thin_web)} or thinner (common practice)"
    return None


def may_camber(beam: BeamInput, at_zero: float) -> bool:
    """Whether any camber can be ordered for a predicted deflection `at_zero` (in) at no camber
    (the deflection only falls as camber is added)."""
    rules = beam.construction.camber
    return _ruled_out(beam) is None and rules.fraction * at_zero >= rules.minimum - 1e-9


def decide_camber(beam: BeamInput, at_zero: float, drop: float) -> CamberDecision:
    """Camber for a predicted midspan deflection `at_zero - drop * c` at camber c (in).
    Common practice ("Specifying Camber", Modern Steel Construction, July 2006).

    Level screeding ponds less concrete on a cambered beam, so the deflection falls with the
    camber (`drop` >= 0; 0 for constant thickness). The order solves c = f (at_zero - drop c),
    rounded down to the increment, so camber <= f x the deflection it will meet.
    """
    rules: CamberRules = beam.construction.camber
    target = rules.fraction * at_zero / (1.0 + rules.fraction * drop) if at_zero > 0.0 else 0.0

    def none(reason: str) -> CamberDecision:
        return CamberDecision(0.0, f"not cambered: {reason}", target, at_zero, 0.0)

    refused = _ruled_out(beam)
    if refused:
        return none(refused)
    camber = round_down(target, rules.increment)
    share = f"{rules.fraction:.2f} x {at_zero - drop * target:.2f} in" + (
        " (deflection at that camber, level screed)" if drop > 0.0 else "")
    if camber < rules.minimum - 1e-9:
        return none(f"{share} = {target:.2f} in rounds down under the {format_inches(rules.minimum)} minimum")
    return CamberDecision(camber, f"{share} = {target:.2f} in, rounded down to {format_inches(rules.increment)}",
                          target, at_zero - drop * camber, camber_tolerance(beam.span))


@dataclass(frozen=True, slots=True)
class CamberOutcome:
    """The floor at midspan once the slab is placed, for one delivered camber (in).

    deflection: pre-composite dead-load deflection at midspan (in);
    top_of_slab: top of slab above (+) or below (-) the level line set at the supports;
    thickness: slab thickness over the beam (top of steel to top of slab);
    stud_cover: concrete above the stud heads (thickness less installed stud length);
    extra_concrete: concrete beyond the nominal thickness on the beam's tributary area (in^3).
    """

    case: str
    camber: float
    deflection: float
    top_of_slab: float
    thickness: float
    stud_cover: float
    extra_concrete: float
    warnings: tuple[str, ...]
    stiffness: str = "bare steel"


def camber_outcome(beam: BeamInput, plan: PourPlan, at_zero: StagedRun, at_one: StagedRun,
                   camber: float, case: str, stiffness: str = "bare steel") -> CamberOutcome:
    """Outcome at midspan for a delivered camber.
    Definitions of this tool; stud cover minimum AISC 360-22 I3.2c.1(b).

    Constant thickness: the slab keeps its nominal thickness and its top follows the steel, so
    top = camber - deflection at midspan. Level: the concrete is struck off level with the
    supports, so its top is level when placed and thickness = nominal + deflection at placement
    - camber; steps placed later sag it by their own deflection. The stage that first placed
    concrete at midspan decides which applies. Stud cover = thickness - stud length (1/2 in
    minimum). Extra concrete: the ponded weight over the concrete unit weight.
    """
    mid = plan.midspan
    return _outcome(beam, plan, mid, plan.first_placed(mid), at_zero, at_one, camber, case, stiffness)


def _outcome(beam: BeamInput, plan: PourPlan, mid: int, first: int, at_zero: StagedRun, at_one: StagedRun,
             camber: float, case: str, stiffness: str) -> CamberOutcome:
    """`camber_outcome` given the plan's midspan station and the step that first placed concrete
    there. Definitions of this tool; stud cover minimum AISC 360-22 I3.2c.1(b)."""
    dead, ponded = at_zero.dead[:, mid], at_zero.ponded
    if at_one is not at_zero:  # as `blend`, for the two fields needed
        dead = dead + camber * (at_one.dead[:, mid] - dead)
        ponded = ponded + camber * (at_one.ponded - ponded)
    after = np.cumsum(dead)
    final = float(after[-1])
    nominal = beam.slab.total_thickness
    if plan.steps[first].level:
        thickness = nominal + float(after[first]) - camber
        top = -(final - float(after[first]))
    else:
        thickness, top = nominal, camber - final
    cover = thickness - beam.studs.length
    unit_weight = beam.slab.concrete_pcf * KIP_PER_IN3_PER_PCF
    extra = float(ponded.sum()) / unit_weight
    warnings = []
    if cover < 0.0:
        warnings.append(f"stud heads stand {format_inches(-cover)} proud of the slab at midspan")
    elif cover < STUD_COVER_MIN - 1e-9:
        warnings.append(f"stud cover {format_inches(cover)} at midspan is under the 1/2\" minimum "
                        "(AISC 360-22 I3.2c.1(b))")
    return CamberOutcome(case, camber, final, top, thickness, cover, extra, tuple(warnings), stiffness)


Runs = tuple[StagedRun, StagedRun]  # the construction stage at cambers 0 and 1 (fields are linear in camber)
BARE, CURED = "bare steel", "earlier concrete acting"


def outcome_envelope(beam: BeamInput, plan: PourPlan, bare: Runs, cured: Runs | None,
                     decision: CamberDecision) -> tuple[CamberOutcome, ...]:
    """Outcomes at both ends of the delivered band, 75 % of the order to the order plus the
    tolerance (AISC 303 Section 6.4.4), each on the bare steel and, where earlier pours can act,
    with their concrete at its age (the two stiffness bounds); a single case when no camber is
    ordered; and at the beam's measured camber when the job gives one."""
    cases: list[tuple[float, str]]
    if decision.camber <= 0.0:
        cases = [(0.0, "not cambered")]
    else:
        low, high = delivered_band(decision.camber, beam.span)
        cases = [(low, f"delivered at 75 % ({format_inches(low)})"),
                 (high, f"delivered at +{format_inches(high - decision.camber)} ({format_inches(high)})")]
    measured = beam.construction.measured_camber
    if measured is not None:
        cases.append((measured, f"measured {format_inches(measured)}"))
    bounds = [(bare, BARE)] + ([(cured, CURED)] if cured is not None else [])
    mid = plan.midspan
    first = plan.first_placed(mid)
    return tuple(_outcome(beam, plan, mid, first, runs[0], runs[1], camber, case, label)
                 for camber, case in cases for runs, label in bounds)


@dataclass(frozen=True, slots=True)
class CamberOption:
    """A camber the engineer may order instead, and the floor it gives over its delivered band
    and both stiffness bounds: least stud cover and slab thickness, top of slab range (in), most
    extra concrete (in^3)."""

    camber: float
    label: str
    least_cover: float
    least_thickness: float
    lowest_top: float
    highest_top: float
    most_extra_concrete: float


def camber_options(beam: BeamInput, plan: PourPlan, bare: Runs, cured: Runs | None,
                   decision: CamberDecision) -> tuple[CamberOption, ...]:
    """The recommended camber beside one increment less, one more and none, each judged over its
    delivered band (AISC 303 Section 6.4.4) on both stiffness bounds, so the engineer chooses."""
    step = beam.construction.camber.increment
    picks = [(decision.camber, "recommended"), (decision.camber - step, "one increment less"),
             (decision.camber + step, "one increment more"), (0.0, "none")]
    seen: set[float] = set()
    out = []
    unmeasured = beam if beam.construction.measured_camber is None else replace(
        beam, construction=replace(beam.construction, measured_camber=None))
    for pick, label in picks:
        camber = round(pick, 6)
        if camber < 0.0 or camber in seen:
            continue
        seen.add(camber)
        tol = camber_tolerance(beam.span) if camber > 0.0 else 0.0
        trial = replace(decision, camber=camber, tolerance=tol)
        results = outcome_envelope(unmeasured, plan, bare, cured, trial)
        out.append(CamberOption(camber, label, min(o.stud_cover for o in results), min(o.thickness for o in results),
                                min(o.top_of_slab for o in results), max(o.top_of_slab for o in results),
                                max(o.extra_concrete for o in results)))
    return tuple(out)
