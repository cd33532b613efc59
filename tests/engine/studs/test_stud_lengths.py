"""Stud length before welding = installed length + burn-off. Check values: a stud supplier's
published approximate reductions (Fraser Molloy, "Arc Stud Burn Off": 3/16-1/2 in dia 1/8 in,
5/8-7/8 in 3/16 in, 1 in and over 1/4 in; 3/4 in through deck 3/8 in, its example 4.00 in after
welding + 3/8 in = 4 3/8 in to purchase). Common practice, not a specification value."""

from __future__ import annotations

from dataclasses import replace

import pytest

from engine.model.inputs import DeckCase
from engine.studs.stud_lengths import burn_off, stud_lengths
from tests.engine.studs.test_layout import beam


@pytest.mark.parametrize("diameter, expected", [(0.5, 0.125), (0.625, 0.1875), (0.75, 0.1875), (0.875, 0.1875),
                                                (1.0, 0.25)])
def test_burn_off_on_bare_steel_follows_the_supplier_table(diameter, expected):
    assert burn_off(diameter, through_deck=False) == expected


def test_through_deck_the_supplier_example_4_in_after_is_4_3_8_before():
    b = beam()
    assert b.deck_case != DeckCase.NONE and b.slab.deck is not None
    b = replace(b, studs=replace(b.studs, length=4.0, diameter=0.75))
    lengths = stud_lengths(b)
    assert lengths.through_deck and lengths.burn_off == 0.375 and lengths.before == pytest.approx(4.375)
    assert lengths.after == 4.0  # the job's stud length is the installed one (AISC 360-22 I3.2c.1(b) uses it)
