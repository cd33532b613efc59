"""Bare-steel flexure while the concrete is wet: unbraced segments from the bracing the job
states, Cb from each moment diagram, AISC 360-22 F2 (F3 for noncompact flanges)."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from engine.codes.aisc360_22.f_flexure import FlexureStrength, flexure_strength, unbraced_segments
from engine.model.inputs import BeamInput, Method
from engine.model.units import format_ft_in


@dataclass(frozen=True, slots=True)
class Bracing:
    """Brace points of the top flange (in; None: braced continuously) and how they were found."""

    points: np.ndarray | None
    note: str


@dataclass(frozen=True, slots=True)
class BareFlexure:
    """The governing unbraced segment of one moment diagram (kip-in, in)."""

    demand: float
    station: float
    start: float
    end: float
    strength: FlexureStrength

    def available(self, method: str) -> float:
        """phi_b Mn (LRFD) or Mn / Omega_b (ASD), kip-in. AISC 360-22 F1."""
        return self.strength.phi_mn if method == Method.LRFD else self.strength.mn_omega

    def ratio(self, method: str) -> float:
        return self.demand / self.available(method)


def bracing(beam: BeamInput) -> Bracing:
    """Top-flange bracing while the concrete is wet.
    AISC 360-22 F1 (Lb between braced points); AISC Design Examples v16.0 Ex. I.1, I.2.

    Deck perpendicular to the beam and fastened to it braces the top flange continuously
    (common practice; AISC Design Examples v16.0 Ex. I.1). A stated unbraced length puts braces
    at that spacing from the reference end. Otherwise (deck parallel, solid slab on forms) the
    flange is braced only at the point loads, taken as framing members (as in Ex. I.2), and at
    the supports; forms not attached to the flange brace nothing (AISC 360-22 Commentary I3.1b).
    """
    lb = beam.construction.unbraced_length
    span = beam.span
    if lb is None and beam.slab.deck is not None and beam.orientation == "perpendicular":
        return Bracing(None, "top flange braced continuously by the fastened perpendicular deck (common practice)")
    if lb is not None and lb <= 0.0:
        return Bracing(None, "top flange braced continuously (job)")
    if lb is not None:
        count = int(np.ceil(span / lb - 1e-9))
        points = lb * np.arange(1, count)
        return Bracing(points[points < span - 1e-6], f"top flange braced every {format_ft_in(lb)} from the "
                       f"{beam.ribs.reference_end} (job)")
    points = np.unique([p.x for p in beam.point_loads])
    where = ("at the point loads (framing members) and supports" if points.size
             else "only at the supports")
    return Bracing(points, f"top flange braced {where}; state unbraced_length if the deck or forms brace it")


def governing_segments(beam: BeamInput, x: np.ndarray, moments: np.ndarray, braces: Bracing,
                       method: str) -> list[BareFlexure]:
    """For each moment diagram (rows of `moments`, kip-in at stations x), the unbraced segment with
    the highest demand / available strength: Lb between brace points, Cb by AISC 360-22 Eq. F1-1
    over the segment (quarter-point moments interpolated linearly, Mmax over the segment), Mn by
    F2 (or F3). The segments are found once for every diagram
    (engine.codes.aisc360_22.f_flexure.unbraced_segments)."""
    shape, fy = beam.shape, beam.fy
    size = np.abs(moments)
    if braces.points is None:
        strength = flexure_strength(shape, fy, 0.0, 1.0)
        return [BareFlexure(float(size[d, p]), float(x[p]), float(x[0]), float(x[-1]), strength)
                for d, p in enumerate(np.argmax(size, axis=1))]
    segments = unbraced_segments(x, moments, braces.points)
    start, end, m_max, cb = segments.start, segments.end, segments.m_max, segments.cb
    inside = (x >= start[:, None]) & (x <= end[:, None])
    at = np.where(inside, size[:, None, :], -1.0).argmax(axis=-1)  # station of the largest |M| in each
    for i in np.flatnonzero(~inside.any(axis=1)):  # segment shorter than the station spacing
        at[:, i] = int(np.argmin(np.abs(x - 0.5 * (start[i] + end[i]))))
    found = []
    for d in range(size.shape[0]):
        each = [BareFlexure(float(m_max[d, i]), float(x[at[d, i]]), float(start[i]), float(end[i]),
                            flexure_strength(shape, fy, float(segments.lb[i]), max(float(cb[d, i]), 1.0)))
                for i in range(start.size)]
        found.append(max(each, key=lambda f: f.ratio(method)))
    return found
