"""Floor schedules from the erector sheets of every beam (engine.pipeline.erector_sheet): the
fabricator's camber order list and the stud schedule (quantities by diameter x length before
welding, and deck welds), each as CSV (header on the first row, the caution on the last) and as
PDF sheets."""

from __future__ import annotations

import csv
import io
from collections import Counter

from engine.model.units import format_ft_in, format_inches
from fieldcomp.views.csv_safety import csv_cell
from fieldcomp.views.pdf_page import BOTTOM, LEFT, RIGHT, TOP, SheetPdf

CAMBER_COLUMNS = ("mark", "shape", "length", "length_in", "span", "span_in", "camber", "camber_in", "tolerance",
                  "tolerance_plus_in", "note")
STUD_COLUMNS = ("mark", "studs", "diameter", "diameter_in", "length_before_welding", "length_before_in",
                "length_after_welding", "length_after_in", "deck_welds", "deck_weld_ribs")
TOTAL_COLUMNS = ("diameter", "length_before_welding", "quantity")


def camber_rows(pieces) -> list[list]:
    """One row per (beam, engine.construction.camber.CamberDecision): mark, shape, length of the
    piece, span (work points), camber to order and its tolerance (AISC 303-16 6.4.4: -0 / +tolerance, measured in
    the shop, unstressed), and why none."""
    rows = []
    for b, c in pieces:
        ordered = c.camber > 0.0
        rows.append([b.mark, b.shape.name, format_ft_in(b.steel_length), round(b.steel_length, 4),
                     format_ft_in(b.span), round(b.span, 4),
                     format_inches(c.camber) if ordered else "none", round(c.camber, 4),
                     f"0 to +{format_inches(c.tolerance)}" if ordered else "", round(c.tolerance, 4),
                     "" if ordered else c.reason.removeprefix("not cambered: ")])
    return rows


def stud_rows(sheets) -> list[list]:
    """One row per beam: studs, diameter, length before and after welding, deck welds."""
    rows = []
    for e in sheets:
        b, n = e.sheet.beam, e.sheet.layout.total
        rows.append([b.mark, n, format_inches(b.studs.diameter), b.studs.diameter, format_inches(e.lengths.before),
                     round(e.lengths.before, 4), format_inches(e.lengths.after), round(e.lengths.after, 4),
                     len(e.deck_weld_ribs), " ".join(map(str, e.deck_weld_ribs))])
    return rows


def stud_totals(sheets) -> list[tuple[str, str, int]]:
    """Studs to order by diameter x length before welding, and the deck welds of the floor."""
    count: Counter[tuple[float, float]] = Counter()
    for e in sheets:
        count[(e.sheet.beam.studs.diameter, e.lengths.before)] += e.sheet.layout.total
    return [(format_inches(d), format_inches(length), n) for (d, length), n in sorted(count.items())]


def _csv(header, rows, tail, caution: str) -> str:
    out = io.StringIO()
    w = csv.writer(out, lineterminator="\n")
    w.writerow(header)
    for row in rows:
        w.writerow([csv_cell(v) if isinstance(v, str) else v for v in row])
    for row in tail:
        w.writerow([csv_cell(v) if isinstance(v, str) else v for v in row])
    w.writerow(["caution", csv_cell(caution)])
    return out.getvalue()


def camber_csv(pieces, caution: str) -> str:
    return _csv(CAMBER_COLUMNS, camber_rows(pieces), [], caution)


def stud_csv(sheets, caution: str) -> str:
    """Per-beam rows, then the order totals ('total', diameter, length, quantity) and deck welds."""
    totals = [["total", n, d, "", length, "", "", "", "", ""] for d, length, n in stud_totals(sheets)]
    welds = sum(len(e.deck_weld_ribs) for e in sheets)
    totals.append(["total deck welds", "", "", "", "", "", "", "", welds, ""])
    return _csv(STUD_COLUMNS, stud_rows(sheets), totals, caution)


