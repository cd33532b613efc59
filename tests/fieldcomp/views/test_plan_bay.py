"""The bays on the framing plan: the shading, the printed values and the mid-bay call-out come
from the engine's bay solve (views.bay_report), only interpolated for display; the zones are
named with their dates; a job without a bay draws no shading."""

from __future__ import annotations

import io
import re
import xml.etree.ElementTree as ET
from pathlib import Path

import numpy as np
from pypdf import PdfReader

from engine.model.units import format_inches
from engine.pipeline import evaluate_level
from fieldcomp.cli.common import load_inputs
from fieldcomp.cli.main import main
from fieldcomp.jobs.to_engine import level_input
from fieldcomp.views.bay_report import bay_json
from fieldcomp.views.plan_bay import BAND, _strip, bands, grey, plan_bays

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
SVG = "{http://www.w3.org/2000/svg}"


def _demo_json():
    job, beams = load_inputs(str(DEMO))
    return bay_json(evaluate_level(level_input(job, beams)))


def _words(svg: Path) -> str:
    root = ET.fromstring(svg.read_bytes())
    return " ".join(t.text or "" for t in root.iter(SVG + "text"))


def test_the_svg_shades_the_bay_and_prints_the_engines_mid_bay_value(tmp_path):
    main(["plan", str(DEMO), "--svg", str(tmp_path / "p.svg")])
    root = ET.fromstring((tmp_path / "p.svg").read_bytes())
    cells = [p for p in root.iter(SVG + "polygon") if p.get("class") == "bay-cell"]
    bay = _demo_json()["bays"][0]
    assert bay["girder"] == "3G-201" and len(cells) > 20
    mid = format_inches(bay["mid_bay_deflection_in"])
    words = _words(tmp_path / "p.svg")
    assert f"MID-BAY {mid} wet, before camber" in words
    # every printed sag value on the detail is one of the engine's, in sixteenths
    engine_values = {format_inches(p[2]) for m in _demo_json()["plan"] if m["mark"] in (bay["girder"], *bay["beams"])
                     for p in m["plan_points_in"]}
    items = list(root.iter())
    boxed = {items[k + 1].text for k, e in enumerate(items) if e.get("class") == "value-box"}
    assert boxed and boxed <= engine_values
    assert "1 5/16\"" in boxed  # the beams' midspan, 1.29 to 1.32 in from the engine
    # each member's camber label is kept
    assert words.count("no camber PASS") >= 5


def test_the_pdf_names_the_zones_with_dates_and_has_the_grey_legend(tmp_path):
    main(["plan", str(DEMO), "--pdf", str(tmp_path / "p.pdf")])
    reader = PdfReader(io.BytesIO((tmp_path / "p.pdf").read_bytes()))
    text = " ".join(page.extract_text() for page in reader.pages)
    assert len(reader.pages) == 2  # the plan, then the bay of 3G-201 in detail
    assert "POUR 3C  poured 2026-03-02" in text and "POUR 3D  poured 2026-03-05" in text
    assert "WET-CONCRETE DEFLECTION" in text and "1 1/4\" to 1 1/2\"" in text
    assert "deck's own sag" in text


def test_a_job_without_a_bay_draws_no_shading(tmp_path):
    text = DEMO.read_text()
    text = re.sub(r"\n(left|right)_on = [^\n]*", "", text)
    text = re.sub(r"\n# Pour zones.*?(?=\n\[\[beam\]\]|\Z)", "", text, flags=re.S)
    text = re.sub(r"\[\[zone\]\].*?(?=\n\[\[|\Z)", "", text, flags=re.S)
    job = tmp_path / "job.toml"
    job.write_text(text)
    main(["plan", str(job), "--svg", str(tmp_path / "p.svg")])
    svg = (tmp_path / "p.svg").read_text()
    assert "bay-cell" not in svg and "MID-BAY" not in svg and "WET-CONCRETE" not in svg
    assert "3B-107 W18X35" in _words(tmp_path / "p.svg")


def test_between_two_beams_the_field_is_linear():
    # two parallel beams 120 in apart, sag 1.0 in and 2.0 in uniform: the cell centres read the
    # straight line between them (interpolation only, worked by hand: 1 + t)
    a = np.array([[0.0, 0.0, 1.0], [240.0, 0.0, 1.0]])
    b = np.array([[0.0, 120.0, 2.0], [240.0, 120.0, 2.0]])
    cells = _strip(a, b)
    for corners, value in cells:
        y = np.mean([p[1] for p in corners])
        assert abs(value - (1.0 + y / 120.0)) < 1e-9


def test_the_grey_bands_run_light_to_dark_and_cover_the_largest_value():
    bays = plan_bays(_demo_json())
    count = bands(bays)
    top = max(v for b in bays for _, v in b.cells)
    assert (count - 1) * BAND < top <= count * BAND
    levels = [grey(k * BAND, count)[0] for k in range(count)]
    assert levels == sorted(levels, reverse=True) and len(set(levels)) == count


def test_the_bay_sheet_prints_the_girders_loads_and_the_concrete_to_order(tmp_path):
    """The numbers are bay_json's: the girder's derived loads summed over the beams resting on it
    (here wet concrete = four beams' end reactions) and each zone's and the level's concrete."""
    main(["plan", str(DEMO), "--pdf", str(tmp_path / "p.pdf")])
    reader = PdfReader(io.BytesIO((tmp_path / "p.pdf").read_bytes()))
    detail = " ".join(reader.pages[1].extract_text().split())
    data = _demo_json()
    wet = sum(r["wet_concrete_kip"] for r in data["girder_loads"] if r["girder"] == "3G-201")
    assert "GIRDER 3G-201: FROM ITS 4 BEAMS (kip)" in detail and f"wet concrete {wet:.1f}" in detail
    level = data["concrete"][-1]
    assert level["zone"] == "level" and f"level: {level['total_yd3']:.2f} = {level['nominal_yd3']:.2f}" in detail
    assert "pour 3C:" in detail and "pour 3D:" in detail
