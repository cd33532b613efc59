"""Views of the construction stage (no engineering here): JSON records, text blocks, the camber
schedule table and its CSV rows."""

from __future__ import annotations

from typing import Any

import numpy as np

from engine.construction.camber import CamberOption, CamberOutcome
from engine.construction.evaluate import ConstructionResult, StageSummary
from engine.finished.evaluate import governing_check
from engine.model.results import verdict_of
from engine.model.units import format_ft_in, format_inches
from fieldcomp import CAUTION
from fieldcomp.views.csv_safety import csv_cell
from fieldcomp.views.finished_report import check_json, check_lines, governing_json, verdict_line
from fieldcomp.views.numbers import finite

IN3_PER_FT3 = 1728.0
PROFILE_POINTS = 21  # JSON profiles at the twentieth-points of the span


def _num(value: float | None, digits: int = 3) -> float | None:
    return finite(None if value is None else float(value), digits)


def _in(value: float) -> str:
    """Signed inches to 1/16 (e.g. -7/16")."""
    return format_inches(value)


def _stage_json(st: StageSummary) -> dict[str, Any]:
    return {
        "name": st.name, "kind": st.kind, "day": _num(st.day, 2), "start_in": _num(st.start, 2),
        "end_in": _num(st.end, 2), "side": st.side, "screed": st.screed,
        "midspan_deflection_in": _num(st.deflection, 4), "cumulative_midspan_in": _num(st.cumulative, 4),
        "midspan_deflection_cured_in": _num(st.deflection_cured, 4),
        "cumulative_midspan_cured_in": _num(st.cumulative_cured, 4),
        "live_deflection_in": _num(st.live_deflection, 4), "demand_kipft": _num(st.demand / 12.0, 1),
        "capacity_kipft": _num(st.capacity / 12.0, 1), "ratio": _num(st.demand / st.capacity),
        "bottom_flange_stress_ksi": _num(st.stress, 2), "bottom_flange_stress_cured_ksi": _num(st.stress_cured, 2),
        "earlier_fc_ratio": _num(st.earlier_fc_ratio), "ponded_concrete_ft3": _num(st.ponded_volume / IN3_PER_FT3, 3),
    }


def _outcome_json(o: CamberOutcome) -> dict[str, Any]:
    return {"case": o.case, "stiffness": o.stiffness, "camber_in": _num(o.camber), "wet_deflection_in": _num(o.deflection, 4),
            "top_of_slab_in": _num(o.top_of_slab), "slab_thickness_in": _num(o.thickness),
            "stud_cover_in": _num(o.stud_cover), "extra_concrete_ft3": _num(o.extra_concrete / IN3_PER_FT3, 2),
            "warnings": list(o.warnings)}


def _option_json(o: CamberOption) -> dict[str, Any]:
    return {"choice": o.label, "camber_in": _num(o.camber), "least_stud_cover_in": _num(o.least_cover),
            "least_slab_thickness_in": _num(o.least_thickness), "top_of_slab_low_in": _num(o.lowest_top),
            "top_of_slab_high_in": _num(o.highest_top), "most_extra_concrete_ft3": _num(o.most_extra_concrete / IN3_PER_FT3, 2)}


def _profile(cr: ConstructionResult) -> dict[str, list[float]]:
    idx = np.unique(np.round(np.linspace(0, cr.x.size - 1, PROFILE_POINTS)).astype(int))
    pick = lambda a: [round(float(v), 4) for v in a[idx]]  # noqa: E731
    return {"x_in": pick(cr.x), "wet_in": pick(cr.wet_deflection), "live_in": pick(cr.live_deflection),
            "total_in": pick(cr.total_deflection), "wet_cured_in": pick(cr.cured.total)}


