"""The beam elevation as DXF for detailers (ezdxf): drawn full size in inches, x along the beam
from the reference end (station 0 as the erector measures it), y up from the top of the steel.
Named layers: STEEL (beam outline and flanges), DECK (the deck profile and slab outline), RIBS
(rib centrelines), STUDS (one stem and head per stud), DECK-WELDS (ribs needing a weld by
others), DIMENSIONS (running dimensions from the reference end to every stud rib), TEXT (mark,
ends, notes and the caution)."""

from __future__ import annotations

import io

import ezdxf
from ezdxf import units

from engine.model.inputs import DeckCase
from engine.model.units import format_ft_in, format_inches
from engine.studs.ribs import printed_station
from engine.studs.sheet_data import SheetData, anchor_ribs, mark_rows, station_origin_text

LAYERS = {"STEEL": 7, "DECK": 8, "RIBS": 9, "STUDS": 1, "DECK-WELDS": 3, "DIMENSIONS": 5, "TEXT": 7}


def elevation_dxf(sheet: SheetData, lengths=None) -> str:
    """The DXF text (R2010) of one beam's elevation."""
    b, lay = sheet.beam, sheet.layout
    doc = ezdxf.new("R2010", setup=True)
    doc.units = units.IN
    doc.header["$MEASUREMENT"] = 0  # imperial
    for name, colour in LAYERS.items():
        doc.layers.add(name, color=colour)
    msp = doc.modelspace()
    shift = float(printed_station(b, 0.0))  # engine x 0 as printed: the drawing's x origin is station 0
    x0, x1 = shift, shift + b.span
    d, tf = b.shape.d, b.shape.tf
    msp.add_lwpolyline([(x0, 0), (x1, 0), (x1, -d), (x0, -d)], close=True, dxfattribs={"layer": "STEEL"})
    for y in (-tf, -d + tf):
        msp.add_line((x0, y), (x1, y), dxfattribs={"layer": "STEEL"})
    deck = b.slab.deck
    hr = deck.rib_height if deck is not None else 0.0
    slab_top = hr + b.slab.topping
    msp.add_lwpolyline([(x0, 0), (x1, 0), (x1, slab_top), (x0, slab_top)], close=True, dxfattribs={"layer": "DECK"})
    if deck is not None and b.deck_case == DeckCase.PERPENDICULAR:
        points = [(x0, hr)]
        for xi in lay.x:
            c = shift + float(xi)
            points += [(c - deck.rib_top_width / 2, hr), (c - deck.rib_bottom_width / 2, 0.0),
                       (c + deck.rib_bottom_width / 2, 0.0), (c + deck.rib_top_width / 2, hr)]
            msp.add_line((c, -0.5), (c, slab_top + 0.5), dxfattribs={"layer": "RIBS", "linetype": "CENTER"})
        points.append((x1, hr))
        msp.add_lwpolyline(points, dxfattribs={"layer": "DECK"})
    length = lengths.after if lengths is not None else b.studs.length
    dia = b.studs.diameter
    lost = sheet.lost if sheet.lost is not None else [0] * lay.x.size
    offset = deck.stud_offset if deck is not None and b.deck_case == DeckCase.PERPENDICULAR else 0.0
    weak = b.studs.position == "weak"  # either side works: the better side is drawn (as the erector sheet)
    for i, xi in enumerate(lay.x):
        n = int(lay.count[i] - lost[i])
        side = {"reference": -1.0, "far": 1.0}.get(str(lay.side[i]), 0.0) * (-1.0 if weak else 1.0)
        for j in range(n):
            c = shift + float(xi) + side * offset + 1.5 * dia * (j - (n - 1) / 2)
            msp.add_lwpolyline([(c - dia / 2, 0), (c - dia / 2, length - 0.375), (c + dia / 2, length - 0.375),
                                (c + dia / 2, 0)], dxfattribs={"layer": "STUDS"})
            msp.add_lwpolyline([(c - 0.8 * dia, length - 0.375), (c - 0.8 * dia, length), (c + 0.8 * dia, length),
                                (c + 0.8 * dia, length - 0.375)], close=True, dxfattribs={"layer": "STUDS"})
    for r in anchor_ribs(sheet):
        c = shift + float(lay.x[r - 1])
        msp.add_lwpolyline([(c - 1, -0.25), (c + 1, -0.25), (c + 1, 0.25), (c - 1, 0.25)], close=True,
                           dxfattribs={"layer": "DECK-WELDS"})
        msp.add_text(f"DW {r}", height=1.0, dxfattribs={"layer": "DECK-WELDS"}).set_placement((c - 1.5, -2.0))
    base = slab_top + 6.0
    style = {"dimtxt": 1.5, "dimasz": 0.75, "dimexe": 0.5, "dimexo": 0.5, "dimdec": 2, "dimlunit": 4, "dimtad": 1}
    for k, r in enumerate(mark_rows(sheet)):
        c = float(printed_station(b, r.x))
        dim = msp.add_linear_dim(base=(x0, base + 4.0 * (k % 3)), p1=(x0, slab_top), p2=(c, length), angle=0,
                                 dxfattribs={"layer": "DIMENSIONS"}, override=style)
        dim.render()
    text = [(f"BEAM {b.mark}  {b.shape.name}  span {format_ft_in(b.span)}", 4.0),
            (f"{station_origin_text(b)}; x = station (in), y up from the top of the steel", 2.0),
            (f"{lay.total} studs {format_inches(dia)} dia x {format_inches(length)} after welding", 2.0),
            (f"left: {b.ribs.reference_end} (reference end)   right: {b.ribs.far_end}", 2.0),
            *([("weak-position design: either side of the rib works; the better side is drawn", 2.0)] if weak else []),
            (f"job: {sheet.job}   date: {sheet.date}", 2.0), (f"CAUTION: {sheet.caution}", 1.5)]
    y = base + 20.0
    for line, h in reversed(text):
        msp.add_text(line, height=h, dxfattribs={"layer": "TEXT"}).set_placement((x0, y))
        y += 2.0 * h
    out = io.StringIO()
    doc.write(out)
    return out.getvalue()
