"""The AISC Design Examples v16.0, Example I.2 composite girder as engine input, shared by the
finished-beam and construction-stage validation tests (source values in those tests' docstrings).

W24X76, Fy 50 ksi, span 30 ft, beams framing in at the third points, deck parallel to the girder:
3 in deck (6 in average rib at 12 in pitch, the example's 50% void) + 4 1/2 in normal-weight
concrete, 145 pcf, f'c 4 ksi, b = 7.50 ft. Per point: PD = 40.5 kips of which 36.0 pre-composite,
PL = 45.0 kips, construction live 11.3 kips; 55 studs 3/4 in.
"""

from engine.model.deck import DeckProfile, Slab
from engine.model.inputs import BeamInput, PointLoad, StudSpec
from engine.model.shapes import get_shape

FT = 12.0


def girder() -> BeamInput:
    deck = DeckProfile("3in", 3.0, 7.25, 4.75, 12.0, 0.0)
    slab = Slab("I.2", deck, 4.5, 145.0, 4.0, lightweight=False)
    loads = (PointLoad(10 * FT, 40.5, 45.0, 36.0, 11.3), PointLoad(20 * FT, 40.5, 45.0, 36.0, 11.3))
    return BeamInput(
        mark="I.2", shape=get_shape("W24X76"), span=30 * FT, fy=50.0, slab=slab, orientation="parallel",
        slab_left=22.5 * FT, slab_right=22.5 * FT, superimposed_dead_psf=0.0, live_psf=0.0,
        studs=StudSpec(0.75, 65.0, 5.25, "center", 55), point_loads=loads, load_width=0.0,
    )
