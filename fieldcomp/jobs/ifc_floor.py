"""The framing of one storey read from an IFC model (ISO 16739: IFC2x3 and IFC4, with
ifcopenshell): beams with their I-section profiles and axes, columns, slabs with their outline
and thickness. Lengths are converted from the project's length unit to inches here. What cannot
be read is reported per element with its GlobalId and left out, never guessed."""

from __future__ import annotations

import os
from dataclasses import dataclass, field
from typing import Any

import numpy as np

from engine.model.errors import FieldcompError
from fieldcomp.jobs.file_kinds import FileKindError, read_regular
from fieldcomp.jobs.floor_geometry import Member, Outline, Post
from fieldcomp.jobs.shape_match import Section, ShapeMatchError, match_section

MAX_BYTES = 500 * 1024 * 1024
_METRES_PER_INCH = 0.0254  # exact (1959)
_LEVEL_SLOPE = 0.02  # a beam rising more than 1 in 50 is not a floor beam


class IfcReadError(FieldcompError, ValueError):
    """The model as a whole cannot be read (not IFC, no storey of that name); names the file."""

    def __init__(self, path: str | os.PathLike[str], reason: str):
        super().__init__(f"{path}: {reason}")


@dataclass(frozen=True, slots=True)
class Problem:
    """An element that was not read: its IFC class, GlobalId, name and why."""

    ifc_class: str
    global_id: str
    name: str
    reason: str

    def __str__(self) -> str:
        name = f" '{self.name}'" if self.name else ""
        return f"{self.ifc_class} {self.global_id}{name}: {self.reason}"


@dataclass(slots=True)
class StoreyFraming:
    schema: str
    unit: str  # the project's length unit as read, e.g. "millimetre", "foot"
    level: str
    members: list[Member] = field(default_factory=list)
    posts: list[Post] = field(default_factory=list)
    slabs: list[Outline] = field(default_factory=list)
    problems: list[Problem] = field(default_factory=list)
    notes: dict[str, list[str]] = field(default_factory=dict)  # GlobalId -> how values were read


def open_model(path: str | os.PathLike[str]) -> Any:
    import ifcopenshell

    try:
        data = read_regular(path, MAX_BYTES, "IFC models")
    except FileKindError as exc:
        raise IfcReadError(path, exc.reason) from None
    if not data.lstrip().startswith(b"ISO-10303-21"):
        raise IfcReadError(path, "not an IFC file in the STEP text form (ISO-10303-21); export .ifc, not .ifczip or .ifcxml")
    try:
        return ifcopenshell.file.from_string(data.decode("utf-8", errors="replace"))
    except Exception as exc:
        raise IfcReadError(path, f"not readable as IFC: {exc}") from None


def storey_names(model: Any) -> list[str]:
    """Names of the storeys holding at least one beam, lowest first."""
    storeys = sorted(model.by_type("IfcBuildingStorey"), key=lambda s: s.Elevation or 0.0)
    return [s.Name or s.GlobalId for s in storeys if any(e.is_a("IfcBeam") for e in _contents(s))]


def _contents(storey: Any) -> set[Any]:
    from ifcopenshell.util import element

    return element.get_decomposition(storey)


def read_storey(path: str | os.PathLike[str], model: Any, level: str | None) -> StoreyFraming:
    """The beams, columns and slabs of the storey named `level` (the only storey with beams when
    None). Columns are taken from the whole model (they often belong to the storey below)."""
    import ifcopenshell.util.unit as units

    names = storey_names(model)
    if not names:
        raise IfcReadError(path, "no IfcBuildingStorey holds an IfcBeam")
    if level is None:
        if len(names) > 1:
            raise IfcReadError(path, f"beams on {len(names)} storeys ({', '.join(names)}); choose one with --level NAME")
        level = names[0]
    storey = next((s for s in model.by_type("IfcBuildingStorey") if level in (s.Name, s.GlobalId)), None)
    if storey is None:
        raise IfcReadError(path, f"no storey named {level!r}; storeys with beams: {', '.join(names)}")
    scale = units.calculate_unit_scale(model) / _METRES_PER_INCH  # project length unit -> in
    unit = units.get_project_unit(model, "LENGTHUNIT")
    found = StoreyFraming(model.schema, _unit_name(unit), "".join(ch for ch in level if ch.isprintable())[:60])
    contents = sorted(_contents(storey), key=lambda e: e.GlobalId)
    for element in contents:
        if element.is_a("IfcBeam"):
            _read_beam(element, scale, found)
        elif element.is_a("IfcSlab"):
            _read_slab(element, scale, found)
    for column in sorted(model.by_type("IfcColumn"), key=lambda e: e.GlobalId):
        post = _read_column(column, scale)
        if post is not None:
            found.posts.append(post)
    return found


def _unit_name(unit: Any) -> str:
    if unit is None:
        return "unknown"
    prefix = (getattr(unit, "Prefix", None) or "").lower()
    return f"{prefix}{(unit.Name or '').lower()}" or "unknown"


