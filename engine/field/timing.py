"""Was the slab over a finding placed when it was found? Before the pour a crew can still weld
studs through the deck; after it no stud can be welded into a rib under concrete (AISC 360-22
I8.2: studs are welded to the flange through the deck before the slab is placed).

A finding's `found` says it; else it is derived where the finding's date and the date of every
pour stage of the beam are given: a finding dated on or after the placement of the concrete over
its rib is after the pour (same day counts as after: conservative, no welding is proposed).
"""

from __future__ import annotations

import numpy as np

from engine.field.as_built import finding_slot
from engine.model.inputs import BeamInput, Finding
from engine.studs.layout import StudLayout

BEFORE, AFTER, UNKNOWN = "before-pour", "after-pour", "unknown"


def placed_on(beam: BeamInput, x: float) -> str:
    """ISO date the concrete over station `x` was placed ("" when the beam's pours are not all dated)."""
    stages = beam.construction.pours
    if not stages or any(not s.date for s in stages):
        return ""
    over = [s.date for s in stages if s.start - 1e-6 <= x <= s.end + 1e-6]
    return min(over) if over else ""


def finding_timing(beam: BeamInput, grid: StudLayout, f: Finding, index: int) -> str:
    """BEFORE, AFTER or UNKNOWN for one finding (see the module note)."""
    if f.found is not None:
        return f.found
    if not f.date:
        return UNKNOWN
    placed = placed_on(beam, float(grid.x[finding_slot(grid, f, index)]))
    if not placed:
        return UNKNOWN
    return AFTER if f.date >= placed else BEFORE


def beam_timing(beam: BeamInput, grid: StudLayout, findings: tuple[Finding, ...]) -> str:
    """AFTER if any finding was found after the pour, BEFORE if all were found before, else UNKNOWN."""
    times = {finding_timing(beam, grid, f, i) for i, f in enumerate(findings)}
    if AFTER in times:
        return AFTER
    return BEFORE if times <= {BEFORE} else UNKNOWN


def closed_slots(beam: BeamInput, grid: StudLayout, findings: tuple[Finding, ...], timing: str) -> np.ndarray:
    """Slots under placed concrete (True): none before the pour; after it, the slots of the stages
    placed by the latest dated after-pour finding when every stage is dated, else every slot
    (the extent of the concrete is not known: no stud is proposed anywhere)."""
    if timing == BEFORE:
        return np.zeros(grid.x.size, dtype=bool)
    dates = [f.date for i, f in enumerate(findings) if f.date and finding_timing(beam, grid, f, i) == AFTER]
    undated = any(not f.date for i, f in enumerate(findings) if finding_timing(beam, grid, f, i) == AFTER)
    placed = [placed_on(beam, float(x)) for x in grid.x]
    if timing != AFTER or undated or not dates or not all(placed):
        return np.ones(grid.x.size, dtype=bool)
    latest = max(dates)
    return np.array([p <= latest for p in placed], dtype=bool)
