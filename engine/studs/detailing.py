"""Deck and stud detailing limits: AISC 360-22 I3.2c.1 (formed steel deck), I8.1 and I8.2d."""

from __future__ import annotations

import numpy as np

from engine.codes.aisc360_22.i3_composite import (
    DECK_ANCHOR_SPACING_MAX,
    DECK_RIB_HEIGHT_MAX,
    DECK_RIB_WIDTH_MIN,
    DECK_STUD_DIAMETER_MAX,
    DECK_TOPPING_MIN,
    PARALLEL_RIB_HEIGHT_MIN,
    STUD_COVER_MIN,
    STUD_PROJECTION_MIN,
    parallel_rib_studs_across,
)
from engine.codes.aisc360_22.i8_anchors import (
    stud_diameter_max_off_web,
    stud_length_min,
    stud_spacing_max,
    stud_spacing_min,
    stud_spacing_transverse,
)
from engine.model.results import Check, Flag
from engine.model.inputs import BeamInput, DeckCase
from engine.finished.slab_force import StudGroups

DECK_ANCHOR_CLAUSE = "AISC 360-22 I3.2c.1(d)"  # deck anchored to every support at 18 in max


def deck_checks(beam: BeamInput) -> list[Check]:
    """Formed-deck limits of AISC 360-22 I3.2c.1 that depend on the slab and stud geometry."""
    slab, deck, spec = beam.slab, beam.slab.deck, beam.studs
    checks: list[Check] = []
    if deck is not None:
        checks += [
            Check("deck.rib_height", "rib height", "AISC 360-22 I3.2c.1(a)", deck.rib_height, DECK_RIB_HEIGHT_MAX, "in",
                  kind="detailing"),
            Check("deck.rib_width", "average rib width (min 2 in)", "AISC 360-22 I3.2c.1(a)",
                  DECK_RIB_WIDTH_MIN, deck.rib_average_width, "in", kind="detailing"),
            Check("deck.stud_diameter", "stud diameter through deck", "AISC 360-22 I3.2c.1(b), I8.1",
                  spec.diameter, DECK_STUD_DIAMETER_MAX, "in", kind="detailing"),
            Check("deck.stud_projection", "stud projection above deck (min 1 1/2 in)", "AISC 360-22 I3.2c.1(b)",
                  STUD_PROJECTION_MIN, spec.length - deck.rib_height, "in", kind="detailing"),
            Check("deck.topping", "slab thickness above deck (min 2 in)", "AISC 360-22 I3.2c.1(c)",
                  DECK_TOPPING_MIN, slab.topping, "in", kind="detailing"),
        ]
    checks += [
        Check("studs.cover", "concrete cover over stud head (min 1/2 in)", "AISC 360-22 I3.2c.1(b)",
              STUD_COVER_MIN, slab.total_thickness - spec.length, "in", kind="detailing"),
        Check("studs.length", "stud length (min 4 d)", "AISC 360-22 I8.2", stud_length_min(spec.diameter), spec.length, "in",
              kind="detailing"),
    ]
    return checks


def studs_across(beam: BeamInput) -> int:
    """Most studs that fit in one transverse row, no more than the job allows.
    AISC 360-22 I8.2d (4 d apart), I3.2c.3 (parallel flute: w_r >= 2 in + 4 d per added stud,
    for h_r >= 1 1/2 in); each shank fully on the flange and the flute bottom (common practice)."""
    d = beam.studs.diameter
    deck = beam.slab.deck
    width = beam.shape.bf
    fit = int(np.floor((width - d) / stud_spacing_transverse(d) + 1e-9)) + 1
    if deck is not None and beam.orientation == "parallel":
        fit = min(fit, int(np.floor((deck.rib_bottom_width - d) / stud_spacing_transverse(d) + 1e-9)) + 1)
        if deck.rib_height >= PARALLEL_RIB_HEIGHT_MIN:
            fit = min(fit, parallel_rib_studs_across(deck.rib_average_width, d))
    return max(0, min(fit, beam.studs.max_per_rib))


def off_web_allowed(beam: BeamInput) -> bool:
    """Whether studs may stand off the web: d <= 2.5 t_f (AISC 360-22 I8.1). A single stud per
    slot stands over the web."""
    return beam.studs.diameter <= stud_diameter_max_off_web(beam.shape.tf) + 1e-9


def studs_per_slot(beam: BeamInput) -> int:
    """Most studs one slot (rib or stud row) may take: the transverse row (`studs_across`), and
    one only, over the web, when the flange is too thin for studs off it (AISC 360-22 I8.1)."""
    across = studs_across(beam)
    return min(across, 1) if not off_web_allowed(beam) else across


def spacing_limits(beam: BeamInput) -> tuple[float, float]:
    """(least, greatest) centre-to-centre stud spacing along the beam, in.

    AISC 360-22 I8.2d: 4 d within deck ribs perpendicular to the beam, 6 d otherwise; at most
    8 x the total slab thickness and 36 in.
    """
    d = beam.studs.diameter
    perpendicular = beam.slab.deck is not None and beam.orientation == "perpendicular"
    return stud_spacing_min(d, perpendicular), stud_spacing_max(beam.slab.total_thickness)


def spacing_checks(beam: BeamInput, groups: StudGroups) -> tuple[list[Check], list[Flag]]:
    """Stud spacing, base-metal and deck-anchorage limits for a placed stud arrangement."""
    d = beam.studs.diameter
    checks: list[Check] = []
    flags: list[Flag] = []
    if groups.total == 0:
        return checks, flags
    x = np.sort(groups.x)
    perpendicular = beam.slab.deck is not None and beam.orientation == "perpendicular"
    smin, smax = spacing_limits(beam)
    gaps = np.diff(x)
    ends = np.array([x[0], beam.span - x[-1]])
    if gaps.size:
        i = int(np.argmin(gaps))
        checks.append(Check("studs.spacing.min", "stud spacing along beam (min)", "AISC 360-22 I8.2d", smin, gaps[i], "in",
                            station=float(x[i]), kind="detailing"))
        j = int(np.argmax(gaps))
        checks.append(Check("studs.spacing.max", "stud spacing along beam (max)", "AISC 360-22 I8.2d", gaps[j], smax, "in",
                            station=float(x[j]), kind="detailing"))
    most = int(groups.count.max())
    row_clause = "AISC 360-22 I8.2d (4d transverse)" + (", I3.2c.3" if beam.deck_case == DeckCase.PARALLEL else "")
    checks.append(Check("studs.row", "studs in one transverse row", row_clause,
                        most, studs_across(beam), "studs", kind="detailing"))
    if most >= 2:
        checks.append(Check("studs.diameter_off_web", "stud diameter off the web (max 2.5 tf)", "AISC 360-22 I8.1",
                            d, stud_diameter_max_off_web(beam.shape.tf), "in", kind="detailing"))
    if perpendicular:
        longest = float(max(gaps.max() if gaps.size else 0.0, ends.max()))
        if longest > DECK_ANCHOR_SPACING_MAX + 1e-9:
            flags.append(Flag(DECK_ANCHOR_CLAUSE,
                              f"studs alone leave up to {longest:.1f} in between deck anchors (max 18 in): "
                              "the ribs without studs need puddle welds or other specified anchors"))
    return checks, flags
