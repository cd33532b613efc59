"""The bays on the framing plan (display only, no engineering): a grey-scale grid of the
wet-concrete deflection between the bay's beams, interpolated from the engine's sag points along
each member (linearly along each beam and linearly from one beam to the next), the values printed
at the sag points, the mid-bay value called out, the pour zones outlined with names and dates,
and a grey-scale legend (it prints in black and white). Numbers come from
`fieldcomp.views.bay_report.bay_json`."""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from engine.model.units import format_inches

BAND = 0.25  # in of sag per grey band of the legend
LIGHT, DARK = 245, 120  # grey levels of the first and the last band
CELL = 24.0  # in, the target size of a shading cell on plan


@dataclass(frozen=True, slots=True)
class PlanBay:
    """One bay on plan: its girder and members, shading cells (four plan corners, sag in), the
    printed sag points (x, y, sag in, the member runs more up the sheet than across) and the
    mid-bay point and value (in, wet, before camber)."""

    girder: str
    members: tuple[str, ...]
    cells: tuple[tuple[tuple[tuple[float, float], ...], float], ...]
    points: tuple[tuple[float, float, float, bool], ...]
    mid: tuple[float, float, float]
    notes: tuple[str, ...] = ()  # the derived girder loads and the concrete to order, as printed


LOAD_KINDS = (("steel_and_deck_kip", "steel and deck"), ("wet_concrete_kip", "wet concrete"),
              ("ponded_concrete_kip", "ponded"), ("construction_live_kip", "construction live"),
              ("superimposed_dead_kip", "superimposed dead"), ("live_kip", "live"))


def bay_notes(data: dict, girder: str) -> tuple[str, ...]:
    """The lines the bay's sheet prints beside the shading: the girder's loads from the beams
    resting on it (sums of `bay_json`'s derived loads, kip, by load type) and the concrete to order
    per pour zone and for the level (`bay_json`'s concrete, yd3)."""
    rows = [r for r in data["girder_loads"] if r["girder"] == girder]
    loads = [f"{name} {sum(r[key] for r in rows):.1f}" for key, name in LOAD_KINDS if any(r[key] for r in rows)]
    lines = [f"GIRDER {girder}: FROM ITS {len({r['beam'] for r in rows})} BEAMS (kip)"]
    lines += ["  " + ", ".join(loads[k:k + 2]) for k in range(0, len(loads), 2)]
    lines.append("CONCRETE TO ORDER (yd3)")
    lines.append("  total = nominal + ponded + deck sag")
    for c in data["concrete"]:
        ponded = c["ponded_own_sag_yd3"] + c["ponded_girder_sag_yd3"]
        lines.append(f"  {c['zone']}: {c['total_yd3']:.2f} = {c['nominal_yd3']:.2f} + {ponded:.2f} + {c['deck_sag_yd3']:.2f}")
    return tuple(lines)


@dataclass(frozen=True, slots=True)
class PlanZone:
    """A pour zone drawn on plan: its name, date and outline (plan in)."""

    name: str
    date: str
    outline: tuple[tuple[float, float], ...]


