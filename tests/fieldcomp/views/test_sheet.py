"""Marks sheet: the SVG parses, carries every station and count, is to scale along the beam; text,
CSV and SVG agree; user text is escaped for XML and for spreadsheets; overlays are distinct."""

from __future__ import annotations

import csv
import io
import re
import xml.etree.ElementTree as ET
from dataclasses import replace

import numpy as np
import pytest

from engine.studs.evaluate import evaluate_studs
from engine.studs.design import design_layout
from engine.model.inputs import RibSettings
from engine.studs.sheet_data import Envelope, SheetData, mark_rows, totals
from fieldcomp.views.marks_sheet import CSV_COLUMNS, marks_csv, marks_text
from fieldcomp.views.marks_svg import marks_svg
from fieldcomp.views.marks_svg import X0, X1
from engine.model.units import format_ft_in
from tests.engine.studs.test_layout import beam

NS = {"s": "http://www.w3.org/2000/svg"}
CAUTION = "Results support, and do not replace, the engineer of record."


def sheet_of(b, **kw) -> SheetData:
    placed = design_layout(b)
    r = evaluate_studs(b, placed.layout.groups())
    base = dict(job="Test job", beam=b, date="2025-01-15", layout=placed.layout, caution=CAUTION,
                required_sum_qn=placed.required_sum_qn, checks=placed.checks,
                envelope=Envelope(r.x, r.demand, r.capacity))
    base.update(kw)
    return SheetData(**base)


def texts(el) -> str:
    return " ".join(t.strip() for t in el.itertext() if t.strip())


@pytest.mark.parametrize("orientation", ["perpendicular", "parallel"])
def test_svg_parses_and_carries_every_station_and_count(orientation):
    b = beam(count=22, orientation=orientation)
    sheet = sheet_of(b)
    root = ET.fromstring(marks_svg(sheet))
    assert root.tag.endswith("svg") and root.get("width") == "10in" and root.get("height") == "7.5in"  # landscape
    rows = {int(g.get("data-slot")): texts(g) for g in root.iter("{http://www.w3.org/2000/svg}g")
            if g.get("class") == "mark-row"}
    lay = sheet.layout
    occupied = np.flatnonzero(lay.count > 0)
    assert sorted(rows) == lay.number[occupied].tolist()
    for i in occupied:
        cells = rows[int(lay.number[i])].split(" ")
        assert cells[0] == str(lay.number[i])
        assert format_ft_in(float(lay.x[i])) in rows[int(lay.number[i])]
        assert str(int(lay.count[i])) in cells


def test_strip_is_to_scale_along_the_beam():
    b = beam(count=30, span=300.0)
    root = ET.fromstring(marks_svg(sheet_of(b)))
    marks = [g for g in root.iter("{http://www.w3.org/2000/svg}g") if g.get("class") == "stud-mark"]
    station = np.array([float(g.get("data-station-in")) for g in marks])
    px = np.array([float(re.match(r"translate\(([-\d.]+),", g.get("transform")).group(1)) for g in marks])
    # positions proportional to stations: px = X0 + (X1 - X0) x / span
    assert px == pytest.approx(X0 + (X1 - X0) * station / b.span, abs=1e-3)
    assert station.size == int((design_layout(b).layout.count > 0).sum())


def test_text_csv_and_svg_agree():
    b = beam(count=18)
    sheet = sheet_of(b)
    rows = mark_rows(sheet)
    table = list(csv.DictReader(io.StringIO(marks_csv(sheet))))
    assert tuple(table[0].keys()) == CSV_COLUMNS
    assert [int(r["slot"]) for r in table] == [r.slot for r in rows]
    assert [float(r["station_in"]) for r in table] == pytest.approx([r.x for r in rows])
    assert [int(r["studs"]) for r in table] == [r.studs for r in rows]
    text = marks_text(sheet)
    for r in rows:
        assert re.search(rf"^\s+{r.slot}\s+{re.escape(r.station)}\s+{r.studs}\s", text, re.M)
    assert CAUTION in text and CAUTION in marks_svg(sheet)


@pytest.mark.parametrize("origin, words", [("beam-end", "end of the steel at grid 2"),
                                           ("support", "support centreline (work point) at grid 2")])
def test_station_convention_is_stated_on_every_output(origin, words):
    b = beam(ribs=replace(RibSettings("grid 2", "grid 3", 6.0, 10.0, 0.0), station_origin=origin))
    sheet = sheet_of(b)
    assert words in marks_text(sheet)
    assert words in marks_svg(sheet)
    assert all(words in r["stations_from"] for r in csv.DictReader(io.StringIO(marks_csv(sheet))))


def test_user_text_is_escaped_for_xml_and_spreadsheets():
    hostile = beam(ribs=RibSettings("=HYPERLINK(\"x\")", "@far", 6.0, 10.0, 0.0))
    hostile = replace(hostile, mark="+1<b>&\x07")
    sheet = sheet_of(hostile, job="-2+3 <Job> & \"co\"")
    ET.fromstring(marks_svg(sheet))  # still well-formed XML
    raw = marks_csv(sheet)
    table = list(csv.reader(io.StringIO(raw)))
    for row in table[1:]:
        job, mark, side, half, origin = row[0], row[1], row[8], row[12], row[13]
        assert job.startswith("'-2+3") and mark == "'+1<b>&" and "\x07" not in raw
        assert side[0] not in "=+-@" and half[0] not in "=+-@" and origin[0] not in "=+-@"
    # numbers stay numbers: unquoted numeric cells
    first = raw.splitlines()[1]
    assert re.search(r",\d+,[\d.]+,\"\d+'-[^\"]*\"\"\",\d+,", first)


def test_overlays_draw_lost_and_added_studs_distinctly():
    b = beam(count=16)
    base = sheet_of(b)
    n = base.layout.x.size
    lost, added = np.zeros(n, dtype=int), np.zeros(n, dtype=int)
    occupied = np.flatnonzero(base.layout.count > 0)
    lost[occupied[:3]] = 1
    empty = np.flatnonzero((base.layout.count == 0) & (base.layout.max_count > 0))
    added[empty[:2]] = 1
    env = base.envelope
    sheet = replace(base, title="Stud repair", lost=lost, added=added,
                    envelope=Envelope(env.x, env.demand, 0.9 * env.capacity, env.capacity))
    root = ET.fromstring(marks_svg(sheet))
    strip = [g for g in root.iter("{http://www.w3.org/2000/svg}g") if g.get("class") == "stud-mark"]
    kinds = [k.get("class") for g in strip for k in g]
    assert kinds.count("stud-lost") == 3 and kinds.count("stud-added") == 2
    assert kinds.count("stud-placed") == int(base.layout.count.sum()) - 3
    assert len(root.findall(".//s:polyline", NS)) == 3  # demand, capacity, capacity after
    t = totals(sheet)
    assert sum(t.studs) == int(base.layout.count.sum()) - 3
    text = marks_text(sheet)
    assert "lost" in text and "add" in text


def test_no_envelope_no_plot():
    root = ET.fromstring(marks_svg(sheet_of(beam(), envelope=None)))
    assert root.findall(".//s:polyline", NS) == []