def _problem(found: StoreyFraming, element: Any, reason: str) -> None:
    found.problems.append(Problem(element.is_a(), element.GlobalId, element.Name or "", reason))


def _note(found: StoreyFraming, element: Any, text: str) -> None:
    found.notes.setdefault(element.GlobalId, []).append(text)


def _placement(element: Any) -> np.ndarray:
    from ifcopenshell.util import placement

    if element.ObjectPlacement is None:
        return np.eye(4)
    return np.asarray(placement.get_local_placement(element.ObjectPlacement), dtype=float)


def _axis_matrix(position: Any) -> np.ndarray:
    from ifcopenshell.util import placement

    return np.eye(4) if position is None else np.asarray(placement.get_axis2placement(position), dtype=float)


def _operator(op: Any) -> np.ndarray:
    """An IfcCartesianTransformationOperator3D as a 4x4 matrix (uniform scale only)."""
    m = np.eye(4)
    x = np.array(op.Axis1.DirectionRatios if op.Axis1 else (1.0, 0.0, 0.0), dtype=float)
    z = np.array(op.Axis3.DirectionRatios if getattr(op, "Axis3", None) else (0.0, 0.0, 1.0), dtype=float)
    x, z = x / np.linalg.norm(x), z / np.linalg.norm(z)
    y = np.cross(z, x)
    m[:3, 0], m[:3, 1], m[:3, 2] = x, y, z
    m[:3, :3] *= op.Scale if op.Scale is not None else 1.0
    m[:3, 3] = (list(op.LocalOrigin.Coordinates) + [0.0])[:3]
    return m


def _solids(element: Any) -> list[tuple[Any, np.ndarray]]:
    """Extruded solids of the body, each with its matrix to the element's placement (mapped
    items, boolean results and clippings unwrapped to their first operand)."""
    out: list[tuple[Any, np.ndarray]] = []
    if element.Representation is None:
        return out
    for rep in element.Representation.Representations:
        if rep.RepresentationIdentifier not in (None, "Body"):
            continue
        stack = [(item, np.eye(4)) for item in rep.Items]
        while stack:
            item, m = stack.pop()
            if item.is_a("IfcExtrudedAreaSolid"):
                out.append((item, m))
            elif item.is_a("IfcBooleanResult"):
                stack.append((item.FirstOperand, m))
            elif item.is_a("IfcMappedItem"):
                source = item.MappingSource
                base = m @ _operator(item.MappingTarget) @ _axis_matrix(source.MappingOrigin)
                stack += [(sub, base) for sub in source.MappedRepresentation.Items]
    return out


