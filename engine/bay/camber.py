"""Camber for the bay: the floor at mid-bay (girder + beam) for the cambers chosen, side by side.

Each member's own rule (engine.construction.camber, common practice) looks at its own deflection
only, so a beam and a girder each under the minimum camber may together sag well over it at
mid-bay. The alternatives offered: each member's rule; the beams cambered also for the girders'
share; the girder cambered (its own share rounded down to the increment, the minimum waived);
the girder cambered and the beams for the rest; no camber. The engineer picks one.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, replace

import numpy as np

from engine.bay.inputs import Bearing
from engine.bay.solve import BaySolution, MemberRun
from engine.construction.camber import decide_camber
from engine.construction.pours import KIP_PER_IN3_PER_PCF
from engine.model.inputs import BeamInput
from engine.model.units import format_inches

PROFILE_POINTS = 9  # top-of-slab profile across the bay: the beam's ends, its eighth points


@dataclass(frozen=True, slots=True)
class BayFloor:
    """The floor across one bay for one set of cambers (in): `deflection` at mid-bay below the line
    of the columns (beam + girder, before camber), `net` less the cambers there, top of slab above
    (+) or below (-) that line at `stations` along the mid-bay beam, extra concrete (in^3) ponded
    in the bay's beams (own sag and girders' sag)."""

    label: str
    cambers: tuple[tuple[str, float], ...]
    deflection: float
    net: float
    beam_share: float
    girder_share: float
    stations: tuple[float, ...]
    top_of_slab: tuple[float, ...]
    extra_concrete: float


@dataclass(frozen=True, slots=True)
class BayCamber:
    """One bay (a girder and the beams resting on it): its mid-bay beam (the one bearing nearest the
    girder's midspan; mid-bay is that beam's midspan) and the alternatives."""

    girder: str
    beams: tuple[str, ...]
    mid_beam: str
    girder_deflection: float  # the girder's own wet deflection at its midspan at the ordered cambers (in)
    alternatives: tuple[BayFloor, ...]
    remark: str


def mid_bay_beam(girder: BeamInput, bearings: tuple[Bearing, ...]) -> str:
    """The beam bearing nearest the girder's midspan (where beam and girder sag most together)."""
    mine = [b for b in bearings if b.girder == girder.mark]
    return min(mine, key=lambda b: abs(b.at - 0.5 * girder.span)).beam


def floor(solution: BaySolution, beam: BeamInput, beams: tuple[str, ...], label: str,
          cambers: dict[str, float]) -> BayFloor:
    """The floor across the bay from a bay solve at `cambers`.
    Top of slab as engine.construction.camber.camber_outcome: constant thickness follows the
    steel (top = lift - sag); struck off level, the top sags only by what is placed after it."""
    run = solution.member(beam.mark)
    sag, lift = run.sag(), run.lift()
    idx = np.arange(run.x.size)
    at_place = sag[run.first_step, idx]
    top = np.where(run.level_placed, -(sag[-1] - at_place), lift - sag[-1])
    pick = np.round(np.linspace(0, run.x.size - 1, PROFILE_POINTS)).astype(int)
    mid = run.x.size // 2
    own = float(np.cumsum(run.dead, axis=0)[-1, mid])
    extra = sum(float(solution.member(m).ponded_own.sum() + solution.member(m).ponded_settle.sum()) for m in beams)
    return BayFloor(label, tuple(sorted(cambers.items())), float(sag[-1, mid]), float(sag[-1, mid] - lift[mid]),
                    own, float(sag[-1, mid]) - own, tuple(float(v) for v in run.x[pick]),
                    tuple(float(v) for v in top[pick]), extra / _unit_weight(beam))


def _unit_weight(beam: BeamInput) -> float:
    return beam.slab.concrete_pcf * KIP_PER_IN3_PER_PCF


def bay_camber(girder: BeamInput, members: dict[str, BeamInput], bearings: tuple[Bearing, ...],
               own: dict[str, float], solve: Callable[[dict[str, float]], BaySolution]) -> BayCamber:
    """The bay's alternatives (module docstring), each solved afresh at its cambers by `solve`
    (a level screed ponds less on cambered steel). Camber rules: common practice ("Specifying
    Camber", Modern Steel Construction, July 2006) via engine.construction.camber."""
    beams = tuple(dict.fromkeys(b.beam for b in bearings if b.girder == girder.mark))
    mid = members[mid_bay_beam(girder, bearings)]
    base = solve(own)
    picks: list[tuple[str, dict[str, float]]] = [("each member's own rule", dict(own))]
    shares = _beam_cambers(base, beams, members)
    picks.append(("beams cambered for the girders' share", {**own, **shares}))
    g_camber = _girder_camber(girder, base.member(girder.mark))
    if g_camber > 0.0:
        with_girder = {**own, girder.mark: g_camber}
        picks.append(("girder cambered", with_girder))
        rest = _beam_cambers(solve(with_girder), beams, members)
        picks.append(("girder cambered, beams for the rest", {**with_girder, **rest}))
    picks.append(("no camber", {**own, girder.mark: 0.0, **{m: 0.0 for m in beams}}))
    seen: set[tuple[tuple[str, float], ...]] = set()
    floors = []
    for label, cambers in picks:
        key = tuple(sorted((m, round(cambers.get(m, 0.0), 6)) for m in (girder.mark, *beams)))
        if key in seen:
            continue
        seen.add(key)
        result = base if cambers == own else solve(cambers)
        mine = {m: c for m, c in key}
        floors.append(floor(result, mid, beams, label, mine))
    first = floors[0]
    g_run = base.member(girder.mark)
    g_mid = float(np.cumsum(g_run.dead, axis=0)[-1, g_run.x.size // 2])
    remark = ""
    rules = mid.construction.camber
    if all(c == 0.0 for _, c in first.cambers) and rules.fraction * first.deflection >= rules.minimum - 1e-9:
        remark = (f"beam {mid.mark} ({format_inches(first.beam_share)}) and girder {girder.mark} "
                  f"({format_inches(g_mid)} at its midspan) are each left uncambered by their own rule, but "
                  f"together sag {format_inches(first.deflection)} at mid-bay: see the alternatives")
    return BayCamber(girder.mark, beams, mid.mark, g_mid, tuple(floors), remark)


def _beam_cambers(solution: BaySolution, beams: tuple[str, ...], members: dict[str, BeamInput]) -> dict[str, float]:
    """Each beam's camber by its rule for its total sag at midspan (own + girders', less the
    girders' camber there)."""
    out = {}
    for mark in beams:
        run: MemberRun = solution.member(mark)
        mid = run.x.size // 2
        lift_ends = run.lift()[mid] - run.camber
        sag = float(run.sag()[-1, mid]) - lift_ends
        out[mark] = decide_camber(members[mark], sag, 0.0).camber
    return out


def _girder_camber(girder: BeamInput, run: MemberRun) -> float:
    """The girder's share rounded down to the increment, the minimum waived; its other rules hold."""
    rules = girder.construction.camber
    mid = run.x.size // 2
    relaxed = replace(girder, construction=replace(girder.construction, camber=replace(rules, minimum=rules.increment)))
    return decide_camber(relaxed, float(np.cumsum(run.dead, axis=0)[-1, mid]), 0.0).camber
