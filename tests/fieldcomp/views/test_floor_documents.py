"""The floor's documents (issue 14 items 2-6) made from the demo job through the CLI: every PDF
page rendered to pixels (pypdfium2) and read back as text (pypdf), the plan SVG rendered (resvg)
and parsed, every DXF opened with ezdxf. Check values come from outside the views: the stud
burn-off table of engine.codes.practice (a stud supplier's published allowances, common
practice), AISC 303-16 6.4.4 for the camber tolerance, AISC 360-22 I3.2c.1(d) for deck welds
(the engine's own anchor ribs), and the engine's layouts for counts."""

from __future__ import annotations

import csv
import io
import re
import shutil
import xml.etree.ElementTree as ET
from pathlib import Path

import ezdxf
import pypdf
import pypdfium2
import pytest
import resvg_py
from PIL import Image

from engine.pipeline import erector_sheet
from fieldcomp import CAUTION
from fieldcomp.cli.common import load_inputs
from fieldcomp.cli.main import main

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
JOB = "Harbor Row Lab Building - Level 3"
MARKS = re.findall(r'^mark = "([^"]+)"', DEMO.read_text(), flags=re.M)  # the demo's beams, in job order


@pytest.fixture(scope="module")
def made(tmp_path_factory) -> Path:
    out = tmp_path_factory.mktemp("floor")
    job = out / "job.toml"
    shutil.copyfile(DEMO, job)
    date = ["--date", "2026-12-04", "--revision", "B"]
    runs = [["marks", str(job), "--all", "--pdf", str(out / "es.pdf"), "--dxf", str(out / "dxf"),
             "--schedule", str(out / "ss.pdf"), "--svg", str(out / "svg")] + date,
            ["marks", str(job), "--all", "--schedule", str(out / "ss.csv")],
            ["findings", str(job), "--beam", "3B-103", "--pdf", str(out / "rs.pdf"), "--repair-svg", str(out / "rs.svg")] + date,
            ["camber", str(job), "--pdf", str(out / "cl.pdf"), "--order-csv", str(out / "cl.csv"), "--csv",
             str(out / "cs.csv")] + date,
            ["check", str(job), "--beam", "3B-102", "--pdf", str(out / "cp.pdf")] + date,
            ["plan", str(job), "--svg", str(out / "plan.svg"), "--pdf", str(out / "plan.pdf"), "--level", "Level 3"] + date]
    for argv in runs:
        assert main(argv) in (0, 1, 3), argv
    return out


def pages(path: Path) -> list[str]:
    """Every page rendered (it must show ink, not a blank page) and its text."""
    doc = pypdfium2.PdfDocument(str(path))
    for i in range(len(doc)):
        image = doc[i].render(scale=0.5).to_pil().convert("L")
        dark = sum(image.histogram()[:128])
        assert dark > 0.002 * image.width * image.height, (path.name, i)
    return [p.extract_text() for p in pypdf.PdfReader(str(path)).pages]


def frame(text: str, prefix: str, k: int, n: int) -> None:
    """The title block and the caution of every sheet (issue 14 item 3)."""
    flat = " ".join(text.split())
    for part in (JOB, f"{prefix}-{k} of {n}", "REV.", "B", "2026-12-04", "DRAWN", "CHECKED", "APPROVED"):
        assert part in flat, (prefix, k, part)
    assert " ".join(("CAUTION: " + CAUTION).split()) in flat


def test_erector_booklet_one_page_per_beam_crew_first(made):
    """One sheet per beam, in job order; a beam whose rib table is too long for one sheet goes on
    to a next sheet (it says so), never into another beam's."""
    texts = pages(made / "es.pdf")
    _, beams = load_inputs(str(DEMO))
    assert len(texts) >= len(MARKS)
    firsts = [k for k, text in enumerate(texts) if "DO THIS" in text]
    assert len(firsts) == len(beams)
    for k, text in enumerate(texts, 1):
        frame(text, "ES", k, len(texts))
    for start, beam in zip(firsts, beams):
        flat = " ".join(texts[start].split())
        assert beam.mark in flat
        detail = "SIDE OF THE RIB" if beam.deck_case == "perpendicular" else "WHERE THE STUDS STAND"
        assert flat.index("DO THIS") < flat.index(detail)
        assert "ELEVATION - scale" in " ".join(" ".join(texts[start:start + 2]).split())


