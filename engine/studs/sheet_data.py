"""Marks sheet data: the studs of one beam as rows with stations, sides and Q_n, totals per half
span and the ribs that need a deck anchor. The text, CSV and SVG renderings are in fieldcomp.views.

No clock: the caller passes the date. The same data serves repair sheets: `lost` and `added` studs
per slot are listed beside the studs in place, with an optional strength envelope (before / after).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import cast

import numpy as np

from engine.model.results import Check
from engine.studs.layout import StudLayout, deck_anchor_slots, layout_qn
from engine.model.inputs import BeamInput, DeckCase
from engine.studs.ribs import printed_station
from engine.model.text import printable as clean
from engine.model.units import format_ft_in

@dataclass(frozen=True, slots=True)
class Envelope:
    """Strength along the span for the sheet's plot: stations `x` (in), `demand` and `capacity`
    (kip-in, phi Mn or Mn/Omega), and `capacity_after` when a change (repair) is shown."""

    x: np.ndarray
    demand: np.ndarray
    capacity: np.ndarray
    capacity_after: np.ndarray | None = None


@dataclass(frozen=True, slots=True)
class SheetData:
    """Everything one sheet shows. `layout.count`: studs in place (as designed); `lost`: of those,
    studs per slot that no longer work; `added`: studs per slot to add (int arrays per slot).
    `required_sum_qn`: what each side must develop (kip); `checks` and `notes` are printed under
    the totals; `caution` closes every output."""

    job: str
    beam: BeamInput
    date: str
    layout: StudLayout
    caution: str
    title: str = "Stud marks"
    required_sum_qn: float | None = None
    checks: tuple[Check, ...] = ()
    notes: tuple[str, ...] = ()
    lost: np.ndarray | None = None
    added: np.ndarray | None = None
    envelope: Envelope | None = None
    instructions: tuple[str, ...] = ()  # what the crew does, printed first in large type (field sheets)
    lost_kinds: tuple[str, ...] = ()  # per slot, the finding kind of its lost studs ("" where none)
    approval: bool = False  # print the engineer of record's approval block


@dataclass(frozen=True, slots=True)
class MarkRow:
    """One slot with studs: number from the reference end, station (in and ft-in text), studs in
    place, lost, to add, the side of the rib they stand on, Q_n of one stud (kip; for a slot that
    only receives studs, Q_n of those)."""

    slot: int
    x: float
    station: str
    studs: int
    lost: int
    added: int
    side: str
    qn: float


def slot_word(beam: BeamInput) -> str:
    """What a slot is called: a deck rib, or a row of studs along a flute or solid slab."""
    return "rib" if beam.deck_case == DeckCase.PERPENDICULAR else "row"


def origin_text(beam: BeamInput) -> str:
    """What stations are measured from (job option project.station_origin) at the reference end."""
    end = clean(beam.ribs.reference_end)
    if beam.ribs.station_origin == "support":
        return f"the support centreline (work point) at {end}"
    return f"the end of the steel at {end}"


def station_origin_text(beam: BeamInput) -> str:
    """How stations are measured, stated on every output."""
    return f"stations from {origin_text(beam)}"


def side_text(beam: BeamInput, side: str) -> str:
    """The side of the rib a stud stands on, named by the end it is toward."""
    if beam.deck_case != DeckCase.PERPENDICULAR:
        return "in flute" if beam.deck_case == DeckCase.PARALLEL else "on flange"
    if side == "center":
        return "centre of rib"
    if beam.studs.position == "weak":  # strength assumes the weak side: either side works, the strong side is better
        strong = beam.ribs.far_end if side == "reference" else beam.ribs.reference_end
        return f"either; {clean(strong)} side better"
    return f"toward {clean(beam.ribs.reference_end if side == 'reference' else beam.ribs.far_end)}"


def _per_slot(values: np.ndarray | None, n: int) -> np.ndarray:
    return np.zeros(n, dtype=int) if values is None else np.asarray(values, dtype=int)


def mark_rows(sheet: SheetData) -> list[MarkRow]:
    """Slots holding, losing or receiving studs, from the reference end."""
    lay = sheet.layout
    lost, added = _per_slot(sheet.lost, lay.x.size), _per_slot(sheet.added, lay.x.size)
    sides = lay.side
    rows = []
    for i in np.flatnonzero((lay.count > 0) | (added > 0)):
        qn = float(lay.qn[i]) if lay.count[i] > 0 else float(layout_qn(sheet.beam, added[i:i + 1], lay.position[i])[0])
        rows.append(MarkRow(int(lay.number[i]), float(lay.x[i]), format_ft_in(float(printed_station(sheet.beam, lay.x[i]))),
                            int(lay.count[i]), int(lost[i]), int(added[i]), side_text(sheet.beam, str(sides[i])), qn))
    return rows


@dataclass(frozen=True, slots=True)
class Totals:
    """Studs and their strength each side of the maximum moment (a slot on it counts half)."""

    studs: tuple[int, int]
    sum_qn: tuple[float, float]


def totals(sheet: SheetData) -> Totals:
    """Per half span: studs in place (less lost) and their sum of Q_n (kip, real per-rib values).

    AISC 360-22 I3.2d.1 / I8.2c (sum Qn between the maximum moment and each end).
    """
    lay = sheet.layout
    working = lay.count - _per_slot(sheet.lost, lay.x.size)
    flip = lay.x_flip if math.isfinite(lay.x_flip) else 0.5 * sheet.beam.span
    strength = working * lay.qn
    on = np.abs(lay.x - flip) <= 1e-6
    left, right = lay.x < flip - 1e-6, lay.x > flip + 1e-6
    half_on = 0.5 * float(strength[on].sum())
    studs_on = int(working[on].sum())
    return Totals((int(working[left].sum()) + studs_on, int(working[right].sum())),
                  (float(strength[left].sum()) + half_on, float(strength[right].sum()) + half_on))


def anchor_ribs(sheet: SheetData) -> list[int]:
    """Ribs without studs that need a deck weld or fastener by others (AISC 360-22 I3.2c.1)."""
    lay = sheet.layout
    working = lay.count - _per_slot(sheet.lost, lay.x.size) + _per_slot(sheet.added, lay.x.size)
    shown = StudLayout(lay.x, working, lay.position, lay.qn, lay.max_count, lay.x_flip)
    # cast: ndarray.tolist is Any in numpy's stubs
    return cast(list[int], lay.number[deck_anchor_slots(sheet.beam, shown)].tolist())
