"""`design_layout`: studs placed on one beam (engine.studs.placement), their checks, and, when the
requirement cannot be met, the shortfall and what would close it."""

from __future__ import annotations

import math
from dataclasses import replace
from functools import lru_cache

import numpy as np

from engine.finished.basis import finished_basis
from engine.model.results import Authority, Check, Flag
from engine.studs.detailing import spacing_checks, spacing_limits, studs_across
from engine.studs.layout import LayoutResult, StudLayout, layout_qn, slots_for
from engine.model.inputs import BeamInput, DeckCase
from engine.studs.placement import Arrangement, Need, Slots, arrange, slab_force_needed
from engine.finished.slab_force import slab_force
from engine.model.units import format_ft_in, format_inches

_TOL = 1e-6
SHORTFALL_CLAUSE = "AISC 360-22 I3.2d.1, I8.2a, I8.2c, I8.2d"


def beam_slots(beam: BeamInput) -> Slots:
    """The beam's slots with the strength of a slot holding 0..3 studs in the job's position
    (perpendicular deck) or centred (parallel flute, solid slab). AISC 360-22 I8.2a."""
    x, cap = slots_for(beam)
    word = beam.studs.position if beam.deck_case == DeckCase.PERPENDICULAR else "center"
    per_slot = np.concatenate(([0.0], np.arange(1, 4) * layout_qn(beam, np.arange(1, 4), word)))
    return Slots(x, cap, np.full(x.size, word), per_slot)


def stud_layout(slots: Slots, counts: np.ndarray, x_max: float) -> StudLayout:
    """The layout of `counts` studs per slot; Q_n per stud from the slots' table (the same
    values `layout_qn` gives, every slot of a design sharing one position word)."""
    qn = slots.per_slot[counts] / np.maximum(counts, 1)
    return StudLayout(slots.x, counts, slots.words, qn, slots.cap, x_max)


@lru_cache(maxsize=64)
def design_layout(beam: BeamInput, suggest: bool = True) -> LayoutResult:
    """Studs rib by rib for one beam: the drawings' count, or with `count = "design"` the fewest
    that give phi Mn >= Mu at every station; singles first, doubles nearest the ends, within
    the limits of AISC 360-22 I8.1, I8.2d and I3.2c.3 (engine.studs.placement). Computed once per
    beam input (the finished-beam evaluation designs it too); arrays read-only.

    What would close a shortfall is searched for only with `suggest` (for the views that show
    it); the layout, its checks and its flags are the same without it, the shortfall text then
    naming only what falls short."""
    if suggest:
        return _with_suggestions(beam, design_layout(beam, False))
    need = slab_force_needed(beam)
    slots = beam_slots(beam)
    total = beam.studs.count
    arr = arrange(beam, need, slots, total)
    layout = stud_layout(slots, arr.counts, need.x_max)
    groups = layout.groups()
    _, left, right = slab_force(np.array([need.x_max]), groups, math.inf)
    provided = (float(left[0]), float(right[0]))
    checks, flags = spacing_checks(beam, groups)
    required = float(need.c_req.max())  # what phi Mn >= Mu needs each side (I8.2c: V' the design uses)
    if total is None:
        checks.append(Check("studs.slab_force", "studs develop the slab force phi Mn >= Mu needs, each side",
                            "AISC 360-22 I3.2d.1, I8.2c",
                            required, min(provided), "kip", station=need.x_max, kind="detailing"))
    else:
        checks.append(Check("studs.count_placed", "studs placed vs count on the drawings",
                            "the drawings (project); AISC 360-22 I8.2d",
                            float(total), float(layout.total), "studs", kind="detailing", authority=Authority.PROJECT))
    intent = design_intent(beam)
    if intent is not None:
        checks.append(Check("studs.design_intent", "sum Qn each side vs the design's stated intent",
                            "the job's design_sum_qn / design_composite "
                            "(project intent; strength is checked by AISC 360-22 I3.2a)",
                            intent, min(provided), "kip", station=need.x_max, kind="detailing",
                            authority=Authority.PROJECT, advisory=True))
    text = "; ".join(_problems(beam, need, slots, arr, layout, required, provided)) or None
    if text is not None:
        flags.append(Flag(SHORTFALL_CLAUSE, f"stud layout short: {text}"))
    for values in (layout.x, layout.count, layout.position, layout.qn, layout.max_count):
        values.flags.writeable = False
    return LayoutResult(layout, required, provided[0], provided[1], text, tuple(checks), tuple(flags),
                        "design" if total is None else "drawings")


