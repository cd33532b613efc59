"""Re-import into a job the engineer has edited: only geometry lines change, the engineer's
fields and comments stay, new beams are added, beams gone from the source are kept and reported.
The revision (B-3 moved 2 ft east, B-8 added at x = 45 ft) is drawn in ifc_building.py; the
expected spacings are the new distances between beam lines (10 -> 12 and 8 ft, 10 -> 5 ft)."""

import difflib
import re

import pytest

from fieldcomp.jobs.beam_text import BeamTextError, set_key
from fieldcomp.jobs.floor_geometry import lay_out
from fieldcomp.jobs.floor_job import from_layout
from fieldcomp.jobs.floor_text import Source, job_text
from fieldcomp.jobs.ifc_floor import open_model, read_storey
from fieldcomp.jobs.jobfile import parse_job
from fieldcomp.jobs.reimport import reimport
from tests.fieldcomp.jobs.ifc_building import level2, moved_and_added, write_building


def records(tmp_path, pieces, name):
    path = write_building(tmp_path / name, pieces=pieces)
    storey = read_storey(path, open_model(path), "Level 2")
    recs, problems = from_layout(lay_out(storey.members, storey.posts, storey.slabs), storey.level, storey.notes)
    return recs, Source(str(path), "IFC4 model", "Wrenfield Annex", "Level 2", [], problems,
                        [(s.source_id, s.thickness) for s in storey.slabs])


def edit_beam(text, mark, old, new):
    """Replace `old` by `new` in the [[beam]] block of `mark` only."""
    start = text.index(f'[[beam]]\nmark = "{mark}"')
    end = text.find("\n[[beam]]", start)
    end = len(text) if end < 0 else end
    assert old in text[start:end]
    return text[:start] + text[start:end].replace(old, new, 1) + text[end:]


def engineers_job(tmp_path):
    recs, source = records(tmp_path, level2(), "first.ifc")
    text = job_text(source, recs, None, None)
    text = edit_beam(text, "B-3", 'span = "36\'-0\\""', 'span = "36 ft"  # checked against the drawings, JL')
    text = edit_beam(text, "B-3", "[beam.studs]", '[[beam.pour]]\nname = "east half"\nend = "18 ft"\n\n[beam.studs]')
    text = edit_beam(text, "B-2", 'count = "design"  # TO CONFIRM', "count = 30  # S-201")
    text = edit_beam(text, "B-2", "live_psf = 0.0  # TO CONFIRM", "live_psf = 100.0")
    text += '\n[[beam.finding]]\nkind = "missing"\nrib = 4\n'  # on the last beam, B-7
    text = edit_beam(text, "B-4", 'construction_live_psf = 20.0  # TO CONFIRM',
                     'construction_live_psf = 20.0\ncamber = "none"\nno_camber_reason = "moment-connected"')
    parse_job(text)
    return text


def test_reimport_changes_geometry_lines_only_and_keeps_the_engineers_work(tmp_path):
    before = engineers_job(tmp_path)
    recs, _ = records(tmp_path, moved_and_added(), "revised.ifc")
    result = reimport(before, parse_job(before), recs, "Level 2", None)
    # a beam's end names its girder (left_on / right_on): a moved beam changes its own lines, not the girders'
    assert [c.split(":")[0] for c in result.changed] == ["B-2", "B-3", "B-4", "B-5", "B-6"]
    changed = dict(c.split(": ", 1) for c in result.changed)
    assert changed["B-3"] == ("spacing_left 10'-0\" -> 12'-0\"; spacing_right 10'-0\" -> 8'-0\"; "
                              "plan (20'-0\", 0\") to (20'-0\", 36'-0\") -> (22'-0\", 0\") to (22'-0\", 36'-0\"); "
                              "left_on on G-1 at 20'-0\" -> on G-1 at 22'-0\"; right_on on G-3 at 20'-0\" -> on G-3 at 22'-0\"")
    assert changed["B-5"] == "spacing_right 10'-0\" -> 5'-0\""
    assert result.added == ["B-8: W18X35, span 36'-0\""] and result.gone == [] and result.unchanged == 6
    after = parse_job(result.text)
    beams = {b.mark: b for b in after.beam}
    assert beams["B-3"].pour[0].name == "east half" and beams["B-3"].span == "36 ft"
    assert beams["B-2"].studs.count == 30 and beams["B-2"].live_psf == 100.0
    assert beams["B-4"].camber == "none" and beams["B-7"].finding[0].rib == 4
    assert (beams["B-8"].left_on.girder, beams["B-8"].left_on.at) == ("G-2", "15'-0\"")  # the new beam rests on G-2
    assert (beams["B-8"].right_on.girder, beams["B-8"].right_on.at) == ("G-4", "15'-0\"")
    assert 'span = "36 ft"  # checked against the drawings, JL' in result.text
    geometry = re.compile(r'^(spacing_(left|right)|plan|left_on|right_on) = |^$')
    removed = [line[2:] for line in difflib.ndiff(before.splitlines(), result.text.splitlines()) if line.startswith("- ")]
    assert removed and all(geometry.match(line) for line in removed), removed


