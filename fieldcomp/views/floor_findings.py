"""The floor summary of `fieldcomp findings JOB --all`: one row per beam (reports, findings open,
the as-built verdict, the repair of the world the findings were found in, the disposition), as
text, JSON and CSV."""

from __future__ import annotations

import csv
import io
from typing import Any

from fieldcomp import CAUTION, __version__
from fieldcomp.views.findings_report import REPAIR_CAUTION

COLUMNS = ("beam", "reports", "findings", "open", "layout", "found", "verdict_as_built", "repair", "disposition")


def repair_summary(review) -> str:
    """One phrase per branch: before the pour the studs to weld, after it acceptance by analysis."""
    if review is None:
        return ""
    parts = []
    if review.in_kind is not None:
        fewest = review.repair
        tail = ("no stud needed" if fewest.total == 0 else f"fewest {fewest.total} added") if fewest.restores \
            else "added studs alone do not restore"
        parts.append("before pour: none needed" if review.before.verdict == "pass" and review.in_kind.total == 0
                     else f"before pour: replace {review.in_kind.total} in kind, or {tail}")
    if review.acceptance is not None:
        acc = review.acceptance
        parts.append("after pour: accepted by analysis" if acc.acceptable else
                     f"after pour: not acceptable as built (connectors sum Qn {acc.qn_missing_left:.0f} / "
                     f"{acc.qn_missing_right:.0f} kips, live load carried {acc.live_fraction:.0%})")
    return "; ".join(parts)


def floor_rows(job, reviews: dict[str, Any]) -> list[dict[str, Any]]:
    """Rows for every beam of the job; `reviews` maps mark -> engine.pipeline.FieldReview (beams with findings)."""
    from fieldcomp.jobs.records import beam_disposition, finding_status, report_numbers

    rows = []
    for b in job.beam:
        review = reviews.get(b.mark)
        rows.append({"beam": b.mark, "reports": " ".join(report_numbers(b)), "findings": len(b.finding),
                     "open": sum(finding_status(b, f) == "open" for f in b.finding),
                     "layout": "" if review is None else ("as detailed" if b.as_detailed else "fieldcomp"),
                     "found": "" if review is None else review.timing,
                     "verdict_as_built": "" if review is None else str(review.before.verdict),
                     "repair": repair_summary(review), "disposition": beam_disposition(b)})
    return rows


def floor_text(job_name: str, job_path: str, rows: list[dict[str, Any]]) -> str:
    lines = [f"fieldcomp {__version__} - job '{job_name}' ({job_path}) - stud inspection findings, whole floor",
             f"CAUTION: {CAUTION}", f"REPAIRS: {REPAIR_CAUTION}", "",
             f"{'beam':10} {'reports':14} {'findings':>8} {'open':>5} {'layout':12} {'found':12} {'as built':8} "
             "disposition      repair"]
    for r in rows:
        lines.append(f"{r['beam']:10} {r['reports'] or '-':14} {r['findings']:>8} {r['open']:>5} {r['layout'] or '-':12} "
                     f"{r['found'] or '-':12} {(r['verdict_as_built'] or '-').upper():8} {r['disposition'] or '-':16} "
                     f"{r['repair'] or '-'}")
    lines += ["", f"CAUTION: {CAUTION}", f"REPAIRS: {REPAIR_CAUTION}"]
    return "\n".join(lines)


def floor_json(job_name: str, rows: list[dict[str, Any]]) -> dict[str, Any]:
    return {"job": job_name, "caution": [CAUTION, REPAIR_CAUTION], "beams": rows}


def floor_csv(rows: list[dict[str, Any]]) -> str:
    out = io.StringIO()
    w = csv.writer(out, lineterminator="\n")
    w.writerow(COLUMNS)
    for r in rows:
        w.writerow([r[c] for c in COLUMNS])
    w.writerow([f"CAUTION: {CAUTION} {REPAIR_CAUTION}"] + [""] * (len(COLUMNS) - 1))
    return out.getvalue()
