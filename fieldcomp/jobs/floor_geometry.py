"""Framing of one level on plan, from members read out of a building model: each beam's supports
(a column, or a girder it frames into), its span between support work points, the distance to
the adjacent parallel beam (or the slab edge) on each side, and the girders' framing. Inches,
plan x to the right and y up; left is 90 degrees counter-clockwise of the reference-to-far
direction. No engineering here: this is where the members are."""

from __future__ import annotations

import math
from dataclasses import dataclass, field

Point = tuple[float, float]

END_REACH = 3.0  # in: a member's end counts as bearing on a support within its half-width plus this
PARALLEL_SINE = math.sin(math.radians(2.0))  # beams within 2 degrees of each other are parallel
CROSSING_SINE = math.sin(math.radians(10.0))  # a girder crosses the beam at 10 degrees or more
SAME_LINE = 1.0  # in: a parallel beam nearer than this is on the same line, not a neighbour


@dataclass(frozen=True, slots=True)
class Member:
    """A horizontal member read from the model: its steel ends on plan, elevation, section sizes."""

    source_id: str
    mark: str
    shape: str
    start: Point
    end: Point
    z: float
    d: float
    bf: float


@dataclass(frozen=True, slots=True)
class Post:
    """A column: plan position, the heights it spans, half its larger plan dimension."""

    source_id: str
    mark: str
    at: Point
    z_bottom: float
    z_top: float
    half_size: float


@dataclass(frozen=True, slots=True)
class Outline:
    """A slab on plan: its boundary (closed polygon), overall thickness and source id."""

    source_id: str
    polygon: tuple[Point, ...]
    thickness: float


@dataclass(frozen=True, slots=True)
class Framing:
    mark: str
    at: float
    end: str  # "reference-end" or "far-end" of the beam that frames in
    side: str  # "left" or "right" of the girder


@dataclass(slots=True)
class FloorBeam:
    """A beam laid out on plan: work points, supports, sides, framing (filled by `lay_out`)."""

    member: Member
    start: Point
    end: Point
    supports: tuple[str, str] = ("", "")  # what each end bears on ("column C-2", "G-1"; "" none found)
    sides: dict[str, tuple[str, float]] = field(default_factory=dict)  # side -> ("spacing" | "edge", in)
    framing: list[Framing] = field(default_factory=list)
    slab: Outline | None = None
    problems: list[str] = field(default_factory=list)

    @property
    def span(self) -> float:
        return math.dist(self.start, self.end)


def _sub(a: Point, b: Point) -> Point:
    return (a[0] - b[0], a[1] - b[1])


def _dot(a: Point, b: Point) -> float:
    return a[0] * b[0] + a[1] * b[1]


def _cross(a: Point, b: Point) -> float:
    return a[0] * b[1] - a[1] * b[0]


def _unit(a: Point, b: Point) -> Point:
    length = math.dist(a, b)
    return ((b[0] - a[0]) / length, (b[1] - a[1]) / length)


def _left(u: Point) -> Point:
    return (-u[1], u[0])


def canonical(member: Member) -> Member:
    """The member with its reference end first: towards +x, or towards +y when it runs along y."""
    dx, dy = _sub(member.end, member.start)
    if dx < -1e-6 * max(abs(dy), 1.0) or (abs(dx) <= 1e-6 * max(abs(dy), 1.0) and dy < 0.0):
        return Member(member.source_id, member.mark, member.shape, member.end, member.start, member.z, member.d, member.bf)
    return member


def _intersection(p: Point, u: Point, q: Point, v: Point) -> tuple[float, float] | None:
    """Parameters (s, t) with p + s u = q + t v, or None for parallel lines."""
    denom = _cross(u, v)
    if abs(denom) < 1e-12:
        return None
    w = _sub(q, p)
    return _cross(w, v) / denom, _cross(w, u) / denom


def _bearing(m: Member, end: Point, posts: list[Post], members: list[Member]) -> tuple[str, Point, Member | None]:
    """What `end` of `m` bears on: (description, work point, girder or None). A column first
    (the work point is its centre projected onto the beam's axis), then a crossing member the
    end reaches (the work point is where the two axes cross); otherwise the modelled end."""
    u = _unit(m.start, m.end)
    for post in posts:
        if post.z_bottom - m.d <= m.z <= post.z_top + m.d and math.dist(post.at, end) <= post.half_size + END_REACH:
            s = _dot(_sub(post.at, m.start), u)
            return f"column {post.mark}", (m.start[0] + s * u[0], m.start[1] + s * u[1]), None
    for g in members:
        if g is m or abs(g.z - m.z) > max(g.d, m.d):
            continue
        v = _unit(g.start, g.end)
        sine = abs(_cross(u, v))
        if sine < CROSSING_SINE:
            continue
        hit = _intersection(m.start, u, g.start, v)
        if hit is None:
            continue
        s, t = hit
        point = (m.start[0] + s * u[0], m.start[1] + s * u[1])
        reach = (g.bf / 2.0 + END_REACH) / sine
        if math.dist(point, end) <= reach and -END_REACH <= t <= math.dist(g.start, g.end) + END_REACH:
            return g.mark, point, g
    return "", end, None


