"""What fieldcomp does not check, said in every report rather than left silent."""

from __future__ import annotations

SUPPORTS = ("simple", "continuous", "cantilever")

NOT_CHECKED: tuple[tuple[str, str], ...] = (
    ("negative moment, continuous and cantilevered beams", "AISC 360-22 I3.2b; refused as input"),
    ("web openings", "AISC Design Guide 2; flagged when the job says the beam has them"),
    ("floor vibration", "AISC Design Guide 11"),
    ("long-term (creep and shrinkage) deflection", "AISC 360-22 Commentary I3.2"),
    ("slab edge distance of studs in the direction of shear", "AISC 360-22 I8.2d"),
    ("flange local bending and web local yielding under point loads", "AISC 360-22 J10"),
    ("torsion, fire resistance, deck as a form", "AISC Design Guide 9, 19; SDI C-2017"),
)
