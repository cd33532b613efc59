"""The crew's repair sheet (engine.pipeline.field_sheet drawn by fieldcomp.views.marks_svg): the
instruction first, each finding kind drawn its own way, the method, the re-test, the engineer of
record's approval block, and never a stud to weld after the pour.

Beam: tests/engine/field/test_field_world.py (one stud in each of 32 ribs as detailed; ribs at
6 + 12 (n - 1) in, so rib 1 is at 0'-6" and rib 3 at 2'-6").
"""

from __future__ import annotations

import xml.etree.ElementTree as ET
from dataclasses import replace

from engine.model.inputs import Finding
from engine.pipeline import field_review, field_sheet
from fieldcomp.views.marks_svg import marks_svg
from tests.engine.field.test_field_world import detailed_beam

KINDS = (Finding("missing", rib=1), Finding("failed-test", rib=2), Finding("awaiting-test", rib=3),
         Finding("short", rib=4), Finding("off-rib", rib=5))


def _svg(found: str) -> tuple[object, str]:
    review = field_review(detailed_beam([replace(f, found=found) for f in KINDS]))
    sheet = field_sheet("T", "2026-12-01", review, "CAUTION TEXT engineer of record")
    return sheet, marks_svg(sheet)


def test_before_the_pour_the_crew_replaces_in_kind_and_re_tests():
    sheet, svg = _svg("before-pour")
    ET.fromstring(svg)
    assert sheet.instructions[0] == "RIB 1 @ 0'-6\": REPLACE 1, THEN RE-TEST"
    assert "RIB 3 @ 2'-6\": REMOVE THE DEFECTIVE STUD AND REPLACE 1, THEN RE-TEST" in sheet.instructions
    assert svg.index("DO THIS") < svg.index("ELEVATION")  # the instruction comes first
    assert "METHOD: arc stud welding" in svg and "RE-TEST:" in svg and "verify against AWS D1.1" in svg
    assert "ENGINEER OF RECORD APPROVAL" in svg and "CAUTION TEXT" in svg
    for legend in ("missing (dashed ring)", "failed test (ring crossed)", "awaiting bend test (ring, ?)",
                   "short (short stem)", "off the rib (head set aside)"):
        assert legend in svg


def test_after_the_pour_the_sheet_never_tells_the_crew_to_weld():
    sheet, svg = _svg("after-pour")
    root = ET.fromstring(svg)
    ns = "{http://www.w3.org/2000/svg}"
    marks = [g for g in root.iter(f"{ns}g") if g.get("class") == "stud-mark"]
    assert marks and not any(c.get("class") == "stud-added" for g in marks for c in g.iter(f"{ns}g"))
    assert sheet.added is not None and int(sheet.added.sum()) == 0
    assert sheet.instructions[0].startswith("AFTER THE POUR: DO NOT WELD")
    assert "REPLACE" not in svg and "METHOD:" not in svg
