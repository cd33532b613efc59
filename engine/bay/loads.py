"""A girder's loads from the beams that rest on it: each beam end's reaction, stage by stage and
load type by load type, is a point load on the girder at the bearing. Statics of a simple span:
the reaction of a beam end is the beam's end shear (engine.mechanics.statics.reactions,
engine.mechanics.ponding.line_load_effects for the ponded concrete)."""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np

from engine.bay.inputs import Bearing
from engine.bay.solve import BaySolution
from engine.finished.loads import finished_loads
from engine.mechanics.statics import reactions
from engine.model.inputs import BeamInput, PointLoad

LOAD_TYPES = ("steel and deck", "wet concrete", "ponded concrete", "construction live", "superimposed dead", "live")


@dataclass(frozen=True, slots=True)
class GirderLoad:
    """One beam end's reaction on a girder in one step of the level (kip, down on the girder).
    `step` names the level's step ("steel and deck" at erection, else the day's pours) and `day`
    its day (None at erection); the finished loads (superimposed dead, live) have step "finished"."""

    girder: str
    beam: str
    end: int
    at: float
    step: str
    day: float | None
    steel_and_deck: float = 0.0
    wet_concrete: float = 0.0
    ponded_concrete: float = 0.0
    construction_live: float = 0.0
    superimposed_dead: float = 0.0
    live: float = 0.0

    def of(self, load_type: str) -> float:
        """The load of one of LOAD_TYPES (kip)."""
        return float(getattr(self, load_type.replace(" ", "_")))


FINISHED = "finished"


def girder_loads(solution: BaySolution, beams: dict[str, BeamInput], bearings: tuple[Bearing, ...]) -> tuple[GirderLoad, ...]:
    """Every bearing's reaction per step and load type: erection (steel and deck), each pour day
    (wet concrete at nominal thickness, ponded concrete, construction live load) from the bay
    solve, and the finished superimposed dead and live loads on the composite beam."""
    out: list[GirderLoad] = []
    for b in bearings:
        run = solution.member(b.beam)
        for t, (step, day) in enumerate(zip(run.names, solution.days)):
            nominal, ponded, live = (float(v) for v in run.reaction[t, b.end])
            if t == 0:
                out.append(GirderLoad(b.girder, b.beam, b.end, b.at, step, None, steel_and_deck=nominal))
            elif nominal or ponded or live:
                out.append(GirderLoad(b.girder, b.beam, b.end, b.at, step, day, wet_concrete=nominal,
                                      ponded_concrete=ponded, construction_live=live))
        loads = finished_loads(beams[b.beam])
        sdl = reactions(beams[b.beam].span, loads.postcomposite_dead)[b.end] if loads.postcomposite_dead else 0.0
        ll = reactions(beams[b.beam].span, loads.live)[b.end] if loads.live else 0.0
        out.append(GirderLoad(b.girder, b.beam, b.end, b.at, FINISHED, None, superimposed_dead=sdl, live=ll))
    return tuple(out)


def derived_point_loads(loads: tuple[GirderLoad, ...], girder: str) -> tuple[PointLoad, ...]:
    """The girder's point loads from its bearings: at erection, with each pour day, and on the
    finished floor (engine.model.inputs.PointLoad with `erection` / `day`)."""
    out = []
    for g in loads:
        if g.girder != girder:
            continue
        if g.step == FINISHED:
            out.append(PointLoad(g.at, g.superimposed_dead, g.live, 0.0))
        elif g.day is None:
            out.append(PointLoad(g.at, g.steel_and_deck, 0.0, g.steel_and_deck, erection=True))
        else:
            lasting = g.wet_concrete + g.ponded_concrete
            out.append(PointLoad(g.at, lasting, 0.0, lasting, g.construction_live, day=g.day))
    return tuple(out)


def without_derived(girder: BeamInput) -> BeamInput:
    """The girder with only its typed point loads (those from bearings removed)."""
    typed = tuple(p for p in girder.point_loads if not (p.erection or p.day is not None))
    return replace(girder, point_loads=typed) if len(typed) != len(girder.point_loads) else girder


def with_derived(girder: BeamInput, loads: tuple[GirderLoad, ...]) -> BeamInput:
    """The girder with its typed point loads and those derived from its bearings."""
    girder = without_derived(girder)
    return replace(girder, point_loads=girder.point_loads + derived_point_loads(loads, girder.mark))


def with_settlement(beam: BeamInput, solution: BaySolution) -> BeamInput:
    """The beam with the drop of its ends on the girders by the end of each pour day, net of the
    girders' camber (engine.model.inputs.ConstructionSpec.settlement), from the bay solve."""
    run = solution.member(beam.mark)
    drops = np.cumsum(run.settle, axis=0)
    rows = tuple((float(day), float(d[0] - run.end_lift[0]), float(d[1] - run.end_lift[1]))
                 for day, d in zip(solution.days[1:], drops[1:]))
    return replace(beam, construction=replace(beam.construction, settlement=rows))
