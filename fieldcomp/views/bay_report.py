"""Views of the level's bays (no engineering here): each bay's mid-bay deflection and camber
alternatives, the girder loads derived from the beams resting on them, the concrete to order per
pour zone, and the numbers a plan drawing shows (`bay_plan_data`)."""

from __future__ import annotations

from typing import Any

import numpy as np

from engine.bay.concrete import DECK_SAG_METHOD
from engine.bay.inputs import FAR_END
from engine.bay.loads import FINISHED, LOAD_TYPES
from engine.model.units import format_ft_in, format_inches
from engine.pipeline import LevelResult
from fieldcomp import CAUTION
from fieldcomp.views.numbers import finite

IN3_PER_YD3 = 46_656.0  # 36^3
PLAN_POINTS = 9


def _num(value: float | None, digits: int = 3) -> float | None:
    return finite(None if value is None else float(value), digits)


def _end(end: int) -> str:
    return "far end" if end == FAR_END else "reference end"


def bay_json(result: LevelResult) -> dict[str, Any]:
    """The level's bays, girder loads and concrete to order as one JSON-ready record."""
    cambers = dict(result.cambers)
    bays = []
    for bay in result.bays:
        first = bay.alternatives[0]
        bays.append({
            "stages": bay_stages(result, bay.girder, bay.mid_beam),
            "girder": bay.girder, "beams": list(bay.beams), "mid_bay_beam": bay.mid_beam,
            "ordered_camber_in": {m: _num(cambers.get(m, 0.0)) for m in (bay.girder, *bay.beams)},
            "mid_bay_deflection_in": _num(first.deflection, 4), "beam_share_in": _num(first.beam_share, 4),
            "girder_share_in": _num(first.girder_share, 4), "girder_midspan_deflection_in": _num(bay.girder_deflection, 4),
            "remark": bay.remark,
            "alternatives": [{"choice": a.label, "camber_in": {m: _num(c) for m, c in a.cambers},
                              "mid_bay_deflection_in": _num(a.deflection, 4), "net_of_camber_in": _num(a.net, 4),
                              "top_of_slab_stations_in": [_num(s, 2) for s in a.stations],
                              "top_of_slab_in": [_num(v, 4) for v in a.top_of_slab],
                              "extra_concrete_yd3": _num(a.extra_concrete / IN3_PER_YD3, 3)} for a in bay.alternatives],
        })
    loads = [{"girder": g.girder, "beam": g.beam, "end": _end(g.end), "at_in": _num(g.at, 2), "step": g.step,
              "day": _num(g.day, 2), **{t.replace(" ", "_") + "_kip": _num(g.of(t), 3) for t in LOAD_TYPES}}
             for g in result.loads]
    concrete = [{"zone": z.zone, "day": _num(z.day, 2), "nominal_yd3": _num(z.nominal / IN3_PER_YD3, 2),
                 "ponded_own_sag_yd3": _num(z.ponded_own / IN3_PER_YD3, 2),
                 "ponded_girder_sag_yd3": _num(z.ponded_girders / IN3_PER_YD3, 2),
                 "deck_sag_yd3": _num(z.deck_sag / IN3_PER_YD3, 2), "total_yd3": _num(z.total / IN3_PER_YD3, 2)}
                for z in result.concrete]
    return {"bays": bays, "girder_loads": loads, "concrete": concrete,
            "deck_sag_method": DECK_SAG_METHOD if result.level.deck_sag else None,
            "plan": bay_plan_data(result), "caution": CAUTION}