def _table(pdf: SheetPdf, title: str, heads: list[tuple[str, float]], rows: list[list[str]], notes: list[str]) -> None:
    """Rows on as many sheets as they need, the heads repeated, the notes under the last."""
    per = int((BOTTOM - TOP - 0.9 - 0.16 * len(notes)) / 0.22)
    chunks = [rows[i:i + per] for i in range(0, len(rows), per)] or [[]]
    for k, chunk in enumerate(chunks):
        x0, y0, _, _ = pdf.sheet(f"{len(rows)} lines" + (f", part {k + 1} of {len(chunks)}" if len(chunks) > 1 else ""))
        pdf.words(x0, y0 + 0.3, title.upper(), 16, "B")
        y = y0 + 0.65
        x = x0
        for head, w in heads:
            pdf.words(x, y, head, 7, grey=True)
            x += w
        pdf.set_line_width(0.01)
        pdf.line(x0, y + 0.06, RIGHT, y + 0.06)
        for row in chunk:
            y += 0.22
            x = x0
            for (_, w), cell in zip(heads, row):
                pdf.set_font("Helvetica", "B" if x == x0 else "", 10)
                pdf.text(x, y, pdf.fit(cell, w - 0.08))
                x += w
        y += 0.2
        if k == len(chunks) - 1:
            for note in notes:
                y = pdf.paragraph(LEFT, y, RIGHT - LEFT, note, 8) + 0.02


def camber_pdf(issue, pieces) -> bytes:
    """The fabricator's camber order list of (beam, camber decision) pairs."""
    pdf = SheetPdf(issue, "Camber order list")
    rows = [[r[0], r[1], r[2], r[4], r[6], r[8], r[10]] for r in camber_rows(pieces)]
    heads = [("MARK", 0.95), ("SHAPE", 0.9), ("LENGTH", 0.95), ("SPAN (WORK POINTS)", 1.3), ("CAMBER TO ORDER", 1.2),
             ("TOLERANCE", 0.95), ("NOTE", 3.75)]
    _table(pdf, "Camber order list", heads, rows, [
        "Camber at midspan, crown up, measured in the shop with the member unstressed; tolerance -0 / +1/2 in up to 50 ft "
        "of length, plus 1/8 in per 10 ft or fraction beyond (AISC 303-16 6.4.4).",
        "Camber to order: a share of the predicted pre-composite dead-load deflection, rounded down (common practice; "
        "the job's camber settings). Beams marked none are ordered without camber."])
    return pdf.output_bytes()


def stud_pdf(issue, sheets) -> bytes:
    """The stud schedule: per beam, then the order totals by diameter x length before welding."""
    pdf = SheetPdf(issue, "Stud schedule")
    rows = [[r[0], str(r[1]), r[2], r[4], r[6], str(r[8]), r[9]] for r in stud_rows(sheets)]
    rows += [["TOTAL", str(n), d, length, "", "", "to order"] for d, length, n in stud_totals(sheets)]
    rows.append(["DECK WELDS", "", "", "", "", str(sum(len(e.deck_weld_ribs) for e in sheets)), "by others"])
    heads = [("MARK", 1.2), ("STUDS", 0.7), ("DIAMETER", 0.9), ("LENGTH BEFORE WELDING", 1.7), ("AFTER WELDING", 1.2),
             ("DECK WELDS", 0.95), ("DECK-WELD RIBS", 3.3)]
    _table(pdf, "Stud schedule", heads, rows, [
        "Length before welding = installed length + burn-off: 3/8 in through deck; on bare steel 1/8 in to 1/2 in "
        "diameter, 3/16 in for 5/8 to 7/8 in, 1/4 in for 1 in and over (common practice, a stud supplier's published "
        "allowances; confirm with the stud supplier and the welding set-up).",
        "Deck welds: ribs without studs where the deck must be anchored to the beam at 18 in or less "
        "(AISC 360-22 I3.2c.1(d)); puddle welds or the fastener the project specifies, by others."])
    return pdf.output_bytes()