def lay_out(members: list[Member], posts: list[Post], slabs: list[Outline]) -> list[FloorBeam]:
    """Every member laid out: supports and work points, sides, girder framing, its slab."""
    members = [canonical(m) for m in members]
    beams: list[FloorBeam] = []
    girders: list[tuple[FloorBeam, str, Point, Member]] = []
    for m in members:
        a_what, a_point, a_girder = _bearing(m, m.start, posts, members)
        b_what, b_point, b_girder = _bearing(m, m.end, posts, members)
        beam = FloorBeam(m, a_point, b_point, (a_what, b_what))
        beams.append(beam)
        for girder, end, point in ((a_girder, "reference-end", a_point), (b_girder, "far-end", b_point)):
            if girder is not None:
                girders.append((beam, end, point, girder))
    by_member = {id(b.member): b for b in beams}
    for beam, end, point, girder in girders:
        g = by_member[id(girder)]
        u = _unit(g.start, g.end)
        other = beam.end if end == "reference-end" else beam.start
        side = "left" if _dot(_sub(other, point), _left(u)) > 0.0 else "right"
        g.framing.append(Framing(beam.member.mark, _dot(_sub(point, g.start), u), end, side))
    for beam in beams:
        beam.framing.sort(key=lambda f: (f.at, f.mark))
        beam.slab = _slab_under(_midpoint(beam), slabs)
        _find_sides(beam, beams, slabs)
    return beams


def _midpoint(beam: FloorBeam) -> Point:
    return ((beam.start[0] + beam.end[0]) / 2.0, (beam.start[1] + beam.end[1]) / 2.0)


def _find_sides(beam: FloorBeam, beams: list[FloorBeam], slabs: list[Outline]) -> None:
    """Nearest parallel beam beside the midpoint on each side, or the slab edge when nearer."""
    u = _unit(beam.start, beam.end)
    n = _left(u)
    mid = _midpoint(beam)
    nearest = {"left": math.inf, "right": math.inf}
    for other in beams:
        if other is beam or abs(other.member.z - beam.member.z) > max(other.member.d, beam.member.d):
            continue
        if abs(_cross(u, _unit(other.start, other.end))) > PARALLEL_SINE:
            continue
        s1, s2 = sorted(_dot(_sub(p, mid), u) for p in (other.start, other.end))
        if not s1 <= 0.0 <= s2:
            continue
        v = _unit(other.start, other.end)
        w = _sub(other.start, mid)
        t = -_dot(w, u) / _dot(v, u)  # the point of the other beam abreast of this midpoint
        offset = _dot((w[0] + t * v[0], w[1] + t * v[1]), n)
        side = "left" if offset > 0.0 else "right"
        if abs(offset) >= SAME_LINE:
            nearest[side] = min(nearest[side], abs(offset))
    outline = beam.slab
    for side, sign in (("left", 1.0), ("right", -1.0)):
        edge = _ray_to_edge(mid, (sign * n[0], sign * n[1]), outline) if outline else math.inf
        if edge < nearest[side]:
            beam.sides[side] = ("edge", edge)
        elif math.isfinite(nearest[side]):
            beam.sides[side] = ("spacing", nearest[side])
        else:
            beam.problems.append(f"{side} side: no parallel beam beside it and no slab edge found")


def _ray_to_edge(origin: Point, direction: Point, outline: Outline) -> float:
    """Distance along the ray to the first crossing of the slab boundary (inf when none)."""
    best = math.inf
    poly = outline.polygon
    for i, a in enumerate(poly):
        b = poly[(i + 1) % len(poly)]
        edge = _sub(b, a)
        if math.dist(a, b) < 1e-9:
            continue
        hit = _intersection(origin, direction, a, _unit(a, b))
        if hit is None:
            continue
        s, t = hit
        if s > 1e-6 and -1e-6 <= t <= math.hypot(*edge) + 1e-6:
            best = min(best, s)
    return best


def contains(polygon: tuple[Point, ...], p: Point) -> bool:
    """Point in polygon (even-odd rule)."""
    inside = False
    for i, a in enumerate(polygon):
        b = polygon[(i + 1) % len(polygon)]
        if (a[1] > p[1]) != (b[1] > p[1]):
            x = a[0] + (p[1] - a[1]) * (b[0] - a[0]) / (b[1] - a[1])
            if x > p[0]:
                inside = not inside
    return inside


def _slab_under(p: Point, slabs: list[Outline]) -> Outline | None:
    return next((s for s in slabs if contains(s.polygon, p)), None)
