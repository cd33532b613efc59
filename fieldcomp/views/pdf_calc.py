"""The calculation package for the engineer of record, per beam: the inputs, the section and slab
results, every check of the finished beam and of the construction stage with its clause and its
authority, the strength envelope along the span and the construction-stage deflection profiles
(engine.pipeline.evaluate_beam and engine.construction.evaluate results, formatted only)."""

from __future__ import annotations

import numpy as np

from engine.codes.aisc360_22.f_flexure import OMEGA_B, PHI_B
from engine.model.results import verdict_of, worst
from engine.model.units import format_ft_in, format_inches
from engine.studs.ribs import printed_station
from fieldcomp.views.numbers import ratio_text
from fieldcomp.views.pdf_page import BOTTOM, GREY, INK, SheetPdf

RED, BLUE = (170, 40, 30), (30, 70, 150)


def input_lines(r, c) -> list[tuple[str, str]]:
    """(key, value) rows of what the beam was evaluated with."""
    b = r.beam
    s, slab, deck = b.shape, b.slab, b.slab.deck
    deck_text = "none (solid slab)" if deck is None else (
        f"{deck.name}: hr {format_inches(deck.rib_height)}, ribs {format_inches(deck.rib_top_width)} top / "
        f"{format_inches(deck.rib_bottom_width)} bottom at {format_inches(deck.pitch)}, {b.orientation} to the beam")
    points = "; ".join(f"{format_ft_in(p.x)}: D {p.dead:g}, L {p.live:g} kip" for p in b.point_loads) or "none"
    return [("beam", f"{b.mark}, {s.name}, span {format_ft_in(b.span)}, simply supported, unshored, {b.method}"),
            ("steel", f"Fy {b.fy:g} ksi; d {s.d:.2f} in, bf {s.bf:.2f} in, tf {s.tf:.3f} in, tw {s.tw:.3f} in, "
                      f"A {s.area:.1f} in2, Ix {s.ix:,.0f} in4, Zx {s.zx:.1f} in3"),
            ("slab", f"{slab.name}: {format_inches(slab.topping)} above the deck, {slab.concrete_pcf:g} pcf, "
                     f"f'c {slab.fc_ksi:g} ksi" + (" (lightweight)" if slab.lightweight else "")),
            ("deck", deck_text),
            ("slab each side", f"{format_ft_in(b.slab_left)} / {format_ft_in(b.slab_right)}; tributary "
                               f"{format_ft_in(b.tributary_width)}"),
            ("area loads", f"superimposed dead {b.superimposed_dead_psf:g} psf, live {b.live_psf:g} psf, "
                           f"construction live {b.construction.live_psf:g} psf, screed {b.construction.screed}"),
            ("point loads", points),
            ("studs", f"{r.groups.total} placed, {format_inches(b.studs.diameter)} dia x {format_inches(b.studs.length)} "
                      f"installed, Fu {b.studs.fu:g} ksi, {b.studs.position} position"),
            ("camber", f"{format_inches(c.camber.camber)} ordered ({c.camber.reason})" if c.camber.camber > 0
             else c.camber.reason),
            ("findings", f"{len(b.findings)} stud finding(s) recorded: this package is the beam as designed; the beam "
                         "as built is in the findings report (fieldcomp findings)" if b.findings else "none recorded")]


def result_lines(r, c) -> list[tuple[str, str]]:
    k = r.critical
    strength = (f"phi Mn {PHI_B * r.mn[k] / 12:,.1f} vs Mu {r.mu[k] / 12:,.1f} kip-ft" if r.beam.method == "LRFD"
                else f"Mn/Omega {r.mn[k] / OMEGA_B / 12:,.1f} vs Ma {r.ma[k] / 12:,.1f} kip-ft")
    return [("effective width", f"b_eff {r.b_eff:.1f} in; Ec {r.ec:,.0f} ksi, n {r.n:.2f}"),
            ("slab force", f"sum Qn {r.sum_qn_left:.1f} / {r.sum_qn_right:.1f} kip each side, C_f {r.cf:.1f} kip, "
                           f"composite {100 * r.composite_ratio:.0f} %, PNA {r.pna}"),
            ("stiffness", f"I_tr {r.i_tr:,.0f}, I_LB {r.i_lb:,.0f}, I_equiv {r.i_equiv:,.0f} in4"),
            ("at the largest moment", f"{strength} at {format_ft_in(float(printed_station(r.beam, float(r.x[k]))))}"),
            ("deflection", f"live {r.live_deflection:.2f} in; superimposed dead + live {r.after_cure_deflection:.2f} in; "
                           f"wet concrete {c.at_midspan(c.wet_deflection):.2f} in at midspan"),
            ("verdict", f"{worst((r.verdict, c.verdict)).upper()}: finished beam {r.verdict}, construction stage "
                        f"{verdict_of(c.checks)}")]


