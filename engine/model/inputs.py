"""Engine inputs: plain frozen dataclasses built by the job-file edge (`fieldcomp.jobs.jobfile`).

Lengths in inches, forces in kips, stresses in ksi, area loads in psf (converted where used).
Stations run from the beam's reference end (x = 0) to the far end (x = span).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from enum import StrEnum

from engine.codes import practice
from engine.model.deck import Slab
from engine.model.results import Authority
from engine.model.shapes import WShape

class Method(StrEnum):
    """Design method: load and resistance factor design or allowable strength design (AISC 360-22 B3.1, B3.2)."""

    LRFD = "LRFD"
    ASD = "ASD"


class DeckCase(StrEnum):
    """Slab on the beam for stud strength: solid slab, deck ribs parallel or perpendicular to the
    beam (AISC 360-22 I8.2a)."""

    NONE = "none"
    PARALLEL = "parallel"
    PERPENDICULAR = "perpendicular"


ORIENTATIONS = (DeckCase.PERPENDICULAR.value, DeckCase.PARALLEL.value)
STUD_POSITIONS = ("strong", "weak", "center")
SCREED_MODES = ("constant-thickness", "level")
POUR_SIDES = ("both", "left", "right")
FINDING_KINDS = ("missing", "failed-test", "awaiting-test", "weak-side", "off-rib", "short", "added", "bent-accepted",
                 "replaced")
FINDING_TIMES = ("before-pour", "after-pour")  # was the slab over the finding placed when it was found


@dataclass(frozen=True, slots=True)
class StudSpec:
    """Headed stud anchors as specified: `count` on the whole beam, None when the layout
    is to find the count the design needs."""

    diameter: float
    fu: float
    length: float
    position: str
    count: int | None
    max_per_rib: int = 3
    design_sum_qn: float | None = None  # the design's sum Qn each side of the maximum moment (kip), if stated
    design_composite: float | None = None  # or the design's degree of composite, sum Qn / C_f


@dataclass(frozen=True, slots=True)
class PointLoad:
    """Concentrated load at station `x` (kips): `dead` is all dead load, of which
    `precomposite_dead` is applied to the bare steel; `construction_live` acts during placement.
    The pre-composite part arrives with the first stage that places concrete at `x`, or, for the
    reaction of a beam framing in (engine.bay), at erection or with the pour on `day`."""

    x: float
    dead: float
    live: float
    precomposite_dead: float
    construction_live: float = 0.0
    day: float | None = None  # placed with the pour on this day (a framing beam's reaction), None: with the concrete at x
    erection: bool = False  # on the steel before any pour (a framing beam's own weight and deck)


@dataclass(frozen=True, slots=True)
class PourStage:
    """One placement: concrete from `start` to `end` (stations, in) on `side` of the beam at
    `day` (days after the first placement); `screed` overrides the beam's screeding mode."""

    name: str
    start: float
    end: float
    side: str = "both"
    day: float = 0.0
    screed: str | None = None
    date: str = ""  # ISO date (YYYY-MM-DD) the stage was placed, if known


@dataclass(frozen=True, slots=True)
class CamberRules:
    """Camber decision settings (common practice defaults: engine.codes.practice; "Specifying Camber",
    Modern Steel Construction, July 2006)."""

    fraction: float = practice.CAMBER_FRACTION
    increment: float = practice.CAMBER_INCREMENT
    minimum: float = practice.CAMBER_MINIMUM
    min_length: float = practice.CAMBER_MIN_LENGTH
    min_depth: float = practice.CAMBER_MIN_DEPTH
    thin_web: float = practice.CAMBER_MAX_THIN_WEB  # webs this thin or thinner are not cambered
    do_not_camber: str | None = None  # reason, e.g. "moment-connected", "spandrel", "cantilevered"


@dataclass(frozen=True, slots=True)
class ConstructionSpec:
    """How the slab is placed on this beam and how the bare steel is braced meanwhile."""

    live_psf: float = practice.CONSTRUCTION_LIVE_PSF
    screed: str = "constant-thickness"
    unbraced_length: float | None = None  # None: braced by fastened perpendicular deck, else at point loads
    pours: tuple[PourStage, ...] = ()
    camber: CamberRules = field(default_factory=CamberRules)
    combinations: tuple[tuple[float, float], ...] = ()  # (dead, live) factors; () = defaults of the method
    dead_limit_ratio: float = practice.WET_DEFLECTION_RATIO  # span / ratio ...
    dead_limit_max: float | None = practice.WET_DEFLECTION_MAX  # ... and not over 1 in (AISC Design Guide 3, via DE16 I.1)
    dead_limit_authority: Authority = Authority.DESIGN_GUIDE  # PROJECT when the job sets the limit
    live_limit_ratio: float | None = None  # construction live-load deflection limit; None: not checked
    measured_camber: float | None = None  # camber measured in the shop or on site before the pour (in)
    # the ends' drop on the girders they rest on (engine.bay), net of the girders' camber: (day, reference
    # end, far end) in, cumulative by the end of that pour day; a level screed ponds into this line too
    settlement: tuple[tuple[float, float, float], ...] = ()


