"""The crew's stud sheet as a PDF page, one per beam (engine.pipeline.erector_sheet), and the
repair sheet (engine.pipeline.field_sheet) drawn the same way. What the crew does comes first, in
large type: the studs to load and weld, then rib by rib the station, the studs and the side of the
rib. Then the side of the rib drawn, the camber of the piece, the deck welds, and the beam
elevation to a stated scale. No strength plot or code check: those are in the calculation package."""

from __future__ import annotations

import math

from engine.model.inputs import DeckCase
from engine.model.text import printable as clean
from engine.model.units import format_ft_in, format_inches
from engine.studs.ribs import printed_station
from engine.studs.sheet_data import MarkRow, SheetData, anchor_ribs, mark_rows, origin_text, slot_word
from fieldcomp.views.pdf_page import BOTTOM, GREY, INK, LEFT, RIGHT, TOP, SheetPdf, fit_scale, latin

RED, GREEN = (170, 40, 30), (20, 110, 50)
DETAIL_SCALE = 1.0 / 6.0  # the rib detail at 2" = 1'-0" (1:6)


def camber_text(camber) -> str:
    """The piece's camber as the crew checks it (engine.construction.camber.CamberDecision)."""
    if camber.camber <= 0.0:
        why = camber.reason.removeprefix("not cambered: ")
        return f"NOT CAMBERED ({why})" if why else "NOT CAMBERED"
    return (f"CAMBER {format_inches(camber.camber)} ordered, crown up (shop tolerance -0 / +"
            f"{format_inches(camber.tolerance)}, AISC 303-16 6.4.4)")


def stud_order_text(sheet: SheetData, lengths) -> str:
    """'26 STUDS 3/4" DIA - LOAD 5 5/8" STUDS (5 1/4" AFTER WELDING, 3/8" BURN-OFF THROUGH DECK)'."""
    b = sheet.beam
    where = "through deck" if lengths.through_deck else "on bare steel"
    return (f"{sheet.layout.total} STUDS {format_inches(b.studs.diameter)} DIA - LOAD {format_inches(lengths.before)} "
            f"STUDS ({format_inches(lengths.after)} AFTER WELDING, {format_inches(lengths.burn_off)} burn-off {where})")


def side_runs(rows: list[MarkRow], word: str) -> list[str]:
    """Rows in a run on one side as 'ribs 2-15: toward grid 2', or 'ribs 1-39 as listed: in
    flute' when some ribs of the run hold no stud (one line per run)."""
    out: list[tuple[int, int, int, str]] = []
    for r in rows:
        if out and out[-1][3] == r.side:
            out[-1] = (out[-1][0], r.slot, out[-1][2] + 1, r.side)
        else:
            out.append((r.slot, r.slot, 1, r.side))
    return [f"{word} {a}: {side}" if a == b else f"{word}s {a}-{b}{'' if n == b - a + 1 else ' as listed'}: {side}"
            for a, b, n, side in out]


def _header(pdf: SheetPdf, sheet: SheetData, camber) -> float:
    b = sheet.beam
    title = "erector stud sheet" if camber is not None else sheet.title
    pdf.words(LEFT, TOP + 0.12, clean(title).upper(), 7, grey=True)
    pdf.words(LEFT, TOP + 0.52, b.mark, 30, "B")
    pdf.words(LEFT, TOP + 0.78, f"{b.shape.name}   span {format_ft_in(b.span)}", 11)
    pdf.words(LEFT + 3.4, TOP + 0.24, f"REFERENCE END (station 0): {b.ribs.reference_end}", 9, "B")
    pdf.words(LEFT + 3.4, TOP + 0.42, f"FAR END: {b.ribs.far_end}", 9, "B")
    pdf.words(LEFT + 3.4, TOP + 0.60, f"stations measured from {origin_text(b)}", 8)
    if camber is not None:
        pdf.set_line_width(0.02)
        pdf.rect(LEFT + 3.35, TOP + 0.67, RIGHT - LEFT - 3.35, 0.22)
        pdf.words(LEFT + 3.42, TOP + 0.83, camber_text(camber), 9, "B")
    return TOP + 1.0