def _extrusion_ends(solid: Any, m: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """The two ends of the extrusion of the profile's origin, in the element's coordinates."""
    profile_origin = np.zeros(3)
    position = getattr(solid.SweptArea, "Position", None)
    if position is not None:
        profile_origin[:2] = list(position.Location.Coordinates)[:2]
    d = np.array(solid.ExtrudedDirection.DirectionRatios, dtype=float)
    d = d / np.linalg.norm(d)
    local = m @ _axis_matrix(solid.Position)
    a = local @ np.append(profile_origin, 1.0)
    b = local @ np.append(profile_origin + d * solid.Depth, 1.0)
    return a[:3], b[:3]


def _axis_curve(element: Any) -> tuple[np.ndarray, np.ndarray] | None:
    """Ends of an 'Axis' representation's polyline (IfcPolyline or IfcIndexedPolyCurve)."""
    if element.Representation is None:
        return None
    for rep in element.Representation.Representations:
        if rep.RepresentationIdentifier != "Axis" or not rep.Items:
            continue
        curve = rep.Items[0]
        if curve.is_a("IfcPolyline"):
            points = [list(p.Coordinates) for p in curve.Points]
        elif curve.is_a("IfcIndexedPolyCurve"):
            points = [list(p) for p in curve.Points.CoordList]
        else:
            continue
        a, b = (np.array((p + [0.0, 0.0])[:3], dtype=float) for p in (points[0], points[-1]))
        return a, b
    return None


def _profile(element: Any, solids: list[tuple[Any, np.ndarray]]) -> Any | None:
    """The section profile: the material profile set's (IFC4), else the body extrusion's."""
    import ifcopenshell.util.element as util

    material = util.get_material(element, should_skip_usage=True)
    if material is not None and material.is_a("IfcMaterialProfileSet") and material.MaterialProfiles:
        profile = material.MaterialProfiles[0].Profile
        if profile is not None:
            return profile
    return solids[0][0].SweptArea if solids else None


def _section(profile: Any, scale: float) -> Section:
    while profile.is_a("IfcDerivedProfileDef"):
        profile = profile.ParentProfile
    name = profile.ProfileName or ""
    if profile.is_a("IfcAsymmetricIShapeProfileDef"):
        raise ShapeMatchError(f"profile {name!r} is an asymmetric I section, not a rolled W shape")
    if profile.is_a("IfcIShapeProfileDef"):
        return Section(name, profile.OverallDepth * scale, profile.OverallWidth * scale,
                       profile.WebThickness * scale, profile.FlangeThickness * scale)
    if not name:
        raise ShapeMatchError(f"profile {profile.is_a()} without a name is not an I section")
    return Section(name)


def _read_beam(element: Any, scale: float, found: StoreyFraming) -> None:
    solids = _solids(element)
    profile = _profile(element, solids)
    if profile is None:
        return _problem(found, element, "no profile (no material profile set and no extruded body)")
    try:
        shape, how = match_section(_section(profile, scale))
    except ShapeMatchError as exc:
        return _problem(found, element, str(exc))
    place = _placement(element)
    if solids:
        a, b = _extrusion_ends(*solids[0])
    else:
        ends = _axis_curve(element)
        if ends is None:
            return _problem(found, element, "no axis: neither an extruded body nor an 'Axis' polyline")
        a, b = ends
    a, b = ((place @ np.append(p, 1.0))[:3] * scale for p in (a, b))
    plan = float(np.hypot(*(b - a)[:2]))
    if plan < 1.0 or abs(b[2] - a[2]) > _LEVEL_SLOPE * plan:
        return _problem(found, element, "not a level member (its axis rises more than 1 in 50, or has no plan length)")
    mark = (element.Name or element.Tag or "").strip()
    if not mark:
        return _problem(found, element, "no mark: the beam has neither a Name nor a Tag")
    if len(mark) > 40 or not mark.isprintable():
        return _problem(found, element, "its Name is not a mark of up to 40 printable characters")
    if any(m.mark == mark for m in found.members):
        first = next(m.source_id for m in found.members if m.mark == mark)
        return _problem(found, element, f"mark {mark!r} is also the mark of {first} on this storey")
    if how:
        _note(found, element, how)
    z = float(max(a[2], b[2]))
    found.members.append(Member(element.GlobalId, mark, shape.name, (float(a[0]), float(a[1])),
                                (float(b[0]), float(b[1])), z, shape.d, shape.bf))
    return None


def _read_column(element: Any, scale: float) -> Post | None:
    """A column's centre on plan and the heights it spans; None when its body is not readable
    (it is then no support: beam ends there are reported as bearing on nothing found)."""
    solids = _solids(element)
    if not solids:
        return None
    place = _placement(element)
    a, b = ((place @ np.append(p, 1.0))[:3] * scale for p in _extrusion_ends(*solids[0]))
    profile = solids[0][0].SweptArea
    sizes = [getattr(profile, k, None) for k in ("OverallDepth", "OverallWidth", "XDim", "YDim")]
    radius = getattr(profile, "Radius", None)
    sizes = [s for s in sizes if s] + ([2.0 * radius] if radius else [])
    half = max(sizes) * scale / 2.0 if sizes else 6.0
    return Post(element.GlobalId, (element.Name or element.Tag or element.GlobalId).strip(),
                (float(a[0]), float(a[1])), float(min(a[2], b[2])), float(max(a[2], b[2])), half)


def _read_slab(element: Any, scale: float, found: StoreyFraming) -> None:
    solids = _solids(element)
    if not solids:
        return _problem(found, element, "no extruded body: slab outline and thickness not read")
    solid, m = solids[0]
    place = _placement(element) @ m @ _axis_matrix(solid.Position)
    d = place[:3, :3] @ (np.array(solid.ExtrudedDirection.DirectionRatios, dtype=float) * solid.Depth)
    if abs(d[2]) < 0.99 * np.linalg.norm(d):
        return _problem(found, element, "not extruded vertically: slab thickness not read")
    outline = _outline(solid.SweptArea)
    if outline is None:
        return _problem(found, element, f"outline ({solid.SweptArea.is_a()}) not read: only polylines and rectangles are")
    polygon = tuple((float(p[0]), float(p[1])) for p in
                    ((place @ np.array([x, y, 0.0, 1.0]))[:2] * scale for x, y in outline))
    found.slabs.append(Outline(element.GlobalId, polygon, float(abs(d[2]) * scale)))
    return None


def _outline(profile: Any) -> list[tuple[float, float]] | None:
    """The profile's boundary in the solid's coordinates (its own Position applied)."""
    if profile.is_a("IfcRectangleProfileDef"):
        hx, hy = profile.XDim / 2.0, profile.YDim / 2.0
        points = [(-hx, -hy), (hx, -hy), (hx, hy), (-hx, hy)]
    elif profile.is_a("IfcArbitraryClosedProfileDef") and profile.OuterCurve.is_a("IfcPolyline"):
        points = [tuple(p.Coordinates[:2]) for p in profile.OuterCurve.Points]
    elif profile.is_a("IfcArbitraryClosedProfileDef") and profile.OuterCurve.is_a("IfcIndexedPolyCurve"):
        points = [tuple(p[:2]) for p in profile.OuterCurve.Points.CoordList]
    else:
        return None
    if len(points) > 1 and points[0] == points[-1]:
        points = points[:-1]
    position = getattr(profile, "Position", None)
    m = _axis_matrix(position)
    return [tuple((m @ np.array([x, y, 0.0, 1.0]))[:2]) for x, y in points]

