"""Findings pane: enter or import inspection findings; as-built strength, verdict, repair."""

from __future__ import annotations

from pathlib import Path
from typing import Any

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.widgets import Button, Static

from fieldcomp.tui.outcome import BeamOutcome
from fieldcomp.tui.plain import plain
from fieldcomp.tui.session import JobSession
from fieldcomp.tui.widgets.checks_table import ChecksTable
from fieldcomp.tui.widgets.field_form import FieldSpec
from fieldcomp.tui.widgets.fmt import station
from fieldcomp.tui.widgets.pane_base import ROW_KEYS, Pane
from fieldcomp.tui.widgets.plot import Series, TerminalPlot
from fieldcomp.tui.widgets.row_editor import RowEditor
from fieldcomp.tui.widgets.strip import StripMark, StudStrip, legend
from fieldcomp.tui.widgets.verdict import word
from fieldcomp.views.numbers import ratio_text

FINDING_FIELDS = (
    FieldSpec("kind", ("kind",), "What the inspector found.",
              ("missing", "failed-test", "awaiting-test", "weak-side", "off-rib", "short", "added", "bent-accepted",
               "replaced")),
    FieldSpec("rib", ("rib",), "Rib number from the reference end, 1-based (clears station)."),
    FieldSpec("station", ("station",), "Station from the reference end (clears rib)."),
    FieldSpec("count", ("count",), "Studs concerned."),
    FieldSpec("note", ("note",), "Inspector's note."),
    FieldSpec("date", ("date",), "Date of the report."),
    FieldSpec("by", ("reported_by",), "Who reported it."),
    FieldSpec("found", ("found",), "Whether the slab over it was placed when it was found (blank: from the dates, "
              "else unknown and both branches are shown).", ("before-pour", "after-pour"), optional=True),
)


def with_new_finding(rows: list[dict[str, Any]], beam: Any) -> list[dict[str, Any]]:
    return rows + [{"kind": "missing", "rib": 1, "count": 1}]


def as_built_marks(ab, slots: tuple[int, ...], repair) -> list[StripMark]:
    """Strip marks of the studs as built: working, weak-side, added, each loss by its kind (at
    the slot the engine found for it), and the studs the repair adds."""
    st, x = ab.state, ab.designed.x
    marks = []
    for k in range(x.size):
        working = int(st.effective[k] - st.weak[k] - st.added[k])
        for kind, n in (("stud", working), ("weak-side", int(st.weak[k])), ("added", int(st.added[k]))):
            if n > 0:
                marks.append(StripMark(float(x[k]), n, kind))
    for f, k in zip(ab.beam.findings, slots):
        if f.kind not in ("added", "weak-side"):
            marks.append(StripMark(float(x[k]), f.count, f.kind))
    if repair is not None:
        marks += [StripMark(float(x[k]), int(n), "repair") for k, n in enumerate(repair.added) if n > 0]
    return marks


class FindingsEditor(RowEditor):
    def extra_buttons(self) -> ComposeResult:
        yield Button("Import CSV", id="finding-import", tooltip="Add findings from an inspection log (CSV).", compact=True)

    def on_button_pressed(self, event: Button.Pressed) -> None:
        """Import here; Add and Remove are handled by RowEditor (Textual also calls the base
        class handler unless the default is prevented)."""
        if event.button.id == "finding-import":
            event.stop()
            event.prevent_default()
            self.ask_import()

    def ask_import(self) -> None:
        from fieldcomp.tui.dialogs import AskPath

        self.app.push_screen(AskPath("Import inspection log (CSV)", str(Path.cwd()) + "/",
                                     "Columns: kind, rib or station, count, note, date, reported_by."), self.import_csv)

    def import_csv(self, path: Path | None) -> None:
        """Add the log's new rows (fieldcomp.jobs.log_import.plan_import: rows already recorded
        are left out, each new row checked against the layout) as one edit, after the reports
        they name that the beam lacks. Text from the file is shown as written (markup off)."""
        from fieldcomp.jobs.inspection_log import CsvImportError, read_log
        from fieldcomp.jobs.jobfile import JobFileError
        from fieldcomp.jobs.log_import import plan_import
        from fieldcomp.tui.messages import RowsSet

        if path is None or self.session is None:
            return
        index = self.beam_index
        try:
            log = read_log(path)
            plan = plan_import(self.session.job, index, log, self.session.where, str(path))
        except (CsvImportError, JobFileError) as exc:
            self.app.notify(str(exc), title="Not imported", severity="error", timeout=12, markup=False)
            return
        for warning in log.warnings:
            self.app.notify(f"{path.name}: {warning}", title="Column ignored", severity="warning", markup=False)
        recorded = f"{len(plan.recorded)} row(s) already recorded" if plan.recorded else ""
        if not plan.added:
            self.app.notify(f"Already recorded: every row of {path.name} is a finding of this beam already; "
                            "nothing added.", title="Nothing imported", markup=False)
            return
        if plan.reports:
            reports = [r.model_dump(mode="json", exclude_defaults=True) for r in plan.updated.beam[index].report]
            self.post_message(RowsSet(("beam", index, "report"), reports,
                                      f"add report(s) {', '.join(r.number for r in plan.reports)} from {path.name}"))
        items = [f.model_dump(mode="json", exclude_defaults=True, exclude_none=True) for _, f in plan.added]
        self.add(items, f"import {len(items)} finding(s) from {path.name}" + (f" ({recorded})" if recorded else ""))


