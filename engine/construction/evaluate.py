"""Construction stage of an unshored composite beam: the slab placed the way the job places it,
the bare steel checked while the concrete is wet, and the camber decision with its outcome.

One entry point, `evaluate_construction(BeamInput) -> ConstructionResult`. Modules used:
engine.construction.pours (steps and sections), engine.construction.staging (response), engine.mechanics.ponding (level screed),
engine.construction.bare_steel (F2 with the stated bracing), engine.construction.camber (decision, tolerance, outcome).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import cast

import numpy as np

from engine.codes import asce7_22
from engine.codes.aisc360_22.i1_materials import E_STEEL
from engine.codes.aisc360_22.i3_composite import COMPOSITE_FC_SHARE, STUD_COVER_MIN
from engine.codes.aisc360_22.g_shear import ShearStrength, web_shear_strength
from engine.construction.bare_steel import BareFlexure, Bracing, bracing, governing_segments
from engine.construction.camber import (
    CamberDecision,
    CamberOption,
    CamberOutcome,
    camber_options,
    decide_camber,
    may_camber,
    outcome_envelope,
)
from engine.model.results import Authority, Check, Flag, Level, verdict_of
from engine.model.deck import psf_to_kip_per_in
from engine.model.inputs import BeamInput
from engine.mechanics.ponding import first_mode_ratio
from engine.construction.pours import (
    KIP_PER_IN3_PER_PCF, PourPlan, bare_sections, cured_sections, earlier_strength_ratio, first_difference,
    pour_plan, side_widths,
)
from engine.construction.staging import StagedRun, blend, constant_thickness_total, run_stages_at, step_effects
from engine.mechanics.statics import PondingInstabilityError
from engine.model.units import format_ft_in, format_inches

PSF_PER_KIP_PER_IN2 = 144_000.0


def combinations(beam: BeamInput, method: str) -> tuple[tuple[float, float], ...]:
    """(dead, construction live) factor pairs for the construction stage.
    ASCE/SEI 7-22 2.3.1 / 2.4.1 with construction live load as L, as AISC Design Examples v16.0 Ex. I.2.

    The job's own pairs for its method, else LRFD 1.4D and 1.2D + 1.6L, ASD D + L (the AISC 360-22
    Commentary leaves them to the project, with ASCE/SEI 37 as a guide)."""
    if beam.construction.combinations and method == beam.method:
        return beam.construction.combinations
    return asce7_22.combinations(method)


@dataclass(frozen=True, slots=True)
class StageSummary:
    """One step at a glance. Deflections at midspan (in): `deflection` added by the step on the
    bare steel, `cumulative` after it; `*_cured` with earlier concrete stiffening the section.
    `demand` / `capacity`: peak factored moment during the step and the bare-steel available
    strength of the governing segment (kip-in). `stress`: largest locked-in bottom-flange stress
    after the step (ksi). `earlier_fc_ratio`: least f'c(t)/f'c of earlier concrete (None: none).
    `ponded_volume`: concrete ponded beyond nominal thickness by this step (in^3)."""

    name: str
    kind: str
    day: float
    start: float
    end: float
    side: str
    screed: str
    deflection: float
    cumulative: float
    deflection_cured: float
    cumulative_cured: float
    live_deflection: float
    demand: float
    capacity: float
    stress: float
    stress_cured: float
    earlier_fc_ratio: float | None
    ponded_volume: float


@dataclass(frozen=True, slots=True)
class ConstructionResult:
    """Everything the construction stage found for one beam. Profiles are per station `x`."""

    beam: BeamInput
    plan: PourPlan
    run: StagedRun  # bare steel, at the ordered camber
    cured: StagedRun  # with the concrete of earlier stages at its age (upper-bound stiffness)
    no_ponding: np.ndarray  # pre-composite dead-load deflection placed at constant thickness
    camber: CamberDecision
    outcomes: tuple[CamberOutcome, ...]
    options: tuple[CamberOption, ...]
    stages: tuple[StageSummary, ...]
    bracing: Bracing
    flexure: BareFlexure  # governing segment, job's method
    flexure_step: int
    mu: float  # largest LRFD factored moment while wet (kip-in)
    ma: float  # largest ASD moment (kip-in)
    vu: float
    va: float
    shear: ShearStrength
    ponding_stable: bool
    checks: tuple[Check, ...]
    flags: tuple[Flag, ...]

    @property
    def x(self) -> np.ndarray:
        return self.plan.x

    @property
    def wet_deflection(self) -> np.ndarray:
        """Pre-composite dead-load deflection profile (in): what the camber answers."""
        return self.run.total

    @property
    def live_deflection(self) -> np.ndarray:
        """Construction live-load deflection while it acts, largest over the steps (in)."""
        return cast(np.ndarray, self.run.live.max(axis=0))  # cast: ndarray.max is Any in numpy's stubs

    @property
    def total_deflection(self) -> np.ndarray:
        """Dead load so far plus construction live load, largest over the steps (in)."""
        return cast(np.ndarray, (self.run.cumulative + self.run.live).max(axis=0))  # cast: ndarray.max is Any in numpy's stubs

    def at_midspan(self, profile: np.ndarray) -> float:
        return float(profile[self.plan.midspan])

    @property
    def ponded_weight(self) -> float:
        """Concrete ponded beyond the nominal thickness at the ordered camber (kip)."""
        return float(self.run.ponded.sum())

    @property
    def ponded_line_load(self) -> np.ndarray:
        """Ponded concrete at the ordered camber as a line load along the span (kip/in at `x`)."""
        return cast(np.ndarray, self.run.ponded_load.sum(axis=0))  # cast: numpy's stubs type .sum as Any

    @property
    def ponded_volume(self) -> float:
        """Its volume (in^3)."""
        return self.ponded_weight / (self.beam.slab.concrete_pcf * KIP_PER_IN3_PER_PCF)

    @property
    def ponding_extra_psf(self) -> float:
        """Ponded concrete spread over the beam's tributary area (psf)."""
        area = sum(side_widths(self.beam)) * self.beam.span
        return self.ponded_weight / area * PSF_PER_KIP_PER_IN2 if area > 0.0 else 0.0

    @property
    def ponded_share(self) -> float:
        """Ponded concrete as a share of the nominal wet slab weight on the tributary area."""
        nominal = psf_to_kip_per_in(self.beam.slab.wet_weight_psf(), sum(side_widths(self.beam))) * self.beam.span
        return self.ponded_weight / nominal if nominal > 0.0 else 0.0

    @property
    def verdict(self) -> Level:
        """pass / review / fail: the worst level of the checks."""
        return verdict_of(self.checks)


