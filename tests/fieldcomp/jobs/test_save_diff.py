"""Saves change only what was edited (issue 13): a job opened and saved unedited is the same
bytes, one edited value is one changed line (a line diff, Python's difflib, is the measure), rows
added or removed are blocks added or removed, nothing the file did not say is written; CRLF and
the byte-order mark stay; a job reached through a symbolic link is saved to its target; the .bak
keeps the original's permissions (POSIX stat mode bits)."""

from __future__ import annotations

import difflib
import os
import stat
import tomllib
from importlib.resources import files
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from fieldcomp.jobs.jobfile import dump_job, load_job, parse_job, save_job
from fieldcomp.tui.session import JobSession, field_text

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
BOM = b"\xef\xbb\xbf"  # UTF-8 encoding of U+FEFF (Unicode Standard, ch. 23.8)
STARTER = files("fieldcomp.jobs").joinpath("starter.toml").read_bytes()


def generated() -> bytes:
    """A job written by fieldcomp itself, no comments: the demo's job rendered plainly."""
    return dump_job(load_job(DEMO).job).encode("utf-8")


FORMS = {"demo": DEMO.read_bytes(), "crlf": DEMO.read_bytes().replace(b"\n", b"\r\n"), "bom": BOM + DEMO.read_bytes(),
         "bom+crlf": BOM + DEMO.read_bytes().replace(b"\n", b"\r\n"), "starter": STARTER, "generated": generated()}


def changed(old: bytes, new: bytes) -> list[str]:
    return [line for line in difflib.ndiff(old.decode().splitlines(True), new.decode().splitlines(True))
            if line[:1] in "+-"]


def copy(tmp_path: Path, data: bytes, name: str = "job.toml") -> Path:
    path = tmp_path / name
    path.write_bytes(data)
    return path


def leaves(table, prefix=()):
    """Every key path a TOML document sets (array rows by index)."""
    for key, value in table.items():
        if isinstance(value, dict):
            yield from leaves(value, (*prefix, key))
        elif isinstance(value, list) and value and all(isinstance(v, dict) for v in value):
            for i, row in enumerate(value):
                yield from leaves(row, (*prefix, key, i))
        else:
            yield (*prefix, key)


@pytest.mark.parametrize("form", list(FORMS))
def test_a_job_opened_and_saved_unedited_is_the_same_bytes(tmp_path, form):
    path = copy(tmp_path, FORMS[form])
    session = JobSession.open(path)
    session.save()
    assert path.read_bytes() == FORMS[form]
    assert (tmp_path / "job.toml.bak").read_bytes() == FORMS[form]


@pytest.mark.parametrize("form", ["demo", "crlf", "bom+crlf", "generated"])
@pytest.mark.parametrize("field, typed, line", [
    (("beam", 0, "span"), "31'-6\"", 'span = "31\'-6\\""'),  # the length as typed, ft-in
    (("beam", 1, "studs", "count"), "30", "count = 30"),
    (("beam", 2, "live_psf"), "75", "live_psf = 75"),  # a whole number stays written as one
])
def test_one_edited_value_is_one_changed_line(tmp_path, form, field, typed, line):
    path = copy(tmp_path, FORMS[form])
    session = JobSession.open(path)
    session.set_text(field, typed)
    session.save()
    diff = changed(FORMS[form], path.read_bytes())
    assert len(diff) == 2 and diff[0].startswith("- ") and diff[1].startswith("+ ") and line in diff[1], diff
    assert load_job(path).job == session.job


