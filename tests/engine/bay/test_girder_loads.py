"""A hand-worked bay: girder G-1 (W24X62, 30 ft, load width 0) with beams B-1 and B-2 (W18X35, 30 ft,
10 ft on centre) whose far ends rest on it at its third points (10 ft and 20 ft); their reference
ends sit on columns. Constant-thickness placement, one pour.

Hand work (kip, in; E = 29 000 ksi; Ix W18X35 = 510 in^4, W24X62 = 1550 in^4, AISC Shapes
Database v16.0; slab: 3 1/4 in topping on 3 in deck, ribs 7/5 in at 12 in, 145 pcf):
- wet concrete 145 pcf x (3.25 + 3 x 6/12) in / 12 = 57.40 psf (topping plus ribs averaged over
  the pitch), on a 10 ft strip w = 57.40 x 10 / 12 000 = 0.0478 kip/in; each far-end reaction w L / 2
  (statics of a simple span);
- erection: steel 35 plf + deck 2 psf x 10 ft = 55 plf, reaction 55 x 30 / 2 = 825 lb;
- the girder carries P at L/3 and 2L/3: deflection under a load 5 P L^3 / (162 E I)
  (AISC Manual Table 3-23 case 9, x = a = L/3), plus its own weight w_g x (L^3 - 2 L x^2 + x^3) / (24 E I)
  (case 1); at mid-span of a beam the support line has sunk half the girder's drop, so
  mid-bay = 5 w L^4 / (384 E I) + drop / 2.
"""

from __future__ import annotations

import pytest

from engine.bay.inputs import FAR_END, Bearing, LevelInput, PourZone
from engine.model.deck import DeckProfile, Slab
from engine.model.inputs import BeamInput, CamberRules, ConstructionSpec, StudSpec
from engine.model.shapes import get_shape
from engine.pipeline import evaluate_level

E = 29_000.0
L = 360.0
SLAB = Slab("NW", DeckProfile("3in", 3.0, 7.0, 5.0, 12.0, 2.0), 3.25, 145.0, 4.0, lightweight=False)
WET_PSF = 145.0 * (3.25 + 3.0 * 6.0 / 12.0) / 12.0  # 57.40 psf, ribs averaged over the pitch


def member(mark: str, shape: str, screed: str = "constant-thickness", load_width: float | None = None,
           sdl: float = 20.0, live: float = 100.0) -> BeamInput:
    spec = ConstructionSpec(live_psf=20.0, screed=screed, camber=CamberRules(do_not_camber="test"))
    return BeamInput(mark=mark, shape=get_shape(shape), span=L, fy=50.0, slab=SLAB, orientation="perpendicular",
                     slab_left=60.0, slab_right=60.0, superimposed_dead_psf=sdl, live_psf=live,
                     studs=StudSpec(0.75, 65.0, 5.25, "weak", 30), load_width=load_width, construction=spec)


def third_point_bay(screed: str = "constant-thickness", zones: tuple[PourZone, ...] = ()) -> LevelInput:
    girder = member("G-1", "W24X62", load_width=0.0)
    beams = (member("B-1", "W18X35", screed), member("B-2", "W18X35", screed))
    bearings = (Bearing("B-1", FAR_END, "G-1", 120.0), Bearing("B-2", FAR_END, "G-1", 240.0))
    return LevelInput("test level", (*beams, girder), bearings, zones=zones)


def test_derived_girder_loads_equal_the_beams_reactions():
    result = evaluate_level(third_point_bay())
    w_wet = WET_PSF * 10.0 / 12_000.0  # 10 ft strip: psf x ft = plf; plf / 12 000 = kip/in
    for mark in ("B-1", "B-2"):
        mine = [g for g in result.loads if g.beam == mark]
        erection = next(g for g in mine if g.day is None and g.step != "finished")
        assert erection.steel_and_deck == pytest.approx(55.0 * 30.0 / 2.0 / 1000.0, rel=1e-3)  # 0.825 kip
        pour = next(g for g in mine if g.day is not None)
        assert pour.wet_concrete == pytest.approx(w_wet * L / 2.0, rel=1e-6)  # w L / 2 = 8.61 kip
        assert pour.ponded_concrete == pytest.approx(0.0, abs=1e-9)
        assert pour.construction_live == pytest.approx(20.0 * 10.0 * 30.0 / 2.0 / 1000.0, rel=1e-6)  # 3.0 kip
        finished = next(g for g in mine if g.step == "finished")
        assert finished.superimposed_dead == pytest.approx(20 * 10 * 30 / 2 / 1000, rel=1e-6)  # 3.0 kip
        assert finished.live == pytest.approx(100 * 10 * 30 / 2 / 1000, rel=1e-6)  # 15.0 kip
    girder = result.member("G-1")
    assert sum(p.precomposite_dead for p in girder.point_loads) == pytest.approx(2 * (0.825 + w_wet * L / 2), rel=1e-3)
    assert sum(p.live for p in girder.point_loads) == pytest.approx(30.0, rel=1e-6)


def test_mid_bay_deflection_is_the_beam_plus_half_the_girder_drop():
    result = evaluate_level(third_point_bay())
    w_beam = (WET_PSF + 2.0) * 10.0 / 12_000.0 + 35.0 / 12_000.0  # kip/in: concrete, deck, steel
    own = 5.0 * w_beam * L**4 / (384.0 * E * 510.0)  # AISC Manual Table 3-23 case 1
    p = w_beam * L / 2.0
    x = L / 3.0
    drop = 5.0 * p * L**3 / (162.0 * E * 1550.0) + (62.0 / 12_000.0) * x * (L**3 - 2 * L * x**2 + x**3) / (24 * E * 1550.0)
    run = result.solution.member("B-1")
    mid = run.x.size // 2
    assert run.sag()[-1, -1] == pytest.approx(drop, rel=2e-3)
    assert run.sag()[-1, mid] == pytest.approx(own + drop / 2.0, rel=2e-3)
    girder_run = result.solution.member("G-1")
    assert girder_run.sag()[-1, girder_run.x.size // 3] == pytest.approx(drop, rel=2e-3)


def test_a_pour_break_across_the_girder_loads_it_on_two_days():
    """Zone 3A places B-1 on day 0, zone 3B B-2 on day 3: the girder gets B-1's concrete on day 0
    and B-2's on day 3; the sum is the single-pour load (statics is linear)."""
    zones = (PourZone("3A", 0.0, "2026-03-02", ("B-1", "G-1")), PourZone("3B", 3.0, "2026-03-05", ("B-2",)))
    staged = evaluate_level(third_point_bay(zones=zones))
    single = evaluate_level(third_point_bay())
    by_day = {}
    for g in staged.loads:
        if g.day is not None:
            by_day.setdefault(g.day, []).append(g)
    assert sorted(by_day) == [0.0, 3.0]
    assert [g.beam for g in by_day[3.0]] == ["B-2"]
    girder = staged.member("G-1")
    assert {p.day for p in girder.point_loads if p.day is not None} == {0.0, 3.0}
    assert staged.solution.member("G-1").sag()[-1, 120] == pytest.approx(
        single.solution.member("G-1").sag()[-1, 120], rel=1e-9)
    level = next(z for z in staged.concrete if z.zone == "level")
    assert level.nominal == pytest.approx(2 * L * 120.0 * 12.0 * WET_PSF / 145.0, rel=1e-9)  # in^3, two 10 ft strips
