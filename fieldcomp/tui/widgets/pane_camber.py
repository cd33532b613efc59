"""Camber pane: the camber to order and why, the outcome at both ends of the delivered band,
the construction-stage checks, warnings; and the camber schedule of every beam of the job."""

from __future__ import annotations

from rich.text import Text
from textual import work
from textual.app import ComposeResult
from textual.widgets import Collapsible, Static
from textual.worker import get_current_worker

from engine.model.text import printable
from engine.model.units import format_inches
from fieldcomp.jobs.model import Job
from fieldcomp.jobs.to_engine import has_level
from fieldcomp.tui.outcome import NONE, BeamOutcome, Part, compute_level
from fieldcomp.tui.plain import plain
from fieldcomp.tui.session import JobSession
from fieldcomp.tui.widgets.checks_table import ChecksTable
from fieldcomp.tui.widgets.field_form import FieldForm, FieldSpec
from fieldcomp.tui.widgets.fmt import signed_inches, station
from fieldcomp.tui.widgets.pane_base import Pane
from fieldcomp.tui.widgets.plot import Series, TerminalPlot
from fieldcomp.tui.widgets.table import Table, TextTable
from fieldcomp.tui.widgets.verdict import PENDING, verdict_cell, word
from engine.finished.evaluate import governing_check
from fieldcomp.views.bay_report import bay_lines, concrete_lines, girder_load_lines

IN3_PER_FT3 = 1728.0  # unit conversion
BAY_DELAY = 0.3  # s: after an edit the level's bays are recomputed once edits pause this long
RULE_FIELDS = (
    FieldSpec("share", ("camber", "fraction"), "Share of the pre-composite dead-load deflection to camber out (0.80 common)."),
    FieldSpec("round down to", ("camber", "increment"), "Camber is rounded down to this increment."),
    FieldSpec("minimum", ("camber", "minimum"), "No camber below this."),
    FieldSpec("min span", ("camber", "min_length"), "Beams shorter than this are not cambered."),
    FieldSpec("min depth", ("camber", "min_depth"), "Beams shallower than this are not cambered."),
)


def camber_word(outcome: BeamOutcome) -> str:
    con = outcome.construction.value
    if con is None:
        return "-"
    return format_inches(con.camber.camber) if con.camber.camber > 0 else "none"


