"""An inspection log imported into one beam of a job file: rows already recorded are recognised
and not added again, every new row is checked against the beam's layout, and only the new
findings (and the inspection reports they name that the beam lacks) are appended to the file's
text (fieldcomp.jobs.log_append), written atomically with the previous version kept as `.bak`.

"Already recorded": a log row is a finding the beam already has when they agree on kind, rib
(a station resolved to its rib on the layout the findings apply to), count, and every other
column the log gives (note, date, reported_by, found, report). Rows and findings are matched one
to one, so a log holding the same row twice, imported into a beam holding it once, adds it once.
Columns the log does not give are not compared, so a finding dispositioned or annotated in the
job after its import is still recognised. Two studs reported identically on every column the
log gives are one finding: an inspector tells them apart by `count`, a note or the date.
"""

from __future__ import annotations

import hashlib
from collections import defaultdict
from dataclasses import dataclass, field, replace
from pathlib import Path
from typing import Any

from fieldcomp.jobs.inspection_log import CsvImportError, InspectionLog, read_log
from fieldcomp.jobs.model import Beam, FindingIn, Job, ReportIn

_COMPARED = ("note", "date", "reported_by", "found", "report")


@dataclass(frozen=True, slots=True)
class ImportResult:
    """What an import did: the rows added (row number, finding), the rows already recorded (row
    number, 1-based finding of the beam they match), the reports added, warnings, whether the
    file was written and how (appended, or the general save path)."""

    job_path: str
    mark: str
    log_path: str
    separator: str
    added: list[tuple[int, FindingIn]]
    recorded: list[tuple[int, int]]
    reports: list[ReportIn]
    warnings: list[str] = field(default_factory=list)
    written: str = ""  # "", "appended" or "saved"

    def summary(self) -> str:
        """The lines the CLI prints: what was added, what was already recorded, the warnings."""
        name = Path(self.job_path).name
        out = [f"warning: {self.log_path}: {w}" for w in self.warnings]
        if not self.added:
            out.append(f"already recorded: every row of {self.log_path} is a finding of beam {self.mark} already ("
                       + ", ".join(f"row {row} = finding #{n}" for row, n in self.recorded)
                       + f"); nothing added, {self.job_path} not written")
        else:
            how = "" if self.written == "appended" else "; the beam's findings are written inline, so the job was saved whole"
            out.append(f"imported {len(self.added)} finding(s) from {self.log_path} ({self.separator}-separated) "
                       f"into beam {self.mark} of {self.job_path} "
                       f"(previous version kept as {name}.bak{how}):")
            out += [f"  row {row}: {f.kind} x{f.count} at " + (f"rib {f.rib}" if f.rib is not None else f"station {f.station}")
                    + (f", report {f.report}" if f.report else "") for row, f in self.added]
            out += [f"  new inspection report {r.number}" for r in self.reports]
        if self.recorded and self.added:
            out.append("already recorded, not added again: "
                       + ", ".join(f"row {row} (finding #{n})" for row, n in self.recorded))
        return "\n".join(out)


def _key(f: FindingIn, slot: Any, columns: frozenset[str]) -> tuple[Any, ...]:
    return (f.kind, slot, f.count) + tuple(getattr(f, c) if c in columns else None for c in _COMPARED)


def match_recorded(existing: list[tuple[FindingIn, Any]], rows: list[tuple[int, FindingIn, Any]],
                   columns: frozenset[str]) -> tuple[list[int], list[tuple[int, int]]]:
    """Split log rows ((row, finding, slot)) into the indexes of new rows and (row, 1-based
    finding number) of rows already recorded among `existing` ((finding, slot)), one to one."""
    free: dict[tuple[Any, ...], list[int]] = defaultdict(list)
    for n, (f, slot) in enumerate(existing, start=1):
        free[_key(f, slot, columns)].append(n)
    new, recorded = [], []
    for i, (row, f, slot) in enumerate(rows):
        pool = free[_key(f, slot, columns)]
        if pool:
            recorded.append((row, pool.pop(0)))
        else:
            new.append(i)
    return new, recorded


def new_reports(beam: Beam, findings: list[FindingIn]) -> list[ReportIn]:
    """A report for each number the new findings name that the beam lacks, in order of first
    mention; its date and inspector where all its rows agree on them (and the date is ISO)."""
    have = {r.number for r in beam.report}
    rows: dict[str, list[FindingIn]] = {}
    for f in findings:
        if f.report and f.report not in have:
            rows.setdefault(f.report, []).append(f)
    out = []
    for number, group in rows.items():
        dates, who = {f.date for f in group}, {f.reported_by for f in group}
        values: dict[str, Any] = {"number": number}
        if len(who) == 1 and who != {""}:
            values["inspector"] = who.pop()
        try:
            out.append(ReportIn(**values, **({"date": dates.pop()} if len(dates) == 1 and dates != {""} else {})))
        except ValueError:
            out.append(ReportIn(**values))
    return out


def _dump(model: Any) -> dict[str, Any]:
    return model.model_dump(mode="json", exclude_defaults=True, exclude_none=True)


@dataclass(frozen=True, slots=True)
class ImportPlan:
    """The rows of a log to add to beam `index` (row number, finding), the rows already recorded
    (row number, 1-based finding), the reports to add, and the job with them (validated)."""

    index: int
    added: list[tuple[int, FindingIn]]
    recorded: list[tuple[int, int]]
    reports: list[ReportIn]
    updated: Job


