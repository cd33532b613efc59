"""Convert a validated job model into engine inputs, with errors naming file, beam and field."""

from __future__ import annotations

import datetime
import os
from dataclasses import fields

from engine.codes.aci318_19 import LIGHTWEIGHT_BELOW_PCF
from engine.codes.asce37_14 import CONSTRUCTION_LOAD_PSF
from engine.construction.pours import check_stages
from engine.model.deck import DeckProfile, Slab
from engine.model.inputs import (
    BeamInput, CamberRules, ConstructionSpec, DetailedRib, Finding, Limits, Method, PointLoad, PourStage, RibSettings, StudSpec,
)
from engine.model.results import Authority
from engine.model.shapes import ShapeNotFoundError, get_shape
from engine.model.units import format_inches, parse_length
from engine.model.errors import FieldcompError
from fieldcomp.jobs.jobfile import JobFileError, shown
from fieldcomp.jobs.model import Beam, Job, coordinate_inches
from engine.bay.inputs import FAR_END, REFERENCE_END, Bearing, LevelInput, PlanLine, PourZone
from engine.bay.plan_framing import plan_bearings

STATIONS = next(f.default for f in fields(BeamInput) if f.name == "n_stations")  # the engine's station grid
MAX_POUR_STAGES = 20  # a pour plan placed in short segments from both sides stays well under this


def to_engine(job: Job, path: str | os.PathLike[str] = "<job>") -> list[BeamInput]:
    """Every beam of the job as a `BeamInput`. Raises JobFileError listing every problem."""
    slabs, rules, problems = _materials(job)
    beams: list[BeamInput] = []
    for i, b in enumerate(job.beam):
        here = f"beam '{shown(b.mark)}' #{i + 1}"
        try:
            beams.append(beam_input(job, b, slabs[b.slab], rules))
        except _FieldProblemError as exc:
            problems.append((f"{here}, field '{exc.field}'", str(exc)))
    if problems:
        raise JobFileError(path, problems)
    if not has_level(job):
        return beams
    from engine.bay.zones import ZoneError
    from engine.mechanics.statics import PondingInstabilityError
    from engine.pipeline import framed_members

    try:
        return list(framed_members(level_input(job, beams, path)))
    except (ZoneError, PondingInstabilityError) as exc:
        raise JobFileError(path, [("level", str(exc))]) from None


def has_level(job: Job) -> bool:
    """True when beams of the job act together (pour zones, ends resting on girders): a beam's
    engine input then depends on the others (a girder's loads are the beams' reactions)."""
    return bool(job.zone) or job.project.framing_from_plan or any(b.left_on or b.right_on for b in job.beam)


def one_beam_to_engine(job: Job, index: int, path: str | os.PathLike[str] = "<job>") -> BeamInput:
    """Beam `index` of the job as a `BeamInput`, with the problems `to_engine` would list for it
    (and for the job's decks and slabs); the other beams are not converted, unless the job's
    beams act together (`has_level`), when the whole level is converted and this beam taken."""
    slabs, rules, problems = _materials(job)
    b = job.beam[index]
    try:
        beam = beam_input(job, b, slabs[b.slab], rules)
    except _FieldProblemError as exc:
        problems.append((f"beam '{shown(b.mark)}' #{index + 1}, field '{exc.field}'", str(exc)))
    if problems:
        raise JobFileError(path, problems)
    if not has_level(job):
        return beam
    group = level_group(job, index)
    return group_to_engine(job, group, path)[group.index(index)]


def level_group(job: Job, index: int) -> list[int]:
    """The beams acting with beam `index` (job order): those joined to it through bearings of
    beam ends on girders (`left_on` / `right_on`), as the bay solve couples them. Pour zones
    place each member from its own geometry, so they join nothing; bearings found from plan
    geometry (`framing_from_plan`) may join any two beams, so then the whole job is one group."""
    return next(g for g in level_groups(job) if index in g)


def level_groups(job: Job) -> list[list[int]]:
    """The job's beams partitioned into the groups `level_group` describes."""
    if job.project.framing_from_plan:
        return [list(range(len(job.beam)))]
    parent = list(range(len(job.beam)))

    def root(k: int) -> int:
        while parent[k] != k:
            parent[k] = parent[parent[k]]
            k = parent[k]
        return k

    where = {b.mark: k for k, b in enumerate(job.beam)}
    for k, b in enumerate(job.beam):
        for on in (b.left_on, b.right_on):
            if on is not None and on.girder in where:
                parent[root(k)] = root(where[on.girder])
    groups: dict[int, list[int]] = {}
    for k in range(len(job.beam)):
        groups.setdefault(root(k), []).append(k)
    return list(groups.values())