def evaluate_construction(beam: BeamInput) -> ConstructionResult:
    """Place the slab stage by stage on the bare steel, decide the camber, check the steel.

    Strength: the bare steel carries every load applied while the concrete is wet
    (AISC 360-22 I3.1b; kept for all stages, conservative once earlier concrete reaches
    0.75 f'c, which is flagged). Deflection is reported on the bare steel and, as the stiff end
    of the range, with earlier stages' concrete acting at its age.
    """
    plan = pour_plan(beam)
    bare = bare_sections(beam, plan)
    level = any(step.level for step in plan.steps)
    flags: list[Flag] = []
    mid = plan.midspan
    effects = step_effects(plan)
    try:  # every field is linear in the camber: one pass gives the runs at cambers 0 and 1
        runs = run_stages_at(plan, bare, (0.0, 1.0) if level else (0.0,), effects=effects)
        at_zero, at_one = runs[0], runs[-1]
        delta0 = float(at_zero.total[mid])
        if not (level and may_camber(beam, delta0)):
            at_one = at_zero
        stable = True
    except PondingInstabilityError as exc:
        runs = run_stages_at(plan, bare, (0.0,), False, effects=effects)
        at_zero = at_one = runs[0]
        delta0 = float(at_zero.total[mid])
        stable = False
        flags.append(Flag("AISC 360-22 Commentary I3.1b", f"level screeding is unstable ({exc}); deflections "
                          "below are for constant-thickness placement"))
    decision = decide_camber(beam, delta0, max(delta0 - float(at_one.total[mid]), 0.0))
    run = blend(at_zero, at_one, decision.camber)
    stiff = cured_sections(beam, plan)
    cured_runs = None
    if stiff is not None:  # earlier pours acting at their age: the stiff bound, at cambers 0 and 1
        # the steps before the first cured section are the bare runs' own (same cambers, same ponding)
        pair = run_stages_at(plan, stiff, (0.0, 1.0) if level and stable else (0.0,), stable, earlier=runs,
                             start=first_difference(bare, stiff), effects=effects)
        cured_runs = (pair[0], pair[-1])
    cured = run if cured_runs is None else blend(cured_runs[0], cured_runs[1], decision.camber)
    no_ponding = constant_thickness_total(plan, bare, effects) if level and stable else run.total
    outcomes = outcome_envelope(beam, plan, (at_zero, at_one), cured_runs, decision)
    options = camber_options(beam, plan, (at_zero, at_one), cured_runs, decision)

    braces = bracing(beam)
    method = beam.method
    dead_moment = np.cumsum(run.dead_moment, axis=0)
    dead_shear = np.cumsum(run.dead_shear, axis=0)
    pairs = combinations(beam, method)
    count = len(plan.steps)
    diagrams = [fd * dead_moment[s] + fl * run.live_moment[s] for fd, fl in pairs for s in range(count)]
    found = governing_segments(beam, plan.x, np.array(diagrams), braces, method)
    per_step: list[BareFlexure] = [max((found[c * count + s] for c in range(len(pairs))), key=lambda g: g.ratio(method))
                                   for s in range(count)]
    gov = int(np.argmax([g.ratio(method) for g in per_step]))

    def peak(values: np.ndarray, live: np.ndarray, m: str) -> float:
        return max(float(np.abs(fd * values + fl * live).max()) for fd, fl in combinations(beam, m))

    mu, ma = (peak(dead_moment, run.live_moment, m) for m in ("LRFD", "ASD"))
    vu, va = (peak(dead_shear, run.live_shear, m) for m in ("LRFD", "ASD"))
    shear = web_shear_strength(beam.shape, beam.fy)

    summaries = _summaries(beam, plan, run, cured, per_step)
    checks = _checks(beam, plan, run, decision, per_step[gov], plan.steps[gov].name, shear, vu, va, level, stable)
    checks += _cover_checks(beam, outcomes, decision, level)
    flags += _flags(beam, plan, braces, stiff is not None, outcomes, summaries)
    return ConstructionResult(
        beam=beam, plan=plan, run=run, cured=cured, no_ponding=no_ponding, camber=decision, outcomes=outcomes, options=options,
        stages=summaries, bracing=braces, flexure=per_step[gov], flexure_step=gov, mu=mu, ma=ma, vu=vu, va=va,
        shear=shear, ponding_stable=stable, checks=tuple(checks), flags=tuple(flags),
    )


