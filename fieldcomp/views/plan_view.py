"""The framing plan to scale from the beams' plan coordinates: each beam drawn between its work
points with its mark, shape, studs and camber to order, its verdict as a colour, a line style and
a word (it reads in black and white), findings located along it, grid lines where the beam ends
are named for grids, a legend, the scale, a north arrow and the caution. Drawn once as simple
primitives, then written as SVG or onto a PDF sheet (landscape letter)."""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from xml.sax.saxutils import escape

from engine.model.text import printable as clean
from engine.model.units import format_inches
from fieldcomp.views.plan_bay import bay_legend, draw_bays, draw_values
from fieldcomp.views.pdf_page import BOTTOM, LEFT, PAGE_H, PAGE_W, RIGHT, TOP, SheetPdf, fit_scale, latin

COLOURS = {"pass": (30, 120, 60), "review": (200, 120, 0), "fail": (190, 30, 30)}
DASHES = {"pass": None, "review": (0.08, 0.04), "fail": (0.16, 0.04, 0.02, 0.04)}
WIDTHS = {"pass": 0.02, "review": 0.03, "fail": 0.045}
INK, GRID = (29, 42, 56), (140, 150, 160)
_GRID_NAME = re.compile(r"^\s*grid\s+(\S+)\s*$", re.IGNORECASE)


@dataclass(frozen=True, slots=True)
class PlanBeam:
    """One beam on the plan: work points (in, plan x right, y up), what is printed beside it,
    its verdict (pass / review / fail) and the stations (in from the reference end) of findings."""

    mark: str
    shape: str
    x1: float
    y1: float
    x2: float
    y2: float
    studs: int
    camber: float
    verdict: str
    reference_end: str
    far_end: str
    findings: tuple[float, ...] = ()


def grid_lines(beams: list[PlanBeam]) -> list[tuple[str, tuple[float, float], tuple[float, float]]]:
    """Grid lines known from beam ends named 'grid X': (name, a point on it, its direction), the
    line through the end's work point, square to the beam. The first beam naming a grid places it."""
    out: dict[str, tuple[tuple[float, float], tuple[float, float]]] = {}
    for b in beams:
        length = math.hypot(b.x2 - b.x1, b.y2 - b.y1) or 1.0
        normal = (-(b.y2 - b.y1) / length, (b.x2 - b.x1) / length)
        for end, point in ((b.reference_end, (b.x1, b.y1)), (b.far_end, (b.x2, b.y2))):
            m = _GRID_NAME.match(end)
            if m and m.group(1).upper() not in out:
                out[m.group(1).upper()] = (point, normal)
    return [(name, p, d) for name, (p, d) in sorted(out.items())]


class _Canvas:
    """Primitives in paper inches (y down): lines, polylines and text."""

    def __init__(self) -> None:
        self.items: list[tuple] = []

    def line(self, a, b, colour=INK, width=0.01, dash=None) -> None:
        self.items.append(("line", a, b, colour, width, dash))

    def text(self, x, y, words, size=7.0, colour=INK, bold=False, anchor="start", angle=0.0) -> None:
        self.items.append(("text", x, y, clean(str(words)), size, colour, bold, anchor, angle))

    def polygon(self, points, fill, stroke=None) -> None:
        self.items.append(("polygon", tuple(points), fill, stroke))


