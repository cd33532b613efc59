"""Finished-beam evaluation: one entry point used by the CLI, the workbench, sheets and tests.

Composite flexure along the span (AISC 360-22 I3.2a with the slab force available at each
station, I3.2d.1 / I8.2c), web shear on the steel alone (I4.3, G2.1), live-load and total
deflection with I_LB (Commentary Eq. C-I3-1), minimum degree of composite, and detailing.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

import numpy as np

from engine.codes.aisc360_22.i3_composite import (
    DECK_RIB_HEIGHT_MAX,
    DECK_STUD_DIAMETER_MAX,
    b_eff as total_effective_width,
    cf_force,
    equivalent_inertia,
    lower_bound_inertia,
    pna_label,
    plastic_moment,
    slip_capacity_exempt,
    stress_block_force,
    transformed_inertia,
)
from engine.codes.aisc360_22.f_flexure import OMEGA_B, PHI_B
from engine.codes.aisc360_22.i1_materials import E_STEEL, ec, fc_strength_range, modular_ratio
from engine.codes.aisc360_22.g_shear import ShearStrength, web_shear_strength
from engine.codes.asce7_22 import combinations
from engine.codes.practice import MIN_COMPOSITE
from engine.model.results import Check, Flag
from engine.studs.detailing import deck_checks, spacing_checks
from engine.finished.loads import FinishedLoads, finished_loads, load_factors
from engine.model.inputs import BeamInput
from engine.finished.slab_force import StudGroups, slab_force
from engine.mechanics.statics import deflection_rows, factored_max_abs_shear, factored_moment, stations


class OutOfScope(ValueError):
    """The input lies outside what the engine checks; the message names the clause."""

    def __init__(self, field: str, message: str):
        super().__init__(message)
        self.field = field


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
        return self.mu if self.beam.method == "LRFD" else self.ma

    @property
    def governing(self) -> Check:
        """The failing check with the highest ratio; with none failing, the highest-ratio
        strength or serviceability check (detailing limits are often met exactly)."""
        return governing_check(self.checks)

    @property
    def verdict(self) -> str:
        return "pass" if all(c.passed for c in self.checks) else "fail"

    @property
    def qn_per_stud(self) -> float:
        """Strength of the weakest stud on the beam (kip); 0 with no studs."""
        return float(self.groups.qn.min()) if self.groups.total else 0.0


def governing_check(checks: tuple[Check, ...] | list[Check]) -> Check:
    failing = [c for c in checks if not c.passed]
    pool = failing or [c for c in checks if c.kind != "detailing"] or list(checks)
    return max(pool, key=lambda c: c.ratio)


def check_scope(beam: BeamInput) -> None:
    """Refuse inputs outside the engine's scope, naming the clause (AISC 360-22 I1.3, I3.2c.1)."""
    lo, hi = fc_strength_range(beam.slab.lightweight)
    if not lo <= beam.slab.fc_ksi <= hi:
        kind = "lightweight" if beam.slab.lightweight else "normal-weight"
        raise OutOfScope("fc_ksi", f"f'c = {beam.slab.fc_ksi:g} ksi is outside {lo:g}-{hi:g} ksi for "
                         f"{kind} concrete (AISC 360-22 I1.3); not computed")
    deck = beam.slab.deck
    if deck is not None and deck.rib_height > DECK_RIB_HEIGHT_MAX:
        raise OutOfScope("rib_height", f"rib height {deck.rib_height:g} in exceeds 3 in "
                         "(AISC 360-22 I3.2c.1(a)); not computed")
    if deck is not None and beam.studs.diameter > DECK_STUD_DIAMETER_MAX:
        raise OutOfScope("diameter", f"stud diameter {beam.studs.diameter:g} in exceeds 3/4 in through deck "
                         "(AISC 360-22 I8.1 / I3.2c.1(c)); not computed")
    if beam.support != "simple":
        raise OutOfScope("support", f"a {beam.support} beam has negative moment over its supports (AISC 360-22 I3.2b); "
                         "fieldcomp computes simply supported beams only; not computed")
    if beam.fy > 70.0:
        raise OutOfScope("fy_ksi", f"Fy = {beam.fy:g} ksi exceeds 70 ksi; plastic stress distribution "
                         "not established (AISC 360-22 I3.2a); not computed")


