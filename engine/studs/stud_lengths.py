"""Stud lengths before and after welding. The job gives the installed stud (after welding: the
length AISC 360-22 I3.2c.1(b) and the cover check use); the crew orders and loads the gun with
the length before welding, longer by the burn-off (engine.codes.practice, common practice)."""

from __future__ import annotations

from dataclasses import dataclass

from engine.codes import practice
from engine.model.inputs import BeamInput, DeckCase


@dataclass(frozen=True, slots=True)
class StudLengths:
    """Installed length `after` welding, `burn_off` and the length `before` welding (in), and
    whether the studs are welded through the deck."""

    after: float
    burn_off: float
    before: float
    through_deck: bool


def burn_off(diameter: float, through_deck: bool) -> float:
    """Approximate length lost in drawn-arc stud welding (in): common practice, stud supplier's
    published reductions (engine.codes.practice.STUD_BURN_OFF_BARE / _THROUGH_DECK)."""
    if through_deck:
        return practice.STUD_BURN_OFF_THROUGH_DECK
    return next(loss for largest, loss in practice.STUD_BURN_OFF_BARE if diameter <= largest + 1e-9)


def stud_lengths(beam: BeamInput) -> StudLengths:
    """The beam's stud lengths: through deck wherever the slab sits on metal deck (ribs across or
    along the beam), on bare steel under a solid slab. before = after + burn_off (common practice)."""
    through = beam.slab.deck is not None and beam.deck_case != DeckCase.NONE
    loss = burn_off(beam.studs.diameter, through)
    return StudLengths(beam.studs.length, loss, beam.studs.length + loss, through)
