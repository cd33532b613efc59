"""File handling of the workbench: save (atomic, .bak kept), save as, open, reopen, the guard
for unsaved edits, the recovery file of unsaved edits, and a job file changed on disk by
someone else (detected before it is overwritten). Mixed into `FieldcompApp`.
"""

from __future__ import annotations

import time
from pathlib import Path
from typing import Callable

from textual import work

from fieldcomp.jobs.jobfile import ChangedOnDiskError, JobFileError
from fieldcomp.tui.dialogs import AskPath, Choice
from fieldcomp.tui.session import JobSession, discard_recovery, read_recovery, write_recovery


class FileActions:
    """Actions on the job file; the app provides `session`, `state_dir`, `job_changed`,
    `update_title`, `notify`, `push_screen` and `exit`."""

    _disk_warned = False

    def action_save(self) -> None:
        self.save_then(None)

    def save_then(self, after: Callable[[], None] | None, path: Path | None = None, overwrite: bool = False) -> None:
        """Save (to `path`, or the job's own file), then run `after`. Asks for a name when the
        job is untitled, and asks before overwriting a file someone else changed."""
        if path is None and self.session.path is None:
            self.action_save_as(after)
            return
        old = self.session.path
        try:
            saved = self.session.save(path, overwrite=overwrite)
        except ChangedOnDiskError:
            self.push_screen(Choice(
                "Changed on disk", f"{self.session.where} was changed by someone else since it was opened. "
                "Saving now would overwrite their edit.",
                [("cancel", "Cancel", "default"), ("save_as", "Save as...", "primary"),
                 ("overwrite", "Overwrite", "error"), ("reopen", "Reopen theirs", "warning")],
                id="changed-on-disk"), lambda answer: self._changed_answer(answer, after))
            return
        except OSError as exc:
            self.notify(f"Not saved: {exc}", severity="error")
            return
        if old is not None and old != saved:
            discard_recovery(self.state_dir, old)
        discard_recovery(self.state_dir, saved)
        self._disk_warned = False
        self.update_title()
        self.notify(f"Saved {saved}")
        if after is not None:
            after()

    def _changed_answer(self, answer: str | None, after: Callable[[], None] | None) -> None:
        if answer == "overwrite":
            self.save_then(after, overwrite=True)
        elif answer == "save_as":
            self.action_save_as(after)
        elif answer == "reopen":
            self.action_reopen()

    def action_save_as(self, after: Callable[[], None] | None = None) -> None:
        initial = str(self.session.path) if self.session.path else str(Path.cwd() / "untitled.toml")

        def chosen(path: Path | None) -> None:
            if path is None:
                return
            same = self.session.path is not None and path.resolve() == self.session.path.resolve()
            if path.exists() and not same:
                self.push_screen(Choice("Replace file?", f"{path} exists. Replace it (kept as .bak)?",
                                        [("cancel", "Cancel", "default"), ("replace", "Replace", "error")]),
                                 lambda answer: answer == "replace" and self.save_then(after, path, overwrite=True))
                return
            self.save_then(after, path)
        self.push_screen(AskPath("Save job as", initial, "A .toml file; Enter saves, Escape cancels."), chosen)

    def action_reopen(self) -> None:
        if self.session.path is None:
            self.notify("An untitled job has no file to reopen.", severity="warning")
            return
        try:
            self.session.reload()
        except JobFileError as exc:
            self.notify(str(exc), title="Cannot reopen", severity="error", timeout=10)
            return
        self._disk_warned = False
        self.notify(f"Reopened {self.session.path.name}; ctrl+z brings back the edits it replaced.")
        self.job_changed(time.perf_counter())

    def action_open_job(self) -> None:
        def chosen(path: Path | None) -> None:
            if path is not None:
                self.guard_unsaved(lambda: self.switch_session(lambda: JobSession.open(path)), "open another job")
        self.push_screen(AskPath("Open job", str(self.session.path or Path.cwd()), "Path of a .toml job file."), chosen)

    def action_new_job(self) -> None:
        self.guard_unsaved(lambda: self.switch_session(JobSession.untitled), "start a new job")

    def switch_session(self, make: Callable[[], JobSession]) -> None:
        try:
            session = make()
        except JobFileError as exc:
            self.notify(str(exc), title="Cannot open", severity="error", timeout=10)
            return
        discard_recovery(self.state_dir, self.session.path)
        self.session, self.selected, self.outcomes, self._disk_warned = session, 0, [], False
        self.job_changed(time.perf_counter())
        self.offer_recovery()

    def guard_unsaved(self, then: Callable[[], None], doing: str) -> None:
        """Run `then` now, or after asking what to do with unsaved edits."""
        if not self.session.dirty:
            then()
            return

        def answer(choice: str | None) -> None:
            if choice == "save":
                self.save_then(then)
            elif choice == "discard":
                discard_recovery(self.state_dir, self.session.path)
                then()
        self.push_screen(Choice("Unsaved edits", f"{self.session.name} has unsaved edits. Save them before you {doing}?",
                                [("save", "Save", "primary"), ("discard", "Discard", "error"),
                                 ("cancel", "Cancel", "default")], id="unsaved"), answer)

    async def action_quit(self) -> None:
        self.guard_unsaved(self.exit, "quit")

    @work(exclusive=True, thread=True, group="recovery", description="keep the recovery file")
    def keep_recovery(self, job) -> None:
        """Write the unsaved job to its recovery file (or remove it once nothing is unsaved)."""
        if job is None:
            discard_recovery(self.state_dir, self.session.path)
        else:
            write_recovery(self.state_dir, self.session.path, job)

    def offer_recovery(self) -> None:
        job = read_recovery(self.state_dir, self.session.path)
        if job is None or job == self.session.job:
            return

        def answer(choice: str | None) -> None:
            if choice == "restore":
                self.session.replace_job(job, "restore unsaved edits")
                self.job_changed(time.perf_counter())
                self.notify("Unsaved edits restored; save to keep them.")
            elif choice == "discard":
                discard_recovery(self.state_dir, self.session.path)
        self.push_screen(Choice("Unsaved edits found",
                                f"fieldcomp stopped before {self.session.name} was saved. Restore the unsaved edits?",
                                [("restore", "Restore", "primary"), ("discard", "Discard them", "error"),
                                 ("cancel", "Later", "default")], id="recovery"), answer)

    def watch_disk(self) -> None:
        if self._disk_warned or not self.session.changed_on_disk():
            return
        self._disk_warned = True
        self.notify(f"{self.session.where} changed on disk. F5 reopens it; saving asks before overwriting.",
                    title="Changed on disk", severity="warning", timeout=12)

