"""User text is never read as markup (headless, App.run_test): a beam mark "[/]..." (an
auto-closing tag with nothing to close, MarkupError when parsed) in the command palette's beam
search and help lines, the beam list and the pane heads; the app keeps running and shows it as typed."""

from __future__ import annotations

import asyncio
import shutil
from pathlib import Path

from textual.widgets import OptionList

from fieldcomp.tui.app import FieldcompApp
from fieldcomp.tui.session import JobSession

ROOT = Path(__file__).resolve().parents[3]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"


def test_a_mark_that_looks_like_markup_is_shown_as_typed(tmp_path):
    path = tmp_path / "hostile.toml"
    shutil.copyfile(DEMO, path)
    text = path.read_text()
    assert 'mark = "3B-102"' in text and 'span = "30\'-0\\""' in text
    path.write_text(text.replace('mark = "3B-102"', 'mark = "[/]3B-102 [b]"', 1))

    async def flow():
        app = FieldcompApp(JobSession.open(path), state_dir=tmp_path / "state", theme="light")
        app.animation_level = "none"
        async with app.run_test(size=(160, 45)) as pilot:
            for _ in range(3):
                await app.workers.wait_for_complete()
                await pilot.pause()
            assert app.workbench.query_one("#beams").row_cells(1)[0] == "[/]3B-102 [b]"
            await pilot.press("ctrl+p")
            await pilot.pause()
            await pilot.press(*"go to beam [/]3b")
            await pilot.pause(0.5)  # the palette searches and draws its hits
            hits = [str(option.prompt) for option in app.screen.query_one(OptionList).options]
            assert any("Go to beam [/]3B-102 [b]" in hit for hit in hits), hits
            await pilot.press("enter")
            for _ in range(3):
                await app.workers.wait_for_complete()
                await pilot.pause()
            assert app.is_running and app.selected == 1
            head = app.workbench.query_one("#beam-head").render()
            assert str(head).startswith("[/]3B-102 [b]")
    asyncio.run(flow())
