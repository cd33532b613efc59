"""`fieldcomp findings JOB --beam MARK [--json] [--repair-svg PATH] [--import CSV]`: does the beam
still work with the studs the inspector found, and which studs would restore it.

Exit codes: 0 the beam passes as built, 1 it fails (a repair is proposed), 2 bad input.
"""

from __future__ import annotations

import argparse
import json
import sys
from pathlib import Path
from typing import Any

from fieldcomp import CAUTION, __version__
from fieldcomp.cli.common import EXIT_FAIL, EXIT_PASS, fail_input

REPAIR_CAUTION = (
    "The engineer of record decides whether to accept, repair or hold the pour. Repairs follow the "
    "project specification and AWS D1.1 (stud welding clause) and are approved before work."
)


def register(sub) -> None:
    f = sub.add_parser("findings", help="check one beam against its stud inspection findings; propose a repair")
    f.add_argument("job", help="job file (.toml)")
    f.add_argument("--beam", metavar="MARK", required=True, help="the beam inspected")
    f.add_argument("--json", action="store_true", help="print one JSON object")
    f.add_argument("--repair-svg", metavar="PATH", help="write the repair marks sheet (SVG) here")
    f.add_argument("--import", dest="import_csv", metavar="CSV",
                   help="first add the findings of an inspection log (CSV) to the beam and save the job")


def run(args: argparse.Namespace) -> int:
    from engine.field.as_built import FindingError, evaluate_as_built
    from engine.studs.design import design_layout
    from engine.field.repair import find_repair
    from fieldcomp.cli.common import load_inputs
    from fieldcomp.jobs.inspection_log import CsvImportError
    from fieldcomp.jobs.jobfile import ChangedOnDisk, JobFileError

    try:
        if args.import_csv:
            print(import_log(args.job, args.beam, args.import_csv), file=sys.stderr)
    except (JobFileError, CsvImportError, ChangedOnDisk) as exc:
        return fail_input(exc)
    except OSError as exc:
        return fail_input(f"cannot save {args.job}: {exc.strerror or exc}")
    try:
        job, beams = load_inputs(args.job, args.beam)
        beam = beams[0]
        designed = design_layout(beam).layout
        try:
            before = evaluate_as_built(beam, designed)
        except FindingError as exc:
            raise JobFileError(args.job, [(f"beam '{beam.mark}', field 'finding[{exc.index}]'", str(exc))]) from None
    except JobFileError as exc:
        return fail_input(exc)
    repair = find_repair(before)
    if args.repair_svg:
        try:
            write_sheet(args.repair_svg, job.project.name, before, repair)
        except OSError as exc:
            return fail_input(f"cannot write {args.repair_svg}: {exc.strerror or exc}")
    if args.json:
        print(json.dumps(findings_json(job.project.name, before, repair), indent=2))
    else:
        print(findings_text(job.project.name, args.job, before, repair))
    return EXIT_PASS if before.verdict == "pass" else EXIT_FAIL


def import_log(job_path: str, mark: str, csv_path: str) -> str:
    """Add the findings of an inspection log to one beam and save the job (atomic, .bak kept).
    Every row is checked first, against the file format and against the beam's layout; on any
    error nothing is written. Returns a one-line summary."""
    from engine.field.as_built import FindingError, apply_findings
    from engine.studs.design import design_layout
    from fieldcomp.cli.common import load_inputs
    from fieldcomp.jobs.inspection_log import CsvImportError, read_findings_csv
    from fieldcomp.jobs.jobfile import load_job, save_job
    from fieldcomp.jobs.to_engine import to_engine

    loaded = load_job(job_path)
    _, (beam,) = load_inputs(job_path, mark)
    rows = read_findings_csv(csv_path)
    job = loaded.job
    updated = job.model_copy(update={"beam": [
        b.model_copy(update={"finding": b.finding + [f for _, f in rows]}) if b.mark == mark else b for b in job.beam]})
    merged = next(b for b in to_engine(updated, job_path) if b.mark == mark)
    designed = design_layout(beam).layout
    try:
        apply_findings(merged, designed, merged.findings)
    except FindingError:
        existing, new = list(beam.findings), list(merged.findings[len(beam.findings):])
        raise CsvImportError(csv_path, _rows_against_layout(beam, designed, existing, rows, new)) from None
    save_job(updated, job_path, expected_digest=loaded.digest)
    return (f"imported {len(rows)} finding(s) into beam {mark} of {job_path} "
            f"(previous version kept as {Path(job_path).name}.bak)")


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


def _num(value: float, digits: int = 3) -> float | None:
    return None if value != value or value in (float("inf"), float("-inf")) else float(round(value, digits))


def _station(beam, x: float | None) -> str:
    from engine.studs.ribs import printed_station
    from engine.model.units import format_ft_in

    return "" if x is None else f"{format_ft_in(printed_station(beam, x))} from {beam.ribs.reference_end}"


