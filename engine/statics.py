"""Simple-span statics on a station grid: reactions, V, M, deflection with EI(x), ponding.

Stations run from the left support (x = 0) to the right support (x = span), inches.
Loads act downward when positive. Deflection is positive downward, moment positive sagging.
"""

from __future__ import annotations

import math
from collections.abc import Iterable
from dataclasses import dataclass

import numpy as np

_BLOCK = 13  # stations per block of the prefix product in ponded_deflection (speed only)


@dataclass(frozen=True, slots=True)
class UniformLoad:
    """w kip/in downward over [start, end] in; end None runs to the far support."""

    w: float
    start: float = 0.0
    end: float | None = None

    def __post_init__(self) -> None:
        if not math.isfinite(self.w):
            raise ValueError(f"uniform load w = {self.w} must be finite")
        if not (math.isfinite(self.start) and self.start >= 0.0):
            raise ValueError(f"uniform load start = {self.start} in must be >= 0")
        if self.end is not None and not (math.isfinite(self.end) and self.end > self.start):
            raise ValueError(f"uniform load end = {self.end} in must exceed start = {self.start} in")


@dataclass(frozen=True, slots=True)
class PointLoad:
    """p kip downward at x in from the left support."""

    p: float
    x: float

    def __post_init__(self) -> None:
        if not math.isfinite(self.p):
            raise ValueError(f"point load p = {self.p} must be finite")
        if not (math.isfinite(self.x) and self.x >= 0.0):
            raise ValueError(f"point load position x = {self.x} in must be >= 0")


Load = UniformLoad | PointLoad


class PondingInstability(ValueError):
    """The deflection-dependent load has no stable equilibrium: the beam is too flexible."""


def stations(span: float, n: int = 401) -> np.ndarray:
    """Equally spaced stations from 0 to span inclusive (use n >= 201 for reports).

    Grid definition (DESIGN.md, Statics); n >= 3 is required.
    """
    if not (math.isfinite(span) and span > 0.0):
        raise ValueError(f"span = {span} in must be > 0")
    if n < 3:
        raise ValueError(f"n = {n} stations must be >= 3")
    return np.linspace(0.0, float(span), int(n))


def _span_of(load: UniformLoad, span: float) -> tuple[float, float]:
    end = span if load.end is None else load.end
    if end > span * (1.0 + 1e-12):
        raise ValueError(f"uniform load end = {end} in lies beyond the span {span} in")
    return load.start, min(end, span)


def _check_loads(span: float, loads: Iterable[Load]) -> tuple[Load, ...]:
    if not (math.isfinite(span) and span > 0.0):
        raise ValueError(f"span = {span} in must be > 0")
    loads = tuple(loads)
    for load in loads:
        if isinstance(load, UniformLoad):
            _span_of(load, span)
        elif isinstance(load, PointLoad):
            if load.x > span * (1.0 + 1e-12):
                raise ValueError(f"point load x = {load.x} in lies beyond the span {span} in")
        else:
            raise TypeError(f"unknown load {load!r}; expected UniformLoad or PointLoad")
    return loads


def reactions(span: float, loads: Iterable[Load]) -> tuple[float, float]:
    """Left and right support reactions (kip, upward positive) of a simple span.

    Statics (sum of moments about each support); AISC Manual Table 3-23 (simple beam diagrams).
    """
    left = right = 0.0
    for load in _check_loads(span, loads):
        if isinstance(load, UniformLoad):
            a, b = _span_of(load, span)
            total, centroid = load.w * (b - a), 0.5 * (a + b)
        else:
            total, centroid = load.p, min(load.x, span)
        right += total * centroid / span
        left += total * (span - centroid) / span
    return left, right


def _shear_moment(
    x: np.ndarray, span: float, loads: tuple[Load, ...], right_side: bool
) -> tuple[np.ndarray, np.ndarray]:
    shear = np.zeros_like(x)
    moment = np.zeros_like(x)
    for load in loads:
        if isinstance(load, UniformLoad):
            a, b = _span_of(load, span)
            total = load.w * (b - a)
            r_left = total * (span - 0.5 * (a + b)) / span
            loaded = np.clip(x - a, 0.0, b - a)  # loaded length left of x
            shear += r_left - load.w * loaded
            moment += r_left * x - load.w * loaded * (x - a - 0.5 * loaded)
        else:
            c = min(load.x, span)
            r_left = load.p * (span - c) / span
            past = x >= c if right_side else x > c
            shear += r_left - load.p * past
            moment += r_left * x - load.p * np.maximum(x - c, 0.0)
    return shear, moment


def shear_moment(x: np.ndarray, span: float, loads: Iterable[Load]) -> tuple[np.ndarray, np.ndarray]:
    """Exact V (kip) and M (kip-in, sagging +) at x; V is taken just right of a point load.

    Statics of a simple beam, closed forms of AISC Manual Table 3-23 (simple beam diagrams).
    """
    x = np.asarray(x, dtype=float)
    return _shear_moment(x, span, _check_loads(span, loads), right_side=True)