def _instructions(pdf: SheetPdf, sheet: SheetData, lengths, erector: bool, y: float, width: float) -> float:
    pdf.words(LEFT, y + 0.1, "DO THIS", 7, grey=True)
    y += 0.16
    lines: list[tuple[str, float]] = []
    if sheet.instructions:
        lines = [(s, 8 if s.startswith(("METHOD:", "RE-TEST:")) else 10.5) for s in sheet.instructions]
    if erector:
        lines.append((stud_order_text(sheet, lengths), 13))
        lines += [(s.upper(), 12) for s in side_runs(mark_rows(sheet), slot_word(sheet.beam))]

    for text, size in lines:
        y = pdf.paragraph(LEFT, y, width, text, size, "B" if size > 8 else "") + 0.02
    return y + 0.04


MIN_STEP = 0.125  # the closest rows the crew reads (in of paper; 7 pt type)


def table_rows(sheet: SheetData) -> list[MarkRow]:
    """The rows the crew's table lists: every slot with studs; on a repair only what changes."""
    extra = sheet.lost is not None or sheet.added is not None
    return [r for r in mark_rows(sheet) if not extra or r.lost or r.added]


def _table(pdf: SheetPdf, sheet: SheetData, rows: list[MarkRow], y: float, width: float, bottom: float) -> tuple[float, int]:
    """The rows from `y` down to `bottom` in as many blocks as fit `width`, in the largest type
    that fits: (the y below the table, how many rows it holds; the rest go on a next sheet)."""
    extra = sheet.lost is not None or sheet.added is not None
    word = slot_word(sheet.beam).upper()
    heads = [word, "STATION", "STUDS"] + (["LOST", "ADD"] if extra else []) + ["SIDE OF RIB" if word == "RIB" else "WHERE"]
    widths = [0.42, 0.8, 0.5] + ([0.42, 0.42] if extra else []) + [1.2]
    block_w = sum(widths) + 0.1
    room = max(1, int((bottom - y - 0.2) / MIN_STEP))
    most = max(1, int(width // block_w))
    blocks = max(1, min(most, math.ceil(len(rows) / 8) or 1, math.ceil(len(rows) / room)))
    rows = rows[:blocks * room]
    per = max(1, math.ceil(len(rows) / blocks))
    step = min(0.2, (bottom - y - 0.2) / per)
    size = max(6.0, min(11.0, step * 72 * 0.8))
    for blk in range(blocks):
        x = LEFT + blk * block_w
        cx = x
        for head, w in zip(heads, widths):
            pdf.words(cx, y + 0.1, head, 7, grey=True)
            cx += w
        for j, r in enumerate(rows[blk * per:(blk + 1) * per]):
            ry = y + 0.14 + step * (j + 1)
            cells = [str(r.slot), r.station, str(r.studs)] + ([str(r.lost), str(r.added)] if extra else []) + [r.side]
            cx = x
            for k, (cell, w) in enumerate(zip(cells, widths)):
                colour = RED if extra and k == 3 and r.lost else GREEN if extra and k == 4 and r.added else INK
                pdf.set_text_color(*colour)
                pdf.set_font("Helvetica", "B" if k in (1, 2) else "", size if k < len(cells) - 1 else min(size, 7.5))
                pdf.text(cx, ry, latin(cell))
                cx += w
            pdf.set_text_color(*INK)
    return y + 0.14 + step * (per + 1), len(rows)


def _stud(pdf: SheetPdf, x: float, base: float, height: float, diameter: float, colour=INK) -> None:
    """A stud standing on `base` (paper y), `height` tall (paper in), head schematic."""
    pdf.set_draw_color(*colour)
    pdf.set_fill_color(*colour)
    pdf.set_line_width(max(0.01, diameter))
    pdf.line(x, base, x, base - height)
    pdf.set_line_width(0.01)
    pdf.rect(x - diameter * 0.8, base - height - diameter * 0.1, diameter * 1.6, diameter * 0.5, style="F")
    pdf.set_draw_color(*INK)


def rib_detail(pdf: SheetPdf, sheet: SheetData, lengths, x: float, y: float) -> None:
    """One rib in section along the beam at 1:4, the stud on each side of the rib the sheet uses,
    each named by the end it is toward, with its length before and after welding."""
    b = sheet.beam
    deck = b.slab.deck
    if deck is None or b.deck_case != DeckCase.PERPENDICULAR:
        pdf.words(x, y + 0.1, "WHERE THE STUDS STAND", 7, grey=True)
        where = "in the deck flute along the beam" if deck is not None else "on the top flange (solid slab)"
        pdf.words(x, y + 0.35, f"studs {where}, in a row", 9, "B")
        return
    pdf.words(x, y + 0.1, "SIDE OF THE RIB - section along the beam, scale 2\" = 1'-0\" (1:6)", 7, grey=True)
    s = DETAIL_SCALE
    hr, wt, wb = deck.rib_height * s, deck.rib_top_width * s, deck.rib_bottom_width * s
    stud_h = (lengths.after if lengths is not None else b.studs.length) * s
    top = y + 0.35 + stud_h - hr + 0.1
    for k, (side, label, note) in enumerate(rib_sides(sheet)):
        cx = x + 0.9 + 1.85 * k
        base = top + hr
        pdf.set_line_width(0.012)
        pdf.set_draw_color(*GREY)
        reach = wt / 2 + 0.35
        pdf.line(cx - reach, base, cx + reach, base)  # the top flange
        pdf.polyline([(cx - reach, top), (cx - wt / 2, top), (cx - wb / 2, base), (cx + wb / 2, base),
                      (cx + wt / 2, top), (cx + reach, top)])
        pdf.set_draw_color(*INK)
        offset = {"reference": -1.0, "far": 1.0}.get(side, 0.0) * deck.stud_offset * s
        _stud(pdf, cx + offset, base, stud_h, b.studs.diameter * s)
        if side != "center":
            arrow = -1.0 if side == "reference" else 1.0
            ax = cx + arrow * 0.5
            pdf.set_line_width(0.015)
            pdf.line(cx - arrow * 0.2, base + 0.16, ax, base + 0.16)
            pdf.line(ax, base + 0.16, ax - arrow * 0.07, base + 0.12)
            pdf.line(ax, base + 0.16, ax - arrow * 0.07, base + 0.20)
        pdf.words(cx - 0.9, base + 0.34, label, 8, "B")
        pdf.words(cx - 0.9, base + 0.46, note, 7)
        if lengths is not None:
            pdf.words(cx - 0.9, base + 0.58, f"{format_inches(lengths.after)} after welding "
                      f"({format_inches(lengths.before)} before)", 7)


def rib_sides(sheet: SheetData) -> list[tuple[str, str, str]]:
    """(side of the rib to draw, label, note) for each side the sheet's studs use. Where the
    design takes the weak position (either side works; engine.studs.sheet_data.side_text) the
    better side is drawn, and the note says either side works."""
    b, lay = sheet.beam, sheet.layout
    out = []
    for side in sorted({str(v) for v in lay.side[lay.count > 0]} or {"center"}):
        if side == "center":
            out.append(("center", "stud at the centre of the rib", ""))
            continue
        weak = b.studs.position == "weak"
        drawn = {"reference": "far", "far": "reference"}[side] if weak else side
        end = b.ribs.reference_end if drawn == "reference" else b.ribs.far_end
        out.append((drawn, f"stud toward {end}", "better side; either side works" if weak else ""))
    return out


def elevation(pdf: SheetPdf, sheet: SheetData, y: float, x0: float = LEFT, x1: float = RIGHT) -> float:
    """The beam along its span to a stated scale (both directions): deck ribs, studs (lost in
    red, added in green), deck-weld squares, the ends named. Returns the y below it."""
    b, lay = sheet.beam, sheet.layout
    scale, name = fit_scale(b.span, x1 - x0 - 0.2)
    pdf.words(x0, y + 0.1, f"ELEVATION - scale {name}; studs drawn at their {slot_word(b)}, {slot_word(b)} numbers every 5th; "
              "squares: deck weld by others", 7, grey=True)
    left = x0 + 0.1
    depth = b.shape.d * scale
    flange = y + 0.6
    deck = b.slab.deck
    slab_top = flange - ((deck.rib_height if deck else 0.0) + b.slab.topping) * scale
    pdf.set_line_width(0.01)
    pdf.set_draw_color(*GREY)
    pdf.rect(left, slab_top, b.span * scale, flange - slab_top)
    pdf.set_draw_color(*INK)
    pdf.set_line_width(0.015)
    pdf.rect(left, flange, b.span * scale, depth)
    if deck is not None and b.deck_case == DeckCase.PERPENDICULAR:
        pdf.set_draw_color(*GREY)
        pdf.set_line_width(0.006)
        rib_top = flange - deck.rib_height * scale
        for k, xi in enumerate(lay.x):
            px = left + float(xi) * scale
            pdf.polyline([(px - deck.rib_top_width * scale / 2, rib_top), (px - deck.rib_bottom_width * scale / 2, flange),
                          (px + deck.rib_bottom_width * scale / 2, flange), (px + deck.rib_top_width * scale / 2, rib_top)])
            if (k + 1) % 5 == 0 or k == 0:
                pdf.words(px - 0.04, slab_top - 0.05, str(k + 1), 5, grey=True)
        pdf.set_draw_color(*INK)
    lost = sheet.lost if sheet.lost is not None else [0] * lay.x.size
    added = sheet.added if sheet.added is not None else [0] * lay.x.size
    for i, xi in enumerate(lay.x):
        px = left + float(xi) * scale
        kinds = [INK] * int(lay.count[i] - lost[i]) + [RED] * int(lost[i]) + [GREEN] * int(added[i])
        for j, colour in enumerate(kinds):
            _stud(pdf, px + 0.035 * (j - (len(kinds) - 1) / 2), flange, b.studs.length * scale,
                  max(0.012, b.studs.diameter * scale), colour)
    for r in anchor_ribs(sheet):
        px = left + float(lay.x[r - 1]) * scale
        pdf.set_line_width(0.01)
        pdf.rect(px - 0.03, flange - 0.07, 0.06, 0.06)
    pdf.words(left, flange + depth + 0.16, f"{b.ribs.reference_end} (station 0)", 7)
    pdf.set_font("Helvetica", "", 7)
    far = latin(f"{b.ribs.far_end} ({format_ft_in(b.span)})")
    pdf.text(left + b.span * scale - pdf.get_string_width(far), flange + depth + 0.16, far)
    return flange + depth + 0.24


def deck_weld_text(sheet: SheetData, ribs) -> str:
    """The deck welds by others, rib and station (AISC 360-22 I3.2c.1(d))."""
    if sheet.beam.deck_case != DeckCase.PERPENDICULAR:
        return "DECK WELDS: as the deck drawings show (deck not across this beam)"
    if not ribs:
        return "DECK WELDS: none needed here - the studs anchor the deck at 18 in or less (AISC 360-22 I3.2c.1(d))"
    where = ", ".join(f"{r} @ {format_ft_in(float(printed_station(sheet.beam, float(sheet.layout.x[r - 1]))))}" for r in ribs)
    return f"DECK WELDS by others (puddle weld or specified fastener, AISC 360-22 I3.2c.1(d)) at ribs without studs: {where}"


def crew_page(pdf: SheetPdf, sheet: SheetData, camber=None, lengths=None, erector: bool = True) -> None:
    """One sheet: the erector sheet, or (`erector` False) the repair sheet (its own instructions,
    lost and added studs, the engineer of record's approval block)."""
    pdf.sheet(f"beam {sheet.beam.mark}")
    y = _header(pdf, sheet, camber)
    pdf.set_line_width(0.015)
    pdf.line(LEFT - 0.12, y, RIGHT + 0.12, y)
    y = _instructions(pdf, sheet, lengths, erector, y + 0.02, RIGHT - LEFT)
    table_w = RIGHT - LEFT - 3.9
    y_el = BOTTOM - elevation_height(sheet)
    notes = [n for n in sheet.notes if n.startswith(("SHORTFALL", "as built", "after adding"))]
    bottom = y_el - (0.5 if erector else 0.1) - (0.58 if sheet.approval else 0.0) - 0.15 * len(notes)
    rows = table_rows(sheet)
    end, shown = _table(pdf, sheet, rows, y, table_w, bottom)
    rib_detail(pdf, sheet, lengths, RIGHT - 3.8, y)
    yy = (max(end, y + 1.6) if erector else end) + 0.04
    if shown < len(rows):
        yy = pdf.paragraph(LEFT, yy - 0.06, RIGHT - LEFT, f"THE TABLE CONTINUES ON THE NEXT SHEET ({slot_word(sheet.beam)}s "
                           f"{rows[shown].slot} to {rows[-1].slot})", 9, "B")
    if erector:
        yy = pdf.paragraph(LEFT, yy, RIGHT - LEFT, deck_weld_text(sheet, anchor_ribs(sheet)), 9, "B")
    for note in notes:
        yy = pdf.paragraph(LEFT, yy, RIGHT - LEFT, note, 8)
    if sheet.approval:
        pdf.set_line_width(0.015)
        pdf.rect(LEFT, yy + 0.04, table_w, 0.5)  # beside the rib detail, under the table
        pdf.words(LEFT + 0.06, yy + 0.16, "ENGINEER OF RECORD APPROVAL (required before any work)", 7, grey=True)
        pdf.words(LEFT + 0.06, yy + 0.32, "name ____________________  date __________  signature ____________________", 8)
        pdf.words(LEFT + 0.06, yy + 0.47, "disposition: accepted / repair ordered / repaired / re-inspected", 8)
        yy += 0.58
    elevation(pdf, sheet, y_el)
    while shown < len(rows):
        pdf.sheet(f"beam {sheet.beam.mark}, continued")
        pdf.words(LEFT, TOP + 0.3, f"{sheet.beam.mark} (continued)", 16, "B")
        _, more = _table(pdf, sheet, rows[shown:], TOP + 0.45, RIGHT - LEFT, BOTTOM - 0.1)
        shown += more


def elevation_height(sheet: SheetData) -> float:
    """Paper height of `elevation` (in)."""
    scale, _ = fit_scale(sheet.beam.span, RIGHT - LEFT - 0.2)
    return 0.6 + sheet.beam.shape.d * scale + 0.24


def erector_pdf(issue, sheets) -> bytes:
    """The erector stud sheets, one page per beam (a booklet for several), from
    engine.pipeline.ErectorSheet items."""
    pdf = SheetPdf(issue, "Erector stud sheet")
    for e in sheets:
        crew_page(pdf, e.sheet, e.camber, e.lengths)
    return pdf.output_bytes()


def repair_pdf(issue, sheet: SheetData, lengths=None) -> bytes:
    """The crew's repair sheet of one beam (engine.pipeline.field_sheet), with the stud lengths
    (engine.studs.stud_lengths) where given."""
    pdf = SheetPdf(issue, "Stud repair sheet")
    crew_page(pdf, sheet, None, lengths, erector=False)
    return pdf.output_bytes()