def test_reimport_of_the_same_source_changes_nothing(tmp_path):
    before = engineers_job(tmp_path)
    recs, _ = records(tmp_path, level2(), "again.ifc")
    result = reimport(before, parse_job(before), recs, "Level 2", None)
    assert (result.changed, result.added, result.gone, result.text) == ([], [], [], before)


def test_a_beam_gone_from_the_source_is_reported_and_kept(tmp_path):
    before = engineers_job(tmp_path)
    recs, _ = records(tmp_path, [p for p in level2() if p.mark != "B-6"], "less.ifc")
    result = reimport(before, parse_job(before), recs, "Level 2", None)
    assert result.gone == ["B-6 (000000000000000000000G): no longer in the source; kept, with all its fields"]
    beams = {b.mark: b for b in parse_job(result.text).beam}
    assert "B-6" in beams and beams["B-6"].left_on.girder == "G-2"  # kept as it was, its bearings too


def test_a_side_that_became_a_slab_edge_swaps_its_key(tmp_path):
    before = edit_beam(engineers_job(tmp_path), "B-1", 'edge_left = "1\'-0\\""', 'spacing_left = "12 in"')
    recs, _ = records(tmp_path, level2(), "edge.ifc")
    result = reimport(before, parse_job(before), recs, "Level 2", None)
    assert result.changed == ["B-1: spacing_left 12 in -> edge_left 1'-0\""]
    b1 = next(b for b in parse_job(result.text).beam if b.mark == "B-1")
    assert (b1.spacing_left, b1.edge_left) == (None, "1'-0\"")


def test_set_key_keeps_the_comment_and_refuses_a_value_over_lines():
    block = ['[[beam]]\n', 'mark = "B-1"\n', 'span = "30 ft"   # per S-201\n', 'slab = "S"\n']
    set_key(block, "span", "31'-0\"")
    assert block[2] == 'span = "31\'-0\\""   # per S-201\n'
    set_key(block, "level", "Level 2")
    assert block[-1] == 'level = "Level 2"\n'
    with pytest.raises(BeamTextError, match="more than one line"):
        set_key(['[[beam]]\n', 'plan = { x1 = "0 in",\n', '  y1 = "0 in" }\n'], "plan", {"x1": "1 in"})


def test_a_slab_of_another_thickness_is_reported_not_written(tmp_path):
    """The job's slab: 3 1/4 in topping on 3 in ribs = 6 1/4 in overall; a source slab of 6 1/2 in is
    reported (its topping depends on the deck, which is the engineer's)."""
    before = engineers_job(tmp_path)
    recs, _ = records(tmp_path, level2(), "same.ifc")
    result = reimport(before, parse_job(before), recs, "Level 2", None, None, (("S-9", 6.5), ("S-2", 6.25)))
    assert result.slabs == ["slab S-9: 6 1/2\" overall in the source; no slab of the job is (SLAB-1 6 1/4\"): "
                            "not changed, edit its topping if the slab changed"]
    assert result.text == before
