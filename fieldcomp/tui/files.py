"""File handling of the workbench: save (only the edits, atomic, .bak kept), save as, open,
reopen, the guard for unsaved edits, this workbench's recovery file of unsaved edits (and what
crashed ones left), and a job file changed on disk by someone else (detected before it is
overwritten). Mixed into `FieldcompApp`.
"""

from __future__ import annotations

import time
from functools import partial
from pathlib import Path
from typing import Callable

from textual import work

from fieldcomp.jobs.jobfile import ChangedOnDiskError, JobFileError
from fieldcomp.tui.dialogs import AskPath, Choice
from fieldcomp.tui.recovery import RecoveryFile, read_recovery, recovered_session
from fieldcomp.tui.session import JobSession


class FileActions:
    """Actions on the job file; the app provides `session`, `state_dir`, `job_changed`,
    `update_title`, `notify`, `push_screen` and `exit`."""

    _disk_warned = False
    recovery: RecoveryFile | None = None
    _recovery_warned = False

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
        self.discard_recovery()
        if old != saved:  # saved as another file: this workbench now holds that one
            self.claim_recovery()
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
        except (JobFileError, OSError) as exc:
            self.notify(str(exc), title="Cannot reopen", severity="error", timeout=10)
            return
        self._disk_warned = False
        self.notify(f"Reopened {self.session.path.name}; ctrl+z brings back the edits it replaced.")
        self.job_changed(time.perf_counter())

    def action_open_job(self) -> None:
        def chosen(path: Path | None) -> None:
            if path is not None:
                self.guard_unsaved(lambda: self.switch_session(lambda: self.open_session(path)), "open another job")
        self.push_screen(AskPath("Open job", str(self.session.path or Path.cwd()), "Path of a .toml job file."), chosen)

    def action_new_job(self) -> None:
        self.guard_unsaved(lambda: self.switch_session(JobSession.untitled), "start a new job")

    def open_session(self, path: Path) -> JobSession:
        """The job at `path`; a job file that is gone opens from the unsaved edits kept for it."""
        try:
            return JobSession.open(path)
        except JobFileError:
            session = recovered_session(self.state_dir, path)
            if session is None:
                raise
            return session

    def switch_session(self, make: Callable[[], JobSession]) -> None:
        try:
            session = make()
        except JobFileError as exc:
            self.notify(str(exc), title="Cannot open", severity="error", timeout=10)
            return
        self.discard_recovery()
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
                self.discard_recovery()
                then()
        self.push_screen(Choice("Unsaved edits", f"{self.session.name} has unsaved edits. Save them before you {doing}?",
                                [("save", "Save", "primary"), ("discard", "Discard", "error"),
                                 ("cancel", "Cancel", "default")], id="unsaved"), answer)

    async def action_quit(self) -> None:
        self.guard_unsaved(self.exit, "quit")

    # -- recovery files --------------------------------------------------------------------------
    def claim_recovery(self) -> None:
        """Take this workbench's recovery file for the job, and say who else has the job open."""
        self.release_recovery()
        self.recovery = RecoveryFile(self.state_dir, self.session.path)
        self._recovery_warned = False
        if self.recovery.others:
            self.notify(f"{self.session.name} is also open in another workbench: "
                        f"{'; '.join(map(str, self.recovery.others))}. Unsaved edits here are kept apart from "
                        "theirs; saving asks before overwriting a change they saved.",
                        title="Open elsewhere", severity="warning", timeout=15)

    def release_recovery(self) -> None:
        if self.recovery is not None:
            self.recovery.release()
            self.recovery = None

    def discard_recovery(self) -> None:
        if self.recovery is not None:
            self.recovery.discard()

    def on_unmount(self) -> None:
        self.release_recovery()

    @work(exclusive=True, thread=True, group="recovery", description="keep the recovery file")
    def keep_recovery(self, job) -> None:
        """Write the unsaved job to the recovery file, as a save would write it (or remove the
        file once nothing is unsaved). A recovery file that cannot be written is a warning."""
        recovery = self.recovery
        if recovery is None:
            return
        if job is None:
            recovery.discard()
            return
        self._recovery_problem(recovery.write(self.session.render(job)), thread=True)

    def _recovery_problem(self, problem: str | None, thread: bool = False) -> None:
        """Warn once while unsaved edits cannot be kept; the session goes on."""
        if problem is None:
            self._recovery_warned = False
        elif not self._recovery_warned:
            self._recovery_warned = True
            say = partial(self.notify, f"{problem}. Work goes on; save often.", title="No recovery file",
                          severity="warning", timeout=15)
            self.call_from_thread(say) if thread else say()

    def offer_recovery(self) -> None:
        """Claim this workbench's recovery file and offer back what a crashed workbench left."""
        self.claim_recovery()
        if self.session.path is not None and self.session.digest is None and not self.session.path.exists():
            self._recovery_problem(self.recovery.write(self.session.render()))
            self.notify(f"{self.session.path} is not on disk any more: the unsaved edits kept for it are open. "
                        "Save (ctrl+s) writes the file again.", title="Job file gone", severity="warning", timeout=15)
        for path in self.recovery.leftovers():
            found = read_recovery(path)
            if found is None:
                continue  # damaged: not offered, left where it is
            if found[0] == self.session.job:
                path.unlink(missing_ok=True)  # nothing in it that is not open here
                continue
            self._offer(path, found[0])
            return

    def _offer(self, leftover: Path, job) -> None:
        def answer(choice: str | None) -> None:
            if choice == "restore":
                self.session.replace_job(job, "restore unsaved edits")
                if self.recovery.write(self.session.render()) is None:
                    leftover.unlink(missing_ok=True)  # now kept in this workbench's own file
                self.job_changed(time.perf_counter())
                self.notify("Unsaved edits restored; save to keep them.")
            elif choice == "discard":
                leftover.unlink(missing_ok=True)
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

