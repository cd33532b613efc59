"""Deck ribs along a beam: rib stations from the first rib and the pitch, keep-out zones."""

from __future__ import annotations

import numpy as np

from engine.model.inputs import BeamInput

_EPS = 1e-9


def rib_stations(beam: BeamInput) -> np.ndarray:
    """Stations (in from the reference end) of every rib centreline over the beam, keep-out
    zones included: ribs run perpendicular to the beam at the deck pitch from `first_rib`
    (default half a pitch; no rib before it), strictly between the ends. Empty for parallel
    deck or a solid slab."""
    deck = beam.slab.deck
    if deck is None or beam.orientation != "perpendicular":
        return np.empty(0)
    first = beam.ribs.first_rib if beam.ribs.first_rib is not None else 0.5 * deck.pitch
    if first >= beam.span:
        return np.empty(0)
    count = int(np.floor((beam.span - first) / deck.pitch + _EPS)) + 1
    x = first + deck.pitch * np.arange(count)
    return x[(x > _EPS) & (x < beam.span - _EPS)]


def in_keep_out(beam: BeamInput, x: np.ndarray) -> np.ndarray:
    """True at stations closer to an end than its keep-out distance (connections, girder
    flanges) or beyond the end of the steel, where no stud may stand."""
    x = np.asarray(x, dtype=float)
    start = max(beam.ribs.keep_out_start, beam.ribs.end_setback)
    end = max(beam.ribs.keep_out_end, beam.ribs.end_setback)
    return (x < start - _EPS) | (x > beam.span - end + _EPS)


def station_offset(beam: BeamInput) -> float:
    """Engine stations run from the support centreline at the reference end; erector-facing
    stations (marks, findings) run from the end of the steel when project.station_origin is
    "beam-end". This is what to subtract from an engine station to print it."""
    return beam.ribs.end_setback if beam.ribs.station_origin == "beam-end" else 0.0


def printed_station(beam: BeamInput, x: float) -> float:
    """An engine station as the erector measures it (see `station_offset`)."""
    return x - station_offset(beam)
