"""Simple-span statics on a station grid: reactions, V, M, deflection with EI(x), ponding.

Stations run from the left support (x = 0) to the right support (x = span), inches.
Loads act downward when positive. Deflection is positive downward, moment positive sagging.
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Sequence
from dataclasses import dataclass
from typing import Literal, cast, overload

import numpy as np
import numpy.typing as npt
from engine.model.errors import FieldcompError

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


class PondingInstabilityError(FieldcompError, ValueError):
    """The deflection-dependent load has no stable equilibrium: the beam is too flexible."""


def stations(span: float, n: int = 401) -> np.ndarray:
    """Equally spaced stations from 0 to span inclusive (use n >= 201 for reports).

    Grid definition of this tool; n >= 3 is required.
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


@overload
def _effects(
    x: np.ndarray, span: float, loads: tuple[Load, ...], right_side: bool | np.ndarray,
    factors: np.ndarray | None = None, with_shear: Literal[True] = True,
) -> tuple[np.ndarray, np.ndarray]: ...
@overload
def _effects(
    x: np.ndarray, span: float, loads: tuple[Load, ...], right_side: bool | np.ndarray,
    factors: np.ndarray | None = None, *, with_shear: Literal[False],
) -> tuple[None, np.ndarray]: ...
def _effects(
    x: np.ndarray, span: float, loads: tuple[Load, ...], right_side: bool | np.ndarray,
    factors: np.ndarray | None = None, with_shear: bool = True,
) -> tuple[np.ndarray | None, np.ndarray]:
    """V and M (rows, x.size) of checked loads; row r scales load j by factors[r, j] (one row of
    the loads as given when factors is None; V None unless `with_shear`). V is taken just right
    of a point load where `right_side` (True, False or per station), else just left of it. The
    loads are evaluated together and summed in their order, so a row equals the loop over the
    loads it replaces."""
    rows = 1 if factors is None else len(factors)
    shear = np.zeros((rows, x.size)) if with_shear else None
    moment = np.zeros((rows, x.size))
    uniform = [j for j, load in enumerate(loads) if isinstance(load, UniformLoad)]
    point = [j for j, load in enumerate(loads) if not isinstance(load, UniformLoad)]
    parts: dict[int, tuple[np.ndarray | None, np.ndarray]] = {}
    if uniform:  # cast: `uniform` indexes the UniformLoads, `point` the PointLoads
        ab = np.array([_span_of(cast(UniformLoad, loads[j]), span) for j in uniform])
        a, b = ab[:, :1], ab[:, 1:]
        w = np.array([cast(UniformLoad, loads[j]).w for j in uniform])
        w = (w[None, :] if factors is None else w * factors[:, uniform])[:, :, None]
        r_left = w * (b - a) * (span - 0.5 * (a + b)) / span
        loaded = np.minimum(np.maximum(x - a, 0.0), b - a)  # loaded length left of x
        wl = w * loaded
        v = r_left - wl if with_shear else None
        m = r_left * x - wl * (x - a - 0.5 * loaded)
        parts.update((j, (None if v is None else v[:, i], m[:, i])) for i, j in enumerate(uniform))
    if point:
        c = np.array([min(cast(PointLoad, loads[j]).x, span) for j in point])[:, None]
        p = np.array([cast(PointLoad, loads[j]).p for j in point])
        p = (p[None, :] if factors is None else p * factors[:, point])[:, :, None]
        r_left = p * (span - c) / span
        past = np.where(right_side, x >= c, x > c) if isinstance(right_side, np.ndarray) else (
            x >= c if right_side else x > c)
        v = r_left - p * past if with_shear else None
        m = r_left * x - p * np.maximum(x - c, 0.0)
        parts.update((j, (None if v is None else v[:, i], m[:, i])) for i, j in enumerate(point))
    for j in range(len(loads)):
        v, m = parts[j]
        if shear is not None:
            shear += cast(np.ndarray, v)  # cast: v is None only without shear
        moment += m
    return shear, moment


def shear_moment(x: np.ndarray, span: float, loads: Iterable[Load]) -> tuple[np.ndarray, np.ndarray]:
    """Exact V (kip) and M (kip-in, sagging +) at x; V is taken just right of a point load.

    Statics of a simple beam, closed forms of AISC Manual Table 3-23 (simple beam diagrams).
    """
    x = np.asarray(x, dtype=float)
    shear, moment = _effects(x, span, _check_loads(span, loads), right_side=True)
    return shear[0], moment[0]


def grouped_shear_moment(x: np.ndarray, span: float, groups: Sequence[Sequence[Load]]) -> tuple[np.ndarray, np.ndarray]:
    """V and M (kip, kip-in; one row per group of loads) at x, each row as `shear_moment` of that
    group alone. Statics of a simple beam (AISC Manual Table 3-23), superposed load by load."""
    loads = _check_loads(span, [load for group in groups for load in group])
    factors = np.zeros((len(groups), len(loads)))
    first = 0
    for row, group in enumerate(groups):
        factors[row, first:first + len(group)] = 1.0
        first += len(group)
    shear, moment = _effects(np.asarray(x, dtype=float), span, loads, True, factors)
    return shear, moment


