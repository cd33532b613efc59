"""The one composer of the engine: stud layout -> finished beam -> construction stage -> as built
-> repair. Views and tests reach every evaluation through these functions."""

from __future__ import annotations

import numpy as np

from engine.field.as_built import AsBuiltResult
from engine.field.repair import Repair
from engine.finished.evaluate import BeamResult, evaluate_finished
from engine.model.inputs import BeamInput
from engine.model.results import Check
from engine.model.scope import check_scope
from engine.studs.design import SHORTFALL_CLAUSE, design_layout
from engine.studs.detailing import DECK_ANCHOR_CLAUSE, deck_checks
from engine.studs.evaluate import evaluate_studs
from engine.studs.layout import LayoutResult, StudLayout
from engine.studs.sheet_data import Envelope, SheetData


def evaluate_beam(beam: BeamInput) -> BeamResult:
    """The finished composite beam with its studs laid out rib by rib (engine.studs.design), the
    layout's own checks joining the beam's. AISC 360-22 Chapter I (see engine.finished.evaluate)."""
    check_scope(beam)
    placed = design_layout(beam)
    return evaluate_finished(beam, placed.layout.groups(), tuple(deck_checks(beam)) + placed.checks, placed.flags)


def marks_sheet(job_name: str, beam: BeamInput, date: str, caution: str) -> tuple[SheetData, LayoutResult, Check]:
    """(sheet data, layout, composite flexure check) of one beam's stud marks: the layout of
    engine.studs.design evaluated with its own studs (AISC 360-22 I3.2a, I8.2c). The sheet lists
    deck anchors and the shortfall itself, so those flags are not repeated in its notes."""
    placed = design_layout(beam)
    result = evaluate_studs(beam, placed.layout.groups())
    flexure = result.check("flexure.composite")
    composite = result.check("composite.degree_min")
    notes = tuple(f.message for f in placed.flags if f.clause not in (SHORTFALL_CLAUSE, DECK_ANCHOR_CLAUSE))
    if placed.shortfall:
        notes = (f"SHORTFALL: {placed.shortfall}",) + notes
    sheet = SheetData(job=job_name, beam=beam, date=date, layout=placed.layout, caution=caution,
                      required_sum_qn=placed.required_sum_qn, checks=(flexure, composite) + placed.checks,
                      notes=notes, envelope=Envelope(result.x, result.demand, result.capacity))
    return sheet, placed, flexure


def _ratio(ratio: float) -> str:
    """A check ratio for the sheet's notes; 'n/a: no capacity' when the capacity is zero or less."""
    return f"{ratio:.2f}" if np.isfinite(ratio) else "n/a: no capacity"


def repair_sheet(job_name: str, date: str, before: AsBuiltResult, repair: Repair, caution: str) -> SheetData:
    """The repair marks sheet data: studs in place (as designed plus any added in the field), those
    lost, those to add, and the strength envelope as built and after the repair
    (engine.field.as_built, engine.field.repair)."""
    d, r = before.designed, before.result
    in_place = d.count + before.state.added
    qn = np.where(before.layout.count > 0, before.layout.qn, repair.after.layout.qn)
    layout = StudLayout(d.x, in_place, d.position, qn, d.max_count, d.x_flip)
    after = repair.after.result.capacity if repair.total else None
    gov = before.governing
    notes = [f"as built: {before.verdict.upper()} (governing {gov.name}, ratio {_ratio(gov.ratio)})"]
    if repair.total:
        notes.append(f"after adding {repair.total} stud(s): {repair.after.verdict.upper()} "
                     f"(governing {repair.after.governing.name}, ratio {_ratio(repair.after.governing.ratio)})")
    notes += list(repair.notes) + [f"option: {a}" for a in repair.alternatives]
    failing = tuple(c for c in before.checks if not c.passed)
    return SheetData(job=job_name, beam=before.beam, date=date, layout=layout, caution=caution,
                     title="Stud repair marks", checks=failing, notes=tuple(notes), lost=before.lost,
                     added=repair.added, envelope=Envelope(r.x, r.demand, r.capacity, after))