def bay_stages(result: LevelResult, girder: str, mid_beam: str) -> list[dict[str, Any]]:
    """Step by step (erection, then each pour day of the level): the mid-bay sag and the girder's
    sag at its midspan after the step (in, below the line of the columns, before camber)."""
    sol = result.solution
    beam, g = sol.member(mid_beam), sol.member(girder)
    return [{"step": ", ".join(dict.fromkeys(n for n in (beam.names[t], g.names[t]) if n)),
             "day": None if t == 0 else _num(day, 2),
             "mid_bay_in": _num(float(beam.sag()[t, beam.x.size // 2]), 4),
             "girder_midspan_in": _num(float(g.sag()[t, g.x.size // 2]), 4)}
            for t, day in enumerate(sol.days) if t == 0 or beam.names[t] or g.names[t]]


def bay_plan_data(result: LevelResult) -> list[dict[str, Any]]:
    """Per member, for a plan drawing: its camber to order and its wet-concrete sag below the
    line of the columns (own + girders', before camber) at PLAN_POINTS stations along it (in,
    from its reference end) and, where it lies on plan, the same points as [x, y, sag] (in) for a
    shaded grid or contours, and for girders the total derived load (kip, pre-composite)."""
    cambers = dict(result.cambers)
    out = []
    for run in result.solution.members:
        pick = np.round(np.linspace(0, run.x.size - 1, PLAN_POINTS)).astype(int)
        member = result.member(run.mark)
        derived = sum(p.precomposite_dead for p in member.point_loads if p.erection or p.day is not None)
        line = result.level.plan_of(run.mark)
        sag = run.sag()[-1, pick]
        points = None if line is None else [
            [_num(line.x1 + (line.x2 - line.x1) * float(run.x[i]) / run.span, 2),
             _num(line.y1 + (line.y2 - line.y1) * float(run.x[i]) / run.span, 2), _num(float(v), 4)]
            for i, v in zip(pick, sag)]
        out.append({"mark": run.mark, "camber_in": _num(cambers.get(run.mark, 0.0)),
                    "stations_in": [_num(float(run.x[i]), 2) for i in pick],
                    "wet_sag_in": [_num(float(v), 4) for v in sag],
                    "plan_points_in": points,
                    "derived_precomposite_kip": _num(derived, 2) if derived else None})
    return out


def _cambers_text(cambers: dict[str, float], girder: str, beams: tuple[str, ...]) -> str:
    """'girder 1/2", beams 3/4"' when the beams share one camber, else each beam's."""
    values = {cambers.get(m, 0.0) for m in beams}
    shown = (f'beams {format_inches(values.pop())}' if len(values) == 1
             else " ".join(f"{m} {format_inches(cambers.get(m, 0.0))}" for m in beams))
    return f"girder {format_inches(cambers.get(girder, 0.0))}, {shown}"


def _bay_block(result: LevelResult, bay: Any) -> list[str]:
    """One bay's lines of `bay_text`: members, cambers ordered, the mid-bay deflection (beam +
    girders' shares) and after each step, the remark, the alternatives side by side."""
    cambers = dict(result.cambers)
    first = bay.alternatives[0]
    ordered = ", ".join(f"{m} {format_inches(cambers.get(m, 0.0))}" for m in (bay.girder, *bay.beams))
    lines = [f"  Bay of girder {bay.girder}: beams {', '.join(bay.beams)}; mid-bay = midspan of {bay.mid_beam}, "
             "the beam nearest the girder's midspan",
             f"    camber ordered by each member's rule: {ordered}",
             f"    mid-bay wet deflection {format_inches(first.deflection)} = beam {format_inches(first.beam_share)}"
             f" + girders {format_inches(first.girder_share)}; net of camber {format_inches(first.net)}; "
             f"girder {format_inches(bay.girder_deflection)} at its midspan"]
    steps = "; ".join(f"{st['step'] if st['day'] is None else 'day ' + format(st['day'], 'g') + ' ' + st['step']}: "
                      f"{format_inches(st['mid_bay_in'])} (girder {format_inches(st['girder_midspan_in'])})"
                      for st in bay_stages(result, bay.girder, bay.mid_beam))
    lines.append(f"    after each step, mid-bay (girder at its midspan): {steps}")
    if bay.remark:
        lines.append(f"    NOTE: {bay.remark}")
    lines.append("    alternatives (the engineer chooses):")
    lines.append(f"      {'choice':<38} {'cambers':<26} {'mid-bay':>8} {'net':>8} {'top of slab':>17} {'extra':>9}")
    for a in bay.alternatives:
        chosen = _cambers_text(dict(a.cambers), bay.girder, bay.beams)
        top = f"{format_inches(min(a.top_of_slab))} to {format_inches(max(a.top_of_slab))}"
        lines.append(f"      {a.label:<38} {chosen:<26} {format_inches(a.deflection):>8} {format_inches(a.net):>8} "
                     f"{top:>17} {a.extra_concrete / IN3_PER_YD3:>6.2f} yd3")
    return lines


def _load_lines(loads: Any) -> list[str]:
    """The derived girder loads table of `bay_text` (header and one row per load), for `loads`."""
    lines = [f"  {'girder':<8} {'beam':<8} {'end':<13} {'at':>9}  {'step':<28} " + " ".join(f"{t[:12]:>12}" for t in LOAD_TYPES)]
    for g in loads:
        step = g.step if g.step == FINISHED or g.day is None else f"day {g.day:g}: {g.step}"
        lines.append(f"  {g.girder:<8} {g.beam:<8} {_end(g.end):<13} {format_ft_in(g.at):>9}  {step[:28]:<28} "
                     + " ".join(f"{g.of(t):>12.2f}" for t in LOAD_TYPES))
    return lines


def concrete_lines(result: LevelResult) -> list[str]:
    """The concrete to order as `bay_text` prints it: heading, one line per pour zone and the level."""
    lines = ["Concrete to order (cubic yards; nominal + ponded into the beams' sag + into the "
             "girders' sag" + (" + deck sag between beams" if result.level.deck_sag else "") + "):"]
    for z in result.concrete:
        day = "" if z.day is None else f" (day {z.day:g})"
        lines.append(f"  {(z.zone + day)[:30]:<30} nominal {z.nominal / IN3_PER_YD3:7.2f}  own sag {z.ponded_own / IN3_PER_YD3:6.2f}"
                     f"  girders' sag {z.ponded_girders / IN3_PER_YD3:6.2f}  deck {z.deck_sag / IN3_PER_YD3:6.2f}"
                     f"  total {z.total / IN3_PER_YD3:7.2f}")
    if result.level.deck_sag:
        lines.append(f"  deck sag {format_inches(result.level.deck_sag)} at mid-pitch: {DECK_SAG_METHOD}")
    return lines


def bay_lines(result: LevelResult, mark: str) -> list[str]:
    """The lines of `bay_text` for the bays member `mark` belongs to (as girder or as a beam
    resting on it): each bay's block; empty when `mark` is in no bay."""
    return [line for bay in result.bays if mark == bay.girder or mark in bay.beams for line in _bay_block(result, bay)]


def girder_load_lines(result: LevelResult, mark: str) -> list[str]:
    """The lines of `bay_text`'s derived girder loads table for the girders of the bays `mark`
    belongs to (header first); empty when it is in no bay or those girders carry no derived load."""
    girders = {bay.girder for bay in result.bays if mark == bay.girder or mark in bay.beams}
    loads = [g for g in result.loads if g.girder in girders]
    return _load_lines(loads) if loads else []


def bay_text(result: LevelResult) -> str:
    """The bays of the level as text for `fieldcomp camber` (under the beams)."""
    lines = ["Bays (girders with the beams resting on them, through the pour; bare steel):"] if result.bays else []
    for bay in result.bays:
        lines += _bay_block(result, bay)
    if result.loads:
        lines += ["", "Girder loads derived from the beams resting on them (kip):", *_load_lines(result.loads)]
    return "\n".join(lines + ([""] if lines else []) + concrete_lines(result))
