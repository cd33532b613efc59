"""Write the workbench screenshots in docs/ (SVG, light theme, 170 x 48): one per pane on the
demo job, as linked from the README.

    python tools/workbench_screenshots.py
"""

from __future__ import annotations

import asyncio
import os
import sys
import tempfile
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

SHOTS = (  # (file, pane, beam index in the demo job)
    ("workbench-beam.svg", "beam", 0),
    ("workbench-pour.svg", "pour", 1),
    ("workbench-camber.svg", "camber", 6),
    ("workbench-studs.svg", "studs", 0),
    ("workbench-findings.svg", "findings", 2),
    ("workbench-sheet.svg", "sheet", 2),
)


async def _settle(app, pilot) -> None:
    for _ in range(3):
        await app.workers.wait_for_complete()
        await pilot.pause()


async def _shoot(out: Path) -> None:
    from fieldcomp.tui.app import FieldcompApp
    from fieldcomp.tui.session import JobSession

    with tempfile.TemporaryDirectory() as state:
        app = FieldcompApp(JobSession.open(Path("jobs") / "harbor_row_level3.toml"), state_dir=Path(state),
                           theme="light", date="2025-06-02")
        app.animation_level = "none"
        async with app.run_test(size=(170, 48)) as pilot:
            for name, pane, beam in SHOTS:
                app.select_beam(beam)
                app.workbench.action_pane(pane)
                await _settle(app, pilot)
                if pane == "sheet":  # the repair marks of the beam that fails as built
                    app.workbench.query_one("#sheet-kind").value = "repair"
                    await _settle(app, pilot)
                app.save_screenshot(filename=name, path=str(out))
                print(out / name)


def main() -> None:
    os.chdir(ROOT)  # the title shows the job by its path relative to the repository
    out = ROOT / "docs"
    out.mkdir(exist_ok=True)
    asyncio.run(_shoot(out))


if __name__ == "__main__":
    main()
