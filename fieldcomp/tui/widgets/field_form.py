"""A form of job-file fields with inline validation by the job-file loader.

Each field is addressed by its path in the job (`("beam", 2, "studs", "count")`) and its widget
id is its job-file key (`#span`, `#studs-count`; rows of a table add the table: `#finding-note`).
Typing never waits for the loader: the check runs a moment after the last key (in a worker when
it needs the whole job) and its message shows under the form; Enter or leaving the field asks for
the edit with `EditRequested`, so the app applies it, records undo and recomputes. Text typed and
not yet applied is never replaced when the panes are refilled with the job's values.
"""

from __future__ import annotations

from dataclasses import dataclass

from textual import events
from textual.app import ComposeResult
from textual.containers import Grid, Vertical
from textual.timer import Timer
from textual.widgets import Input, Label, Select, Static

from fieldcomp.jobs.model import Job
from fieldcomp.tui.messages import EditRequested
from fieldcomp.tui.plain import plain
from fieldcomp.tui.session import JobSession, Path_, field_text

CHECK_DELAY = 0.15  # seconds after the last key before the typed text is checked
CELL_WIDTH = 34  # columns a label and its field need to stay readable; fewer form columns below


@dataclass(frozen=True, slots=True)
class FieldSpec:
    """A field of the form: `key` is its path below the form's base path. `choices` makes a
    drop-down; `optional` adds a blank choice (the key is left out of the file)."""

    label: str
    key: tuple[str, ...]
    tooltip: str = ""
    choices: tuple[str, ...] = ()
    optional: bool = False
    placeholder: str = ""
    choices_from: str = ""  # "slab" or "deck": the ids of that job table


def field_id(spec: FieldSpec, table: str = "") -> str:
    """Widget id of a field, its job-file key: "span", "studs-count", "finding-note"."""
    return "-".join((table, *spec.key) if table else spec.key)


def problems_text(problems: list[tuple[str, str]]) -> str:
    return "\n".join(f"{w}: {m}" if w else m for w, m in problems)


