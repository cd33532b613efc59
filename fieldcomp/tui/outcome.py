"""What the workbench shows for one beam: the engine's results, computed in a worker thread.

No engineering here: each part is one engine entry point called with the beam's inputs. A part
that raises (bad input, out of scope, an unstable ponding case, a finding that contradicts the
layout) carries its message instead. Results are cached by the (frozen, hashable) engine input,
so an edit recomputes only the beams it changed. The repair search (the slowest part) and the
marks sheets run in a second pass, after the panes have been drawn (`finish`).
"""

from __future__ import annotations

import threading
from collections import OrderedDict
from dataclasses import dataclass, replace
from typing import Any, Callable

from engine.finished.evaluate import BeamResult, governing_check
from engine.pipeline import evaluate_beam
from engine.model.inputs import BeamInput
from fieldcomp import CAUTION
from fieldcomp.jobs.model import Job
from fieldcomp.jobs.to_engine import to_engine

CACHE_SIZE = 512  # the outcomes undo may bring back; the app keeps those of the job it shows


@dataclass(frozen=True, slots=True)
class Part:
    """One engine result, or the message of the exception it raised; `value` None and `error`
    None mean the part does not apply (e.g. no findings)."""

    value: Any = None
    error: str | None = None


NONE = Part()


@dataclass(frozen=True, slots=True)
class BeamOutcome:
    beam: BeamInput
    finished: Part  # engine.finished.evaluate.BeamResult
    construction: Part  # engine.construction.evaluate.ConstructionResult
    layout: Part  # engine.studs.layout.LayoutResult
    deck_anchors: Any  # engine.studs.layout.deck_anchor_slots of the layout (bool per slot), or None
    as_built: Part  # engine.field.as_built.AsBuiltResult (beams with findings)
    finding_slots: tuple[int, ...]  # slot index of each finding (engine.field.as_built.finding_slot)
    sheet: Part | None = None  # engine.studs.sheet_data.SheetData of the marks as designed (second pass)
    repair: Part | None = None  # engine.field.repair.Repair (second pass; NONE when not needed)
    repair_sheet: Part = NONE  # engine.studs.sheet_data.SheetData of the repair marks (second pass)
    review: Part = NONE  # engine.pipeline.FieldReview: timing, remedies before / after the pour (second pass)
    key: tuple[str, str] = ("", "")  # (job name, sheet date) the sheets were made with
    source: BeamInput | None = None  # the engine input as converted from the job (`beam` is it as poured)

    @property
    def beam_in(self) -> BeamInput:
        """The engine input this outcome was computed from."""
        return self.source if self.source is not None else self.beam

    @property
    def result(self) -> BeamResult | None:
        return self.finished.value

    @property
    def verdict(self) -> str:
        """One word for the beam list: the worst of pass / review / fail over the computed parts
        (finished, construction, as built), 'error' if the finished beam could not be computed."""
        from engine.model.results import worst

        if self.result is None:
            return "error"
        parts = [self.result, self.construction.value, self.as_built.value]
        return str(worst(p.verdict for p in parts if p is not None))

    @property
    def governing_ratio(self) -> float | None:
        """The largest ratio among the checks of every part computed."""
        checks = [c for p in (self.result, self.construction.value, self.as_built.value) if p is not None
                  for c in p.checks]
        return governing_check(checks).ratio if checks else None

    @property
    def finished_all(self) -> bool:
        """True once the second pass (sheets, repair) has run."""
        return self.sheet is not None and self.repair is not None

    @property
    def needs_repair(self) -> bool:
        return self.as_built.value is not None and self.as_built.value.verdict == "fail"


def _part(fn: Callable[[], Any]) -> Part:
    try:
        return Part(fn())
    except (ValueError, ArithmeticError) as exc:  # bad input, out of scope, unstable ponding
        return Part(None, str(exc))
    except Exception as exc:  # noqa: BLE001 - an engine defect shows in its pane, the app stays up
        return Part(None, f"internal error ({type(exc).__name__}: {exc}); please report it")


