"""Beam pane: the beam's inputs and the finished-beam checks with the strength envelope."""

from __future__ import annotations

from rich.text import Text
from textual.app import ComposeResult
from textual.widgets import Static

from engine.model.inputs import Method
from engine.model.text import printable
from fieldcomp.tui.outcome import BeamOutcome
from fieldcomp.tui.plain import plain
from fieldcomp.tui.session import JobSession
from fieldcomp.tui.widgets.checks_table import ChecksTable
from fieldcomp.tui.widgets.field_form import FieldForm, FieldSpec
from fieldcomp.tui.widgets.fmt import station
from fieldcomp.tui.widgets.pane_base import Pane
from fieldcomp.tui.widgets.plot import Series, TerminalPlot
from fieldcomp.tui.widgets.verdict import word
from fieldcomp.views.numbers import ratio_text

LENGTH = "a length with units: 32'-6 1/2\", 45 ft, 6.5 in, 1650 mm"
BEAM_FIELDS = (
    FieldSpec("mark", ("mark",), "Beam mark as on the framing plan."),
    FieldSpec("shape", ("shape",), "W shape, e.g. W21X50 (`fieldcomp shapes` lists them)."),
    FieldSpec("span", ("span",), f"Span between support centrelines: {LENGTH}."),
    FieldSpec("slab", ("slab",), "Slab of this beam.", choices_from="slab"),
    FieldSpec("deck", ("deck_orientation",), "Deck ribs relative to the beam.", ("perpendicular", "parallel")),
    FieldSpec("Fy ksi", ("fy_ksi",), "Steel yield stress, ksi."),
    FieldSpec("spacing L", ("spacing_left",), "Distance to the adjacent beam on the left (clears edge L)."),
    FieldSpec("spacing R", ("spacing_right",), "Distance to the adjacent beam on the right (clears edge R)."),
    FieldSpec("load width", ("load_width",), "Tributary width for area loads; blank: from the spacings."),
    FieldSpec("edge L", ("edge_left",), "Distance to the slab edge on the left (clears spacing L)."),
    FieldSpec("edge R", ("edge_right",), "Distance to the slab edge on the right (clears spacing R)."),
    FieldSpec("screed", ("screed",), "How the slab is screeded.", ("constant-thickness", "level")),
    FieldSpec("SDL psf", ("superimposed_dead_psf",), "Dead load added after the slab cures, psf."),
    FieldSpec("live psf", ("live_psf",), "Live load on the finished floor, psf."),
    FieldSpec("constr. psf", ("construction_live_psf",), "Construction live load while placing, psf (ASCE/SEI 37)."),
    FieldSpec("studs", ("studs", "count"), "Studs on the whole beam, or \"design\"."),
    FieldSpec("stud length", ("studs", "length"), "Installed stud length."),
    FieldSpec("stud dia", ("studs", "diameter"), "Stud shank diameter."),
    FieldSpec("position", ("studs", "position"), "Stud position in the rib (AISC 360-22 I8.2a).", ("strong", "weak", "center")),
    FieldSpec("per rib max", ("studs", "max_per_rib"), "Most studs the job allows in one rib."),
    FieldSpec("camber", ("camber",), "\"none\" for beams that must not be cambered.", ("auto", "none")),
    FieldSpec("ref. end", ("reference_end",), "Name of the end stations are measured from."),
    FieldSpec("far end", ("far_end",), "Name of the other end."),
    FieldSpec("no camber why", ("no_camber_reason",), "Why not to camber (spandrel, moment-connected ...)."),
    FieldSpec("live L/", ("live_limit_ratio",), "Live-load deflection limit, span / ratio."),
    FieldSpec("total L/", ("total_limit_ratio",), "Total deflection limit, span / ratio."),
    FieldSpec("unbraced", ("unbraced_length",), "Unbraced top flange while wet; blank: braced by the deck."),
)


class BeamPane(Pane):
    def build(self) -> ComposeResult:
        yield Static("", classes="pane--head", id="beam-head")
        yield FieldForm(BEAM_FIELDS, id="beam-form", columns=3)
        yield Static("", id="beam-summary")
        yield TerminalPlot("Strength along the span", id="beam-envelope")
        yield Static("Finished-beam checks", classes="pane--section")
        yield ChecksTable(id="beam-checks")
        yield Static("", id="beam-flags", classes="pane--warn")

    def show_job(self, session: JobSession, index: int) -> None:
        self.query_one(FieldForm).show(session, ("beam", index))

    def show_outcome(self, outcome: BeamOutcome | None, outcomes: list[BeamOutcome]) -> None:
        head = self.query_one("#beam-head", Static)
        plot = self.query_one(TerminalPlot)
        r = outcome.result if outcome else None
        if outcome is None or r is None:
            head.update(Text(printable(outcome.finished.error) if outcome else "no beam", style="bold red"))
            plot.clear("not computed")
            self.query_one(ChecksTable).show([])
            return
        b, gov = r.beam, r.governing
        head.update(Text.assemble(f"{b.mark}  {b.shape.name}  span {station(b.span)}  {b.method}   as designed ",
                                  word(str(r.verdict), badge=True), f"   governing: {gov.name}, ratio {ratio_text(gov.ratio)}"))
        k = r.critical
        word_cap = "phi Mn" if b.method == Method.LRFD else "Mn/Omega"
        word_dem = "Mu" if b.method == Method.LRFD else "Ma"
        self.query_one("#beam-summary", Static).update(plain(
            f"b_eff {station(r.b_eff)}   studs {r.groups.total}, Qn {r.qn_per_stud:.1f} kip (weakest)   "
            f"sum Qn {r.sum_qn_left:.0f}/{r.sum_qn_right:.0f} kip   composite {r.composite_ratio:.0%}   "
            f"PNA in {r.pna}   I_LB {r.i_lb:,.0f} in4   {word_dem} {r.demand[k] / 12:,.0f} / "
            f"{word_cap} {r.capacity[k] / 12:,.0f} kip-ft at {station(r.x[k])}"))
        plot.plot([Series(f"{word_dem} demand", r.x, r.demand / 12.0, hatch=True, over=r.demand > r.capacity, tone=4),
                   Series(f"{word_cap} available", r.x, r.capacity / 12.0, tone=0)],
                  b.span, unit="kip-ft", fmt=lambda v: f"{v:,.0f} k-ft")
        self.query_one(ChecksTable).show(r.checks)
        self.query_one("#beam-flags", Static).update(plain("\n".join(f"note [{f.clause}] {f.message}" for f in r.flags)))