class CamberPane(Pane):
    lists_every_beam = True
    _rows: dict[int, tuple[BeamOutcome, tuple]] = {}

    _level: tuple[Job, Part] | None = None  # the level's bays (engine.pipeline.evaluate_level) of that job
    _mark = ""  # the member the Bay section shows

    def on_mount(self) -> None:
        self._rows = {}
        self._bay_timer = None

    def build(self) -> ComposeResult:
        yield Static("", classes="pane--head", id="camber-head")
        yield Static("", id="camber-reason")
        yield Static("Outcome at midspan, both ends of the delivered band, 75 % to +tolerance (AISC 303 6.4.4)",
                     classes="pane--section")
        yield TextTable("case", "camber", "wet deflection", "top of slab vs supports", "slab over beam", "stud cover",
                        "extra concrete", id="camber-envelope")
        yield Static("", id="camber-warnings", classes="pane--warn")
        yield Collapsible(Static("", id="camber-bay-text"), title="Bay", id="camber-bay", collapsed=False)
        yield Collapsible(Static("", id="camber-concrete-text"), title="Concrete to order", id="camber-concrete",
                          collapsed=False)
        yield TerminalPlot("Deflection while wet against the camber (down)", id="camber-plot")
        yield Static("Construction-stage checks", classes="pane--section")
        yield ChecksTable(id="camber-checks")
        yield Static("Camber schedule, every beam", classes="pane--section")
        yield Table("beam", "shape", "span", "predicted", "camber", "why", "construction", id="camber-schedule")
        yield Static("Camber rules of the job", classes="pane--section")
        yield FieldForm(RULE_FIELDS, id="camber-rules", columns=3)

    def show_job(self, session: JobSession, index: int) -> None:
        self.query_one(FieldForm).show(session, ("project",))

    def show_outcome(self, outcome: BeamOutcome | None, outcomes: list[BeamOutcome]) -> None:
        self._schedule(outcomes)
        self._mark = outcome.beam_in.mark if outcome is not None else ""
        self._show_level()
        envelope = self.query_one("#camber-envelope", TextTable)
        con = outcome.construction.value if outcome else None
        head = self.query_one("#camber-head", Static)
        if outcome is None or con is None:
            head.update(Text(printable(outcome.construction.error) if outcome and outcome.construction.error
                             else "no beam", style="bold red"))
            self.query_one(TerminalPlot).clear("not computed")
            envelope.set_rows([])
            self.query_one(ChecksTable).show([])
            return
        b, d = con.beam, con.camber
        order = (Text(f" order camber {format_inches(d.camber)} ", style="bold reverse")
                 if d.camber > 0 else Text(" no camber ", style="bold reverse"))
        tol = f"  delivered 75 % to +{format_inches(d.tolerance)}" if d.camber > 0 else ""
        head.update(Text.assemble(f"{b.mark}  {b.shape.name}  ", order, tol, "   construction ",
                                  word(str(con.verdict), badge=True)))
        self.query_one("#camber-reason", Static).update(plain(
            f"{d.reason}.  Predicted pre-composite dead-load deflection at midspan {signed_inches(d.predicted)} "
            f"(constant thickness would give {signed_inches(con.at_midspan(con.no_ponding))})."))
        envelope.set_rows([(f"{o.case}, {o.stiffness}", format_inches(o.camber), signed_inches(o.deflection), signed_inches(o.top_of_slab),
                            signed_inches(o.thickness),
                            Text(signed_inches(o.stud_cover), style="bold red" if o.warnings else ""),
                            f"{o.extra_concrete / IN3_PER_FT3:.1f} ft3") for o in con.outcomes])
        self.query_one("#camber-warnings", Static).update(
            plain("\n".join(dict.fromkeys(f"{o.case}: {w}" for o in con.outcomes for w in o.warnings))))
        self._profile(con)
        self.query_one(ChecksTable).show(con.checks)

    def _show_level(self) -> None:
        """The Bay and Concrete sections from the level's result of the job shown; a changed job's
        level is recomputed in a worker (at once the first time, after an edit once edits pause)."""
        job = self.app.session.job  # type: ignore[attr-defined]
        if not has_level(job):
            self._level = (job, NONE)
        if self._level is not None and self._level[0] is job:
            self._draw_level(self._level[1])
            return
        if self._bay_timer is not None:
            self._bay_timer.stop()
        self._draw_level(None)
        if self._level is None:
            self._start_level()
        else:
            self._bay_timer = self.set_timer(BAY_DELAY, self._start_level)

    def _start_level(self) -> None:
        self._bay_timer = None
        session = self.app.session  # type: ignore[attr-defined]
        self._compute_level(session.job, session.engine_beams(), session.where)

    @work(exclusive=True, thread=True, group="bay", description="the level's bays, girder loads, concrete")
    def _compute_level(self, job: Job, beams: list, where: str) -> None:
        part = compute_level(job, beams, where)
        if not get_current_worker().is_cancelled:
            self.app.call_from_thread(self._level_ready, job, part)

    def _level_ready(self, job: Job, part: Part) -> None:
        if job is not self.app.session.job:  # type: ignore[attr-defined]
            return  # an edit since: its own computation follows
        self._level = (job, part)
        self._draw_level(part)

    def _draw_level(self, part: Part | None) -> None:
        """The bay lines of fieldcomp.views.bay_report for the member shown (None: computing)."""
        bay_box = self.query_one("#camber-bay", Collapsible)
        concrete_box = self.query_one("#camber-concrete", Collapsible)
        bay_text = self.query_one("#camber-bay-text", Static)
        concrete = self.query_one("#camber-concrete-text", Static)
        job = self.app.session.job  # type: ignore[attr-defined]
        if part is None or part is NONE or part.value is None:
            applies = part is not NONE and (part is None or part.error is not None)
            bay_box.display, concrete_box.display = applies, False
            bay_box.title = "Bay"
            bay_text.update(Text("computing the level's bays ..." if part is None
                                 else f"level not computed: {printable(part.error)}",
                                 style="dim" if part is None else "bold red"))
            return
        bay = bay_lines(part.value, self._mark)
        loads = girder_load_lines(part.value, self._mark)
        bay_box.display = bool(bay)
        concrete_box.display = bool(bay) or bool(job.zone)
        if bay:
            bay_box.title = "Bay: mid-bay deflection, camber alternatives, derived girder loads"
            bay_text.update(_lines_text(bay + (["", "Girder loads derived from the beams resting on them (kip):", *loads]
                                               if loads else [])))
        concrete.update(_lines_text(concrete_lines(part.value)))

    def _profile(self, con) -> None:
        """The predicted pre-composite deflection against the camber ordered and the camber the
        shop may deliver (engine.mechanics.ponding.camber_shape scaled by the engine's camber values)."""
        from engine.mechanics.ponding import camber_shape

        x, b, d = con.x, con.beam, con.camber
        series = [Series("pre-composite dead-load deflection", x, con.run.total, tone=0)]
        if d.camber > 0:
            shape = camber_shape(x, b.span)
            series += [Series(f"camber {format_inches(d.camber)} ordered", x, d.camber * shape, tone=2),
                       Series(f"camber {format_inches(d.camber + d.tolerance)} (+tolerance)", x,
                              (d.camber + d.tolerance) * shape, tone=3)]
        self.query_one(TerminalPlot).plot(series, b.span, downward=True, fmt=signed_inches)

    def _schedule(self, outcomes: list[BeamOutcome | None]) -> None:
        """One row per beam; a row is built once per outcome (a 2,000-beam job rebuilds only the
        rows of beams that changed)."""
        rows = []
        for k, o in enumerate(outcomes):
            if o is None:
                rows.append(("", "", "", "", Text(PENDING, style="dim"), "", Text(PENDING, style="dim")))
                continue
            hit = self._rows.get(id(o))
            if hit is None or hit[0] is not o:
                hit = self._rows[id(o)] = (o, schedule_row(o))
            rows.append(hit[1])
        if len(self._rows) > 2 * len(outcomes) + 64:
            self._rows = {id(o): self._rows[id(o)] for o in outcomes if o is not None and id(o) in self._rows}
        self.query_one("#camber-schedule", Table).set_rows(rows)


def _lines_text(lines: list[str]) -> Text:
    """Report lines as literal text (marks and zone names are never markup); headings and the
    bay's remark stand out."""
    out = Text()
    for k, line in enumerate(lines):
        style = ("bold" if line.startswith(("  Bay of girder", "Girder loads", "Concrete to order"))
                 else "bold italic" if line.lstrip().startswith("NOTE:") else "")
        out.append(printable(line), style=style)
        if k < len(lines) - 1:
            out.append("\n")
    return out


def schedule_row(o: BeamOutcome) -> tuple:
    """A beam's row of the camber schedule: mark, shape, span, predicted, camber, why, construction."""
    con = o.construction.value
    if con is None:
        return (o.beam.mark, o.beam.shape.name, "", "", word("error"), o.construction.error or "", word("error"))
    d = con.camber
    return (o.beam.mark, o.beam.shape.name, station(o.beam.span), signed_inches(d.predicted),
            Text(camber_word(o), style="bold"), d.reason,
            verdict_cell(str(con.verdict), governing_check(con.checks).ratio if con.checks else None))