def _at(beam, x: float) -> float | None:
    """A station as printed for the erector (project.station_origin), for JSON."""
    from engine.studs.ribs import printed_station

    return _num(float(printed_station(beam, x)), 2)


def _repair_rows(before, repair) -> list[dict[str, Any]]:
    d = before.designed
    return [{"rib": int(k) + 1, "station_in": _at(before.beam, float(d.x[k])), "station": _station(before.beam, float(d.x[k])),
             "added": int(repair.added[k]),
             "studs_in_rib_after": int(before.state.in_rib[k] + repair.added[k])}
            for k in range(d.x.size) if repair.added[k] > 0]


def _governing_station(r) -> float:
    """Where the governing check governs; checks not tied to a station (degree of composite,
    deflection) are measured at the point of maximum moment."""
    gov = r.governing
    return gov.station if gov.station is not None else float(r.result.x[r.result.critical])


def _governing(r) -> dict[str, Any]:
    gov = r.governing
    return {"check": gov.name, "clause": gov.clause, "ratio": _num(gov.ratio), "station_in": _at(r.beam, _governing_station(r))}


def findings_json(job_name: str, before, repair) -> dict[str, Any]:
    """The JSON record of `fieldcomp findings --json`."""
    from engine.field.as_built import finding_effect, finding_slot
    from fieldcomp.views.finished_report import check_json

    b, r, d = before.beam, before.result, before.designed
    ratio, station = before.min_strength_ratio
    after = repair.after if repair.total else None
    found = []
    for i, f in enumerate(b.findings):
        k = finding_slot(d, f, i)
        effect, clause = finding_effect(d, f, k)
        found.append({"index": i + 1, "kind": f.kind, "rib": k + 1, "station_in": _at(b, float(d.x[k])),
                      "count": f.count, "note": f.note, "effect": effect, "clause": clause})
    return {
        "job": job_name,
        "mark": b.mark,
        "caution": [CAUTION, REPAIR_CAUTION],
        "shape": b.shape.name,
        "span_in": _num(b.span),
        "method": b.method,
        "reference_end": b.ribs.reference_end,
        "findings": found,
        "studs_designed": d.total,
        "studs_working": before.layout.total,
        "studs_lost": int(before.lost.sum()),
        "studs_added_in_field": int(before.state.added.sum()),
        "sum_qn_kips_left": _num(r.sum_qn_left),
        "sum_qn_kips_right": _num(r.sum_qn_right),
        "min_strength_ratio": _num(ratio),
        "min_ratio_station_in": _at(b, station),
        "composite_ratio": _num(r.composite_ratio),
        "i_lb_in4": _num(r.i_lb, 0),
        "i_equiv_in4": _num(r.i_equiv, 0),
        "live_deflection_in": _num(r.live_deflection),
        "live_deflection_limit_in": _num(b.span / b.limits.live_ratio),
        "deck_anchor_gap_in": _num(before.anchor_gap, 2),
        "verdict": before.verdict,
        "governing": _governing(before),
        "checks": [check_json(c) for c in before.checks],
        "flags": [{"clause": f.clause, "message": f.message, "severity": f.severity} for f in before.flags],
        "repair": _repair_rows(before, repair),
        "repair_studs_total": repair.total,
        "repair_restores": repair.restores,
        "repair_lower_bound": repair.lower_bound,
        "repair_proven_fewest": repair.proven_fewest,
        "after_repair": None if after is None else {
            "verdict": after.verdict, "min_strength_ratio": _num(after.min_strength_ratio[0]),
            "min_ratio_station_in": _at(b, after.min_strength_ratio[1]), "governing": _governing(after)},
        "alternatives": list(repair.alternatives),
        "repair_notes": list(repair.notes),
    }


