"""The command line: exit codes, JSON keys, errors, start-up hygiene."""

import json
import subprocess
import sys
from pathlib import Path

import pytest

from fieldcomp.cli.main import main

ROOT = Path(__file__).resolve().parents[3]
DEMO = str(ROOT / "jobs" / "harbor_row_level3.toml")

CHECK_KEYS = {
    "mark", "shape", "span_in", "method", "b_eff_in", "qn_per_stud_kips", "sum_qn_kips", "composite_ratio",
    "pna", "phi_mn_kipft", "mn_omega_kipft", "mu_kipft", "ma_kipft", "vu_kips", "phi_vn_kips", "i_lb_in4",
    "live_deflection_in", "verdict", "governing",
}


def test_check_json_has_every_key_for_every_beam(capsys):
    assert main(["check", DEMO, "--json"]) == 3  # none fails; 3B-102: review (cover)
    out = json.loads(capsys.readouterr().out)
    assert out["job"] and out["beams"]
    for beam in out["beams"]:
        assert CHECK_KEYS <= beam.keys(), CHECK_KEYS - beam.keys()
        assert beam["verdict"] in ("pass", "review", "fail")
        assert all({"id", "authority", "level"} <= c.keys() for c in beam["checks"])
        assert beam["pna"] in ("slab", "flange", "web")
        assert {"check", "ratio"} <= beam["governing"].keys()


def test_check_text_report_carries_caution_and_clauses(capsys):
    assert main(["check", DEMO, "--beam", "3B-101"]) == 0
    text = capsys.readouterr().out
    assert "engineer of record" in text and "AISC 360-22" in text and "3B-101" in text


def test_broken_job_exits_2_naming_file_beam_field(tmp_path, capsys):
    bad = tmp_path / "broken.toml"
    bad.write_text(Path(DEMO).read_text().replace('span = "30\'-0\\""', 'span = "30"', 1))
    assert main(["check", str(bad)]) == 2
    err = capsys.readouterr().err
    assert "broken.toml" in err and "3B-101" in err and "'span'" in err


def test_failing_beam_exits_1(tmp_path, capsys):
    weak = tmp_path / "weak.toml"
    weak.write_text(Path(DEMO).read_text().replace("live_psf = 100", "live_psf = 400", 1))
    assert main(["check", str(weak), "--json"]) == 1
    beams = json.loads(capsys.readouterr().out)["beams"]
    assert any(b["verdict"] == "fail" for b in beams)


def test_out_of_scope_concrete_is_refused_with_clause(tmp_path, capsys):
    hot = tmp_path / "hot.toml"
    hot.write_text(Path(DEMO).read_text().replace("fc_ksi = 3.5", "fc_ksi = 7.0", 1))
    assert main(["check", str(hot)]) == 2
    assert "I1.3" in capsys.readouterr().err


def test_unknown_beam_mark(capsys):
    assert main(["check", DEMO, "--beam", "NOPE"]) == 2
    assert "no beam with mark 'NOPE'" in capsys.readouterr().err


def test_shapes_and_new(tmp_path, capsys):
    assert main(["shapes", "W21X5*"]) == 0
    assert "W21X50" in capsys.readouterr().out
    assert main(["shapes", "X*"]) == 2
    target = tmp_path / "starter.toml"
    assert main(["new", str(target)]) == 0
    assert main(["check", str(target)]) in (0, 1)
    assert main(["new", str(target)]) == 2  # never overwrites


def test_help_does_not_import_numpy_pydantic_or_textual():
    code = ("import sys\nfrom fieldcomp.cli.main import main\ntry:\n    main(['--help'])\nexcept SystemExit:\n    pass\n"
            "bad = [m for m in ('numpy', 'pydantic', 'textual', 'engine') if m in sys.modules]\n"
            "print('LOADED=' + ','.join(bad))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True).stdout
    assert out.strip().splitlines()[-1] == "LOADED="


@pytest.mark.parametrize("verb", ["check", "shapes", "new", "schema"])
def test_every_verb_has_help(verb, capsys):
    with pytest.raises(SystemExit) as info:
        main([verb, "--help"])
    assert info.value.code == 0


def test_continuous_beam_is_refused_and_scope_is_stated(tmp_path, capsys):
    cont = tmp_path / "cont.toml"
    cont.write_text(Path(DEMO).read_text().replace('mark = "3B-101"', 'mark = "3B-101"\nsupport = "continuous"', 1))
    assert main(["check", str(cont)]) == 2
    err = capsys.readouterr().err
    assert "3B-101" in err and "'support'" in err and "I3.2b" in err
    assert main(["check", DEMO, "--json"]) == 3  # none fails; 3B-102: review (cover)
    out = json.loads(capsys.readouterr().out)
    assert any("vibration" in item["item"] for item in out["not_checked"])


def test_web_openings_are_flagged_not_checked(tmp_path, capsys):
    holes = tmp_path / "holes.toml"
    holes.write_text(Path(DEMO).read_text().replace('mark = "3B-101"', 'mark = "3B-101"\nweb_openings = true', 1))
    assert main(["check", str(holes), "--beam", "3B-101", "--json"]) == 0
    flags = json.loads(capsys.readouterr().out)["beams"][0]["flags"]
    assert any(f["severity"] == "not-checked" and "Design Guide 2" in f["clause"] for f in flags)