@dataclass(frozen=True, slots=True)
class Demand:
    """Finished-beam demand along the span: LRFD envelope `mu` and ASD `ma` (kip-in), the
    largest shears `vu`, `va` (kip)."""

    mu: np.ndarray
    ma: np.ndarray
    vu: float
    va: float


def _factors(loads: FinishedLoads) -> tuple[list[list[float]], int]:
    """Load factors of each LRFD combination and then the ASD one, per load of dead + live
    (ASCE/SEI 7-22 2.3.1 and 2.4.1), and the number of LRFD rows."""
    lrfd = combinations("LRFD")
    return load_factors(loads, lrfd + combinations("ASD")), len(lrfd)


def moment_envelope(beam: BeamInput, x: np.ndarray, loads: FinishedLoads | None = None) -> tuple[np.ndarray, np.ndarray]:
    """(Mu, Ma) at stations `x` (kip-in): the LRFD envelope and the ASD moment of the finished loads.

    ASCE/SEI 7-22 2.3.1 (LRFD) and 2.4.1 (ASD), via `engine.finished.loads`.
    """
    loads = finished_loads(beam) if loads is None else loads
    rows, lrfd = _factors(loads)
    return _envelope(factored_moment(x, beam.span, loads.dead + loads.live, rows), lrfd)


def _envelope(moments: np.ndarray, lrfd: int) -> tuple[np.ndarray, np.ndarray]:
    """(Mu, Ma) from moment rows of the LRFD combinations then the ASD one (ASCE/SEI 7-22 2.3.1, 2.4.1)."""
    mu = np.zeros_like(moments[0])
    for m in moments[:lrfd]:
        mu = np.maximum(mu, m)
    return mu, moments[lrfd]


def moment_demand(beam: BeamInput, x: np.ndarray, loads: FinishedLoads | None = None) -> Demand:
    """Moments and shears of the finished loads in their combinations at stations `x`.

    ASCE/SEI 7-22 2.3.1 (LRFD) and 2.4.1 (ASD), via `engine.finished.loads`.
    """
    loads = finished_loads(beam) if loads is None else loads
    mu, ma = moment_envelope(beam, x, loads)
    return Demand(mu, ma, *_shears(beam, loads))


def _shears(beam: BeamInput, loads: FinishedLoads) -> tuple[float, float]:
    """Largest |Vu| (LRFD envelope) and |Va| (ASD) of the finished loads (kip).
    ASCE/SEI 7-22 2.3.1 (LRFD) and 2.4.1 (ASD); statics (engine.mechanics.statics)."""
    rows, lrfd = _factors(loads)
    shears = factored_max_abs_shear(beam.span, loads.dead + loads.live, rows)
    return max(float(v) for v in shears[:lrfd]), float(shears[lrfd])


@dataclass(frozen=True, slots=True)
class SlabLimits:
    """Effective width `b_eff` (in), strength concrete area `ac` (in^2), full-composite slab
    force `cf` and the largest force the stress block may take within the topping `c_block` (kip)."""

    b_eff: float
    ac: float
    cf: float
    c_block: float


def slab_limits(beam: BeamInput) -> SlabLimits:
    """Effective width, strength concrete area and C_f = min(A_s F_y, 0.85 f'c A_c).
    AISC 360-22 I3.1a (b_eff), I3.2c.2-3 (A_c), I3.2d.1 (C_f).

    The stress block is taken within the topping; where it would reach into parallel ribs the
    force is limited to the topping (conservative; AISC 360-22 I3.2a).
    """
    slab = beam.slab
    b_eff = float(total_effective_width(beam.span, beam.slab_left, beam.slab_right))
    ac = slab.strength_concrete_area(b_eff, beam.orientation)
    cf = float(cf_force(beam.shape.area * beam.fy, slab.fc_ksi, ac))
    return SlabLimits(b_eff, ac, cf, min(cf, float(stress_block_force(slab.fc_ksi, b_eff, slab.topping))))