def test_camber_order_list_pdf_and_csv(made):
    (text,) = pages(made / "cl.pdf")
    frame(text, "CL", 1, 1)
    rows = list(csv.reader(io.StringIO((made / "cl.csv").read_text())))
    assert rows[0][:7] == ["mark", "shape", "length", "length_in", "span", "span_in", "camber"]
    assert rows[-1][0] == "caution"
    by_mark = {r[0]: r for r in rows[1:-1]}
    assert set(by_mark) == set(MARKS)
    # AISC 303-16 6.4.4: members up to 50 ft: -0 / +1/2 in (3B-102 41'-6", 3B-106 44'-9")
    assert by_mark["3B-102"][6:9] == ['1"', "1.0", '0 to +1/2"'] and by_mark["3B-106"][8] == '0 to +1/2"'
    assert by_mark["3B-103"][6] == "none" and by_mark["3B-103"][10] == "spandrel"
    assert by_mark["3B-102"][2] == by_mark["3B-102"][4] == "41'-6\""  # no end setback in the demo: length = span
    assert next(csv.reader(io.StringIO((made / "cs.csv").read_text())))[0] == "mark"  # header on the first row


def test_stud_schedule_totals_by_diameter_and_length_before_welding(made):
    (text,) = pages(made / "ss.pdf")
    frame(text, "SS", 1, 1)
    rows = list(csv.DictReader(io.StringIO((made / "ss.csv").read_text())))
    beams = [r for r in rows if r["mark"] in MARKS]
    totals = {r["length_before_welding"]: int(r["studs"]) for r in rows if r["mark"] == "total"}
    expect: dict[str, int] = {}
    for r in beams:
        expect[r["length_before_welding"]] = expect.get(r["length_before_welding"], 0) + int(r["studs"])
    assert totals == expect and sum(totals.values()) == sum(int(r["studs"]) for r in beams)
    welds = next(r for r in rows if r["mark"] == "total deck welds")
    assert int(welds["deck_welds"]) == sum(len(r["deck_weld_ribs"].split()) for r in beams)


def test_every_dxf_opens_with_layers_and_entities(made):
    job, beams = load_inputs(str(DEMO))
    files = sorted((made / "dxf").iterdir())
    assert [f.stem for f in files] == sorted(MARKS)
    for beam in beams:
        doc = ezdxf.readfile(made / "dxf" / f"{beam.mark}.dxf")
        assert doc.units == ezdxf.units.IN
        assert {"STEEL", "DECK", "RIBS", "STUDS", "DECK-WELDS", "DIMENSIONS", "TEXT"} <= {layer.dxf.name for layer in doc.layers}
        e = erector_sheet(job.project.name, beam, "2026-12-04", CAUTION)
        msp = doc.modelspace()
        studs = msp.query('LWPOLYLINE[layer=="STUDS"]')
        assert len(studs) == 2 * e.sheet.layout.total  # a stem and a head per stud
        assert len(msp.query('LWPOLYLINE[layer=="DECK-WELDS"]')) == len(e.deck_weld_ribs)
        assert len(msp.query("DIMENSION")) == int((e.sheet.layout.count > 0).sum())
        outline = msp.query('LWPOLYLINE[layer=="STEEL"]')[0]
        xs = [p[0] for p in outline.get_points()]
        assert max(xs) - min(xs) == pytest.approx(beam.span)  # drawn full size in inches
        assert any(CAUTION in t.dxf.text for t in msp.query("TEXT"))