def max_abs_shear(span: float, loads: Iterable[Load]) -> float:
    """Largest |V| (kip) on the span, both sides of every point load included.

    V is piecewise linear, so its extremes sit at supports and load limits (statics).
    """
    loads = _check_loads(span, loads)
    points = [0.0, span]
    for load in loads:
        points.extend(_span_of(load, span) if isinstance(load, UniformLoad) else (min(load.x, span),))
    xs = np.asarray(points)
    left, _ = _shear_moment(xs, span, loads, right_side=False)
    right, _ = _shear_moment(xs, span, loads, right_side=True)
    return float(max(np.abs(left).max(), np.abs(right).max()))


def _check_grid(x: np.ndarray, span: float | None = None) -> np.ndarray:
    x = np.asarray(x, dtype=float)
    if x.ndim != 1 or x.size < 3:
        raise ValueError(f"stations must be a 1-D array of >= 3 values, got shape {x.shape}")
    if not (np.all(np.diff(x) >= 0.0) and x[-1] > x[0]):
        raise ValueError("stations must be non-decreasing (a station may repeat to carry a jump)")
    if span is not None and (abs(x[0]) > 1e-9 * span or abs(x[-1] - span) > 1e-9 * span):
        raise ValueError(f"stations must run from 0 to span = {span} in, got {x[0]} to {x[-1]}")
    return x


def _per_station(value: float | np.ndarray, x: np.ndarray, name: str, positive: bool) -> np.ndarray:
    arr = np.broadcast_to(np.asarray(value, dtype=float), x.shape)
    bad = ~(arr > 0.0) if positive else ~(arr >= 0.0)
    if np.any(bad | ~np.isfinite(arr)):
        limit = "> 0" if positive else ">= 0"
        raise ValueError(f"{name} must be finite and {limit} at every station")
    return arr


def deflection_from_curvature(x: np.ndarray, curvature: np.ndarray) -> np.ndarray:
    """Deflection (in, downward +) from curvature M/EI (1/in), zero at x[0] and x[-1].

    Euler-Bernoulli y'' = -M/EI integrated exactly for curvature linear between stations.

    A jump in curvature (a step in EI) between two stations is smeared over that interval
    (error of order h/L); repeat the station at the step, left value first, to make it exact.
    """
    x = _check_grid(x)
    kappa = np.asarray(curvature, dtype=float)
    if kappa.shape != x.shape:
        raise ValueError(f"curvature shape {kappa.shape} differs from stations {x.shape}")
    h = np.diff(x)
    # slope with zero start slope: trapezoid of linear curvature
    slope = np.empty_like(x)
    slope[0] = 0.0
    np.cumsum(-0.5 * h * (kappa[:-1] + kappa[1:]), out=slope[1:])
    # deflection: exact double integral of a linear curvature over each interval
    steps = h * slope[:-1] - h * h * (kappa[:-1] / 3.0 + kappa[1:] / 6.0)
    y = np.empty_like(x)
    y[0] = 0.0
    np.cumsum(steps, out=y[1:])
    return y - y[-1] * (x - x[0]) / (x[-1] - x[0])


def deflection(
    x: np.ndarray, span: float, loads: Iterable[Load], ei: float | np.ndarray
) -> np.ndarray:
    """Deflection (in, downward +) of a simple span with EI (kip-in^2) scalar or per station.

    Exact M at stations over EI, integrated twice (deflection_from_curvature).
    """
    x = _check_grid(x, span)
    ei = _per_station(ei, x, "EI", positive=True)
    _, moment = _shear_moment(x, span, _check_loads(span, loads), right_side=True)
    return deflection_from_curvature(x, moment / ei)


def _transfer_matrices(
    x: np.ndarray, flex: np.ndarray, k: np.ndarray, kappa: np.ndarray, kappa_probe: np.ndarray
) -> np.ndarray:
    """Station-to-station maps of (m, v, y, slope, 1, 1) for load k*y, linear between stations.

    The same exact-for-linear integration as deflection_from_curvature, applied twice.
    """
    h = np.diff(x)
    h2 = h * h
    f0, f1, k0, k1 = flex[:-1], flex[1:], k[:-1], k[1:]
    alpha, gamma = h2 * k1 / 6.0, h2 * f1 / 6.0
    det = 1.0 - alpha * gamma
    if np.any(det <= 0.0):
        raise PondingInstability("deflection-dependent load is too stiff for the station spacing")
    # rows before coupling: m_next + alpha*y_next = row_m . z,  y_next + gamma*m_next = row_y . z
    row_m = np.zeros((h.size, 6))
    row_m[:, 0], row_m[:, 1], row_m[:, 2] = 1.0, h, -h2 * k0 / 3.0
    row_y = np.zeros((h.size, 6))
    row_y[:, 0], row_y[:, 2], row_y[:, 3] = -h2 * f0 / 3.0, 1.0, h
    row_y[:, 4] = -h2 * (kappa[:-1] / 3.0 + kappa[1:] / 6.0)
    row_y[:, 5] = -h2 * (kappa_probe[:-1] / 3.0 + kappa_probe[1:] / 6.0)
    maps = np.zeros((h.size, 6, 6))
    maps[:, 0] = (row_m - alpha[:, None] * row_y) / det[:, None]
    maps[:, 2] = (row_y - gamma[:, None] * row_m) / det[:, None]
    maps[:, 1] = -0.5 * (h * k1)[:, None] * maps[:, 2]
    maps[:, 1, 1] += 1.0
    maps[:, 1, 2] -= 0.5 * h * k0
    maps[:, 3] = -0.5 * (h * f1)[:, None] * maps[:, 0]
    maps[:, 3, 0] -= 0.5 * h * f0
    maps[:, 3, 3] += 1.0
    maps[:, 3, 4] -= 0.5 * h * (kappa[:-1] + kappa[1:])
    maps[:, 3, 5] -= 0.5 * h * (kappa_probe[:-1] + kappa_probe[1:])
    maps[:, 4, 4] = maps[:, 5, 5] = 1.0
    return maps


