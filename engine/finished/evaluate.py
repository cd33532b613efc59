"""Finished-beam evaluation for a given set of studs.

Composite flexure along the span (AISC 360-22 I3.2a with the slab force available at each
station, I3.2d.1 / I8.2c), web shear on the steel alone (I4.3, G2.1), live-load and total
deflection with I_LB (Commentary Eq. C-I3-1) and the minimum degree of composite. The studs and
their detailing results come in as arguments (engine.pipeline composes them).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from engine.codes.aisc360_22.i1_materials import E_STEEL
from engine.codes.aisc360_22.i3_composite import equivalent_inertia, lower_bound_inertia, pna_label
from engine.codes.practice import MIN_COMPOSITE
from engine.finished.basis import FinishedBasis, available_strength, composite_strength, finished_basis
from engine.finished.slab_force import StudGroups, slab_force
from engine.finished.slip import slip_results, slip_sides
from engine.mechanics.statics import deflection_rows
from engine.model.inputs import BeamInput, Method
from engine.model.results import Authority, Check, Flag, Level, verdict_of
from engine.model.scope import check_scope

@dataclass(frozen=True, slots=True)
class BeamResult:
    """Everything `evaluate_beam` found for one beam. Arrays are per station `x`."""

    beam: BeamInput
    x: np.ndarray
    mu: np.ndarray  # LRFD demand envelope (kip-in)
    ma: np.ndarray  # ASD demand (kip-in)
    mn: np.ndarray  # nominal composite strength with the slab force available at x (kip-in)
    slab_force: np.ndarray  # C(x), kips
    groups: StudGroups
    b_eff: float
    ac: float
    cf: float
    ec: float
    n: float
    critical: int  # station index of the largest demand
    sum_qn_left: float
    sum_qn_right: float
    composite_ratio: float
    pna: str
    i_tr: float
    i_lb: float
    i_equiv: float
    vu: float
    va: float
    phi_vn: float
    vn_omega: float
    live_deflection: float
    after_cure_deflection: float  # superimposed dead + live on the composite section
    checks: tuple[Check, ...]
    flags: tuple[Flag, ...]

    @property
    def capacity(self) -> np.ndarray:
        """Available strength along the span for the beam's method (phi Mn or Mn / Omega)."""
        return available_strength(self.beam, self.mn)

    @property
    def demand(self) -> np.ndarray:
        return self.mu if self.beam.method == Method.LRFD else self.ma

    @property
    def governing(self) -> Check:
        """The failing check with the highest ratio; with none failing, the highest-ratio
        strength or serviceability check (detailing limits are often met exactly)."""
        return governing_check(self.checks)

    @property
    def verdict(self) -> Level:
        """pass / review / fail: the worst level of the beam's checks."""
        return verdict_of(self.checks)

    def check(self, check_id: str) -> Check:
        """The check with this stable id (KeyError if the beam has none)."""
        return find_check(self.checks, check_id)

    @property
    def qn_per_stud(self) -> float:
        """Strength of the weakest stud on the beam (kip); 0 with no studs."""
        return float(self.groups.qn.min()) if self.groups.total else 0.0


def find_check(checks: tuple[Check, ...], check_id: str) -> Check:
    """The check with the stable id `check_id` (KeyError naming it if absent)."""
    for c in checks:
        if c.id == check_id:
            return c
    raise KeyError(f"no check {check_id!r}")


def governing_check(checks: tuple[Check, ...] | list[Check]) -> Check:
    """The check that decides the verdict: the highest-ratio failing check, else the highest-ratio
    one asking for review, else the highest-ratio strength or serviceability check (detailing
    limits are often met exactly)."""
    failing = [c for c in checks if c.level == Level.FAIL]
    review = [c for c in checks if c.level == Level.REVIEW]
    pool = failing or review or [c for c in checks if c.kind != "detailing"] or list(checks)
    return max(pool, key=lambda c: c.ratio)


