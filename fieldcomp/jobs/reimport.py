"""Re-import into an existing job: the geometry fields of the beams the source still has are
updated where their value changed (a minimal edit of their lines, beam_text: the file's comments,
layout and every other field stay as they are), new beams are added as new [[beam]] blocks, and beams the
source no longer has are reported and kept (the engineer's work on them is not deleted)."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

from engine.model.shapes import ShapeNotFoundError, get_shape
from engine.model.units import UnitError, parse_length
from fieldcomp.jobs.beam_text import beam_spans, delete_key, set_key
from fieldcomp.jobs.floor_job import GEOMETRY, ImportedBeam, length_text
from fieldcomp.jobs.floor_text import CONFIRM, beam_values, printable, table_lines
from fieldcomp.jobs.jobfile import parse_job
from fieldcomp.jobs.model import Job, coordinate_inches

_SIDES = ("spacing_left", "edge_left", "spacing_right", "edge_right")


@dataclass(slots=True)
class Reimport:
    text: str
    changed: list[str] = field(default_factory=list)  # "B-3: span 30'-0" -> 32'-0"" ...
    added: list[str] = field(default_factory=list)
    gone: list[str] = field(default_factory=list)
    slabs: list[str] = field(default_factory=list)  # source slabs whose thickness differs from the job's
    unchanged: int = 0


def _same_length(a: Any, b: Any) -> bool:
    try:
        return abs(coordinate_inches(str(a)) - coordinate_inches(str(b))) < 1.0 / 32.0
    except UnitError:
        return a == b


def _same(key: str, old: Any, new: Any) -> bool:
    if old is None or new is None:
        return old is new
    if key == "shape":
        try:
            return get_shape(str(old)).name == get_shape(str(new)).name
        except ShapeNotFoundError:
            return False
    if key == "plan":
        return all(_same_length(old.get(k), new.get(k)) for k in ("x1", "y1", "x2", "y2"))
    if key in ("left_on", "right_on"):
        return old.get("girder") == new.get("girder") and _same_length(old.get("at"), new.get("at"))
    if key in ("level", "source_id"):
        return old == new
    return _same_length(old, new)


def _shown(key: str, value: Any) -> str:
    if value is None:
        return "(none)"
    if key == "plan":
        return f"({value['x1']}, {value['y1']}) to ({value['x2']}, {value['y2']})"
    if key in ("left_on", "right_on"):
        return f"on {value['girder']} at {value['at']}"
    return str(value)


def _update_beam(block: list[str], old: dict[str, Any], record: ImportedBeam) -> list[str]:
    """Edit the geometry lines of one [[beam]] block that differ from the import; what changed."""
    changes: list[str] = []
    if old["mark"] != record.mark:
        changes.append(f"mark {old['mark']} -> {record.mark}")
        set_key(block, "mark", record.mark)
    new = record.values
    for side in ("left", "right"):
        wanted = next((k for k in (f"spacing_{side}", f"edge_{side}") if k in new), None)
        for other in (f"spacing_{side}", f"edge_{side}"):
            if wanted and other != wanted and other in old:
                changes.append(f"{other} {old[other]} -> {wanted} {new[wanted]}")
                delete_key(block, other)
                set_key(block, wanted, new[wanted])
                old = old | {wanted: new[wanted]}
    for key in GEOMETRY:
        if key not in new:
            if key in ("left_on", "right_on") and key in old:  # the end no longer rests on a girder
                changes.append(f"{key} {_shown(key, old[key])} -> (none)")
                delete_key(block, key)
            continue
        value = new[key]
        if not _same(key, old.get(key), value):
            changes.append(f"{key} {_shown(key, old.get(key))} -> {_shown(key, value)}")
            set_key(block, key, value)
    return changes


def _engineers(job: Job) -> dict[str, dict[str, Any]]:
    """Each beam's fields other than its geometry (and mark), by source id or mark."""
    out = {}
    for b in job.beam:
        data = b.model_dump(mode="json", exclude_unset=True)
        out[b.source_id or b.mark] = {k: v for k, v in data.items() if k not in GEOMETRY and k != "mark"}
    return out


