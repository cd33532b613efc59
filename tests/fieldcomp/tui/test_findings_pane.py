"""The workbench's Findings pane in both worlds: when each finding was found, before the pour the
replacement in kind and the fewest studs (each re-evaluated), after it the acceptance analysis and
what each remedy must supply. The pane renders what `fieldcomp findings` reports: the reference
here is that report (fieldcomp.views.findings_report.findings_text, itself checked against
hand-worked beams in tests/engine/field/), line for line."""

from __future__ import annotations

import asyncio
from pathlib import Path

import pytest
from textual.widgets import Static

from engine.pipeline import field_review
from fieldcomp.jobs.to_engine import to_engine
from fieldcomp.tui.app import FieldcompApp
from fieldcomp.tui.session import JobSession
from fieldcomp.views.findings_report import findings_text

ROOT = Path(__file__).resolve().parents[3]
DEMO = Path("jobs") / "harbor_row_level3.toml"
BEAM = 2  # 3B-103: ten findings, fails as built (tests/fieldcomp/cli/test_cli_findings.py)
SIZE = (100, 30)


def with_found(session: JobSession, found: str | None, note: str | None = None) -> JobSession:
    """Every finding of beam 3B-103 marked found before or after the pour (None: unknown)."""
    def change(raw: dict) -> None:
        for f in raw["beam"][BEAM]["finding"]:
            f.pop("found", None)
            if found is not None:
                f["found"] = found
        if note is not None:
            raw["beam"][BEAM]["finding"][0]["note"] = note
    if found is not None or note is not None:
        session.apply(change, "timing")
    return session


def demo_app(tmp_path: Path, found: str | None, note: str | None = None) -> FieldcompApp:
    app = FieldcompApp(with_found(JobSession.open(DEMO), found, note), state_dir=tmp_path / "state", theme="light",
                       date="2025-06-02")
    app.animation_level = "none"
    return app


def show_findings(pilot):
    async def run() -> None:
        app = pilot.app
        for _ in range(3):
            await app.workers.wait_for_complete()
            await pilot.pause()
        app.select_beam(BEAM)
        app.workbench.action_pane("findings")
        for _ in range(4):
            await app.workers.wait_for_complete()
            await pilot.pause()
    return run()


def pane_text(tmp_path: Path, found: str | None, note: str | None = None) -> tuple[str, str, str]:
    """(review text, legend, CLI report) for the demo beam in that world."""
    async def flow() -> tuple[str, str, str]:
        app = demo_app(tmp_path, found, note)
        async with app.run_test(size=SIZE) as pilot:
            await show_findings(pilot)
            pane = app.workbench
            review = str(pane.query_one("#findings-repair", Static).render())
            legend = str(pane.query_one("#findings-legend", Static).render())
            beam = to_engine(app.session.job)[BEAM]
            report = findings_text(app.session.job.project.name, str(DEMO), field_review(beam))
            return review, legend, report
    return asyncio.run(flow())


@pytest.fixture(autouse=True)
def _at_root(monkeypatch):
    monkeypatch.chdir(ROOT)


def remedy_part(report: str) -> list[str]:
    """The remedy lines of the CLI report (from the first world's heading to the closing caution)."""
    lines = report.splitlines()
    start = next(i for i, line in enumerate(lines) if line.startswith(("Before the pour", "After the pour")))
    end = max(i for i, line in enumerate(lines) if line.startswith("CAUTION"))
    return [line for line in lines[start:end] if line]


def test_before_the_pour_the_pane_shows_both_repair_options_with_method_and_retest(tmp_path):
    text, legend, report = pane_text(tmp_path, "before-pour")
    lines = text.splitlines()
    assert "Found: before the pour (the crew can still weld studs through the deck)" in lines
    assert sum("found before the pour" in line for line in lines) == 10
    assert remedy_part(report) == [line for line in lines if line][12:-1]  # as `fieldcomp findings` prints them
    for words in ("(a) replacement in kind", "after replacement: PASS", "(b) fewest studs that restore every check",
                  "after repair: PASS", "method: arc stud welding through the deck", "fillet-welded stud, the fillet size "
                  "per AWS D1.1", "re-test: the inspector bend-tests each replaced or added stud"):
        assert words in text
    assert "After the pour" not in text and "to add" in legend  # the fewest studs drawn on the strip