def design_intent(beam: BeamInput) -> float | None:
    """The sum Qn each side the design states it relies on (kip): `design_sum_qn`, or
    `design_composite` x C_f (AISC 360-22 I3.2d.1); None when the job states neither."""
    spec = beam.studs
    if spec.design_sum_qn is not None:
        return spec.design_sum_qn
    if spec.design_composite is not None:
        return spec.design_composite * finished_basis(beam).limits.cf
    return None


def envelope_misses(need: Need, layout: StudLayout) -> np.ndarray:
    """Stations where the placed studs develop less slab force than phi Mn >= Mu needs (stations
    where even full composite action falls short are left to that message)."""
    _, left, right = slab_force(need.x, layout.groups(), math.inf)
    low = need.c_req - _TOL * np.maximum(need.c_req, 1.0)
    return np.flatnonzero(~need.short & ((left < low) | (right < low)))


def _with_suggestions(beam: BeamInput, placed: LayoutResult) -> LayoutResult:
    """`placed` (designed without suggestions) with what would close its shortfall, if it has one."""
    if placed.shortfall is None:
        return placed
    options = closing_options(beam, slab_force_needed(beam), beam_slots(beam), placed.layout, placed.required_sum_qn)
    text = placed.shortfall + (". Would close it: " + "; ".join(options) if options else "")
    flags = placed.flags[:-1] + (Flag(SHORTFALL_CLAUSE, f"stud layout short: {text}"),)  # the shortfall's flag is last
    return replace(placed, shortfall=text, flags=flags)


def _problems(beam: BeamInput, need: Need, slots: Slots, arr: Arrangement, layout: StudLayout,
              required: float, provided: tuple[float, float]) -> list[str]:
    if need.short.any():
        k = int(np.argmax(np.where(need.short, need.demand, -np.inf)))
        return [f"the demand at {format_ft_in(float(need.x[k]))} exceeds the strength with full composite action: "
                "the shape is too light for any stud count"]
    if not (slots.cap > 0).any():
        return ["no slot can take a stud: the flute or flange is too narrow for the stud (AISC 360-22 I3.2c.3, "
                "I8.2d) or the keep-out zones cover every rib"]
    problems: list[str] = []
    ends = (beam.ribs.reference_end, beam.ribs.far_end)
    for h in range(2):
        if arr.before[h] > 0.0:
            problems.append(f"composite action ({arr.before[h]:.0f} kips) is needed nearer the {ends[h]} end than "
                            "the first usable slot: keep-out zone or first rib too far out")
        elif arr.full[h]:
            problems.append(f"every usable slot on the {ends[h]} half is full and still short")
    for start, gap in arr.gaps:
        problems.append(f"a {format_inches(gap)} spacing from {format_ft_in(start)} has no usable slot to split it "
                        f"(max {format_inches(spacing_limits(beam)[1])}, AISC 360-22 I8.2d)")
    if beam.studs.count is not None:
        problems += _drawing_problems(beam, layout, beam.studs.count)
    misses = envelope_misses(need, layout)
    if misses.size and (beam.studs.count is not None or not problems):
        problems.append(f"the studs develop less slab force than phi Mn >= Mu needs (at least 25 % of C_f at the "
                        f"maximum moment) at {misses.size} of {need.x.size} stations, from "
                        f"{format_ft_in(float(need.x[misses[0]]))} to {format_ft_in(float(need.x[misses[-1]]))}")
    return problems


def _drawing_problems(beam: BeamInput, layout: StudLayout, total: int) -> list[str]:
    out: list[str] = []
    if layout.total < total:
        out.append(f"only {layout.total} of the {total} studs on the drawings fit the usable slots")
    occupied = layout.x[layout.count > 0]
    smax = spacing_limits(beam)[1]
    if occupied.size > 1 and float(np.diff(occupied).max()) > smax + 1e-9:
        gap = float(np.diff(occupied).max())
        out.append(f"{total} studs leave a {format_inches(gap)} spacing (max {format_inches(smax)}, AISC 360-22 I8.2d)")
    return out


