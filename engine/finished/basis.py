"""What the finished-beam evaluation of one beam needs whatever studs it has: demand along the span
(ASCE/SEI 7-22 2.3.1, 2.4.1), slab limits (AISC 360-22 I3.1a, I3.2d.1), plastic strength for any slab
force (I3.2a), E_c, n, I_tr and the web shear strength (G2.1). Placement, as-built and repair
evaluations of the same beam share it."""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

import numpy as np

from engine.codes.aisc360_22.g_shear import ShearStrength, web_shear_strength
from engine.codes.aisc360_22.f_flexure import OMEGA_B, PHI_B
from engine.codes.aisc360_22.i1_materials import ec, modular_ratio
from engine.codes.aisc360_22.i3_composite import b_eff as total_effective_width
from engine.codes.aisc360_22.i3_composite import PlasticMoment, cf_force, plastic_moment, stress_block_force, transformed_inertia
from engine.codes.asce7_22 import combinations
from engine.finished.loads import FinishedLoads, finished_loads, load_factors
from engine.mechanics.statics import factored_max_abs_shear, factored_moment, stations
from engine.model.inputs import BeamInput, Method

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
    lrfd = combinations(Method.LRFD)
    return load_factors(loads, lrfd + combinations(Method.ASD)), len(lrfd)


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


def composite_strength(beam: BeamInput, limits: SlabLimits, c: np.ndarray) -> PlasticMoment:
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
    return PHI_B * mn if method == Method.LRFD else mn / OMEGA_B


@dataclass(frozen=True, slots=True)
class FinishedBasis:
    """What the finished-beam evaluation of one beam needs whatever studs it has: stations `x`,
    loads and their demand, the service moments (live; superimposed dead + live; kip-in, None
    without such loads), slab limits, E_c, n, I_tr and the web shear strength."""

    x: np.ndarray
    loads: FinishedLoads
    demand: Demand
    service: np.ndarray | None
    limits: SlabLimits
    ec: float
    n: float
    i_tr: float
    shear: ShearStrength


def demand_stations(beam: BeamInput) -> np.ndarray:
    """The evaluation grid: equal stations along the span plus every point-load position, so the
    demand under each load is evaluated exactly (the moment peaks there). Statics of a simple span."""
    x = stations(beam.span, beam.n_stations)
    if not beam.point_loads:
        return x
    return np.union1d(x, [min(max(p.x, 0.0), beam.span) for p in beam.point_loads])


@lru_cache(maxsize=64)
def finished_basis(beam: BeamInput) -> FinishedBasis:
    """The stud-independent part of `evaluate_beam`, computed once per beam input (layout, as-built
    and repair evaluations of the same beam share it). Arrays are read-only.
    ASCE/SEI 7-22 2.3.1 / 2.4.1 (demand); AISC 360-22 I3.1a, I3.2d.1 (limits), I2.1b (E_c),
    Commentary I3.2 (I_tr), G2.1 (shear)."""
    slab = beam.slab
    x = demand_stations(beam)
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
    return FinishedBasis(x, loads, dem, service, lim, e_c, n, float(i_tr), web_shear_strength(beam.shape, beam.fy))
