"""The one composer of the engine: stud layout -> finished beam -> construction stage -> as built
-> repair, and the level: pour zones -> beams -> bays (girders loaded by the beams resting on
them). Views and tests reach every evaluation through these functions."""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np

from engine.construction.camber import CamberDecision
from engine.bay.camber import BayCamber, bay_camber
from engine.bay.concrete import ZoneConcrete, zone_concrete
from engine.bay.inputs import LevelInput
from engine.bay.loads import GirderLoad, girder_loads, with_derived, with_settlement, without_derived
from engine.bay.solve import BaySolution, solve_bay
from engine.bay.zones import with_zone_stages
from engine.construction.evaluate import ConstructionResult, evaluate_construction
from engine.construction.pours import pour_plan
from engine.field.as_built import AsBuiltResult, evaluate_as_built, finding_slot
from engine.field.detailed import SOURCE_DETAILED, SOURCE_FIELDCOMP, detailed_layout
from engine.field.remedy import RETEST, WELD_METHOD, Acceptance, InKind, acceptance, fewest_studs, in_kind
from engine.field.repair import Repair
from engine.field.timing import AFTER, BEFORE, beam_timing, closed_slots
from engine.finished.evaluate import BeamResult, evaluate_finished
from engine.model.inputs import BeamInput, PondedConcrete
from engine.model.results import Check
from engine.model.scope import check_scope
from engine.model.units import format_ft_in
from engine.studs.design import SHORTFALL_CLAUSE, design_layout
from engine.studs.detailing import DECK_ANCHOR_CLAUSE, deck_checks
from engine.studs.evaluate import evaluate_studs
from engine.studs.layout import LayoutResult, StudLayout
from engine.studs.ribs import printed_station
from engine.studs.sheet_data import Envelope, SheetData, anchor_ribs
from engine.studs.stud_lengths import StudLengths, stud_lengths


def as_poured(beam: BeamInput) -> tuple[BeamInput, ConstructionResult]:
    """The beam as its slab is placed, and the construction stage: where a level screed ponds
    concrete into the sag, that concrete (its distribution at the ordered camber) joins the
    pre-composite dead load of the finished beam, its studs and its as-built evaluation.
    Construction stage per engine.construction.evaluate (AISC 360-22 I3.1b)."""
    construction = evaluate_construction(beam)
    if construction.ponded_weight <= 0.0:
        return beam, construction
    q = construction.ponded_line_load
    ponded = PondedConcrete(tuple(construction.x.tolist()), tuple(q.tolist()))
    return replace(beam, ponded=ponded), construction


def evaluate_beam(beam: BeamInput) -> BeamResult:
    """The finished composite beam with its studs laid out rib by rib (engine.studs.design), the
    layout's own checks joining the beam's. AISC 360-22 Chapter I (see engine.finished.evaluate)."""
    check_scope(beam)
    placed = design_layout(beam)
    return evaluate_finished(beam, placed.layout.groups(), tuple(deck_checks(beam)) + placed.checks, placed.flags)


def marks_sheet(job_name: str, beam: BeamInput, date: str, caution: str) -> tuple[SheetData, LayoutResult, Check]:
    """(sheet data, layout, composite flexure check) of one beam's stud marks: the layout of
    engine.studs.design evaluated with its own studs (AISC 360-22 I3.2a, I8.2c). The sheet lists
    deck anchors and the shortfall itself, so those flags are not repeated in its notes. A level
    screed's ponded concrete is part of the dead load the studs are laid out for (`as_poured`)."""
    return _marks_sheet(job_name, as_poured(beam)[0], date, caution)


def _marks_sheet(job_name: str, beam: BeamInput, date: str, caution: str) -> tuple[SheetData, LayoutResult, Check]:
    """`marks_sheet` of a beam already `as_poured`."""
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


@dataclass(frozen=True, slots=True)
class ErectorSheet:
    """The crew's stud sheet of one beam: the marks (`sheet`, `layout`, `flexure` as `marks_sheet`),
    the piece's camber as ordered with its shop tolerance (engine.construction.camber, AISC 303-16
    6.4.4), the stud lengths before and after welding (engine.studs.stud_lengths) and the ribs
    needing a deck weld (`deck_weld_ribs`, 1-based; AISC 360-22 I3.2c.1(d), `anchor_ribs`)."""

    sheet: SheetData
    layout: LayoutResult
    flexure: Check
    camber: CamberDecision
    lengths: StudLengths
    deck_weld_ribs: tuple[int, ...]


