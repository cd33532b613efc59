"""Workbench flows, headless (App.run_test): edit and see the panes follow, findings and repair,
save / reopen, the unsaved-edits guard, recovery after a crash, a file changed on disk.

Expected engineering values are not asserted here (the engine's own tests carry their sources);
these tests check that the workbench shows what the engine returns for the edited job.
"""

from __future__ import annotations

import asyncio
import shutil
from pathlib import Path

from textual.widgets import Input, Static

from engine.construction.evaluate import evaluate_construction
from fieldcomp.tui.app import RECOVERY_DELAY, FieldcompApp
from fieldcomp.jobs.jobfile import load_job, parse_job
from fieldcomp.tui.dialogs import Choice
from fieldcomp.tui.screens.help import HelpScreen
from fieldcomp.tui.recovery import recovery_path
from fieldcomp.tui.session import JobSession
from fieldcomp.tui.widgets.field_form import CHECK_DELAY
from fieldcomp.jobs.to_engine import to_engine

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
SIZE = (170, 48)


def demo_copy(tmp_path: Path) -> Path:
    target = tmp_path / "demo.toml"
    shutil.copyfile(DEMO, target)
    return target


def make_app(path: Path, tmp_path: Path) -> FieldcompApp:
    app = FieldcompApp(JobSession.open(path), state_dir=tmp_path / "state", theme="light")
    app.animation_level = "none"
    return app


async def settle(pilot, app: FieldcompApp) -> None:
    """Wait until every worker (recompute, repair, recovery file) has finished and the screen
    has caught up."""
    for _ in range(3):
        await app.workers.wait_for_complete()
        await pilot.pause()


async def type_into(pilot, app: FieldcompApp, selector: str, text: str) -> Input:
    """Enter `text` in a field (as pasted: one change event) and press Enter."""
    field = app.workbench.query_one(selector, Input)
    field.focus()
    field.value = text
    await pilot.press("enter")
    await settle(pilot, app)
    return field


def rib_that_fails(outcome) -> int:
    """A rib where one more missing stud makes the beam fail as built (found with the engine)."""
    from engine.field.as_built import evaluate_as_built
    from engine.model.inputs import Finding

    beam, designed = outcome.beam, outcome.layout.value.layout
    for rib in designed.number[designed.count > 0]:
        trial = beam.findings + (Finding("missing", rib=int(rib)),)
        try:
            if evaluate_as_built(beam, designed, trial).verdict == "fail":
                return int(rib)
        except ValueError:  # the rib's studs are already accounted for
            continue
    raise AssertionError("no single missing stud fails this beam")


def run(coro) -> None:
    asyncio.run(coro)