def plan_import(job: Job, index: int, log: InspectionLog, job_path: str = "<job>",
                log_path: str = "<csv>") -> ImportPlan:
    """Which rows of `log` are new to beam `index` of `job`; the new ones are checked against
    the layout the findings apply to (engine.pipeline.field_layout) and raise CsvImportError
    naming each row that contradicts it."""
    from engine.field.as_built import FindingError, apply_findings, finding_slot
    from engine.pipeline import as_poured, field_layout

    beam_in = job.beam[index]
    every = [f for _, f in log.rows]
    merged = _engine_beam(_with(job, index, beam_in.finding + every, beam_in.report + new_reports(beam_in, every)),
                          beam_in.mark, job_path)
    beam = as_poured(merged)[0]
    designed = field_layout(beam)[0]
    slots: list[Any] = []
    for i, f in enumerate(beam.findings):
        try:
            slots.append(finding_slot(designed, f, i))
        except FindingError:
            slots.append(("unplaced", i))  # matches nothing; the layout check below names the row
    have = len(beam_in.finding)
    columns = frozenset(c for c in _COMPARED if any(c in f.model_fields_set for f in every))
    new, recorded = match_recorded(list(zip(beam_in.finding, slots[:have])),
                                   [(row, f, s) for (row, f), s in zip(log.rows, slots[have:])], columns)
    added = [log.rows[i] for i in new]
    findings = [f for _, f in added]
    reports = new_reports(beam_in, findings)
    updated = _with(job, index, beam_in.finding + findings, beam_in.report + reports)
    if added:
        try:
            apply_findings(beam, designed, _engine_beam(updated, beam_in.mark, job_path).findings)
        except FindingError:
            existing = list(beam.findings[:have])
            fresh = [beam.findings[have + i] for i in new]
            raise CsvImportError(log_path, _rows_against_layout(beam, designed, existing, added, fresh),
                                 log.separator) from None
    return ImportPlan(index, added, recorded, reports, updated)


def import_log(job_path: str, mark: str, csv_path: str) -> ImportResult:
    """Add the new findings of an inspection log to beam `mark` and write the job (atomic, .bak
    kept). Every row is checked first, against the file format and the beam's layout; on any
    error, and when every row is already recorded, nothing is written. Raises CsvImportError,
    JobFileError or ChangedOnDiskError."""
    from fieldcomp.jobs.jobfile import ChangedOnDiskError, JobFileError, load_job
    from fieldcomp.jobs.to_engine import require_in_scope, to_engine

    loaded = load_job(job_path)
    job = loaded.job
    index = next((i for i, b in enumerate(job.beam) if b.mark == mark), None)
    if index is None:
        marks = ", ".join(b.mark for b in job.beam)
        raise JobFileError(job_path, [("", f"no beam with mark {mark!r}; marks: {marks}")])
    require_in_scope([b for b in to_engine(job, job_path) if b.mark == mark], job_path)
    log = read_log(csv_path)
    plan = plan_import(job, index, log, job_path, str(csv_path))
    result = ImportResult(job_path, mark, str(csv_path), log.separator_name, plan.added, plan.recorded, plan.reports,
                          log.warnings)
    if not plan.added:
        return result
    p = Path(job_path)
    data = p.read_bytes()
    if hashlib.sha256(data).hexdigest() != loaded.digest:
        raise ChangedOnDiskError(f"{p} changed on disk since it was read; not overwritten")
    tables = [("report", _dump(r)) for r in plan.reports] + [("finding", _dump(f)) for _, f in plan.added]
    return replace(result, written=_write(p, data, index, len(job.beam), tables, plan.updated))


def _engine_beam(job: Job, mark: str, job_path: str):
    from fieldcomp.jobs.to_engine import to_engine

    return next(b for b in to_engine(job, job_path) if b.mark == mark)


def _with(job: Job, index: int, findings: list[FindingIn], reports: list[ReportIn]) -> Job:
    beams = list(job.beam)
    beams[index] = beams[index].model_copy(update={"finding": findings, "report": reports})
    return Job.model_validate(job.model_copy(update={"beam": beams}).model_dump(mode="json", exclude_unset=True,
                                                                                   exclude_none=True))


def _write(p: Path, data: bytes, index: int, beams: int, tables: list[tuple[str, dict[str, Any]]], updated: Job) -> str:
    """Append the tables to the file's text where that reads back as `updated`; else (the
    beam's findings or reports written inline) the general save path. Returns how it wrote."""
    from fieldcomp.jobs.atomic import write_bytes_atomic
    from fieldcomp.jobs.jobfile import JobFileError, parse_job, save_job
    from fieldcomp.jobs.log_append import AppendError, append_tables

    try:
        new = append_tables(data, index, beams, tables)
        if parse_job(new.decode("utf-8-sig")) != updated:
            raise AppendError("the appended text does not read back as the import")
    except (AppendError, JobFileError):
        save_job(updated, p, expected_digest=hashlib.sha256(data).hexdigest())
        return "saved"
    write_bytes_atomic(p.with_name(p.name + ".bak"), data)
    write_bytes_atomic(p, new)
    return "appended"


def _rows_against_layout(beam, designed, existing, rows, new) -> list[tuple[int | None, str]]:
    """Every log row that contradicts the layout: added studs first, then the rest in order, each
    kept only if it fits with what came before."""
    from engine.field.as_built import FindingError, apply_findings

    problems: list[tuple[int | None, str]] = []
    try:
        apply_findings(beam, designed, tuple(existing))
    except FindingError as exc:
        return [(None, f"the job's own findings for beam {beam.mark} contradict the layout: {exc}")]
    kept = list(existing)
    order = sorted(range(len(new)), key=lambda i: (new[i].kind != "added", i))
    for i in order:
        try:
            apply_findings(beam, designed, tuple(kept + [new[i]]))
            kept.append(new[i])
        except FindingError as exc:
            problems.append((rows[i][0], str(exc).split(": ", 1)[-1] + f" (beam {beam.mark})"))
    return sorted(problems, key=lambda p: p[0] or 0)
