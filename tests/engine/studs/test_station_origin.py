"""Station convention (project.station_origin) and the end setback: erector-facing stations are
measured from the end of the steel ("beam-end") or from the support work point ("support")."""

from pathlib import Path

import pytest

from engine.studs.design import design_layout
from engine.studs.sheet_data import SheetData, mark_rows
from engine.model.units import parse_length
from fieldcomp.jobs.jobfile import parse_job
from fieldcomp.jobs.to_engine import to_engine

DEMO = (Path(__file__).resolve().parents[3] / "jobs" / "harbor_row_level3.toml").read_text()


def beam_with(origin: str, setback: str, finding: str = ""):
    text = DEMO.replace('method = "LRFD"', f'method = "LRFD"\nstation_origin = "{origin}"', 1)
    text = text.replace('far_end = "grid 3"', f'far_end = "grid 3"\nend_setback = "{setback}"{finding}', 1)
    return next(b for b in to_engine(parse_job(text)) if b.mark == "3B-101")


def rows(beam):
    lay = design_layout(beam).layout
    return lay, mark_rows(SheetData("job", beam, "2026-12-01", lay, "caution"))


def test_beam_end_stations_subtract_the_setback():
    """Hand check: a rib at x = 6 in from the work point prints 6 - 1/2 = 5 1/2 in from the steel."""
    _, rows_end = rows(beam_with("beam-end", "1/2 in"))
    _, rows_sup = rows(beam_with("support", "1/2 in"))
    assert [r.x for r in rows_end] == [r.x for r in rows_sup]  # same physical layout
    for a, b in zip(rows_end, rows_sup):
        assert parse_length(b.station) - parse_length(a.station) == pytest.approx(0.5, abs=1 / 32)


def test_no_stud_where_there_is_no_steel():
    beam = beam_with("beam-end", "8 in")  # ribs at 6 in (first rib, half pitch) lie beyond the steel end
    lay = design_layout(beam).layout
    assert all(lay.count[(lay.x < 8.0) | (lay.x > beam.span - 8.0)] == 0)


def test_finding_stations_follow_the_printed_convention():
    finding = '\n[[beam.finding]]\nkind = "missing"\nstation = "5 1/2 in"'
    beam = beam_with("beam-end", "1/2 in", finding)
    assert beam.findings[0].station == pytest.approx(6.0)  # engine station: from the work point
    beam = beam_with("support", "1/2 in", finding)
    assert beam.findings[0].station == pytest.approx(5.5)