def test_change_span_and_the_camber_follows(tmp_path):
    async def flow():
        app = make_app(demo_copy(tmp_path), tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            before = app.outcomes[0].construction.value.camber
            assert before.camber == 0.0  # the demo's 30 ft infill beam is not cambered
            await type_into(pilot, app, "#beam-form #span", "36 ft 6 in")
            assert app.session.job.beam[0].span == "36 ft 6 in"
            after = app.outcomes[0].construction.value.camber
            # the engine's own decision for the edited beam, computed independently of the app
            expected = evaluate_construction(to_engine(app.session.job)[0]).camber
            assert after == expected and after.camber > 0.0
            app.workbench.action_pane("camber")
            await settle(pilot, app)
            head = str(app.workbench.query_one("#camber-head", Static).render())
            assert "order camber" in head
            assert app.session.dirty and "[modified]" in app.sub_title
    run(flow())


def test_units_as_typed_and_inline_loader_messages(tmp_path):
    async def flow():
        app = make_app(demo_copy(tmp_path), tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            field = app.workbench.query_one("#beam-form #span", Input)
            field.focus()
            field.value = ""
            await pilot.press(*"32 6")
            await pilot.pause(CHECK_DELAY * 2)  # the check runs a moment after the last key
            assert field.has_class("-invalid")
            shown = str(app.workbench.query_one("#beam-form .form--problem", Static).render())
            raw = DEMO.read_text().replace("span = \"30'-0\\\"\"", "span = \"32 6\"", 1)
            try:
                parse_job(raw, app.session.where)
            except ValueError as exc:
                loader = exc.problems[0]
            assert shown == f"{loader[0]}: {loader[1]}"
            await pilot.press("enter")
            await settle(pilot, app)
            assert app.session.job.beam[0].span == "30'-0\""  # refused: the job is unchanged
            await type_into(pilot, app, "#beam-form #span", "32'-6 1/2\"")
            assert app.session.job.beam[0].span == "32'-6 1/2\""
            assert not field.has_class("-invalid")
    run(flow())


def test_undo_and_redo_the_last_edits(tmp_path):
    async def flow():
        app = make_app(demo_copy(tmp_path), tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            original = app.session.job
            await type_into(pilot, app, "#beam-form #live_psf", "150")
            await type_into(pilot, app, "#beam-form #studs-count", "20")
            assert app.session.job.beam[0].studs.count == 20
            await pilot.press("ctrl+z")
            await settle(pilot, app)
            assert app.session.job.beam[0].studs.count == 26
            assert app.workbench.query_one("#beam-form #studs-count", Input).value == "26"
            await pilot.press("ctrl+z")
            await settle(pilot, app)
            assert app.session.job == original and not app.session.dirty
            await pilot.press("ctrl+y")
            await settle(pilot, app)
            assert app.session.job.beam[0].live_psf == 150
    run(flow())


def test_add_a_finding_flips_the_verdict_and_a_repair_appears(tmp_path):
    async def flow():
        app = make_app(demo_copy(tmp_path), tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            assert app.outcomes[0].as_built.value.verdict == "pass"  # 3B-101: accepted as built
            before = len(app.session.job.beam[0].finding)
            app.workbench.action_pane("findings")
            await settle(pilot, app)
            await pilot.click("#finding-add")
            await settle(pilot, app)
            assert len(app.session.job.beam[0].finding) == before + 1
            await type_into(pilot, app, "#finding-form #finding-rib", str(rib_that_fails(app.outcomes[0])))
            outcome = app.outcomes[0]
            assert outcome.as_built.value.verdict == "fail" and outcome.verdict == "fail"
            repair = outcome.repair.value
            assert repair is not None and repair.total >= 1 and repair.after.verdict == "pass"
            text = str(app.workbench.query_one("#findings-repair", Static).render())
            assert f"add {repair.total} stud(s)" in text
            row = app.workbench.query_one("#beams").row_cells(0)
            assert row[0] == "3B-101" and row[3].startswith("fail")  # the as-built column
    run(flow())


def test_save_then_reopen_gives_an_equal_job(tmp_path):
    async def flow():
        path = demo_copy(tmp_path)
        app = make_app(path, tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            await type_into(pilot, app, "#beam-form #live_psf", "125")
            await pilot.press("ctrl+s")
            await settle(pilot, app)
            assert not app.session.dirty
            assert path.with_name("demo.toml.bak").read_bytes() == DEMO.read_bytes()
            assert load_job(path).job == app.session.job
            edited = app.session.job
            await pilot.press("f5")
            await settle(pilot, app)
            assert app.session.job == edited and not app.session.dirty
    run(flow())


def test_quit_with_unsaved_edits_asks_first(tmp_path):
    async def flow():
        app = make_app(demo_copy(tmp_path), tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            await type_into(pilot, app, "#beam-form #live_psf", "90")
            await pilot.press("ctrl+q")
            await pilot.pause()
            assert isinstance(app.screen, Choice) and app.screen.id == "unsaved"
            await pilot.press("escape")
            await pilot.pause()
            assert app.is_running and not isinstance(app.screen, Choice)
            await pilot.press("ctrl+q")
            await pilot.pause()
            await pilot.click("#discard")
            await pilot.pause()
            assert not app.is_running
        assert not list((tmp_path / "state").glob("*.recover.toml"))
    run(flow())


def test_a_recovery_file_is_offered_after_a_crash(tmp_path):
    async def flow():
        path = demo_copy(tmp_path)
        first = make_app(path, tmp_path)
        async with first.run_test(size=SIZE) as pilot:
            await settle(pilot, first)
            await type_into(pilot, first, "#beam-form #superimposed_dead_psf", "45")
            edited = first.session.job
            await pilot.pause(RECOVERY_DELAY + 0.3)  # written once the edits pause
            await settle(pilot, first)
            assert recovery_path(tmp_path / "state", path).exists()
            first.exit()  # a crash: the unsaved-edits guard never runs
        assert load_job(path).job != edited
        second = make_app(path, tmp_path)
        async with second.run_test(size=SIZE) as pilot:
            await settle(pilot, second)
            assert isinstance(second.screen, Choice) and second.screen.id == "recovery"
            await pilot.click("#restore")
            await settle(pilot, second)
            assert second.session.job == edited and second.session.dirty
            assert second.workbench.query_one("#beam-form #superimposed_dead_psf", Input).value == "45"
    run(flow())


def test_a_file_changed_on_disk_is_not_overwritten_without_asking(tmp_path):
    async def flow():
        path = demo_copy(tmp_path)
        app = make_app(path, tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            await type_into(pilot, app, "#beam-form #live_psf", "80")
            theirs = DEMO.read_text().replace('name = "Harbor Row', 'name = "Edited elsewhere: Harbor Row')
            path.write_text(theirs)
            await pilot.press("ctrl+s")
            await pilot.pause()
            assert isinstance(app.screen, Choice) and app.screen.id == "changed-on-disk"
            assert path.read_text() == theirs
            await pilot.click("#cancel")
            await pilot.pause()
            assert path.read_text() == theirs and app.session.dirty
    run(flow())


def test_keys_help_palette_theme_and_caution(tmp_path):
    async def flow():
        app = make_app(demo_copy(tmp_path), tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            from fieldcomp import CAUTION
            assert str(app.workbench.query_one("#caution", Static).render()) == CAUTION
            names = [name for name, _, _ in app.palette_actions()]
            for action in ("Save", "Save as", "Undo", "Redo", "Help", "Quit", "Beam", "Findings", "Duplicate beam"):
                assert action in names
            app.workbench.query_one("#beams").focus()
            await pilot.press("4")
            assert app.workbench.query_one("#panes").active == "tab-studs"
            await pilot.press("f1")
            await pilot.pause()
            assert isinstance(app.screen, HelpScreen)
            await pilot.press("escape")
            await pilot.press("ctrl+t")
            assert app.theme == "fieldcomp-dark"
            await pilot.press("ctrl+t")
            assert app.theme == "fieldcomp-light"
            assert all(b.id and b.tooltip for b in app.all_bindings())
    run(flow())


def test_new_untitled_job_from_the_starter(tmp_path):
    async def flow():
        app = FieldcompApp(JobSession.untitled(), state_dir=tmp_path / "state", theme="light")
        app.animation_level = "none"
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            assert "untitled" in app.sub_title and not app.session.dirty
            assert app.outcomes and app.outcomes[0].result is not None
            await pilot.press("f2")
            await pilot.pause()
            field = app.screen.query_one("#path", Input)
            field.value = str(tmp_path / "new.toml")
            await pilot.press("enter")
            await settle(pilot, app)
            assert load_job(tmp_path / "new.toml").job == app.session.job
            assert app.session.path == tmp_path / "new.toml" and not app.session.dirty
    run(flow())


def test_write_the_marks_sheet_and_import_an_inspection_log(tmp_path):
    async def flow():
        from fieldcomp.views.marks_sheet import marks_csv
        from fieldcomp.views.marks_svg import marks_svg
        from engine.pipeline import marks_sheet
        from fieldcomp import CAUTION

        app = make_app(demo_copy(tmp_path), tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            app.workbench.action_pane("sheet")
            await settle(pilot, app)
            app.workbench.query_one("#sheet-svg", Input).value = str(tmp_path / "b1.svg")
            app.workbench.query_one("#sheet-csv", Input).value = str(tmp_path / "b1.csv")
            app.workbench.query_one("#sheet-folder", Input).value = str(tmp_path / "all")
            await pilot.press("f6", "f7", "f8")
            await settle(pilot, app)
            expected = marks_sheet(app.session.job.project.name, app.outcomes[0].beam, app.date, CAUTION)[0]
            assert (tmp_path / "b1.svg").read_text() == marks_svg(expected)  # as `fieldcomp marks` writes it
            assert (tmp_path / "b1.csv").read_text() == marks_csv(expected)
            assert len(list((tmp_path / "all").glob("*.svg"))) == len(app.session.job.beam)
            log = tmp_path / "log.csv"
            log.write_text("kind,rib,note\nmissing,5,no stud\nweak-side,7,\n")
            app.select_beam(1)
            app.workbench.action_pane("findings")
            await settle(pilot, app)
            before = len(app.session.job.beam[1].finding)
            app.workbench.query_one("#findings-rows").import_csv(log)
            await settle(pilot, app)
            assert len(app.session.job.beam[1].finding) == before + 2
            await pilot.press("ctrl+z")
            await settle(pilot, app)
            assert len(app.session.job.beam[1].finding) == before  # the import is one edit
    run(flow())


def test_open_verb_refuses_a_bad_job_before_starting_the_app(tmp_path, capsys):
    from fieldcomp.cli.main import main

    bad = tmp_path / "bad.toml"
    bad.write_text(DEMO.read_text().replace("span = \"30'-0\\\"\"", "span = \"30\"", 1))
    assert main(["open", str(bad)]) == 2
    err = capsys.readouterr().err
    assert "beam '3B-101' #1, field 'span'" in err and "needs a unit" in err
