"""Stud groups along a beam and the slab force they can develop at every station.

The available slab force at x is the least of the studs' strength on either side of x and the
concrete and steel limits (AISC 360-22 I3.2d.1: V' = min(0.85 f'c Ac, Fy As, sum Qn) between
the point considered and each point of zero moment; I8.2c for concentrated loads).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache
from typing import cast

import numpy as np

from engine.codes.aisc360_22.i8_anchors import qn_stud, rg_rp, stud_area, emid_ht
from engine.codes.aisc360_22.i1_materials import ec
from engine.model.deck import Slab
from engine.model.inputs import BeamInput, StudSpec


@dataclass(frozen=True, slots=True)
class StudGroups:
    """Studs grouped by location: station `x` (in), studs there `count`, strength of each `qn` (kip)."""

    x: np.ndarray
    count: np.ndarray
    qn: np.ndarray

    @property
    def total(self) -> int:
        return int(self.count.sum())

    @property
    def strength(self) -> np.ndarray:
        """Strength of each group (kip)."""
        return cast(np.ndarray, self.count * self.qn)  # cast: numpy's stubs type arithmetic on np.ndarray as Any


def stud_qn(beam: BeamInput, studs_in_rib: np.ndarray, position: np.ndarray | str | None = None) -> np.ndarray:
    """Strength of one stud in a rib holding `studs_in_rib` studs, for this beam's deck.

    AISC 360-22 Eq. I8-1 with Rg, Rp per I8.2a; e_mid-ht from the rib geometry. Q_n depends only
    on the count (R_g stops changing at 3) and the position, so it is looked up per beam.
    """
    n = np.asarray(studs_in_rib)
    if (n < 0).any():
        raise ValueError(f"studs in a rib {studs_in_rib} must be >= 0")
    words = np.asarray(beam.studs.position if position is None else position)
    if beam.slab.deck is None or beam.orientation == "parallel":
        words = np.asarray("center")  # R_p does not depend on the position there
    index = np.minimum(n, 3).astype(int)
    if words.ndim == 0:
        # cast: numpy's stubs type indexing as Any
        return cast(np.ndarray, _qn_by_count(beam.slab, beam.orientation, beam.studs, str(words))[index])
    out = np.empty(np.broadcast_shapes(index.shape, words.shape))
    index, words = np.broadcast_arrays(index, words)
    for word in np.unique(words).tolist():
        here = words == word
        out[here] = _qn_by_count(beam.slab, beam.orientation, beam.studs, word)[index[here]]
    return out


@lru_cache(maxsize=256)
def _qn_by_count(slab: Slab, orientation: str, spec: StudSpec, position: str) -> np.ndarray:
    """Q_n of one stud in a rib holding 0, 1, 2, 3 (or more) studs at `position` (kip).
    AISC 360-22 Eq. I8-1 with Rg, Rp per I8.2a; e_mid-ht from the rib geometry."""
    deck = slab.deck
    asa = stud_area(spec.diameter)
    e_c = ec(slab.concrete_pcf, slab.fc_ksi)
    n = np.arange(4)
    if deck is None:
        rg, rp = rg_rp("none", n)
    elif orientation == "parallel":
        rg, rp = rg_rp("parallel", n, wr_over_hr=deck.rib_average_width / deck.rib_height)
    else:
        # a stud cannot stand further off the rib centreline than the rib bottom allows
        offset = min(deck.stud_offset, max(0.0, 0.5 * (deck.rib_bottom_width - spec.diameter)))
        e = emid_ht(deck.rib_mid_height_width, offset, spec.diameter, position)
        rg, rp = rg_rp("perpendicular", n, emid_ht=e)
    qn = qn_stud(asa, slab.fc_ksi, e_c, spec.fu, rg, rp)
    qn.flags.writeable = False
    return qn


def slab_force(x: np.ndarray, groups: StudGroups, cap: float) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """C(x) = min(sum Qn left of x, sum Qn right of x, cap) at every station.

    A group standing exactly at a station counts half on each side. Returns (C, left, right).
    AISC 360-22 I3.2d.1 and I8.2c.
    """
    strength = groups.strength
    order = np.argsort(groups.x)
    gx, gs = groups.x[order], strength[order]
    cum = np.concatenate(([0.0], np.cumsum(gs)))
    lo = np.searchsorted(gx, x - 1e-6, side="left")
    hi = np.searchsorted(gx, x + 1e-6, side="right")
    at = cum[hi] - cum[lo]
    left = cum[lo] + 0.5 * at
    right = cum[-1] - cum[hi] + 0.5 * at
    return np.minimum(np.minimum(left, right), cap), left, right
