"""The marks sheet drawn as SVG: title block, beam elevation to scale along the span with ribs and
studs, running dimensions from the reference end, optional strength envelope, marks table,
totals and checks, caution. 1 drawing unit = 0.01 in; the sheet is 10 x 7.5 in, landscape.
"""

from __future__ import annotations

import math
import textwrap
from dataclasses import replace
from xml.sax.saxutils import escape

import numpy as np

from engine.model.inputs import DeckCase
from engine.model.text import printable as clean
from engine.model.units import format_ft_in
from engine.studs.sheet_data import SheetData, anchor_ribs, mark_rows, origin_text, slot_word, station_origin_text
from fieldcomp.views.marks_sheet import heading_lines, studs_text, summary_lines

W, H = 1000, 750
X0, X1 = 60.0, 940.0  # the beam's ends on the sheet
INK, STEEL, CONCRETE, LOST, ADDED, FAINT = "#1d2a38", "#c9d3de", "#eceae4", "#c0392b", "#1e8449", "#7b8794"
STYLE = """<style>
text { font-family: 'DejaVu Sans', Verdana, Arial, sans-serif; fill: #1d2a38; }
.k { font-size: 7.5px; fill: #7b8794; letter-spacing: 0.6px; }
.v { font-size: 11px; }
.t { font-size: 9.5px; }
.s { font-size: 8.5px; }
@page { size: landscape; margin: 0.4in; }
</style>"""


def _t(x: float, y: float, text: str, cls: str = "t", anchor: str = "start", extra: str = "") -> str:
    return (f'<text x="{x:.2f}" y="{y:.2f}" class="{cls}" text-anchor="{anchor}"{extra}>'
            f"{escape(clean(text))}</text>")


def _px(x: float, span: float) -> float:
    return X0 + (X1 - X0) * x / span


LOST_SYMBOLS = {  # finding kind -> (legend text, extra marks drawn over the slashed ring)
    "missing": ("missing (dashed ring)", "dash"),
    "failed-test": ("failed test (ring crossed)", "cross"),
    "awaiting-test": ("awaiting bend test (ring, ?)", "query"),
    "short": ("short (short stem)", "short"),
    "off-rib": ("off the rib (head set aside)", "aside"),
    "weak-side": ("weak side (half ring)", "half"),
}


def _lost_kind_mark(mark: str, dx: float, top: float) -> str:
    """The extra mark of one lost-stud kind (our own symbols; see LOST_SYMBOLS)."""
    if mark == "dash":
        return (f'<circle cx="{dx:.2f}" cy="{top:.2f}" r="5.2" fill="none" stroke="{LOST}" stroke-width="0.8" '
                'stroke-dasharray="2 1.5"/>')
    if mark == "cross":
        return (f'<line x1="{dx - 3.6:.2f}" y1="{top - 3.6:.2f}" x2="{dx + 3.6:.2f}" y2="{top + 3.6:.2f}" '
                f'stroke="{LOST}" stroke-width="1.2"/>')
    if mark == "query":
        return _t(dx, top - 6, "?", "s", "middle", f' style="fill:{LOST};font-weight:bold"')
    if mark == "short":
        return f'<rect x="{dx - 1.5:.2f}" y="{top + 4:.2f}" width="3" height="10" fill="white"/>'
    if mark == "aside":
        return f'<circle cx="{dx + 6:.2f}" cy="{top + 8:.2f}" r="2" fill="{LOST}"/>'
    if mark == "half":
        return f'<path d="M {dx - 3.4:.2f} {top:.2f} A 3.4 3.4 0 0 0 {dx + 3.4:.2f} {top:.2f} Z" fill="{LOST}"/>'
    return ""