def test_after_the_pour_the_pane_shows_the_acceptance_analysis_and_what_each_remedy_must_supply(tmp_path):
    text, legend, report = pane_text(tmp_path, "after-pour")
    lines = text.splitlines()
    assert sum("found after the pour" in line for line in lines) == 10
    assert remedy_part(report) == [line for line in lines if line][12:-1]
    for words in ("After the pour (no stud is welded in a rib under placed concrete): acceptance by analysis",
                  "strength envelope: least capacity/demand", "slip capacity: stud slip capacity",
                  "degree of composite: degree of composite (min 25%), ratio 1.18: REVIEW (commentary",
                  "deflection: live-load deflection (span/360)", "post-installed shear connectors: sum Qn",
                  "strengthening the steel:", "load restriction: the beam as built carries"):
        assert words in text
    # no stud is proposed under placed concrete: no replacement, no stud to add on the strip
    assert "Before the pour" not in text and "replacement in kind" not in text and "to add" not in legend


def test_unknown_timing_shows_both_branches_and_says_so_per_finding(tmp_path):
    text, _, report = pane_text(tmp_path, None)
    assert sum("timing unknown: both branches shown" in line for line in text.splitlines()) == 10
    assert "Before the pour" in text and "After the pour" in text
    assert remedy_part(report) == [line for line in text.splitlines() if line][12:-1]


def test_an_inspectors_note_is_shown_as_written_never_read_as_markup(tmp_path):
    note = "[bold red]gone[/] [link=x]y[/link]"
    text, _, _ = pane_text(tmp_path, "before-pour", note)
    assert f"found before the pour - {note}" in text


def test_findings_pane_after_the_pour(snap_compare, tmp_path):
    async def run_before(pilot) -> None:
        await show_findings(pilot)
        pilot.app.workbench.query_one("#findings-repair").scroll_visible(animate=False)
        await pilot.pause()
    assert snap_compare(demo_app(tmp_path, "after-pour"), terminal_size=(170, 48), run_before=run_before)


def test_the_workbench_import_leaves_out_rows_already_recorded_and_adds_the_reports_named(tmp_path):
    """Beam 3B-105 (index 5): ribs 3 and 4 hold one stud each in fieldcomp's layout
    (tests/fieldcomp/test_import_edges.py)."""
    log = tmp_path / "log.csv"
    log.write_text("kind;rib;report;weather\nmissing;3;SI-09;rain\nweak-side;4;SI-09;rain\n")

    async def flow() -> None:
        app = demo_app(tmp_path, None)
        async with app.run_test(size=SIZE) as pilot:
            await show_findings(pilot)
            app.select_beam(5)
            for _ in range(3):
                await app.workers.wait_for_complete()
                await pilot.pause()
            editor = app.workbench.query_one("#findings-rows")
            editor.import_csv(log)
            await pilot.pause()
            beam = app.session.job.beam[5]
            assert [(f.kind, f.rib, f.report) for f in beam.finding] == [("missing", 3, "SI-09"), ("weak-side", 4, "SI-09")]
            assert [r.number for r in beam.report] == ["SI-09"]
            notes = [n.message for n in app._notifications]
            assert any("column 4 ('weather') ignored" in n for n in notes)
            editor.import_csv(log)  # the same log again
            await pilot.pause()
            assert len(app.session.job.beam[5].finding) == 2
            assert any(n.message.startswith("Already recorded: every row of log.csv") for n in app._notifications)
    asyncio.run(flow())
