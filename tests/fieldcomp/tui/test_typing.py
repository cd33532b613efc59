"""Typing into the workbench as a person does, headless (App.run_test): keys pressed one after
another with no pause (faster than 20 keys/s), while the panes recompute, land in the field they
were typed into; pane keys typed inside a field are text; the job read back from the saved file
holds what was typed. The beam list and the panes speak the same verdicts.

No engineering value is asserted here: the engine's own tests carry their sources."""

from __future__ import annotations

import asyncio
import shutil
from pathlib import Path

from textual.widgets import Input, Static

from fieldcomp.jobs.jobfile import load_job
from fieldcomp.tui.app import FieldcompApp
from fieldcomp.tui.session import JobSession

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
SIZE = (160, 45)


def make_app(tmp_path: Path) -> tuple[FieldcompApp, Path]:
    path = tmp_path / "demo.toml"
    shutil.copyfile(DEMO, path)
    app = FieldcompApp(JobSession.open(path), state_dir=tmp_path / "state", theme="light")
    app.animation_level = "none"
    return app, path


async def settle(pilot, app: FieldcompApp) -> None:
    for _ in range(3):
        await app.workers.wait_for_complete()
        await pilot.pause()


async def type_fast(pilot, field: Input, text: str) -> None:
    """Focus `field`, clear it with the keyboard and type `text` key by key, without waiting."""
    field.focus()
    await pilot.press("end", *["backspace"] * (len(field.value) + 2), *[{" ": "space"}.get(c, c) for c in text])


def test_fast_typing_into_span_stud_count_and_a_finding_note_is_what_the_job_holds(tmp_path):
    async def flow():
        app, path = make_app(tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            span = app.workbench.query_one("#beam-form #span", Input)
            studs = app.workbench.query_one("#beam-form #studs-count", Input)
            await type_fast(pilot, span, "34 ft 6 1/2 in")
            await pilot.press("enter")  # the recompute starts; the next field is typed into at once
            await type_fast(pilot, studs, "24")
            assert span.value == "34 ft 6 1/2 in" and studs.value == "24"
            await settle(pilot, app)  # the panes were refilled meanwhile: the typed text stays
            assert studs.value == "24" and app.workbench.query_one("#panes").active == "tab-beam"
            await pilot.press("enter")
            await settle(pilot, app)
            app.workbench.action_pane("findings")
            await settle(pilot, app)
            note = app.workbench.query_one("#finding-form #finding-note", Input)
            await type_fast(pilot, note, "no stud, 4 ft 5 in from grid 2 [/] see photo 12")
            await pilot.press("enter")
            await settle(pilot, app)
            await pilot.press("ctrl+s")
            await settle(pilot, app)
        beam = load_job(path).job.beam[0]
        assert beam.span == "34 ft 6 1/2 in" and beam.studs.count == 24
        assert beam.finding[0].note == "no stud, 4 ft 5 in from grid 2 [/] see photo 12"
    asyncio.run(flow())


def test_pane_keys_inside_a_field_are_text(tmp_path):
    async def flow():
        app, _ = make_app(tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            field = app.workbench.query_one("#beam-form #superimposed_dead_psf", Input)
            await type_fast(pilot, field, "45")
            await pilot.press("[", "]")  # beam keys too
            assert field.value == "45[]" and field.has_focus
            assert app.workbench.query_one("#panes").active == "tab-beam" and app.selected == 0
            await pilot.pause(0.4)
            assert field.has_class("-invalid")  # checked a moment after the last key
            app.workbench.query_one("#beams").focus()
            await pilot.press("4")
            assert app.workbench.query_one("#panes").active == "tab-studs"  # outside a field, a pane key
    asyncio.run(flow())


def test_an_edit_recomputes_only_its_beam_and_updates_only_its_row(tmp_path):
    async def flow():
        app, _ = make_app(tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            before = list(app.outcomes)
            app.select_beam(3)
            await settle(pilot, app)
            field = app.workbench.query_one("#beam-form #live_psf", Input)
            await type_fast(pilot, field, "140")
            await pilot.press("enter")
            await settle(pilot, app)
            assert app.session.job.beam[3].live_psf == 140
            changed = [k for k, (a, b) in enumerate(zip(before, app.outcomes)) if a is not b]
            assert changed == [3]
    asyncio.run(flow())


def test_the_beam_list_and_the_panes_give_the_same_verdicts(tmp_path):
    async def flow():
        app, _ = make_app(tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            table = app.workbench.query_one("#beams")
            assert str(table.render_line(0).text).split() == ["beam", "as", "designed", "construction", "as", "built"]
            for k in range(len(app.session.job.beam)):
                app.select_beam(k)
                cells = table.row_cells(k)
                for pane, head, column in (("beam", "#beam-head", 1), ("camber", "#camber-head", 2),
                                           ("findings", "#findings-verdict", 3)):
                    app.workbench.action_pane(pane)
                    await settle(pilot, app)
                    shown = str(app.workbench.query_one(head, Static).render())
                    level = cells[column].split(" ")[0]
                    if level:
                        assert f" {level} " in shown, (k, pane, cells, shown)
                    else:
                        assert "No findings" in shown  # the as-built column is empty without findings
    asyncio.run(flow())


def test_every_focused_input_of_every_pane_has_room_for_its_text(tmp_path):
    """The symptom of the issue: a focused one-line input drawn with the toolkit's tall focus
    border has no content row left, so its text and cursor vanish. Every input of every pane,
    focused in turn at 80x24 and 160x45, keeps at least one content row."""
    async def flow(size):
        app, _ = make_app(tmp_path)
        async with app.run_test(size=size) as pilot:
            await settle(pilot, app)
            seen = 0
            for pane in ("beam", "pour", "camber", "studs", "findings", "sheet"):
                app.workbench.action_pane(pane)
                await settle(pilot, app)
                for field in app.workbench.query(Input):
                    if not field.is_on_screen and not field.display:
                        continue
                    field.focus()
                    await pilot.pause()
                    if field.has_focus and field.region.height:
                        seen += 1
                        assert field.content_region.height >= 1, (pane, field.id)
            assert seen >= 20
    for size in ((80, 24), (160, 45)):
        asyncio.run(flow(size))
