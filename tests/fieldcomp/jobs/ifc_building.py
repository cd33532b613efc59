"""An invented two-storey steel building written as IFC with ifcopenshell, for the import tests.

Wrenfield Annex: two 30 ft x 36 ft bays on column lines x = 0, 30, 60 ft and y = 0, 36 ft.
Level 2 (14 ft): girders G-1..G-4 along y = 0 and y = 36 between columns, beams B-1, B-4, B-7 on
the column lines x = 0, 30, 60 (column to column), infill beams B-2, B-3 (x = 10, 20 ft) and B-5,
B-6 (x = 40, 50 ft) framing into the girders; a 6 1/4 in slab from (-1 ft, -1 ft) to (61 ft,
37 ft); one plate "PL-1" with a rectangular profile (not a W shape). Beams are modelled as the
steel is cut: clear of the columns' faces and of the girders' webs. Roof (28 ft): girders GR-1,
GR-2 and beams R-1..R-3 on a bare metal deck (no slab in the model).
Dimensions of the W shapes: AISC Shapes Database v16.0 (d, bf, tw, tf)."""

from __future__ import annotations

from dataclasses import dataclass, replace
from pathlib import Path

import ifcopenshell
import ifcopenshell.api.aggregate
import ifcopenshell.api.context
import ifcopenshell.api.owner
import ifcopenshell.api.owner.settings
import ifcopenshell.api.project
import ifcopenshell.api.root
import ifcopenshell.api.spatial
import ifcopenshell.api.unit
from ifcopenshell import api
import ifcopenshell.guid

FT = 12.0  # in per ft
SIZES = {  # d, bf, tw, tf in inches (AISC Shapes Database v16.0)
    "W24X55": (23.6, 7.01, 0.395, 0.505), "W18X35": (17.7, 6.0, 0.3, 0.425), "W16X26": (15.7, 5.5, 0.25, 0.345),
    "W10X49": (10.0, 10.0, 0.34, 0.56), "W21X44": (20.7, 6.5, 0.35, 0.45), "W14X22": (13.7, 5.0, 0.23, 0.335),
}
UNITS = {"mm": 25.4, "m": 0.0254, "ft": 1.0 / 12.0, "in": 1.0}  # model units per inch


@dataclass(frozen=True)
class Piece:
    """One member as modelled: mark, profile name in the model, W shape giving its dimensions,
    steel ends on plan in ft (already cut back), storey, GlobalId (fixed so re-imports match)."""

    mark: str
    profile: str
    shape: str
    start: tuple[float, float]
    end: tuple[float, float]
    level: str
    gid: str


def _gid(n: int) -> str:
    return ifcopenshell.guid.compress(f"{n:032x}")


HALF_COLUMN = 5.0 / FT  # ft: W10X49 half depth, the face a beam is cut back to
CLEAR_WEB = (0.395 / 2 + 0.5) / FT  # ft: infill cut 1/2 in clear of the W24X55 girder web


def level2() -> list[Piece]:
    c, w = HALF_COLUMN, CLEAR_WEB
    pieces = [
        Piece("G-1", "W24X55", "W24X55", (0 + c, 0), (30 - c, 0), "Level 2", _gid(1)),
        Piece("G-2", "W24X55", "W24X55", (30 + c, 0), (60 - c, 0), "Level 2", _gid(2)),
        Piece("G-3", "W24X55", "W24X55", (30 - c, 36), (0 + c, 36), "Level 2", _gid(3)),  # modelled east to west
        Piece("G-4", "W24X55", "W24X55", (30 + c, 36), (60 - c, 36), "Level 2", _gid(4)),
        Piece("B-1", "W16X26", "W16X26", (0, 0 + c), (0, 36 - c), "Level 2", _gid(11)),
        Piece("B-2", "W18X35", "W18X35", (10, 0 + w), (10, 36 - w), "Level 2", _gid(12)),
        Piece("B-3", "W18X35", "W18X35", (20, 36 - w), (20, 0 + w), "Level 2", _gid(13)),  # modelled north to south
        Piece("B-4", "W16X26", "W16X26", (30, 0 + c), (30, 36 - c), "Level 2", _gid(14)),
        Piece("B-5", "W460X52", "W18X35", (40, 0 + w), (40, 36 - w), "Level 2", _gid(15)),  # metric name
        Piece("B-6", "W18X35", "W18X35", (50, 0 + w), (50, 36 - w), "Level 2", _gid(16)),
        Piece("B-7", "W16X26", "W16X26", (60, 0 + c), (60, 36 - c), "Level 2", _gid(17)),
        Piece("PL-1", "PL12X300", "", (61.5, 10), (63.5, 10), "Level 2", _gid(18)),  # a plate: not a W shape
    ]
    roof = [
        Piece("GR-1", "W21X44", "W21X44", (0 + c, 0), (30 - c, 0), "Roof", _gid(31)),
        Piece("GR-2", "W21X44", "W21X44", (0 + c, 36), (30 - c, 36), "Roof", _gid(32)),
        Piece("R-1", "W14X22", "W14X22", (0, 0 + c), (0, 36 - c), "Roof", _gid(33)),
        Piece("R-2", "W14X22", "W14X22", (15, 0 + w), (15, 36 - w), "Roof", _gid(34)),
        Piece("R-3", "W14X22", "W14X22", (30, 0 + c), (30, 36 - c), "Roof", _gid(35)),
    ]
    return pieces + roof


