"""Sheet pane: preview the marks sheet of the beam (as designed, or the repair marks) and write
it as SVG and CSV; or write the sheets of every beam into a folder."""

from __future__ import annotations

from pathlib import Path

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal
from textual.widgets import Button, Input, Label, Select, Static

from fieldcomp.tui.outcome import BeamOutcome
from fieldcomp.tui.plain import plain
from fieldcomp.tui.session import JobSession
from fieldcomp.tui.widgets.pane_base import Pane

KINDS = (("marks as designed", "design"), ("repair marks (findings)", "repair"))


class SheetPane(Pane):
    BINDINGS = [
        Binding("f6", "write('svg')", "Write SVG", id="sheet.svg", tooltip="Write the sheet shown as SVG."),
        Binding("f7", "write('csv')", "Write CSV", id="sheet.csv", tooltip="Write the marks shown as CSV."),
        Binding("f8", "write('all')", "Write all", id="sheet.all",
                tooltip="Write the SVG and CSV of every beam into the folder."),
    ]
    DEFAULT_CSS = """
    SheetPane Horizontal { height: auto; padding: 0 0 1 0; }
    SheetPane Label { padding: 0 1 0 0; color: $foreground-muted; }
    SheetPane Input { width: 1fr; height: 1; border: none; padding: 0 1; background: $boost; }
    SheetPane Button { margin: 0 0 0 2; }
    SheetPane Select { width: 36; }
    #sheet-preview { padding: 1 2; background: $surface; text-wrap: nowrap; }
    """

    def build(self) -> ComposeResult:
        yield Static("", classes="pane--head", id="sheet-head")
        yield Horizontal(Label("sheet   "), Select(KINDS, value="design", allow_blank=False, id="sheet-kind", compact=True))
        yield Horizontal(Label("SVG file"), Input(id="sheet-svg"),
                         Button("Write SVG", id="sheet-write-svg", variant="primary", compact=True))
        yield Horizontal(Label("CSV file"), Input(id="sheet-csv"),
                         Button("Write CSV", id="sheet-write-csv", variant="primary", compact=True))
        yield Horizontal(Label("folder  "), Input(id="sheet-folder"),
                         Button("Write every beam", id="sheet-write-all", compact=True,
                                tooltip="One SVG and one CSV per beam, named from the marks."))
        yield Static("", id="sheet-status", classes="pane--note")
        yield Static("Preview", classes="pane--section")
        yield Static("", id="sheet-preview")

    def show_job(self, session: JobSession, index: int) -> None:
        from fieldcomp.jobs.output_names import safe_name

        self.folder = session.path.parent if session.path is not None else Path.cwd()
        self.name = safe_name(session.job.beam[index].mark)
        self._default_paths()
        if not self.query_one("#sheet-folder", Input).value:
            self.query_one("#sheet-folder", Input).value = str(self.folder / "sheets")

    folder = Path(".")
    name = "beam"

    def _default_paths(self) -> None:
        """File names beside the job, from the mark; repair sheets get their own names."""
        tail = "-repair" if self.query_one("#sheet-kind", Select).value == "repair" else ""
        self.query_one("#sheet-svg", Input).value = str(self.folder / f"{self.name}{tail}.svg")
        self.query_one("#sheet-csv", Input).value = str(self.folder / f"{self.name}{tail}.csv")

    def sheet(self):
        """The SheetData chosen (engine data built in the worker), or None."""
        outcome = self.outcome
        if outcome is None:
            return None
        if self.query_one("#sheet-kind", Select).value == "repair":
            return outcome.repair_sheet.value
        return outcome.sheet.value if outcome.sheet is not None else None

    outcome: BeamOutcome | None = None
    outcomes: list[BeamOutcome] = []

    def show_outcome(self, outcome: BeamOutcome | None, outcomes: list[BeamOutcome]) -> None:
        from fieldcomp.views.marks_sheet import marks_text

        self.outcome, self.outcomes = outcome, outcomes
        head = self.query_one("#sheet-head", Static)
        preview = self.query_one("#sheet-preview", Static)
        kind = self.query_one("#sheet-kind", Select).value
        sheet = self.sheet()
        if outcome is None:
            head.update("no beam")
            return
        if sheet is None:
            part = outcome.repair_sheet if kind == "repair" else outcome.sheet
            if not outcome.finished_all:
                why, error = "preparing the sheet ...", None
            else:
                error = part.error if part is not None else None
                why = error or ("no repair for this beam: it has no findings, or passes as built"
                                if kind == "repair" else "not computed")
            head.update(Text(f"{outcome.beam.mark}: {why}", style="bold red" if error else "italic"))
            preview.update("")
            return
        head.update(plain(f"{outcome.beam.mark}: {sheet.title.lower()}, dated {sheet.date}"))
        preview.update(Text(marks_text(sheet)))

    def on_select_changed(self, event: Select.Changed) -> None:
        event.stop()
        self._default_paths()
        self.show_outcome(self.outcome, self.outcomes)

    def on_button_pressed(self, event: Button.Pressed) -> None:
        event.stop()
        self.action_write((event.button.id or "").removeprefix("sheet-write-"))

    def action_write(self, which: str) -> None:
        from fieldcomp.views.marks_sheet import marks_csv
        from fieldcomp.views.marks_svg import marks_svg

        if which == "all":
            self.write_all()
            return
        sheet = self.sheet()
        if sheet is None:
            self.app.notify("Nothing to write for this beam.", severity="warning")
            return
        field, render = ("#sheet-svg", marks_svg) if which == "svg" else ("#sheet-csv", marks_csv)
        self.write([(Path(self.query_one(field, Input).value.strip()).expanduser(), render(sheet))])

    def write_all(self) -> None:
        from fieldcomp.views.marks_sheet import marks_csv
        from fieldcomp.views.marks_svg import marks_svg
        from fieldcomp.jobs.output_names import inside, unique_names

        folder = Path(self.query_one("#sheet-folder", Input).value.strip()).expanduser()
        sheets = [o.sheet.value for o in self.outcomes if o.sheet is not None and o.sheet.value is not None]
        if len(sheets) < len(self.outcomes):
            self.app.notify(f"{len(self.outcomes) - len(sheets)} beam(s) have no sheet (yet); the others are written.",
                            severity="warning")
        names = unique_names([s.beam.mark for s in sheets])
        try:
            folder.mkdir(parents=True, exist_ok=True)
            files = [(inside(folder, n + ext), render(s)) for s, n in zip(sheets, names)
                     for ext, render in ((".svg", marks_svg), (".csv", marks_csv))]
        except OSError as exc:
            self.app.notify(f"Not written: {exc}", severity="error")
            return
        self.write(files)

    def write(self, files: list[tuple[Path, str]]) -> None:
        from fieldcomp.jobs.atomic import write_text_atomic

        try:
            for path, text in files:
                write_text_atomic(path, text)
        except OSError as exc:
            self.app.notify(f"Not written: {exc.strerror or exc}", severity="error")
            return
        where = str(files[0][0]) if len(files) == 1 else f"{len(files)} files in {files[0][0].parent}"
        self.query_one("#sheet-status", Static).update(plain(f"Wrote {where}"))
        self.app.notify(f"Wrote {where}")