def construction_json(cr: ConstructionResult) -> dict[str, Any]:
    """The per-beam record of `fieldcomp camber --json` (and the construction part of `check --json`)."""
    b, s = cr.beam, cr.flexure.strength
    mid = cr.at_midspan
    return {
        "mark": b.mark, "shape": b.shape.name, "span_in": _num(b.span), "method": b.method,
        "screed": b.construction.screed, "construction_live_psf": _num(b.construction.live_psf, 1),
        "wet_deflection_in": _num(mid(cr.wet_deflection), 4),
        "wet_deflection_no_ponding_in": _num(mid(cr.no_ponding), 4),
        "wet_deflection_cured_in": _num(mid(cr.cured.total), 4),
        "construction_live_deflection_in": _num(mid(cr.live_deflection), 4),
        "construction_total_deflection_in": _num(mid(cr.total_deflection), 4),
        "ponding_extra_psf": _num(cr.ponding_extra_psf, 2), "ponded_concrete_ft3": _num(cr.ponded_volume / IN3_PER_FT3, 2),
        "ponded_share": _num(cr.ponded_share, 4),
        "camber_in": _num(cr.camber.camber), "camber_reason": cr.camber.reason,
        "camber_target_in": _num(cr.camber.target), "camber_tolerance_in": _num(cr.camber.tolerance),
        "camber_outcomes": [_outcome_json(o) for o in cr.outcomes],
        "camber_options": [_option_json(o) for o in cr.options],
        "bracing": cr.bracing.note, "bare_lb_in": _num(s.lb, 2), "bare_cb": _num(s.cb),
        "bare_limit_state": s.limit_state,
        "bare_phi_mn_kipft": _num(s.phi_mn / 12.0, 1), "bare_mn_omega_kipft": _num(s.mn_omega / 12.0, 1),
        "construction_mu_kipft": _num(cr.mu / 12.0, 1), "construction_ma_kipft": _num(cr.ma / 12.0, 1),
        "construction_vu_kips": _num(cr.vu, 2), "construction_va_kips": _num(cr.va, 2),
        "bare_phi_vn_kips": _num(cr.shear.phi_vn, 1), "bare_vn_omega_kips": _num(cr.shear.vn_omega, 1),
        "stages": [_stage_json(st) for st in cr.stages],
        "deflection_profile": _profile(cr),
        "construction_checks": [check_json(c) for c in cr.checks],
        "construction_flags": [{"clause": f.clause, "message": f.message, "severity": f.severity} for f in cr.flags],
        "construction_verdict": str(cr.verdict),
        "construction_governing": governing_json(governing_check(cr.checks)),
    }


def merge_into_check(record: dict[str, Any], cr: ConstructionResult, finished_checks: tuple) -> dict[str, Any]:
    """Add the construction keys to a `check --json` beam record; `verdict` and `governing` then
    cover the finished beam and the construction stage together (`finished_verdict` keeps the former)."""
    record["finished_verdict"] = record["verdict"]
    record["finished_governing"] = record["governing"]
    for key, value in construction_json(cr).items():
        record.setdefault(key, value)
    both = tuple(finished_checks) + cr.checks
    record["verdict"] = str(verdict_of(both))
    record["governing"] = governing_json(governing_check(both))
    return record


def _outcome_rows(cr: ConstructionResult) -> list[str]:
    rows = [f"    {'delivered camber (AISC 303 6.4.4)':34} {'stiffness':24} {'defl.':>8} {'top of slab':>12} "
            f"{'slab':>8} {'stud cover':>11} {'extra concrete':>15}"]
    for o in cr.outcomes:
        rows.append(f"    {o.case:34} {o.stiffness:24} {_in(o.deflection):>8} {_in(o.top_of_slab):>12} "
                    f"{_in(o.thickness):>8} {_in(o.stud_cover):>11} {o.extra_concrete / IN3_PER_FT3:>11.1f} ft3")
    if len(cr.options) > 1:
        rows.append(f"    {'camber choices (worst over band and stiffness)':58} {'top of slab':>21} {'slab':>8} "
                    f"{'stud cover':>11} {'extra concrete':>15}")
        for o in cr.options:
            label = f"{_in(o.camber) if o.camber > 0 else 'no camber'} ({o.label})"
            rows.append(f"    {label:58} {_in(o.lowest_top) + ' to ' + _in(o.highest_top):>21} "
                        f"{_in(o.least_thickness):>8} {_in(o.least_cover):>11} {o.most_extra_concrete / IN3_PER_FT3:>11.1f} ft3")
    return rows


def _stage_rows(cr: ConstructionResult) -> list[str]:
    rows = ["  steps (midspan deflection added = running total; bare steel | with cured earlier concrete):"]
    for st in cr.stages:
        where = "" if st.kind == "erection" else (
            f" {format_ft_in(st.start)}-{format_ft_in(st.end)} {st.side}, day {st.day:g}, {st.screed}")
        rows.append(f"    {st.name}{where}")
        rows.append(f"      {_in(st.deflection)} = {_in(st.cumulative)} | {_in(st.deflection_cured)} = "
                    f"{_in(st.cumulative_cured)};  peak {st.demand / 12:,.0f} vs {st.capacity / 12:,.0f} kip-ft; "
                    f"bottom flange {st.stress:.1f} ksi ({st.stress_cured:.1f} cured)"
                    + (f"; earlier concrete at {st.earlier_fc_ratio:.0%} f'c" if st.earlier_fc_ratio is not None else ""))
    return rows


