"""The workbench screen: beam list, the six panes, the caution line and the footer."""

from __future__ import annotations

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal
from textual.screen import Screen
from textual.widgets import Footer, Header, TabbedContent, TabPane

from fieldcomp.tui.outcome import BeamOutcome
from fieldcomp.tui.session import JobSession
from fieldcomp.tui.widgets.beam_list import BeamList
from fieldcomp.tui.widgets.caution import CautionLine
from fieldcomp.tui.widgets.pane_base import Pane
from fieldcomp.tui.widgets.pane_beam import BeamPane
from fieldcomp.tui.widgets.pane_camber import CamberPane
from fieldcomp.tui.widgets.pane_findings import FindingsPane
from fieldcomp.tui.widgets.pane_pour import PourPane
from fieldcomp.tui.widgets.pane_sheet import SheetPane
from fieldcomp.tui.widgets.pane_studs import StudsPane

PANES = (("beam", "Beam", BeamPane), ("pour", "Pour", PourPane), ("camber", "Camber", CamberPane),
         ("studs", "Studs", StudsPane), ("findings", "Findings", FindingsPane), ("sheet", "Sheet", SheetPane))
PANE_KEYS = Binding.Group("panes", compact=True)


class WorkbenchScreen(Screen[None]):
    CSS_PATH = "workbench.tcss"
    BINDINGS = [
        *(Binding(str(k), f"pane('{key}')", title, id=f"pane.{key}", group=PANE_KEYS,
                  tooltip=f"Show the {title} pane (outside text fields).")
          for k, (key, title, _) in enumerate(PANES, start=1)),
        Binding("[", "step_beam(-1)", "Previous beam", id="beam.previous", show=False,
                tooltip="Select the beam above in the list."),
        Binding("]", "step_beam(1)", "Next beam", id="beam.next", show=False,
                tooltip="Select the beam below in the list."),
        Binding("ctrl+b", "focus_beams", "Beams", id="beam.list", show=False,
                tooltip="Move the focus to the beam list."),
    ]

    def compose(self) -> ComposeResult:
        yield Header(icon="≡")
        with Horizontal(id="main"):
            yield BeamList(id="beams")
            with TabbedContent(id="panes"):
                for key, title, cls in PANES:
                    with TabPane(title, id=f"tab-{key}"):
                        yield cls(id=f"pane-{key}")
        yield CautionLine()
        yield Footer()

    def on_mount(self) -> None:
        self._job: tuple[JobSession, int] | None = None
        self._outcome: tuple[BeamOutcome | None, list[BeamOutcome]] | None = None
        self._stale_job: set[str | None] = set()
        self._stale_outcome: set[str | None] = set()
        self.app.workbench_ready()  # type: ignore[attr-defined]

    def active_pane(self) -> Pane:
        return self.query_one(f"#pane-{self.query_one(TabbedContent).active.removeprefix('tab-')}", Pane)

    def show_job(self, session: JobSession, index: int) -> None:
        """Inputs changed (edit, undo, other beam): refill the visible pane now, the others
        when they are shown (hidden panes cost nothing until then)."""
        self._job = (session, index)
        self._stale_job = {p.id for p in self.query(Pane)}
        self._show_active()

    def show_outcomes(self, marks: list[str], outcomes: list[BeamOutcome], index: int) -> None:
        verdicts = [(o.verdict, o.governing_ratio) for o in outcomes]
        self.query_one(BeamList).show(marks, verdicts, index)
        self._outcome = (outcomes[index] if 0 <= index < len(outcomes) else None, outcomes)
        self._stale_outcome = {p.id for p in self.query(Pane)}
        self._show_active()

    def _show_active(self) -> None:
        """Bring the visible pane up to date: now if it is built, else once it is."""
        pane = self.active_pane()
        if not pane.built:
            self.call_next(self._build_and_show, pane)
            return
        if pane.id in self._stale_job and self._job is not None:
            self._stale_job.discard(pane.id)
            pane.show_job(*self._job)
        if pane.id in self._stale_outcome and self._outcome is not None:
            self._stale_outcome.discard(pane.id)
            pane.show_outcome(*self._outcome)

    async def _build_and_show(self, pane: Pane) -> None:
        await pane.ensure_built()
        self._show_active()

    def on_tabbed_content_tab_activated(self, event: TabbedContent.TabActivated) -> None:
        self._show_active()

    def action_pane(self, key: str) -> None:
        """Show a pane and move the focus into it (a focused field left in a hidden pane would
        bring its pane back)."""
        self.query_one(TabbedContent).active = f"tab-{key}"
        self.query_one(f"#pane-{key}", Pane).focus()

    def action_step_beam(self, step: int) -> None:
        self.app.select_beam(self.app.selected + step)  # type: ignore[attr-defined]

    def action_focus_beams(self) -> None:
        self.query_one(BeamList).focus()
