"""Deck ribs along a beam: rib stations from the first rib and the pitch, keep-out zones."""

from __future__ import annotations

import numpy as np

from engine.model import BeamInput


def rib_stations(beam: BeamInput) -> np.ndarray:
    """Stations (in from the reference end) of every rib centreline over the beam.

    Ribs run perpendicular to the beam at the deck pitch from `first_rib` (default half a
    pitch). Only ribs where a stud may stand are returned: outside the keep-out zones at both
    ends. Empty for parallel deck or a solid slab.
    """
    deck = beam.slab.deck
    if deck is None or beam.orientation != "perpendicular":
        return np.empty(0)
    first = beam.ribs.first_rib if beam.ribs.first_rib is not None else 0.5 * deck.pitch
    count = int(np.floor((beam.span - first) / deck.pitch + 1e-9)) + 1
    x = first + deck.pitch * np.arange(max(count, 0))
    lo = beam.ribs.keep_out_start
    hi = beam.span - beam.ribs.keep_out_end
    return x[(x >= lo - 1e-9) & (x <= hi + 1e-9) & (x > 0.0) & (x < beam.span)]
