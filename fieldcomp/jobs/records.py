"""Inspection records the engineer of record signs: findings grouped by inspection report, each
finding's disposition (its own latest entry, else its report's, else open), the history kept in
the job file (entries are added, never edited)."""

from __future__ import annotations

from fieldcomp.jobs.model import Beam, DispositionIn, FindingIn

STATUS_ORDER = ("open", "repair-ordered", "repaired", "re-inspected", "accepted-by-eor")


def finding_disposition(beam: Beam, finding: FindingIn) -> DispositionIn | None:
    """The disposition that governs a finding, or None (open)."""
    if finding.history:
        return finding.history[-1]
    report = next((r for r in beam.report if r.number == finding.report), None)
    return report.history[-1] if report is not None and report.history else None


def finding_status(beam: Beam, finding: FindingIn) -> str:
    d = finding_disposition(beam, finding)
    return "open" if d is None else d.status


def beam_disposition(beam: Beam) -> str:
    """The least advanced status of the beam's findings (STATUS_ORDER), "" without findings."""
    statuses = {finding_status(beam, f) for f in beam.finding}
    return min(statuses, key=STATUS_ORDER.index) if statuses else ""


def report_numbers(beam: Beam) -> list[str]:
    """The beam's reports in order, and any finding without one as "(no report)"."""
    out = [r.number for r in beam.report]
    if any(not f.report for f in beam.finding):
        out.append("(no report)")
    return out