def _draw(beams: list[PlanBeam], title: str, caution: str, unplaced: list[str], bays=(), zones=(),
          values: bool = False) -> _Canvas:
    c = _Canvas()
    legend_x = RIGHT - 2.3
    corners = [p for z in zones for p in z.outline] if values else []
    xs = [v for b in beams for v in (b.x1, b.x2)] + [p[0] for p in corners] or [0.0, 1.0]
    ys = [v for b in beams for v in (b.y1, b.y2)] + [p[1] for p in corners] or [0.0, 1.0]
    pad = 60.0
    minx, maxx, miny, maxy = min(xs) - pad, max(xs) + pad, min(ys) - pad, max(ys) + pad
    room_w, room_h = legend_x - LEFT - 0.3, BOTTOM - TOP - 0.7
    scale, name = fit_scale(max(maxx - minx, (maxy - miny) * room_w / room_h), room_w)
    ox, oy = LEFT + 0.3 + (room_w - (maxx - minx) * scale) / 2, TOP + 0.5

    def paper(x: float, y: float) -> tuple[float, float]:
        return ox + (x - minx) * scale, oy + (maxy - y) * scale

    c.text(LEFT, TOP + 0.25, title, 14, bold=True)
    for gname, (px, py), (dx, dy) in grid_lines(beams):
        reach = max(maxx - minx, maxy - miny)
        ts = [t for t in (-reach * 2, reach * 2)]
        a, b = paper(px + dx * ts[0], py + dy * ts[0]), paper(px + dx * ts[1], py + dy * ts[1])
        a, b = _clip(a, b, paper(minx, maxy), paper(maxx, miny))
        if a is None:
            continue
        c.line(a, b, GRID, 0.008, (0.2, 0.05, 0.03, 0.05))
        c.text(a[0], a[1] - 0.04, gname, 9, GRID, bold=True, anchor="middle")
    draw_bays(c, paper, list(bays), list(zones), INK, values)
    in_bay = {m for bay in bays for m in bay.members}
    ends = {b.mark: ((b.x1 + b.x2) / 2, (b.y1 + b.y2) / 2) for b in beams}
    girder_mid = {m: paper(*ends[bay.girder]) for bay in bays if bay.girder in ends for m in bay.members[1:]}
    for b in beams:
        p1, p2 = paper(b.x1, b.y1), paper(b.x2, b.y2)
        c.line(p1, p2, COLOURS[b.verdict], WIDTHS[b.verdict], DASHES[b.verdict])
        angle = math.degrees(math.atan2(-(p2[1] - p1[1]), p2[0] - p1[0]))
        if angle > 90 or angle < -90:
            angle += 180
        mx, my = _label_centre(p1, p2, girder_mid.get(b.mark))
        nx, ny = _offset(p1, p2, 0.09 * (0.8 if b.mark in in_bay and not values else 1.0))
        # in a bay both labels go on one side of the member (the sag values sit on it on the detail)
        far = 2.2 if b.mark in in_bay else -1.5
        small = 0.8 if b.mark in in_bay and not values else 1.0  # the bay's labels on the whole plan crowd
        camber = f"c={format_inches(b.camber)}" if b.camber > 0 else "no camber"
        c.text(mx + nx * (far if far > 0 else 1.0), my + ny * (far if far > 0 else 1.0), f"{b.mark} {b.shape}", 6.5 * small,
               bold=True, anchor="middle", angle=angle)
        c.text(mx + nx * (1.0 if far > 0 else far), my + ny * (1.0 if far > 0 else far),
               f"({b.studs}) {camber} {b.verdict.upper()}", 6 * small, COLOURS[b.verdict], True, "middle", angle)
        length = math.hypot(b.x2 - b.x1, b.y2 - b.y1) or 1.0
        for s in b.findings:
            t = s / length
            fx, fy = paper(b.x1 + t * (b.x2 - b.x1), b.y1 + t * (b.y2 - b.y1))
            c.line((fx - 0.04, fy - 0.04), (fx + 0.04, fy + 0.04), INK, 0.012)
            c.line((fx - 0.04, fy + 0.04), (fx + 0.04, fy - 0.04), INK, 0.012)
    draw_values(c, paper, list(bays), INK, values)
    y = _legend(c, legend_x, TOP + 0.6, name, unplaced)
    if bays:
        bay_legend(c, legend_x, y, list(bays), INK, values)
    return c


def _label_centre(p1, p2, girder=None, shift: float = 0.12) -> tuple[float, float]:
    """The middle of p1-p2, moved along it away from its bay's girder (paper point), if any, so
    that the beams' labels clear the girder's."""
    mx, my = (p1[0] + p2[0]) / 2, (p1[1] + p2[1]) / 2
    if girder is None:
        return mx, my
    far = max((p1, p2), key=lambda p: math.hypot(p[0] - girder[0], p[1] - girder[1]))
    length = math.hypot(far[0] - mx, far[1] - my) or 1.0
    return mx + (far[0] - mx) / length * shift, my + (far[1] - my) / length * shift


def _offset(p1, p2, distance: float) -> tuple[float, float]:
    """A paper offset square to the line p1-p2 (toward the line's upper or left side)."""
    dx, dy = p2[0] - p1[0], p2[1] - p1[1]
    length = math.hypot(dx, dy) or 1.0
    nx, ny = dy / length * distance, -dx / length * distance
    return (nx, ny) if ny < 0 or (abs(ny) < 1e-9 and nx < 0) else (-nx, -ny)


