"""The marks sheet as plain text and as CSV for spreadsheets (one row per slot with studs)."""

from __future__ import annotations

import csv
import io
import math

from engine.model.inputs import DeckCase
from engine.model.text import printable as clean
from engine.model.units import format_ft_in, format_inches
from engine.studs.detailing import DECK_ANCHOR_CLAUSE
from engine.studs.ribs import printed_station
from engine.studs.sheet_data import SheetData, anchor_ribs, mark_rows, slot_word, station_origin_text, totals
from fieldcomp.views.csv_safety import csv_cell
from fieldcomp.views.numbers import ratio_text


def studs_text(sheet: SheetData) -> str:
    """Stud size and where in the rib, e.g. '26 studs 3/4" dia x 5 1/4", weak side of rib'."""
    b = sheet.beam
    where = {"perpendicular": f"{b.studs.position} side of rib" if b.studs.position != "center" else "rib centre",
             "parallel": "in the flute", "none": "on the flange"}[b.deck_case]
    return f"{sheet.layout.total} studs {format_inches(b.studs.diameter)} dia x {format_inches(b.studs.length)}, {where}"


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
        word = {"pass": "pass", "review": "REVIEW", "fail": "FAIL"}[c.level]
        lines.append(f"{word} {ratio_text(c.ratio)}  {c.name}{where}  [{c.clause}; {c.authority}]")
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
    elif b.deck_case == DeckCase.PERPENDICULAR:
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
        w.writerow([csv_cell(sheet.job), csv_cell(b.mark), r.slot, round(float(printed_station(b, r.x)), 4), r.station, r.studs, r.lost,
                    r.added, csv_cell(r.side), str(lay.position[i]), round(r.qn, 3),
                    round((r.studs - r.lost) * r.qn, 3), csv_cell(half), csv_cell(station_origin_text(b))])
    return out.getvalue()
