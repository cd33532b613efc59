"""The storey read from IFC files built in tests/fieldcomp/jobs/ifc_building.py (IFC4 and IFC2x3;
millimetre, metre, foot and inch models). Check values come from how the building is drawn there:
column lines 30 ft apart, girders on y = 0 and 36 ft, beams 10 ft apart, a 6 1/4 in slab 1 ft
past the outer lines, beams cut 5 in short of column centres (half a W10X49's 10.0 in depth,
AISC Shapes Database v16.0) and 0.6975 in clear of the W24X55 girders' axes (tw/2 + 1/2 in)."""

import pytest

from fieldcomp.jobs.floor_geometry import lay_out
from fieldcomp.jobs.floor_job import from_layout
from fieldcomp.jobs.ifc_floor import IfcReadError, open_model, read_storey
from tests.fieldcomp.jobs.ifc_building import Piece, level2, write_building


def read(tmp_path, schema="IFC4", unit="mm", level="Level 2", **kw):
    path = write_building(tmp_path / f"annex-{schema}-{unit}-{len(kw)}.ifc", schema, unit, **kw)
    return read_storey(path, open_model(path), level)


@pytest.mark.parametrize("schema, unit, unit_name", [("IFC4", "mm", "millimetre"), ("IFC2X3", "ft", "foot"),
                                                     ("IFC4", "m", "metre"), ("IFC2X3", "in", "inch")])
def test_every_schema_and_unit_gives_the_same_floor_in_inches(tmp_path, schema, unit, unit_name):
    storey = read(tmp_path, schema, unit)
    assert storey.unit == unit_name and storey.schema == schema
    beams = {b.member.mark: b for b in lay_out(storey.members, storey.posts, storey.slabs)}
    assert sorted(beams) == ["B-1", "B-2", "B-3", "B-4", "B-5", "B-6", "B-7", "G-1", "G-2", "G-3", "G-4"]
    assert beams["B-2"].span == pytest.approx(432.0, abs=1e-6)  # girder axis to girder axis, 36 ft
    assert beams["B-1"].span == pytest.approx(432.0, abs=1e-6)  # column centre to column centre
    assert beams["G-1"].span == pytest.approx(360.0, abs=1e-6)
    assert beams["B-3"].start == pytest.approx((240.0, 0.0))  # modelled north to south: reference end south
    assert beams["B-2"].sides == {"left": ("spacing", pytest.approx(120.0)), "right": ("spacing", pytest.approx(120.0))}
    assert beams["B-7"].sides["right"] == ("edge", pytest.approx(12.0))
    assert [(f.mark, round(f.at, 6)) for f in beams["G-2"].framing] == [("B-5", 120.0), ("B-6", 240.0)]
    assert [s.thickness for s in storey.slabs] == [pytest.approx(6.25)]


def test_an_axis_curve_with_a_material_profile_set_reads_as_the_body_does(tmp_path):
    """IFC4: B-6 and G-4 drawn as an 'Axis' polyline with an IfcMaterialProfileSetUsage give the
    same floor as when drawn with an extruded body."""
    plain = read(tmp_path)
    axis = read(tmp_path, pieces=None, axis_only=("B-6", "G-4"))
    assert axis.problems == plain.problems

    def key(storey):
        return sorted((m.mark, m.shape, *(round(v, 6) for v in (*m.start, *m.end, m.z))) for m in storey.members)

    assert key(axis) == key(plain) and len(key(axis)) == 11


def test_what_cannot_be_read_is_reported_with_its_global_id(tmp_path):
    storey = read(tmp_path)
    [problem] = storey.problems
    assert (problem.ifc_class, problem.name) == ("IfcBeam", "PL-1")
    assert problem.global_id in str(problem) and "not a W shape" in str(problem)
    b5 = next(m for m in storey.members if m.mark == "B-5")
    assert b5.shape == "W18X35" and "matched to W18X35" in storey.notes[b5.source_id][0]


def test_records_carry_work_points_setbacks_and_framing(tmp_path):
    storey = read(tmp_path)
    records, problems = from_layout(lay_out(storey.members, storey.posts, storey.slabs), storey.level, storey.notes)
    assert problems == []
    r = {x.mark: x for x in records}
    assert r["B-2"].values["span"] == "36'-0\"" and r["B-2"].values["end_setback"] == "11/16\""  # 0.6975 in to 1/16
    assert r["G-1"].values["end_setback"] == "5\""
    assert r["B-3"].values["plan"] == {"x1": "20'-0\"", "y1": "0\"", "x2": "20'-0\"", "y2": "36'-0\""}
    assert r["G-3"].girder and not r["B-2"].girder
    # each framing beam's end names its girder and the station along it (left_on / right_on, issue 15)
    assert r["B-2"].values["right_on"] == {"girder": "G-3", "at": "10'-0\""}
    assert r["B-3"].values["right_on"] == {"girder": "G-3", "at": "20'-0\""}
    assert r["B-2"].values["left_on"]["girder"] == "G-1" and "left_on" not in r["G-3"].values
    assert r["B-2"].ends == ("at G-1", "at G-3") and r["B-1"].ends == ("at column C-1A", "at column C-1B")


def test_roof_without_slab_leaves_out_the_outer_members_by_global_id(tmp_path):
    """On the roof (no slab in the model) the members on the outer lines, GR-1, GR-2, R-1 and R-3,
    have no parallel member on their outer side and no slab edge: that spacing cannot be read, so
    they are not written. R-2, between R-1 and R-3, is (15 ft each side)."""
    storey = read(tmp_path, level="Roof")
    records, problems = from_layout(lay_out(storey.members, storey.posts, storey.slabs), storey.level, storey.notes)
    assert [r.mark for r in records] == ["R-2"]
    assert records[0].values["spacing_left"] == records[0].values["spacing_right"] == "15'-0\""
    assert len(problems) == 4 and all("no slab edge found; beam not written" in p for p in problems)
    gids = {m.mark: m.source_id for m in storey.members}
    for mark in ("GR-1", "GR-2", "R-1", "R-3"):
        assert any(f"IfcBeam {gids[mark]} '{mark}'" in p for p in problems)


def test_storey_choice(tmp_path):
    path = write_building(tmp_path / "annex.ifc")
    model = open_model(path)
    with pytest.raises(IfcReadError, match=r"beams on 2 storeys \(Level 2, Roof\); choose one with --level"):
        read_storey(path, model, None)
    with pytest.raises(IfcReadError, match="no storey named 'Level 9'"):
        read_storey(path, model, "Level 9")


def test_not_an_ifc_file(tmp_path):
    bad = tmp_path / "x.ifc"
    bad.write_text("hello")
    with pytest.raises(IfcReadError, match="not an IFC file"):
        open_model(bad)


def test_a_repeated_mark_is_reported_not_renamed(tmp_path):
    extra = Piece("B-2", "W18X35", "W18X35", (5, 0.7 / 12), (5, 36 - 0.7 / 12), "Level 2", "1" * 22)
    storey = read(tmp_path, pieces=[*level2(), extra])
    [problem] = [p for p in storey.problems if p.global_id == "1" * 22]
    assert problem.reason == "mark 'B-2' is also the mark of 000000000000000000000C on this storey"
    assert [m.source_id for m in storey.members if m.mark == "B-2"] == ["000000000000000000000C"]