def _clip(a, b, top_left, bottom_right):
    """The part of segment a-b inside the box (Liang-Barsky), or (None, None)."""
    (x0, y0), (x1, y1) = top_left, bottom_right
    dx, dy = b[0] - a[0], b[1] - a[1]
    lo, hi = 0.0, 1.0
    for p, q in ((-dx, a[0] - x0), (dx, x1 - a[0]), (-dy, a[1] - y0), (dy, y1 - a[1])):
        if abs(p) < 1e-12:
            if q < 0:
                return None, None
            continue
        t = q / p
        if p < 0:
            lo = max(lo, t)
        else:
            hi = min(hi, t)
    if lo > hi:
        return None, None
    return (a[0] + lo * dx, a[1] + lo * dy), (a[0] + hi * dx, a[1] + hi * dy)


def _legend(c: _Canvas, x: float, y: float, scale_name: str, unplaced: list[str]) -> float:
    c.text(x, y, "LEGEND", 7, GRID, True)
    y += 0.22
    for word, meaning in (("pass", "every check passes"), ("review", "the engineer of record reviews"),
                          ("fail", "a binding limit is broken")):
        c.line((x, y - 0.03), (x + 0.45, y - 0.03), COLOURS[word], WIDTHS[word], DASHES[word])
        c.text(x + 0.55, y, f"{word.upper()}: {meaning}", 6.5)
        y += 0.2
    c.line((x + 0.18, y - 0.07), (x + 0.26, y + 0.01), INK, 0.012)
    c.line((x + 0.18, y + 0.01), (x + 0.26, y - 0.07), INK, 0.012)
    c.text(x + 0.55, y, "stud inspection finding", 6.5)
    y += 0.2
    c.line((x, y - 0.03), (x + 0.45, y - 0.03), GRID, 0.008, (0.2, 0.05, 0.03, 0.05))
    c.text(x + 0.55, y, "grid line (from beam ends named for grids)", 6.5)
    y += 0.26
    for line in ("MARK SHAPE above the beam;", "(studs) camber to order and the", "verdict word below it"):
        c.text(x, y, line, 6.5)
        y += 0.14
    y += 0.12
    c.text(x, y, f"SCALE {scale_name}", 7, bold=True)
    y += 0.8
    c.line((x + 0.3, y), (x + 0.3, y - 0.4), INK, 0.02)
    c.line((x + 0.3, y - 0.4), (x + 0.22, y - 0.26), INK, 0.02)
    c.line((x + 0.3, y - 0.4), (x + 0.38, y - 0.26), INK, 0.02)
    c.text(x + 0.3, y - 0.46, "N", 10, bold=True, anchor="middle")
    c.text(x + 0.5, y - 0.1, "plan north (y up)", 6.5)
    if unplaced:
        y += 0.3
        c.text(x, y, "NOT ON THE PLAN (no plan coordinates):", 6.5, bold=True)
        for k in range(0, len(unplaced), 4):
            y += 0.14
            c.text(x, y, ", ".join(unplaced[k:k + 4]), 6.5)
    return y + 0.3


def _pages(beams: list[PlanBeam], title: str, caution: str, unplaced: list[str], bays, zones):
    """(sheet title, drawing) per page: the plan (bays shaded, values on the detail), then one
    detail per bay at the largest scale that fits, with the sag values printed."""
    pages = [(f"{len(beams)} beams", _draw(beams, title, caution, unplaced, bays, zones))]
    for bay in bays:
        members = [b for b in beams if b.mark in bay.members]
        pages.append((f"bay of girder {bay.girder}",
                      _draw(members, f"{title} - bay of girder {bay.girder}, wet concrete", caution, [], [bay], zones, True)))
    return pages


def plan_svg(issue, beams: list[PlanBeam], title: str, unplaced: list[str], bays=(), zones=()) -> str:
    """The plan as SVG pages (11 x 8.5 in each, stacked; 100 units to the inch), each with the
    caution and a title line (job, revision, issue date, drawn / checked / approved) as the PDF
    sheet has; a bay's detail page follows the plan."""
    caution = issue.caution
    pages = _pages(beams, title, caution, unplaced, bays, zones)
    out = ['<?xml version="1.0" encoding="UTF-8"?>',
           f'<svg xmlns="http://www.w3.org/2000/svg" width="{PAGE_W}in" height="{PAGE_H * len(pages)}in" '
           f'viewBox="0 0 {PAGE_W * 100:.0f} {PAGE_H * len(pages) * 100:.0f}">', f"<title>{escape(clean(title))}</title>",
           f'<rect x="0" y="0" width="{PAGE_W * 100:.0f}" height="{PAGE_H * len(pages) * 100:.0f}" fill="white"/>']
    for k, (sheet, c) in enumerate(pages):
        out.append(f'<g transform="translate(0 {k * PAGE_H * 100:.0f})">')
        out += _svg_items(c)
        out += _svg_block(issue, caution, sheet)
        out.append("</g>")
    return "\n".join(out + ["</svg>", ""])