def evaluate_finished(beam: BeamInput, groups: StudGroups, detailing: tuple[Check, ...],
                      detailing_flags: tuple[Flag, ...]) -> BeamResult:
    """Evaluate the finished composite beam with the studs in `groups`; `detailing` and
    `detailing_flags` are the deck and stud detailing results of those studs (engine.studs), listed
    after the beam's own checks. AISC 360-22 I3.2a, I3.2d.1, I8.2c, G2.1, Commentary I3.2."""
    check_scope(beam)
    shape, slab = beam.shape, beam.slab
    basis = finished_basis(beam)
    x, dem = basis.x, basis.demand
    mu, ma, vu, va = dem.mu, dem.ma, dem.vu, dem.va

    lim = basis.limits
    b_eff, ac, cf = lim.b_eff, lim.ac, lim.cf
    c, left, right = slab_force(x, groups, cf)
    y_con = slab.total_thickness
    plastic = composite_strength(beam, lim, c)
    mn = plastic.mn

    demand = mu if beam.method == Method.LRFD else ma
    capacity = available_strength(beam, mn)
    k = int(np.argmax(demand))
    ratio = np.divide(demand, capacity, out=np.zeros_like(demand), where=capacity > 0)
    g = int(np.argmax(ratio))

    e_c, n, i_tr = basis.ec, basis.n, basis.i_tr
    sum_qn = float(min(left[k], right[k]))
    sum_qn_eff = min(sum_qn, cf)
    composite_ratio = sum_qn_eff / cf
    a_k = float(plastic.a[k])
    c_k = float(plastic.c[k])  # the concrete force the strength assumes (limited to the topping, I3.2a)
    i_lb = float(lower_bound_inertia(shape, c_k, beam.fy, y_con, a_k)) if c_k > 0 else shape.ix
    i_equiv = float(equivalent_inertia(shape.ix, i_tr, sum_qn_eff, cf)) if sum_qn_eff > 0 else shape.ix

    shear = basis.shear
    phi_vn, vn_omega = shear.phi_vn, shear.vn_omega

    live_defl, after_cure_defl = _service_deflections(basis, E_STEEL * i_lb)

    word = "phi Mn" if beam.method == Method.LRFD else "Mn/Omega"
    checks = [
        Check("flexure.composite", f"flexure, composite ({word} along span)", "AISC 360-22 I3.2a, I3.2d.1, I8.2c",
              float(demand[g]), float(capacity[g]), "kip-in", station=float(x[g])),
        Check("shear.web", "shear, steel web", "AISC 360-22 I4.3, G2.1",
              vu if beam.method == Method.LRFD else va, phi_vn if beam.method == Method.LRFD else vn_omega, "kip"),
        Check("deflection.live", f"live-load deflection (span/{beam.limits.live_ratio:g})",
              "AISC 360-22 Commentary I3.2 (I_LB); "
              + _limit_source(beam.limits.live_authority, "IBC Table 1604.3, floor members"),
              live_defl, beam.span / beam.limits.live_ratio, "in", kind="serviceability",
              authority=beam.limits.live_authority),
        Check("deflection.superimposed_live", f"superimposed dead + live deflection (span/{beam.limits.total_ratio:g})",
              "AISC 360-22 Commentary I3.2 (I_LB); " + _limit_source(
                  beam.limits.total_authority, "common practice (IBC Table 1604.3 takes the dead load of steel members as zero)"),
              after_cure_defl, beam.span / beam.limits.total_ratio, "in", kind="serviceability",
              authority=beam.limits.total_authority),
        Check("composite.degree_min", "degree of composite (min 25%)",
              "AISC 360-22 Commentary I3.2 (Eq. C-I3-3 not used below 25 %)",
              MIN_COMPOSITE, composite_ratio, "ratio", kind="detailing", authority=Authority.COMMENTARY),
    ]
    sides = slip_sides(beam, basis, k, demand, (float(left[k]), float(right[k])))
    slip_checks, slip_flags = slip_results(beam, sides, float(demand[k]), float(x[k]))
    checks += slip_checks
    checks += detailing
    flags = list(detailing_flags) + slip_flags
    if beam.web_openings:
        flags.append(Flag("AISC Design Guide 2", "web openings are not checked: strength and deflection here assume "
                          "a solid web", severity="not-checked"))
    return BeamResult(
        beam=beam, x=x, mu=mu, ma=ma, mn=mn, slab_force=c, groups=groups, b_eff=b_eff, ac=ac, cf=cf,
        ec=e_c, n=n, critical=k, sum_qn_left=float(left[k]), sum_qn_right=float(right[k]),
        composite_ratio=composite_ratio, pna=pna_label(int(plastic.pna[k])), i_tr=i_tr,
        i_lb=i_lb, i_equiv=i_equiv, vu=vu, va=va, phi_vn=phi_vn, vn_omega=vn_omega,
        live_deflection=live_defl, after_cure_deflection=after_cure_defl, checks=tuple(checks), flags=tuple(flags),
    )


def _limit_source(authority: Authority, default: str) -> str:
    """Where a serviceability limit comes from, as printed beside its check."""
    return "limit set by the job (project)" if authority == Authority.PROJECT else f"limit {default}"


def _service_deflections(basis: FinishedBasis, ei: float) -> tuple[float, float]:
    """Largest deflection (in) under the live load and under superimposed dead + live load on the
    composite section of stiffness `ei` (0 without such loads). AISC 360-22 Commentary I3.2 (I_LB);
    deflection by double integration of M/EI (engine.mechanics.statics)."""
    if basis.service is None:
        return 0.0, 0.0
    y = deflection_rows(basis.x, basis.service / ei).max(axis=1)
    return (float(y[0]) if basis.loads.live else 0.0), float(y[1])
