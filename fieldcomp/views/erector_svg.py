"""The erector's stud sheet as SVG (engine.pipeline.erector_sheet), for the crew on the deck:
the marks sheet of fieldcomp.views.marks_svg with what the crew does first, in large type (the
studs to load, with their length before and after welding, and the side of the rib rib by rib),
the camber of the piece and the deck welds; the side of the rib drawn to a stated scale beside
the table. No strength plot and no code check: those are in the calculation package."""

from __future__ import annotations

from dataclasses import replace

from engine.model.inputs import DeckCase
from engine.model.units import format_inches
from engine.studs.sheet_data import mark_rows, slot_word
from fieldcomp.views.marks_svg import FAINT, INK, _t, marks_svg
from fieldcomp.views.pdf_erector import camber_text, deck_weld_text, rib_sides, side_runs, stud_order_text

DETAIL = 12.5  # drawing units (0.01 in of paper) per inch: 1 1/2" = 1'-0" (1:8)


def _rib(cx: float, base: float, side: str, label: str, note: str, e) -> list[str]:
    """One rib in section along the beam with its stud on `side`, the end it is toward named."""
    b = e.sheet.beam
    deck = b.slab.deck
    s = DETAIL
    hr, wt, wb = deck.rib_height * s, deck.rib_top_width * s / 2, deck.rib_bottom_width * s / 2
    top, reach = base - hr, wt + 22
    pts = [(cx - reach, top), (cx - wt, top), (cx - wb, base), (cx + wb, base), (cx + wt, top), (cx + reach, top)]
    out = [f'<line x1="{cx - reach:.1f}" y1="{base:.1f}" x2="{cx + reach:.1f}" y2="{base:.1f}" stroke="{INK}" '
           'stroke-width="1.4"/>',
           '<polyline points="' + " ".join(f"{x:.1f},{y:.1f}" for x, y in pts)
           + f'" fill="none" stroke="{FAINT}" stroke-width="1"/>']
    dx = cx + {"reference": -1.0, "far": 1.0}.get(side, 0.0) * deck.stud_offset * s
    d, h = b.studs.diameter * s, e.lengths.after * s
    out += [f'<rect x="{dx - d / 2:.1f}" y="{base - h:.1f}" width="{d:.1f}" height="{h:.1f}" fill="{INK}"/>',
            f'<rect x="{dx - 0.8 * d:.1f}" y="{base - h - 0.1 * d:.1f}" width="{1.6 * d:.1f}" height="{0.5 * d:.1f}" '
            f'fill="{INK}"/>']
    if side != "center":
        sign = -1.0 if side == "reference" else 1.0
        a0, a1, y = cx - sign * 15, cx + sign * 45, base + 10
        out += [f'<line x1="{a0:.1f}" y1="{y:.1f}" x2="{a1:.1f}" y2="{y:.1f}" stroke="{INK}" stroke-width="1.2"/>',
                f'<polyline points="{a1 - sign * 6:.1f},{y - 4:.1f} {a1:.1f},{y:.1f} {a1 - sign * 6:.1f},{y + 4:.1f}" '
                f'fill="none" stroke="{INK}" stroke-width="1.2"/>']
    out.append(_t(cx, base + 26, label, "t", "middle", ' style="font-weight:bold"'))
    out.append(_t(cx, base + 38, note, "s", "middle"))
    out.append(_t(cx, base + 50, f"{format_inches(e.lengths.after)} after welding ({format_inches(e.lengths.before)} before)",
                  "s", "middle"))
    return out


def side_of_rib(e, x: float = 650.0, y: float = 520.0) -> tuple[str, ...]:
    """The side-of-the-rib detail for the right-hand column of the sheet."""
    b = e.sheet.beam
    out = [_t(x, y, "SIDE OF THE RIB - section along the beam, scale 1 1/2\" = 1'-0\" (1:8)", "k")]
    if b.slab.deck is None or b.deck_case != DeckCase.PERPENDICULAR:
        where = "studs in the deck flute along the beam" if b.slab.deck is not None else "studs on the flange (solid slab)"
        return (*out, _t(x, y + 20, where, "t", extra=' style="font-weight:bold"'))
    base = y + 30 + e.lengths.after * DETAIL
    for k, (side, label, note) in enumerate(rib_sides(e.sheet)):
        out += _rib(x + 80 + 165 * k, base, side, label, note, e)
    return tuple(out)


def erector_svg(e) -> str:
    """The crew's sheet of one beam (engine.pipeline.ErectorSheet) as SVG text."""
    sheet = e.sheet
    runs = (r.upper() for r in side_runs(mark_rows(sheet), slot_word(sheet.beam)))
    steps = (f"BEAM {sheet.beam.mark}: " + stud_order_text(sheet, e.lengths), *runs, camber_text(e.camber),
             deck_weld_text(sheet, e.deck_weld_ribs))
    shown = replace(sheet, title="Erector stud sheet", instructions=steps, envelope=None, checks=(),
                    notes=tuple(n for n in sheet.notes if n.startswith("SHORTFALL")))
    return marks_svg(shown, side_of_rib(e))
