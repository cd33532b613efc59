"""Studs pane: the beam drawn with its ribs and studs, the marks, the layout checks."""

from __future__ import annotations

from rich.text import Text
from textual.app import ComposeResult
from textual.widgets import Static

from fieldcomp.outcome import BeamOutcome
from fieldcomp.widgets.checks_table import ChecksTable
from fieldcomp.widgets.fmt import station
from fieldcomp.widgets.pane_base import Pane
from fieldcomp.widgets.strip import StripMark, StudStrip, legend
from fieldcomp.widgets.table import Table

SIDE_WORDS = {"reference": "toward {ref}", "far": "toward {far}", "center": "centred"}


def layout_marks(layout, anchors) -> list[StripMark]:
    """Strip marks of a designed layout: studs per slot, and ribs that need a deck weld."""
    marks = [StripMark(float(x), int(n)) for x, n in zip(layout.x, layout.count) if n > 0]
    marks += [StripMark(float(x), 1, "anchor") for x, a in zip(layout.x, anchors) if a]
    return marks


class StudsPane(Pane):
    def build(self) -> ComposeResult:
        yield Static("", classes="pane--head", id="studs-head")
        yield StudStrip(id="studs-strip")
        yield Static("", id="studs-legend", classes="pane--note")
        yield Static("", id="studs-shortfall", classes="pane--warn")
        yield Static("Marks (stations from the reference end)", classes="pane--section")
        yield Table("rib", "station", "studs", "side of rib", "Qn each", id="studs-marks")
        yield Static("Layout checks", classes="pane--section")
        yield ChecksTable(id="studs-checks")
        yield Static("", id="studs-flags", classes="pane--warn")

    def show_outcome(self, outcome: BeamOutcome | None, outcomes: list[BeamOutcome]) -> None:
        from engine.layout import deck_anchor_slots

        head = self.query_one("#studs-head", Static)
        strip = self.query_one(StudStrip)
        table = self.query_one("#studs-marks", Table)
        table.clear()
        placed = outcome.layout.value if outcome else None
        if outcome is None or placed is None:
            head.update(Text(outcome.layout.error if outcome else "no beam", style="bold red"))
            strip.clear("no layout")
            self.query_one(ChecksTable).show([])
            return
        b, lay = outcome.beam, placed.layout
        anchors = deck_anchor_slots(b, lay)
        mode = "count from the drawings" if placed.mode == "drawings" else "count designed"
        head.update(f"{b.mark}: {lay.total} studs ({mode}); sum Qn {placed.provided_left:.0f} kip toward "
                    f"{b.ribs.reference_end}, {placed.provided_right:.0f} kip toward {b.ribs.far_end}; "
                    f"required {placed.required_sum_qn:.0f} kip each side")
        strip.draw(b.span, lay.x, layout_marks(lay, anchors), ends=(b.ribs.reference_end, b.ribs.far_end),
                   keep_out=(b.ribs.keep_out_start, b.ribs.keep_out_end))
        kinds = {"stud"} | ({"anchor"} if anchors.any() else set())
        self.query_one("#studs-legend", Static).update(legend(kinds))
        self.query_one("#studs-shortfall", Static).update(placed.shortfall or "")
        words = {k: v.format(ref=b.ribs.reference_end, far=b.ribs.far_end) for k, v in SIDE_WORDS.items()}
        for n, x, count, side, qn, anchor in zip(lay.number, lay.x, lay.count, lay.side, lay.qn, anchors):
            if count > 0:
                table.add_row(str(n), station(float(x)), str(int(count)), words.get(str(side), str(side)), f"{qn:.1f} kip")
            elif anchor:
                table.add_row(str(n), station(float(x)), "0", Text("deck weld (no stud)", style="dim"), "")
        self.query_one(ChecksTable).show(placed.checks)
        self.query_one("#studs-flags", Static).update("\n".join(f"note [{f.clause}] {f.message}" for f in placed.flags))
