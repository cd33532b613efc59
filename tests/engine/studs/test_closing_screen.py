"""The screen of the "what would close it" search (engine.studs.design.cannot_close): every trial
it skips is one that, placed in full, still falls short; and the suggestions it gives are the
unscreened search's. The bound it rests on is checked by hand against AISC 360-22 Eq. I8-1.
"""

from __future__ import annotations

import math
from dataclasses import replace

import pytest

from engine.studs.design import _meets_all, beam_slots, cannot_close, closing_options, design_layout
from engine.studs.placement import arrange, slab_force_needed
from tests.engine.studs.test_layout import beam

ASA_FU = math.pi * 0.75**2 / 4.0 * 65.0  # 28.72 kip: A_sa F_u of a 3/4 in stud (AISC 360-22 Eq. I8-1)

# light shapes, long spans and few studs on the drawings: layouts that fall short
SHORT = [beam(span=span, count=count, shape=shape, live=live, position=position)
         for span in (300.0, 384.0) for count in (4, 8, 12) for shape in ("W16X26", "W18X35")
         for live in (50.0, 100.0) for position in ("weak", "strong")]


def test_one_weak_stud_bounds_the_strength_per_stud():
    # weak position, one stud per rib: R_g 1.0, R_p 0.6 -> Q_n = 0.6 x 28.72 = 17.23 kip, the
    # steel limit under the concrete's 0.5 A_sa sqrt(f'c E_c) (AISC 360-22 Eq. I8-1, I8.2a)
    b = beam(count=4)
    per_slot = beam_slots(b).per_slot
    assert per_slot[1] == pytest.approx(0.6 * ASA_FU, rel=1e-3)
    need = slab_force_needed(b)
    peak = float(need.c_req.max())
    # 2 C_req at the peak against n Q_n: 4 studs cannot give each side the peak's force ...
    assert 2.0 * peak > 4 * per_slot[1]
    assert cannot_close(need, per_slot, 4)
    # ... and as many studs as the whole force each side needs, twice over, are not screened out
    assert not cannot_close(need, per_slot, math.ceil(2.0 * peak / (per_slot[1] / 1.0)) + 1)


@pytest.mark.parametrize("b", SHORT, ids=[f"{b.shape.name}-{b.span:g}-{b.studs.count}-{b.live_psf:g}-{b.studs.position}"
                                          for b in SHORT])
def test_every_screened_trial_falls_short(b):
    need, slots = slab_force_needed(b), beam_slots(b)
    total = b.studs.count
    assert total is not None
    if not cannot_close(need, slots.per_slot, total):
        return
    pitch = b.slab.deck.pitch
    for k in range(1, 16):  # the rib trials the search would have made
        first = round(b.ribs.first_rib + k * pitch / 16.0, 4) % pitch or pitch
        trial = replace(b, ribs=replace(b.ribs, first_rib=first))
        assert design_layout(trial, suggest=False).shortfall is not None
    strong = replace(b, studs=replace(b.studs, position="strong"))
    if cannot_close(need, beam_slots(strong).per_slot, total):
        assert design_layout(strong, suggest=False).shortfall is not None
    for extra in range(total + 1, int(slots.cap.sum()) + 1):
        if cannot_close(need, slots.per_slot, extra):
            trial = replace(b, studs=replace(b.studs, count=extra))
            assert design_layout(trial, suggest=False).shortfall is not None


def test_screen_leaves_the_suggestions_of_the_full_search():
    # the first count that closes it, found with the screen, is the first found trying every count
    for b in SHORT:
        placed = design_layout(b)
        if placed.shortfall is None:
            continue
        need, slots = slab_force_needed(b), beam_slots(b)
        options = closing_options(b, need, slots, placed.layout, placed.required_sum_qn)
        found = [o for o in options if o.endswith("(EOR to revise the count)")]
        closes = [n for n in range(b.studs.count + 1, int(slots.cap.sum()) + 1)
                  if _meets_all(b, need, slots, arrange(b, need, slots, n), placed.required_sum_qn)]
        if closes:
            assert found and found[0].startswith(f"{closes[0]} studs instead of")
        else:
            assert not found
