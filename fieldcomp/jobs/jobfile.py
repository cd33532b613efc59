"""Job files: load (TOML, validated), save (only what was edited, atomic, previous version kept
as .bak), errors that name the file, the beam and the field."""

from __future__ import annotations

import difflib
import hashlib
import os
import tomllib
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import tomli_w
from tomlkit.exceptions import TOMLKitError
from pydantic import BaseModel, ValidationError

from fieldcomp.jobs.atomic import write_bytes_atomic
from fieldcomp.jobs.kind_messages import KIND_ERRORS, kind_message
from fieldcomp.jobs.file_kinds import FileKindError, read_regular
from fieldcomp.jobs.nesting import JOB_NESTING, MAX_NESTING, deep_line, deep_path
from fieldcomp.jobs.model import Job
from fieldcomp.jobs.toml_top_level import patch_blocks
from fieldcomp.jobs.toml_text import BOM, join_form, minimal, patch_text, split_form
from engine.model.errors import FieldcompError
from engine.model.text import printable

MAX_BYTES = 20 * 1024 * 1024
_TOO_DEEP = f"lists and tables nested more than {MAX_NESTING} deep are refused (the job format nests {JOB_NESTING})"


class JobFileError(FieldcompError, ValueError):
    """Bad job file. `problems` lists (where, message); `where` names table, beam mark and field."""

    def __init__(self, path: str | os.PathLike[str], problems: list[tuple[str, str]]):
        self.path = str(path)
        self.problems = problems
        lines = [f"{self.path}: {where}: {msg}" if where else f"{self.path}: {msg}" for where, msg in problems]
        super().__init__("\n".join(lines))


class ChangedOnDiskError(FieldcompError, RuntimeError):
    """The file on disk changed since it was loaded; saving would overwrite someone's edit."""


@dataclass(frozen=True, slots=True)
class LoadedJob:
    path: Path
    job: Job
    digest: str  # sha256 of the bytes loaded, to detect edits by others before saving
    text: str = ""  # the file's text as loaded (byte-order mark kept): what a save patches


def parse_job(text: str, path: str | os.PathLike[str] = "<job>") -> Job:
    """Validate TOML text as a job; raises JobFileError naming file, beam and field."""
    line = deep_line(text)
    if line is not None:
        raise JobFileError(path, [(line, _TOO_DEEP)])
    try:
        raw = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise JobFileError(path, [("", f"not valid TOML: {exc}")]) from None
    deep = deep_path(raw)
    if deep is not None:
        raise JobFileError(path, [(_place(deep, raw), _TOO_DEEP)])
    try:
        job = Job.model_validate(raw)
    except ValidationError as exc:
        raise JobFileError(path, _merge([_describe(err, raw) for err in exc.errors()])) from None
    _check_references(job, path)
    return job


def load_job(path: str | os.PathLike[str]) -> LoadedJob:
    """Read and validate a job file (TOML only, never executed; a regular file of 20 MB at most,
    UTF-8 with or without a byte-order mark)."""
    p = Path(path)
    try:
        data = read_regular(p, MAX_BYTES, "job files")
    except FileKindError as exc:
        raise JobFileError(p, [("", exc.reason)]) from None
    try:
        text = job_text(data)
    except UnicodeDecodeError as exc:
        utf16 = "; it looks like UTF-16: save it as UTF-8" if data[:2] in (b"\xff\xfe", b"\xfe\xff") else ""
        raise JobFileError(p, [("", f"not UTF-8 text (byte {exc.start}){utf16}")]) from None
    job = parse_job(text.removeprefix(BOM), p)
    return LoadedJob(p, _remember(text, job), hashlib.sha256(data).hexdigest(), text)


