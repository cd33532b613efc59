"""The field-findings report: the as-built beam, rib by rib, and the repair, as text and JSON."""

from __future__ import annotations

from typing import Any

from fieldcomp import CAUTION, __version__
from fieldcomp.views.numbers import finite, ratio_json, ratio_text

REPAIR_CAUTION = (
    "The engineer of record decides whether to accept, repair or hold the pour. Repairs follow the "
    "project specification and AWS D1.1 (stud welding clause) and are approved before work."
)


TIMING_TEXT = {
    "before-pour": "before the pour (the crew can still weld studs through the deck)",
    "after-pour": "after the pour (no stud can be welded in a rib under placed concrete)",
    "unknown": "not known (no `found` given, nor dates for the finding and every pour stage): both branches follow",
}


FOUND_TEXT = {"before-pour": "found before the pour", "after-pour": "found after the pour",
              "unknown": "timing unknown: both branches shown"}


def printed_at(beam):
    """Stations as printed for the erector (project.station_origin), ft-in to 1/16 in."""
    from engine.studs.ribs import printed_station
    from engine.model.units import format_ft_in

    return lambda x: format_ft_in(float(printed_station(beam, x)))


def finding_rows(review) -> list[dict[str, Any]]:
    """Each finding as the report prints it: number, kind, count, rib, station, when it was found
    (engine.field.timing), its effect and clause, the inspector's note."""
    from engine.field.as_built import finding_effect, finding_slot
    from engine.field.timing import finding_timing

    b, d = review.before.beam, review.before.designed
    at = printed_at(b)
    rows = []
    for i, f in enumerate(b.findings):
        s = finding_slot(d, f, i)
        effect, clause = finding_effect(d, f, s)
        rows.append({"index": i + 1, "kind": f.kind, "count": f.count, "rib": s + 1, "station": at(float(d.x[s])),
                     "found": finding_timing(b, d, f, i), "effect": effect, "clause": clause, "note": f.note})
    return rows


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
    return {"id": gov.id, "check": gov.name, "clause": gov.clause, "authority": str(gov.authority), "level": str(gov.level),
            **ratio_json(gov.ratio), "station_in": _at(r.beam, _governing_station(r))}


def _acceptance_json(review) -> dict[str, Any] | None:
    acc = review.acceptance
    if acc is None:
        return None
    b = review.before.beam
    return {"acceptable": acc.acceptable, "connectors_suffice": acc.connectors_suffice,
            "qn_missing_kips_left": _num(acc.qn_missing_left), "qn_within_station_in_left": _at(b, acc.qn_within_left),
            "qn_missing_kips_right": _num(acc.qn_missing_right),
            "qn_within_station_in_right": _at(b, acc.qn_within_right),
            "moment_shortfall_kip_ft": _num(acc.moment_shortfall / 12.0),
            "shortfall_from_station_in": _at(b, acc.shortfall_from), "shortfall_to_station_in": _at(b, acc.shortfall_to),
            "live_fraction": _num(acc.live_fraction), "live_psf_carried": _num(acc.live_fraction * b.live_psf, 1),
            "repair_in_open_ribs": None if review.after_repair is None else _repair_rows(review.before, review.after_repair)}


def _in_kind_json(review) -> dict[str, Any] | None:
    kind = review.in_kind
    if kind is None:
        return None
    b, d = review.before.beam, review.before.designed
    return {"studs_total": kind.total, "moved": kind.moved, "unplaced": kind.unplaced, "verdict": kind.after.verdict,
            "ribs": [{"rib": int(k) + 1, "station_in": _at(b, float(d.x[k])), "weld": int(kind.weld[k])}
                     for k in kind.weld.nonzero()[0]]}


def no_repair(before):
    """The empty repair of a beam no stud may be added to (after the pour)."""
    import numpy as np

    from engine.field.repair import Repair

    return Repair(np.zeros(before.designed.x.size, dtype=int), before, 0, False, ())


def findings_json(job_name: str, review, records: list[dict[str, str]] | None = None) -> dict[str, Any]:
    """The JSON record of `fieldcomp findings --json`."""
    from engine.field.as_built import finding_effect, finding_slot
    from engine.field.remedy import RETEST, WELD_METHOD
    from engine.field.timing import finding_timing
    from fieldcomp.views.finished_report import check_json

    before = review.before
    repair = review.repair if review.repair is not None else review.after_repair or no_repair(before)
    b, r, d = before.beam, before.result, before.designed
    ratio, station = before.min_strength_ratio
    after = repair.after if repair.total else None
    found = []
    for i, f in enumerate(b.findings):
        k = finding_slot(d, f, i)
        effect, clause = finding_effect(d, f, k)
        found.append({"index": i + 1, "kind": f.kind, "rib": k + 1, "station_in": _at(b, float(d.x[k])),
                      "count": f.count, "note": f.note, "found": finding_timing(b, d, f, i),
                      "effect": effect, "clause": clause, **(records[i] if records else {})})
    return {
        "job": job_name,
        "mark": b.mark,
        "caution": [CAUTION, REPAIR_CAUTION],
        "shape": b.shape.name,
        "span_in": _num(b.span),
        "method": b.method,
        "reference_end": b.ribs.reference_end,
        "layout_source": review.source,
        "timing": review.timing,
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
        "in_kind": _in_kind_json(review),
        "acceptance_after_pour": _acceptance_json(review),
        "weld_method": WELD_METHOD if review.in_kind is not None or review.after_repair is not None else None,
        "retest": RETEST if review.in_kind is not None or review.after_repair is not None else None,
    }