def group_to_engine(job: Job, group: list[int], path: str | os.PathLike[str] = "<job>") -> list[BeamInput]:
    """The beams of one `level_group` as the whole job's conversion gives them (its bays solved,
    its zones applied), converting only that group."""
    if len(group) == len(job.beam):
        return to_engine(job, path)
    return to_engine(job.model_copy(update={"beam": [job.beam[k] for k in group]}), path)


def _materials(job: Job) -> tuple[dict[str, Slab], CamberRules, list[tuple[str, str]]]:
    """The job's slabs (with their decks) and camber rules as engine inputs, and their problems."""
    decks = {d.id: DeckProfile(d.id, parse_length(d.rib_height), parse_length(d.rib_top_width),
                               parse_length(d.rib_bottom_width), parse_length(d.pitch), d.weight_psf,
                               parse_length(d.stud_offset)) for d in job.deck}
    problems: list[tuple[str, str]] = []
    for i, d in enumerate(job.deck):
        deck = decks[d.id]
        for field, value in (("pitch", deck.pitch), ("rib_height", deck.rib_height),
                             ("rib_top_width", deck.rib_top_width), ("rib_bottom_width", deck.rib_bottom_width)):
            if value <= 0.0:
                problems.append((f"deck '{shown(d.id)}' #{i + 1}, field '{field}'", "must be greater than zero"))
        if deck.rib_top_width > deck.pitch:
            problems.append((f"deck '{shown(d.id)}' #{i + 1}, field 'rib_top_width'", "wider than the pitch"))
        elif deck.rib_top_width < deck.rib_bottom_width:
            problems.append((f"deck '{shown(d.id)}' #{i + 1}, field 'rib_top_width'",
                             f"{shown(d.rib_top_width)} is narrower than rib_bottom_width {shown(d.rib_bottom_width)}: "
                             "a concrete rib widens from the deck pan to the deck top (re-entrant profiles are not covered)"))
    slabs = {}
    for i, s in enumerate(job.slab):
        lightweight = s.lightweight if s.lightweight is not None else s.concrete_pcf < LIGHTWEIGHT_BELOW_PCF
        slabs[s.id] = Slab(s.id, decks.get(s.deck) if s.deck else None, parse_length(s.topping),
                           s.concrete_pcf, s.fc_ksi, lightweight)
        if slabs[s.id].topping <= 0.0:
            problems.append((f"slab '{shown(s.id)}' #{i + 1}, field 'topping'", "must be greater than zero"))
    cam = job.project.camber
    rules = CamberRules(cam.fraction, parse_length(cam.increment), parse_length(cam.minimum),
                        parse_length(cam.min_length), parse_length(cam.min_depth), parse_length(cam.thin_web))
    return slabs, rules, problems


def level_input(job: Job, beams: list[BeamInput], path: str | os.PathLike[str] = "<job>") -> LevelInput:
    """The job's level for engine.bay: bearings of beam ends on girders, plan lines, pour zones
    (days counted from the first zone's date). Raises JobFileError naming beam or zone and field."""
    # the engine inputs in job order name the members (a caller may have renamed them)
    engine_mark = {jb.mark: b.mark for jb, b in zip(job.beam, beams)} if len(beams) == len(job.beam) else {}

    def named(mark: str) -> str:
        return engine_mark.get(mark, mark)

    spans = {jb.mark: b.span for jb, b in zip(job.beam, beams)} if engine_mark else {b.mark: b.span for b in beams}
    problems: list[tuple[str, str]] = []
    bearings = []
    for i, b in enumerate(job.beam):
        for end, name in ((REFERENCE_END, "left_on"), (FAR_END, "right_on")):
            on = getattr(b, name)
            if on is None:
                continue
            at = parse_length(on.at)
            if not 0.0 < at < spans[on.girder]:
                problems.append((f"beam '{shown(b.mark)}' #{i + 1}, field '{name}.at'",
                                 f"{shown(on.at)} is not inside the span of girder '{shown(on.girder)}'"))
            bearings.append(Bearing(named(b.mark), end, named(on.girder), at))
    plans = tuple((named(b.mark), PlanLine(*(coordinate_inches(getattr(b.plan, c)) for c in ("x1", "y1", "x2", "y2"))))
                  for b in job.beam if b.plan is not None)
    if job.project.framing_from_plan:
        bearings += plan_bearings(plans, {named(m): v for m, v in spans.items()}, tuple(bearings))
    dates = [datetime.date.fromisoformat(z.date) for z in job.zone]
    first = min(dates) if dates else None
    zones = []
    for z, d in zip(job.zone, dates):
        only = tuple(named(b.mark) for b in job.beam if b.level == z.level) if z.level is not None else ()
        outline = tuple((coordinate_inches(p.x), coordinate_inches(p.y)) for p in z.outline)
        zones.append(PourZone(z.name, float((d - first).days) if first else 0.0, z.date, tuple(named(m) for m in z.beams),
                              outline, only))
    if problems:
        raise JobFileError(path, problems)
    sag = job.project.deck_sag
    return LevelInput(job.project.name, tuple(beams), tuple(bearings), plans, tuple(zones),
                      None if sag is None else parse_length(sag))


