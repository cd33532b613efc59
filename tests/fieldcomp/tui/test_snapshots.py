"""Snapshots of every workbench pane on the demo job (pytest-textual-snapshot, fixed size).

Update after a deliberate change with `pytest tests/fieldcomp/tui/test_snapshots.py --snapshot-update`,
then read the SVG diffs (tests/fieldcomp/tui/__snapshots__/) before accepting them.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from fieldcomp.tui.app import FieldcompApp
from fieldcomp.tui.session import JobSession

ROOT = Path(__file__).resolve().parents[3]
SIZE = (170, 48)  # wide enough for the caution line in full
DATE = "2025-06-02"  # printed on marks sheets; fixed so the snapshot does not change with the day


def demo_app(tmp_path: Path, theme: str = "light") -> FieldcompApp:
    """The demo job opened by a relative path (the title shows no machine-specific folder)."""
    app = FieldcompApp(JobSession.open(Path("jobs") / "harbor_row_level3.toml"), state_dir=tmp_path / "state",
                       theme=theme, date=DATE)
    app.animation_level = "none"
    return app


def show(pane: str, beam: int = 0):
    async def run_before(pilot) -> None:
        app = pilot.app
        for _ in range(3):
            await app.workers.wait_for_complete()
            await pilot.pause()
        app.select_beam(beam)
        app.workbench.action_pane(pane)
        for _ in range(3):
            await app.workers.wait_for_complete()
            await pilot.pause()
    return run_before


@pytest.fixture(autouse=True)
def _at_root(monkeypatch):
    monkeypatch.chdir(ROOT)


@pytest.mark.parametrize("pane, beam", [
    ("beam", 0), ("pour", 1), ("camber", 1), ("studs", 0), ("findings", 2), ("sheet", 0),
])
def test_pane(snap_compare, tmp_path, pane, beam):
    assert snap_compare(demo_app(tmp_path), terminal_size=SIZE, run_before=show(pane, beam))


def test_dark_theme_beam_pane(snap_compare, tmp_path):
    assert snap_compare(demo_app(tmp_path, "dark"), terminal_size=SIZE, run_before=show("camber", 6))


def show_list():
    """The beam list brought up with f3 (hidden by default below 120 columns)."""
    async def run_before(pilot) -> None:
        await show("beam", 2)(pilot)
        await pilot.press("f3")
        await pilot.pause()
    return run_before


@pytest.mark.parametrize("size", [(80, 24), (100, 30), (160, 45)])
def test_beam_pane_at_each_terminal_size(snap_compare, tmp_path, size):
    assert snap_compare(demo_app(tmp_path), terminal_size=size, run_before=show("beam", 0))


@pytest.mark.parametrize("size", [(80, 24), (100, 30), (160, 45)])
def test_findings_pane_at_each_terminal_size(snap_compare, tmp_path, size):
    assert snap_compare(demo_app(tmp_path), terminal_size=size, run_before=show("findings", 2))


@pytest.mark.parametrize("size", [(80, 24), (100, 30)])
def test_beam_list_shown_on_a_narrow_terminal(snap_compare, tmp_path, size):
    assert snap_compare(demo_app(tmp_path), terminal_size=size, run_before=show_list())