def findings_text(job_name: str, job_path: str, review, records: list[dict[str, str]] | None = None) -> str:
    """A readable report: the layout findings apply to, findings with their timing, effect and
    clause, the beam as built, and the remedies of the world each finding was found in."""
    from engine.studs.sheet_data import station_origin_text
    from engine.model.units import format_ft_in, format_inches
    from fieldcomp.views.finished_report import check_lines

    before = review.before
    at = printed_at(before.beam)
    b, r, d = before.beam, before.result, before.designed
    ratio, station = before.min_strength_ratio
    k = r.critical
    lines = [f"fieldcomp {__version__} - job '{job_name}' ({job_path}) - stud inspection of beam {b.mark}",
             f"CAUTION: {CAUTION}", f"REPAIRS: {REPAIR_CAUTION}", "",
             f"Beam {b.mark}: {b.shape.name}, span {format_ft_in(b.span)}, {b.method}; {station_origin_text(b)}, "
             f"ribs numbered 1-{d.x.size} from there",
             f"  studs the findings apply to: {review.source}",
             f"  found: {TIMING_TEXT[review.timing]}"]
    lines.append(f"  findings ({len(b.findings)}):" if b.findings else "  no findings recorded for this beam")
    for i, row in enumerate(finding_rows(review)):
        note = f" - \"{row['note']}\"" if row["note"] else ""
        lines.append(f"  #{row['index']:<2} {row['kind']:13} x{row['count']} rib {row['rib']:>3} @ {row['station']:>10} "
                     f"({row['found']}): {row['effect']} [{row['clause']}]{note}")
        if records:
            rec = records[i]
            who = ", ".join(v for v in (rec["disposition_by"], rec["disposition_on"]) if v)
            lines.append(f"      report {rec['report'] or '(none)'}; disposition {rec['disposition']}"
                         + (f" ({who})" if who else ""))
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
    lines += check_lines(before.checks)
    lines += [f"  note  [{f.clause}] {f.message}" for f in before.flags]
    gov = before.governing
    lines.append(f"  verdict (as built): {before.verdict.upper()} (governing: {gov.name}, ratio {ratio_text(gov.ratio)} "
                 f"at {at(_governing_station(before))}; {gov.clause}; {gov.authority})")
    lines.append("")
    lines += remedy_lines(review, at)
    lines += ["", f"CAUTION: {CAUTION}", f"REPAIRS: {REPAIR_CAUTION}"]
    return "\n".join(lines)


def _fewest_lines(before, repair, at) -> list[str]:
    """The fewest-stud repair (engine.field.repair) as report lines."""
    if repair.restores and repair.total == 0:
        return ["    none needed: the beam passes as built."]
    if not repair.restores:
        return ["    added studs alone do not restore this beam."] + [f"    option: {a}" for a in repair.alternatives]
    proof = ("the fewest possible (lower bound met)" if repair.proven_fewest
             else f"the fewest the search found; no repair can use fewer than {repair.lower_bound}")
    out = [f"    add {repair.total} stud(s), {proof}:"]
    for row in _repair_rows(before, repair):
        out.append(f"      rib {row['rib']:>3} @ {at(float(before.designed.x[row['rib'] - 1]))}: add {row['added']} "
                   f"({row['studs_in_rib_after']} in the rib after)")
    a = repair.after
    out.append(f"    after repair: {a.verdict.upper()}; least capacity/demand {a.min_strength_ratio[0]:.2f}; "
               f"governing {a.governing.name}, ratio {a.governing.ratio:.2f}")
    return out + [f"    note: {n}" for n in repair.notes]


def _in_kind_lines(before, kind, at) -> list[str]:
    """The replacement in kind (engine.field.remedy.in_kind) as report lines."""
    if kind.total == 0:
        return ["    nothing to replace."]
    out = [f"    weld {kind.total} stud(s) in kind:"]
    lost = before.lost
    for k in map(int, kind.weld.nonzero()[0]):
        what = "remove the failed stud(s) and replace" if before.state.in_rib[k] > before.state.effective[k] else "replace"
        out.append(f"      rib {k + 1:>3} @ {at(float(before.designed.x[k]))}: {what} {int(kind.weld[k])}"
                   + ("" if lost[k] else " (moved here from a rib under concrete)"))
    if kind.unplaced:
        out.append(f"    {kind.unplaced} lost stud(s) have no open rib with room")
    a = kind.after
    out.append(f"    after replacement: {a.verdict.upper()}; least capacity/demand {a.min_strength_ratio[0]:.2f}; "
               f"governing {a.governing.name}, ratio {a.governing.ratio:.2f}")
    return out