class FieldForm(Vertical):
    """Labelled inputs for the fields in `specs` at `base` (set with `show`); `table` names the
    job table of a row form (the prefix of its ids)."""

    def __init__(self, specs: tuple[FieldSpec, ...], *, id: str | None = None, columns: int = 2,
                 table: str = "") -> None:
        super().__init__(id=id, classes="field-form")
        self.specs = specs
        self.columns = columns
        self.table = table
        self.session: JobSession | None = None
        self.base: Path_ | None = None
        self.by_id = {field_id(spec, table): spec for spec in specs}
        self.filling = False  # values set from the job are valid: no need to ask the loader
        self.typed: set[str] = set()  # ids of inputs holding text typed and not yet applied
        self._timer: Timer | None = None
        self._problem_shown = ""

    def compose(self) -> ComposeResult:
        with Grid() as grid:
            grid.styles.grid_size_columns = 2 * self.columns
            grid.styles.grid_columns = " ".join(["auto 1fr"] * self.columns)
            for spec in self.specs:
                yield Label(spec.label)
                if spec.choices or spec.choices_from:
                    options = [(c, c) for c in spec.choices]
                    select: Select[str] = Select(options, allow_blank=spec.optional or not options,
                                                 id=field_id(spec, self.table), prompt="(none)", compact=True)
                    select.tooltip = spec.tooltip or None
                    yield select
                else:
                    field = Input(id=field_id(spec, self.table), placeholder=spec.placeholder, compact=True)
                    field.tooltip = spec.tooltip or None
                    yield field
        yield Static("", classes="form--problem")

    def on_resize(self, event: events.Resize) -> None:
        self._fit(event.size.width)

    def on_show(self) -> None:
        self.call_after_refresh(lambda: self._fit(self.size.width))

    def _fit(self, width: int) -> None:
        """As many label-field columns as keep each field readable."""
        if width <= 0:
            return
        columns = max(1, min(self.columns, width // CELL_WIDTH))
        grid = self.query_one(Grid)
        if grid.styles.grid_size_columns != 2 * columns:
            grid.styles.grid_size_columns = 2 * columns
            grid.styles.grid_columns = " ".join(["auto 1fr"] * columns)

    def show(self, session: JobSession, base: Path_) -> None:
        """Fill the inputs from the job at `base` without asking for edits; text typed into a
        field of the same record and not applied yet stays as typed."""
        if base != self.base:
            self.typed.clear()
        self.session, self.base = session, base
        self.filling = True
        try:
            self._fill(session.job, base)
        finally:
            self.filling = False
        if not self.typed:
            self._problem("")

    def _fill(self, job: Job, base: Path_) -> None:
        for spec in self.specs:
            text = field_text(job, base + spec.key) if self._exists(job, base + spec.key) else ""
            widget = self.query_one(f"#{field_id(spec, self.table)}")
            if isinstance(widget, Select):
                with widget.prevent(Select.Changed):
                    if spec.choices_from:
                        ids = [item.id for item in getattr(job, spec.choices_from)]
                        if ids != getattr(widget, "_ids", None):
                            widget.set_options([(plain(i), i) for i in ids])
                            widget._ids = ids  # type: ignore[attr-defined]
                    wanted = text if text else Select.NULL
                    if widget.value != wanted:
                        widget.value = wanted
            elif isinstance(widget, Input) and widget.id not in self.typed and widget.value != text:
                with widget.prevent(Input.Changed):
                    widget.value = text
                widget.remove_class("-invalid")

    @staticmethod
    def _exists(job: Job, path: Path_) -> bool:
        try:
            field_text(job, path)
        except (AttributeError, IndexError):
            return False
        return True

    def _problem(self, text: str) -> None:
        """Show the loader's message (an unchanged line is not redrawn: the layout stays put)."""
        if text != self._problem_shown:
            self._problem_shown = text
            self.query_one(".form--problem", Static).update(plain(text))

    def _path(self, widget_id: str | None) -> Path_ | None:
        spec = self.by_id.get(widget_id or "")
        return None if spec is None or self.base is None else self.base + spec.key

    def _current(self, path: Path_) -> str:
        job = self.session.job  # type: ignore[union-attr]
        return field_text(job, path) if self._exists(job, path) else ""

    # -- typing -----------------------------------------------------------------------------------
    def on_input_changed(self, event: Input.Changed) -> None:
        event.stop()
        if self.filling or event.input.id not in self.by_id:
            return
        self.typed.add(event.input.id)  # type: ignore[arg-type]
        if self._timer is not None:
            self._timer.stop()
        self._timer = self.set_timer(CHECK_DELAY, lambda widget=event.input: self._check(widget))

    def _check(self, widget: Input) -> None:
        """Ask the loader about the text now in `widget`: at once for a field of one beam (only
        that beam is checked), in a worker for a field of the whole job."""
        path, session = self._path(widget.id), self.session
        if path is None or session is None:
            return
        text = widget.value
        if path[0] == "beam":
            self._checked(widget, text, session.check_text(path, text))
            return

        def work() -> None:
            problems = session.check_text(path, text)
            self.app.call_from_thread(self._checked, widget, text, problems)
        self.run_worker(work, thread=True, exclusive=True, group=f"check-{self.id}", description="check typed text")

    def _checked(self, widget: Input, text: str, problems: list[tuple[str, str]]) -> None:
        if widget.value != text or widget.id not in self.typed:
            return  # typed on since, or applied: a later check will speak
        widget.set_class(bool(problems), "-invalid")
        self._problem(problems_text(problems))

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        self._commit(event.input)

    def on_input_blurred(self, event: Input.Blurred) -> None:
        event.stop()
        self._commit(event.input)

    def _commit(self, widget: Input) -> None:
        path = self._path(widget.id)
        if path is None or self.session is None or widget.id not in self.typed:
            return
        if widget.value.strip() == self._current(path):
            self.typed.discard(widget.id)  # type: ignore[arg-type]
            widget.remove_class("-invalid")
            return
        problems = self.session.check_text(path, widget.value)
        widget.set_class(bool(problems), "-invalid")
        self._problem(problems_text(problems))
        if problems:
            return
        self.typed.discard(widget.id)  # type: ignore[arg-type]
        self.post_message(EditRequested(path, widget.value))

    def on_select_changed(self, event: Select.Changed) -> None:
        event.stop()
        path = self._path(event.select.id)
        if path is None or self.session is None:
            return
        text = "" if event.value is Select.NULL else str(event.value)
        if text == self._current(path):
            return
        problems = self.session.check_text(path, text)
        self._problem(problems_text(problems))
        if not problems:
            self.post_message(EditRequested(path, text))
