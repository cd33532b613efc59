"""What fieldcomp does not check, said in every report rather than left silent, and the input it
refuses to compute (AISC 360-22 I1.3, I3.2b, I3.2c.1, I3.2a)."""

from __future__ import annotations

from engine.codes.aisc360_22.i1_materials import fc_strength_range
from engine.codes.aisc360_22.i3_composite import DECK_RIB_HEIGHT_MAX, DECK_STUD_DIAMETER_MAX
from engine.model.errors import FieldcompError
from engine.model.inputs import BeamInput

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


class OutOfScopeError(FieldcompError, ValueError):
    """The input lies outside what the engine checks; the message names the clause."""

    def __init__(self, field: str, message: str):
        super().__init__(message)
        self.field = field



def check_scope(beam: BeamInput) -> None:
    """Refuse inputs outside the engine's scope, naming the clause (AISC 360-22 I1.3, I3.2c.1)."""
    lo, hi = fc_strength_range(beam.slab.lightweight)
    if not lo <= beam.slab.fc_ksi <= hi:
        kind = "lightweight" if beam.slab.lightweight else "normal-weight"
        raise OutOfScopeError("fc_ksi", f"f'c = {beam.slab.fc_ksi:g} ksi is outside {lo:g}-{hi:g} ksi for "
                         f"{kind} concrete (AISC 360-22 I1.3); not computed")
    deck = beam.slab.deck
    if deck is not None and deck.rib_height > DECK_RIB_HEIGHT_MAX:
        raise OutOfScopeError("rib_height", f"rib height {deck.rib_height:g} in exceeds 3 in "
                         "(AISC 360-22 I3.2c.1(a)); not computed")
    if deck is not None and beam.studs.diameter > DECK_STUD_DIAMETER_MAX:
        raise OutOfScopeError("diameter", f"stud diameter {beam.studs.diameter:g} in exceeds 3/4 in through deck "
                         "(AISC 360-22 I8.1 / I3.2c.1(b)); not computed")
    if beam.support != "simple":
        raise OutOfScopeError("support", f"a {beam.support} beam has negative moment over its supports (AISC 360-22 I3.2b); "
                         "fieldcomp computes simply supported beams only; not computed")
    if beam.fy > 70.0:
        raise OutOfScopeError("fy_ksi", f"Fy = {beam.fy:g} ksi exceeds 70 ksi; plastic stress distribution "
                         "not established (AISC 360-22 I3.2a); not computed")
