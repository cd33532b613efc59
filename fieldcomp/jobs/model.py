"""Pydantic models of the TOML job file. Lengths stay strings with units (as people write
them) and are parsed by `engine.model.units.parse_length` when converted to engine inputs."""

from __future__ import annotations

import unicodedata
from fractions import Fraction
from typing import Annotated, Literal

from pydantic import AfterValidator, BaseModel, BeforeValidator, ConfigDict, Field, model_validator

from engine.codes import practice
from engine.model.units import UnitError, parse_length


_NON_PRINTING = {"Cc", "Cf", "Zl", "Zp", "Cs"}  # controls (ESC, NUL, tab), bidi and zero-width marks, line breaks


def _printable(text: str) -> str:
    """Text fields hold printable text: no control, format or line-break character."""
    if text.isprintable():  # refuses every category of _NON_PRINTING (and some it allows, looked at below)
        return text
    for i, ch in enumerate(text):
        if unicodedata.category(ch) in _NON_PRINTING:
            raise ValueError(f"holds a non-printing character (U+{ord(ch):04X}) at character {i + 1}; "
                             "write printable text only")
    return text


Words = Annotated[str, AfterValidator(_printable)]


def _length_kind(value: object) -> object:
    """A number where a length belongs is refused with the unit hint (strings go on to `_length`)."""
    if isinstance(value, (int, float)):
        try:
            parse_length(value)  # type: ignore[arg-type]  # raises the hint: a length needs a unit
        except UnitError as exc:
            raise ValueError(str(exc)) from None
    return value


def _length(text: str) -> str:
    try:
        parse_length(text)
    except UnitError as exc:
        raise ValueError(str(exc)) from None
    return text


def _written(inches: float, unit: str = "in") -> str:
    """A default length (in) of engine.codes.practice as people write it: 0.25 -> "1/4 in",
    288 with unit "ft" -> "24 ft"."""
    return f"{Fraction(inches / 12.0 if unit == 'ft' else inches)} {unit}"


Length = Annotated[
    str,
    BeforeValidator(_length_kind),
    AfterValidator(_printable),
    AfterValidator(_length),
    Field(description="A length with units: 32'-6 1/2\", 45 ft, 6.5 in, 3/4 in or 1650 mm. Bare numbers are refused.",
          examples=["32'-6 1/2\"", "6.5 in"]),
]


def coordinate_inches(text: str) -> float:
    """A plan coordinate in inches: a length with units, optionally signed ("-12'-6\"", "3.5 m")."""
    text = text.strip()
    negative = text.startswith("-")
    inches = parse_length(text[1:].lstrip() if negative else text)
    return -inches if negative else inches


def _coordinate(text: str) -> str:
    try:
        coordinate_inches(text)
    except UnitError as exc:
        raise ValueError(str(exc)) from None
    return text


Coordinate = Annotated[
    str,
    BeforeValidator(_length_kind),
    AfterValidator(_printable),
    AfterValidator(_coordinate),
    Field(description="A plan coordinate: a length with units from the plan origin, may be negative (\"-12'-6\\\"\", \"48 ft\", \"14.63 m\").",
          examples=["48'-0\"", "-6 ft"]),
]


class Strict(BaseModel):
    model_config = ConfigDict(extra="forbid", frozen=True, strict=True)


class CamberSettings(Strict):
    fraction: float = Field(practice.CAMBER_FRACTION, gt=0.0, le=1.0, description="Share of the pre-composite dead-load deflection to camber out (common practice 0.80).")
    increment: Length = Field(_written(practice.CAMBER_INCREMENT), description="Camber is rounded down to this increment.")
    minimum: Length = Field(_written(practice.CAMBER_MINIMUM), description="No camber below this (common practice).")
    min_length: Length = Field(_written(practice.CAMBER_MIN_LENGTH, "ft"), description="Beams shorter than this are not cambered.")
    min_depth: Length = Field(_written(practice.CAMBER_MIN_DEPTH), description="Beams shallower than this are not cambered.")
    thin_web: Length = Field(_written(practice.CAMBER_MAX_THIN_WEB), description="Beams whose web is this thin or thinner are not cambered (common practice 1/4 in).")


