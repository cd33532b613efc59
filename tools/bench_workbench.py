"""Benchmark: the workbench on a 2,000-beam job (tools/bench.py's `generated_job`), headless
Textual at 160 x 45. Medians of:

- open: `JobSession.open` (load and validate the file) until the first beam's panes and the beam
  list are on screen (the other beams' results arrive in the background, in batches); target 1 s;
- edit -> panes updated: an edit reaching the app (`EditRequested`, as a form sends it after its
  inline check) until the edited beam's list row and the visible pane are redrawn
  (`FieldcompApp.redraw_ms`: the one-beam validation and conversion, the worker's recompute of
  that beam, one batched update); target 50 ms, with each pane on screen in turn;
- switch beam: another beam selected until its panes are redrawn (`switch_ms`); target 100 ms.

The repair search of a beam that fails as built runs in a second pass and is reported apart.

    python tools/bench_workbench.py            # 2,000 beams, 15 edits per pane
    python tools/bench_workbench.py --beams 320 --edits 5
"""

from __future__ import annotations

import argparse
import asyncio
import statistics
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
sys.path.insert(0, str(ROOT / "tools"))

PANES = ("beam", "pour", "camber", "studs", "findings", "sheet")
SIZE = (160, 45)
TARGETS_MS = {"open": 1000.0, "edit": 50.0, "switch": 100.0}


async def _settle(app) -> None:
    """Let workers finish and the screen catch up (plain sleeps: the pilot's own waiting visits
    every widget and would load the benchmark more than the app)."""
    for _ in range(2):
        await app.workers.wait_for_complete()
        await asyncio.sleep(0.03)


async def _wait_for(log: list[float], seen: int, seconds: float = 10.0) -> None:
    deadline = time.perf_counter() + seconds
    while len(log) == seen and time.perf_counter() < deadline:
        await asyncio.sleep(0.002)


async def _edits(app, beam: int, values: list[str], log: list[float], pane: str) -> list[float]:
    """Show `pane` for `beam`, then edit its live load once per value; the logged times."""
    from fieldcomp.tui.messages import EditRequested

    app.select_beam(beam)
    app.workbench.action_pane(pane)
    await _settle(app)
    out: list[float] = []
    for value in values:
        seen = len(log)
        app.post_message(EditRequested(("beam", beam, "live_psf"), value))
        await _wait_for(log, seen)
        out.extend(log[seen:])
        await _settle(app)
    return out


async def _open_once(job: Path, state: Path) -> float:
    """Seconds from opening the file to the first beam's panes on screen."""
    from fieldcomp.tui.app import FieldcompApp
    from fieldcomp.tui.session import JobSession

    started = time.perf_counter()
    app = FieldcompApp(JobSession.open(job), state_dir=state, theme="light", date="2025-06-02")
    app.animation_level = "none"
    async with app.run_test(size=SIZE):
        await _wait_for(app.redraw_ms, 0, 30.0)
        shown = time.perf_counter() - started
        app.exit()
    return shown


async def _run(job: Path, edits: int, opens: int) -> dict[str, list[float]]:
    from fieldcomp.tui.app import FieldcompApp
    from fieldcomp.tui.session import JobSession

    results: dict[str, list[float]] = {"open": []}
    with tempfile.TemporaryDirectory() as state:
        for _ in range(opens):
            results["open"].append(1000.0 * await _open_once(job, Path(state)))
        app = FieldcompApp(JobSession.open(job), state_dir=Path(state), theme="light", date="2025-06-02")
        app.animation_level = "none"
        async with app.run_test(size=SIZE):
            t0 = time.perf_counter()
            await _settle(app)
            results["background, every beam's first and second pass (s)"] = [time.perf_counter() - t0]
            fresh = iter(range(101, 1000))  # every edit a live load not seen before: no cached result
            beams = len(app.session.job.beam)
            for pane in PANES:
                values = [str(next(fresh)) for _ in range(edits)]
                results[f"edit, {pane} pane"] = await _edits(app, beams // 2, values, app.redraw_ms, pane)
            values = [str(next(fresh)) for _ in range(edits)]
            results["edit, findings pane (3B-103 copy, repair shown)"] = await _edits(
                app, 2, values, app.repair_ms, "findings")
            app.workbench.action_pane("beam")
            await _settle(app)
            switches = []
            for k in range(3, min(beams, 3 + 7 * 20), 7):
                seen = len(app.switch_ms)
                app.select_beam(k)
                await _wait_for(app.switch_ms, seen)
                switches.extend(app.switch_ms[seen:])
                await _settle(app)
            results["switch beam, beam pane"] = switches
    return results


def main() -> None:
    from bench import generated_job

    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--beams", type=int, default=2000)
    parser.add_argument("--edits", type=int, default=15)
    parser.add_argument("--opens", type=int, default=3)
    args = parser.parse_args()
    with tempfile.TemporaryDirectory() as folder:
        job = Path(folder) / "generated.toml"
        job.write_text(generated_job(args.beams))
        results = asyncio.run(_run(job, args.edits, args.opens))
    print(f"workbench, {args.beams}-beam job, {SIZE[0]} x {SIZE[1]}; medians (targets: open "
          f"{TARGETS_MS['open']:.0f} ms, edit {TARGETS_MS['edit']:.0f} ms, switch {TARGETS_MS['switch']:.0f} ms):")
    for name, times in results.items():
        if times:
            unit = "s " if name.endswith("(s)") else "ms"
            print(f"  {name:52} {statistics.median(times):8.1f} {unit}  (n {len(times)}, max {max(times):.1f})")


if __name__ == "__main__":
    main()