def composite_strength(beam: BeamInput, limits: SlabLimits, c: np.ndarray):
    """Plastic stress distribution for the slab force `c` (kip), the stress block in the topping.

    AISC 360-22 I3.2a; returns `engine.codes.aisc360_22.i3_composite.PlasticMoment`.
    """
    return plastic_moment(np.minimum(c, limits.c_block), beam.shape, beam.fy, beam.slab.fc_ksi,
                          limits.b_eff, beam.slab.total_thickness)


def available_strength(beam: BeamInput, mn: np.ndarray) -> np.ndarray:
    """phi_b Mn (LRFD) or Mn / Omega_b (ASD) for the beam's design method.

    AISC 360-22 I3.2a (phi_b = 0.90, Omega_b = 1.67).
    """
    return method_strength(beam.method, mn)


def method_strength(method: str, mn: np.ndarray) -> np.ndarray:
    """phi_b Mn for "LRFD", else Mn / Omega_b.

    AISC 360-22 I3.2a (phi_b = 0.90, Omega_b = 1.67).
    """
    return PHI_B * mn if method == "LRFD" else mn / OMEGA_B


@dataclass(frozen=True, slots=True)
class FinishedBasis:
    """What the finished-beam evaluation of one beam needs whatever studs it has: stations `x`,
    loads and their demand, the service moments (live; superimposed dead + live; kip-in, None
    without such loads), slab limits, E_c, n, I_tr, the web shear strength and deck checks."""

    x: np.ndarray
    loads: FinishedLoads
    demand: Demand
    service: np.ndarray | None
    limits: SlabLimits
    ec: float
    n: float
    i_tr: float
    shear: ShearStrength
    deck_checks: tuple[Check, ...]


@lru_cache(maxsize=64)
def finished_basis(beam: BeamInput) -> FinishedBasis:
    """The stud-independent part of `evaluate_beam`, computed once per beam input (layout, as-built
    and repair evaluations of the same beam share it). Arrays are read-only.
    ASCE/SEI 7-22 2.3.1 / 2.4.1 (demand); AISC 360-22 I3.1a, I3.2d.1 (limits), I2.1b (E_c),
    Commentary I3.2 (I_tr), G2.1 (shear), I3.2c.1 (deck)."""
    slab = beam.slab
    x = stations(beam.span, beam.n_stations)
    loads = finished_loads(beam)
    rows, lrfd = _factors(loads)
    pre, post, live = len(loads.precomposite_dead), len(loads.postcomposite_dead), len(loads.live)
    rows += [[0.0] * (pre + post) + [1.0] * live, [0.0] * pre + [1.0] * (post + live)]  # service: L, SD + L
    moments = factored_moment(x, beam.span, loads.dead + loads.live, rows)
    moments.flags.writeable = False
    dem = Demand(*_envelope(moments, lrfd), *_shears(beam, loads))
    service = moments[-2:] if post + live else None
    for arr in (x, dem.mu):
        arr.flags.writeable = False
    lim = slab_limits(beam)
    e_c = float(ec(slab.concrete_pcf, slab.fc_ksi))
    n = float(modular_ratio(e_c))
    i_tr, _ = transformed_inertia(beam.shape, lim.b_eff, n, slab.topping, slab.total_thickness)
    return FinishedBasis(x, loads, dem, service, lim, e_c, n, float(i_tr), web_shear_strength(beam.shape, beam.fy),
                         tuple(deck_checks(beam)))


