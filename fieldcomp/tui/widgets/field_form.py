"""A form of job-file fields with inline validation by the job-file loader.

Each field is addressed by its path in the job (`("beam", 2, "studs", "count")`). Typing
validates at once (the loader's message shows under the form); Enter or leaving the field
asks for the edit with `EditRequested`, so the app applies it, records undo and recomputes.
"""

from __future__ import annotations

from dataclasses import dataclass

from textual.app import ComposeResult
from textual.containers import Grid, Vertical
from textual.validation import ValidationResult, Validator
from textual.widgets import Input, Label, Select, Static

from fieldcomp.jobs.model import Job
from fieldcomp.tui.messages import EditRequested
from fieldcomp.tui.plain import plain
from fieldcomp.tui.session import JobSession, Path_, field_text


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


def field_id(spec: FieldSpec) -> str:
    """Widget id of a field: "f-span", "f-studs-count"."""
    return "f-" + "-".join(spec.key)


class LoaderValidator(Validator):
    """Asks the session whether the loader would accept the text for one field."""

    def __init__(self, form: "FieldForm", spec: FieldSpec) -> None:
        super().__init__()
        self.form, self.spec = form, spec

    def validate(self, value: str) -> ValidationResult:
        session = self.form.session
        if session is None or self.form.base is None or self.form.filling:
            return self.success()
        problems = session.check_text(self.form.base + self.spec.key, value)
        if not problems:
            return self.success()
        return self.failure("; ".join(f"{where}: {msg}" if where else msg for where, msg in problems))


class FieldForm(Vertical):
    """Labelled inputs for the fields in `specs` at `base` (set with `show`)."""

    DEFAULT_CSS = """
    FieldForm { height: auto; }
    FieldForm > Grid { grid-gutter: 0 1; height: auto; }
    FieldForm Label { padding: 0 0 0 1; color: $foreground-muted; width: auto; }
    FieldForm Input { width: 1fr; height: 1; border: none; padding: 0 1; background: $boost; }
    FieldForm Input:focus { background: $primary 25%; }
    FieldForm Input.-invalid { background: $error 35%; }
    FieldForm Select { width: 1fr; }
    FieldForm SelectCurrent #label { text-wrap: nowrap; text-overflow: ellipsis; }
    FieldForm > .form--problem { color: $error; height: auto; padding: 0 1; }
    """

    def __init__(self, specs: tuple[FieldSpec, ...], *, id: str | None = None, columns: int = 2) -> None:
        super().__init__(id=id)
        self.specs = specs
        self.columns = columns
        self.session: JobSession | None = None
        self.base: Path_ | None = None
        self.by_id = {field_id(spec): spec for spec in specs}
        self.filling = False  # values set from the job are valid: no need to ask the loader

    def compose(self) -> ComposeResult:
        with Grid() as grid:
            grid.styles.grid_size_columns = 2 * self.columns
            grid.styles.grid_columns = " ".join(["auto 1fr"] * self.columns)
            for spec in self.specs:
                yield Label(spec.label)
                if spec.choices or spec.choices_from:
                    options = [(c, c) for c in spec.choices]
                    select: Select[str] = Select(options, allow_blank=spec.optional or not options, id=field_id(spec),
                                                 prompt="(none)", compact=True)
                    select.tooltip = spec.tooltip or None
                    yield select
                else:
                    field = Input(id=field_id(spec), placeholder=spec.placeholder, validators=[LoaderValidator(self, spec)],
                                  validate_on=["changed", "submitted", "blur"])
                    field.tooltip = spec.tooltip or None
                    yield field
        yield Static("", classes="form--problem")

    def show(self, session: JobSession, base: Path_) -> None:
        """Fill the inputs from the job at `base` without asking for edits."""
        self.session, self.base = session, base
        job: Job = session.job
        self.filling = True
        try:
            self._fill(job, base)
        finally:
            self.filling = False
        self.query_one(".form--problem", Static).update("")

    def _fill(self, job: Job, base: Path_) -> None:
        for spec in self.specs:
            text = field_text(job, base + spec.key) if self._exists(job, base + spec.key) else ""
            widget = self.query_one(f"#{field_id(spec)}")
            if isinstance(widget, Select):
                with widget.prevent(Select.Changed):
                    if spec.choices_from:
                        ids = [item.id for item in getattr(job, spec.choices_from)]
                        widget.set_options([(plain(i), i) for i in ids])
                    widget.value = text if text else Select.NULL
            elif isinstance(widget, Input) and widget.value != text:
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

    def _spec(self, widget_id: str | None) -> FieldSpec | None:
        return self.by_id.get(widget_id or "")

    def _problem(self, text: str) -> None:
        self.query_one(".form--problem", Static).update(plain(text))

    def on_input_changed(self, event: Input.Changed) -> None:
        event.stop()
        result = event.validation_result
        self._problem("" if result is None or result.is_valid else "\n".join(result.failure_descriptions))

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        self._commit(event.input)

    def on_input_blurred(self, event: Input.Blurred) -> None:
        event.stop()
        self._commit(event.input)

    def _commit(self, widget: Input) -> None:
        spec = self._spec(widget.id)
        if spec is None or self.session is None or self.base is None:
            return
        path = self.base + spec.key
        current = field_text(self.session.job, path) if self._exists(self.session.job, path) else ""
        if widget.value.strip() == current:
            return
        problems = self.session.check_text(path, widget.value)
        if problems:
            self._problem("\n".join(f"{w}: {m}" if w else m for w, m in problems))
            return
        self.post_message(EditRequested(path, widget.value))

    def on_select_changed(self, event: Select.Changed) -> None:
        event.stop()
        spec = self._spec(event.select.id)
        if spec is None or self.session is None or self.base is None:
            return
        text = "" if event.value is Select.NULL else str(event.value)
        path = self.base + spec.key
        current = field_text(self.session.job, path) if self._exists(self.session.job, path) else ""
        if text == current:
            return
        problems = self.session.check_text(path, text)
        if problems:
            self._problem("\n".join(f"{w}: {m}" if w else m for w, m in problems))
            return
        self.post_message(EditRequested(path, text))
