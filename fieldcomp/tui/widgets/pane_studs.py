"""Studs pane: the beam drawn with its ribs and studs, the marks, the layout checks."""

from __future__ import annotations

from rich.text import Text
from textual.app import ComposeResult
from textual.widgets import Static

from fieldcomp.tui.outcome import BeamOutcome
from fieldcomp.tui.plain import plain
from fieldcomp.tui.widgets.checks_table import ChecksTable
from fieldcomp.tui.widgets.fmt import station
from fieldcomp.tui.widgets.pane_base import Pane
from fieldcomp.tui.widgets.strip import StripMark, StudStrip, legend
from fieldcomp.tui.widgets.table import TextTable

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
        yield Static("Marks", classes="pane--section", id="studs-marks-title")
        yield TextTable("rib", "station", "studs", "side of rib", "Qn each", id="studs-marks", keep=("rib", "studs"))
        yield Static("Layout checks", classes="pane--section")
        yield ChecksTable(id="studs-checks")
        yield Static("", id="studs-flags", classes="pane--warn")

    def show_outcome(self, outcome: BeamOutcome | None, outcomes: list[BeamOutcome]) -> None:
        from engine.studs.ribs import printed_station
        from engine.studs.sheet_data import side_text, station_origin_text

        head = self.query_one("#studs-head", Static)
        strip = self.query_one(StudStrip)
        table = self.query_one("#studs-marks", TextTable)
        placed = outcome.layout.value if outcome else None
        if outcome is None or placed is None:
            head.update(Text(outcome.layout.error if outcome else "no beam", style="bold red"))
            strip.clear("no layout")
            table.set_rows([])
            self.query_one(ChecksTable).show([])
            return
        b, lay = outcome.beam, placed.layout
        anchors = outcome.deck_anchors
        mode = "count from the drawings" if placed.mode == "drawings" else "count designed"
        head.update(plain(f"{b.mark}: {lay.total} studs ({mode}); sum Qn {placed.provided_left:.0f} kip toward "
                          f"{b.ribs.reference_end}, {placed.provided_right:.0f} kip toward {b.ribs.far_end}; "
                          f"required {placed.required_sum_qn:.0f} kip each side"))
        strip.draw(b.span, lay.x, layout_marks(lay, anchors), ends=(b.ribs.reference_end, b.ribs.far_end),
                   keep_out=(b.ribs.keep_out_start, b.ribs.keep_out_end))
        kinds = {"stud"} | ({"anchor"} if anchors.any() else set())
        self.query_one("#studs-legend", Static).update(legend(kinds))
        short = self.query_one("#studs-shortfall", Static)
        short.update(plain(placed.shortfall or ""))
        short.display = bool(placed.shortfall)
        self.query_one("#studs-marks-title", Static).update(plain(f"Marks ({station_origin_text(b)})"))
        rows = []
        for n, x, count, side, qn, anchor in zip(lay.number, lay.x, lay.count, lay.side, lay.qn, anchors):
            at = station(float(printed_station(b, float(x))))
            if count > 0:
                rows.append((str(n), at, str(int(count)), side_text(b, str(side)), f"{qn:.1f} kip"))
            elif anchor:
                rows.append((str(n), at, "0", Text("deck weld (no stud)", style="dim"), ""))
        table.set_rows(rows)
        self.query_one(ChecksTable).show(placed.checks)
        self.query_one("#studs-flags", Static).update(plain("\n".join(f"note [{f.clause}] {f.message}" for f in placed.flags)))
