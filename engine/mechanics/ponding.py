"""Level screeding: wet concrete ponds into the sag of the beam.

When the slab is struck off level at the elevation set at the supports, the concrete at x is
deeper than nominal by the sag of the steel below that line, so the load grows by
k(x) * sag(x), k = unit weight x width placed (after
Ruddy, "Ponding of Concrete Deck Floors", AISC Engineering Journal 23(3), 1986). The sag is
the deflection so far less the camber; the linear problem is solved exactly on the station grid
by engine.mechanics.statics.ponded_deflection, not with a fixed percentage.
"""

from __future__ import annotations

from collections.abc import Sequence
from functools import lru_cache
from typing import cast

import numpy as np

from engine.mechanics.statics import Load, deflection_rows, ponded_rows, shear_moment

PIECES = 8  # uniform pieces that carry a known station load into ponded_deflection (1e-4 relative)


def camber_shape(x: np.ndarray, span: float) -> np.ndarray:
    """Shape of a cambered beam, 1 at midspan and 0 at the supports: the parabola 4x(L-x)/L^2.
    Assumption of this tool: a cold-cambered beam is close to a circular arc, which differs from
    the parabola by well under 1% of the camber for cambers under span/200 (geometry)."""
    return 4.0 * x * (span - x) / (span * span)


def line_load_effects(x: np.ndarray, q: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Shear V (kip) and moment M (kip-in) of a simple span x[0]..x[-1] under a line load q.
    Statics: R_left = (1/L) int_0^L int_0^s q, V = R_left - int q, M = R_left x - int int q.

    q (kip/in, downward +) is given at the stations and taken linear between them; the integrals
    are exact for that. q may hold several loads as rows (..., x.size).
    """
    h = x[1:] - x[:-1]
    q0, q1 = q[..., :-1], q[..., 1:]
    load = np.zeros(q.shape)
    (0.5 * h * (q0 + q1)).cumsum(axis=-1, out=load[..., 1:])
    second = np.zeros(q.shape)
    (h * load[..., :-1] + h * h * (q0 / 3.0 + q1 / 6.0)).cumsum(axis=-1, out=second[..., 1:])
    xs = x - x[0]
    r_left = second[..., -1:] / xs[-1]
    return r_left - load, r_left * xs - second


def _pieces(x: np.ndarray, q: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Uniform pieces with the same resultant as q over each of PIECES runs of stations."""
    nonzero = np.flatnonzero(q)
    cuts = _cuts(max(int(nonzero[0]) - 1, 0), min(int(nonzero[-1]) + 1, x.size - 1))
    h = x[1:] - x[:-1]
    load = np.zeros(x.size)
    (0.5 * h * (q[:-1] + q[1:])).cumsum(out=load[1:])
    start, end = x[cuts[:-1]], x[cuts[1:]]
    return start, end, (load[cuts[1:]] - load[cuts[:-1]]) / (end - start)


@lru_cache(maxsize=256)
def _cuts(lo: int, hi: int) -> np.ndarray:
    """Station indices splitting lo..hi into PIECES runs (read-only)."""
    cuts = np.unique(np.round(np.linspace(lo, hi, PIECES + 1)).astype(int))
    cuts.flags.writeable = False
    return cuts


def _piece_moments(x: np.ndarray, span: float, start: np.ndarray, end: np.ndarray, w: np.ndarray) -> np.ndarray:
    """Moment (kip-in) of each uniform load w on [start, end], one row per piece (AISC Manual
    Table 3-23 case 3)."""
    length = end - start
    r_left = w * length * (span - 0.5 * (start + end)) / span
    loaded = np.minimum(np.maximum(x[None, :] - start[:, None], 0.0), length[:, None])  # clip, without its overhead
    # cast: numpy's stubs type arithmetic on np.ndarray as Any
    return cast(np.ndarray, r_left[:, None] * x[None, :] - w[:, None] * loaded * (x[None, :] - start[:, None] - 0.5 * loaded))


def level_deflection(
    x: np.ndarray, span: float, loads: Sequence[Load], known: np.ndarray, k: np.ndarray, ei: np.ndarray
) -> np.ndarray:
    """Deflection y (in) under `loads`, a known station load `known` and the ponding load k y.
    Level placement adds gamma_c s Delta (after Ruddy, AISC Engineering Journal 1986): y = A (loads + known + k y).

    A is the simple-span flexibility with EI(x); solved by engine.mechanics.statics.ponded_deflection.
    `known` (kip/in at stations) enters it as uniform pieces of equal resultant; the
    remainder (known less pieces) is added through its own deflection without ponding
    amplification: about 1e-4 of the deflection with 8 pieces (tests/engine/construction/test_construction_ponding.py).
    """
    # cast: numpy's stubs type [0] (a row) as Any
    return cast(np.ndarray, level_deflections(x, span, loads, np.asarray(known, dtype=float)[None, :], k, ei)[0])


def level_deflections(
    x: np.ndarray, span: float, loads: Sequence[Load], known: np.ndarray, k: np.ndarray, ei: np.ndarray,
    moment: np.ndarray | None = None,
) -> np.ndarray:
    """`level_deflection` for several rows of known station load (rows, x.size) on the same
    beam, loads and ponding stiffness: one solve of the ponding operator for every row.
    `moment`: the moment of `loads` at x when the caller has it.
    Linear ponding equilibrium solved by engine.mechanics.statics.ponded_rows."""
    ei = _along(ei, x)
    moment = shear_moment(x, span, loads)[1] if moment is None else moment
    rows = np.repeat(moment[None, :], len(known), axis=0)
    active = [i for i, row in enumerate(known) if row.any()]
    if active:
        remainder = line_load_effects(x, known[active])[1]
        for j, i in enumerate(active):
            start, end, w = _pieces(x, known[i])
            each = _piece_moments(x, span, start, end, w)
            for piece in each[w != 0.0]:  # the pieces as uniform loads after the step's own, in order
                rows[i] += piece
            remainder[j] -= each.sum(axis=0)
    y = ponded_rows(x, span, rows, 1.0 / ei, _along(k, x))
    if active:
        y[active] += deflection_rows(x, remainder / ei)
    return y


def _along(value: float | np.ndarray, x: np.ndarray) -> np.ndarray:
    """`value` as floats at the stations `x` (a scalar broadcast; an array of their shape as is)."""
    arr = np.asarray(value, dtype=float)
    return arr if arr.shape == x.shape else np.broadcast_to(arr, x.shape)


def first_mode_ratio(k_max: float, span: float, ei_min: float) -> float:
    """C_c = k L^4 / (pi^4 EI): level placement is stable only for C_c < 1 (largest k, least EI).
    Closed form after Ruddy, AISC Engineering Journal 1986 (amplification 1 / (1 - C_c))."""
    return float(k_max * span**4 / (np.pi**4 * ei_min))
