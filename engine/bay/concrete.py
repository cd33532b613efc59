"""Concrete to order per pour zone and for the level (in^3): nominal, plus what level screeding
ponds into the beams' own sag and into the girders' sag under them, plus, when the engineer gives
the deck's own sag between beams, the concrete it holds.

Nominal: each member's tributary strip placed by the zone (length x width) times the slab's
concrete per unit area (engine.model.deck.Slab.wet_weight_psf over the unit weight: topping plus
ribs averaged over the pitch). Deck sag: a parabola between beams, whose mean depth is 2/3 of its
mid-pitch value (geometry of the parabola), over the same strips.
"""

from __future__ import annotations

from dataclasses import dataclass

from engine.bay.solve import BaySolution
from engine.construction.pours import KIP_PER_IN3_PER_PCF, PourPlan, side_widths
from engine.model.inputs import BeamInput

IN3_PER_PSF_PCF = 12.0  # a slab of w psf at gamma pcf is w / gamma ft = 12 w / gamma in thick
DECK_SAG_METHOD = "deck sag between beams taken as a parabola: mean depth 2/3 of the mid-pitch sag (geometry)"


@dataclass(frozen=True, slots=True)
class ZoneConcrete:
    """Concrete (in^3) of one zone, or of the level when `zone` is "level"."""

    zone: str
    day: float | None
    nominal: float
    ponded_own: float
    ponded_girders: float
    deck_sag: float

    @property
    def total(self) -> float:
        return self.nominal + self.ponded_own + self.ponded_girders + self.deck_sag


OUTSIDE = "outside the pour zones"


def zone_concrete(members: tuple[BeamInput, ...], plans: dict[str, PourPlan], solution: BaySolution,
                  deck_sag: float | None, zones: tuple[str, ...]) -> tuple[ZoneConcrete, ...]:
    """Per pour zone (the zones name their members' stages) in day order, the members' own
    stages outside every zone together, then the level's sum."""
    rows: dict[str, list[float]] = {}
    days: dict[str, float] = {}
    for m in members:
        plan = plans[m.mark]
        run = solution.member(m.mark)
        width = sum(side_widths(m))
        thick = IN3_PER_PSF_PCF * m.slab.wet_weight_psf() / m.slab.concrete_pcf
        unit = m.slab.concrete_pcf * KIP_PER_IN3_PER_PCF
        for step in plan.steps[1:]:
            if step.kind != "pour":
                continue
            placed = float(step.placed.sum(axis=0).max()) > 0.0 and width > 0.0
            name = step.name if step.name in zones else OUTSIDE
            row = rows.setdefault(name, [0.0, 0.0, 0.0, 0.0])
            days[name] = step.day if name != OUTSIDE else float("inf")
            if not placed:
                continue
            share = _side_share(step.side, m)
            area = (step.end - step.start) * width * share
            row[0] += area * thick
            row[3] += area * (2.0 / 3.0) * deck_sag if deck_sag else 0.0
            t = solution.days.index(step.day)
            same_day = [s for s in plan.steps[1:] if s.day == step.day and s.kind == "pour"]
            if same_day[0] is step:  # the day's ponding goes to the member's first stage that day
                row[1] += float(run.ponded_own[t]) / unit
                row[2] += float(run.ponded_settle[t]) / unit
    out = [ZoneConcrete(name, None if name == OUTSIDE else days[name], *vals)
           for name, vals in sorted(rows.items(), key=lambda kv: days[kv[0]])]
    total = [sum(getattr(z, f) for z in out) for f in ("nominal", "ponded_own", "ponded_girders", "deck_sag")]
    return (*out, ZoneConcrete("level", None, *total))


def _side_share(side: str, m: BeamInput) -> float:
    left, right = side_widths(m)
    if side == "both" or left + right <= 0.0:
        return 1.0
    return (left if side == "left" else right) / (left + right)