def test_a_finding_note_edited_is_one_line_and_rows_come_and_go_as_blocks(tmp_path):
    path = copy(tmp_path, FORMS["demo"])
    session = JobSession.open(path)
    rows = [f.model_dump(mode="json", exclude_none=True) for f in session.job.beam[0].finding]
    rows[1]["note"] = "re-tested: broke again"
    session.set_rows(("beam", 0, "finding"), rows, "edit a note")
    session.save()
    assert changed(FORMS["demo"], path.read_bytes()) == ['- note = "broke off in the bend test"\n',
                                                          '+ note = "re-tested: broke again"\n']
    before = path.read_bytes()
    session.set_rows(("beam", 0, "finding"), rows + [{"kind": "added", "rib": 11, "note": "welded on site"}], "add")
    session.save()
    assert changed(before, path.read_bytes()) == ['+ [[beam.finding]]\n', '+ kind = "added"\n', '+ rib = 11\n',
                                                  '+ note = "welded on site"\n']
    added = path.read_text()
    session.remove(("beam", 0, "finding"), 1, "remove the second finding")
    session.save()
    block = '[[beam.finding]]\nkind = "failed-test"\nrib = 9\nnote = "re-tested: broke again"\n'
    assert added.count(block) == 1 and path.read_text() == added.replace(block, "")


def test_nothing_the_file_did_not_say_is_written(tmp_path):
    """The symptom of issue 13: one edit rewrote every beam with every default (5.7 kB to 9.6 kB)."""
    path = copy(tmp_path, FORMS["demo"])
    session = JobSession.open(path)
    for k in range(len(session.job.beam)):
        session.set_text(("beam", k, "superimposed_dead_psf"), "25")
    session.save()
    beams = tomllib.loads(DEMO.read_text())["beam"]
    missing = [k for k, b in enumerate(beams) if "superimposed_dead_psf" not in b]
    assert set(leaves(tomllib.loads(path.read_text()))) == set(leaves(tomllib.loads(DEMO.read_text()))) | {
        ("beam", k, "superimposed_dead_psf") for k in missing}
    assert len(path.read_bytes()) - len(FORMS["demo"]) == len(missing) * len("superimposed_dead_psf = 25\n")
    assert len(changed(FORMS["demo"], path.read_bytes())) == 2 * (len(beams) - len(missing)) + len(missing)


def _with_construction_load(tmp_path: Path) -> Path:
    text = DEMO.read_text().replace('far_end = "grid 3"\n', 'far_end = "grid 3"\nconstruction_load = "light"\n', 1)
    return copy(tmp_path, text.encode())


def test_a_key_the_readme_recommends_stays_loadable_after_an_edit_elsewhere(tmp_path):
    """`construction_load` (README): a default construction_live_psf written beside it made the file refuse it."""
    path = _with_construction_load(tmp_path)
    loaded = load_job(path)
    beams = list(loaded.job.beam)
    beams[1] = beams[1].model_copy(update={"live_psf": 70.0})
    save_job(loaded.job.model_copy(update={"beam": beams}), path, expected_digest=loaded.digest)
    assert changed(path.with_name("job.toml.bak").read_bytes(), path.read_bytes()) == ["- live_psf = 65\n",
                                                                                       "+ live_psf = 70\n"]
    assert load_job(path).job.beam[0].construction_load == "light"


def test_a_workbench_edit_beside_construction_load_saves(tmp_path):
    path = _with_construction_load(tmp_path)
    session = JobSession.open(path)
    session.set_text(("beam", 1, "live_psf"), "70")
    session.save()
    assert changed(path.with_name("job.toml.bak").read_bytes(), path.read_bytes()) == ["- live_psf = 65\n",
                                                                                       "+ live_psf = 70\n"]