class FindingsPane(Pane):
    BINDINGS = [*ROW_KEYS, Binding("f8", "import_csv", "Import CSV", id="findings.import",
                                   tooltip="Add findings from an inspection log (CSV).")]

    def action_import_csv(self) -> None:
        self.query_one(FindingsEditor).ask_import()

    def build(self) -> ComposeResult:
        yield Static("", classes="pane--head", id="findings-head")
        yield FindingsEditor("finding", "finding", FINDING_FIELDS, with_new_finding, id="findings-rows",
                             empty="No findings for this beam. Add them one by one or import an inspection log (CSV).")
        yield Static("", id="findings-verdict")
        yield StudStrip(id="findings-strip")
        yield Static("", id="findings-legend", classes="pane--note")
        yield TerminalPlot("Strength as built", id="findings-envelope")
        yield Static("", id="findings-repair")
        yield Static("Checks as built", classes="pane--section")
        yield ChecksTable(id="findings-checks")
        yield Static("", id="findings-effects", classes="pane--note")

    def show_job(self, session: JobSession, index: int) -> None:
        self.query_one(RowEditor).show(session, index)
        self.query_one("#findings-head", Static).update(plain(f"{session.job.beam[index].mark}: stud inspection findings"))

    def show_outcome(self, outcome: BeamOutcome | None, outcomes: list[BeamOutcome]) -> None:
        """The beam as built and its review in the world each finding was found in: once the
        second pass has reviewed it (engine.pipeline.field_review, on the layout the findings
        apply to), the pane shows that review, as `fieldcomp findings` reports it."""
        verdict = self.query_one("#findings-verdict", Static)
        strip, plot = self.query_one(StudStrip), self.query_one(TerminalPlot)
        repair_text = self.query_one("#findings-repair", Static)
        review = outcome.review.value if outcome is not None else None
        ab = review.before if review is not None else outcome.as_built.value if outcome else None
        if outcome is None or ab is None:
            error = outcome.as_built.error if outcome else None
            verdict.update(Text(error, style="bold red") if error else "No findings: the beam stands as designed.")
            strip.clear("")
            plot.clear("")
            repair_text.update("")
            self.query_one(ChecksTable).show([])
            self.query_one("#findings-effects", Static).update("")
            return
        b, r, gov = ab.beam, ab.result, ab.governing
        low, at = ab.min_strength_ratio
        verdict.update(Text.assemble("As built: ", word(str(ab.verdict), badge=True), f"  governing: {gov.name}, ratio {ratio_text(gov.ratio)};  "
                                     f"least capacity / demand {ratio_text(low)} at {station(at)};  "
                                     f"{ab.layout.total} working studs of {ab.designed.total} designed"))
        repair = None if review is None else review.repair if review.repair is not None else review.after_repair
        strip.draw(b.span, ab.designed.x, as_built_marks(ab, outcome.finding_slots, repair), ends=(b.ribs.reference_end, b.ribs.far_end),
                   keep_out=(b.ribs.keep_out_start, b.ribs.keep_out_end))
        kinds = {"stud"} | {f.kind for f in b.findings} | ({"repair"} if repair is not None and repair.total else set())
        self.query_one("#findings-legend", Static).update(legend(kinds))
        designed = outcome.result
        series = [Series("demand", r.x, r.demand / 12.0, hatch=True, over=r.demand > r.capacity, tone=4)]
        if designed is not None:
            series.append(Series("as designed", designed.x, designed.capacity / 12.0, tone=5))
        if repair is not None and repair.total:
            series.append(Series("repaired", repair.after.result.x, repair.after.result.capacity / 12.0, tone=2))
        series.append(Series("as built", r.x, r.capacity / 12.0, tone=3 if ab.verdict == "fail" else 0))
        plot.plot(series, b.span, fmt=lambda v: f"{v:,.0f} k-ft")
        repair_text.update(self._review_text(outcome))
        self.query_one(ChecksTable).show(ab.checks)
        self.query_one("#findings-effects", Static).update(plain(self._effects(b.findings, ab.flags)))

    @staticmethod
    def _review_text(outcome: BeamOutcome) -> Text:
        from fieldcomp.tui.widgets.field_review_view import review_text

        if outcome.review.value is not None:
            return review_text(outcome.review.value)
        if outcome.review.error is not None:
            return Text(f"Findings not reviewed: {outcome.review.error}", style="bold red")
        return Text("Reviewing the findings: timing, repairs before the pour, acceptance after it ...", style="italic")

    @staticmethod
    def _effects(findings, flags) -> str:
        from engine.field.as_built import FINDING_EFFECTS

        kinds = sorted({f.kind for f in findings})
        lines = [f"{k}: {FINDING_EFFECTS[k][0]} [{FINDING_EFFECTS[k][1]}]" for k in kinds if k in FINDING_EFFECTS]
        lines += [f"note [{f.clause}] {f.message}" for f in flags]
        return "\n".join(lines)
