"""The workbench shows hostile text as it is: marks, names, notes and ids that look like Textual
markup ("[/]" closes nothing and once stopped the app) are drawn literally on every pane, in the
tables, the select lists, the problem line, notifications and dialogs; a FIFO chosen as the file to
save to is refused, not waited on. Headless (App.run_test)."""

from __future__ import annotations

import asyncio
import os
import signal
from pathlib import Path

from textual.widgets import Input, Static

from fieldcomp.tui.app import FieldcompApp
from fieldcomp.tui.session import JobSession

ROOT = Path(__file__).resolve().parents[2]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
SIZE = (170, 48)
MARKUP = "[/]"  # an auto-closing tag with nothing to close: MarkupError when read as markup


def hostile_job(tmp_path: Path) -> Path:
    """The demo job with markup in the project name, a deck id, a slab id, marks, end names, notes
    and a pour stage name (all printable text, so the loader accepts it)."""
    text = DEMO.read_text()
    for old, new in [('name = "Harbor Row', f'name = "{MARKUP}[bold]Harbor Row'), ('"D3"', '"[/D3]"'),
                     ('mark = "3B-101"', 'mark = "[/]3B-101"'), ('mark = "3B-102"', 'mark = "[@click=app.quit]3B-102"'),
                     ('reference_end = "grid 2"', 'reference_end = "[/]grid 2"'),
                     ('note = "stud not welded"', 'note = "[red]x[/]"'), ('name = "pour 3A"', 'name = "[/p]3A"'),
                     ('no_camber_reason = "spandrel"', 'no_camber_reason = "[/]spandrel"')]:
        assert old in text, old
        text = text.replace(old, new)
    path = tmp_path / "hostile.toml"
    path.write_text(text)
    return path


async def settle(pilot, app) -> None:
    for _ in range(3):
        await app.workers.wait_for_complete()
        await pilot.pause()


def test_markup_in_job_text_is_drawn_literally_on_every_pane(tmp_path):
    async def flow():
        app = FieldcompApp(JobSession.open(hostile_job(tmp_path)), state_dir=tmp_path / "state", theme="light")
        app.animation_level = "none"
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            # every pane of the first beam (mark, end name, note); the pour pane of the second (stage
            # name), the camber and findings panes of the third (no-camber reason, repair)
            for beam, panes in ((0, "123456"), (1, "2"), (2, "35")):
                app.select_beam(beam)
                for key in panes:
                    await pilot.press(key)
                    await settle(pilot, app)
            app.select_beam(0)
            await pilot.press("1")
            await settle(pilot, app)
            head = str(app.workbench.query_one("#beam-head", Static).render())
            assert head.startswith("[/]3B-101")  # drawn as typed
            field = app.workbench.query_one("#beam-form #span", Input)
            field.focus()
            field.value = "[/]30 ft"  # refused by the loader; the problem line quotes it
            await pilot.pause(0.4)  # the check runs a moment after the last change
            problem = str(app.workbench.query_one("#beam-form .form--problem", Static).render())
            assert "'[/]30 ft'" in problem
            await pilot.press("enter")
            await settle(pilot, app)
            assert app.session.job.beam[0].span == "30'-0\""
            app.notify(f"{MARKUP} a notification [b]with markup", title=MARKUP)
            await settle(pilot, app)
            assert "[/]" in app.title
    asyncio.run(flow())


def test_saving_to_a_fifo_is_refused_with_a_notification(tmp_path):
    fifo = tmp_path / "out.toml"
    os.mkfifo(fifo)
    job = tmp_path / "job.toml"
    job.write_bytes(DEMO.read_bytes())

    def hung(signum, frame):
        raise AssertionError("the save waited on the FIFO")

    async def flow():
        app = FieldcompApp(JobSession.open(job), state_dir=tmp_path / "state", theme="light")
        app.animation_level = "none"
        async with app.run_test(size=SIZE) as pilot:
            await settle(pilot, app)
            app.save_then(None, fifo, overwrite=True)
            await settle(pilot, app)
            shown = [n.message for n in app._notifications]
            assert any(m.startswith(f"Not saved: {fifo}: is a pipe or FIFO") for m in shown), shown
            assert app.session.path == job
    previous = signal.signal(signal.SIGALRM, hung)
    signal.alarm(30)
    try:
        asyncio.run(flow())
    finally:
        signal.alarm(0)
        signal.signal(signal.SIGALRM, previous)
    assert fifo.is_fifo()