def moved_and_added() -> list[Piece]:
    """Level 2 after a revision: B-3 moved 2 ft east (x = 22 ft) and B-8 added at x = 45 ft."""
    w = CLEAR_WEB
    pieces = [replace(p, start=(22, p.start[1]), end=(22, p.end[1])) if p.mark == "B-3" else p for p in level2()]
    return pieces + [Piece("B-8", "W18X35", "W18X35", (45, 0 + w), (45, 36 - w), "Level 2", _gid(19))]


ELEVATIONS = {"Level 1": 0.0, "Level 2": 14 * FT, "Roof": 28 * FT}  # in
SLAB = 6.25  # in, overall (3 in deck ribs + 3 1/4 in topping)


def write_building(path: Path, schema: str = "IFC4", unit: str = "mm", pieces: list[Piece] | None = None,
                   slab: bool = True, axis_only: tuple[str, ...] = ()) -> Path:
    """Write the building to `path` in `schema` with the project length unit `unit`. Beams named
    in `axis_only` get an 'Axis' polyline and their profile as a material profile set (IFC4)
    instead of an extruded body."""
    k = UNITS[unit]
    f = api.project.create_file(version=schema)
    if schema == "IFC2X3":  # every IfcRoot has an owner history there
        user = f.createIfcPersonAndOrganization(f.createIfcPerson(FamilyName="Tester"),
                                                f.createIfcOrganization(Name="Fieldcomp tests"))
        app = f.createIfcApplication(user.TheOrganization, "0.1", "fieldcomp tests", "fieldcomp-tests")
        ifcopenshell.api.owner.settings.get_user = lambda _f: user
        ifcopenshell.api.owner.settings.get_application = lambda _f: app
    project = api.root.create_entity(f, ifc_class="IfcProject", name="Wrenfield Annex")
    if unit in ("mm", "m"):
        length = f.createIfcSIUnit(None, "LENGTHUNIT", "MILLI" if unit == "mm" else None, "METRE")
    else:
        length = api.unit.add_conversion_based_unit(f, name={"ft": "foot", "in": "inch"}[unit])
    api.unit.assign_unit(f, units=[length])
    model = api.context.add_context(f, context_type="Model")
    body = api.context.add_context(f, context_type="Model", context_identifier="Body", target_view="MODEL_VIEW", parent=model)
    site = api.root.create_entity(f, ifc_class="IfcSite", name="Site")
    building = api.root.create_entity(f, ifc_class="IfcBuilding", name="Wrenfield Annex")
    api.aggregate.assign_object(f, products=[site], relating_object=project)
    api.aggregate.assign_object(f, products=[building], relating_object=site)
    origin = f.createIfcLocalPlacement(None, _axes(f, (0, 0, 0)))
    storeys = {}
    for name, z in ELEVATIONS.items():
        s = api.root.create_entity(f, ifc_class="IfcBuildingStorey", name=name)
        s.Elevation = z * k
        s.ObjectPlacement = f.createIfcLocalPlacement(origin, _axes(f, (0, 0, z * k)))
        api.aggregate.assign_object(f, products=[s], relating_object=building)
        storeys[name] = s
    pieces = level2() if pieces is None else pieces
    for piece in pieces:
        _beam(f, body, storeys[piece.level], piece, k, piece.mark in axis_only)
    columns = [_column(f, body, origin, f"C-{x // 30 + 1}{'AB'[y // 36]}", (x * FT, y * FT), k, 100 + i)
               for i, (x, y) in enumerate((x, y) for x in (0, 30, 60) for y in (0, 36))]
    api.spatial.assign_container(f, products=columns, relating_structure=storeys["Level 1"])
    if slab:
        _slab(f, body, storeys["Level 2"], k)
    f.write(str(path))
    return path


