"""Marks sheet data: the studs of one beam as rows, plain text, CSV text and an SVG sheet.

Pure: builds strings from data (no files, no clock: the caller passes the date). The same data
serves repair sheets: `lost` and `added` studs per slot are drawn and listed beside the studs in
place, and an optional strength envelope (before / after) is plotted under the beam.
"""

from __future__ import annotations

import csv
import io
import math
from dataclasses import dataclass

import numpy as np

from engine.model.results import Check
from engine.studs.detailing import DECK_ANCHOR_CLAUSE
from engine.studs.layout import StudLayout, deck_anchor_slots, layout_qn
from engine.model.inputs import BeamInput
from engine.studs.ribs import printed_station
from engine.model.units import format_ft_in, format_inches

FORMULA_START = ("=", "+", "-", "@", "\t", "\r")  # spreadsheet formula triggers (OWASP CSV injection)


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


def clean(text: str) -> str:
    """User text without control characters (kept out of XML, CSV and terminals)."""
    return "".join(ch for ch in str(text) if ch.isprintable())


def slot_word(beam: BeamInput) -> str:
    """What a slot is called: a deck rib, or a row of studs along a flute or solid slab."""
    return "rib" if beam.deck_case == "perpendicular" else "row"


def studs_text(sheet: SheetData) -> str:
    """Stud size and where in the rib, e.g. '26 studs 3/4" dia x 5 1/4", weak side of rib'."""
    b = sheet.beam
    where = {"perpendicular": f"{b.studs.position} side of rib" if b.studs.position != "center" else "rib centre",
             "parallel": "in the flute", "none": "on the flange"}[b.deck_case]
    return f"{sheet.layout.total} studs {format_inches(b.studs.diameter)} dia x {format_inches(b.studs.length)}, {where}"


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
    if beam.deck_case != "perpendicular":
        return "in flute" if beam.deck_case == "parallel" else "on flange"
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
        rows.append(MarkRow(int(lay.number[i]), float(lay.x[i]), format_ft_in(float(printed_station(sheet.beam, lay.x[i]))), int(lay.count[i]),
                            int(lost[i]), int(added[i]), side_text(sheet.beam, str(sides[i])), qn))
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
    return lay.number[deck_anchor_slots(sheet.beam, shown)].tolist()


def summary_lines(sheet: SheetData) -> list[str]:
    """Totals, requirement, checks, deck anchors and notes, as printed under the table."""
    b, t = sheet.beam, totals(sheet)
    ends = (clean(b.ribs.reference_end), clean(b.ribs.far_end))
    studs = "studs working" if sheet.lost is not None else "studs"
    lines = [f"{ends[0]} half: {t.studs[0]} {studs}, sum Qn {t.sum_qn[0]:.1f} kips;  "
             f"{ends[1]} half: {t.studs[1]} {studs}, sum Qn {t.sum_qn[1]:.1f} kips;  "
             f"total {sum(t.studs)} {studs}"]
    if sheet.required_sum_qn is not None:
        lines.append(f"required sum Qn each side: {sheet.required_sum_qn:.1f} kips")
    for c in sheet.checks:
        where = f" at {format_ft_in(printed_station(sheet.beam, c.station))}" if c.station is not None else ""
        lines.append(f"{'pass' if c.passed else 'FAIL'} {c.ratio:.2f}  {c.name}{where}  [{c.clause}]")
    anchors = anchor_ribs(sheet)
    if anchors:
        lines.append(f"deck weld or fastener by others at ribs without studs: {', '.join(map(str, anchors))} "
                     f"(deck anchored at 18 in max, {DECK_ANCHOR_CLAUSE})")
    lines += [clean(n) for n in sheet.notes]
    return lines


def heading_lines(sheet: SheetData) -> list[str]:
    b = sheet.beam
    deck = b.slab.deck
    if deck is None:
        slab = f"solid slab {format_inches(b.slab.topping)}"
    elif b.deck_case == "perpendicular":
        first = b.ribs.first_rib if b.ribs.first_rib is not None else 0.5 * deck.pitch
        slab = (f"{format_inches(deck.rib_height)} deck '{clean(deck.name)}' across the beam, ribs at "
                f"{format_inches(deck.pitch)}, first rib {format_ft_in(first)}")
    else:
        slab = f"{format_inches(deck.rib_height)} deck '{clean(deck.name)}' along the beam (studs in the flute)"
    keep = f"keep-out {format_ft_in(b.ribs.keep_out_start)} / {format_ft_in(b.ribs.keep_out_end)} at the ends"
    return [f"{clean(sheet.title)}: beam {clean(b.mark)}, {b.shape.name}, span {format_ft_in(b.span)} - "
            f"job '{clean(sheet.job)}' - {clean(sheet.date)}",
            f"{station_origin_text(b)}, toward {clean(b.ribs.far_end)}; {slab}; {keep}",
            studs_text(sheet)]


def marks_text(sheet: SheetData) -> str:
    """The marks as a plain-text table with heading, totals, checks and caution."""
    rows = mark_rows(sheet)
    extra = sheet.lost is not None or sheet.added is not None
    head = f"{slot_word(sheet.beam):>8}  {'station':>12}  {'studs':>5}  " + ("lost    add  " if extra else "") + \
        f"{'Qn kip':>6}  side of rib"
    lines = heading_lines(sheet) + ["", head]
    for r in rows:
        mid = f"{r.lost:>4}  {r.added:>5}  " if extra else ""
        lines.append(f"{r.slot:>8}  {r.station:>12}  {r.studs:>5}  {mid}{r.qn:>6.1f}  {r.side}")
    return "\n".join(lines + [""] + summary_lines(sheet) + ["", f"CAUTION: {sheet.caution}"])


CSV_COLUMNS = ("job", "beam", "slot", "station_in", "station", "studs", "lost", "added", "side", "position",
               "qn_kips", "slot_qn_kips", "half", "stations_from")


def csv_text(value: str) -> str:
    """A user-text cell, escaped so a spreadsheet does not run it as a formula."""
    value = clean(value)
    return "'" + value if value.startswith(FORMULA_START) else value


def marks_csv(sheet: SheetData) -> str:
    """One row per slot with studs (columns `CSV_COLUMNS`); numbers stay numbers."""
    b, lay = sheet.beam, sheet.layout
    out = io.StringIO()
    w = csv.writer(out, lineterminator="\n")
    w.writerow(CSV_COLUMNS)
    flip = lay.x_flip if math.isfinite(lay.x_flip) else 0.5 * b.span
    for r in mark_rows(sheet):
        i = r.slot - 1
        half = b.ribs.reference_end if r.x <= flip + 1e-6 else b.ribs.far_end
        w.writerow([csv_text(sheet.job), csv_text(b.mark), r.slot, round(float(printed_station(b, r.x)), 4), r.station, r.studs, r.lost,
                    r.added, csv_text(r.side), str(lay.position[i]), round(r.qn, 3),
                    round((r.studs - r.lost) * r.qn, 3), csv_text(half), csv_text(station_origin_text(b))])
    return out.getvalue()


def marks_svg(sheet: SheetData) -> str:
    """The printable sheet (landscape, 10 x 7.5 in: fits letter and tabloid). See fieldcomp.views.marks_svg."""
    from fieldcomp.views.marks_svg import draw  # the drawing code, kept apart from the data

    return draw(sheet)
