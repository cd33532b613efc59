"""Recovery files never strand work (issue 13): one that cannot be written is a warning and the
session goes on; two workbenches on one job keep separate files and the second is told who
holds the job; what a crashed workbench left is offered back, also when the job file is gone;
a recovery file holds what a save would write (the edits only). Locks are POSIX advisory
locks (flock(2)): the system drops them when the holding process ends."""

from __future__ import annotations

import difflib
import errno
import os
import shutil
import subprocess
import sys
from pathlib import Path

from fieldcomp.cli.main import main
from fieldcomp.tui.dialogs import Choice
from fieldcomp.tui.recovery import RecoveryFile, read_recovery, recovered_session, recovery_path
from fieldcomp.tui.session import JobSession
from tests.fieldcomp.tui.test_app import SIZE, make_app, run, settle, type_into

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"


def demo_copy(tmp_path: Path) -> Path:
    path = tmp_path / "demo.toml"
    shutil.copyfile(DEMO, path)
    return path


def edited_session(path: Path) -> JobSession:
    session = JobSession.open(path)
    session.set_text(("beam", 0, "live_psf"), "90")
    return session


def test_a_recovery_file_holds_what_a_save_would_write(tmp_path):
    session = edited_session(demo_copy(tmp_path))
    kept = RecoveryFile(tmp_path / "state", session.path)
    assert kept.write(session.render()) is None
    text = kept.path.read_text()
    diff = [d for d in difflib.ndiff(DEMO.read_text().splitlines(), text.splitlines()) if d[:1] in "+-"]
    assert diff == ["- live_psf = 100", "+ live_psf = 90"]
    session.save()
    assert session.path.read_text() == text
    kept.release()


def test_a_state_folder_that_cannot_be_made_is_a_warning_not_a_stop(tmp_path):
    blocker = tmp_path / "not-a-folder"
    blocker.write_text("a file where the state folder should be")
    kept = RecoveryFile(blocker / "state", demo_copy(tmp_path))
    assert kept.path is None and "unsaved edits cannot be kept" in kept.problem
    assert kept.write("anything") == kept.problem
    kept.discard()
    kept.release()  # both harmless


def test_a_full_disk_is_a_warning_and_the_old_recovery_file_stays_whole(tmp_path, monkeypatch):
    session = edited_session(demo_copy(tmp_path))
    kept = RecoveryFile(tmp_path / "state", session.path)
    assert kept.write(session.render()) is None
    before = kept.path.read_bytes()

    def full(fd):
        raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))
    monkeypatch.setattr("fieldcomp.tui.recovery.os.fsync", full)
    session.set_text(("beam", 0, "live_psf"), "95")
    problem = kept.write(session.render())
    assert problem is not None and "No space left on device" in problem
    assert kept.path.read_bytes() == before and not list((tmp_path / "state").glob(".recover.*.tmp"))
    kept.release()


def test_the_workbench_warns_once_and_goes_on_when_no_recovery_file_can_be_written(tmp_path):
    blocker = tmp_path / "blocker"
    blocker.write_text("")
    path = demo_copy(tmp_path)

    async def flow():
        app = make_app(path, blocker)  # state folder blocker/state: under a file, cannot be made
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            await type_into(pilot, app, "#beam-form #live_psf", "90")
            await type_into(pilot, app, "#beam-form #live_psf", "95")
            warned = [n for n in app._notifications if n.title == "No recovery file"]
            assert len(warned) == 1 and "save often" in warned[0].message
            assert app.is_running and app.session.job.beam[0].live_psf == 95
            app.action_save()
            await settle(pilot, app)
            assert "live_psf = 95" in path.read_text()
    run(flow())


def test_two_workbenches_on_one_job_keep_separate_files_and_the_second_is_told(tmp_path):
    path = demo_copy(tmp_path)
    first = RecoveryFile(tmp_path / "state", path)
    second = RecoveryFile(tmp_path / "state", path)
    assert first.path != second.path and not first.others
    assert [str(h.pid) for h in second.others] == [str(os.getpid())]
    assert second.others[0].host and second.others[0].since
    first.write("first's edits")
    second.write("second's edits")
    assert first.path.read_text() == "first's edits" and second.path.read_text() == "second's edits"
    assert first.leftovers() == [] and second.leftovers() == []  # live workbenches' files are not offered
    first.release()
    second.release()