def _summaries(beam: BeamInput, plan: PourPlan, run: StagedRun, cured: StagedRun, per_step: list[BareFlexure]
               ) -> tuple[StageSummary, ...]:
    mid, method = plan.midspan, beam.method
    unit_weight = beam.slab.concrete_pcf * KIP_PER_IN3_PER_PCF
    cum, cum_cured = run.cumulative, cured.cumulative
    stress = np.cumsum(run.stress, axis=0).max(axis=1)
    stress_cured = np.cumsum(cured.stress, axis=0).max(axis=1)
    return tuple(
        StageSummary(step.name, step.kind, step.day, step.start, step.end, step.side, step.screed,
                     float(run.dead[s, mid]), float(cum[s, mid]), float(cured.dead[s, mid]),
                     float(cum_cured[s, mid]), float(run.live[s, mid]), per_step[s].demand,
                     per_step[s].available(method), float(stress[s]), float(stress_cured[s]),
                     earlier_strength_ratio(plan, s), float(run.ponded[s]) / unit_weight)
        for s, step in enumerate(plan.steps))


def _checks(beam: BeamInput, plan: PourPlan, run: StagedRun, decision: CamberDecision, flex: BareFlexure,
            step_name: str, shear: ShearStrength, vu: float, va: float, level: bool, stable: bool) -> list[Check]:
    con = beam.construction
    lrfd = beam.method == "LRFD"
    s = flex.strength
    lb = "continuous" if s.lb == 0.0 else format_ft_in(s.lb)
    checks = [
        Check("construction.flexure",
              f"bare steel flexure while wet ({'phi Mn' if lrfd else 'Mn/Omega'}, Lb {lb}, Cb {s.cb:.2f})",
              f"{s.clause}; AISC 360-22 I3.1b", flex.demand, flex.available(beam.method), "kip-in",
              station=flex.station, note=f"step '{step_name}', {s.limit_state}"),
        Check("construction.shear", "bare steel web shear while wet", f"{shear.clause}; AISC 360-22 I3.1b",
              vu if lrfd else va, shear.phi_vn if lrfd else shear.vn_omega, "kip"),
    ]
    limit = beam.span / con.dead_limit_ratio
    if con.dead_limit_max is not None:
        limit = min(limit, con.dead_limit_max)
    cap = f", max {format_inches(con.dead_limit_max)}" if con.dead_limit_max is not None else ""
    checks.append(Check("construction.deflection.dead_less_camber",
                        f"pre-composite dead-load deflection less camber (span/{con.dead_limit_ratio:g}{cap})",
                        ("limit set by the job (project); net of camber" if con.dead_limit_authority == Authority.PROJECT
                         else "AISC Design Guide 3 limit as used in AISC Design Examples v16.0 Chapter I; net of camber"),
                        max(decision.predicted - decision.camber, 0.0), limit, "in", station=plan.span / 2,
                        kind="serviceability", authority=con.dead_limit_authority))
    if con.live_limit_ratio is not None:
        checks.append(Check("construction.deflection.live", f"construction live-load deflection (span/{con.live_limit_ratio:g})",
                            "limit set by the job",
                            float(run.live[:, plan.midspan].max()), beam.span / con.live_limit_ratio, "in",
                            station=plan.span / 2, kind="serviceability", authority=Authority.PROJECT))
    if level or not stable:
        k_max = max(float(step.k.max()) for step in plan.steps)
        cc = first_mode_ratio(k_max, beam.span, E_STEEL * beam.shape.ix)
        checks.append(Check("construction.ponding_stability", "level-screed ponding stability (C_c < 1)",
                            "closed form after Ruddy, AISC Engineering Journal 1986; AISC 360-22 Commentary I3.1b",
                            cc if stable else max(cc, 1.0 + 1e-6), 1.0, "ratio",
                            note="" if stable else "the exact solution has no stable equilibrium: level screeding "
                            "cannot be used as planned", authority=Authority.COMMENTARY))
    return checks


