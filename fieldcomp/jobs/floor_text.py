"""The job file an import writes: the geometry read from the model or schedule; deck, slab,
studs and loads from the template job the user names, or placeholders marked "TO CONFIRM";
comments that say where each value came from."""

from __future__ import annotations

import unicodedata
from dataclasses import dataclass, field
from typing import Any

import tomli_w

from engine.model.units import parse_length, round_to_sixteenth
from fieldcomp.jobs.floor_job import ImportedBeam, length_text
from fieldcomp.jobs.model import Job

CONFIRM = "TO CONFIRM"
# Template beam fields an imported beam takes: loads, materials, limits and stud settings.
FROM_TEMPLATE = ("deck_orientation", "fy_ksi", "superimposed_dead_psf", "live_psf", "construction_live_psf",
                 "construction_load", "screed", "unbraced_length", "construction_factors", "construction_limits",
                 "camber", "live_limit_ratio", "total_limit_ratio", "studs")
_PLACEHOLDER_DECK = {"id": "DECK-1", "rib_height": "3 in", "rib_top_width": "7 in", "rib_bottom_width": "5 in",
                     "pitch": "12 in", "weight_psf": 2.4}
_PLACEHOLDER_SLAB = {"concrete_pcf": 145.0, "fc_ksi": 4.0}
_PLACEHOLDER_BEAM = {"deck_orientation": "perpendicular", "fy_ksi": 50.0, "superimposed_dead_psf": 0.0, "live_psf": 0.0,
                     "construction_live_psf": 20.0}
_PLACEHOLDER_STUDS = {"diameter": "3/4 in", "length": "5 1/4 in", "count": "design"}


@dataclass(slots=True)
class Source:
    """Where the beams came from, for the file's heading."""

    path: str
    kind: str  # "IFC4 model, length unit millimetre", "CSV framing schedule" ...
    project: str
    level: str | None
    basis: list[str] = field(default_factory=list)  # how geometry was taken (span basis ...)
    left_out: list[str] = field(default_factory=list)  # elements or rows not read
    slabs: list[tuple[str, float]] = field(default_factory=list)  # (source id, overall thickness in)


def printable(text: str) -> str:
    return "".join(ch if unicodedata.category(ch)[0] != "C" else "?" for ch in text)


def value_text(value: Any) -> str:
    if isinstance(value, dict):
        return "{ " + ", ".join(f"{k} = {value_text(v)}" for k, v in value.items()) + " }"
    return tomli_w.dumps({"v": value})[4:].rstrip("\n")


INLINE = ("plan", "left_on", "right_on")  # written on one line, as the job file shows them


def table_lines(header: str, values: dict[str, Any], comments: dict[str, str], array: bool = True) -> list[str]:
    """A TOML table: scalars and the inline tables (plan, left_on, right_on) first, `# comment` beside the keys given one; then
    its sub-tables ([header.key]) and arrays of tables ([[header.key]])."""
    lines = [f"[[{header}]]" if array else f"[{header}]"]
    later: list[str] = []
    for key, value in values.items():
        if isinstance(value, dict) and key not in INLINE:
            later += ["", *table_lines(f"{header}.{key}", value, comments.get(f"{key}.*", {}), array=False)]  # type: ignore[arg-type]
        elif isinstance(value, list) and all(isinstance(v, dict) for v in value):
            for item in value:
                later += ["", *table_lines(f"{header}.{key}", item, {})]
        else:
            note = comments.get(key)
            lines.append(f"{key} = {value_text(value)}" + (f"  # {printable(note)}" if note else ""))
    return lines + later


def _template_beam(template: Job | None, mark: str | None) -> dict[str, Any]:
    if template is None:
        return {}
    beam = next((b for b in template.beam if b.mark == mark), None) if mark else template.beam[0]
    if beam is None:
        raise ValueError(f"the template has no beam {mark!r}; its marks: {', '.join(b.mark for b in template.beam)}")
    return beam.model_dump(mode="json", exclude_unset=True, exclude_none=True) | {"slab": beam.slab}


def beam_values(record: ImportedBeam, taken: dict[str, Any], slab: str, first: bool) -> tuple[dict[str, Any], dict[str, Any]]:
    """A new beam's values (geometry, then template loads and studs or placeholders) and comments."""
    values: dict[str, Any] = {"mark": record.mark}
    comments: dict[str, Any] = {}
    geometry = dict(record.values)
    for key in ("shape", "span", "spacing_left", "spacing_right", "edge_left", "edge_right"):
        if key in geometry:
            values[key] = geometry.pop(key)
    values["slab"] = slab
    if first and all(record.ends):
        values["reference_end"], values["far_end"] = record.ends
    loads = {k: taken[k] for k in FROM_TEMPLATE if k in taken}
    if not taken:
        loads = dict(_PLACEHOLDER_BEAM) | {"studs": dict(_PLACEHOLDER_STUDS)}
        comments |= {k: CONFIRM for k in _PLACEHOLDER_BEAM}
        comments["studs.*"] = {k: CONFIRM for k in _PLACEHOLDER_STUDS}
    elif isinstance(loads.get("studs", {}).get("count"), int):
        loads["studs"] = loads["studs"] | {"count": "design"}
        comments["studs.*"] = {"count": f"{CONFIRM}: the template's count is for its own beam; "
                                        "give the drawings' count or keep design"}
    if record.girder:
        loads["load_width"] = "0 in"
        comments["load_width"] = "a girder: its slab load arrives through the beams resting on it (derived)"
        loads["deck_orientation"] = "parallel"
        comments["deck_orientation"] = (f"{CONFIRM}: deck ribs taken parallel to a girder "
                                        "(the deck spans between the beams framing in)")
    if record.studs is not None:
        loads["studs"] = loads.get("studs", {}) | {"count": record.studs}
        comments.setdefault("studs.*", {})["count"] = "from the schedule"
    values |= {k: v for k, v in loads.items() if k != "studs"} | geometry
    values["studs"] = loads.get("studs", {})
    return values, comments