class Project(Strict):
    name: Words = Field(description="Job name printed on every report and sheet.", min_length=1, max_length=200)
    method: Literal["LRFD", "ASD"] = Field("LRFD", description="Design method (AISC 360-22 B3.1 / B3.2).")
    station_origin: Literal["beam-end", "support"] = Field(
        "beam-end", description="Stations are measured from the end of the steel or from the support work point.")
    camber: CamberSettings = Field(default_factory=CamberSettings, description="Camber decision settings.")
    framing_from_plan: bool = Field(False, description="A beam end whose plan work point lies on a girder's line (within 1 in, between the girder's ends) rests on that girder, where left_on / right_on do not say. Leave off when girder point loads are typed for those beams.")
    deck_sag: Length | None = Field(None, description="The deck's own sag between beams at mid-pitch under wet concrete (from the deck's load tables): counted in the concrete to order. Leave out: not counted.")


class Deck(Strict):
    id: Words = Field(min_length=1, max_length=60, description="Deck name that slabs refer to.")
    rib_height: Length = Field(description="h_r, height of the deck ribs.")
    rib_top_width: Length = Field(description="Width of a concrete rib at the deck top.")
    rib_bottom_width: Length = Field(description="Width of a concrete rib at the deck pan.")
    pitch: Length = Field(description="Rib spacing, centre to centre.")
    weight_psf: float = Field(ge=0.0, le=20.0, description="Deck weight, psf.")
    stud_offset: Length = Field("1 1/4 in", description="Offset of an off-centre stud from the rib centreline (flute stiffener).")


class Slab(Strict):
    id: Words = Field(min_length=1, max_length=60, description="Slab name that beams refer to.")
    deck: Words | None = Field(None, description="Deck id; leave out for a solid slab.")
    topping: Length = Field(description="Concrete above the deck top (whole thickness of a solid slab).")
    concrete_pcf: float = Field(ge=70.0, le=160.0, description="Concrete unit weight w_c, pcf.")
    fc_ksi: float = Field(gt=0.0, le=20.0, description="Specified compressive strength f'c, ksi (AISC 360-22 I1.3 range is checked).")
    lightweight: bool | None = Field(None, description="Lightweight concrete; default: w_c under 135 pcf (ACI 318-19 2.3).")


class Studs(Strict):
    diameter: Length = Field(_written(practice.STUD_DIAMETER), description="Stud shank diameter d_sa.")
    fu_ksi: float = Field(practice.STUD_FU_KSI, gt=0.0, le=100.0, description="Stud tensile strength F_u, ksi.")
    length: Length = Field(description="Installed stud length (after welding).")
    position: Literal["strong", "weak", "center"] = Field("weak", description="Stud position in the rib (AISC 360-22 I8.2a).")
    count: int | Literal["design"] = Field(description="Studs on the whole beam as on the drawings, or \"design\" to find the count.")
    max_per_rib: int = Field(3, ge=1, le=3, description="Most studs the job allows in one rib.")
    design_sum_qn: float | None = Field(None, gt=0.0, le=20000.0, description="The design's intent: sum Qn each side of the maximum moment, kips (from the calculations). A layout that develops less is flagged for review.")
    design_composite: float | None = Field(None, gt=0.0, le=1.0, description="Or the design's degree of composite, sum Qn / C_f. A layout that develops less is flagged for review.")

    @model_validator(mode="after")
    def _count_range(self) -> "Studs":
        if isinstance(self.count, int) and not 0 <= self.count <= 1000:
            raise ValueError("count must be between 0 and 1000, or \"design\"")
        return self


class PointLoadIn(Strict):
    at: Length = Field(description="Station of the load from the reference end.")
    dead_kips: float = Field(0.0, ge=0.0, le=5000.0, description="All dead load, kips.")
    precomposite_dead_kips: float | None = Field(None, ge=0.0, le=5000.0, description="Part of the dead load applied to the bare steel (default: all of it).")
    live_kips: float = Field(0.0, ge=0.0, le=5000.0, description="Live load on the finished floor, kips.")
    construction_live_kips: float = Field(0.0, ge=0.0, le=5000.0, description="Construction live load during placement, kips.")


class Pour(Strict):
    name: Words = Field(min_length=1, max_length=60, description="Stage name.")
    start: Length = Field("0 in", description="Station where this stage's concrete starts.")
    end: Length | None = Field(None, description="Station where it ends (default: the far end).")
    side: Literal["both", "left", "right"] = Field("both", description="Side of the beam the concrete is placed on.")
    day: float = Field(0.0, ge=0.0, le=365.0, description="Days after the first placement.")
    screed: Literal["constant-thickness", "level"] | None = Field(None, description="Overrides the beam's screeding mode.")
    date: IsoDate = Field("", description="Date the stage was placed, YYYY-MM-DD (tells findings found before the pour from those after).")


