"""What an import found for each beam, as job-file values (lengths as people write them): the
geometry fields the import owns, the notes it writes beside them, and the conversion of a plan
layout (floor_geometry) into these records."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

from engine.model.units import format_ft_in, format_inches, round_to_sixteenth
from fieldcomp.jobs.floor_geometry import FloorBeam

# The fields an import writes and a re-import updates: the beam's geometry. Everything else on
# a beam (loads, studs, pours, findings, camber settings ...) is the engineer's.
GEOMETRY = ("shape", "span", "spacing_left", "spacing_right", "edge_left", "edge_right", "end_setback",
            "level", "plan", "left_on", "right_on", "source_id")

SPAN_BASIS = ("span: support work point to work point (centre to centre of supports): a column's "
              "centre, or where the beam's axis crosses the axis of the girder it frames into; an end "
              "bearing on no member found in the model is taken at the modelled end of the steel")
SIDE_BASIS = ("spacing_left / spacing_right: perpendicular distance at mid-span to the adjacent parallel beam "
              "on that side; edge_left / edge_right instead where the slab edge is nearer; left and right looking "
              "from the reference end to the far end")
GIRDER_NOTE = ("girder: the beams resting on it name it in left_on / right_on; its loads from them are derived "
               "stage by stage (fieldcomp camber shows them), so its own area loads are off (load_width 0 in)")


@dataclass(slots=True)
class ImportedBeam:
    mark: str
    values: dict[str, Any]  # GEOMETRY field -> job-file value (plan, left_on and right_on dicts)
    ends: tuple[str, str] = ("", "")  # reference_end / far_end names for a first import
    notes: list[str] = field(default_factory=list)  # written as comments above the beam
    girder: bool = False
    slab_key: float | None = None  # overall slab thickness (in) under the beam, when the model has one
    studs: int | str | None = None  # a stud count the schedule gives (first import only: studs are the engineer's)


def length_text(inches: float) -> str:
    """A length as the job file writes it, to the nearest 1/16 in: feet-inches from 1 ft, else inches."""
    return format_ft_in(inches) if round_to_sixteenth(inches) >= 12.0 else format_inches(inches)


def coordinate_text(inches: float) -> str:
    text = length_text(abs(inches))
    return f"-{text}" if round_to_sixteenth(inches) < 0.0 else text


def _end_name(support: str) -> str:
    return f"at {support}"[:40] if support else "modelled end"


def from_layout(beams: list[FloorBeam], level: str, notes: dict[str, list[str]]) -> tuple[list[ImportedBeam], list[str]]:
    """Records for the beams whose sides were found, and the problems of those that were not."""
    records: list[ImportedBeam] = []
    problems: list[str] = []
    framing: dict[str, list] = {}
    for b in beams:
        m = b.member
        if b.problems:
            problems += [f"IfcBeam {m.source_id} '{m.mark}': {p}; beam not written" for p in b.problems]
            continue
        values: dict[str, Any] = {"shape": m.shape, "span": length_text(b.span)}
        for side, (kind, inches) in sorted(b.sides.items()):
            values[f"{kind}_{side}"] = length_text(inches)
        setbacks = [((b.start[0] - m.start[0]) ** 2 + (b.start[1] - m.start[1]) ** 2) ** 0.5,
                    ((b.end[0] - m.end[0]) ** 2 + (b.end[1] - m.end[1]) ** 2) ** 0.5]
        beam_notes = list(notes.get(m.source_id, []))
        if round_to_sixteenth(setbacks[0]) == round_to_sixteenth(setbacks[1]):
            values["end_setback"] = length_text(setbacks[0])
        else:
            beam_notes.append(f"work point to end of steel differs at the two ends ({length_text(setbacks[0])}, "
                              f"{length_text(setbacks[1])}): end_setback not written")
        values["level"] = level
        values["plan"] = {"x1": coordinate_text(b.start[0]), "y1": coordinate_text(b.start[1]),
                          "x2": coordinate_text(b.end[0]), "y2": coordinate_text(b.end[1])}
        values["source_id"] = m.source_id
        for where, support in zip(("reference end", "far end"), b.supports):
            if not support:
                beam_notes.append(f"{where}: no supporting column or girder found in the model; "
                                  "span taken to the modelled end of the steel")
        records.append(ImportedBeam(m.mark, values, (_end_name(b.supports[0]), _end_name(b.supports[1])),
                                    beam_notes, bool(b.framing), b.slab.thickness if b.slab else None))
        framing[m.mark] = b.framing
    by_mark = {r.mark: r for r in records}
    for r in records:
        kept = [f for f in framing[r.mark] if f.mark in by_mark]
        for f in framing[r.mark]:
            if f.mark not in by_mark:
                r.notes.append(f"{f.mark} frames in at {length_text(f.at)} but was not written (see the import report)")
        for f in kept:  # the framing beam's end names this girder and the station along it
            beam = by_mark[f.mark]
            beam.values["left_on" if f.end == "reference-end" else "right_on"] = {"girder": r.mark, "at": length_text(f.at)}
        r.girder = bool(kept)
        if r.girder:
            r.notes.append(GIRDER_NOTE)
    for r in records:
        r.values = {k: r.values[k] for k in GEOMETRY if k in r.values}
    return records, problems