def _acceptance_lines(review, at) -> list[str]:
    """Acceptance by analysis after the pour (engine.field.remedy.acceptance) as report lines."""
    acc, before = review.acceptance, review.before
    gov = before.governing
    out = [f"  as built: {before.verdict.upper()} (governing {gov.name}, ratio {gov.ratio:.2f}; {gov.authority}); "
           f"acceptable by analysis: {'yes' if acc.acceptable else 'no, unless the engineer of record accepts it'}"]
    out += acceptance_analysis_lines(before, at)
    if acc.acceptable:
        return out
    ref, far = before.beam.ribs.reference_end, before.beam.ribs.far_end
    out.append("  what each remedy must supply (the engineer of record chooses; no product is implied):")
    if not acc.connectors_suffice:
        out.append("    post-installed shear connectors: even full composite action does not restore the beam")
    else:
        if acc.qn_missing_left > 0.0:
            out.append(f"    post-installed shear connectors: sum Qn {acc.qn_missing_left:.1f} kips more between "
                       f"{ref} and {at(acc.qn_within_left)} (reference-end shear span)")
        if acc.qn_missing_right > 0.0:
            out.append(f"    post-installed shear connectors: sum Qn {acc.qn_missing_right:.1f} kips more between "
                       f"{at(acc.qn_within_right)} and {far} (far-end shear span)")
    if acc.moment_shortfall > 0.0:
        out.append(f"    strengthening the steel: {acc.moment_shortfall / 12.0:.1f} kip-ft of design strength short "
                   f"at most, from {at(acc.shortfall_from)} to {at(acc.shortfall_to)}")
    else:
        out.append("    strengthening the steel: the design strength meets the demand everywhere")
    b = before.beam
    out.append(f"    load restriction: the beam as built carries {acc.live_fraction:.0%} of its live load "
               f"({acc.live_fraction * b.live_psf:.0f} psf of {b.live_psf:.0f} psf"
               + (", point live loads in proportion)" if b.point_loads else ")")
               + ("" if acc.live_fraction < 1.0 else "; the shortfall is in detailing, not load"))
    for c in before.checks:
        if c.kind == "detailing" and not c.passed and c.id != "composite.degree_min":
            where = "" if c.station is None else f" at {at(c.station)}"
            out.append(f"    detailing: {c.name} fails{where} [{c.clause}]: post-installed connectors there, or the "
                       "engineer of record accepts it")
    if review.after_repair is not None:
        out.append("  ribs the concrete does not yet cover (a later pour stage):")
        out += _fewest_lines(before, review.after_repair, at)
    return out


ANALYSIS_PARTS = (("strength", lambda c: c.kind == "strength" and not c.id.startswith("composite.slip")),
                  ("slip capacity", lambda c: c.id.startswith("composite.slip")),
                  ("degree of composite", lambda c: c.id == "composite.degree_min"),
                  ("deflection", lambda c: c.kind == "serviceability"))


def acceptance_analysis_lines(before, at) -> list[str]:
    """The beam as built, part by part (strength envelope, slip capacity, degree of composite,
    deflection), each check with its verdict level and whose rule it is."""
    from engine.model.units import format_inches

    r, b = before.result, before.beam
    low, where = before.min_strength_ratio
    out = ["  acceptance analysis, the beam as built:",
           f"    strength envelope: least capacity/demand {ratio_text(low)} at {at(where)}",
           f"    degree of composite: {r.composite_ratio:.0%} (sum Qn {r.sum_qn_left:.0f} / {r.sum_qn_right:.0f} kips "
           f"left/right of max moment)",
           f"    deflection: live load {format_inches(r.live_deflection)} vs {format_inches(b.span / b.limits.live_ratio)}"]
    for part, wanted in ANALYSIS_PARTS:
        out += [f"    {part}: {c.name}, ratio {ratio_text(c.ratio)}: {str(c.level).upper()} ({c.authority}; {c.clause})"
                for c in before.checks if wanted(c)]
    return out


def remedy_lines(review, at) -> list[str]:
    """The remedies of each branch the findings' timing leaves open."""
    from engine.field.remedy import RETEST, WELD_METHOD

    out: list[str] = []
    if review.in_kind is not None:
        out += ["Before the pour (the crew can still weld):", "  (a) replacement in kind, same rib:"]
        out += _in_kind_lines(review.before, review.in_kind, at)
        out.append("  (b) fewest studs that restore every check:")
        out += _fewest_lines(review.before, review.repair, at)
        out += [f"  method: {WELD_METHOD}", f"  re-test: {RETEST}"]
    if review.acceptance is not None:
        out += ([""] if out else []) + ["After the pour (no stud is welded in a rib under placed concrete): "
                                        "acceptance by analysis"]
        out += _acceptance_lines(review, at)
    return out