def factored_moment(x: np.ndarray, span: float, loads: Iterable[Load], factors: npt.ArrayLike) -> np.ndarray:
    """M (kip-in, rows x stations) of load combinations: row r scales load j by factors[r][j].

    Statics of a simple beam (AISC Manual Table 3-23), superposed load by load.
    """
    loads = _check_loads(span, loads)
    factors = np.atleast_2d(np.asarray(factors, dtype=float))
    return _effects(np.asarray(x, dtype=float), span, loads, True, factors, with_shear=False)[1]


def max_abs_shear(span: float, loads: Iterable[Load]) -> float:
    """Largest |V| (kip) on the span, both sides of every point load included.

    V is piecewise linear, so its extremes sit at supports and load limits (statics).
    """
    return float(factored_max_abs_shear(span, loads, None)[0])


def factored_max_abs_shear(span: float, loads: Iterable[Load], factors: npt.ArrayLike | None) -> np.ndarray:
    """Largest |V| (kip) of each load combination (row r scales load j by factors[r][j];
    None: the loads as given), both sides of every point load included.

    V is piecewise linear, so its extremes sit at supports and load limits (statics).
    """
    loads = _check_loads(span, loads)
    if factors is not None:
        factors = np.atleast_2d(np.asarray(factors, dtype=float))
    points = [0.0, span]
    for load in loads:
        points.extend(_span_of(load, span) if isinstance(load, UniformLoad) else (min(load.x, span),))
    xs = np.asarray(points + points)
    both, _ = _effects(xs, span, loads, np.arange(xs.size) >= len(points), factors)  # left, then right
    return cast(np.ndarray, np.abs(both).max(axis=1))  # cast: np.abs and .max are Any in numpy's stubs


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
    return deflection_rows(x, kappa)


def deflection_rows(x: np.ndarray, curvature: np.ndarray) -> np.ndarray:
    """`deflection_from_curvature` for curvature of shape (..., x.size), without input checks
    (for stations from `stations`). Each row is integrated exactly as that function does.

    Euler-Bernoulli y'' = -M/EI integrated exactly for curvature linear between stations.
    """
    h = x[1:] - x[:-1]
    k0, k1 = curvature[..., :-1], curvature[..., 1:]
    # slope with zero start slope: trapezoid of linear curvature
    slope = np.empty(curvature.shape)
    slope[..., 0] = 0.0
    (-0.5 * h * (k0 + k1)).cumsum(axis=-1, out=slope[..., 1:])
    # deflection: exact double integral of a linear curvature over each interval
    steps = h * slope[..., :-1] - h * h * (k0 / 3.0 + k1 / 6.0)
    y = np.empty(curvature.shape)
    y[..., 0] = 0.0
    steps.cumsum(axis=-1, out=y[..., 1:])
    # cast: numpy's stubs type arithmetic on np.ndarray as Any
    return cast(np.ndarray, y - y[..., -1:] * (x - x[0]) / (x[-1] - x[0]))


def deflection(
    x: np.ndarray, span: float, loads: Iterable[Load], ei: float | np.ndarray
) -> np.ndarray:
    """Deflection (in, downward +) of a simple span with EI (kip-in^2) scalar or per station.

    Exact M at stations over EI, integrated twice (deflection_from_curvature).
    """
    x = _check_grid(x, span)
    ei = _per_station(ei, x, "EI", positive=True)
    _, moment = _effects(x, span, _check_loads(span, loads), True, with_shear=False)
    return deflection_rows(x, moment[0] / ei)