def reimport(previous: str, job: Job, records: list[ImportedBeam], level: str | None,
             template: Job | None, template_mark: str | None = None, slabs: tuple[tuple[str, float], ...] = ()) -> Reimport:
    """The job text after re-importing `records` into `previous` (which loads as `job`). The
    source's slab thicknesses (`slabs`: id, overall in) are compared, not written: a slab's
    topping depends on the deck, which is the engineer's."""
    lines = previous.splitlines(keepends=True)
    if lines and not lines[-1].endswith("\n"):
        lines[-1] += "\n"
    spans = beam_spans(lines)
    if len(spans) != len(job.beam):
        raise ValueError(f"the job's [[beam]] blocks are not all written as [[beam]] tables ({len(spans)} found, "
                         f"{len(job.beam)} beams); re-import needs each beam as its own [[beam]] block")
    olds = [b.model_dump(mode="json", exclude_unset=True, exclude_none=True) for b in job.beam]
    by_source = {b.source_id: i for i, b in enumerate(job.beam) if b.source_id}
    by_mark = {b.mark: i for i, b in enumerate(job.beam)}
    result = Reimport(previous)
    edits: dict[int, list[str]] = {}
    new_records: list[ImportedBeam] = []
    for record in records:
        i = by_source.get(record.values.get("source_id"))
        if i is None:
            i = by_mark.get(record.mark)
            if i is not None and job.beam[i].source_id not in (None, record.values.get("source_id")):
                i = None  # the same mark on another element of the source: a new beam
        if i is None or i in edits:
            new_records.append(record)
            continue
        block = lines[spans[i].start:spans[i].end]
        changes = _update_beam(block, olds[i], record)
        edits[i] = block
        if changes:
            result.changed.append(f"{record.mark}: " + "; ".join(changes))
        else:
            result.unchanged += 1
    for i in sorted(edits, reverse=True):
        lines[spans[i].start:spans[i].end] = edits[i]
    imported = {r.values.get("source_id") for r in records}
    for i, b in enumerate(job.beam):
        if i not in edits and b.source_id and b.source_id not in imported and (level is None or b.level in (None, level)):
            result.gone.append(f"{b.mark} ({b.source_id}): no longer in the source; kept, with all its fields")
    result.slabs = _slab_changes(job, slabs)
    text = "".join(lines)
    for record in new_records:
        text += "\n" + "\n".join(_new_block(record, job, template, template_mark)) + "\n"
        result.added.append(f"{record.mark}: {record.values.get('shape')}, span {record.values.get('span')}")
    updated = parse_job(text)
    kept, now = _engineers(job), _engineers(updated)
    lost = [key for key, fields in kept.items() if now.get(key, fields) != fields]
    if lost:
        raise ValueError(f"re-import would change the engineer's fields of {', '.join(lost)}; the job is left as it was")
    result.text = text
    return result


def _slab_changes(job: Job, slabs: tuple[tuple[str, float], ...]) -> list[str]:
    """Source slabs whose overall thickness no slab of the job has (topping + deck rib height)."""
    ribs = {d.id: parse_length(d.rib_height) for d in job.deck}
    overall = {s.id: parse_length(s.topping) + ribs.get(s.deck or "", 0.0) for s in job.slab}
    shown = ", ".join(f"{k} {length_text(v)}" for k, v in overall.items())
    return [f"slab {gid}: {length_text(t)} overall in the source; no slab of the job is ({shown}): not changed, "
            "edit its topping if the slab changed" for gid, t in slabs
            if all(abs(t - v) >= 1.0 / 32.0 for v in overall.values())]


def _new_block(record: ImportedBeam, job: Job, template: Job | None, template_mark: str | None) -> list[str]:
    """A new beam: loads and studs from the template, else from a beam of the job of its kind
    (girder or not), marked to confirm."""
    notes = list(record.notes)
    if template is not None:
        source = next((b for b in template.beam if b.mark == template_mark), template.beam[0])
        slab = source.slab if source.slab in {s.id for s in job.slab} else job.slab[0].id
    else:
        girders = {on.girder for b in job.beam for on in (b.left_on, b.right_on) if on is not None}
        kind = [b for b in job.beam if (b.mark in girders) == record.girder]
        source = (kind or job.beam)[0]
        slab = source.slab
        notes.append(f"new beam: loads, studs and slab copied from beam {source.mark} ({CONFIRM})")
    taken = source.model_dump(mode="json", exclude_unset=True, exclude_none=True)
    values, comments = beam_values(record, taken, slab, True)
    return [*[f"# {printable(n)}" for n in notes], *table_lines("beam", values, comments)]
