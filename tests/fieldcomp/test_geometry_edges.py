"""Geometry the engine cannot compute, and work it should not start, are refused at the job edge
with a clear message (file, deck or beam, field, value, what is allowed), never by an exception
from deep in the engine: a deck rib narrower at the top than at the pan, a stud wider than the rib
bottom, an unbraced length shorter than the station spacing (which once asked for a 30 GB array),
more pour stages than one beam computes."""

from __future__ import annotations

import pytest

from fieldcomp.cli.main import main
from fieldcomp.jobs.jobfile import JobFileError, parse_job
from fieldcomp.jobs.to_engine import STATIONS, to_engine

JOB = """[project]
name = "Geometry"
[[deck]]
id = "D3"
rib_height = "3 in"
rib_top_width = "7 in"
rib_bottom_width = "5 in"
pitch = "12 in"
weight_psf = 2.4
[[slab]]
id = "S"
deck = "D3"
topping = "3 1/4 in"
concrete_pcf = 145
fc_ksi = 4.0
[[beam]]
mark = "B1"
shape = "W18X35"
span = "30 ft"
spacing_left = "10 ft"
spacing_right = "10 ft"
slab = "S"
live_psf = 100
[beam.studs]
length = "5 1/4 in"
count = 26
[[beam.finding]]
kind = "missing"
rib = 2
"""
VERBS = (["check"], ["camber"], ["marks", "--beam", "B1"], ["findings", "--beam", "B1"], ["findings", "--beam", "B1", "--json"])


def run_all(tmp_path, capsys, text: str) -> list[tuple[int, str]]:
    path = tmp_path / "job.toml"
    path.write_text(text)
    out = []
    for verb in VERBS:
        rc = main([verb[0], str(path), *verb[1:]])
        out.append((rc, capsys.readouterr().err))
    return out


def test_a_rib_narrower_at_the_top_is_a_geometry_error_for_every_verb(tmp_path, capsys):
    # top 1 in, pan 5 in: e_mid-ht of a weak-side stud would be negative (AISC 360-22 I8.2a)
    for rc, err in run_all(tmp_path, capsys, JOB.replace('rib_top_width = "7 in"', 'rib_top_width = "1 in"')):
        assert rc == 2
        assert "job.toml: deck 'D3' #1, field 'rib_top_width': 1 in is narrower than rib_bottom_width 5 in" in err
        assert "Traceback" not in err


def test_equal_top_and_bottom_widths_are_a_rectangular_rib_and_compute(tmp_path, capsys):
    text = JOB.replace('rib_top_width = "7 in"', 'rib_top_width = "5 in"')
    assert all(rc in (0, 1) for rc, _ in run_all(tmp_path, capsys, text))


def test_a_stud_wider_than_the_rib_bottom_is_refused(tmp_path, capsys):
    text = JOB.replace('rib_bottom_width = "5 in"', 'rib_bottom_width = "1/2 in"')
    for rc, err in run_all(tmp_path, capsys, text):
        assert rc == 2
        assert "beam 'B1' #1, field 'studs.diameter': a 3/4 in stud does not fit the 1/2\" rib bottom of deck 'D3'" in err


@pytest.mark.parametrize("length", ["0.0001 in", "1/64 in", "0.89 in"])
def test_an_unbraced_length_under_the_station_spacing_is_refused_with_the_minimum_and_why(tmp_path, capsys, length):
    # 30 ft span on the engine's 401 stations: spacing 360 in / 400 = 0.9 in
    text = JOB.replace("live_psf = 100", f'live_psf = 100\nunbraced_length = "{length}"')
    for rc, err in run_all(tmp_path, capsys, text):
        assert rc == 2
        assert (f"beam 'B1' #1, field 'unbraced_length': {length} is shorter than the station spacing 0.9 in "
                "(span / 400) the bare-steel check resolves; give 0 in for a top flange braced continuously") in err


@pytest.mark.parametrize("length", ["0 in", "0.9 in", "7 ft"])
def test_unbraced_lengths_from_the_station_spacing_up_and_zero_compute(length):
    beam = to_engine(parse_job(JOB.replace("live_psf = 100", f'live_psf = 100\nunbraced_length = "{length}"')))[0]
    assert beam.construction.unbraced_length in (0.0, 0.9, 84.0)
    assert STATIONS == beam.n_stations == 401


def test_the_minimum_is_named_in_the_loader_message():
    with pytest.raises(JobFileError, match=r"station spacing 0\.9 in \(span / 400\)"):
        to_engine(parse_job(JOB.replace("live_psf = 100", 'live_psf = 100\nunbraced_length = "0.1 in"')), "j.toml")


def _pours(n: int) -> str:
    stages = [f'[[beam.pour]]\nname = "p{i}"\nstart = "{i} ft"\nend = "{i + 1} ft"\n' for i in range(n - 1)]
    return "".join(stages) + f'[[beam.pour]]\nname = "rest"\nstart = "{n - 1} ft"\n'


def test_more_pour_stages_than_a_beam_computes_are_refused_before_any_work(tmp_path, capsys):
    # 150 stages took about 3 s a beam (the time grows with the square of the count); 20 compute
    for rc, err in run_all(tmp_path, capsys, JOB + _pours(150)):
        assert rc == 2
        assert "beam 'B1' #1, field 'pour': 150 pour stages; at most 20 are computed for one beam" in err
    assert all(rc in (0, 1) for rc, _ in run_all(tmp_path, capsys, JOB + _pours(20)))