def slab_tables(source: Source, template: Job | None, base_slab: str | None
                ) -> tuple[list[dict[str, Any]], dict[float, str], list[str], dict[str, dict[str, str]]]:
    """(slab tables, slab id per overall thickness, notes, comments per slab id). The topping is
    the model's overall thickness less the deck's rib height (the whole thickness for a solid slab)."""
    ribs = ({d.id: parse_length(d.rib_height) for d in template.deck} if template
            else {_PLACEHOLDER_DECK["id"]: parse_length(_PLACEHOLDER_DECK["rib_height"])})
    slabs = [s.model_dump(mode="json", exclude_unset=True, exclude_none=True) for s in template.slab] if template else []
    if not slabs:
        slabs = [{"id": "SLAB-1", "deck": _PLACEHOLDER_DECK["id"], "topping": "3 1/4 in"} | _PLACEHOLDER_SLAB]
    base = next((s for s in slabs if s["id"] == base_slab), slabs[0])
    comments: dict[str, dict[str, str]] = {}
    if template is None:
        comments[base["id"]] = {"deck": CONFIRM, "topping": CONFIRM, "concrete_pcf": CONFIRM, "fc_ksi": CONFIRM}
    thicknesses = sorted({round_to_sixteenth(t) for _, t in source.slabs})
    ids: dict[float, str] = {}
    notes: list[str] = []
    for n, t in enumerate(thicknesses):
        rib = ribs.get(base.get("deck", ""), 0.0)
        topping = t - rib
        gids = ", ".join(g for g, th in source.slabs if round_to_sixteenth(th) == t)
        if topping <= 0.0:
            notes.append(f"slab {gids}: {length_text(t)} overall is not thicker than the deck ribs "
                         f"({length_text(rib)}); topping not taken from it")
            continue
        slab = base if n == 0 else dict(base) | {"id": f"{base['id']}-{n + 1}"}
        if n > 0:
            slabs.append(slab)
        slab["topping"] = length_text(topping)
        comments.setdefault(slab["id"], {})["topping"] = (f"from the model's slab {gids}: {length_text(t)} overall"
                                                          + (f" less {length_text(rib)} deck ribs" if rib else "")
                                                          + (f" (deck rib height {CONFIRM})" if template is None and rib else ""))
        ids[t] = slab["id"]
    return slabs, ids, notes, comments


def job_text(source: Source, records: list[ImportedBeam], template: Job | None, template_mark: str | None) -> str:
    """The whole job file for a first import."""
    taken = _template_beam(template, template_mark)
    slabs, slab_ids, slab_notes, slab_comments = slab_tables(source, template, taken.get("slab"))
    lines = [f"# Written by `fieldcomp import` from {printable(source.path)} ({source.kind})"
             + (f", level {printable(source.level)!r}" if source.level else "") + ".",
             "# The geometry (shape, span, spacings, end_setback, level, plan, left_on, right_on, source_id) is the source's;",
             "# a re-import updates those fields only. Loads, studs, pours, findings and camber settings are yours."]
    lines += [f"# {printable(b)}." for b in source.basis]
    if template is None:
        lines.append(f"# No template job: deck, slab, studs and loads are placeholders marked {CONFIRM}. "
                     "Confirm them before using any result.")
    else:
        which = f" (beam {template_mark})" if template_mark else ""
        lines.append(f"# Deck, slab, studs and loads from the template job{which}.")
    left_out = source.left_out + slab_notes
    if left_out:
        lines.append("# Not read from the source (left out, not guessed):")
        lines += [f"#   {printable(p)}" for p in left_out]
    project = (template.project.model_dump(mode="json", exclude_unset=True) if template
               else {"name": source.project[:200] or "Imported floor", "method": "LRFD"})
    lines += ["", *table_lines("project", project, {} if template else {"method": CONFIRM}, array=False)]
    decks = ([d.model_dump(mode="json", exclude_unset=True) for d in template.deck] if template
             else [dict(_PLACEHOLDER_DECK)])
    for deck in decks:
        lines += ["", *table_lines("deck", deck, {} if template else {k: CONFIRM for k in deck if k != "id"})]
    for slab in slabs:
        lines += ["", *table_lines("slab", slab, slab_comments.get(slab["id"], {}))]
    default_slab = next((s["id"] for s in slabs if s["id"] == taken.get("slab")), slabs[0]["id"])
    for record in records:
        slab = slab_ids.get(round_to_sixteenth(record.slab_key)) if record.slab_key is not None else None
        notes = list(record.notes)
        if slab is None and source.slabs:
            notes.append(f"not over a slab of the model: slab {default_slab}")
        values, comments = beam_values(record, taken, slab or default_slab, True)
        lines += ["", *[f"# {printable(n)}" for n in notes], *table_lines("beam", values, comments)]
    return "\n".join(lines) + "\n"