def evaluate_beam(beam: BeamInput, groups: StudGroups | None = None) -> BeamResult:
    """Evaluate the finished composite beam with the studs in `groups` (default: the studs laid
    out rib by rib by `engine.studs.layout.design_layout`, whose checks then join the beam's)."""
    check_scope(beam)
    shape, slab = beam.shape, beam.slab
    basis = finished_basis(beam)
    x, loads, dem = basis.x, basis.loads, basis.demand
    placed = None
    if groups is None:
        from engine.studs.layout import design_layout  # late import: the layout builds on this module

        placed = design_layout(beam)
        groups = placed.layout.groups()
    mu, ma, vu, va = dem.mu, dem.ma, dem.vu, dem.va

    lim = basis.limits
    b_eff, ac, cf = lim.b_eff, lim.ac, lim.cf
    c, left, right = slab_force(x, groups, cf)
    y_con = slab.total_thickness
    plastic = composite_strength(beam, lim, c)
    mn = plastic.mn

    demand = mu if beam.method == "LRFD" else ma
    capacity = available_strength(beam, mn)
    k = int(np.argmax(demand))
    ratio = np.divide(demand, capacity, out=np.zeros_like(demand), where=capacity > 0)
    g = int(np.argmax(ratio))

    e_c, n, i_tr = basis.ec, basis.n, basis.i_tr
    sum_qn = float(min(left[k], right[k]))
    sum_qn_eff = min(sum_qn, cf)
    composite_ratio = sum_qn_eff / cf
    a_k = float(plastic.a[k])
    i_lb = float(lower_bound_inertia(shape, sum_qn_eff, beam.fy, y_con, a_k)) if sum_qn_eff > 0 else shape.ix
    i_equiv = float(equivalent_inertia(shape.ix, i_tr, sum_qn_eff, cf)) if sum_qn_eff > 0 else shape.ix

    shear = basis.shear
    phi_vn, vn_omega = shear.phi_vn, shear.vn_omega

    live_defl, after_cure_defl = _service_deflections(basis, E_STEEL * i_lb)

    word = "phi Mn" if beam.method == "LRFD" else "Mn/Omega"
    checks = [
        Check(f"flexure, composite ({word} along span)", "AISC 360-22 I3.2a, I3.2d.1, I8.2c",
              float(demand[g]), float(capacity[g]), "kip-in", station=float(x[g])),
        Check("shear, steel web", "AISC 360-22 I4.3, G2.1",
              vu if beam.method == "LRFD" else va, phi_vn if beam.method == "LRFD" else vn_omega, "kip"),
        Check(f"live-load deflection (span/{beam.limits.live_ratio:g})", "AISC 360-22 Commentary I3.2 (I_LB); "
              "limit common practice", live_defl, beam.span / beam.limits.live_ratio, "in", kind="serviceability"),
        Check(f"superimposed dead + live deflection (span/{beam.limits.total_ratio:g})",
              "AISC 360-22 Commentary I3.2 (I_LB); limit common practice",
              after_cure_defl, beam.span / beam.limits.total_ratio, "in", kind="serviceability"),
        Check("degree of composite (min 25%)", "AISC 360-22 Commentary I3.2d (common practice)",
              MIN_COMPOSITE, composite_ratio, "ratio", kind="detailing"),
    ]
    checks += basis.deck_checks
    if placed is None:
        spacing, flags = spacing_checks(beam, groups)
    else:  # the layout's checks hold the spacing checks of the same studs, and its own
        spacing, flags = list(placed.checks), list(placed.flags)
    checks += spacing
    flags += _ductility_flags(beam, composite_ratio, groups)
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


def _service_deflections(basis: FinishedBasis, ei: float) -> tuple[float, float]:
    """Largest deflection (in) under the live load and under superimposed dead + live load on the
    composite section of stiffness `ei` (0 without such loads). AISC 360-22 Commentary I3.2 (I_LB);
    deflection by double integration of M/EI (engine.mechanics.statics)."""
    if basis.service is None:
        return 0.0, 0.0
    y = deflection_rows(basis.x, basis.service / ei).max(axis=1)
    return (float(y[0]) if basis.loads.live else 0.0), float(y[1])


def _ductility_flags(beam: BeamInput, composite_ratio: float, groups: StudGroups) -> list[Flag]:
    """AISC 360-22 I3.2d slip capacity: flagged unless a Commentary exemption applies
    (span <= 30 ft, >= 50% composite, or average stud strength >= 16 kip/ft)."""
    per_ft = float(groups.strength.sum()) / (beam.span / 12.0)
    if slip_capacity_exempt(beam.span, composite_ratio, per_ft):
        return []
    return [Flag("AISC 360-22 I3.2d, Commentary", "slip capacity not checked: span over 30 ft, composite under "
                 f"50% and {per_ft:.1f} kip/ft of studs (< 16): the engineer of record must consider connector "
                 "ductility", severity="not-checked")]