def _transfer_matrices(x: np.ndarray, flex: np.ndarray, k: np.ndarray, kappa: np.ndarray,
                       block: int) -> np.ndarray:
    """Station-to-station maps of (m, v, y, slope, 1, ...) for load k*y, linear between stations,
    with one constant state per row of load curvature `kappa` (rows, x.size); identity maps pad
    them to a whole number of blocks of `block` steps.

    The same exact-for-linear integration as deflection_from_curvature, applied twice.
    """
    h = x[1:] - x[:-1]
    h2 = h * h
    f0, f1, k0, k1 = flex[:-1], flex[1:], k[:-1], k[1:]
    alpha, gamma = h2 * k1 / 6.0, h2 * f1 / 6.0
    det = 1.0 - alpha * gamma
    if (det <= 0.0).any():
        raise PondingInstabilityError("deflection-dependent load is too stiff for the station spacing")
    dim = 4 + kappa.shape[0]
    # rows before coupling: m_next + alpha*y_next = row_m . z,  y_next + gamma*m_next = row_y . z
    row_m = np.zeros((h.size, dim))
    row_m[:, 0], row_m[:, 1], row_m[:, 2] = 1.0, h, -h2 * k0 / 3.0
    row_y = np.zeros((h.size, dim))
    row_y[:, 0], row_y[:, 2], row_y[:, 3] = -h2 * f0 / 3.0, 1.0, h
    row_y[:, 4:] = (-h2 * (kappa[:, :-1] / 3.0 + kappa[:, 1:] / 6.0)).T
    padded = np.zeros((-(-h.size // block) * block, dim, dim))
    padded[h.size:] = np.eye(dim)
    maps = padded[:h.size]
    maps[:, 0] = (row_m - alpha[:, None] * row_y) / det[:, None]
    maps[:, 2] = (row_y - gamma[:, None] * row_m) / det[:, None]
    maps[:, 1] = -0.5 * (h * k1)[:, None] * maps[:, 2]
    maps[:, 1, 1] += 1.0
    maps[:, 1, 2] -= 0.5 * h * k0
    maps[:, 3] = -0.5 * (h * f1)[:, None] * maps[:, 0]
    maps[:, 3, 0] -= 0.5 * h * f0
    maps[:, 3, 3] += 1.0
    maps[:, 3, 4:] -= (0.5 * h * (kappa[:, :-1] + kappa[:, 1:])).T
    const = np.arange(4, dim)
    maps[:, const, const] = 1.0
    return padded


def _prefix_states(padded: np.ndarray, count: int, columns: list[int],
                   block: int) -> tuple[np.ndarray, np.ndarray]:
    """Deflection row at every station and the full far-end state, for unit starts in `columns`,
    of the first `count` maps of `padded` (whole blocks of `block` maps).

    Blocked prefix product of the maps: sequential inside blocks (vectorised over blocks),
    then a doubling scan over the block totals.
    """
    dim = padded.shape[1]
    blocks = padded.shape[0] // block
    by_block = padded.reshape(blocks, block, dim, dim)
    inner = np.empty((block, blocks, dim, dim))
    inner[0] = by_block[:, 0]
    for j in range(1, block):
        np.matmul(by_block[:, j], inner[j - 1], out=inner[j])
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

    Linear ponding equilibrium (after Ruddy, AISC Engineering Journal 1986), solved on the grid.

    Solves y = y_0 + A K y for the discrete operator A of `deflection`. Stability: A is entrywise
    positive, so (Perron-Frobenius) the largest eigenvalue of A K is < 1 exactly when the response
    to a positive probe load stays positive; otherwise PondingInstabilityError is raised.
    """
    x = _check_grid(x, span)
    flex = 1.0 / _per_station(ei, x, "EI", positive=True)
    k = _per_station(k, x, "ponding stiffness k", positive=False)
    _, moment = _effects(x, span, _check_loads(span, loads), True, with_shear=False)
    return cast(np.ndarray, ponded_rows(x, span, moment, flex, k)[0])  # cast: numpy's stubs type [0] (a row) as Any


def ponded_rows(x: np.ndarray, span: float, moments: np.ndarray, flex: np.ndarray, k: np.ndarray) -> np.ndarray:
    """`ponded_deflection` for several load cases on one operator, without input checks: rows of
    moments M_0 (kip-in at stations `x` from `stations`), flex = 1/EI and k per station.

    Linear ponding equilibrium (after Ruddy, AISC Engineering Journal 1986): one transfer-matrix sweep carries
    every load case and the stability probe (see `ponded_deflection`).
    """
    probe_moment = 0.5 * x * (span - x)  # unit uniform load, kip-in per kip/in
    kappa = np.concatenate((moments * flex, (probe_moment * flex)[None, :]))
    steps = _transfer_matrices(x, flex, k, kappa, _BLOCK)
    # unknown start values: shear and slope; unit columns: each load case, then the probe
    deflections, end = _prefix_states(steps, x.size - 1, [1, 3, *range(4, 4 + kappa.shape[0])], _BLOCK)
    ends = end[[0, 2]]  # moment and deflection at the far support must vanish
    if not np.isfinite(deflections).all() or not np.isfinite(ends).all():
        raise PondingInstabilityError("ponding load makes the beam singular (critical stiffness)")
    try:
        starts = np.linalg.solve(ends[:, :2], -ends[:, 2:])
    except np.linalg.LinAlgError as exc:
        raise PondingInstabilityError("ponding load makes the beam singular (critical stiffness)") from exc
    solved = np.ascontiguousarray((deflections[:, :2] @ starts + deflections[:, 2:]).T)
    y, y_probe = solved[:-1], solved[-1]
    inside = (x > x[0]) & (x < x[-1])
    if not (np.isfinite(y).all() and (y_probe[inside] > 0.0).all()):
        crit = float(np.max(k) * span**4 * np.max(flex) / math.pi**4)
        raise PondingInstabilityError(
            "ponding is unstable: the deflection-dependent load exceeds the beam's stiffness "
            f"(first-mode ratio k L^4/(pi^4 EI) with the largest k and least EI = {crit:.3g})"
        )
    y[:, 0] = y[:, -1] = 0.0
    return y
