"""The job's plan fields: per-beam plan coordinates, level, source id and framing (girder relations)."""

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
    framing = '[[beam.framing]]\nmark = "B-2"\nat = "10 ft"\nend = "far-end"\nside = "left"\n\n'
    text = text.replace("[beam.studs]", framing + "[beam.studs]")
    text += ('\n[[beam]]\nmark = "B-2"\nshape = "W12X19"\nspan = "10 ft"\nedge_left = "1 ft"\nedge_right = "1 ft"\n'
             'slab = "SLAB-1"\n[beam.studs]\nlength = "5 1/4 in"\ncount = 8\n')
    job = parse_job(text)
    b = job.beam[0]
    assert (b.level, b.source_id) == ("Level 2", "2xQ$n5SLP5MBLyL442paFx")
    assert coordinate_inches(b.plan.x1) == -72.0 and coordinate_inches(b.plan.x2) == 288.0
    assert coordinate_inches(b.plan.y2) == pytest.approx(1500 / 25.4)  # 25.4 mm per inch, exact by definition
    assert (b.framing[0].mark, b.framing[0].end, b.framing[0].side) == ("B-2", "far-end", "left")
    assert job.beam[1].plan is None and job.beam[1].framing == []


@pytest.mark.parametrize("framing, message", [
    ('{ mark = "B-1", at = "5 ft", end = "far-end" }', "names the beam itself"),
    ('{ mark = "B-9", at = "5 ft", end = "far-end" }', "no beam with mark 'B-9'"),
])
def test_framing_names_another_beam_of_the_job(framing, message):
    with pytest.raises(JobFileError, match=r"field 'framing\[0\]\.mark'") as info:
        parse_job(with_beam_lines(f"framing = [{framing}]"))
    assert message in str(info.value)


@pytest.mark.parametrize("value", ["6", '"6"', '"--6 ft"'])
def test_a_coordinate_needs_a_unit(value):
    with pytest.raises(JobFileError, match=r"field 'plan\.x1'"):
        parse_job(with_beam_lines(f'plan = {{ x1 = {value}, y1 = "0 in", x2 = "1 ft", y2 = "0 in" }}'))