def test_plan_svg_and_pdf(made):
    svg = (made / "plan.svg").read_text()
    root = ET.fromstring(svg.encode())
    words = " ".join(t.text or "" for t in root.iter("{http://www.w3.org/2000/svg}text"))
    for mark in MARKS:
        assert mark in words
    assert "FAIL" in words and "REVIEW" in words and "PASS" in words  # verdict as a word, not only a colour
    for grid in "ABCDEF123456":
        assert f" {grid} " in f" {words} "
    assert "SCALE" in words and " N " in words and CAUTION.split(";")[0] in words
    assert f"JOB {JOB}" in words and "REV. B" in words and "ISSUED 2026-12-04" in words and "APPROVED" in words
    png = bytes(resvg_py.svg_to_bytes(svg_string=svg, dpi=96.0, background="#ffffff"))
    image = Image.open(io.BytesIO(png)).convert("L")
    assert image.size == (1056, 2 * 816)  # 11 x 8.5 in at 96 dpi: the plan, then the bay of 3G-201 in detail
    assert sum(image.histogram()[:128]) > 500
    text, detail = pages(made / "plan.pdf")
    frame(text, "FP", 1, 2)
    frame(detail, "FP", 2, 2)
    assert all(m in text for m in MARKS)


def test_erector_svg_sheets_render_and_put_the_crew_first(made):
    job, beams = load_inputs(str(DEMO))
    for beam in beams:
        svg = (made / "svg" / f"{beam.mark}.svg").read_text()
        png = bytes(resvg_py.svg_to_bytes(svg_string=svg, dpi=96.0, background="#ffffff"))
        image = Image.open(io.BytesIO(png)).convert("L")
        assert sum(image.histogram()[:128]) > 0.002 * image.width * image.height, beam.mark
        root = ET.fromstring(svg.encode())
        words = [t.text or "" for t in root.iter("{http://www.w3.org/2000/svg}text")]
        flat = " ".join(words)
        assert words[0] == "DO THIS" and words[1].startswith(f"BEAM {beam.mark}: ")
        e = erector_sheet(job.project.name, beam, "2026-12-04", CAUTION)
        ratio = beam.span / 8.8  # the elevation's 880 drawing units are 8.8 in of paper
        assert f"(1:{ratio:.0f})" in flat and "SIDE OF THE RIB" in flat and "after welding" in flat.lower()
        assert ("CAMBER" in flat) and ("NOT CAMBERED" in flat) == (e.camber.camber == 0)
        assert "STRENGTH ALONG THE SPAN" not in flat and "AISC 360-22 I3.2a" not in flat  # moved to the package
        assert " ".join(CAUTION.split()[:6]) in flat


def test_a_long_beam_continues_its_table_on_a_next_sheet_and_lists_every_rib(tmp_path):
    job = tmp_path / "long.toml"
    text = DEMO.read_text().replace('span = "44\'-9\\""', 'span = "80\'-0\\""')
    job.write_text(text.replace("count = 40\n[[beam.pour]]", "count = 140\n[[beam.pour]]"))
    assert main(["marks", str(job), "--beam", "3B-106", "--pdf", str(tmp_path / "l.pdf"), "--date", "2026-12-04"]) in (0, 1)
    texts = pages(tmp_path / "l.pdf")
    assert len(texts) == 2 and "3B-106 (continued)" in texts[1]
    assert "THE TABLE CONTINUES ON THE NEXT SHEET" in " ".join(texts[0].split())
    _, (beam,) = load_inputs(str(job), "3B-106")
    e = erector_sheet("j", beam, "2026-12-04", CAUTION)
    stations = [f"{int(x // 12)}'-{int(x % 12)}\"" for x in e.sheet.layout.x[e.sheet.layout.count > 0]]
    both = " ".join(texts)
    assert all(s in both for s in stations)  # ribs at whole inches here: 0'-6", 1'-6" ...