def _frame(points: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """A member's origin, unit direction along it and unit normal (plan)."""
    origin, end = points[0, :2], points[-1, :2]
    d = (end - origin) / (np.hypot(*(end - origin)) or 1.0)
    return origin, d, np.array([-d[1], d[0]])


def _strip(a: np.ndarray, b: np.ndarray) -> list[tuple[tuple[tuple[float, float], ...], float]]:
    """Cells between beam a and the parallel beam b (points [x, y, sag]) over their common length:
    each cell's value is the linear interpolation at its centre (along each beam between its sag
    points, then across from a to b)."""
    origin, d, n = _frame(a)
    ua, ub = (a[:, :2] - origin) @ d, (b[:, :2] - origin) @ d
    gap = float(np.mean((b[:, :2] - origin) @ n))
    oa, ob = np.argsort(ua), np.argsort(ub)
    lo, hi = max(ua.min(), ub.min()), min(ua.max(), ub.max())
    nu, nv = max(4, round((hi - lo) / CELL)), max(2, round(abs(gap) / CELL))
    us, vs = np.linspace(lo, hi, nu + 1), np.linspace(0.0, gap, nv + 1)
    cells = []
    for i in range(nu):
        uc = (us[i] + us[i + 1]) / 2
        sa = np.interp(uc, ua[oa], a[oa, 2])
        sb = np.interp(uc, ub[ob], b[ob, 2])
        for j in range(nv):
            t = ((vs[j] + vs[j + 1]) / 2) / gap
            corners = tuple(tuple(float(c) for c in origin + u * d + v * n)
                            for u, v in ((us[i], vs[j]), (us[i + 1], vs[j]), (us[i + 1], vs[j + 1]), (us[i], vs[j + 1])))
            cells.append((corners, float((1 - t) * sa + t * sb)))
    return cells


def _steep(points: np.ndarray) -> bool:
    _, d, _ = _frame(points)
    return bool(abs(d[1]) > abs(d[0]))


def _neighbour(a: np.ndarray, others: list[np.ndarray]) -> np.ndarray | None:
    """The nearest beam parallel to a on its normal's positive side sharing part of its length."""
    origin, d, n = _frame(a)
    ua = (a[:, :2] - origin) @ d
    best, best_gap = None, math.inf
    for b in others:
        _, db, _ = _frame(b)
        if abs(d[0] * db[1] - d[1] * db[0]) > 0.02:
            continue
        ub = (b[:, :2] - origin) @ d
        gap = float(np.mean((b[:, :2] - origin) @ n))
        if min(ua.max(), ub.max()) - max(ua.min(), ub.min()) > 1.0 and 1.0 < gap < best_gap:
            best, best_gap = b, gap
    return best


def plan_bays(data: dict) -> list[PlanBay]:
    """The bays of `bay_json` whose members lie on plan, ready to draw."""
    points = {p["mark"]: np.array(p["plan_points_in"], dtype=float) for p in data["plan"] if p["plan_points_in"]}
    out = []
    for bay in data["bays"]:
        beams = [points[m] for m in bay["beams"] if m in points]
        if not beams or bay["mid_bay_beam"] not in points or bay["mid_bay_deflection_in"] is None:
            continue
        cells = []
        for a in beams:
            b = _neighbour(a, [o for o in beams if o is not a])
            if b is not None:
                cells += _strip(a, b)
        shown = [(float(p[0]), float(p[1]), float(p[2]), _steep(points[m]))
                 for m in (*bay["beams"], bay["girder"]) if m in points for p in points[m]]
        mid = points[bay["mid_bay_beam"]]
        centre = mid[len(mid) // 2]
        out.append(PlanBay(bay["girder"], (bay["girder"], *bay["beams"]), tuple(cells), tuple(shown),
                           (float(centre[0]), float(centre[1]), float(bay["mid_bay_deflection_in"])),
                           bay_notes(data, bay["girder"])))
    return out


def plan_zones(job) -> list[PlanZone]:
    """The job's pour zones given by outline, in plan inches."""
    from fieldcomp.jobs.model import coordinate_inches

    return [PlanZone(z.name, str(z.date), tuple((coordinate_inches(p.x), coordinate_inches(p.y)) for p in z.outline))
            for z in job.zone if z.outline]


def bands(bays: list[PlanBay]) -> int:
    """How many grey bands the legend needs (BAND in each) to cover every shaded value."""
    top = max([v for b in bays for _, v in b.cells] + [0.0])
    return max(1, math.ceil(top / BAND - 1e-9))


def grey(value: float, count: int) -> tuple[int, int, int]:
    """The grey of the band a value falls in (lighter: less sag)."""
    k = min(count - 1, max(0, int(value / BAND)))
    level = round(LIGHT - (LIGHT - DARK) * (k / max(1, count - 1)))
    return (level, level, level)


def draw_bays(c, paper, bays: list[PlanBay], zones: list[PlanZone], ink, named: bool) -> None:
    """Under the members: the shading and the zones' outlines, with `named` (the bay's detail)
    their names and dates (`paper` maps plan inches to paper inches)."""
    count = bands(bays)
    for bay in bays:
        for corners, value in bay.cells:
            c.polygon([paper(*p) for p in corners], grey(value, count))
    for z in zones:
        pts = [paper(*p) for p in z.outline]
        for a, b in zip(pts, pts[1:] + pts[:1]):
            c.line(a, b, ink, 0.014, (0.12, 0.05))
        left, top, bottom = min(p[0] for p in pts), min(p[1] for p in pts), max(p[1] for p in pts)
        if named:
            c.text(left - 0.06, (top + bottom) / 2, f"{z.name.upper()}  poured {z.date}", 6, ink, True, "middle", 90.0)


def draw_values(c, paper, bays: list[PlanBay], ink, values: bool, size: float = 6.0) -> None:
    """Over the members: with `values` (the bay's detail) the sag values in white boxes, a value
    closer to one already printed than a label's size left out; the mid-bay call-out always."""
    placed: list[tuple[float, float]] = []
    for bay in bays:
        for x, y, s, steep in bay.points if values else ():
            px, py = paper(x, y)
            if any(abs(px - qx) < 0.4 and abs(py - qy) < 0.12 for qx, qy in placed):
                continue
            placed.append((px, py))
            words = format_inches(s)
            w, h = len(words) * size / 72 * 0.55 + 0.03, size / 72 + 0.02
            px += w / 2 + 0.03 if steep else 0.0  # beside a member running up the sheet, on it otherwise
            c.polygon([(px - w / 2, py - h / 2), (px + w / 2, py - h / 2), (px + w / 2, py + h / 2), (px - w / 2, py + h / 2)],
                      (255, 255, 255), ink)
            c.text(px, py + size / 72 * 0.36, words, size, ink, anchor="middle")
        mx, my = paper(bay.mid[0], bay.mid[1])
        c.line((mx, my + 0.05), (mx + 0.25, my + 0.4), ink, 0.01)
        c.text(mx + 0.28, my + 0.46, f"MID-BAY {format_inches(bay.mid[2])} wet, before camber", 6, ink, True)


def bay_legend(c, x: float, y: float, bays: list[PlanBay], ink, values: bool) -> float:
    """The grey-scale key of the shading and how the field between members is drawn; returns the
    next free y."""
    count = bands(bays)
    c.text(x, y, "WET-CONCRETE DEFLECTION (bay shading)", 6.5, ink, True)
    y += 0.08
    for k in range(count):
        c.polygon([(x, y), (x + 0.3, y), (x + 0.3, y + 0.12), (x, y + 0.12)], grey(k * BAND, count), ink)
        c.text(x + 0.38, y + 0.1, f"{format_inches(k * BAND)} to {format_inches((k + 1) * BAND)}", 6, ink)
        y += 0.14
    y += 0.06
    where = ("values printed at the members' sag points." if values else "values, pour zones: on the bay's detail.")
    for line in ("below the column line, before camber;", where,
                 "Field between members: linear from beam", "to beam, and along each beam between its",
                 "sag points; the deck's own sag between", "beams is not included."):
        y += 0.12
        c.text(x, y, line, 6, ink)
    if values:  # the bay's own sheet: what the girder carries and the concrete to order
        y += 0.1
        for bay in bays:
            for line in bay.notes:
                y += 0.11
                c.text(x, y, line, 6, ink, line.isupper() or line.startswith(("GIRDER", "CONCRETE")))
    return y + 0.2