def dump_job(job: Job, previous: str | None = None) -> str:
    """The job as the text of its file. Given the file's previous text, that text is patched so
    that only what was edited changes (`toml_text.patch_text`: comments, layout, line endings and
    byte-order mark kept, no default written). Without it (or if it no longer reads as a job),
    the job is written plainly with only what is not a default."""
    if previous is not None:
        try:
            old = _parsed(previous)
            bom, crlf, body = split_form(previous)
            fast = patch_blocks(body, old, job)  # each rewritten block read back already
            if fast is not None:
                return join_form(bom, crlf, fast)
            merged = patch_text(previous, old, job)
            if parse_job(merged.removeprefix(BOM)) == job:
                return merged
        except (JobFileError, TOMLKitError, LookupError, TypeError, ValueError):
            pass  # the previous text is not a job any more, or tomlkit cannot patch it: written plainly
    return tomli_w.dumps(minimal(job))


_PARSED: dict[str, Job] = {}  # the last texts loaded or patched, and the jobs they say


def _parsed(text: str) -> Job:
    """The job a text says (a session's saved text is patched again at every save and every
    recovery write: parsed once, or not at all when it was just loaded)."""
    job = _PARSED.get(text)
    return job if job is not None else _remember(text, parse_job(text.removeprefix(BOM)))


def _remember(text: str, job: Job) -> Job:
    while len(_PARSED) >= 2:
        _PARSED.pop(next(iter(_PARSED)), None)
    _PARSED[text] = job
    return job


def job_text(data: bytes) -> str:
    """The file's bytes as text, byte-order mark kept (so a save writes it back)."""
    return data.decode("utf-8")


def save_job(job: Job, path: str | os.PathLike[str], expected_digest: str | None = None,
             previous: str | None = None) -> str:
    """Write the job to its file, changing only what was edited against `previous` (the text it
    was loaded from; by default the file's current text). See `write_job`."""
    p = saved_path(path)
    if previous is None and p.exists():
        try:
            previous = job_text(read_regular(p, MAX_BYTES, "job files"))
        except (OSError, UnicodeDecodeError):
            previous = None
    return write_job(p, dump_job(job, previous).encode("utf-8"), expected_digest)


def saved_path(path: str | os.PathLike[str]) -> Path:
    """Where a save writes: a job reached through a symbolic link is saved to the link's target
    (the link stays a link)."""
    p = Path(path)
    return Path(os.path.realpath(p)) if p.is_symlink() else p


def write_job(path: str | os.PathLike[str], data: bytes, expected_digest: str | None = None) -> str:
    """Write job-file bytes atomically: temp file in the same folder, flush + fsync, previous
    version kept as `<name>.bak` (with the original's permissions), then atomic replace. Returns
    the new digest. Raises ChangedOnDiskError if `expected_digest` is given and the file on disk
    no longer has it."""
    p = saved_path(path)
    if expected_digest is not None and p.exists():
        if hashlib.sha256(p.read_bytes()).hexdigest() != expected_digest:
            raise ChangedOnDiskError(f"{p} changed on disk since it was opened; not overwritten")
    if p.exists():
        _keep_backup(p)
    write_bytes_atomic(p, data)
    return hashlib.sha256(data).hexdigest()


def _keep_backup(p: Path) -> None:
    """Copy the current file to .bak atomically, with the current file's permissions (the
    original stays in place until replaced)."""
    write_bytes_atomic(p.with_name(p.name + ".bak"), p.read_bytes(), mode=p.stat().st_mode & 0o7777)


def shown(text: object, limit: int = 40) -> str:
    """User text (a mark, an id, a key) as messages quote it: printable, cut to `limit` characters."""
    clean = printable(text)
    return clean if len(clean) <= limit else clean[:limit - 3] + "..."


def where(table: str, index: int | None, raw_item: Any, field: str) -> str:
    """'beam 'B-3' (#4), field 'studs.count'' style location text."""
    name = ""
    if isinstance(raw_item, dict):
        key = {"beam": "mark", "zone": "name"}.get(table, "id")
        if isinstance(raw_item.get(key), str):
            name = f" '{shown(raw_item[key])}'"
    num = f" #{index + 1}" if index is not None else ""
    return f"{shown(table)}{name}{num}" + (f", field '{shown(field, 80)}'" if field else "")