def erector_sheet(job_name: str, beam: BeamInput, date: str, caution: str) -> ErectorSheet:
    """`marks_sheet` with the camber of the piece, the stud lengths and the deck-weld ribs."""
    poured, construction = as_poured(beam)
    sheet, placed, flexure = _marks_sheet(job_name, poured, date, caution)
    return ErectorSheet(sheet, placed, flexure, construction.camber, stud_lengths(poured), tuple(anchor_ribs(sheet)))


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


def field_layout(beam: BeamInput) -> tuple[StudLayout, str]:
    """The studs findings apply to, and which they are: the as-detailed layout of the shop drawings
    where the job gives it (engine.field.detailed), else fieldcomp's own (engine.studs.design; the
    layout only, so what would close a shortfall is not searched for)."""
    grid = design_layout(beam, suggest=False).layout
    if beam.detailed:
        return detailed_layout(beam, grid, beam.detailed), SOURCE_DETAILED
    return grid, SOURCE_FIELDCOMP


@dataclass(frozen=True, slots=True)
class FieldReview:
    """A stud report reviewed in the world it was found in (engine.field.timing): `timing` is
    before-pour, after-pour or unknown (then both branches are given). Before the pour: the
    in-kind replacement and the fewest-stud repair; after it: acceptance by analysis and, where
    part of the beam is still open, the fewest studs in the open ribs (engine.field.remedy)."""

    source: str
    before: AsBuiltResult
    timing: str
    in_kind: InKind | None
    repair: Repair | None
    acceptance: Acceptance | None
    after_repair: Repair | None


def field_review(beam: BeamInput) -> FieldReview:
    """The as-built beam (with its ponded concrete, `as_poured`) on the layout of `field_layout`,
    and the remedies of each branch. Raises engine.field.as_built.FindingError."""
    beam = as_poured(beam)[0]
    layout, source = field_layout(beam)
    before = evaluate_as_built(beam, layout)
    timing = beam_timing(beam, layout, beam.findings)
    kind = repair = accept = late = None
    if timing != AFTER:
        kind = in_kind(before, closed_slots(beam, layout, beam.findings, BEFORE))
        repair = fewest_studs(before, closed_slots(beam, layout, beam.findings, BEFORE))
    if timing != BEFORE:
        accept = acceptance(before)
        closed = closed_slots(beam, layout, beam.findings, AFTER)
        if not accept.acceptable and not closed.all():
            late = fewest_studs(before, closed)
    return FieldReview(source, before, timing, kind, repair, accept, late)


def field_sheet(job_name: str, date: str, review: FieldReview, caution: str) -> SheetData:
    """The repair sheet a crew follows: before the pour the replacement in kind (each lost stud
    welded again in its rib; engine.field.remedy.in_kind), with the welding method and re-test
    (when the timing is not recorded, only on the engineer of record's confirmation that no
    concrete is placed there); after the pour no stud to weld, only acceptance by analysis. Each lost stud keeps its finding
    kind for the drawing; the sheet carries the engineer of record's approval block."""
    before, d = review.before, review.before.designed
    kinds = [""] * d.x.size
    for i, f in enumerate(before.beam.findings):
        k = finding_slot(d, f, i)
        if f.kind not in ("added", "bent-accepted", "replaced"):
            kinds[k] = kinds[k] or f.kind
    zero = np.zeros(d.x.size, dtype=int)
    if review.in_kind is not None:
        kind = review.in_kind
        steps = []
        for k in map(int, np.flatnonzero(kind.weld)):
            what = ("REMOVE THE DEFECTIVE STUD AND REPLACE" if before.state.in_rib[k] > before.state.effective[k]
                    else "REPLACE")
            steps.append(f"RIB {k + 1} @ {format_ft_in(float(printed_station(before.beam, float(d.x[k]))))}: "
                         f"{what} {int(kind.weld[k])}, THEN RE-TEST")
        first = () if review.timing == BEFORE else (
            "ONLY IF NO CONCRETE IS PLACED OVER THESE RIBS (timing not recorded): the engineer of record confirms "
            "first; if it is placed, weld nothing.",)
        instructions = first + tuple(steps or ["NOTHING TO WELD"]) + (f"METHOD: {WELD_METHOD}", f"RE-TEST: {RETEST}")
        repair = Repair(kind.weld, kind.after, 0, kind.after.verdict != "fail", ())
    else:
        instructions = ("AFTER THE POUR: DO NOT WELD ANY STUD. The beam is accepted by analysis or by a remedy the "
                        "engineer of record orders (see the findings report).",)
        repair = Repair(zero, before, 0, False, ())
    sheet = repair_sheet(job_name, date, before, repair, caution)
    return replace(sheet, title="Stud repair - crew sheet", instructions=instructions, lost_kinds=tuple(kinds),
                   approval=True)


