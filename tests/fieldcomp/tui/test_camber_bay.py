"""The Camber pane's Bay section on the demo's bay (girder 3G-201, beams 3B-107..3B-110 resting on
it, pour zones "pour 3C" / "pour 3D"), headless: the lines shown are those `fieldcomp camber`
prints (fieldcomp.views.bay_report.bay_text of engine.pipeline.evaluate_level, computed here
independently of the app), a beam outside the bay shows none, an edit recomputes the level."""

from __future__ import annotations

import asyncio
import time

from textual.widgets import Static

from engine.pipeline import evaluate_level
from fieldcomp.jobs.to_engine import level_input, to_engine
from fieldcomp.tui.messages import EditRequested
from fieldcomp.views.bay_report import bay_text
from tests.fieldcomp.tui.test_app import SIZE, demo_copy, make_app, settle

GIRDER, BEAM, OUTSIDE = 3, 7, 0  # 3G-201, 3B-107, 3B-101 in the demo's job order


def expected_text(app) -> list[str]:
    job = app.session.job
    return bay_text(evaluate_level(level_input(job, to_engine(job)))).splitlines()


async def show_camber(pilot, app, index: int) -> tuple[str, str]:
    """Select beam `index`, show the Camber pane, wait until its level result is drawn: (bay text,
    concrete text), '' for a hidden section."""
    app.select_beam(index)
    app.workbench.action_pane("camber")
    pane = app.workbench.query_one("#pane-camber")
    deadline = time.monotonic() + 30
    while pane._level is None or pane._level[0] is not app.session.job:
        assert time.monotonic() < deadline, "the level was never computed"
        await settle(pilot, app)
    await settle(pilot, app)
    out = []
    for box, text in (("#camber-bay", "#camber-bay-text"), ("#camber-concrete", "#camber-concrete-text")):
        shown = app.workbench.query_one(box).display
        out.append(str(app.workbench.query_one(text, Static).render()) if shown else "")
    return out[0], out[1]


def test_the_bay_shows_on_the_girder_and_on_a_beam_resting_on_it(tmp_path):
    async def flow():
        app = make_app(demo_copy(tmp_path), tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            expected = expected_text(app)
            for index in (GIRDER, BEAM):
                bay, concrete = await show_camber(pilot, app, index)
                assert "mid-bay wet deflection" in bay and "NOTE:" in bay
                assert "Girder loads derived from the beams resting on them" in bay
                assert "Concrete to order" in concrete and "pour 3C" in concrete and "pour 3D" in concrete
                shown = bay.splitlines() + concrete.splitlines()
                # every number row of the CLI's bay report is on screen, character for character
                for line in expected:
                    if line.strip() and not line.startswith("Bays ("):
                        assert line in shown, line
            bay, concrete = await show_camber(pilot, app, OUTSIDE)
            assert bay == "" and "mid-bay" not in concrete and "Girder loads" not in concrete
            assert "Concrete to order" in concrete  # the job has pour zones: the level's concrete
    asyncio.run(flow())


def test_an_edit_recomputes_the_bay(tmp_path):
    async def flow():
        app = make_app(demo_copy(tmp_path), tmp_path)
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            before, _ = await show_camber(pilot, app, GIRDER)
            app.post_message(EditRequested(("beam", GIRDER, "shape"), "W24X94"))  # a stiffer girder
            await settle(pilot, app)
            after, _ = await show_camber(pilot, app, GIRDER)
            assert after != before
            mid = [line for line in expected_text(app) if "mid-bay wet deflection" in line]
            assert mid and mid[0] in after.splitlines()
    asyncio.run(flow())


def test_snapshot_of_the_camber_pane_on_the_girder(snap_compare, tmp_path, monkeypatch):
    """The Camber pane on 3G-201 at 160x45 with its Bay section (read the SVG before updating)."""
    from tests.fieldcomp.tui.test_snapshots import ROOT, demo_app

    monkeypatch.chdir(ROOT)

    async def run_before(pilot) -> None:
        await settle(pilot, pilot.app)
        await show_camber(pilot, pilot.app, GIRDER)
        pilot.app.workbench.query_one("#camber-bay").scroll_visible(animate=False, top=True)
        await settle(pilot, pilot.app)

    assert snap_compare(demo_app(tmp_path), terminal_size=(160, 45), run_before=run_before)