def _place(path: tuple[Any, ...], raw: dict[str, Any]) -> str:
    """Location text of a path into the raw job: 'beam 'B-3' #4, field 'studs.count''."""
    table, rest = str(path[0]), list(path[1:])
    index = rest.pop(0) if rest and isinstance(rest[0], int) and table in ("beam", "deck", "slab", "zone") else None
    items = raw.get(table)
    item = items[index] if index is not None and isinstance(items, list) else None
    field = "".join(f"[{p}]" if isinstance(p, int) else f".{p}" for p in rest[:3]).lstrip(".")
    return where(table, index, item, field)


def _merge(problems: list[tuple[str, str]]) -> list[tuple[str, str]]:
    """One line per place: the alternatives of a union ('an integer' or '"design"') joined."""
    merged: dict[str, list[str]] = {}
    loose: list[tuple[str, str]] = []
    for place, msg in problems:
        if place:
            merged.setdefault(place, []).append(msg)
        else:
            loose.append((place, msg))
    return loose + [(place, _alternatives(msgs)) for place, msgs in merged.items()]


def _alternatives(msgs: list[str]) -> str:
    """'must be a whole number (got true)' and 'must be 'design' (got true)' as one message."""
    got = msgs[0][msgs[0].rfind(" (got "):] if " (got " in msgs[0] else ""
    if len(msgs) > 1 and got and all(m.endswith(got) for m in msgs):
        stems = [m.removesuffix(got) for m in msgs]
        return ("; or " if any("," in s for s in stems) else " or ").join(stems) + got
    return "; or ".join(msgs)


def _is_union_tag(part: Any) -> bool:
    """pydantic names union branches in error locations ('int', "literal['design']"); not fields."""
    return isinstance(part, str) and (part in ("int", "str", "float", "bool", "none") or "[" in part)


def _describe(err: dict[str, Any], raw: dict[str, Any]) -> tuple[str, str]:
    full = [part for part in err["loc"] if not _is_union_tag(part)]
    loc = list(full)
    table = str(loc.pop(0)) if loc else ""
    index = loc.pop(0) if loc and isinstance(loc[0], int) and table in ("beam", "deck", "slab", "zone") else None
    item = raw.get(table) if table in raw else None
    if index is not None and isinstance(item, list) and index < len(item):
        item = item[index]
    field = ".".join(str(part) for part in loc)
    msg = str(err.get("msg", "invalid value")).removeprefix("Value error, ")
    if err.get("type") == "extra_forbidden" and full:
        unknown = str(full[-1])
        parents = [p for p in full[:-1] if not isinstance(p, int)]
        if not loc:  # an unknown top-level table
            return "", f"unknown table {_short(unknown)}" + _hint(unknown, list(Job.model_fields))
        msg = f"unknown key {_short(unknown)}" + _hint(unknown, _known_keys(parents))
    elif err.get("type") == "missing":
        if not loc and index is None:
            return "", f"required table {table!r} is missing"
        msg = "required key is missing"
    elif err.get("type") in ("model_type", "dict_type"):
        msg = f"must be a table, got {_short(err.get('input'))}"
    elif err.get("type") == "list_type":
        msg = f"must be a list (e.g. [[{table}]] tables), got {_short(err.get('input'))}"
    elif err.get("type") in KIND_ERRORS:
        msg = f"{kind_message(err['type'], msg, err.get('input'))} (got {_short(err.get('input'))})"
    elif "input" in err:
        msg = f"{msg} (got {_short(err['input'])})"
    if not loc and index is None:
        return f"table '{table}'", msg
    return where(table, index, item, field), msg


def _short(value: Any) -> str:
    text = ("true" if value else "false") if isinstance(value, bool) else repr(value)
    return text if len(text) <= 60 else text[:57] + "..."