def _axes(f, at, z=(0.0, 0.0, 1.0), x=(1.0, 0.0, 0.0)):
    return f.createIfcAxis2Placement3D(f.createIfcCartesianPoint([float(v) for v in at]),
                                       f.createIfcDirection([float(v) for v in z]), f.createIfcDirection([float(v) for v in x]))


def _i_profile(f, name, shape, k):
    d, bf, tw, tf = SIZES[shape]
    return f.createIfcIShapeProfileDef("AREA", name, f.createIfcAxis2Placement2D(f.createIfcCartesianPoint([0.0, 0.0])),
                                       bf * k, d * k, tw * k, tf * k)


def _beam(f, body, storey, piece: Piece, k: float, axis_only: bool = False) -> None:
    beam = api.root.create_entity(f, ifc_class="IfcBeam", name=piece.mark)
    beam.GlobalId = piece.gid
    (x1, y1), (x2, y2) = ((a * FT, b * FT) for a, b in (piece.start, piece.end))
    length = ((x2 - x1) ** 2 + (y2 - y1) ** 2) ** 0.5
    ux, uy = (x2 - x1) / length, (y2 - y1) / length
    depth = SIZES[piece.shape][0] if piece.shape else 12.0
    z = -SLAB - depth / 2.0  # centroid below the storey's top of slab (top of steel under the slab)
    # local z along the beam, local x horizontal (up x dir), local y up
    beam.ObjectPlacement = f.createIfcLocalPlacement(storey.ObjectPlacement,
                                                     _axes(f, (x1 * k, y1 * k, z * k), (ux, uy, 0.0), (-uy, ux, 0.0)))
    profile = (_i_profile(f, piece.profile, piece.shape, k) if piece.shape else
               f.createIfcRectangleProfileDef("AREA", piece.profile,
                                              f.createIfcAxis2Placement2D(f.createIfcCartesianPoint([0.0, 0.0])),
                                              12.0 * k, 0.5 * k))
    if axis_only:
        ends = [f.createIfcCartesianPoint([0.0, 0.0, 0.0]), f.createIfcCartesianPoint([0.0, 0.0, length * k])]
        axis = f.createIfcShapeRepresentation(body, "Axis", "Curve3D", [f.createIfcPolyline(ends)])
        beam.Representation = f.createIfcProductDefinitionShape(None, None, [axis])
        steel = f.createIfcMaterial("A992")
        usage = f.createIfcMaterialProfileSetUsage(
            f.createIfcMaterialProfileSet(piece.profile, None, [f.createIfcMaterialProfile(piece.profile, None, steel, profile)]))
        f.createIfcRelAssociatesMaterial(ifcopenshell.guid.new(), None, None, None, [beam], usage)
    else:
        solid = f.createIfcExtrudedAreaSolid(profile, _axes(f, (0, 0, 0)), f.createIfcDirection([0.0, 0.0, 1.0]), length * k)
        beam.Representation = _body(f, body, solid)
    api.spatial.assign_container(f, products=[beam], relating_structure=storey)


def _body(f, context, solid):
    return f.createIfcProductDefinitionShape(None, None, [f.createIfcShapeRepresentation(context, "Body", "SweptSolid", [solid])])


def _column(f, body, origin, mark, at, k, n):
    column = api.root.create_entity(f, ifc_class="IfcColumn", name=mark)
    column.GlobalId = _gid(n)
    column.ObjectPlacement = f.createIfcLocalPlacement(origin, _axes(f, (at[0] * k, at[1] * k, 0.0)))
    solid = f.createIfcExtrudedAreaSolid(_i_profile(f, "W10X49", "W10X49", k), _axes(f, (0, 0, 0)),
                                         f.createIfcDirection([0.0, 0.0, 1.0]), ELEVATIONS["Roof"] * k)
    column.Representation = _body(f, body, solid)
    return column


def _slab(f, body, storey, k):
    slab = api.root.create_entity(f, ifc_class="IfcSlab", name="S-2")
    slab.GlobalId = _gid(50)
    slab.ObjectPlacement = f.createIfcLocalPlacement(storey.ObjectPlacement, _axes(f, (0, 0, -SLAB * k)))
    corners = [(-1, -1), (61, -1), (61, 37), (-1, 37), (-1, -1)]
    curve = f.createIfcPolyline([f.createIfcCartesianPoint([x * FT * k, y * FT * k]) for x, y in corners])
    profile = f.createIfcArbitraryClosedProfileDef("AREA", None, curve)
    solid = f.createIfcExtrudedAreaSolid(profile, _axes(f, (0, 0, 0)), f.createIfcDirection([0.0, 0.0, 1.0]), SLAB * k)
    slab.Representation = _body(f, body, solid)
    api.spatial.assign_container(f, products=[slab], relating_structure=storey)
