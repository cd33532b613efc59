"""The field-findings report: the as-built beam, rib by rib, and the repair, as text and JSON."""

from __future__ import annotations

from typing import Any

from fieldcomp import CAUTION, __version__
from fieldcomp.views.numbers import finite, ratio_json, ratio_text

REPAIR_CAUTION = (
    "The engineer of record decides whether to accept, repair or hold the pour. Repairs follow the "
    "project specification and AWS D1.1 (stud welding clause) and are approved before work."
)


def _num(value: float, digits: int = 3) -> float | None:
    return finite(value, digits)


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
    return {"check": gov.name, "clause": gov.clause, **ratio_json(gov.ratio), "station_in": _at(r.beam, _governing_station(r))}


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
        f"  strength: least capacity/demand {ratio_text(ratio)} at {at(station)}; live-load deflection "
        f"{format_inches(r.live_deflection)} vs {format_inches(b.span / b.limits.live_ratio)}; "
        f"longest gap between working studs {before.anchor_gap:.1f} in",
        "  checks as built (ratio = demand / capacity):",
    ]
    lines += [check_line(c) for c in sorted(before.checks, key=lambda c: -c.ratio)]
    lines += [f"  note  [{f.clause}] {f.message}" for f in before.flags]
    gov = before.governing
    lines.append(f"  verdict: {before.verdict.upper()} (governing: {gov.name}, ratio {ratio_text(gov.ratio)} "
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
        lines.append(f"  after repair: {a.verdict.upper()}; least capacity/demand {ratio_text(a.min_strength_ratio[0])}; "
                     f"governing {a.governing.name}, ratio {ratio_text(a.governing.ratio)}")
        lines += [f"  note: {n}" for n in repair.notes]
    else:
        lines.append("Repair: added studs alone do not restore this beam.")
        lines += [f"  option: {a}" for a in repair.alternatives]
    lines += ["", f"CAUTION: {CAUTION}", f"REPAIRS: {REPAIR_CAUTION}"]
    return "\n".join(lines)