ConstructionLoadClass = Literal["very-light", "light", "medium", "heavy"]


class CombinationIn(Strict):
    dead: float = Field(ge=0.0, le=3.0, description="Factor on the dead load (steel, deck, wet concrete).")
    live: float = Field(ge=0.0, le=3.0, description="Factor on the construction live load.")


class ConstructionLimitsIn(Strict):
    dead_ratio: float = Field(practice.WET_DEFLECTION_RATIO, ge=60.0, le=2000.0, description="Pre-composite dead-load deflection less camber: limit span / ratio (AISC Design Guide 3 via AISC Design Examples v16.0 Chapter I: 360).")
    dead_max: Length | None = Field(_written(practice.WET_DEFLECTION_MAX), description="... and not over this length (Design Guide 3: 1 in); leave out for no cap.")
    live_ratio: float | None = Field(None, ge=60.0, le=2000.0, description="Construction live-load deflection limit, span / ratio; leave out: not checked.")


FindingKind = Literal["missing", "failed-test", "awaiting-test", "weak-side", "off-rib", "short", "added",
                      "bent-accepted", "replaced"]


def _iso_date(text: str) -> str:
    import datetime

    if text:
        try:
            datetime.date.fromisoformat(text)
        except ValueError:
            raise ValueError(f"'{text[:40]}' is not a date as YYYY-MM-DD") from None
    return text


IsoDate = Annotated[str, AfterValidator(_iso_date), Field(max_length=10, description="A date as YYYY-MM-DD, or empty.")]


DispositionStatus = Literal["open", "accepted-by-eor", "repair-ordered", "repaired", "re-inspected"]


class DispositionIn(Strict):
    status: DispositionStatus = Field(description="open, accepted by the engineer of record, repair ordered, repaired, or re-inspected.")
    by: str = Field("", max_length=100, description="Who set it (the engineer of record for acceptance and repair orders).")
    on: IsoDate = Field("", description="When, YYYY-MM-DD.")
    note: str = Field("", max_length=500, description="Remark, e.g. the letter or RFI number.")


class ReportIn(Strict):
    number: str = Field(min_length=1, max_length=40, description="Inspection report number, e.g. SI-07.")
    date: IsoDate = Field("", description="Date of the inspection, YYYY-MM-DD.")
    inspector: str = Field("", max_length=100, description="Who inspected.")
    history: list[DispositionIn] = Field(default_factory=list, description="Dispositions of the whole report, oldest first (kept: add, never edit).")


class FindingIn(Strict):
    kind: FindingKind = Field(description="What the inspector found.")
    rib: int | None = Field(None, ge=1, le=10000, description="Rib number from the reference end, 1-based.")
    station: Length | None = Field(None, description="Station from the reference end (instead of rib).")
    count: int = Field(1, ge=1, le=3, description="Studs concerned.")
    note: Words = Field("", max_length=500, description="Inspector's note.")
    date: Words = Field("", max_length=40, description="Date of the report; written YYYY-MM-DD, with the pour dates it tells whether the slab over the finding was placed.")
    found: Literal["before-pour", "after-pour"] | None = Field(None, description="Whether the slab over the finding was placed when it was found (default: derived from date and the pour dates, else unknown: both branches are reported).")
    reported_by: Words = Field("", max_length=100, description="Who reported it.")
    report: Words = Field("", max_length=40, description="Number of the inspection report it belongs to ([[beam.report]] number).")
    history: list[DispositionIn] = Field(default_factory=list, description="Dispositions of this finding, oldest first; the latest governs over its report's.")

    @model_validator(mode="after")
    def _one_place(self) -> "FindingIn":
        if (self.rib is None) == (self.station is None):
            raise ValueError("give exactly one of rib or station")
        return self


class DetailedRibIn(Strict):
    rib: int | None = Field(None, ge=1, le=10000, description="Rib number from the reference end, 1-based.")
    station: Length | None = Field(None, description="Station from the reference end (instead of rib).")
    studs: int = Field(ge=0, le=3, description="Studs in the rib as detailed on the shop drawings.")

    @model_validator(mode="after")
    def _one_place(self) -> "DetailedRibIn":
        if (self.rib is None) == (self.station is None):
            raise ValueError("give exactly one of rib or station")
        return self