def test_an_edit_keeps_whose_rule_each_default_limit_is(tmp_path):
    """An edit elsewhere in a beam leaves its default deflection limits what they were: live
    L/360 building-code (IBC Table 1604.3) and superimposed dead + live L/240 common practice.
    Written in the job they would be project limits; an edit must not write them."""
    from engine.pipeline import evaluate_beam

    path = copy(tmp_path, FORMS["demo"])
    session = JobSession.open(path)
    before = {c.id: c.authority for c in evaluate_beam(session.engine_beams()[0]).checks}
    session.set_text(("beam", 0, "live_psf"), "90")
    after = {c.id: c.authority for c in evaluate_beam(session.engine_beams()[0]).checks}
    deflection = [k for k in before if k.startswith("deflection.")]
    assert deflection and all(after[k] == before[k] for k in deflection)
    assert "project" not in {str(before[k]) for k in deflection}
    session.save()
    assert changed(path.with_name(path.name + ".bak").read_bytes(), path.read_bytes()) == [
        "- live_psf = 100\n", "+ live_psf = 90\n"]


def test_switching_spacing_for_edge_is_one_line_in_place(tmp_path):
    path = copy(tmp_path, FORMS["demo"])
    session = JobSession.open(path)
    session.set_text(("beam", 0, "edge_left"), "2'-0\"")
    session.save()
    assert changed(FORMS["demo"], path.read_bytes()) == ['- spacing_left = "10\'-0\\""\n', '+ edge_left = "2\'-0\\""\n']


def test_a_job_reached_through_a_symlink_is_saved_to_its_target(tmp_path):
    real = copy(tmp_path, FORMS["demo"], "real.toml")
    link = tmp_path / "link.toml"
    link.symlink_to(real)
    session = JobSession.open(link)
    session.set_text(("beam", 0, "live_psf"), "90")
    session.save()
    assert link.is_symlink() and os.readlink(link) == str(real)
    assert "live_psf = 90" in real.read_text() and (tmp_path / "real.toml.bak").read_bytes() == FORMS["demo"]
    assert not (tmp_path / "link.toml.bak").exists()
    assert not session.changed_on_disk()


@pytest.mark.parametrize("mode", [0o600, 0o640, 0o664])
def test_the_bak_keeps_the_originals_permissions(tmp_path, mode):
    path = copy(tmp_path, FORMS["demo"])
    os.chmod(path, mode)
    (tmp_path / "job.toml.bak").write_bytes(b"an older backup")
    os.chmod(tmp_path / "job.toml.bak", 0o644 if mode != 0o644 else 0o600)
    job = load_job(path).job
    save_job(job.model_copy(update={"project": job.project.model_copy(update={"name": "Renamed"})}), path)
    assert stat.S_IMODE(os.stat(tmp_path / "job.toml.bak").st_mode) == mode
    assert stat.S_IMODE(os.stat(path).st_mode) == mode


TYPED = st.sampled_from([(("beam", 0, "live_psf"), "90"), (("beam", 1, "span"), "41'-7\""),
                         (("beam", 2, "studs", "count"), "18"), (("beam", 3, "fy_ksi"), "55"),
                         (("beam", 4, "far_end"), "grid 9"), (("project", "name"), "Level 3 rev B"),
                         (("beam", 5, "studs", "position"), "strong"), (("slab", 0, "fc_ksi"), "5")])


def _in_file(raw, field) -> bool:
    node = raw
    for part in field:
        try:
            node = node[part]
        except (KeyError, IndexError):
            return False
    return True


@settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.too_slow, HealthCheck.function_scoped_fixture])
@given(st.lists(TYPED, min_size=1, max_size=6, unique_by=lambda e: e[0]))
def test_any_set_of_edits_changes_one_line_each(tmp_path, edits):
    """Each edit that changes a value is one replaced line (a '-' and a '+'), or one added line
    for a key the file did not have; an edit to the value the field already had changes nothing."""
    path = copy(tmp_path, FORMS["demo"])
    session = JobSession.open(path)
    raw = tomllib.loads(DEMO.read_text())
    expected = 0
    for field, typed in edits:
        before = field_text(session.job, field)
        session.set_text(field, typed)
        if field_text(session.job, field) != before:
            expected += 2 if _in_file(raw, field) else 1
    text = session.render()
    assert parse_job(text) == session.job
    assert len(changed(FORMS["demo"], text.encode())) == expected
