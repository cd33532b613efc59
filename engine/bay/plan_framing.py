"""Bearings found on plan: a beam end whose work point lies on another member's line, between its
ends and across it, rests on that member (geometry: distance from a point to a segment)."""

from __future__ import annotations

import math

from engine.bay.inputs import FAR_END, REFERENCE_END, Bearing, PlanLine

ON_LINE = 1.0  # in: an end this close to a girder's line rests on it (plan drafting tolerance, this tool's)
ACROSS = 0.5  # |cos| of the angle between beam and girder below this: the beam crosses the girder (not along it)


def plan_bearings(plans: tuple[tuple[str, PlanLine], ...], spans: dict[str, float],
                  explicit: tuple[Bearing, ...]) -> tuple[Bearing, ...]:
    """The bearings plan geometry gives for every beam end the job does not place itself: the
    nearest member whose line passes within ON_LINE of the end's work point, strictly between that
    member's own ends, at an angle to the beam. A member with an end resting on another is not
    taken as a girder, nor a girder the job names given bearings (girders on girders are not computed)."""
    given = {(b.beam, b.end) for b in explicit}
    resting, girders = {b.beam for b in explicit}, {b.girder for b in explicit}
    found: list[Bearing] = []
    for mark, line in plans:
        if mark in girders:
            continue
        for end, (px, py) in ((REFERENCE_END, (line.x1, line.y1)), (FAR_END, (line.x2, line.y2))):
            if (mark, end) in given:
                continue
            best: tuple[float, str, float] | None = None
            for other, g in plans:
                if other == mark or other in resting:
                    continue
                hit = _on(g, px, py, line)
                if hit is not None and (best is None or hit[0] < best[0]):
                    best = (hit[0], other, hit[1] * spans[other])
            if best is not None:
                found.append(Bearing(mark, end, best[1], best[2]))
    # a member found resting on another is no girder itself: drop bearings onto it
    rests = {b.beam for b in found} | resting
    return tuple(b for b in found if b.girder not in rests)


def _on(g: PlanLine, px: float, py: float, beam: PlanLine) -> tuple[float, float] | None:
    """(distance, share along g) when the point lies on g's line between its ends, across it."""
    dx, dy = g.x2 - g.x1, g.y2 - g.y1
    length = math.hypot(dx, dy)
    bx, by = beam.x2 - beam.x1, beam.y2 - beam.y1
    blen = math.hypot(bx, by)
    if length <= 0.0 or blen <= 0.0 or abs(dx * bx + dy * by) / (length * blen) >= ACROSS:
        return None
    u = ((px - g.x1) * dx + (py - g.y1) * dy) / (length * length)
    distance = abs((px - g.x1) * dy - (py - g.y1) * dx) / length
    margin = ON_LINE / length
    if distance > ON_LINE or not margin < u < 1.0 - margin:
        return None
    return distance, u