@dataclass(frozen=True, slots=True)
class LevelResult:
    """A level through the pour (engine.bay): every member as evaluated (stages from the pour
    zones, each girder with the point loads derived from the beams resting on it), the bay solve
    at the ordered cambers, the girder loads, each bay's camber alternatives and the concrete to
    order per zone and for the level."""

    level: LevelInput
    members: tuple[BeamInput, ...]
    solution: BaySolution
    cambers: tuple[tuple[str, float], ...]
    loads: tuple[GirderLoad, ...]
    bays: tuple[BayCamber, ...]
    concrete: tuple[ZoneConcrete, ...]

    def member(self, mark: str) -> BeamInput:
        return next(m for m in self.members if m.mark == mark)


BAY_PASSES = 4  # cambers feed the ponding and the ponding the cambers; the decisions settle in one or two passes


def evaluate_level(level: LevelInput, with_bays: bool = True) -> LevelResult:
    """Zones -> each beam's construction stage and camber (engine.construction) -> the bay solved
    at those cambers (engine.bay.solve) -> girder loads derived per step and load type
    (engine.bay.loads) -> each girder's own construction stage and camber on those loads, each
    beam's with the drop of its ends on the girders (a level screed ponds into it), repeated until
    the cambers settle -> bay camber alternatives and concrete to order. `with_bays=False`: the
    members only (the bays' members solved; no alternatives; concrete of the bays' members)."""
    staged = with_zone_stages(level)
    girders = set(level.girders)
    bare = tuple(without_derived(m) if m.mark in girders else m for m in staged)
    in_bays = girders | {b.beam for b in level.bearings}
    solved = bare if with_bays else tuple(m for m in bare if m.mark in in_bays)  # the concrete needs them all
    plans = {m.mark: pour_plan(m) for m in solved}
    cambers = {m.mark: evaluate_construction(m).camber.camber for m in solved if m.mark not in girders}
    cambers.update({g: 0.0 for g in girders})
    beams = {m.mark: m for m in bare}
    for _ in range(BAY_PASSES):
        solution = solve_bay(solved, plans, level.bearings, cambers)
        loads = girder_loads(solution, beams, level.bearings)
        members = tuple(with_derived(m, loads) if m.mark in girders else
                        with_settlement(m, solution) if m.mark in in_bays else m for m in bare)
        decided = {m.mark: evaluate_construction(m).camber.camber for m in members if m.mark in in_bays}
        if all(decided[g] == cambers[g] for g in decided):
            break
        cambers.update(decided)
    bays: tuple[BayCamber, ...] = ()
    if with_bays:
        def solve(picked: dict[str, float]) -> BaySolution:
            return solve_bay(solved, plans, level.bearings, picked)

        bays = tuple(bay_camber(beams[g], beams, level.bearings, cambers, solve) for g in level.girders)
    concrete = zone_concrete(solved, plans, solution, level.deck_sag, tuple(z.name for z in level.zones))
    return LevelResult(level, members, solution, tuple(sorted(cambers.items())), loads, bays, concrete)


def framed_members(level: LevelInput) -> tuple[BeamInput, ...]:
    """Every member as evaluated in the level (`evaluate_level` without the camber alternatives)."""
    if not level.bearings and not level.zones:
        return level.beams
    return evaluate_level(level, with_bays=False).members
