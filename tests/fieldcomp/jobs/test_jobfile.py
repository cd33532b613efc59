"""Job files: loading, errors naming file / beam / field, atomic save with .bak, schema drift."""

import json
from pathlib import Path

import pytest

from fieldcomp.jobs.jobfile import ChangedOnDiskError, JobFileError, dump_job, load_job, parse_job, save_job
from fieldcomp.jobs.schema import job_schema
from fieldcomp.jobs.to_engine import to_engine

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"

MINIMAL = """
[project]
name = "t"
[[deck]]
id = "D"
rib_height = "3 in"
rib_top_width = "7 in"
rib_bottom_width = "5 in"
pitch = "12 in"
weight_psf = 2.4
[[slab]]
id = "S"
deck = "D"
topping = "3 1/4 in"
concrete_pcf = 145
fc_ksi = 4.0
[[beam]]
mark = "B-7"
shape = "W18X35"
span = "30 ft"
spacing_left = "10 ft"
spacing_right = "10 ft"
slab = "S"
[beam.studs]
length = "5 1/4 in"
count = 20
"""


def error_of(text: str, path: str = "job.toml") -> JobFileError:
    with pytest.raises(JobFileError) as info:
        job = parse_job(text, path)
        to_engine(job, path)
    return info.value


def test_demo_and_minimal_load():
    job = load_job(DEMO).job
    assert len(to_engine(job)) >= 6
    assert to_engine(parse_job(MINIMAL))[0].span == 360.0


@pytest.mark.parametrize(
    "old, new, field, words",
    [
        ('span = "30 ft"', 'span = "30"', "'span'", "needs a unit"),
        ('span = "30 ft"', "span = 30", "'span'", "needs a unit"),
        ('count = 20', 'count = "many"', "'studs.count'", ""),
        ('shape = "W18X35"', 'shape = "W18X36"', "'shape'", "W18X35"),
        ('slab = "S"\n[beam', 'slab = "T"\n[beam', "'slab'", "no slab"),
        ('spacing_left = "10 ft"', 'spacing_left = "10 ft"\nedge_left = "1 ft"', "beam 'B-7'", "exactly one"),
        ('fc_ksi = 4.0', 'fc_ksi = -4.0', "field 'fc_ksi'", "greater than 0"),
        ('count = 20', 'count = 20\ncuont = 3', "unknown key 'cuont'", "did you mean 'count'"),
        ('live_psf', 'live_psf', "", ""),
    ],
)
def test_errors_name_file_beam_and_field(old, new, field, words):
    if old == "live_psf":  # point load outside the span
        text = MINIMAL.replace('slab = "S"\n[beam', 'slab = "S"\npoint_loads = [{ at = "31 ft", dead_kips = 1 }]\n[beam')
        field, words = "point_loads[0].at", "not inside the span"
    else:
        text = MINIMAL.replace(old, new, 1)
    msg = str(error_of(text, "trailer/level3.toml"))
    assert "trailer/level3.toml" in msg
    assert field in msg
    assert words in msg
    if "beam" in field or "studs" in field or "span" in field or "shape" in field:
        assert "B-7" in msg


def test_unknown_key_in_deck_names_the_deck():
    msg = str(error_of(MINIMAL.replace("pitch = ", "pich = ")))
    assert "deck 'D'" in msg and "unknown key 'pich'" in msg and "did you mean 'pitch'" in msg


def test_bad_toml_and_missing_tables():
    assert "not valid TOML" in str(error_of("[project\nname = 1"))
    assert "required table 'beam' is missing" in str(error_of('[project]\nname = "x"'))


def test_duplicate_marks_and_unknown_deck():
    text = MINIMAL + MINIMAL[MINIMAL.index("[[beam]]"):]
    assert "duplicate beam mark" in str(error_of(text))
    assert "no deck with id 'E'" in str(error_of(MINIMAL.replace('deck = "D"', 'deck = "E"')))


def test_file_level_errors(tmp_path):
    big = tmp_path / "big.toml"
    big.write_bytes(b"#" * (21 * 1024 * 1024))
    with pytest.raises(JobFileError, match="over 20 MB"):
        load_job(big)
    bad = tmp_path / "bad.toml"
    bad.write_bytes(b"\xff\xfe[project]")
    with pytest.raises(JobFileError, match="not UTF-8"):
        load_job(bad)
    with pytest.raises(JobFileError, match="cannot read"):
        load_job(tmp_path / "nope.toml")


def test_save_is_atomic_keeps_backup_and_round_trips(tmp_path):
    path = tmp_path / "job.toml"
    path.write_text(MINIMAL)
    loaded = load_job(path)
    edited = loaded.job.model_copy(update={"project": loaded.job.project.model_copy(update={"name": "edited"})})
    digest = save_job(edited, path, expected_digest=loaded.digest)
    assert (tmp_path / "job.toml.bak").read_text() == MINIMAL
    again = load_job(path)
    assert again.job == edited and again.digest == digest
    assert not list(tmp_path.glob(".*.tmp"))


def test_save_refuses_when_changed_on_disk(tmp_path):
    path = tmp_path / "job.toml"
    path.write_text(MINIMAL)
    loaded = load_job(path)
    path.write_text(MINIMAL.replace('name = "t"', 'name = "someone else"'))
    with pytest.raises(ChangedOnDiskError):
        save_job(loaded.job, path, expected_digest=loaded.digest)
    assert "someone else" in path.read_text()


def test_dump_round_trips_demo():
    job = load_job(DEMO).job
    assert parse_job(dump_job(job)) == job


def test_committed_schema_matches_models():
    """The JSON Schema shipped for editors must not drift from the models (regenerate with
    `fieldcomp schema > fieldcomp/jobs/job.schema.json`)."""
    committed = json.loads((ROOT / "fieldcomp" / "jobs" / "job.schema.json").read_text())
    assert committed == job_schema()


def test_save_keeps_comments_and_layout_of_untouched_lines(tmp_path):
    path = tmp_path / "demo.toml"
    path.write_text(DEMO.read_text())
    loaded = load_job(path)
    beams = list(loaded.job.beam)
    beams[0] = beams[0].model_copy(update={"span": "31'-0\""})
    save_job(loaded.job.model_copy(update={"beam": beams}), path, expected_digest=loaded.digest)
    text = path.read_text()
    assert "# fieldcomp demo job: an invented building" in text  # file comment kept
    assert "# typical infill beam, lab bay" in text  # table comment kept
    assert "span = \"31'-0\\\"\"" in text
    assert load_job(path).job.beam[0].span == "31'-0\""
    old, new = DEMO.read_text().splitlines(), text.splitlines()
    assert sum(a != b for a, b in zip(old, new)) == 1 and len(old) == len(new)  # one line changed


def test_save_removes_a_deleted_beam_and_adds_a_finding(tmp_path):
    path = tmp_path / "demo.toml"
    path.write_text(DEMO.read_text())
    job = load_job(path).job
    from fieldcomp.jobs.model import FindingIn

    last = job.beam[-1]
    beams = list(job.beam[:-1])
    beams[1] = beams[1].model_copy(update={"finding": [FindingIn(kind="missing", rib=3)]})
    edited = job.model_copy(update={"beam": beams})
    save_job(edited, path)
    again = load_job(path).job
    assert again == edited and last.mark not in path.read_text()
