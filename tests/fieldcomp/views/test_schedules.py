"""Schedule rows: the camber order list gives the length of the piece (work-point span less the
end setback at each end) beside the span; the AISC 303-16 6.4.4 tolerance (+1/2 in up to 50 ft,
plus 1/8 in per 10 ft or fraction beyond) goes with each cambered beam."""

from __future__ import annotations

from dataclasses import replace

from engine.codes.aisc303_16 import camber_tolerance
from engine.construction.camber import CamberDecision
from engine.model.inputs import RibSettings
from fieldcomp.views.schedules import CAMBER_COLUMNS, camber_csv, camber_rows
from tests.engine.studs.test_layout import beam


def test_length_of_the_piece_is_the_span_less_both_setbacks():
    b = beam(span=62 * 12.0, ribs=replace(RibSettings("grid 2", "grid 3", 6.0, 10.0, 0.0), end_setback=3.0))
    # AISC 303-16 6.4.4: 62 ft is 12 ft beyond 50 ft: two started 10 ft steps, 1/2 + 2 x 1/8 = 3/4 in
    assert camber_tolerance(b.span) == 0.75
    (row,) = camber_rows([(b, CamberDecision(1.5, "0.80 x 1.9 in", 1.52, 1.9, camber_tolerance(b.span)))])
    cells = dict(zip(CAMBER_COLUMNS, row))
    assert cells["length"] == "61'-6\"" and cells["length_in"] == 738.0 and cells["span"] == "62'-0\""
    assert cells["camber"] == '1 1/2"' and cells["tolerance"] == '0 to +3/4"' and cells["note"] == ""


def test_a_beam_not_cambered_says_why_and_the_csv_ends_with_the_caution():
    b = beam()
    text = camber_csv([(b, CamberDecision(0.0, "not cambered: spandrel", 0.3, 0.4, 0.0))], "CAUTION TEXT")
    lines = text.splitlines()
    assert lines[0].split(",")[0] == "mark" and lines[-1] == "caution,CAUTION TEXT"
    assert lines[1].endswith(",none,0.0,,0.0,spandrel")