class PlanLine(Strict):
    """Where the beam lies on the framing plan: its support work points, plan x to the right and y up."""

    x1: Coordinate = Field(description="x of the reference end's work point (station 0).")
    y1: Coordinate = Field(description="y of the reference end's work point.")
    x2: Coordinate = Field(description="x of the far end's work point.")
    y2: Coordinate = Field(description="y of the far end's work point.")


class BearingIn(Strict):
    """Where one end of this beam rests on a girder (instead of a column or wall): for the bay."""

    girder: Words = Field(min_length=1, max_length=40, description="Mark of the girder the end rests on (a beam of the job).")
    at: Length = Field(description="Station along the girder from the girder's reference end where this end bears (as point_loads.at).")


class PlanPoint(Strict):
    """A point on the framing plan (plan x to the right, y up)."""

    x: Coordinate = Field(description="x of the point.")
    y: Coordinate = Field(description="y of the point.")


class ZoneIn(Strict):
    """A pour zone of a level: the slab placed in one pour, on one date. Its members are listed, or
    found from an outline on plan (beams with plan coordinates; the stretch of each inside it)."""

    name: Words = Field(min_length=1, max_length=60, description="Zone name, e.g. \"pour 3A\".")
    date: IsoDate = Field(description="Date the zone is placed, YYYY-MM-DD.")
    level: Words | None = Field(None, max_length=60, description="Level the zone is on (default: every level).")
    beams: list[Words] = Field(default_factory=list, max_length=1000, description="Marks of the beams whose whole slab this zone places (instead of outline).")
    outline: list[PlanPoint] = Field(default_factory=list, max_length=200, description="The zone's boundary on plan, corner by corner (instead of beams).")

    @model_validator(mode="after")
    def _one_way(self) -> "ZoneIn":
        if not self.date:
            raise ValueError("give the date the zone is placed")
        if bool(self.beams) == bool(self.outline):
            raise ValueError("give exactly one of beams or outline")
        if self.outline and len(self.outline) < 3:
            raise ValueError("an outline needs at least three corners")
        return self


