"""Benchmark: workbench edit-to-redraw time on the demo job (headless Textual, 170 x 48).

For each pane in turn, the same field of a demo beam is edited repeatedly; the app records, per
accepted edit, the time from the edit reaching the app to the screen refresh after the panes
were updated (`FieldcompApp.redraw_ms`: session validation, the worker's recompute, the beam list
and the visible pane redrawn; hidden panes update when shown). The repair search of a beam that
fails as built runs in a second worker and is reported apart (`repair_ms`).

    python tools/bench_workbench.py            # medians per pane, target 100 ms
"""

from __future__ import annotations

import asyncio
import statistics
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
PANES = ("beam", "pour", "camber", "studs", "findings", "sheet")
TARGET_MS = 100.0


async def _edits(app, pilot, beam: int, field: str, values: list[str], log: list[float], pane: str) -> list[float]:
    from textual.widgets import Input

    app.select_beam(beam)
    app.workbench.action_pane("beam")
    await _settle(app, pilot)
    out: list[float] = []
    for value in values:
        app.workbench.action_pane("beam")
        await _settle(app, pilot)
        box = app.workbench.query_one(f"#beam-form #f-{field}", Input)
        box.value = value
        app.workbench.action_pane(pane)  # the pane to watch is the one on screen when the edit lands
        await _settle(app, pilot)
        seen = len(log)
        box.post_message(Input.Submitted(box, value))
        deadline = time.perf_counter() + 10.0
        while len(log) == seen and time.perf_counter() < deadline:
            await pilot.pause(0.002)
        out.extend(log[seen:])
    return out


async def _settle(app, pilot) -> None:
    for _ in range(2):
        await app.workers.wait_for_complete()
        await pilot.pause()


async def _run(edits: int) -> dict[str, list[float]]:
    from fieldcomp.app import FieldcompApp
    from fieldcomp.session import JobSession

    results: dict[str, list[float]] = {}
    with tempfile.TemporaryDirectory() as state:
        app = FieldcompApp(JobSession.open(DEMO), state_dir=Path(state), theme="light", date="2025-06-02")
        app.animation_level = "none"
        async with app.run_test(size=(170, 48)) as pilot:
            await _settle(app, pilot)
            values = [str(100 + 5 * (k % 7)) for k in range(edits)]  # live load, psf: each edit a new input
            for pane in PANES:
                results[f"{pane} (3B-101)"] = await _edits(app, pilot, 0, "live_psf", values, app.redraw_ms, pane)
            results["findings (3B-103, repair search)"] = await _edits(
                app, pilot, 2, "live_psf", [str(100 + 3 * (k % 5)) for k in range(edits)], app.repair_ms, "findings")
    return results


def bench_edit_to_redraw(edits: int = 25) -> dict[str, float]:
    """Median edit-to-redraw time (ms) with each pane on screen; prints them with the target."""
    results = asyncio.run(_run(edits))
    medians = {name: statistics.median(times) for name, times in results.items() if times}
    print(f"workbench edit -> redraw, median of {edits} edits each (target {TARGET_MS:.0f} ms):")
    for name, value in medians.items():
        print(f"  {name:36} {value:7.1f} ms   (max {max(results[name]):.1f} ms)")
    return medians


if __name__ == "__main__":
    bench_edit_to_redraw()