def compute_outcome(beam: BeamInput, job_name: str = "", date: str = "") -> BeamOutcome:
    """The first pass for one beam: construction stage, finished beam (with any ponded concrete
    in its dead load, engine.pipeline.as_poured), layout, as built."""
    from engine.field.as_built import evaluate_as_built, finding_slot
    from engine.pipeline import as_poured
    from engine.studs.design import design_layout
    from engine.studs.layout import deck_anchor_slots

    source = beam
    poured = _part(lambda: as_poured(beam))
    construction = Part(poured.value[1]) if poured.value is not None else poured
    if poured.value is not None:
        beam = poured.value[0]
    finished = _part(lambda: evaluate_beam(beam))
    layout = _part(lambda: design_layout(beam))
    anchors = deck_anchor_slots(beam, layout.value.layout) if layout.value is not None else None
    as_built, slots = NONE, ()
    if beam.findings and layout.value is not None:
        as_built = _part(lambda: evaluate_as_built(beam, layout.value.layout))
        if as_built.value is not None:
            slots = tuple(finding_slot(layout.value.layout, f, i) for i, f in enumerate(beam.findings))
    return BeamOutcome(beam, finished, construction, layout, anchors, as_built, slots, key=(job_name, date), source=source)


def finish(outcome: BeamOutcome) -> BeamOutcome:
    """The second pass: the marks sheet as `fieldcomp marks` builds it, a beam with findings
    reviewed in the world they were found in (engine.pipeline.field_review) and, for a beam that
    fails as built, the repair (many trial evaluations) and its marks sheet."""
    from engine.field.repair import find_repair
    from engine.pipeline import field_review, marks_sheet, repair_sheet
    from fieldcomp.views.findings_report import REPAIR_CAUTION

    if outcome.finished_all:
        return outcome
    sheet = _part(lambda: marks_sheet(outcome.key[0], outcome.beam, outcome.key[1], CAUTION)[0])
    review = _part(lambda: field_review(outcome.beam)) if outcome.as_built.value is not None else NONE
    if not outcome.needs_repair:
        return replace(outcome, sheet=sheet, repair=NONE, review=review)
    repair = _part(lambda: find_repair(outcome.as_built.value))
    fixed = NONE
    if repair.value is not None:
        fixed = _part(lambda: repair_sheet(*outcome.key, outcome.as_built.value, repair.value, f"{CAUTION} {REPAIR_CAUTION}"))
    return replace(outcome, sheet=sheet, repair=repair, repair_sheet=fixed, review=review)


def compute_level(job: Job, beams: list[BeamInput], where: str = "<job>") -> Part:
    """The level's bays (engine.pipeline.evaluate_level on fieldcomp.jobs.to_engine.level_input):
    mid-bay deflections, derived girder loads, concrete to order; NONE when the job's beams do not
    act together (fieldcomp.jobs.to_engine.has_level). Slow (a bay solve): call it in a worker."""
    from engine.pipeline import evaluate_level
    from fieldcomp.jobs.to_engine import has_level, level_input

    if not has_level(job):
        return NONE
    return _part(lambda: evaluate_level(level_input(job, beams, where)))


class OutcomeCache:
    """Outcomes by engine input; only beams whose inputs changed are recomputed."""

    def __init__(self) -> None:
        self._store: OrderedDict[tuple[BeamInput, str, str], BeamOutcome] = OrderedDict()
        self._lock = threading.Lock()  # a superseded worker thread may still be finishing

    def get(self, beam: BeamInput, job_name: str, date: str) -> BeamOutcome:
        key = (beam, job_name, date)
        with self._lock:
            hit = self._store.get(key)
            if hit is not None:
                self._store.move_to_end(key)
                return hit
        hit = compute_outcome(beam, job_name, date)
        self.put(hit)
        return hit

    def put(self, outcome: BeamOutcome) -> None:
        with self._lock:
            self._store[(outcome.beam_in, *outcome.key)] = outcome
            if len(self._store) > CACHE_SIZE:
                self._store.popitem(last=False)

    def job(self, job: Job, date: str) -> list[BeamOutcome]:
        """Outcomes of every beam of a (validated) job, in job order; sheets dated `date`."""
        return [self.get(b, job.project.name, date) for b in to_engine(job)]

    def finished(self, outcome: BeamOutcome) -> BeamOutcome:
        """`outcome` after the second pass, cached."""
        if outcome.finished_all:
            return outcome
        with self._lock:
            hit = self._store.get((outcome.beam_in, *outcome.key))
        if hit is not None and hit.finished_all:
            return hit
        done = finish(outcome)
        self.put(done)
        return done
