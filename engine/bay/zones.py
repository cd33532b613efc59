"""Pour stages of each member from the level's pour zones: a zone listing the member places its
whole slab; a zone with an outline places the member's stretch inside it (plan geometry)."""

from __future__ import annotations

from dataclasses import replace

import numpy as np

from engine.bay.inputs import LevelInput, PlanLine, PourZone
from engine.construction.pours import check_stages
from engine.model.errors import FieldcompError
from engine.model.inputs import BeamInput, PourStage
from engine.model.units import format_ft_in

SNAP = 0.5  # in: a zone boundary this close to a member's end is taken at the end (plan drafting tolerance, this tool's)


class ZoneError(FieldcompError, ValueError):
    """The pour zones do not place a member's slab once over its whole span."""


def inside(polygon: np.ndarray, px: np.ndarray, py: np.ndarray) -> np.ndarray:
    """Whether each point lies inside the polygon (corners (m, 2)): even-odd ray crossing (geometry)."""
    result = np.zeros(px.shape, dtype=bool)
    x0, y0 = polygon[:, 0], polygon[:, 1]
    x1, y1 = np.roll(x0, -1), np.roll(y0, -1)
    for a, b, c, d in zip(x0, y0, x1, y1):
        crosses = (b > py) != (d > py)
        with np.errstate(divide="ignore", invalid="ignore"):
            at = a + (py - b) * (c - a) / (d - b)
        result ^= crosses & (px < at)
    return result


def stretches(line: PlanLine, span: float, outline: tuple[tuple[float, float], ...]) -> list[tuple[float, float]]:
    """Stations (start, end) of the member's stretches inside `outline`: the segment cut at every
    edge it crosses, each piece kept when its middle lies inside (geometry, even-odd rule)."""
    poly = np.asarray(outline, dtype=float)
    p, q = np.array([line.x1, line.y1]), np.array([line.x2, line.y2])
    d = q - p
    cuts = [0.0, 1.0]
    for a, b in zip(poly, np.roll(poly, -1, axis=0)):
        e = b - a
        den = d[0] * e[1] - d[1] * e[0]
        if abs(den) < 1e-12:
            continue
        w = a - p
        t, u = (w[0] * e[1] - w[1] * e[0]) / den, (w[0] * d[1] - w[1] * d[0]) / den
        if 0.0 < t < 1.0 and -1e-9 <= u <= 1.0 + 1e-9:
            cuts.append(float(t))
    ts = np.unique(np.clip(cuts, 0.0, 1.0))
    mid = 0.5 * (ts[:-1] + ts[1:])
    keep = inside(poly, p[0] + mid * d[0], p[1] + mid * d[1])
    out: list[tuple[float, float]] = []
    for a, b, k in zip(ts[:-1] * span, ts[1:] * span, keep):
        start = 0.0 if a < SNAP else float(a)
        end = span if b > span - SNAP else float(b)
        if not k or end - start < SNAP:
            continue
        if out and abs(out[-1][1] - start) < 1e-9:
            out[-1] = (out[-1][0], end)
        else:
            out.append((start, end))
    return out


def member_stages(level: LevelInput, beam: BeamInput) -> tuple[PourStage, ...]:
    """The member's pour stages from the zones that place its slab, by day; () when no zone does
    (the member keeps its own stages, or the whole slab at once). Raises ZoneError when the
    zones leave part of the span unplaced or place it twice."""
    line = level.plan_of(beam.mark)
    stages: list[PourStage] = []
    for zone in level.zones:
        pieces = _pieces(zone, beam, line)
        stages += [PourStage(zone.name, a, b, "both", zone.day, None, zone.date) for a, b in pieces]
    if not stages:
        return ()
    try:
        check_stages(tuple(stages), beam.span)
    except ValueError as exc:
        raise ZoneError(f"beam '{beam.mark}': the pour zones do not place its slab once over its span "
                        f"{format_ft_in(beam.span)} ({exc})") from None
    return tuple(sorted(stages, key=lambda s: (s.day, s.start)))


def _pieces(zone: PourZone, beam: BeamInput, line: PlanLine | None) -> list[tuple[float, float]]:
    if zone.beams:
        return [(0.0, beam.span)] if beam.mark in zone.beams else []
    if line is None or (zone.only and beam.mark not in zone.only):
        return []
    return stretches(line, beam.span, zone.outline)


def with_zone_stages(level: LevelInput) -> tuple[BeamInput, ...]:
    """Every member with its stages from the zones, except a member whose job gives its own pour
    stages: those stand (the engineer's own, e.g. a side-by-side pour along the beam)."""
    out = []
    for beam in level.beams:
        stages = () if beam.construction.pours else member_stages(level, beam)
        out.append(replace(beam, construction=replace(beam.construction, pours=stages)) if stages else beam)
    return tuple(out)
