"""The fieldcomp workbench (Textual): one job, beam by beam, every pane live.

Edits go through `JobSession` (the job-file loader's validation, undo); engine work runs in a
thread worker that posts `ResultsReady`; files are saved atomically with a .bak, guarded against
changes on disk; unsaved edits are kept in a recovery file that the next start offers back.
"""

from __future__ import annotations

import datetime
import gc
import sys
import time
from functools import partial
from pathlib import Path
from typing import Callable, Iterator

from textual import work
from textual.worker import get_current_worker
from textual.app import App
from textual.notifications import SeverityLevel
from textual.binding import Binding
from textual.theme import Theme
from textual.timer import Timer

from engine.model.inputs import BeamInput
from engine.model.text import printable_lines
from fieldcomp.jobs.jobfile import JobFileError
from fieldcomp.tui.files import FileActions
from fieldcomp.tui.palette import WorkbenchCommands
from fieldcomp.jobs.model import Job
from fieldcomp.tui.messages import BeamSelected, EditRequested, OutcomeFinished, ResultsReady, RowRemoved, RowsSet
from fieldcomp.tui.outcome import BeamOutcome, OutcomeCache
from fieldcomp.tui.screens.help import HelpScreen
from fieldcomp.tui.screens.workbench import WorkbenchScreen
from fieldcomp.tui.recovery import default_state_dir
from fieldcomp.tui.session import EditRejectedError, JobSession

THEMES = {
    "light": Theme(name="fieldcomp-light", dark=False, primary="#1D5A85", secondary="#56646F", accent="#A8561C",
                   warning="#9A6400", error="#B3261E", success="#2D7A36", foreground="#1A1C1E",
                   background="#FBFBF8", surface="#F1F1EC", panel="#E3E4DD",
                   variables={"footer-key-foreground": "#1D5A85", "block-cursor-text-style": "bold"}),
    "dark": Theme(name="fieldcomp-dark", dark=True, primary="#6DB0DE", secondary="#9AA8B3", accent="#E39B55",
                  warning="#E3B04B", error="#EF6B60", success="#79C187", foreground="#E4E5E1",
                  background="#14181C", surface="#1C2228", panel="#26303A",
                  variables={"footer-key-foreground": "#6DB0DE"}),
}
DISK_POLL_SECONDS = 2.0
BATCH_SECONDS = 0.1  # a worker sends the results it has at most this often (one update of the panes each)
YIELD_SECONDS = 0.05  # a worker pauses this long after the edited beam's result, so the panes redraw first
RECOVERY_DELAY = 1.0  # s: the recovery file of a large job is written once edits pause this long
RECOVERY_LARGE_JOB = 200  # beams: smaller jobs write their recovery file after every edit
SWITCH_INTERVAL = 0.001  # s: the interface thread gets the interpreter back this soon from a worker
# Actions offered only in the command palette (no key of their own).
PALETTE_ONLY = (
    ("New job from the starter", "Start an untitled job from fieldcomp/jobs/starter.toml.", "new_job"),
    ("Duplicate beam", "Copy the selected beam (new mark) after it (+ in the beam list).", "duplicate_beam"),
    ("Remove beam", "Remove the selected beam, undo brings it back (- in the beam list).", "remove_beam"),
    ("Show keys panel", "Textual's key panel beside the workbench.", "show_help_panel"),
)


