"""The one composer of the engine: stud layout -> finished beam -> construction stage -> as built
-> repair. Views and tests reach every evaluation through these functions."""

from __future__ import annotations

from engine.finished.evaluate import BeamResult, evaluate_finished
from engine.model.inputs import BeamInput
from engine.model.scope import check_scope
from engine.studs.design import design_layout
from engine.studs.detailing import deck_checks


def evaluate_beam(beam: BeamInput) -> BeamResult:
    """The finished composite beam with its studs laid out rib by rib (engine.studs.design), the
    layout's own checks joining the beam's. AISC 360-22 Chapter I (see engine.finished.evaluate)."""
    check_scope(beam)
    placed = design_layout(beam)
    return evaluate_finished(beam, placed.layout.groups(), tuple(deck_checks(beam)) + placed.checks, placed.flags)
