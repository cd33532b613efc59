"""Pour pane: the stage editor and each stage's and the cumulative deflection profiles."""

from __future__ import annotations

from typing import Any

from rich.text import Text
from textual.app import ComposeResult
from textual.widgets import Static

from fieldcomp.tui.outcome import BeamOutcome
from fieldcomp.tui.plain import plain
from fieldcomp.tui.session import JobSession
from fieldcomp.tui.widgets.field_form import FieldSpec
from fieldcomp.tui.widgets.fmt import signed_inches, station
from fieldcomp.tui.widgets.pane_base import ROW_KEYS, Pane
from fieldcomp.tui.widgets.plot import Series, TerminalPlot
from fieldcomp.tui.widgets.row_editor import RowEditor
from fieldcomp.tui.widgets.table import TextTable
from fieldcomp.views.numbers import ratio_text

IN3_PER_FT3 = 1728.0  # unit conversion
STAGE_FIELDS = (
    FieldSpec("name", ("name",), "Stage name."),
    FieldSpec("start", ("start",), "Station where this stage's concrete starts."),
    FieldSpec("end", ("end",), "Station where it ends; blank: the far end."),
    FieldSpec("side", ("side",), "Side of the beam the concrete is placed on.", ("both", "left", "right")),
    FieldSpec("day", ("day",), "Days after the first placement."),
    FieldSpec("screed", ("screed",), "Overrides the beam's screeding mode; blank: the beam's.",
              ("constant-thickness", "level"), optional=True),
)


def with_new_stage(rows: list[dict[str, Any]], beam: Any) -> list[dict[str, Any]]:
    """A new stage a day after the last: the far half of the last stage's length (the whole
    span when there is none), so the plan stays one the engine accepts."""
    from engine.model.units import format_ft_in, parse_length

    if not rows:
        return [{"name": "stage 1", "start": "0 in", "day": 0}]
    last = dict(rows[-1])
    start = parse_length(last.get("start", "0 in"))
    end = parse_length(last["end"]) if "end" in last else parse_length(beam.span)
    mid = format_ft_in((start + end) / 2.0)
    new = {"name": f"stage {len(rows) + 1}", "start": mid, "day": last.get("day", 0) + 1, "side": last.get("side", "both")}
    if "end" in last:
        new["end"] = last["end"]
    last["end"] = mid
    return rows[:-1] + [last, new]


class PourPane(Pane):
    BINDINGS = ROW_KEYS

    def build(self) -> ComposeResult:
        yield Static("", classes="pane--head", id="pour-head")
        yield RowEditor("pour", "stage", STAGE_FIELDS, with_new_stage, id="pour-stages",
                        empty="No stages: the whole slab is placed at once (one stage). Add a stage to plan the pour.")
        yield Static("Steps in time order (bare steel; 'cured': earlier concrete acting at its age; "
                     "vs nominal: concrete beyond the nominal slab, negative where camber leaves it thinner)",
                     classes="pane--section")
        yield TextTable("step", "day", "placed", "screed", "adds", "total", "total cured", "constr. live", "flexure ratio",
                        "stress ksi", "vs nominal ft3", id="pour-steps", keep=("day", "flexure ratio", "stress ksi"))
        yield TerminalPlot("Deflection added by each step (down)", id="pour-step-plot")
        yield TerminalPlot("Cumulative deflection after each step (down)", id="pour-total-plot")
        yield Static("", id="pour-notes", classes="pane--note")


    def show_job(self, session: JobSession, index: int) -> None:
        self.query_one(RowEditor).show(session, index)
        beam = session.job.beam[index]
        self.query_one("#pour-head", Static).update(
            plain(f"{beam.mark}: pour plan, screed {beam.screed}, construction live {beam.construction_live_psf:g} psf"))

    def show_outcome(self, outcome: BeamOutcome | None, outcomes: list[BeamOutcome]) -> None:
        table = self.query_one("#pour-steps", TextTable)
        con = outcome.construction.value if outcome else None
        notes = self.query_one("#pour-notes", Static)
        if outcome is None or con is None:
            for plot in self.query(TerminalPlot):
                plot.clear("not computed")
            notes.update(Text(outcome.construction.error if outcome else "", style="bold red"))
            table.set_rows([])
            return
        b = con.beam
        rows = []
        for st in con.stages:
            where = "steel, deck" if st.kind == "erection" else f"{station(st.start)}-{station(st.end)} {st.side}"
            ratio = st.demand / st.capacity if st.capacity > 0 else float("inf")
            rows.append((st.name, f"{st.day:g}", where, st.screed if st.kind != "erection" else "",
                          signed_inches(st.deflection), signed_inches(st.cumulative), signed_inches(st.cumulative_cured),
                          signed_inches(st.live_deflection), Text(ratio_text(ratio), style="" if ratio <= 1 else "bold red"),
                          f"{st.stress:.1f}", f"{st.ponded_volume / IN3_PER_FT3:.1f}"))
        table.set_rows(rows)
        x, names = con.x, [st.name for st in con.stages]
        fmt = signed_inches
        self.query_one("#pour-step-plot", TerminalPlot).plot(
            [Series(n, x, con.run.dead[k], tone=k) for k, n in enumerate(names)], b.span, downward=True, fmt=fmt)
        cum = con.run.cumulative
        series = [Series(f"after {n}", x, cum[k], tone=k) for k, n in enumerate(names)]
        series.append(Series("final, cured", x, con.cured.cumulative[-1], tone=5))
        self.query_one("#pour-total-plot", TerminalPlot).plot(series, b.span, downward=True, fmt=fmt)
        ponding = ""
        if con.ponded_weight > 0:
            ponding = (f"Level screed: {con.ponded_weight:.2f} kip of concrete ponds beyond the nominal thickness "
                       f"({con.ponding_extra_psf:.1f} psf over the tributary area, {con.ponded_share:.0%} of the slab). ")
        notes.update(plain(ponding + f"Bracing while wet: {con.bracing.note}"))