def _stud(kind: str, dx: float, top: float, lost_kind: str = "") -> str:
    """One stud symbol at local x `dx`: stem from the flange up to a head (our own marks: a round
    head in place, a slashed ring when lost, with a mark for the finding kind where known, a
    diamond when added)."""
    colour = {"lost": LOST, "added": ADDED}.get(kind, INK)
    stem = f'<line x1="{dx:.2f}" y1="190" x2="{dx:.2f}" y2="{top + 3:.2f}" stroke="{colour}" stroke-width="1.1"/>'
    if kind == "lost":
        head = (f'<circle cx="{dx:.2f}" cy="{top:.2f}" r="3.4" fill="white" stroke="{LOST}" stroke-width="1.2"/>'
                f'<line x1="{dx - 3.6:.2f}" y1="{top + 3.6:.2f}" x2="{dx + 3.6:.2f}" y2="{top - 3.6:.2f}" '
                f'stroke="{LOST}" stroke-width="1.2"/>')
        head += _lost_kind_mark(LOST_SYMBOLS.get(lost_kind, ("", ""))[1], dx, top)
    elif kind == "added":
        pts = f"{dx:.2f},{top - 4.2:.2f} {dx + 4.2:.2f},{top:.2f} {dx:.2f},{top + 4.2:.2f} {dx - 4.2:.2f},{top:.2f}"
        head = f'<polygon points="{pts}" fill="{ADDED}"/>'
    elif lost_kind == "weak-side":  # a working stud found on the weak side: half ring
        head = (f'<circle cx="{dx:.2f}" cy="{top:.2f}" r="3.4" fill="white" stroke="{INK}" stroke-width="1"/>'
                + _lost_kind_mark("half", dx, top).replace(LOST, INK))
    else:
        head = f'<circle cx="{dx:.2f}" cy="{top:.2f}" r="3.4" fill="{INK}"/>'
    return f'<g class="stud-{kind}">{stem}{head}</g>'