def test_a_second_process_is_told_who_holds_the_job(tmp_path):
    path = demo_copy(tmp_path)
    mine = RecoveryFile(tmp_path / "state", path)
    code = ("import sys; sys.path.insert(0, sys.argv[1]); from pathlib import Path; "
            "from fieldcomp.tui.recovery import RecoveryFile; "
            "r = RecoveryFile(Path(sys.argv[2]), Path(sys.argv[3])); print(r.others[0].pid, r.path.name)")
    out = subprocess.run([sys.executable, "-c", code, str(ROOT), str(tmp_path / "state"), str(path)],
                         capture_output=True, text=True, check=True).stdout.split()
    assert out[0] == str(os.getpid()) and out[1] != mine.path.name
    mine.release()


def test_the_workbench_tells_the_second_who_has_the_job_open(tmp_path):
    path = demo_copy(tmp_path)
    holder = RecoveryFile(tmp_path / "state", path)

    async def flow():
        app = make_app(path, tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            told = [n.message for n in app._notifications if n.title == "Open elsewhere"]
            assert len(told) == 1 and f"process {os.getpid()}" in told[0]
            await type_into(pilot, app, "#beam-form #live_psf", "90")
            assert app.recovery.path != holder.path and app.recovery.path.exists()
            assert not holder.path.exists()
    run(flow())
    holder.release()


def test_a_crashed_process_leaves_its_edits_to_be_offered(tmp_path):
    path = demo_copy(tmp_path)
    code = ("import os, sys; sys.path.insert(0, sys.argv[1]); from pathlib import Path; "
            "from fieldcomp.tui.recovery import RecoveryFile; from fieldcomp.tui.session import JobSession; "
            "s = JobSession.open(Path(sys.argv[3])); s.set_text(('beam', 0, 'live_psf'), '90'); "
            "RecoveryFile(Path(sys.argv[2]), s.path).write(s.render()); os._exit(9)")  # no clean-up: a crash
    subprocess.run([sys.executable, "-c", code, str(ROOT), str(tmp_path / "state"), str(path)], check=False)
    after = RecoveryFile(tmp_path / "state", path)
    assert after.leftovers() == [recovery_path(tmp_path / "state", path)] and after.path != after.leftovers()[0]
    job, _ = read_recovery(after.leftovers()[0])
    assert job.beam[0].live_psf == 90
    after.release()


def test_a_deleted_jobs_edits_are_offered_when_it_is_opened(tmp_path):
    path = demo_copy(tmp_path)
    crashed = RecoveryFile(tmp_path / "state", path)
    session = edited_session(path)
    crashed.write(session.render())
    crashed.release()  # as a crash would
    path.unlink()
    found = recovered_session(tmp_path / "state", path)
    assert found is not None and found.job == session.job and found.dirty and found.path == path

    async def flow():
        app = make_app_for(found, tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            gone = [n.message for n in app._notifications if n.title == "Job file gone"]
            assert len(gone) == 1 and str(path) in gone[0]
            assert not isinstance(app.screen, Choice)  # what it left is open here, not asked about twice
            assert [p for p in (tmp_path / "state").glob("*.recover.toml")] == [app.recovery.path]
            app.action_save()
            await settle(pilot, app)
        assert path.read_text() == session.render()
        assert not list((tmp_path / "state").glob("*.recover.toml"))
    run(flow())


def make_app_for(session: JobSession, tmp_path: Path):
    from fieldcomp.tui.app import FieldcompApp

    app = FieldcompApp(session, state_dir=tmp_path / "state", theme="light")
    app.animation_level = "none"
    return app


def test_open_on_a_deleted_job_without_edits_kept_still_refuses(tmp_path, monkeypatch, capsys):
    monkeypatch.setenv("FIELDCOMP_STATE_DIR", str(tmp_path / "state"))
    assert main(["open", str(tmp_path / "gone.toml")]) == 2
    assert "gone.toml" in capsys.readouterr().err