def construction_text(cr: ConstructionResult) -> str:
    """A readable construction-stage block for one beam."""
    b, con = cr.beam, cr.beam.construction
    mid = cr.at_midspan
    pours = len(cr.stages) - 1
    lines = [
        f"  construction stage: {con.screed} screed, {pours} pour stage(s), construction live {con.live_psf:g} psf",
        f"  pre-composite dead-load deflection at midspan {_in(mid(cr.wet_deflection))} (constant thickness "
        f"{_in(mid(cr.no_ponding))}, with cured earlier concrete {_in(mid(cr.cured.total))}); construction live "
        f"{_in(mid(cr.live_deflection))}; dead + live {_in(mid(cr.total_deflection))}",
    ]
    if cr.ponded_weight != 0.0:
        lines.append(f"  level screed ponds {cr.ponded_volume / IN3_PER_FT3:.1f} ft3 beyond nominal: "
                     f"{cr.ponding_extra_psf:.1f} psf average, {cr.ponded_share:.1%} of the slab weight")
    tol = (f"; delivered from 75 % to +{_in(cr.camber.tolerance)} (AISC 303 6.4.4)" if cr.camber.camber > 0 else "")
    order = f"order {_in(cr.camber.camber)}" if cr.camber.camber > 0 else "none"
    lines.append(f"  camber: {order} ({cr.camber.reason}){tol}")
    lines += _outcome_rows(cr)
    if pours > 1 or b.construction.screed == "level":
        lines += _stage_rows(cr)
    lines.append(f"  {cr.bracing.note}")
    lines += check_lines(cr.checks)
    lines += [f"  note  [{f.clause}] {f.message}" for f in cr.flags if f.message != cr.bracing.note]
    lines.append(verdict_line("construction verdict", cr.verdict, governing_check(cr.checks)))
    return "\n".join(lines)


def schedule_text(results: list[ConstructionResult]) -> str:
    """The camber schedule: one line per beam."""
    head = (f"{'mark':10} {'shape':9} {'span':>10} {'screed':9} {'wet':>8} {'no pond':>8} {'live':>7} "
            f"{'camber':>7} {'tol.':>6} {'cover 75%/+tol':>15}  reason")
    rows = [head, "-" * len(head)]
    for cr in results:
        b, mid = cr.beam, cr.at_midspan
        c = cr.camber
        bare = [o for o in cr.outcomes if o.stiffness == "bare steel" and not o.case.startswith("measured")]
        covers = " / ".join(_in(o.stud_cover) for o in bare)
        rows.append(f"{b.mark:10} {b.shape.name:9} {format_ft_in(b.span):>10} "
                    f"{'level' if b.construction.screed == 'level' else 'constant':9} {_in(mid(cr.wet_deflection)):>8} "
                    f"{_in(mid(cr.no_ponding)):>8} {_in(mid(cr.live_deflection)):>7} "
                    f"{(_in(c.camber) if c.camber > 0 else 'none'):>7} {(_in(c.tolerance) if c.camber > 0 else '-'):>6} "
                    f"{covers:>15}  {c.reason}")
    return "\n".join(rows)


CSV_HEADER = ("mark", "shape", "span_in", "span", "screed", "wet_deflection_in", "wet_deflection_no_ponding_in",
              "construction_live_deflection_in", "ponding_extra_psf", "camber_in", "camber_reason",
              "camber_tolerance_in", "top_of_slab_low_in", "top_of_slab_high_in", "slab_thickness_low_in",
              "slab_thickness_high_in", "stud_cover_low_in", "stud_cover_high_in", "bare_phi_mn_kipft",
              "construction_mu_kipft", "verdict", "warnings")


def csv_rows(results: list[ConstructionResult]) -> list[list[Any]]:
    """Rows for the camber schedule CSV: header, one row per beam, the caution last; numbers stay numbers."""
    rows: list[list[Any]] = [list(CSV_HEADER)]
    for cr in results:
        j = construction_json(cr)
        bare = [o for o in cr.outcomes if o.stiffness == "bare steel" and not o.case.startswith("measured")]
        low, high = bare[0], bare[-1]
        warnings = "; ".join(f"{o.case}: {w}" for o in cr.outcomes for w in o.warnings)
        rows.append([
            csv_cell(j["mark"]), j["shape"], j["span_in"], csv_cell(format_ft_in(cr.beam.span)), j["screed"],
            j["wet_deflection_in"], j["wet_deflection_no_ponding_in"], j["construction_live_deflection_in"],
            j["ponding_extra_psf"], j["camber_in"], csv_cell(j["camber_reason"]), j["camber_tolerance_in"],
            _num(low.top_of_slab), _num(high.top_of_slab), _num(low.thickness), _num(high.thickness),
            _num(low.stud_cover), _num(high.stud_cover), j["bare_phi_mn_kipft"], j["construction_mu_kipft"],
            cr.verdict, csv_cell(warnings),
        ])
    rows.append(["caution", CAUTION])
    return rows