def _legend(x: float, y: float, overlays: bool, perpendicular: bool) -> list[str]:
    """Our own symbols, one per line (two columns when the sheet shows lost and added studs)."""
    items: list[tuple[str, str]] = [("placed", "stud in place" if overlays else "stud to place (one mark per stud)")]
    if overlays:
        items += [("lost", "stud lost"), ("added", "stud to add")]
    items.append(("keep", "keep-out zone"))
    if perpendicular:
        items.append(("anchor", "deck weld by others" if overlays else "deck weld/fastener by others"))
    items.append(("max", "maximum moment"))
    out = [_t(x, y, "LEGEND", "k")]
    rows = math.ceil(len(items) / 2) if overlays else len(items)
    for i, (kind, label) in enumerate(items):
        lx, yy = x + 112 * (i // rows), y + 16 + 15 * (i % rows)
        if kind in ("placed", "lost", "added"):
            out.append(f'<g transform="translate({lx + 6:.2f},{yy - 185:.2f})">{_stud(kind, 0.0, 182.0)}</g>')
        elif kind == "keep":
            out.append(f'<rect x="{lx + 2:.2f}" y="{yy - 4:.2f}" width="8" height="7" fill="url(#keep)" stroke="{FAINT}"/>')
        elif kind == "anchor":
            out.append(f'<rect x="{lx + 3.5:.2f}" y="{yy - 3:.2f}" width="5" height="5" fill="none" stroke="{INK}"/>')
        else:
            out.append(f'<line x1="{lx:.2f}" y1="{yy:.2f}" x2="{lx + 13:.2f}" y2="{yy:.2f}" stroke="{INK}" '
                       'stroke-dasharray="5 2 1 2"/>')
        out.append(_t(lx + 18, yy + 3, label, "s"))
    return out


def _title(sheet: SheetData, overlays: bool) -> list[str]:
    b = sheet.beam
    out = [f'<line x1="8" y1="104" x2="992" y2="104" stroke="{INK}" stroke-width="1.2"/>',
           f'<line x1="250" y1="8" x2="250" y2="104" stroke="{INK}"/>',
           f'<line x1="735" y1="8" x2="735" y2="104" stroke="{INK}"/>',
           _t(20, 30, clean(sheet.title).upper(), "k", extra=' style="font-size:10px"'),
           _t(20, 70, clean(b.mark), "v", extra=' style="font-size:30px;font-weight:bold"'),
           _t(20, 92, f"{b.shape.name}   span {format_ft_in(b.span)}", "v")]
    fields = [("JOB", sheet.job, 0, 0), ("DATE", sheet.date, 1, 0), ("REFERENCE END", b.ribs.reference_end, 0, 1),
              ("FAR END", b.ribs.far_end, 1, 1), ("STATIONS MEASURED FROM", origin_text(b), 0, 2),
              ("STUDS", studs_text(sheet), 0, 3)]
    for key, value, col, row in fields:
        x, y = 262 + 250 * col, 24 + 21 * row
        width = 44 if col or key in ("JOB", "REFERENCE END") else 88
        out += [_t(x, y, key, "k"), _t(x, y + 10, textwrap.shorten(clean(value), width, placeholder="..."), "s")]
    return out + _legend(745, 24, overlays, b.deck_case == DeckCase.PERPENDICULAR)


def _deck(sheet: SheetData, span: float) -> list[str]:
    b, lay = sheet.beam, sheet.layout
    deck = b.slab.deck
    out = [f'<rect x="{X0:.2f}" y="150" width="{X1 - X0:.2f}" height="{22 if deck else 40}" fill="{CONCRETE}" '
           f'stroke="{FAINT}" stroke-width="0.6"/>']
    if deck is not None and b.deck_case == DeckCase.PERPENDICULAR:
        for xi in lay.x:
            c, top, bot = _px(xi, span), deck.rib_top_width * (X1 - X0) / span / 2, deck.rib_bottom_width * (X1 - X0) / span / 2
            out.append(f'<polygon points="{c - top:.2f},172 {c + top:.2f},172 {c + bot:.2f},190 {c - bot:.2f},190" '
                       f'fill="{CONCRETE}" stroke="{FAINT}" stroke-width="0.6"/>')
    elif deck is not None:
        out.append(f'<rect x="{X0:.2f}" y="172" width="{X1 - X0:.2f}" height="18" fill="{CONCRETE}" stroke="{FAINT}" '
                   'stroke-width="0.6" stroke-dasharray="3 2"/>')
    for lo, hi in ((0.0, b.ribs.keep_out_start), (span - b.ribs.keep_out_end, span)):
        if hi - lo > 1e-9:
            out.append(f'<rect x="{_px(lo, span):.2f}" y="150" width="{_px(hi, span) - _px(lo, span):.2f}" height="40" '
                       f'fill="url(#keep)" stroke="{FAINT}" stroke-width="0.6"/>')
    return out


def _strip(sheet: SheetData, top_y: float) -> list[str]:
    b, lay, span = sheet.beam, sheet.layout, sheet.beam.span
    n = lay.x.size
    lost = np.zeros(n, dtype=int) if sheet.lost is None else np.asarray(sheet.lost, dtype=int)
    added = np.zeros(n, dtype=int) if sheet.added is None else np.asarray(sheet.added, dtype=int)
    deck = {"perpendicular": "deck ribs across the beam", "parallel": "deck flute along the beam (dashed)",
            "none": "solid slab"}[b.deck_case]
    ratio = span / ((X1 - X0) / 100.0)  # 100 drawing units to the inch of paper
    out = [_t(20, top_y + 14, f"ELEVATION - along the beam 1 in = {ratio / 12:.2f} ft (1:{ratio:.0f}), depth not to "
              f"scale; {deck}; several studs in one {slot_word(b)} are drawn side by side", "k")]
    out += _deck(sheet, span)
    out += [f'<rect x="{X0:.2f}" y="190" width="{X1 - X0:.2f}" height="24" fill="{STEEL}" stroke="{INK}" stroke-width="1"/>',
            f'<line x1="{X0:.2f}" y1="195" x2="{X1:.2f}" y2="195" stroke="{INK}" stroke-width="0.5"/>',
            f'<line x1="{X0:.2f}" y1="209" x2="{X1:.2f}" y2="209" stroke="{INK}" stroke-width="0.5"/>']
    for px in (X0, X1):
        out.append(f'<polygon points="{px:.2f},214 {px + 7:.2f},226 {px - 7:.2f},226" fill="none" stroke="{INK}"/>')
    out.append(_t(X0 - 8, 240, f"{clean(b.ribs.reference_end)} (reference end, station 0)", "s"))
    out.append(_t(X1 + 8, 240, f"{clean(b.ribs.far_end)} ({format_ft_in(span)})", "s", anchor="end"))
    if math.isfinite(lay.x_flip):
        fx = _px(lay.x_flip, span)
        out.append(f'<line x1="{fx:.2f}" y1="{top_y + 24:.2f}" x2="{fx:.2f}" y2="232" stroke="{INK}" '
                   'stroke-width="0.7" stroke-dasharray="5 2 1 2"/>')
    used = np.flatnonzero((lay.count > 0) | (added > 0))
    gap = float(np.diff(_px(lay.x[used], span)).min()) if used.size > 1 else 20.0
    font = max(6.0, min(9.0, 0.75 * gap))
    last_label = -math.inf
    sign = {"reference": -1.0, "far": 1.0}
    offset = (b.slab.deck.stud_offset if b.slab.deck is not None else 0.0) * (X1 - X0) / span
    for i in used:
        c = _px(lay.x[i], span)
        kinds = ["placed"] * int(lay.count[i] - lost[i]) + ["lost"] * int(lost[i]) + ["added"] * int(added[i])
        shift = sign.get(str(lay.side[i]), 0.0) * offset if b.deck_case == DeckCase.PERPENDICULAR else 0.0
        why = sheet.lost_kinds[i] if sheet.lost_kinds else ""
        marks = "".join(_stud(k, shift + 5.0 * (j - (len(kinds) - 1) / 2), 165.0, why) for j, k in enumerate(kinds))
        out.append(f'<g class="stud-mark" data-slot="{lay.number[i]}" data-station-in="{lay.x[i]:.4f}" '
                   f'data-studs="{int(lay.count[i])}" transform="translate({c:.3f},0)">{marks}</g>')
        label = str(lay.number[i])
        if c - 0.31 * font * len(label) >= last_label + 2.0:  # numbers that would touch are left to the table
            out.append(_t(c, 146, label, "s", "middle", f' style="font-size:{font:.1f}px"'))
            last_label = c + 0.31 * font * len(label)
    for r in anchor_ribs(sheet):
        c = _px(lay.x[r - 1], span)
        out.append(f'<rect x="{c - 2.5:.2f}" y="181" width="5" height="5" fill="white" stroke="{INK}" stroke-width="0.8"/>')
    out.append(_t(X0 - 8, 146, f"{slot_word(b)}:", "s", "end"))
    return out


def _dimensions(sheet: SheetData, y: float) -> list[str]:
    span = sheet.beam.span
    rows = mark_rows(sheet)
    out = [_t(20, y, f"RUNNING DIMENSIONS - {station_origin_text(sheet.beam)}", "k"),
           f'<line x1="{X0:.2f}" y1="{y + 10:.2f}" x2="{X1:.2f}" y2="{y + 10:.2f}" stroke="{INK}" stroke-width="0.8"/>']
    pxs = [_px(r.x, span) for r in rows]
    gap = float(np.diff(pxs).min()) if len(pxs) > 1 else 20.0
    longest = max((len(r.station) for r in rows), default=1)
    font = max(4.5, min(9.0, 0.9 * gap, 58.0 / (0.62 * longest)))
    for px in [X0, X1]:
        out.append(f'<line x1="{px:.2f}" y1="{y + 4:.2f}" x2="{px:.2f}" y2="{y + 16:.2f}" stroke="{INK}" stroke-width="1"/>')
    for r, px in zip(rows, pxs):
        out.append(f'<line x1="{px - 3:.2f}" y1="{y + 13:.2f}" x2="{px + 3:.2f}" y2="{y + 7:.2f}" stroke="{INK}" '
                   'stroke-width="0.9"/>')
        out.append(f'<text class="dim" transform="translate({px + font * 0.35:.2f},{y + 78:.2f}) rotate(-90)" '
                   f'style="font-size:{font:.1f}px">{escape(r.station)}</text>')
    return out


def _envelope(sheet: SheetData, y: float, h: float) -> list[str]:
    env, span = sheet.envelope, sheet.beam.span
    assert env is not None
    curves = [("demand", env.demand, LOST, ""), ("capacity", env.capacity, INK, "")]
    if env.capacity_after is not None:
        curves.append(("capacity after", env.capacity_after, ADDED, ' stroke-dasharray="5 3"'))
    top = max(float(np.max(c)) for _, c, _, _ in curves) or 1.0
    out = [_t(20, y, "STRENGTH ALONG THE SPAN (kip-ft)", "k"),
           f'<rect x="{X0:.2f}" y="{y + 6:.2f}" width="{X1 - X0:.2f}" height="{h:.2f}" fill="none" stroke="{FAINT}" '
           'stroke-width="0.5"/>']
    for k, (name, values, colour, dash) in enumerate(curves):
        pts = " ".join(f"{_px(float(xi), span):.2f},{y + 6 + h * (1 - float(v) / top):.2f}" for xi, v in zip(env.x, values))
        out.append(f'<polyline points="{pts}" fill="none" stroke="{colour}" stroke-width="1.2"{dash}/>')
        lx = X1 - 330 + 115 * k
        out.append(f'<line x1="{lx:.2f}" y1="{y - 3:.2f}" x2="{lx + 14:.2f}" y2="{y - 3:.2f}" stroke="{colour}" '
                   f'stroke-width="1.5"{dash}/>')
        out.append(_t(lx + 18, y, f"{name}, max {float(np.max(values)) / 12:,.0f}", "s"))
    return out


def _table(sheet: SheetData, y: float, bottom: float) -> list[str]:
    rows = mark_rows(sheet)
    extra = sheet.lost is not None or sheet.added is not None
    perpendicular = sheet.beam.deck_case == DeckCase.PERPENDICULAR
    blocks = 2 if len(rows) <= 2 * 24 else 3 if extra or len(rows) <= 3 * 26 else 4
    width = 620.0 / blocks
    if blocks == 4:  # compact columns for long beams
        cols = [(0, slot_word(sheet.beam).upper(), "start"), (62, "STATION", "end"), (80, "QTY", "end")]
    else:
        cols = [(0, slot_word(sheet.beam).upper(), "start"), (86, "STATION", "end"), (118, "STUDS", "end")]
    cols += [(146, "LOST", "end"), (170, "ADD", "end")] if extra else []
    cols.append((182 if extra else cols[-1][0] + 12, "SIDE OF RIB" if perpendicular else "WHERE", "start"))
    side_chars = int((width - cols[-1][0] - 8) / 5.2)
    per = max(1, math.ceil(len(rows) / blocks))
    step = min(12.0, (bottom - y - 14) / per)
    font = max(4.0, 0.8 * step)
    out = []
    for blk in range(blocks):
        bx = 20 + width * blk
        out += [_t(bx + dx, y, name, "k", anchor) for dx, name, anchor in cols]
        for j, r in enumerate(rows[blk * per:(blk + 1) * per]):
            ry = y + 13 + step * j
            cells = [str(r.slot), r.station, str(r.studs)] + ([str(r.lost), str(r.added)] if extra else [])
            cells.append(textwrap.shorten(r.side, max(side_chars, 8), placeholder="."))
            texts = "".join(f'<text x="{bx + dx:.2f}" y="{ry:.2f}" text-anchor="{anchor}" style="font-size:{font:.1f}px">'
                            f"{escape(cell)}</text>" for (dx, _, anchor), cell in zip(cols, cells))
            out.append(f'<g class="mark-row" data-slot="{r.slot}" data-station-in="{r.x:.4f}" data-studs="{r.studs}">'
                       f"{texts}</g>")
    return out


def _summary(sheet: SheetData, x: float, y: float, bottom: float) -> list[str]:
    out = [_t(x, y, "TOTALS AND CHECKS" if sheet.checks else "TOTALS", "k")]
    yy = y + 14
    for line in summary_lines(sheet):
        colour = f' style="fill:{LOST}"' if line.startswith(("FAIL", "REVIEW", "SHORTFALL")) else ""
        for part in textwrap.wrap(line, 62) or [""]:
            if yy > bottom:
                return out + [_t(x, bottom + 10, "(more in the text output)", "s")]
            out.append(_t(x, yy, part, "s", extra=colour))
            yy += 11
    return out


def _instructions(sheet: SheetData) -> tuple[list[str], float]:
    """The crew's instructions first, in large type, the lost-stud kinds and the engineer of
    record's approval block: (elements, height of the band)."""
    if not sheet.instructions and not sheet.approval:
        return [], 0.0
    out = [_t(20, 30, "DO THIS", "k", extra=' style="font-size:10px"')]
    y = 52.0
    for line in sheet.instructions:
        big = not line.startswith(("METHOD:", "RE-TEST:"))
        for part in textwrap.wrap(line, 70 if big else 150):
            out.append(_t(20, y, part, "v", extra=' style="font-size:17px;font-weight:bold"' if big else ""))
            y += 22 if big else 13
    kinds = sorted({k for k in sheet.lost_kinds if k in LOST_SYMBOLS})
    if kinds:
        out.append(_t(20, y + 4, "LOST STUDS AS FOUND: " + "; ".join(LOST_SYMBOLS[k][0] for k in kinds), "s"))
        y += 16
    if sheet.approval:
        out += [f'<rect x="20" y="{y:.2f}" width="960" height="38" fill="none" stroke="{INK}"/>',
                _t(28, y + 13, "ENGINEER OF RECORD APPROVAL (required before any work)", "k"),
                _t(28, y + 30, "name ______________________   date ____________   disposition: accepted / repair "
                   "ordered / repaired / re-inspected   signature ______________", "s")]
        y += 46
    return out, y + 6


def marks_svg(sheet: SheetData, extra: tuple[str, ...] = ()) -> str:
    """The printable sheet as SVG text (landscape, 10 x 7.5 in: fits letter and tabloid); a field
    sheet puts the crew's instructions and the approval block above it (a taller sheet). `extra`:
    SVG elements drawn on the sheet (fieldcomp.views.erector_svg adds the side of the rib)."""
    band, band_h = _instructions(sheet)
    if band:
        plain = marks_svg(replace(sheet, instructions=(), approval=False), extra)
        head, rest = plain.split(f'viewBox="0 0 {W} {H}">', 1)
        pre, body = rest.split(f'<rect x="8" y="8" width="984" height="734" fill="none" stroke="{INK}" stroke-width="1.6"/>', 1)
        total = H + band_h
        return (head.replace('height="7.5in"', f'height="{7.5 * total / H:.2f}in"') + f'viewBox="0 0 {W} {total:.0f}">'
                + pre.replace(f'height="{H}" fill="white"', f'height="{total:.0f}" fill="white"')
                + f'<rect x="8" y="8" width="984" height="{band_h - 8:.0f}" fill="none" stroke="{INK}" stroke-width="1.6"/>'
                + "\n".join(band) + f'\n<g transform="translate(0,{band_h:.0f})">'
                + f'<rect x="8" y="8" width="984" height="734" fill="none" stroke="{INK}" stroke-width="1.6"/>'
                + body.replace("</svg>", "</g></svg>"))
    overlays = sheet.lost is not None or sheet.added is not None
    body = _title(sheet, overlays) + _strip(sheet, 104) + _dimensions(sheet, 262)
    table_y = 350.0
    if sheet.envelope is not None:
        body += _envelope(sheet, 350, 58)
        table_y = 432.0
    split = 640.0
    body += [f'<line x1="8" y1="{table_y - 14:.2f}" x2="992" y2="{table_y - 14:.2f}" stroke="{INK}"/>',
             f'<line x1="{split:.2f}" y1="{table_y - 14:.2f}" x2="{split:.2f}" y2="700" stroke="{INK}"/>']
    body += _table(sheet, table_y, 696) + _summary(sheet, split + 10, table_y, 690) + list(extra)
    caution = textwrap.wrap("CAUTION: " + clean(sheet.caution), 150)
    body += [f'<line x1="8" y1="700" x2="992" y2="700" stroke="{INK}" stroke-width="1.2"/>']
    body += [_t(20, 716 + 11 * i, part, "s") for i, part in enumerate(caution)]
    head = heading_lines(sheet)[0]
    return "\n".join([
        '<?xml version="1.0" encoding="UTF-8"?>',
        f'<svg xmlns="http://www.w3.org/2000/svg" width="10in" height="7.5in" viewBox="0 0 {W} {H}">',
        f"<title>{escape(head)}</title>", STYLE,
        '<defs><pattern id="keep" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">'
        f'<line x1="0" y1="0" x2="0" y2="6" stroke="{FAINT}" stroke-width="1.5"/></pattern></defs>',
        f'<rect x="0" y="0" width="{W}" height="{H}" fill="white"/>',
        f'<rect x="8" y="8" width="984" height="734" fill="none" stroke="{INK}" stroke-width="1.6"/>',
        *body, "</svg>", ""])

