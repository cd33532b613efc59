"""The workbench's job session without a screen: edits validated by the job-file loader, undo and
redo, the dirty flag, recovery files, saving over a file changed on disk."""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from fieldcomp.jobs.jobfile import ChangedOnDiskError, JobFileError, load_job, parse_job
from fieldcomp.tui.recovery import RecoveryFile, read_recovery, recovery_path
from fieldcomp.tui.session import EditRejectedError, JobSession

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
DEMO_SESSION = JobSession.open(DEMO)

EDITS = st.lists(st.tuples(st.sampled_from([("beam", 0, "live_psf"), ("beam", 1, "span"), ("beam", 2, "studs", "count"),
                                            ("project", "camber", "fraction")]),
                           st.sampled_from(["90", "abc", "36 ft", "41'-6 1/2\"", "20", "-5", "0.7", "design", ""])),
                 max_size=12)


def fresh() -> JobSession:
    s = DEMO_SESSION
    return JobSession(s.job, s.path, s.digest, s.saved, text=s.text)


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(EDITS)
def test_undo_walks_back_every_accepted_edit_and_dirty_follows_the_job(edits):
    s = fresh()
    seen = [s.job]
    for path, text in edits:
        problems = s.check_text(path, text)
        try:
            changed = s.set_text(path, text)
        except EditRejectedError as exc:
            assert exc.problems == problems and problems  # the inline check and the edit agree
            continue
        assert not problems
        if changed:
            seen.append(s.job)
        assert s.dirty == (s.job != s.saved)
    for job in reversed(seen[:-1]):
        s.undo()
        assert s.job == job
    assert s.undo() is None and not s.dirty
    for job in seen[1:]:
        s.redo()
        assert s.job == job


def test_a_rejected_edit_carries_the_loaders_own_message():
    s = fresh()
    with pytest.raises(EditRejectedError) as caught:
        s.set_text(("beam", 0, "span"), "30")
    raw = DEMO.read_text().replace("span = \"30'-0\\\"\"", "span = \"30\"", 1)
    with pytest.raises(JobFileError) as loader:
        parse_job(raw, s.where)
    assert caught.value.problems == loader.value.problems
    assert s.job == DEMO_SESSION.job


def test_setting_a_slab_edge_clears_the_beam_spacing_on_that_side():
    s = fresh()
    assert s.set_text(("beam", 0, "edge_left"), "1'-3\"")
    assert s.job.beam[0].spacing_left is None and s.job.beam[0].edge_left == "1'-3\""


def test_save_keeps_bak_and_refuses_a_file_changed_on_disk(tmp_path):
    path = tmp_path / "job.toml"
    shutil.copyfile(DEMO, path)
    s = JobSession.open(path)
    s.set_text(("beam", 0, "live_psf"), "80")
    s.save()
    assert path.with_name("job.toml.bak").read_bytes() == DEMO.read_bytes()
    assert load_job(path).job == s.job and not s.dirty
    s.set_text(("beam", 0, "live_psf"), "70")
    path.write_text(DEMO.read_text() + "\n# someone else's edit\n")
    assert s.changed_on_disk()
    with pytest.raises(ChangedOnDiskError):
        s.save()
    assert path.read_text().endswith("# someone else's edit\n")
    s.save(overwrite=True)
    assert load_job(path).job == s.job


def test_recovery_file_round_trip(tmp_path):
    s = fresh()
    s.set_text(("beam", 0, "live_psf"), "123")
    kept = RecoveryFile(tmp_path, s.path)
    assert kept.write(s.render()) is None and kept.path == recovery_path(tmp_path, s.path)
    assert read_recovery(kept.path) == (s.job, s.render())
    assert recovery_path(tmp_path, None) != kept.path  # untitled jobs have their own file
    kept.path.write_text("not a job")
    assert read_recovery(kept.path) is None  # a damaged recovery file is not offered
    kept.release()
