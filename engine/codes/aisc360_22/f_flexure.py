"""Bare-steel flexure of doubly symmetric rolled I-shapes about the major axis.

AISC 360-22 Chapter F: F1 (Cb), F2 (compact: yielding, lateral-torsional buckling)
and F3 (noncompact or slender flanges: flange local buckling). Webs must be compact
(F4/F5 are out of scope). `shape` is any object with the W-shape attributes
`bf, tf, zx, sx, ry, j, rts, ho, h_tw`. Units: kip, inch, ksi, kip-in.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import lru_cache
from typing import cast, overload

import numpy as np
import numpy.typing as npt

from engine.codes.aisc360_22.i1_materials import E_STEEL
from engine.codes.aisc360_22.rolled_shape import RolledShape

PHI_B = 0.90  # AISC 360-22 F1(a); the same phi_b for composite flexure, I3.2a
OMEGA_B = 1.67  # AISC 360-22 F1(b); the same Omega_b for composite flexure, I3.2a

YIELDING = "yielding"
LTB = "lateral-torsional buckling"
FLB = "flange local buckling"


@dataclass(frozen=True, slots=True)
class FlexureStrength:
    """Nominal major-axis flexural strength of one unbraced length (kip-in, in)."""

    mp: float
    mn: float
    lp: float
    lr: float
    lb: float
    cb: float
    limit_state: str
    clause: str

    @property
    def phi_mn(self) -> float:
        """Design strength (LRFD), kip-in."""
        return PHI_B * self.mn

    @property
    def mn_omega(self) -> float:
        """Allowable strength (ASD), kip-in."""
        return self.mn / OMEGA_B


@dataclass(frozen=True, slots=True)
class UnbracedSegments:
    """Unbraced segments between consecutive brace points, one entry per segment (`cb` and
    `m_max` one row per moment diagram when the diagrams were given as rows)."""

    start: np.ndarray
    end: np.ndarray
    lb: np.ndarray
    cb: np.ndarray
    m_max: np.ndarray


def _positive(name: str, value: float) -> float:
    value = float(value)
    if not (math.isfinite(value) and value > 0.0):
        raise ValueError(f"{name} = {value!r}: must be a finite number > 0")
    return value


def _scalar_or_array(values: np.ndarray) -> float | np.ndarray:
    return float(values) if np.ndim(values) == 0 else values


def lp(shape: RolledShape, fy: float) -> float:
    """Limiting unbraced length for yielding, in.
    AISC 360-22 Eq. F2-5: Lp = 1.76 ry sqrt(E/Fy)."""
    return 1.76 * shape.ry * math.sqrt(E_STEEL / _positive("fy", fy))


def _jc_sxho(shape: RolledShape) -> float:
    # c = 1 for doubly symmetric I-shapes, AISC 360-22 Eq. F2-8a
    return shape.j * 1.0 / (shape.sx * shape.ho)


def lr(shape: RolledShape, fy: float) -> float:
    """Limiting unbraced length for inelastic lateral-torsional buckling, in.
    AISC 360-22 Eq. F2-6 with c = 1 (Eq. F2-8a)."""
    fy = _positive("fy", fy)
    a = _jc_sxho(shape)
    b = 0.7 * fy / E_STEEL
    return 1.95 * shape.rts * (E_STEEL / (0.7 * fy)) * math.sqrt(a + math.sqrt(a * a + 6.76 * b * b))


@overload
def fcr_ltb(shape: RolledShape, lb: float, cb: float = 1.0) -> float: ...
@overload
def fcr_ltb(shape: RolledShape, lb: npt.ArrayLike, cb: float = 1.0) -> float | npt.NDArray[np.float64]: ...
def fcr_ltb(shape: RolledShape, lb: npt.ArrayLike, cb: float = 1.0) -> float | npt.NDArray[np.float64]:
    """Elastic lateral-torsional buckling stress, ksi (lb > 0; scalar or array).
    AISC 360-22 Eq. F2-4 with c = 1 (Eq. F2-8a)."""
    lb_arr = np.asarray(lb, dtype=float)
    if (~np.isfinite(lb_arr)).any() or (lb_arr <= 0.0).any():
        raise ValueError(f"lb = {lb!r}: must be finite and > 0 for Eq. F2-4")
    slenderness_sq = (lb_arr / shape.rts) ** 2
    fcr = cb * math.pi**2 * E_STEEL / slenderness_sq * np.sqrt(1.0 + 0.078 * _jc_sxho(shape) * slenderness_sq)
    return _scalar_or_array(fcr)


def _check_web_compact(shape: RolledShape, fy: float) -> None:
    # AISC 360-22 Table B4.1b case 15: lambda_pw = 3.76 sqrt(E/Fy)
    limit = 3.76 * math.sqrt(E_STEEL / fy)
    if shape.h_tw > limit:
        raise ValueError(
            f"{getattr(shape, 'name', 'shape')}: h/tw = {shape.h_tw:.1f} > 3.76 sqrt(E/Fy) = {limit:.1f} "
            f"at Fy = {fy:g} ksi; noncompact or slender web (AISC 360-22 F4/F5) is not in scope"
        )


def _mn_ltb(shape: RolledShape, fy: float, lb: float, cb: float, mp: float, lp_: float, lr_: float) -> tuple[float, str]:
    """Lateral-torsional buckling Mn (<= Mp) and its equation, or (Mp, "") when Lb <= Lp.
    AISC 360-22 F2.2, Eqs. F2-2 and F2-3."""
    if lb <= lp_:
        return mp, ""
    if lb <= lr_:
        mn = cb * (mp - (mp - 0.7 * fy * shape.sx) * (lb - lp_) / (lr_ - lp_))
        return min(mn, mp), "Eq. F2-2"
    return min(fcr_ltb(shape, lb, cb) * shape.sx, mp), "Eq. F2-3"


def _mn_flb(shape: RolledShape, fy: float, mp: float) -> tuple[float, str]:
    """Compression flange local buckling Mn and its equation, or (Mp, "") for compact flanges.
    AISC 360-22 F3.2, Eqs. F3-1 and F3-2; limits from Table B4.1b case 10."""
    lam = shape.bf / (2.0 * shape.tf)
    lam_p = 0.38 * math.sqrt(E_STEEL / fy)
    lam_r = 1.0 * math.sqrt(E_STEEL / fy)
    if lam <= lam_p:
        return mp, ""
    if lam <= lam_r:
        return mp - (mp - 0.7 * fy * shape.sx) * (lam - lam_p) / (lam_r - lam_p), "Eq. F3-1"
    kc = min(max(4.0 / math.sqrt(shape.h_tw), 0.35), 0.76)
    return 0.9 * E_STEEL * kc * shape.sx / lam**2, "Eq. F3-2"


@lru_cache(maxsize=256)
def _shape_terms(shape: RolledShape, fy: float) -> tuple[float, float, float, float, str]:
    """Mp, Lp, Lr and the flange local buckling Mn with its equation, once per shape and Fy.
    AISC 360-22 Eqs. F2-1, F2-5, F2-6, F3-1, F3-2; compact webs only (Table B4.1b case 15)."""
    _check_web_compact(shape, fy)
    mp = fy * shape.zx  # AISC 360-22 Eq. F2-1
    mn_flb, eq_flb = _mn_flb(shape, fy, mp)
    return mp, lp(shape, fy), lr(shape, fy), mn_flb, eq_flb


def flexure_strength(shape: RolledShape, fy: float, lb: float, cb: float = 1.0) -> FlexureStrength:
    """Nominal flexural strength for unbraced length lb (in) and Cb; the least limit state governs.
    AISC 360-22 F2 (compact flanges) or F3 (noncompact/slender flanges), compact webs only."""
    fy = _positive("fy", fy)
    lb = float(lb)
    if not (math.isfinite(lb) and lb >= 0.0):
        raise ValueError(f"lb = {lb!r}: must be a finite length >= 0 in")
    cb = float(cb)
    if not (math.isfinite(cb) and cb >= 1.0 - 1e-9):
        raise ValueError(f"cb = {cb!r}: must be >= 1.0 (AISC 360-22 Eq. F1-1)")
    mp, lp_, lr_, mn_flb, eq_flb = _shape_terms(shape, fy)
    mn_ltb, eq_ltb = _mn_ltb(shape, fy, lb, cb, mp, lp_, lr_)

    if not eq_flb:  # compact flange: F2
        if eq_ltb:
            mn, state, clause = mn_ltb, LTB, f"AISC 360-22 F2.2, {eq_ltb}"
        else:
            mn, state, clause = mp, YIELDING, "AISC 360-22 F2.1, Eq. F2-1"
    elif eq_ltb and mn_ltb <= mn_flb:
        mn, state, clause = mn_ltb, LTB, f"AISC 360-22 F3.1 (F2.2, {eq_ltb})"
    else:
        mn, state, clause = mn_flb, FLB, f"AISC 360-22 F3.2, {eq_flb}"
    return FlexureStrength(mp=mp, mn=mn, lp=lp_, lr=lr_, lb=lb, cb=cb, limit_state=state, clause=clause)


def cb_from_moments(m_max: npt.ArrayLike, m_a: npt.ArrayLike, m_b: npt.ArrayLike,
                    m_c: npt.ArrayLike) -> float | npt.NDArray[np.float64]:
    """Lateral-torsional buckling modification factor from absolute moments (scalar or array).
    AISC 360-22 Eq. F1-1; Cb = 1.0 where Mmax = 0 (no moment, value immaterial)."""
    # cast: numpy's stubs type ufunc results (np.abs) as Any
    m_max, m_a, m_b, m_c = (cast("npt.NDArray[np.float64]", np.abs(np.asarray(v, dtype=float))) for v in (m_max, m_a, m_b, m_c))
    denominator = 2.5 * m_max + 3.0 * m_a + 4.0 * m_b + 3.0 * m_c
    with np.errstate(divide="ignore", invalid="ignore"):
        cb = np.where(m_max > 0.0, 12.5 * m_max / denominator, 1.0)
    return _scalar_or_array(cb)


def _check_diagram(x: npt.ArrayLike, moment: npt.ArrayLike) -> tuple[npt.NDArray[np.float64], npt.NDArray[np.float64]]:
    x = np.asarray(x, dtype=float)
    moment = np.asarray(moment, dtype=float)
    if x.ndim != 1 or moment.ndim not in (1, 2) or moment.shape[-1] != x.size or x.size < 2:
        raise ValueError(f"x must be 1-D of length >= 2 and moment one diagram or rows of diagrams along it, "
                         f"got {x.shape} and {moment.shape}")
    if not (np.all(np.isfinite(x)) and np.all(np.isfinite(moment))):
        raise ValueError("x and moment must be finite")
    if np.any(np.diff(x) <= 0.0):
        raise ValueError("x must be strictly increasing")
    return x, moment


def _segment_moments(
    x: npt.NDArray[np.float64], moment: npt.NDArray[np.float64], start: npt.NDArray[np.float64], end: npt.NDArray[np.float64]
) -> tuple[npt.NDArray[np.float64], npt.NDArray[np.float64], npt.NDArray[np.float64], npt.NDArray[np.float64]]:
    """Mmax and |M| at the quarter points (M_A, M_B, M_C) of segments [start, end] (arrays), for
    one diagram `moment` (n,) or rows of diagrams (r, n) at stations x; each result is shaped
    moment.shape[:-1] + start.shape.
    AISC 360-22 Eq. F1-1 terms: quarter-point moments interpolated linearly (then |M|), Mmax the
    largest |M| at the stations within the segment and at its ends."""
    lead, rows = moment.shape[:-1], moment.reshape(-1, x.size)

    def size_at(points: np.ndarray) -> np.ndarray:  # |M| of every diagram at `points`
        # cast: numpy's stubs type np.abs results as Any
        return cast(np.ndarray, np.abs(np.array([np.interp(points, x, m) for m in rows])).reshape(lead + points.shape))

    quarters = start[..., None] + (end - start)[..., None] * np.array([0.25, 0.5, 0.75])
    m_a, m_b, m_c = np.moveaxis(size_at(quarters), -1, 0)
    inside = (x >= start[..., None]) & (x <= end[..., None])
    size = np.abs(moment).reshape(lead + (1,) * start.ndim + (x.size,))
    m_stations = np.where(inside, size, 0.0).max(axis=-1)
    m_ends = np.maximum(size_at(start), size_at(end))
    m_max = np.maximum(m_stations, m_ends)
    return m_max, m_a, m_b, m_c


def cb_for_segment(x: npt.ArrayLike, moment: npt.ArrayLike, start: npt.ArrayLike,
                   end: npt.ArrayLike) -> float | npt.NDArray[np.float64]:
    """Cb of the unbraced segment(s) [start, end] from a moment diagram sampled at stations x
    (or rows of diagrams: one row of Cb each).
    AISC 360-22 Eq. F1-1; quarter-point moments interpolated linearly, Mmax over the segment."""
    x, moment = _check_diagram(x, moment)
    start, end = np.broadcast_arrays(np.asarray(start, dtype=float), np.asarray(end, dtype=float))
    if np.any(~(start < end)) or np.any(start < x[0]) or np.any(end > x[-1]):
        raise ValueError(f"segments must satisfy {x[0]:g} <= start < end <= {x[-1]:g} in")
    m_max, m_a, m_b, m_c = _segment_moments(x, moment, start, end)
    return cb_from_moments(m_max, m_a, m_b, m_c)


def unbraced_segments(x: npt.ArrayLike, moment: npt.ArrayLike, brace_points: npt.ArrayLike) -> UnbracedSegments:
    """Lb, Cb and Mmax of every segment between brace points; the beam ends x[0], x[-1] count as braced.
    `moment` is one diagram at stations x or rows of diagrams (Cb and Mmax then per row).
    AISC 360-22 F1 (Lb, Eq. F1-1)."""
    x, moment = _check_diagram(x, moment)
    braces = np.asarray(brace_points, dtype=float).ravel()
    if np.any(~np.isfinite(braces)) or np.any(braces < x[0]) or np.any(braces > x[-1]):
        raise ValueError(f"brace points must lie within {x[0]:g} to {x[-1]:g} in, got {braces.tolist()}")
    points = np.unique(np.concatenate([[x[0]], braces, [x[-1]]]))
    start, end = points[:-1], points[1:]
    m_max, m_a, m_b, m_c = _segment_moments(x, moment, start, end)
    cb = cast("npt.NDArray[np.float64]", cb_from_moments(m_max, m_a, m_b, m_c))  # cast: segments are 1-D, so Cb is an array
    return UnbracedSegments(start=start, end=end, lb=end - start, cb=cb, m_max=m_max)