class FieldcompApp(FileActions, App[None]):
    CSS_PATH = "app.tcss"
    TITLE = "fieldcomp"
    COMMANDS = App.COMMANDS | {WorkbenchCommands}
    MODES = {"workbench": WorkbenchScreen}
    DEFAULT_MODE = "workbench"
    BINDINGS = [
        Binding("f1", "help", "Help", id="app.help", tooltip="Every key, the panes, how to type values."),
        Binding("ctrl+s", "save", "Save", id="app.save", tooltip="Save the job (atomic; the old file kept as .bak)."),
        Binding("f2", "save_as", "Save as", id="app.save_as", tooltip="Save the job under a new file name."),
        Binding("ctrl+o", "open_job", "Open", id="app.open", show=False, tooltip="Open another job file."),
        Binding("f5", "reopen", "Reopen", id="app.reopen", show=False,
                tooltip="Read the job file again from disk (your edits stay in undo)."),
        Binding("ctrl+z", "undo", "Undo", id="app.undo", tooltip="Undo the last edit."),
        Binding("ctrl+y", "redo", "Redo", id="app.redo", tooltip="Redo the edit just undone."),
        Binding("ctrl+t", "toggle_theme", "Light/dark", id="app.theme", tooltip="Switch between the light and dark theme."),
        Binding("ctrl+q", "quit", "Quit", id="app.quit", priority=True,
                tooltip="Quit; asks first when there are unsaved edits."),
    ]

    def __init__(self, session: JobSession, *, state_dir: Path | None = None, theme: str = "dark",
                 date: str | None = None) -> None:
        """`date`: printed on marks sheets (default: today, YYYY-MM-DD)."""
        gc.freeze()  # the loaded job lives as long as the app: the collector need not walk it again
        sys.setswitchinterval(SWITCH_INTERVAL)  # keys and redraws wait less behind a computing worker
        super().__init__()
        self.session = session
        self.state_dir = state_dir if state_dir is not None else default_state_dir()
        self.cache = OutcomeCache()
        self.date = date or datetime.date.today().isoformat()
        self.outcomes: list[BeamOutcome | None] = []  # per beam; None until its worker result arrives
        self._inputs: list[BeamInput] = []  # the engine inputs of the beams, as `outcomes` were computed
        self.selected = 0
        self.redraw_ms: list[float] = []  # edit accepted -> every pane redrawn, per edit
        self.repair_ms: list[float] = []  # edit accepted -> the repair of the selected beam shown
        self.switch_ms: list[float] = []  # another beam selected -> its panes redrawn
        self._disk_warned = False
        self._recovery_timer: Timer | None = None
        for look in THEMES.values():
            self.register_theme(look)
        self.theme = THEMES[theme].name  # before mount: the CSS is computed once

    # -- start ----------------------------------------------------------------------------------
    def on_mount(self) -> None:
        self.set_interval(DISK_POLL_SECONDS, self.watch_disk)

    def workbench_ready(self) -> None:
        """Called by the workbench once its panes are mounted: first show, then any recovery."""
        self.job_changed(time.perf_counter())
        self.offer_recovery()

    def _showing(self) -> bool:
        return any(isinstance(s, WorkbenchScreen) for s in self.screen_stack)

    @property
    def workbench(self) -> WorkbenchScreen:
        """The workbench screen (at the bottom of the stack, under any dialog)."""
        return next(s for s in self.screen_stack if isinstance(s, WorkbenchScreen))

    # -- edits and recompute ----------------------------------------------------------------------
    def on_edit_requested(self, message: EditRequested) -> None:
        started = time.perf_counter()
        try:
            changed = self.session.set_text(message.path, message.text)
        except EditRejectedError as exc:
            self.notify(str(exc), title="Not accepted", severity="error")
            return
        if changed:
            self.job_changed(started)

    def on_rows_set(self, message: RowsSet) -> None:
        self._apply(lambda: self.session.set_rows(message.path, message.rows, message.description))

    def on_row_removed(self, message: RowRemoved) -> None:
        self._apply(lambda: self.session.remove(message.path, message.index, message.description))

    def _apply(self, edit: Callable[[], bool]) -> None:
        started = time.perf_counter()
        try:
            changed = edit()
        except EditRejectedError as exc:
            self.notify(str(exc), title="Not accepted", severity="error")
            return
        if changed:
            self.job_changed(started)

    def job_changed(self, started: float) -> None:
        """The job changed (edit, undo, open): the beams whose engine inputs changed are
        recomputed in a worker, the selected one first; the others keep their outcomes."""
        self.selected = max(0, min(self.selected, len(self.session.job.beam) - 1))
        self.update_title()
        try:
            inputs = self.session.engine_beams()
        except JobFileError as exc:  # cannot happen for a validated job; shown, not raised
            self.notify(str(exc), title="Not computed", severity="error")
            return
        known = {id(o.beam_in): o for o in self.outcomes if o is not None}
        had = {k for k, o in enumerate(self.outcomes) if o is not None} if len(inputs) == len(self.outcomes) else set()
        self.outcomes = [known.get(id(b)) for b in inputs]
        self._inputs = inputs
        todo = [k for k, o in enumerate(self.outcomes) if o is None]
        todo.sort(key=lambda k: (k != self.selected, k not in had))  # the selected, then the edited beams
        self.workbench.show_job(self.session, self.selected)
        self.show_outcomes(changed=todo if had else None)  # the rows of the beams to recompute say so
        version = self.session.version
        if todo:
            self.recompute(version, [(k, inputs[k]) for k in todo], list(self.outcomes), started)
        else:
            self.call_after_refresh(self._redrawn, version, started)

    @work(exclusive=True, thread=True, group="compute", description="recompute the changed beams")
    def recompute(self, version: int, todo: list[tuple[int, BeamInput]], known: list[BeamOutcome | None],
                  started: float) -> None:
        """First pass of every beam in `todo` (the selected beam first, alone in its message),
        then the second pass (sheets, repair) of the selected beam and of every other beam."""
        worker = get_current_worker()
        name, date = self.session.job.project.name, self.date
        batch: list[tuple[int, BeamOutcome]] = []
        sent = time.perf_counter()
        for n, (k, beam) in enumerate(todo):
            if worker.is_cancelled:
                return
            known[k] = self.cache.get(beam, name, date)
            batch.append((k, known[k]))
            if n == 0 or time.perf_counter() - sent > BATCH_SECONDS:
                self.post_message(ResultsReady(version, batch, started))
                batch, sent = [], time.perf_counter()
        if batch:
            self.post_message(ResultsReady(version, batch, started))
        time.sleep(YIELD_SECONDS)  # the panes redraw before the second pass takes the interpreter
        pending = [k for k, o in enumerate(known) if o is not None and not o.finished_all]
        pending.sort(key=lambda k: k != self.selected)
        for n, k in enumerate(pending):
            if worker.is_cancelled:
                return
            known[k] = self.cache.finished(known[k])  # type: ignore[arg-type]
            batch.append((k, known[k]))
            if n == 0 or time.perf_counter() - sent > BATCH_SECONDS:
                self.post_message(OutcomeFinished(version, batch, started))
                batch, sent = [], time.perf_counter()
        if batch:
            self.post_message(OutcomeFinished(version, batch, started))

    def on_results_ready(self, message: ResultsReady) -> None:
        if message.version != self.session.version or not self._showing():
            return  # a later edit is on its way, or the app is closing
        for k, outcome in message.updates:
            self.outcomes[k] = outcome
        self.show_outcomes(changed=[k for k, _ in message.updates])
        if any(k == self.selected for k, _ in message.updates):
            self.call_after_refresh(self._redrawn, message.version, message.started)

    def _redrawn(self, version: int, started: float) -> None:
        """The selected beam's panes are on screen: log the time, keep the recovery file."""
        self.redraw_ms.append((time.perf_counter() - started) * 1000.0)
        if version == self.session.version:
            if self._recovery_timer is not None:
                self._recovery_timer.stop()
                self._recovery_timer = None
            if len(self.session.job.beam) < RECOVERY_LARGE_JOB:
                self._keep_recovery_now()
            else:
                self._recovery_timer = self.set_timer(RECOVERY_DELAY, self._keep_recovery_now)

    def _keep_recovery_now(self) -> None:
        """Write the recovery file once edits pause (writing a large job takes the interpreter)."""
        self._recovery_timer = None
        self.keep_recovery(self.session.job if self.session.dirty else None)

    def on_outcome_finished(self, message: OutcomeFinished) -> None:
        if message.version != self.session.version or not self._showing():
            return
        for k, outcome in message.updates:
            if k < len(self.outcomes):
                self.outcomes[k] = outcome
        if any(k == self.selected for k, _ in message.updates):
            self.show_outcomes(changed=[])
            if self.outcomes[self.selected].needs_repair:  # type: ignore[union-attr]
                self.call_after_refresh(self._repair_shown, message.started)

    def _repair_shown(self, started: float) -> None:
        self.repair_ms.append((time.perf_counter() - started) * 1000.0)

    def show_outcomes(self, changed: list[int] | None) -> None:
        """Update the beam list (every row, or the rows `changed`) and the visible pane."""
        if len(self.outcomes) != len(self.session.job.beam):
            return
        marks = [b.mark for b in self.session.job.beam]
        self.workbench.show_outcomes(marks, self.outcomes, self.selected, changed)

    def on_beam_selected(self, message: BeamSelected) -> None:
        if message.index != self.selected:
            self.select_beam(message.index)

    def select_beam(self, index: int) -> None:
        """Show another beam: its outcome now (computed here if the worker has not reached it),
        its sheets and repair from a worker."""
        started = time.perf_counter()
        self.selected = max(0, min(index, len(self.session.job.beam) - 1))
        if self.selected < len(self.outcomes) and self.outcomes[self.selected] is None:
            beam = self._inputs[self.selected]
            self.outcomes[self.selected] = self.cache.get(beam, self.session.job.project.name, self.date)
        self.workbench.show_job(self.session, self.selected)
        self.show_outcomes(changed=[self.selected])
        self.call_after_refresh(lambda: self.switch_ms.append((time.perf_counter() - started) * 1000.0))
        outcome = self.outcomes[self.selected] if self.selected < len(self.outcomes) else None
        if outcome is not None and not outcome.finished_all:
            self.finish_selected(self.session.version, self.selected, outcome)

    @work(exclusive=True, thread=True, group="finish", description="sheets and repair of the selected beam")
    def finish_selected(self, version: int, index: int, outcome: BeamOutcome) -> None:
        self.post_message(OutcomeFinished(version, [(index, self.cache.finished(outcome))], time.perf_counter()))

    def notify(self, message: str, *, title: str = "", severity: SeverityLevel = "information",
               timeout: float | None = None, markup: bool = True) -> None:
        """Every notification as plain text: messages quote marks, paths and typed values."""
        super().notify(printable_lines(message), title=printable_lines(title), severity=severity, timeout=timeout,
                       markup=False)

    def update_title(self) -> None:
        s = self.session
        self.title = printable_lines(f"fieldcomp - {s.job.project.name}")
        self.sub_title = printable_lines(f"{s.where}{'  [modified]' if s.dirty else ''}")

    # -- undo, beams --------------------------------------------------------------------------------
    def action_undo(self) -> None:
        what = self.session.undo()
        if what is None:
            self.notify("Nothing to undo.")
            return
        self.notify(f"Undone: {what}")
        self.job_changed(time.perf_counter())

    def action_redo(self) -> None:
        what = self.session.redo()
        if what is None:
            self.notify("Nothing to redo.")
            return
        self.notify(f"Redone: {what}")
        self.job_changed(time.perf_counter())

    def action_duplicate_beam(self) -> None:
        job = self.session.job
        marks = {b.mark for b in job.beam}
        source = job.beam[self.selected]
        mark = next(f"{source.mark}-{n}" for n in range(2, 1000) if f"{source.mark}-{n}" not in marks)
        item = source.model_copy(update={"mark": mark}).model_dump(mode="json", exclude_none=True)

        def change(raw: dict) -> None:
            raw["beam"].insert(self.selected + 1, item)
        self._apply(lambda: self.session.apply(change, f"duplicate beam {source.mark} as {mark}"))
        self.select_beam(self.selected + 1)

    def action_remove_beam(self) -> None:
        mark = self.session.job.beam[self.selected].mark
        self._apply(lambda: self.session.remove(("beam",), self.selected, f"remove beam {mark}"))

    # -- views ----------------------------------------------------------------------------------------
    def action_toggle_theme(self) -> None:
        self.theme = THEMES["light" if self.theme == THEMES["dark"].name else "dark"].name

    def all_bindings(self) -> list[Binding]:
        out = list(Binding.make_bindings(self.BINDINGS))
        out += list(Binding.make_bindings(WorkbenchScreen.BINDINGS))
        out.append(Binding(self.COMMAND_PALETTE_BINDING, "command_palette", "Commands", id="app.palette",
                           tooltip="Search every action and beam by name."))
        return out

    def local_bindings(self) -> list[tuple[str, list[Binding]]]:
        """Keys that work where the focus is: (where, bindings)."""
        from fieldcomp.tui.widgets.beam_list import BeamList
        from fieldcomp.tui.widgets.pane_findings import FindingsPane
        from fieldcomp.tui.widgets.pane_pour import PourPane
        from fieldcomp.tui.widgets.pane_sheet import SheetPane

        return [("beam list", list(Binding.make_bindings(BeamList.BINDINGS))),
                ("Pour pane", list(Binding.make_bindings(PourPane.BINDINGS))),
                ("Findings pane", list(Binding.make_bindings(FindingsPane.BINDINGS))),
                ("Sheet pane", list(Binding.make_bindings(SheetPane.BINDINGS)))]

    def action_help(self) -> None:
        if not isinstance(self.screen, HelpScreen):
            self.push_screen(HelpScreen(self.all_bindings(), self.local_bindings()))

    def palette_actions(self) -> Iterator[tuple[str, str, Callable[[], object]]]:
        """(name, help, callback) of every action for the command palette."""
        screen_actions = {b.action for b in Binding.make_bindings(WorkbenchScreen.BINDINGS)}
        for b in self.all_bindings():
            if b.action == "command_palette":
                continue
            target = self.workbench if b.action in screen_actions else self
            yield b.description, f"{b.tooltip} ({self.get_key_display(b)})", partial(self.run_action, b.action, target)
        for name, help_text, action in PALETTE_ONLY:
            yield name, help_text, partial(self.run_action, action, self)