def _cover_checks(beam: BeamInput, outcomes: tuple[CamberOutcome, ...], decision: CamberDecision,
                  level: bool) -> list[Check]:
    """Stud cover and stud heads at midspan over the delivered band and both stiffness bounds (or
    at the measured camber, when the job gives one: a go / no-go before the pour). Cover under the
    1/2 in specified is a possible outcome for review; a stud head above the slab fails.
    AISC 360-22 I3.2c.1(b); AISC 303 Section 6.4.4."""
    if decision.camber <= 0.0 and not level and beam.construction.measured_camber is None:
        return []  # the slab keeps its nominal thickness: the deck checks of the finished beam cover it
    measured = [o for o in outcomes if o.case.startswith("measured")]
    judged = measured or list(outcomes)
    worst = min(judged, key=lambda o: o.thickness)
    where = f"{worst.case}, {worst.stiffness}"
    length = beam.studs.length
    clause = "AISC 360-22 I3.2c.1(b); AISC 303 6.4.4 delivered camber"
    return [
        Check("construction.camber.stud_cover", f"slab over the studs at midspan, 1/2 in cover ({where})", clause,
              length + STUD_COVER_MIN, worst.thickness, "in", station=beam.span / 2, kind="serviceability",
              note="specified cover not met at this end of the band", advisory=True),
        Check("construction.camber.stud_heads", f"stud heads inside the slab at midspan ({where})", clause,
              length, worst.thickness, "in", station=beam.span / 2, kind="serviceability"),
    ]


def _flags(beam: BeamInput, plan: PourPlan, braces: Bracing, cured: bool, outcomes: tuple[CamberOutcome, ...],
           summaries: tuple[StageSummary, ...]) -> list[Flag]:
    flags = [Flag("AISC 360-22 F1, I3.1b", braces.note, severity="info")]
    for st in summaries:
        if st.earlier_fc_ratio is not None and st.earlier_fc_ratio >= COMPOSITE_FC_SHARE:
            flags.append(Flag("AISC 360-22 I3.1b", f"stage '{st.name}': earlier concrete has reached "
                              f"{st.earlier_fc_ratio:.0%} of f'c (ACI 209R-92); composite strength could be "
                              "counted there, the bare steel is checked (conservative)", severity="info"))
    if cured:
        flags.append(Flag("ACI 209R-92 Eq. 2-1; AISC 360-22 I2.1b", "'cured' deflections let concrete of earlier "
                          "stages (1 day or older) act fully composite at its age: the stiff end of the range",
                          severity="info"))
    said: set[str] = set()
    for out in outcomes:  # each case once, whichever stiffness bound showed it
        for text in out.warnings:
            message = f"camber {out.case}: {text}"
            if message not in said:
                said.add(message)
                flags.append(Flag("AISC 303 6.4.4; AISC 360-22 I3.2c.1(b)", message))
    return flags
