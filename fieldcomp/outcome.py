"""What the workbench shows for one beam: the engine's results, computed in a worker thread.

No engineering here: each part is one engine entry point called with the beam's inputs. A part
that raises (bad input, out of scope, an unstable ponding case, a finding that contradicts the
layout) carries its message instead. Results are cached by the (frozen, hashable) engine input,
so an edit recomputes only the beams it changed. The repair search, the slowest part, runs in a
second pass after every pane has been drawn.
"""

from __future__ import annotations

import threading
from collections import OrderedDict
from dataclasses import dataclass, replace
from typing import Any, Callable

from engine.evaluate import BeamResult, evaluate_beam, governing_check
from engine.model import BeamInput
from fieldcomp.jobmodel import Job
from fieldcomp.to_engine import to_engine

CACHE_SIZE = 256


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
    finished: Part  # engine.evaluate.BeamResult
    construction: Part  # engine.construction.ConstructionResult
    layout: Part  # engine.layout.LayoutResult
    as_built: Part  # engine.findings.AsBuiltResult (beams with findings)
    sheet: Part  # engine.sheet.SheetData of the marks as designed
    repair: Part | None = None  # engine.repair.Repair; None until the second pass has run
    repair_sheet: Part = NONE  # engine.sheet.SheetData of the repair marks
    key: tuple[str, str] = ("", "")  # (job name, sheet date) the sheets were made with

    @property
    def result(self) -> BeamResult | None:
        return self.finished.value

    @property
    def verdict(self) -> str:
        """One word for the beam list: 'fail' if any computed part fails, 'error' if the
        finished beam could not be computed."""
        if self.result is None:
            return "error"
        parts = [self.result, self.construction.value, self.as_built.value]
        return "fail" if any(p is not None and p.verdict == "fail" for p in parts) else "pass"

    @property
    def governing_ratio(self) -> float | None:
        """The largest ratio among the checks of every part computed."""
        checks = [c for p in (self.result, self.construction.value, self.as_built.value) if p is not None
                  for c in p.checks]
        return governing_check(checks).ratio if checks else None

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
    """Every part for one beam; the marks sheet as `fieldcomp marks` builds it."""
    from engine.construction import evaluate_construction
    from engine.findings import evaluate_as_built
    from engine.layout import design_layout
    from fieldcomp.commands.marks import sheet_for

    finished = _part(lambda: evaluate_beam(beam))
    construction = _part(lambda: evaluate_construction(beam))
    layout = _part(lambda: design_layout(beam))
    as_built = NONE
    if beam.findings and layout.value is not None:
        as_built = _part(lambda: evaluate_as_built(beam, layout.value.layout))
    sheet = _part(lambda: sheet_for(job_name, beam, date)[0])
    return BeamOutcome(beam, finished, construction, layout, as_built, sheet,
                       None if as_built.value is not None else NONE, key=(job_name, date))


def with_repair(outcome: BeamOutcome) -> BeamOutcome:
    """The outcome with its repair found (the slow part: many trial evaluations)."""
    from engine.repair import find_repair
    from fieldcomp.commands.findings import repair_sheet

    if outcome.repair is not None:
        return outcome
    if not outcome.needs_repair:
        return replace(outcome, repair=NONE)
    repair = _part(lambda: find_repair(outcome.as_built.value))
    sheet = NONE
    if repair.value is not None:
        sheet = _part(lambda: repair_sheet(*outcome.key, outcome.as_built.value, repair.value))
    return replace(outcome, repair=repair, repair_sheet=sheet)


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
            self._store[(outcome.beam, *outcome.key)] = outcome
            if len(self._store) > CACHE_SIZE:
                self._store.popitem(last=False)

    def job(self, job: Job, date: str) -> list[BeamOutcome]:
        """Outcomes of every beam of a (validated) job, in job order; sheets dated `date`."""
        return [self.get(b, job.project.name, date) for b in to_engine(job)]

    def repaired(self, outcome: BeamOutcome) -> BeamOutcome:
        """`outcome` with its repair, cached."""
        done = self.get(outcome.beam, *outcome.key)
        if done.repair is None:
            done = with_repair(done)
            self.put(done)
        return done
