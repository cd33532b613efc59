"""The finished beam evaluated with a given set of studs and their detailing: the deck limits of
AISC 360-22 I3.2c.1 and the stud spacing limits of I8.1 / I8.2d join the beam's own checks."""

from __future__ import annotations

from engine.finished.evaluate import BeamResult, evaluate_finished
from engine.finished.slab_force import StudGroups
from engine.model.inputs import BeamInput
from engine.studs.detailing import deck_checks, spacing_checks


def evaluate_studs(beam: BeamInput, groups: StudGroups) -> BeamResult:
    """Finished-beam checks with the studs in `groups`, their spacing and the deck limits.
    AISC 360-22 I3.2a, I3.2c.1, I8.1, I8.2d (via engine.finished.evaluate, engine.studs.detailing)."""
    spacing, flags = spacing_checks(beam, groups)
    return evaluate_finished(beam, groups, tuple(deck_checks(beam)) + tuple(spacing), tuple(flags))
