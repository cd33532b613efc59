"""Inputs of a level: its beams, where their ends rest on girders, where they lie on plan, and the
pour zones that place the slab. Inches, kips, days; plan x to the right, y up."""

from __future__ import annotations

from dataclasses import dataclass

from engine.model.inputs import BeamInput

REFERENCE_END, FAR_END = 0, 1


@dataclass(frozen=True, slots=True)
class Bearing:
    """End `end` (REFERENCE_END = station 0, FAR_END = the span) of beam `beam` rests on girder
    `girder` at station `at` (in) along the girder."""

    beam: str
    end: int
    girder: str
    at: float


@dataclass(frozen=True, slots=True)
class PlanLine:
    """A member's work points on plan (in): (x1, y1) at its station 0, (x2, y2) at its span."""

    x1: float
    y1: float
    x2: float
    y2: float


@dataclass(frozen=True, slots=True)
class PourZone:
    """Slab placed in one pour on `day` (days after the level's first pour; `date` ISO): the whole
    slab of the members in `beams`, or, when `outline` (plan corners, in) is given, each member's
    stretch inside the outline."""

    name: str
    day: float
    date: str = ""
    beams: tuple[str, ...] = ()
    outline: tuple[tuple[float, float], ...] = ()
    only: tuple[str, ...] = ()  # an outline places only these members (those of its level); () = any


@dataclass(frozen=True, slots=True)
class LevelInput:
    """One level: every member, the bearings of beam ends on girders, plan lines by mark (members
    without one are absent), the pour zones, and the deck's own sag between beams at mid-pitch
    for the concrete to order (None: not counted; the engineer gives it from the deck's tables)."""

    name: str
    beams: tuple[BeamInput, ...]
    bearings: tuple[Bearing, ...] = ()
    plans: tuple[tuple[str, PlanLine], ...] = ()
    zones: tuple[PourZone, ...] = ()
    deck_sag: float | None = None

    def plan_of(self, mark: str) -> PlanLine | None:
        return dict(self.plans).get(mark)

    @property
    def girders(self) -> tuple[str, ...]:
        """Marks of the members some beam end rests on, in job order."""
        named = {b.girder for b in self.bearings}
        return tuple(b.mark for b in self.beams if b.mark in named)