def findings_text(job_name: str, job_path: str, before, repair) -> str:
    """A readable report: findings with their effect and clause, the beam as built, the repair."""
    from engine.field.as_built import finding_effect, finding_slot
    from engine.studs.ribs import printed_station
    from engine.studs.sheet_data import station_origin_text
    from engine.model.units import format_ft_in, format_inches
    from fieldcomp.views.finished_report import check_line

    def at(x: float) -> str:
        return format_ft_in(float(printed_station(b, x)))

    b, r, d = before.beam, before.result, before.designed
    ratio, station = before.min_strength_ratio
    k = r.critical
    lines = [f"fieldcomp {__version__} - job '{job_name}' ({job_path}) - stud inspection of beam {b.mark}",
             f"CAUTION: {CAUTION}", f"REPAIRS: {REPAIR_CAUTION}", "",
             f"Beam {b.mark}: {b.shape.name}, span {format_ft_in(b.span)}, {b.method}; {station_origin_text(b)}, "
             f"ribs numbered 1-{d.x.size} from there"]
    lines.append(f"  findings ({len(b.findings)}):" if b.findings else "  no findings recorded for this beam")
    for i, f in enumerate(b.findings):
        s = finding_slot(d, f, i)
        effect, clause = finding_effect(d, f, s)
        note = f" - \"{f.note}\"" if f.note else ""
        lines.append(f"  #{i + 1:<2} {f.kind:11} x{f.count} rib {s + 1:>3} @ {at(float(d.x[s])):>10}: "
                     f"{effect} [{clause}]{note}")
    lines += [
        f"  studs: {d.total} as designed, {before.layout.total} working, {int(before.lost.sum())} lost, "
        f"{int(before.state.added.sum())} added in the field",
        f"  as built: sum Qn {r.sum_qn_left:.0f} / {r.sum_qn_right:.0f} kips left/right of max moment "
        f"(at {at(float(r.x[k]))}); composite {r.composite_ratio:.0%}; "
        f"I_LB {r.i_lb:,.0f} in4, I_equiv {r.i_equiv:,.0f} in4",
        f"  strength: least capacity/demand {ratio:.2f} at {at(station)}; live-load deflection "
        f"{format_inches(r.live_deflection)} vs {format_inches(b.span / b.limits.live_ratio)}; "
        f"longest gap between working studs {before.anchor_gap:.1f} in",
        "  checks as built (ratio = demand / capacity):",
    ]
    lines += [check_line(c) for c in sorted(before.checks, key=lambda c: -c.ratio)]
    lines += [f"  note  [{f.clause}] {f.message}" for f in before.flags]
    gov = before.governing
    lines.append(f"  verdict: {before.verdict.upper()} (governing: {gov.name}, ratio {gov.ratio:.2f} "
                 f"at {at(_governing_station(before))})")
    lines.append("")
    if before.verdict == "pass":
        lines.append("Repair: none needed.")
    elif repair.restores:
        proof = ("the fewest possible (lower bound met)" if repair.proven_fewest
                 else f"the fewest the search found; no repair can use fewer than {repair.lower_bound}")
        lines.append(f"Repair: add {repair.total} stud(s), {proof}:")
        for row in _repair_rows(before, repair):
            lines.append(f"  rib {row['rib']:>3} @ {format_ft_in(row['station_in'])}: add {row['added']} "
                         f"({row['studs_in_rib_after']} in the rib after)")
        a = repair.after
        lines.append(f"  after repair: {a.verdict.upper()}; least capacity/demand {a.min_strength_ratio[0]:.2f}; "
                     f"governing {a.governing.name}, ratio {a.governing.ratio:.2f}")
        lines += [f"  note: {n}" for n in repair.notes]
    else:
        lines.append("Repair: added studs alone do not restore this beam.")
        lines += [f"  option: {a}" for a in repair.alternatives]
    lines += ["", f"CAUTION: {CAUTION}", f"REPAIRS: {REPAIR_CAUTION}"]
    return "\n".join(lines)


def repair_sheet(job_name: str, date: str, before, repair):
    """The repair marks sheet data: studs in place (as designed plus any added in the field), those
    lost, those to add, and the strength envelope as built and after the repair."""
    import numpy as np

    from engine.studs.layout import StudLayout
    from engine.studs.sheet_data import Envelope, SheetData

    d, r = before.designed, before.result
    in_place = d.count + before.state.added
    qn = np.where(before.layout.count > 0, before.layout.qn, repair.after.layout.qn)
    layout = StudLayout(d.x, in_place, d.position, qn, d.max_count, d.x_flip)
    after = repair.after.result.capacity if repair.total else None
    gov = before.governing
    notes = [f"as built: {before.verdict.upper()} (governing {gov.name}, ratio {gov.ratio:.2f})"]
    if repair.total:
        notes.append(f"after adding {repair.total} stud(s): {repair.after.verdict.upper()} "
                     f"(governing {repair.after.governing.name}, ratio {repair.after.governing.ratio:.2f})")
    notes += list(repair.notes) + [f"option: {a}" for a in repair.alternatives]
    failing = tuple(c for c in before.checks if not c.passed)
    return SheetData(job=job_name, beam=before.beam, date=date, layout=layout, caution=f"{CAUTION} {REPAIR_CAUTION}",
                     title="Stud repair marks", checks=failing, notes=tuple(notes), lost=before.lost,
                     added=repair.added, envelope=Envelope(r.x, r.demand, r.capacity, after))


def write_sheet(path: str, job_name: str, before, repair) -> None:
    """Write the repair marks sheet (SVG) atomically."""
    import datetime

    from fieldcomp.views.marks_svg import marks_svg
    from fieldcomp.cli.marks import write_atomic

    sheet = repair_sheet(job_name, datetime.date.today().isoformat(), before, repair)
    write_atomic(Path(path), marks_svg(sheet))