class Beam(Strict):
    mark: Words = Field(min_length=1, max_length=40, description="Beam mark as on the framing plan.")
    shape: Words = Field(description="W shape, e.g. W21X50.", min_length=2, max_length=20)
    span: Length = Field(description="Span between support centrelines.")
    spacing_left: Length | None = Field(None, description="Distance to the adjacent beam on the left.")
    spacing_right: Length | None = Field(None, description="Distance to the adjacent beam on the right.")
    edge_left: Length | None = Field(None, description="Distance to the slab edge on the left (instead of spacing_left).")
    edge_right: Length | None = Field(None, description="Distance to the slab edge on the right (instead of spacing_right).")
    load_width: Length | None = Field(None, description="Tributary width for area loads (default from spacings; 0 in for a girder loaded by beams).")
    slab: Words = Field(description="Slab id.")
    deck_orientation: Literal["perpendicular", "parallel"] = Field("perpendicular", description="Deck ribs relative to the beam.")
    fy_ksi: float = Field(practice.FY_KSI, gt=0.0, le=100.0, description="Steel yield stress F_y, ksi.")
    superimposed_dead_psf: float = Field(0.0, ge=0.0, le=1000.0, description="Dead load added after the slab cures, psf.")
    live_psf: float = Field(0.0, ge=0.0, le=1000.0, description="Live load, psf.")
    construction_live_psf: float = Field(practice.CONSTRUCTION_LIVE_PSF, ge=0.0, le=200.0, description="Construction live load during placement, psf.")
    screed: Literal["constant-thickness", "level"] = Field("constant-thickness", description="How the slab is screeded.")
    unbraced_length: Length | None = Field(None, description="Unbraced length of the top flange while wet (default: braced continuously by fastened perpendicular deck, otherwise at the point loads).")
    construction_load: ConstructionLoadClass | None = Field(None, description="ASCE/SEI 37-14 Table 4-1 operational class; sets the construction live load (very-light 20, light 25, medium 50, heavy 75 psf). Give this or construction_live_psf, not both.")
    construction_factors: list[CombinationIn] = Field(default_factory=list, description="Construction-stage load combinations for the job's method (default LRFD 1.4D and 1.2D + 1.6L, ASD D + L).")
    construction_limits: ConstructionLimitsIn = Field(default_factory=ConstructionLimitsIn, description="Construction-stage deflection limits.")
    camber: Literal["auto", "none"] = Field("auto", description="\"none\" for beams that must not be cambered.")
    no_camber_reason: Words | None = Field(None, max_length=80, description="Why not to camber (moment-connected, spandrel, cantilevered ...).")
    measured_camber: Length | None = Field(None, description="Camber measured on the delivered beam (shop or field survey): the report gives cover and slab thickness at it, a go / no-go before the pour.")
    support: Literal["simple", "continuous", "cantilever"] = Field("simple", description="Support condition; only simple spans are computed, the others are refused (AISC 360-22 I3.2b).")
    web_openings: bool = Field(False, description="The beam has web openings (not checked: AISC Design Guide 2); reports flag it.")
    reference_end: Words = Field("left end", max_length=40, description="Name of the end stations are measured from (e.g. \"west\", \"grid 3\").")
    far_end: Words = Field("far end", max_length=40, description="Name of the other end (e.g. \"east\", \"grid 4\").")
    end_setback: Length = Field("0 in", description="Support centreline (work point) to the end of the steel, at each end. Stations printed for the erector and finding stations are measured from the end of the steel when project.station_origin is \"beam-end\".")
    first_rib: Length | None = Field(None, description="Station of the first rib centreline (default half a pitch).")
    keep_out_start: Length = Field("0 in", description="No studs closer than this to the reference end.")
    keep_out_end: Length = Field("0 in", description="No studs closer than this to the far end.")
    live_limit_ratio: float = Field(practice.LIVE_DEFLECTION_RATIO, ge=100.0, le=2000.0, description="Live-load deflection limit, span / ratio.")
    total_limit_ratio: float = Field(practice.TOTAL_DEFLECTION_RATIO, ge=100.0, le=2000.0, description="Total deflection limit, span / ratio.")
    point_loads: list[PointLoadIn] = Field(default_factory=list, description="Concentrated loads.")
    studs: Studs = Field(description="Headed stud anchors.")
    pour: list[Pour] = Field(default_factory=list, description="Pour stages (default: the whole slab at once).")
    finding: list[FindingIn] = Field(default_factory=list, description="Stud inspection findings.")
    report: list[ReportIn] = Field(default_factory=list, description="Stud inspection reports on this beam; findings name theirs by number.")
    as_detailed: list[DetailedRibIn] = Field(default_factory=list, description="The studs as detailed on the shop drawings, rib by rib (ribs not listed hold none); findings apply to this layout. Leave out: findings apply to fieldcomp's own layout.")
    level: Words | None = Field(None, max_length=60, description="Storey or level the beam is on (e.g. \"Level 3\").")
    plan: PlanLine | None = Field(None, description="Plan coordinates of the beam's work points (for the framing plan).")
    left_on: BearingIn | None = Field(None, description="The reference end (station 0) rests on this girder, at this station along it (default: on a column or wall).")
    right_on: BearingIn | None = Field(None, description="The far end rests on this girder, at this station along it (default: on a column or wall).")
    source_id: Words | None = Field(None, max_length=80, description="Id of the element in the model or schedule it was imported from (IFC GlobalId, schedule mark); re-import matches on it.")

    @model_validator(mode="after")
    def _sides(self) -> "Beam":
        for side in ("left", "right"):
            spacing, edge = getattr(self, f"spacing_{side}"), getattr(self, f"edge_{side}")
            if (spacing is None) == (edge is None):
                raise ValueError(f"give exactly one of spacing_{side} or edge_{side}")
        return self

    @model_validator(mode="after")
    def _reports(self) -> "Beam":
        numbers = [r.number for r in self.report]
        if len(set(numbers)) != len(numbers):
            raise ValueError("report numbers must be unique on a beam")
        for i, f in enumerate(self.finding):
            if f.report and f.report not in numbers:
                raise ValueError(f"finding[{i}] names report '{f.report}', which is not among [[beam.report]]")
        return self

    @model_validator(mode="after")
    def _one_construction_load(self) -> "Beam":
        if self.construction_load is not None and "construction_live_psf" in self.model_fields_set:
            raise ValueError("give construction_load (a class) or construction_live_psf, not both")
        return self


class Job(Strict):
    project: Project
    deck: list[Deck] = Field(default_factory=list, description="Deck profiles.")
    slab: list[Slab] = Field(description="Slabs.", min_length=1)
    beam: list[Beam] = Field(description="Beams.", min_length=1)
    zone: list[ZoneIn] = Field(default_factory=list, description="Pour zones of the level(s), with dates: each beam and girder takes its pour stages from the zones it carries.")