def _plot(pdf: SheetPdf, x0: float, y0: float, w: float, h: float, title: str, xs, curves, unit: str, down: bool,
          ends: tuple[str, str]) -> None:
    """Curves over the span in a box, the ends named; `down` draws positive values downward."""
    pdf.words(x0, y0 - 0.06, title, 7, grey=True)
    pdf.words(x0, y0 + h + 0.17, ends[0], 7)
    pdf.set_font("Helvetica", "", 7)
    pdf.text(x0 + w - pdf.get_string_width(pdf.fit(ends[1], 3.0)), y0 + h + 0.17, pdf.fit(ends[1], 3.0))
    pdf.set_line_width(0.008)
    pdf.set_draw_color(*GREY)
    pdf.rect(x0, y0, w, h)
    span = float(xs[-1] - xs[0]) or 1.0
    top = max(float(np.max(np.abs(v))) for _, v, _, _ in curves) or 1.0
    for j, (name, values, colour, dash) in enumerate(curves):
        pdf.set_draw_color(*colour)
        pdf.set_line_width(0.018)
        share = [0.9 * float(v) / top for v in values]
        pts = [(x0 + w * float(xi - xs[0]) / span, y0 + h * (f if down else 1 - f)) for xi, f in zip(xs, share)]
        if dash:
            pdf.set_dash_pattern(dash=0.06, gap=0.04)
        pdf.polyline(pts)
        pdf.set_dash_pattern()
        lx = x0 + 2.2 + 2.4 * j
        if dash:
            pdf.set_dash_pattern(dash=0.06, gap=0.04)
        pdf.line(lx, y0 + h + 0.14, lx + 0.25, y0 + h + 0.14)
        pdf.set_dash_pattern()
        peak = float(np.max(values))
        pdf.words(lx + 0.3, y0 + h + 0.17, f"{name} (max {peak:,.2f} {unit})", 7)
    pdf.set_draw_color(*INK)


def _key_values(pdf: SheetPdf, x: float, y: float, rows: list[tuple[str, str]], width: float) -> float:
    for key, value in rows:
        pdf.words(x, y + 0.1, key.upper(), 6, grey=True)
        y = pdf.paragraph(x + 1.35, y, width - 1.35, value, 8) + 0.02
    return y


def _number(value: float) -> str:
    """A check value: thousands separated from 100 up, three significant figures below."""
    return f"{value:,.0f}" if abs(value) >= 100 else f"{value:.3g}"


def check_rows(r, c) -> list[tuple[str, object]]:
    """('finished' | 'construction', check) for every check of both phases."""
    return [("finished", k) for k in r.checks] + [("construction", k) for k in c.checks]


def _checks(pdf: SheetPdf, r, c) -> None:
    """Every check, one row each (the check's name and clause wrapped, never cut), on as many
    sheets as they need."""
    heads = [("PHASE", 0.72), ("CHECK", 2.75), ("DEMAND", 0.8), ("CAPACITY", 0.8), ("RATIO", 0.42), ("LEVEL", 0.5),
             ("CLAUSE", 3.0), ("AUTHORITY", 0.9)]
    pdf.set_font("Helvetica", "", 6.5)
    rows = []
    for phase, k in check_rows(r, c):
        cells = [[phase], pdf.wrap(k.name, heads[1][1] - 0.06), [f"{_number(k.demand)} {k.unit}"],
                 [f"{_number(k.capacity)} {k.unit}"], [ratio_text(k.ratio)], [str(k.level).upper()],
                 pdf.wrap(k.clause, heads[6][1] - 0.06), [str(k.authority)]]
        rows.append((k, cells))
    y = BOTTOM  # start a sheet at once
    for k, cells in rows:
        height = 0.11 * max(len(cell) for cell in cells) + 0.05
        if y + height > BOTTOM - 0.1:
            x0, y0, _, _ = pdf.sheet(f"beam {r.beam.mark}, checks")
            pdf.words(x0, y0 + 0.25, f"{r.beam.mark} - EVERY CHECK, WITH ITS CLAUSE AND AUTHORITY", 12, "B")
            y = y0 + 0.55
            x = x0
            for head, w in heads:
                pdf.words(x, y, head, 6, grey=True)
                x += w
            y += 0.06
        x = x0
        for j, ((_, w), cell) in enumerate(zip(heads, cells)):
            bold = j == 5 and k.level != "pass"
            pdf.set_text_color(*(RED if bold else INK))
            pdf.set_font("Helvetica", "B" if bold else "", 6.5)
            for n, line in enumerate(cell):
                pdf.text(x, y + 0.11 * (n + 1), pdf.fit(line, w - 0.04))
            x += w
        pdf.set_text_color(*INK)
        y += height


def calc_pages(pdf: SheetPdf, r, c) -> None:
    """One beam's pages: inputs, results and plots; then the checks."""
    x0, y0, x1, _ = pdf.sheet(f"beam {r.beam.mark}, inputs and results")
    pdf.words(x0, y0 + 0.3, f"CALCULATION - BEAM {r.beam.mark}", 16, "B")
    y = _key_values(pdf, x0, y0 + 0.45, input_lines(r, c), (x1 - x0) / 2 - 0.1)
    _key_values(pdf, x0 + (x1 - x0) / 2 + 0.1, y0 + 0.45, result_lines(r, c), (x1 - x0) / 2 - 0.1)
    ph = (BOTTOM - y - 1.25) / 2
    w = x1 - x0
    design = "phi Mn" if r.beam.method == "LRFD" else "Mn / Omega"
    ends = (f"{r.beam.ribs.reference_end} (reference end)", r.beam.ribs.far_end)
    _plot(pdf, x0, y + 0.25, w, ph, f"STRENGTH ALONG THE SPAN (kip-ft): demand and available strength {design} with the "
          "slab force available at each station (AISC 360-22 I3.2a, I8.2c)", r.x,
          [("demand", r.demand / 12, RED, False), (f"{design}", r.capacity / 12, INK, False)], "kip-ft", False, ends)
    _plot(pdf, x0, y + ph + 0.85, w, ph, "DEFLECTION WHILE THE CONCRETE IS WET (in, downward), on the bare steel; the "
          "camber answers the dead-load profile", c.x,
          [("pre-composite dead load", c.wet_deflection, BLUE, False), ("with construction live", c.total_deflection, RED, True)],
          "in", True, ends)
    _checks(pdf, r, c)


def calc_pdf(issue, results) -> bytes:
    """The calculation package of (BeamResult, ConstructionResult) pairs."""
    pdf = SheetPdf(issue, "Calculation package")
    for r, c in results:
        calc_pages(pdf, r, c)
    return pdf.output_bytes()