def _svg_items(c: _Canvas) -> list[str]:
    out = []
    for item in c.items:
        if item[0] == "polygon":
            _, pts, fill, stroke = item
            edge = f' stroke="rgb{stroke}" stroke-width="0.6"' if stroke else ""
            kind = "bay-cell" if not stroke else "value-box" if fill == (255, 255, 255) else "key"
            out.append(f'<polygon class="{kind}" points="'
                       + " ".join(f"{x * 100:.1f},{y * 100:.1f}" for x, y in pts) + f'" fill="rgb{fill}"{edge}/>')
        elif item[0] == "line":
            _, a, b, colour, width, dash = item
            pattern = f' stroke-dasharray="{" ".join(f"{d * 100:.1f}" for d in dash)}"' if dash else ""
            out.append(f'<line x1="{a[0] * 100:.1f}" y1="{a[1] * 100:.1f}" x2="{b[0] * 100:.1f}" y2="{b[1] * 100:.1f}" '
                       f'stroke="rgb{colour}" stroke-width="{width * 100:.2f}"{pattern}/>')
        else:
            _, x, y, words, size, colour, bold, anchor, angle = item
            turn = f' transform="rotate({-angle:.2f} {x * 100:.1f} {y * 100:.1f})"' if angle else ""
            weight = ' font-weight="bold"' if bold else ""
            out.append(f'<text x="{x * 100:.1f}" y="{y * 100:.1f}" font-family="DejaVu Sans, Arial, sans-serif" '
                       f'font-size="{size / 72 * 100:.1f}" fill="rgb{colour}" text-anchor="{anchor}"'
                       f"{weight}{turn}>{escape(words)}</text>")
    return out


def _svg_block(issue, caution: str, sheet: str) -> list[str]:
    out = []
    for k, part in enumerate(_wrap("CAUTION: " + clean(caution), 170)):
        out.append(f'<text x="{LEFT * 100:.0f}" y="{(BOTTOM + 0.25 + 0.14 * k) * 100:.0f}" font-family="DejaVu Sans, Arial, '
                   f'sans-serif" font-size="9.7">{escape(part)}</text>')
    block = (f"JOB {clean(issue.job)}   SHEET framing plan: {clean(sheet)}   REV. {clean(issue.revision)}   "
             f"ISSUED {clean(issue.date)}   DRAWN ________   CHECKED ________   APPROVED ________")
    out.append(f'<text x="{LEFT * 100:.0f}" y="{(PAGE_H - 0.45) * 100:.0f}" font-family="DejaVu Sans, Arial, sans-serif" '
               f'font-size="11" font-weight="bold">{escape(block)}</text>')
    return out


def _wrap(text: str, width: int) -> list[str]:
    import textwrap

    return textwrap.wrap(text, width)


def plan_pdf(issue, beams: list[PlanBeam], title: str, unplaced: list[str], bays=(), zones=()) -> bytes:
    """The plan on one PDF sheet with the title block."""
    pdf = SheetPdf(issue, "Framing plan")
    for sheet, c in _pages(beams, title, issue.caution, unplaced, bays, zones):
        pdf.sheet(sheet)
        _pdf_items(pdf, c)
    pdf.set_text_color(*INK)
    pdf.set_draw_color(*INK)
    return pdf.output_bytes()


def _pdf_items(pdf: SheetPdf, c: _Canvas) -> None:
    for item in c.items:
        if item[0] == "polygon":
            _, pts, fill, stroke = item
            pdf.set_fill_color(*fill)
            if stroke:
                pdf.set_draw_color(*stroke)
                pdf.set_line_width(0.006)
            pdf.polygon([(x, y) for x, y in pts], style="DF" if stroke else "F")
        elif item[0] == "line":
            _, a, b, colour, width, dash = item
            pdf.set_draw_color(*colour)
            pdf.set_line_width(width)
            if dash:
                pdf.set_dash_pattern(dash=dash[0], gap=dash[1])
            pdf.line(a[0], a[1], b[0], b[1])
            pdf.set_dash_pattern()
        else:
            _, x, y, words, size, colour, bold, anchor, angle = item
            pdf.set_font("Helvetica", "B" if bold else "", size)
            pdf.set_text_color(*colour)
            t = latin(words)
            shift = {"middle": 0.5, "end": 1.0}.get(anchor, 0.0) * pdf.get_string_width(t)
            with pdf.rotation(angle, x, y):
                pdf.text(x - shift, y, t)
