"""The job's plan fields: per-beam plan coordinates, level, source id, the girders a beam's ends rest on
(left_on / right_on) and the pour zones of a level."""

from importlib.resources import files

import pytest

from fieldcomp.jobs.jobfile import JobFileError, parse_job
from fieldcomp.jobs.model import coordinate_inches

STARTER = files("fieldcomp.jobs").joinpath("starter.toml").read_text(encoding="utf-8")
_AFTER = 'reference_end = "left end"     # e.g. "grid 3"'


def with_beam_lines(lines: str) -> str:
    return STARTER.replace(_AFTER, _AFTER + "\n" + lines)


def test_plan_level_source_and_framing_read_back():
    text = with_beam_lines('level = "Level 2"\nsource_id = "2xQ$n5SLP5MBLyL442paFx"\n'
                           'plan = { x1 = "-6 ft", y1 = "0 in", x2 = "24 ft", y2 = "1.5 m" }')
    text += ('\n[[beam]]\nmark = "B-2"\nshape = "W12X19"\nspan = "10 ft"\nedge_left = "1 ft"\nedge_right = "1 ft"\n'
             'slab = "SLAB-1"\nright_on = { girder = "B-1", at = "10 ft" }\n[beam.studs]\nlength = "5 1/4 in"\ncount = 8\n')
    job = parse_job(text)
    b = job.beam[0]
    assert (b.level, b.source_id) == ("Level 2", "2xQ$n5SLP5MBLyL442paFx")
    assert coordinate_inches(b.plan.x1) == -72.0 and coordinate_inches(b.plan.x2) == 288.0
    assert coordinate_inches(b.plan.y2) == pytest.approx(1500 / 25.4)  # 25.4 mm per inch, exact by definition
    assert job.beam[1].right_on.girder == "B-1" and job.beam[1].right_on.at == "10 ft"
    assert job.beam[1].plan is None and job.beam[1].left_on is None and b.right_on is None


_SECOND = ('\n[[beam]]\nmark = "B-2"\nshape = "W12X19"\nspan = "10 ft"\nedge_left = "1 ft"\nedge_right = "1 ft"\n'
           'slab = "SLAB-1"\n{on}\n[beam.studs]\nlength = "5 1/4 in"\ncount = 8\n')


@pytest.mark.parametrize("first, second, field, message", [
    ('left_on = { girder = "B-1", at = "5 ft" }', "", "beam 'B-1' #1, field 'left_on.girder'", "names the beam itself"),
    ('right_on = { girder = "B-9", at = "5 ft" }', "", "field 'right_on.girder'", "no beam with mark 'B-9'"),
    ('right_on = { girder = "B-2", at = "5 ft" }', 'left_on = { girder = "B-1", at = "2 ft" }',
     "beam 'B-1' #1, field 'right_on.girder'", "itself rests on a girder"),
])
def test_an_end_rests_on_another_beam_of_the_job(first, second, field, message):
    with pytest.raises(JobFileError) as info:
        parse_job(with_beam_lines(first) + _SECOND.format(on=second))
    assert field in str(info.value) and message in str(info.value)


def test_zones_read_back_and_name_their_beams():
    zone = '\n[[zone]]\nname = "pour 1"\ndate = "2026-03-02"\nbeams = ["B-1"]\n'
    job = parse_job(STARTER + zone + '\n[[zone]]\nname = "pour 2"\ndate = "2026-03-05"\n'
                    'outline = [{ x = "0 ft", y = "0 ft" }, { x = "-10 ft", y = "0 ft" }, { x = "0 ft", y = "9 ft" }]\n')
    assert [z.name for z in job.zone] == ["pour 1", "pour 2"] and coordinate_inches(job.zone[1].outline[1].x) == -120.0
    with pytest.raises(JobFileError, match=r"zone 'pour 1' #1, field 'beams\[0\]'.*no beam with mark 'B-7'"):
        parse_job(STARTER + zone.replace('"B-1"', '"B-7"'))
    with pytest.raises(JobFileError, match="already in zone 'pour 1'"):
        parse_job(STARTER + zone + zone.replace("pour 1", "pour 2"))
    with pytest.raises(JobFileError, match="exactly one of beams or outline"):
        parse_job(STARTER + zone.replace('beams = ["B-1"]', ""))


@pytest.mark.parametrize("value", ["6", '"6"', '"--6 ft"'])
def test_a_coordinate_needs_a_unit(value):
    with pytest.raises(JobFileError, match=r"field 'plan\.x1'"):
        parse_job(with_beam_lines(f'plan = {{ x1 = {value}, y1 = "0 in", x2 = "1 ft", y2 = "0 in" }}'))
