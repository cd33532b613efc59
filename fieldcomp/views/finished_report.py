"""Plain-text and JSON views of engine results (no engineering here: only formatting)."""

from __future__ import annotations

from typing import Any

from engine.codes.aisc360_22.f_flexure import OMEGA_B, PHI_B
import numpy as np

from engine.model.results import Check, Level
from engine.finished.evaluate import BeamResult
from engine.model.units import format_ft_in, format_inches
from fieldcomp import CAUTION
from fieldcomp.views.numbers import finite, ratio_json, ratio_text


def _num(value: float, digits: int = 3) -> float | None:
    return finite(value, digits)


def beam_json(r: BeamResult) -> dict[str, Any]:
    """The per-beam record of `fieldcomp check --json`."""
    b = r.beam
    gov = r.governing
    k = r.critical
    return {
        "mark": b.mark,
        "shape": b.shape.name,
        "span_in": _num(b.span),
        "method": b.method,
        "ponded_dead_kips": _num(b.ponded.weight if b.ponded is not None else 0.0),
        "b_eff_in": _num(r.b_eff),
        "qn_per_stud_kips": _num(r.qn_per_stud),
        "studs": r.groups.total,
        "sum_qn_kips": {"left": _num(r.sum_qn_left), "right": _num(r.sum_qn_right)},
        "composite_ratio": _num(r.composite_ratio),
        "pna": r.pna,
        "phi_mn_kipft": _num(PHI_B * r.mn[k] / 12.0, 1),
        "mn_omega_kipft": _num(r.mn[k] / OMEGA_B / 12.0, 1),
        "mu_kipft": _num(r.mu[k] / 12.0, 1),
        "ma_kipft": _num(r.ma[k] / 12.0, 1),
        "vu_kips": _num(r.vu, 2),
        "phi_vn_kips": _num(r.phi_vn, 1),
        "va_kips": _num(r.va, 2),
        "vn_omega_kips": _num(r.vn_omega, 1),
        "i_tr_in4": _num(r.i_tr, 0),
        "i_lb_in4": _num(r.i_lb, 0),
        "i_equiv_in4": _num(r.i_equiv, 0),
        "live_deflection_in": _num(r.live_deflection),
        "sdl_live_deflection_in": _num(r.after_cure_deflection),
        "verdict": str(r.verdict),
        "governing": governing_json(gov),
        "checks": [check_json(c) for c in r.checks],
        "flags": [{"clause": f.clause, "message": f.message, "severity": f.severity} for f in r.flags],
    }


def check_json(c: Check) -> dict[str, Any]:
    return {"id": c.id, "name": c.name, "clause": c.clause, "authority": str(c.authority), "level": str(c.level),
            "demand": _num(c.demand), "capacity": _num(c.capacity), "unit": c.unit, **ratio_json(c.ratio),
            "passed": c.passed, "station_in": None if c.station is None else _num(c.station, 2)}


def governing_json(c: Check) -> dict[str, Any]:
    """The check that decides a verdict, for JSON records."""
    return {"id": c.id, "check": c.name, "clause": c.clause, "authority": str(c.authority), "level": str(c.level),
            **ratio_json(c.ratio), "station_in": None if c.station is None else _num(c.station, 2)}


def _value(v: float, unit: str) -> str:
    if unit == "kip-in":
        return f"{v / 12.0:,.1f} kip-ft"
    if unit == "in":
        return format_inches(v) if v >= 0 else f"-{format_inches(-v)}"
    if unit == "ratio":
        return f"{v:.0%}"
    return f"{v:,.1f} {unit}"


_WORD = {Level.PASS: "pass", Level.REVIEW: "REVIEW", Level.FAIL: "FAIL"}


def check_line(c: Check) -> str:
    """One check: level, ratio, name, demand vs capacity, [clause; authority]."""
    where = f" @ {format_ft_in(c.station)}" if c.station is not None else ""
    return (f"  {_WORD[c.level]:6}  {ratio_text(c.ratio):>5}  {c.name}{where}: {_value(c.demand, c.unit)} vs "
            f"{_value(c.capacity, c.unit)}   [{c.clause}; {c.authority}]")


