"""Studs rib by rib along a beam: the layout data shared by placement, findings and sheets."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from engine.section import StudGroups


@dataclass(frozen=True, slots=True)
class StudLayout:
    """Studs placed slot by slot. A slot is a deck rib crossing the beam (perpendicular deck),
    or a stud position along the flute or solid slab. Arrays are per slot, in station order.

    x: station of the slot centreline (in from the reference end); count: studs in the slot;
    position: "strong" | "weak" | "center" (side of the rib, AISC 360-22 I8.2a); qn: strength
    of one stud there (kip, by the slot's own count and position; 0 where empty);
    max_count: most studs the slot may take (flange width, job limit; 0 in keep-out zones).
    Slot numbers run 1..n from the reference end, keep-out ribs included, as an erector counts.
    """

    x: np.ndarray
    count: np.ndarray
    position: np.ndarray
    qn: np.ndarray
    max_count: np.ndarray

    @property
    def number(self) -> np.ndarray:
        return np.arange(1, self.x.size + 1)

    @property
    def total(self) -> int:
        return int(self.count.sum())

    def groups(self) -> StudGroups:
        """The occupied slots as stud groups for the slab-force envelope."""
        used = self.count > 0
        return StudGroups(self.x[used], self.count[used], self.qn[used])