class _FieldProblemError(FieldcompError, ValueError):
    def __init__(self, field: str, message: str):
        super().__init__(message)
        self.field = field


def beam_input(job: Job, b: Beam, slab: Slab, rules: CamberRules) -> BeamInput:
    """One beam of the job as engine input; raises _FieldProblemError naming the field."""
    try:
        shape = get_shape(b.shape)
    except ShapeNotFoundError as exc:
        raise _FieldProblemError("shape", str(exc)) from None
    span = parse_length(b.span)
    if not 12.0 <= span <= 1200.0:
        raise _FieldProblemError("span", f"{shown(b.span)} is outside 1 ft to 100 ft")
    sides = []
    for side in ("left", "right"):
        spacing, edge = getattr(b, f"spacing_{side}"), getattr(b, f"edge_{side}")
        value = parse_length(spacing) / 2.0 if spacing is not None else parse_length(edge)
        if spacing is not None and value <= 0.0:
            raise _FieldProblemError(f"spacing_{side}", "must be greater than zero")
        sides.append(value)
    point_loads = []
    for k, p in enumerate(b.point_loads):
        x = parse_length(p.at)
        if not 0.0 < x < span:
            raise _FieldProblemError(f"point_loads[{k}].at", f"{shown(p.at)} is not inside the span {shown(b.span)}")
        pre = p.dead_kips if p.precomposite_dead_kips is None else p.precomposite_dead_kips
        if pre > p.dead_kips:
            raise _FieldProblemError(f"point_loads[{k}].precomposite_dead_kips", "exceeds dead_kips")
        point_loads.append(PointLoad(x, p.dead_kips, p.live_kips, pre, p.construction_live_kips))
    if len(b.pour) > MAX_POUR_STAGES:
        raise _FieldProblemError("pour", f"{len(b.pour)} pour stages; at most {MAX_POUR_STAGES} are computed for one beam "
                                 "(each stage recomputes the whole span, and the time grows with the square of the count)")
    pours = []
    for k, stage in enumerate(b.pour):
        start = parse_length(stage.start)
        end = span if stage.end is None else parse_length(stage.end)
        if not 0.0 <= start < end <= span + 1e-6:
            raise _FieldProblemError(f"pour[{k}]", f"stage '{shown(stage.name)}' must run from 0 to the span with start < end")
        pours.append(PourStage(stage.name, start, min(end, span), stage.side, stage.day, stage.screed, stage.date))
    if pours:
        try:
            check_stages(tuple(pours), span)
        except ValueError as exc:
            raise _FieldProblemError("pour", str(exc)) from None
    camber = rules if b.camber == "auto" else CamberRules(
        rules.fraction, rules.increment, rules.minimum, rules.min_length, rules.min_depth, rules.thin_web,
        do_not_camber=b.no_camber_reason or "marked not to be cambered")
    limits = b.construction_limits
    unbraced = None if b.unbraced_length is None else parse_length(b.unbraced_length)
    if unbraced is not None and 0.0 < unbraced < span / (STATIONS - 1):
        raise _FieldProblemError("unbraced_length", f"{shown(b.unbraced_length)} is shorter than the station spacing "
                                 f"{span / (STATIONS - 1):.3g} in (span / {STATIONS - 1}) the bare-steel check "
                                 "resolves; give 0 in for a top flange braced continuously")
    construction = ConstructionSpec(
        live_psf=b.construction_live_psf if b.construction_load is None else CONSTRUCTION_LOAD_PSF[b.construction_load],
        screed=b.screed, unbraced_length=unbraced,
        pours=tuple(pours), camber=camber, combinations=tuple((f.dead, f.live) for f in b.construction_factors),
        dead_limit_ratio=limits.dead_ratio,
        dead_limit_max=None if limits.dead_max is None else parse_length(limits.dead_max),
        dead_limit_authority=Authority.PROJECT if limits.model_fields_set & {"dead_ratio", "dead_max"}
        else Authority.DESIGN_GUIDE,
        live_limit_ratio=limits.live_ratio,
        measured_camber=None if b.measured_camber is None else parse_length(b.measured_camber))
    keep_start, keep_end = parse_length(b.keep_out_start), parse_length(b.keep_out_end)
    if keep_start + keep_end >= span:
        raise _FieldProblemError("keep_out_start", "keep-out zones cover the whole span")
    setback = parse_length(b.end_setback)
    if 2.0 * setback >= span:
        raise _FieldProblemError("end_setback", "the setbacks at both ends cover the whole span")
    ribs = RibSettings(b.reference_end, b.far_end, None if b.first_rib is None else parse_length(b.first_rib),
                       keep_start, keep_end, job.project.station_origin, setback)
    # finding stations are read off the marks, so they follow the printed station convention
    offset = setback if job.project.station_origin == "beam-end" else 0.0
    findings = tuple(Finding(f.kind, f.rib, None if f.station is None else parse_length(f.station) + offset,
                             f.count, f.note, f.found, _iso_or_blank(f.date)) for f in b.finding)
    detailed = tuple(DetailedRib(r.studs, r.rib, None if r.station is None else parse_length(r.station) + offset)
                     for r in b.as_detailed)
    diameter = parse_length(b.studs.diameter)
    if not 0.25 <= diameter <= 1.0:
        raise _FieldProblemError("studs.diameter", f"{shown(b.studs.diameter)} is outside 1/4 in to 1 in")
    deck = slab.deck
    if deck is not None and b.deck_orientation == "perpendicular" and diameter > deck.rib_bottom_width:
        raise _FieldProblemError("studs.diameter", f"a {shown(b.studs.diameter)} stud does not fit the "
                                 f"{format_inches(deck.rib_bottom_width)} rib bottom of deck '{shown(deck.name)}'")
    studs = StudSpec(diameter, b.studs.fu_ksi, parse_length(b.studs.length), b.studs.position,
                     None if b.studs.count == "design" else b.studs.count, b.studs.max_per_rib,
                     b.studs.design_sum_qn, b.studs.design_composite)
    return BeamInput(
        mark=b.mark, shape=shape, span=span, fy=b.fy_ksi, slab=slab, orientation=b.deck_orientation,
        slab_left=sides[0], slab_right=sides[1], superimposed_dead_psf=b.superimposed_dead_psf,
        live_psf=b.live_psf, studs=studs, method=Method(job.project.method), point_loads=tuple(point_loads),
        load_width=None if b.load_width is None else parse_length(b.load_width),
        construction=construction, ribs=ribs, findings=findings, detailed=detailed,
        limits=_limits(b), support=b.support, web_openings=b.web_openings,
    )