def _meets_all(beam: BeamInput, need: Need, slots: Slots, arr: Arrangement, required: float | None) -> bool:
    layout = stud_layout(slots, arr.counts, need.x_max)
    if any(b > 0.0 for b in arr.before) or any(arr.full) or arr.gaps or envelope_misses(need, layout).size:
        return False
    if required is None:
        return True
    _, left, right = slab_force(np.array([need.x_max]), layout.groups(), math.inf)
    return min(float(left[0]), float(right[0])) >= required * (1.0 - _TOL)


def cannot_close(need: Need, per_slot: np.ndarray, total: int) -> bool:
    """True when `total` studs with these slot strengths cannot meet `need` wherever they are
    placed, so a trial keeping them (other ribs, another stud count per rib) cannot help.

    Proof: `slab_force` counts each stud group on one side of a station, or half on each, so
    left(x) + right(x) is the studs' whole strength S; a slot of k studs gives per_slot[k] <= k q
    with q = max_k per_slot[k] / k, so S <= total q. `envelope_misses` is empty only if left and
    right reach `low` at every station not short, so only if 2 low <= S <= total q there; where
    2 low exceeds total q (with a margin over rounding) the trial keeps a miss and its shortfall.
    The need does not depend on the ribs or the stud position (engine.studs.placement:
    demand and phi Mn(C), AISC 360-22 I3.2a, I3.2d.1, I8.2c).
    """
    k = np.arange(1, per_slot.size)
    q = float((per_slot[1:] / k).max()) if k.size else 0.0
    low = need.c_req - _TOL * np.maximum(need.c_req, 1.0)
    return bool((~need.short & (2.0 * low > total * q * (1.0 + 1e-9) + 1e-9)).any())


def closing_options(beam: BeamInput, need: Need, slots: Slots, layout: StudLayout, required: float) -> list[str]:
    """Changes that would meet the requirement, each tried by placing the studs again; a trial
    keeping the drawings' count is skipped where `cannot_close` shows it cannot help."""
    options: list[str] = []
    if need.short.any():
        return ["a heavier shape (no stud count reaches phi Mn >= Mu)"]
    total = beam.studs.count
    hopeless = total is not None and cannot_close(need, slots.per_slot, total)
    if total is not None:
        for more in range(total + 1, int(slots.cap.sum()) + 1):
            if cannot_close(need, slots.per_slot, more):
                continue
            if _meets_all(beam, need, slots, arrange(beam, need, slots, more), required):
                options.append(f"{more} studs instead of {total} (EOR to revise the count)")
                break
        fewest = arrange(beam, need, slots, None)
        if _meets_all(beam, need, slots, fewest, None) and int(fewest.counts.sum()) <= layout.total:
            options.append(f"the EOR accepting the lower degree of composite these studs give: phi Mn >= Mu holds "
                           f"at every station with {int(fewest.counts.sum())} studs on this deck")
    if beam.deck_case == DeckCase.PERPENDICULAR and beam.slab.deck is not None:
        pitch = beam.slab.deck.pitch
        now = beam.ribs.first_rib if beam.ribs.first_rib is not None else 0.5 * pitch
        for k in range(1, 16) if not hopeless else ():
            first = round(now + k * pitch / 16.0, 4) % pitch or pitch
            trial = replace(beam, ribs=replace(beam.ribs, first_rib=first))
            if design_layout(trial, suggest=False).shortfall is None:
                options.append(f"first rib at {format_inches(first)} from the {beam.ribs.reference_end} end instead "
                               f"of {format_inches(now)} (if the deck layout allows)")
                break
        if beam.studs.position == "weak":
            trial = replace(beam, studs=replace(beam.studs, position="strong"))
            if not (total is not None and cannot_close(need, beam_slots(trial).per_slot, total)) and design_layout(
                    trial, suggest=False).shortfall is None:
                options.append("studs on the strong side of each rib (R_p 0.75, AISC 360-22 I8.2a), if the "
                               "deck's stiffener allows and the installer is told which side")
    if not hopeless and beam.studs.max_per_rib < studs_across(replace(beam, studs=replace(beam.studs, max_per_rib=3))):
        trial = replace(beam, studs=replace(beam.studs, max_per_rib=beam.studs.max_per_rib + 1))
        if design_layout(trial, suggest=False).shortfall is None:
            options.append(f"allowing {beam.studs.max_per_rib + 1} studs per rib (job limit)")
    options.append("a heavier shape (less slab force needed)")
    return options