def _known_keys(path: list[Any]) -> list[str]:
    """Field names of the model at `path` (table and nested keys), for "did you mean" hints."""
    model: type[BaseModel] | None = Job
    for part in path:
        if model is None or part not in model.model_fields:
            return []
        ann = model.model_fields[part].annotation
        model = next((a for a in _flatten(ann) if isinstance(a, type) and issubclass(a, BaseModel)), None)
    return list(model.model_fields) if model is not None else []


def _flatten(ann: Any) -> list[Any]:
    args = getattr(ann, "__args__", None)
    if not args:
        return [ann]
    return [x for a in args for x in _flatten(a)]


def _hint(word: str, choices: list[str]) -> str:
    close = difflib.get_close_matches(word, choices, n=1)
    return f"; did you mean {close[0]!r}?" if close else ""


def _check_references(job: Job, path: str | os.PathLike[str]) -> None:
    """Duplicate ids and marks, and slabs and beams naming an id that is not there: one pass over
    each table with sets (linear in the job's size)."""
    problems: list[tuple[str, str]] = []
    decks = [d.id for d in job.deck]
    slabs = [s.id for s in job.slab]
    deck_ids, slab_ids = set(decks), set(slabs)
    for table, ids in (("deck", decks), ("slab", slabs)):
        seen: set[str] = set()
        for i, name in enumerate(ids):
            if name in seen:
                problems.append((f"{table} '{shown(name)}' #{i + 1}, field 'id'", "duplicate id"))
            seen.add(name)
    for i, s in enumerate(job.slab):
        if s.deck is not None and s.deck not in deck_ids:
            problems.append((f"slab '{shown(s.id)}' #{i + 1}, field 'deck'",
                             f"no deck with id {_short(s.deck)}" + _hint(s.deck, decks)))
    marks: set[str] = set()
    for i, b in enumerate(job.beam):
        if b.mark in marks:
            problems.append((f"beam '{shown(b.mark)}' #{i + 1}, field 'mark'", "duplicate beam mark"))
        marks.add(b.mark)
        if b.slab not in slab_ids:
            problems.append((f"beam '{shown(b.mark)}' #{i + 1}, field 'slab'",
                             f"no slab with id {_short(b.slab)}" + _hint(b.slab, slabs)))
    bearing_ends = {b.mark for b in job.beam if b.left_on is not None or b.right_on is not None}
    for i, b in enumerate(job.beam):
        for end in ("left_on", "right_on"):
            on = getattr(b, end)
            if on is None:
                continue
            where = f"beam '{shown(b.mark)}' #{i + 1}, field '{end}.girder'"
            if on.girder == b.mark:
                problems.append((where, "names the beam itself"))
            elif on.girder not in marks:
                problems.append((where, f"no beam with mark {_short(on.girder)}" + _hint(on.girder, marks)))
            elif on.girder in bearing_ends:
                problems.append((where, f"girder {_short(on.girder)} itself rests on a girder; a girder on a girder "
                                 "is not computed (its ends must rest on columns or walls)"))
    zone_names: list[str] = []
    listed: dict[str, str] = {}
    for i, z in enumerate(job.zone):
        here = f"zone '{shown(z.name)}' #{i + 1}"
        if z.name in zone_names:
            problems.append((f"{here}, field 'name'", "duplicate zone name"))
        zone_names.append(z.name)
        for k, mark in enumerate(z.beams):
            if mark not in marks:
                problems.append((f"{here}, field 'beams[{k}]'", f"no beam with mark {_short(mark)}" + _hint(mark, marks)))
            elif mark in listed:
                problems.append((f"{here}, field 'beams[{k}]'", f"beam {_short(mark)} is already in zone "
                                 f"{_short(listed[mark])}; a member placed in two pours needs zones with outlines"))
            else:
                listed[mark] = z.name
    if problems:
        raise JobFileError(path, problems)
