"""`fieldcomp camber` and the construction keys of `fieldcomp check --json`: keys on the demo job,
stage deflections adding up, CSV escaping, job-file errors for construction fields."""

import csv
import json
from pathlib import Path

import pytest

from fieldcomp.cli.main import main
from fieldcomp.jobs.jobfile import JobFileError, parse_job
from fieldcomp.jobs.to_engine import to_engine

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"

CAMBER_KEYS = {
    "mark", "wet_deflection_in", "construction_live_deflection_in", "ponding_extra_psf", "camber_in",
    "camber_reason", "bare_phi_mn_kipft", "construction_mu_kipft", "stages", "camber_outcomes",
    "wet_deflection_no_ponding_in", "camber_tolerance_in", "construction_verdict",
}


def camber_json(capsys, *args):
    code = main(["camber", str(DEMO), "--json", *args])
    return code, json.loads(capsys.readouterr().out)


def test_camber_json_has_every_key_for_every_beam(capsys):
    code, out = camber_json(capsys)
    assert code == 3 and "engineer of record" in out["caution"]  # 3B-102 needs review
    marks = [b.mark for b in parse_job(DEMO.read_text()).beam]
    assert [b["mark"] for b in out["beams"]] == marks
    for beam in out["beams"]:
        assert CAMBER_KEYS <= beam.keys(), CAMBER_KEYS - beam.keys()
        assert beam["stages"] and all("midspan_deflection_in" in st for st in beam["stages"])
        assert beam["camber_in"] <= beam["wet_deflection_in"]
        if beam["camber_in"] == 0:
            assert beam["camber_reason"].startswith("not cambered")


def test_demo_stages_add_up_to_the_final_deflection(capsys):
    _, out = camber_json(capsys)
    staged = [b for b in out["beams"] if sum(st["kind"] == "pour" for st in b["stages"]) >= 2]
    assert len(staged) >= 2  # the demo shows a pour break and a side-by-side placement
    assert any(b["screed"] == "level" for b in out["beams"])
    for b in out["beams"]:
        total = sum(st["midspan_deflection_in"] for st in b["stages"])
        assert total == pytest.approx(b["wet_deflection_in"], abs=5e-4)
        assert b["stages"][-1]["cumulative_midspan_in"] == pytest.approx(b["wet_deflection_in"], abs=1e-4)
    for b in staged:  # later stages on cured concrete deflect no more than on the bare steel
        assert all(st["midspan_deflection_cured_in"] <= st["midspan_deflection_in"] + 1e-9 for st in b["stages"])


def test_camber_text_carries_caution_and_sources(capsys):
    assert main(["camber", str(DEMO), "--beam", "3B-102"]) == 3  # none fails; 3B-102: review (cover)
    text = capsys.readouterr().out
    assert text.count("engineer of record") >= 2 and "AISC 303 6.4.4" in text and "3B-102" in text
    assert "3B-101" not in text


def test_check_json_gains_the_construction_keys(capsys):
    assert main(["check", str(DEMO), "--json"]) == 3  # none fails; 3B-102: review (cover)
    for beam in json.loads(capsys.readouterr().out)["beams"]:
        assert CAMBER_KEYS <= beam.keys()
        assert beam["finished_verdict"] == "pass"
        assert beam["verdict"] == ("review" if beam["mark"] == "3B-102" else "pass")
        assert beam["checks"] and beam["construction_checks"]


def test_check_text_has_construction_lines(capsys):
    assert main(["check", str(DEMO), "--beam", "3B-106"]) == 0
    text = capsys.readouterr().out
    assert "construction verdict: PASS" in text and "bay B-C" in text


def risky_job(tmp_path: Path) -> Path:
    text = DEMO.read_text().replace('mark = "3B-103"', 'mark = "=HYPERLINK(1)"', 1)
    text = text.replace('no_camber_reason = "spandrel"', 'no_camber_reason = "+cmd"', 1)
    path = tmp_path / "risky.toml"
    path.write_text(text)
    return path


def test_csv_escapes_user_text_and_keeps_numbers(tmp_path, capsys):
    out = tmp_path / "camber.csv"
    assert main(["camber", str(risky_job(tmp_path)), "--csv", str(out)]) in (0, 3)  # no beam fails
    assert "wrote" in capsys.readouterr().out
    rows = list(csv.reader(out.open(newline="")))
    assert rows[-1][0] == "caution" and "engineer of record" in rows[-1][1]  # header first, caution last
    header = rows[0]
    by_mark = {r[0]: dict(zip(header, r)) for r in rows[1:-1]}
    risky = by_mark["'=HYPERLINK(1)"]  # formula injection escaped (a cell opening with = + - @ is a spreadsheet formula)
    assert risky["camber_reason"] == "not cambered: +cmd"  # does not start with a formula character
    assert float(by_mark["3B-102"]["camber_in"]) == 1.0 and by_mark["3B-102"]["camber_in"] == "1.0"
    assert not any(cell.startswith(("=", "+", "@")) for row in rows for cell in row)


def test_csv_reason_starting_with_a_formula_character_is_escaped(tmp_path):
    from fieldcomp.views.csv_safety import csv_cell

    assert csv_cell("-2 in") == "'-2 in" and csv_cell("@x") == "'@x" and csv_cell("ok") == "ok"
    assert csv_cell("\x00=cmd") == "'=cmd"  # a control character cannot hide the formula


@pytest.mark.parametrize("old, new, field", [
    ('mark = "3B-101"', 'mark = "3B-101"\nconstruction_load = "medium"\nconstruction_live_psf = 30', "construction_load"),
    ('name = "pour 3B"\nstart = "24\'-0\\""', 'name = "pour 3B"\nstart = "26\'-0\\""', "pour"),
])
def test_construction_field_errors_name_beam_and_field(tmp_path, capsys, old, new, field):
    bad = tmp_path / "bad.toml"
    text = DEMO.read_text()
    assert old in text
    bad.write_text(text.replace(old, new, 1))
    assert main(["camber", str(bad)]) == 2
    err = capsys.readouterr().err
    assert "bad.toml" in err and field in err


def test_construction_load_class_sets_the_live_load():
    text = DEMO.read_text().replace('mark = "3B-101"', 'mark = "3B-101"\nconstruction_load = "medium"', 1)
    beams = to_engine(parse_job(text))
    assert beams[0].construction.live_psf == 50.0  # ASCE/SEI 37-14 Table 4-1 medium (from memory)
    assert to_engine(parse_job(DEMO.read_text()))[0].construction.live_psf == 25.0  # default: light class
    with pytest.raises(JobFileError, match="not both"):
        parse_job(text.replace('construction_load = "medium"', 'construction_load = "medium"\nconstruction_live_psf = 20'))


def test_construction_factors_and_limits_reach_the_engine():
    text = DEMO.read_text().replace('reference_end = "grid 2"', 'reference_end = "grid 2"\n'
                                    'construction_factors = [{ dead = 1.3, live = 1.5 }]\n'
                                    'construction_limits = { dead_ratio = 240, live_ratio = 360 }', 1)
    spec = to_engine(parse_job(text))[0].construction
    assert spec.combinations == ((1.3, 1.5),)
    assert (spec.dead_limit_ratio, spec.dead_limit_max, spec.live_limit_ratio) == (240.0, 1.0, 360.0)
