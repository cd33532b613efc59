"""Benchmark: workbench edit-to-redraw time on the demo job (headless Textual, 170 x 48).

With each pane on screen in turn, the live load of a demo beam is edited repeatedly; the app
records, per accepted edit, the time from the edit reaching the app to the screen refresh after
the panes were updated (`FieldcompApp.redraw_ms`: validation by the job-file loader, the worker's
recompute, the beam list and the visible pane redrawn; hidden panes update when shown). The repair search of a beam that
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


async def _edits(app, beam: int, field: str, values: list[str], log: list[float], pane: str) -> list[float]:
    """Show `pane` for beam `beam`, then edit `field` once per value, as the Beam pane's form does
    after its inline check (an `EditRequested` to the app); returns the logged times."""
    from fieldcomp.tui.messages import EditRequested

    app.select_beam(beam)
    app.workbench.action_pane(pane)
    await _settle(app)
    out: list[float] = []
    for value in values:
        seen = len(log)
        app.post_message(EditRequested(("beam", beam, field), value))
        deadline = time.perf_counter() + 10.0
        while len(log) == seen and time.perf_counter() < deadline:
            await asyncio.sleep(0.002)
        out.extend(log[seen:])
        await _settle(app)
    return out


async def _settle(app) -> None:
    """Let workers finish and the screen catch up (plain sleeps: the pilot's own waiting visits
    every widget and would load the benchmark more than the app)."""
    for _ in range(2):
        await app.workers.wait_for_complete()
        await asyncio.sleep(0.03)


async def _run(edits: int) -> dict[str, list[float]]:
    from fieldcomp.tui.app import FieldcompApp
    from fieldcomp.tui.session import JobSession

    results: dict[str, list[float]] = {}
    with tempfile.TemporaryDirectory() as state:
        app = FieldcompApp(JobSession.open(DEMO), state_dir=Path(state), theme="light", date="2025-06-02")
        app.animation_level = "none"
        async with app.run_test(size=(170, 48)):
            await _settle(app)
            # every edit a live load (psf) not seen before, so no result comes from the cache
            fresh = iter(range(101, 1000))
            for pane in PANES:
                values = [str(next(fresh)) for _ in range(edits)]
                results[f"{pane} (3B-101)"] = await _edits(app, 0, "live_psf", values, app.redraw_ms, pane)
            values = [str(next(fresh)) for _ in range(edits)]
            results["findings (3B-103, repair search)"] = await _edits(app, 2, "live_psf", values, app.repair_ms,
                                                                        "findings")
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