def _iso_or_blank(text: str) -> str:
    """A report date the engine can compare with the pour dates (YYYY-MM-DD), else "" (timing unknown)."""
    import datetime

    if not text.strip():  # most findings give no date
        return ""
    try:
        return datetime.date.fromisoformat(text.strip()).isoformat()
    except ValueError:
        return ""


def _limits(b: Beam) -> Limits:
    """The beam's deflection limits; one the job states is the project's (engine.model.inputs.Limits)."""
    typed = b.model_fields_set
    return Limits(b.live_limit_ratio, b.total_limit_ratio,
                  Authority.PROJECT if "live_limit_ratio" in typed else Authority.BUILDING_CODE,
                  Authority.PROJECT if "total_limit_ratio" in typed else Authority.COMMON_PRACTICE)


def require_in_scope(beams: list[BeamInput], path: str | os.PathLike[str] = "<job>") -> None:
    """Raise JobFileError naming beam, field and clause for every beam outside the engine's scope
    (engine.finished.evaluate.check_scope)."""
    from engine.model.scope import OutOfScopeError, check_scope

    problems = []
    for b in beams:
        try:
            check_scope(b)
        except OutOfScopeError as exc:
            problems.append((f"beam '{shown(b.mark)}', field '{exc.field}'", str(exc)))
    if problems:
        raise JobFileError(path, problems)