def check_lines(checks: tuple[Check, ...] | list[Check]) -> list[str]:
    """Failures, then reviews, then the rest by ratio; detailing limits that are met come last,
    grouped under their own heading (many are met exactly by design)."""
    rank = {Level.FAIL: 0, Level.REVIEW: 1, Level.PASS: 2}
    ordered = sorted(checks, key=lambda c: (rank[c.level], -c.ratio))
    met_detailing = [c for c in ordered if c.level == Level.PASS and c.kind == "detailing"]
    lines = [check_line(c) for c in ordered if c not in met_detailing]
    if met_detailing:
        lines.append("  detailing limits met:")
        lines += [check_line(c) for c in met_detailing]
    return lines


def verdict_line(label: str, verdict: Level, gov: Check) -> str:
    """The verdict with the check that decides it."""
    where = f" at {format_ft_in(gov.station)}" if gov.station is not None else ""
    return (f"  {label}: {verdict.upper()} (governing: {gov.name}, ratio {ratio_text(gov.ratio)}{where}; "
            f"{gov.clause}; {gov.authority})")


def beam_text(r: BeamResult) -> str:
    """A readable report of one beam: inputs echoed, checks with ratios and clauses, verdict."""
    b, s = r.beam, r.beam.slab
    deck = "solid slab" if s.deck is None else (
        f"{format_inches(s.deck.rib_height)} deck '{s.deck.name}' {b.orientation}")
    k = r.critical
    flex = r.check("flexure.composite")
    g = int(np.argmin(np.abs(r.x - (flex.station if flex.station is not None else r.x[k]))))
    lines = [
        f"Beam {b.mark}: {b.shape.name}, span {format_ft_in(b.span)}, Fy {b.fy:g} ksi, {b.method}",
        f"  slab '{s.name}': {deck}, {format_inches(s.topping)} concrete above deck, "
        f"{s.concrete_pcf:g} pcf, f'c {s.fc_ksi:g} ksi{' (lightweight)' if s.lightweight else ''}",
        f"  loads: SDL {b.superimposed_dead_psf:g} psf, live {b.live_psf:g} psf over "
        f"{format_ft_in(b.tributary_width)}; {len(b.point_loads)} point load(s)"
        + (f"; ponded concrete (level screed) {b.ponded.weight:.2f} kips in the pre-composite dead load"
           if b.ponded is not None else ""),
        f"  studs: {r.groups.total} x {format_inches(b.studs.diameter)} dia, Qn {r.qn_per_stud:.1f} kips (weakest); "
        f"sum Qn {r.sum_qn_left:.0f} / {r.sum_qn_right:.0f} kips left/right of max moment",
        f"  b_eff {format_ft_in(r.b_eff)}, composite {r.composite_ratio:.0%}, PNA in {r.pna}; "
        f"I_LB {r.i_lb:,.0f} in4, I_equiv {r.i_equiv:,.0f} in4",
        f"  governing flexure at {format_ft_in(r.x[g])}: Mu {r.mu[g] / 12:,.0f} kip-ft, phi Mn {PHI_B * r.mn[g] / 12:,.0f} "
        f"kip-ft; Ma {r.ma[g] / 12:,.0f} kip-ft, Mn/Omega {r.mn[g] / OMEGA_B / 12:,.0f} kip-ft",
        "  checks (ratio = demand / capacity):",
    ]
    lines += check_lines(r.checks)
    for f in r.flags:
        lines.append(f"  note  [{f.clause}] {f.message}")
    lines.append(verdict_line("verdict (as designed)", r.verdict, r.governing))
    return "\n".join(lines)


def not_checked_json() -> list[dict[str, str]]:
    """What fieldcomp does not check (engine.model.scope), for JSON reports."""
    from engine.model.scope import NOT_CHECKED

    return [{"item": item, "reference": ref} for item, ref in NOT_CHECKED]


def scope_block() -> str:
    """One line per item fieldcomp does not check, for text reports."""
    from engine.model.scope import NOT_CHECKED

    return "\n".join(["Not checked by fieldcomp (the engineer of record's to check):"]
                     + [f"  - {item} ({ref})" for item, ref in NOT_CHECKED])


def caution_block() -> str:
    return f"CAUTION: {CAUTION}"