@dataclass(frozen=True, slots=True)
class RibSettings:
    """Where the ribs are along the beam and what the stations are measured from."""

    reference_end: str = "left end"
    far_end: str = "far end"
    first_rib: float | None = None  # station of the first rib centreline; None: half a pitch
    keep_out_start: float = 0.0  # no studs closer than this to the reference end
    keep_out_end: float = 0.0  # ... and to the far end
    station_origin: str = "beam-end"  # or "support" (work point)
    end_setback: float = 0.0  # support centreline (work point) to the end of the steel, each end


@dataclass(frozen=True, slots=True)
class Finding:
    """One item of a stud inspection report, located by `rib` (1-based) or `station`."""

    kind: str
    rib: int | None = None
    station: float | None = None
    count: int = 1
    note: str = ""
    found: str | None = None  # FINDING_TIMES, or None: derived from `date` and the pour dates, else unknown
    date: str = ""  # ISO date (YYYY-MM-DD) of the inspection, if known


@dataclass(frozen=True, slots=True)
class DetailedRib:
    """Studs in one rib as detailed on the shop drawings, located by `rib` (1-based) or `station`."""

    count: int
    rib: int | None = None
    station: float | None = None


@dataclass(frozen=True, slots=True)
class PondedConcrete:
    """Concrete a level screed ponds into the sag of the bare steel, beyond the nominal slab:
    a line load q (kip/in) at stations x (in), found by the construction stage."""

    x: tuple[float, ...]
    q: tuple[float, ...]

    @property
    def weight(self) -> float:
        """Its total weight (kip), trapezoid rule."""
        return sum(0.5 * (self.q[i] + self.q[i + 1]) * (self.x[i + 1] - self.x[i]) for i in range(len(self.x) - 1))


@dataclass(frozen=True, slots=True)
class Limits:
    """Serviceability limits as span / ratio and whose rule each is: the defaults are the floor-member
    limits of IBC Table 1604.3 (live L/360 binding; its D + L limit takes the dead load of steel
    members as zero (footnote), so the superimposed dead + live L/240 check is common practice);
    a limit typed into the job is the project's."""

    live_ratio: float = practice.LIVE_DEFLECTION_RATIO
    total_ratio: float = practice.TOTAL_DEFLECTION_RATIO
    live_authority: Authority = Authority.BUILDING_CODE
    total_authority: Authority = Authority.COMMON_PRACTICE


@dataclass(frozen=True, slots=True)
class BeamInput:
    """Everything the engine needs to evaluate one simply supported composite beam.

    `slab_left` / `slab_right`: slab available on each side of the beam centreline for the
    effective width and the tributary load: half the distance to the adjacent beam, or the
    distance to the slab edge. `load_width` overrides the tributary width for area loads
    (e.g. 0 for a girder whose slab load arrives as beam reactions).
    """

    mark: str
    shape: WShape
    span: float
    fy: float
    slab: Slab
    orientation: str
    slab_left: float
    slab_right: float
    superimposed_dead_psf: float
    live_psf: float
    studs: StudSpec
    method: Method = Method.LRFD
    point_loads: tuple[PointLoad, ...] = ()
    load_width: float | None = None
    construction: ConstructionSpec = field(default_factory=ConstructionSpec)
    ribs: RibSettings = field(default_factory=RibSettings)
    findings: tuple[Finding, ...] = ()
    detailed: tuple[DetailedRib, ...] = ()  # the studs as detailed on the shop drawings; () = fieldcomp's layout
    limits: Limits = field(default_factory=Limits)
    ponded: PondedConcrete | None = None  # set by engine.pipeline for level-screeded beams
    n_stations: int = 401
    support: str = "simple"  # engine.model.scope.SUPPORTS; only "simple" is computed
    web_openings: bool = False

    @property
    def tributary_width(self) -> float:
        """Width of floor whose area loads the beam carries (in)."""
        if self.load_width is not None:
            return self.load_width
        return self.slab_left + self.slab_right

    @property
    def steel_length(self) -> float:
        """Length of the piece (in): the span between work points less the end setback at each end."""
        return self.span - 2.0 * self.ribs.end_setback

    @property
    def deck_case(self) -> DeckCase:
        """Solid slab, parallel or perpendicular deck, for AISC 360-22 I8.2a."""
        return DeckCase.NONE if self.slab.deck is None else DeckCase(self.orientation)
