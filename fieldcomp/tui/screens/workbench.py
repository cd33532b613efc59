"""The workbench screen: beam list, the six panes, the caution line and the footer."""

from __future__ import annotations

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal
from textual.screen import Screen
from textual.widgets import Footer, Header, Input, Select, TabbedContent, TabPane

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
                tooltip="Move the focus to the beam list (showing it if hidden)."),
        Binding("f3", "toggle_beams", "Beam list", id="beam.toggle",
                tooltip="Show or hide the beam list (on narrow screens it takes the whole width while shown)."),
    ]
    NARROW = 120  # columns: below this the beam list starts hidden and, shown, covers the panes

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
        self.set_class(self.app.size.width < self.NARROW, "-beams-hidden")
        self._beams_layout(self.app.size.width)
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

    def show_outcomes(self, marks: list[str], outcomes: list[BeamOutcome | None], index: int,
                      changed: list[int] | None = None) -> None:
        """New results: the beam list's rows of `changed` beams (all when None), then the visible
        pane, once the selected beam's outcome is there (until then its row says so)."""
        self.query_one(BeamList).show(marks, outcomes, index, changed)
        outcome = outcomes[index] if 0 <= index < len(outcomes) else None
        if outcome is None and outcomes:
            return
        others_only = (changed is not None and index not in changed and self._outcome is not None
                       and self._outcome[0] is outcome)
        self._outcome = (outcome, outcomes)
        self._stale_outcome = {p.id for p in self.query(Pane)}
        if others_only and not self.active_pane().lists_every_beam:
            return  # only other beams' rows changed: panes that list every beam follow when shown
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

    def check_action(self, action: str, parameters: tuple[object, ...]) -> bool | None:
        """Pane and beam keys are plain characters: inside a field they are text, never commands."""
        if action in ("pane", "step_beam") and isinstance(self.focused, (Input, Select)):
            return False
        return True

    def action_pane(self, key: str) -> None:
        """Show a pane and move the focus into it (a focused field left in a hidden pane would
        bring its pane back)."""
        self.query_one(TabbedContent).active = f"tab-{key}"
        self.query_one(f"#pane-{key}", Pane).focus()

    def action_step_beam(self, step: int) -> None:
        self.app.select_beam(self.app.selected + step)  # type: ignore[attr-defined]

    def action_focus_beams(self) -> None:
        self._beams_layout(self.size.width, False)
        self.query_one(BeamList).focus()

    def _beams_layout(self, width: int, hidden: bool | None = None) -> None:
        if hidden is not None:
            self.set_class(hidden, "-beams-hidden")
        self.set_class(width < self.NARROW, "-narrow")
        self.set_class(width < self.NARROW and not self.has_class("-beams-hidden"), "-cover")

    def action_toggle_beams(self) -> None:
        hidden = not self.has_class("-beams-hidden")
        self._beams_layout(self.size.width, hidden)
        if hidden:
            self.active_pane().focus()
        else:
            self.query_one(BeamList).focus()

    def on_resize(self) -> None:
        self._beams_layout(self.size.width)

    def on_beam_list_picked(self, event: BeamList.Picked) -> None:
        """Enter in the beam list: on a narrow screen the list gives the panes back."""
        if self.has_class("-narrow"):
            event.stop()
            self._beams_layout(self.size.width, True)
            self.active_pane().focus()
