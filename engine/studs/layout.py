"""Studs rib by rib along a beam: the slots and the layout data shared by placement, findings and
sheets (the studs are placed by engine.studs.design.design_layout)."""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from engine.codes.aisc360_22.i3_composite import DECK_ANCHOR_SPACING_MAX
from engine.codes.aisc360_22.i8_anchors import stud_spacing_min
from engine.model.results import Check, Flag
from engine.studs.detailing import spacing_limits, studs_per_slot
from engine.model.inputs import BeamInput, DeckCase
from engine.studs.ribs import in_keep_out, rib_stations
from engine.finished.slab_force import StudGroups, stud_qn


@dataclass(frozen=True, slots=True)
class StudLayout:
    """Studs placed slot by slot. A slot is a deck rib crossing the beam (perpendicular deck),
    or a stud position along the flute or solid slab. Arrays are per slot, in station order.

    x: station of the slot centreline (in from the reference end); count: studs in the slot;
    position: "strong" | "weak" | "center" (side of the rib, AISC 360-22 I8.2a); qn: strength
    of one stud there (kip, by the slot's own count and position; 0 where empty);
    max_count: most studs the slot may take (flange width, job limit; 0 in keep-out zones).
    Slot numbers run 1..n from the reference end, keep-out ribs included, as an erector counts.
    x_flip: station of the maximum moment, where studs turn to bear toward the other end (the
    strong side of a rib flips there; NaN when unknown).
    """

    x: np.ndarray
    count: np.ndarray
    position: np.ndarray
    qn: np.ndarray
    max_count: np.ndarray
    x_flip: float = math.nan

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

    @property
    def side(self) -> np.ndarray:
        """The end each slot's studs stand toward within the rib: "reference", "far" or "center".

        A stud bears toward the maximum moment, so its strong side is the rib side nearer the
        end it serves (derived from the AISC 360-22 I8.2a e_mid-ht definition).
        """
        flip = self.x_flip if math.isfinite(self.x_flip) else 0.5 * (self.x[0] + self.x[-1]) if self.x.size else 0.0
        serves_reference = self.x < flip
        strong = np.where(serves_reference, "reference", "far")
        weak = np.where(serves_reference, "far", "reference")
        return np.where(self.position == "strong", strong, np.where(self.position == "weak", weak, "center"))

    def halves(self) -> tuple[int, int]:
        """Studs on the reference-end side of `x_flip` and on the far side (a slot exactly at
        `x_flip` counts on the reference side)."""
        flip = self.x_flip if math.isfinite(self.x_flip) else math.inf
        left = int(self.count[self.x <= flip].sum())
        return left, self.total - left


@dataclass(frozen=True, slots=True)
class LayoutResult:
    """Studs placed on one beam. `required_sum_qn`: slab force each side of the maximum moment
    must develop (kip): the drawings' count times the strength of one stud per rib, or, for
    `count = "design"`, the force phi Mn >= Mu needs (at least 25 % of C_f). `provided_left` /
    `provided_right`: sum Qn of the placed studs each side of the maximum moment (kip).
    `shortfall`: what cannot be met and what would close it; None when all is met.
    `mode`: "drawings" or "design"."""

    layout: StudLayout
    required_sum_qn: float
    provided_left: float
    provided_right: float
    shortfall: str | None
    checks: tuple[Check, ...]
    flags: tuple[Flag, ...]
    mode: str = "drawings"


def flute_pitch(beam: BeamInput) -> float:
    """Spacing of stud slots along a parallel flute or a solid slab: the least longitudinal
    spacing, 6 d (AISC 360-22 I8.2d), rounded up to 1/2 in so stations stay easy to tape."""
    return math.ceil(stud_spacing_min(beam.studs.diameter, in_perpendicular_ribs=False) * 2.0 - 1e-9) / 2.0


def slots_for(beam: BeamInput) -> tuple[np.ndarray, np.ndarray]:
    """(x, max_count) of every slot from the reference end.

    Perpendicular deck: every rib centreline (`engine.studs.ribs.rib_stations`), keep-out ribs and
    ribs too close to the previous usable one for 4 d (I8.2d) included with max_count 0.
    Parallel deck or solid slab: positions at `flute_pitch` centred on midspan (so a symmetric
    beam gets a symmetric grid), those in keep-out zones with max_count 0.
    max_count elsewhere: `engine.studs.detailing.studs_per_slot` (flange / flute width, I8.1, job limit).
    """
    if beam.deck_case == DeckCase.PERPENDICULAR:
        x = rib_stations(beam)
    else:
        step = flute_pitch(beam)
        n = math.floor(beam.span / step + 1e-9)
        x = 0.5 * (beam.span - (n - 1) * step) + step * np.arange(n) if n > 0 else np.empty(0)
    cap = np.where(in_keep_out(beam, x), 0, studs_per_slot(beam)).astype(int)
    smin = spacing_limits(beam)[0]
    last = -math.inf
    for i in np.flatnonzero(cap):
        if x[i] - last < smin - 1e-9:
            cap[i] = 0
        else:
            last = x[i]
    return x, cap


def layout_qn(beam: BeamInput, count: np.ndarray, position: np.ndarray | str) -> np.ndarray:
    """Strength of one stud in each slot (kip), R_g by the studs in that slot and R_p by its
    position; 0 where the slot is empty.

    AISC 360-22 Eq. I8-1 with R_g, R_p per I8.2a (`engine.finished.slab_force.stud_qn`).
    """
    count = np.asarray(count, dtype=int)
    return np.where(count > 0, stud_qn(beam, np.maximum(count, 1), position), 0.0)


def deck_anchor_slots(beam: BeamInput, layout: StudLayout) -> np.ndarray:
    """Ribs without studs where the deck needs a weld or fastener: studs alone leave more than
    18 in between deck anchors (AISC 360-22 I3.2c.1). Chosen from the reference end, each the
    last rib within 18 in of the previous anchor. Perpendicular deck only (else all False)."""
    need = np.zeros(layout.x.size, dtype=bool)
    if beam.deck_case != DeckCase.PERPENDICULAR or layout.x.size == 0:
        return need
    anchored = layout.count > 0
    last = 0.0
    for i, xi in enumerate(layout.x):
        if anchored[i]:
            last = xi
            continue
        nxt = layout.x[i + 1] if i + 1 < layout.x.size else beam.span
        if nxt - last > DECK_ANCHOR_SPACING_MAX + 1e-9:
            need[i] = True
            last = xi
    return need