def _prefix_states(steps: np.ndarray, columns: list[int], block: int) -> tuple[np.ndarray, np.ndarray]:
    """Deflection row at every station and the full far-end state, for unit starts in `columns`.

    Blocked prefix product of the maps: sequential inside blocks (vectorised over blocks),
    then a doubling scan over the block totals.
    """
    count, dim = steps.shape[0], steps.shape[1]
    blocks = -(-count // block)
    padded = np.broadcast_to(np.eye(dim), (blocks * block, dim, dim)).copy()
    padded[:count] = steps
    padded = padded.reshape(blocks, block, dim, dim).transpose(1, 0, 2, 3).copy()
    inner = np.empty_like(padded)
    inner[0] = padded[0]
    for j in range(1, block):
        np.matmul(padded[j], inner[j - 1], out=inner[j])
    totals = inner[-1].copy()
    shift = 1
    while shift < blocks:
        totals[shift:] = totals[shift:] @ totals[:-shift]
        shift *= 2
    carry = np.empty((blocks, dim, len(columns)))
    carry[0] = np.eye(dim)[:, columns]
    carry[1:] = totals[:-1][:, :, columns]
    rows = (inner[:, :, 2:3] @ carry).transpose(1, 0, 2, 3).reshape(blocks * block, len(columns))
    last, pos = divmod(count - 1, block)
    return np.concatenate([carry[0, 2:3], rows[:count]]), inner[pos, last] @ carry[last]


def ponded_deflection(
    x: np.ndarray,
    span: float,
    loads: Iterable[Load],
    ei: float | np.ndarray,
    k: float | np.ndarray,
) -> np.ndarray:
    """Deflection (in, downward +) with the extra load k(x)*y(x) (k in kip/in per in), solved exactly.

    Linear ponding equilibrium (REFERENCE.md §2, Closed form, D), solved on the grid.

    Solves y = y_0 + A K y for the discrete operator A of `deflection`. Stability: A is entrywise
    positive, so (Perron-Frobenius) the largest eigenvalue of A K is < 1 exactly when the response
    to a positive probe load stays positive; otherwise PondingInstability is raised.
    """
    x = _check_grid(x, span)
    flex = 1.0 / _per_station(ei, x, "EI", positive=True)
    k = _per_station(k, x, "ponding stiffness k", positive=False)
    _, moment = _shear_moment(x, span, _check_loads(span, loads), right_side=True)
    probe_moment = 0.5 * x * (span - x)  # unit uniform load, kip-in per kip/in
    steps = _transfer_matrices(x, flex, k, moment * flex, probe_moment * flex)
    # unknown start values: shear and slope; unit columns: base load and probe load
    deflections, end = _prefix_states(steps, [1, 3, 4, 5], _BLOCK)
    ends = end[[0, 2]]  # moment and deflection at the far support must vanish
    if not np.all(np.isfinite(deflections)) or not np.all(np.isfinite(ends)):
        raise PondingInstability("ponding load makes the beam singular (critical stiffness)")
    try:
        starts = np.linalg.solve(ends[:, :2], -ends[:, 2:])
    except np.linalg.LinAlgError as exc:
        raise PondingInstability("ponding load makes the beam singular (critical stiffness)") from exc
    y_base, y_probe = (deflections[:, :2] @ starts + deflections[:, 2:]).T
    inside = (x > x[0]) & (x < x[-1])
    if not (np.all(np.isfinite(y_base)) and np.all(y_probe[inside] > 0.0)):
        crit = float(np.max(k) * span**4 * np.max(flex) / math.pi**4)
        raise PondingInstability(
            "ponding is unstable: the deflection-dependent load exceeds the beam's stiffness "
            f"(first-mode ratio k L^4/(pi^4 EI) with the largest k and least EI = {crit:.3g})"
        )
    y_base = y_base.copy()
    y_base[0] = y_base[-1] = 0.0
    return y_base
