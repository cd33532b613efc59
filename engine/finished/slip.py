"""Slip capacity of the studs: AISC 360-22 I3.2d.1 requires it to be considered. Each shear span
(support to the point of maximum moment) is spared by a Commentary condition, or its
slip-limited strength Mn,sc is found by the Commentary's analytical method."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from engine.codes.aisc360_22.f_flexure import OMEGA_B, PHI_B
from engine.codes.aisc360_22.i1_materials import E_STEEL
from engine.codes.aisc360_22.i3_composite import (
    SLIP_CAPACITY,
    SLIP_EXEMPT_COMPOSITE,
    SLIP_EXEMPT_KIP_PER_FT,
    SLIP_EXEMPT_SPAN,
    slip_coefficients,
    slip_exemption,
    slip_limited_moment,
)
from engine.finished.basis import FinishedBasis
from engine.model.inputs import BeamInput, Method
from engine.model.results import Check, Flag

SLIP_CLAUSE = "AISC 360-22 I3.2d.1; Commentary I3.2d analytical method, S_u = 0.25 in"


@dataclass(frozen=True, slots=True)
class SlipSide:
    """One shear span: its length (in), sum Q_n of its studs (kip), the Commentary condition that
    spares it (None when none applies) and then its slip-limited strength Mn,sc (kip-in)."""

    length: float
    sum_qn: float
    exemption: str | None
    mn_sc: float | None


def section_coefficients(beam: BeamInput, basis: FinishedBasis) -> tuple[float, float]:
    """K1, K2 of the section: steel W shape and the concrete above the deck (width b_eff,
    thickness t_c, centroid t_c / 2 below the top of slab). AISC 360-22 Commentary I3.2d."""
    slab, shape = beam.slab, beam.shape
    tc = slab.topping if slab.deck is not None else slab.total_thickness
    b = basis.limits.b_eff
    e = shape.d / 2.0 + slab.total_thickness - tc / 2.0
    return slip_coefficients(E_STEEL * shape.ix, E_STEEL * shape.area, basis.ec * b * tc**3 / 12.0,
                             basis.ec * b * tc, e)


def exemptions_apply(beam: BeamInput) -> bool:
    """The Commentary's exemptions are stated for uniformly loaded beams: no point loads, or equal
    point loads equally spaced along the span (AISC 360-22 Commentary I3.2d)."""
    loads = beam.point_loads
    if not loads:
        return True
    n = len(loads)
    xs = sorted(p.x for p in loads)
    spaced = all(abs(x - beam.span * (i + 1) / (n + 1)) <= 0.01 * beam.span for i, x in enumerate(xs))
    same = all(abs(p.dead - loads[0].dead) <= 1e-6 and abs(p.live - loads[0].live) <= 1e-6 for p in loads)
    return spaced and same


def _shape_integrals(x: np.ndarray, demand: np.ndarray, k: int) -> tuple[float, float]:
    """Integral of m(x) = M(x) / M(x_k) over each shear span (in), trapezoid rule on the stations."""
    m = demand / demand[k] if demand[k] > 0.0 else np.zeros_like(demand)
    left = float(np.sum(0.5 * np.diff(x[: k + 1]) * (m[:k] + m[1: k + 1])))
    right = float(np.sum(0.5 * np.diff(x[k:]) * (m[k:-1] + m[k + 1:])))
    return left, right


def slip_sides(beam: BeamInput, basis: FinishedBasis, k: int, demand: np.ndarray,
               sum_qn: tuple[float, float]) -> tuple[SlipSide, SlipSide]:
    """Both shear spans about the maximum moment at station index k. As in the Commentary's
    method, the studs' force builds up evenly from each support, integral C dx = sum Q_n a / 2
    over a shear span of length a (for an end-heavy layout the real integral is larger: the
    method is conservative there). AISC 360-22 I3.2d.1, Commentary I3.2d."""
    x = basis.x
    xk = float(x[k])
    k1, k2 = section_coefficients(beam, basis)
    shapes = _shape_integrals(x, demand, k)
    cf = basis.limits.cf
    allowed = exemptions_apply(beam)
    out = []
    for h, length in enumerate((xk, beam.span - xk)):
        force = sum_qn[h] * length / 2.0
        ratio = min(sum_qn[h], cf) / cf if cf > 0.0 else 0.0
        per_ft = sum_qn[h] / (length / 12.0) if length > 0.0 else 0.0
        exempt = slip_exemption(beam.span, ratio, per_ft) if allowed else None
        mn_sc = None if exempt or shapes[h] <= 0.0 else slip_limited_moment(k1, k2, force, shapes[h])
        out.append(SlipSide(length, sum_qn[h], exempt, mn_sc))
    return out[0], out[1]


def slip_results(beam: BeamInput, sides: tuple[SlipSide, SlipSide], demand_k: float, xk: float
                 ) -> tuple[list[Check], list[Flag]]:
    """The slip-capacity check where a shear span needs the analytical method (phi_b Mn,sc or
    Mn,sc / Omega_b against the maximum demand), else a note naming the exemptions.
    AISC 360-22 I3.2d.1, Commentary I3.2d."""
    ends = (beam.ribs.reference_end, beam.ribs.far_end)
    evaluated = [(ends[h], s.mn_sc) for h, s in enumerate(sides) if s.mn_sc is not None]
    if not evaluated:
        if not exemptions_apply(beam):
            return [], [Flag(SLIP_CLAUSE, "slip capacity not evaluated: the loading is not uniform and the shear "
                             "spans carry no moment to evaluate", severity="not-checked")]
        why = "; ".join(f"{ends[h]} shear span: {s.exemption}" for h, s in enumerate(sides))
        return [], [Flag("AISC 360-22 I3.2d.1, Commentary I3.2d", f"slip capacity: Commentary exemption ({why})",
                         severity="info")]
    side, mn_sc = min(evaluated, key=lambda e: e[1])
    available = PHI_B * mn_sc if beam.method == Method.LRFD else mn_sc / OMEGA_B
    word = "phi Mn,sc" if beam.method == Method.LRFD else "Mn,sc/Omega"
    check = Check("composite.slip_capacity", f"stud slip capacity ({word}, {side} shear span)", SLIP_CLAUSE,
                  demand_k, available, "kip-in", station=xk,
                  note="no Commentary exemption applies" + ("" if exemptions_apply(beam) else " (loading not uniform)"))
    return [check], []


def slip_floor(beam: BeamInput, basis: FinishedBasis, demand: np.ndarray) -> float:
    """Sum Q_n each side (kip) that meets the slip rules with the studs spread evenly along each
    shear span (integral C dx = sum Q_n a / 2): the least of the Commentary's 50 % and 16 kip/ft
    conditions (where they apply) and the analytical method's need; 0 for spans of 30 ft or less.
    AISC 360-22 I3.2d.1, Commentary I3.2d."""
    allowed = exemptions_apply(beam)
    if allowed and beam.span <= SLIP_EXEMPT_SPAN:
        return 0.0
    k = int(np.argmax(demand))
    xk = float(basis.x[k])
    required = demand[k] / PHI_B if beam.method == Method.LRFD else demand[k] * OMEGA_B
    k1, k2 = section_coefficients(beam, basis)
    shapes = _shape_integrals(basis.x, demand, k)
    floor = 0.0
    for length, shape in zip((xk, beam.span - xk), shapes):
        if length <= 0.0 or shape <= 0.0:
            continue
        options = [max(2.0 * (k1 * shape * required - SLIP_CAPACITY) / (k2 * length), 0.0)]
        if allowed:
            options += [SLIP_EXEMPT_COMPOSITE * basis.limits.cf, SLIP_EXEMPT_KIP_PER_FT * length / 12.0]
        floor = max(floor, min(options))
    return floor
