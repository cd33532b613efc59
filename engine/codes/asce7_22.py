"""Load combinations of dead and live load for strength design (LRFD) and allowable stress
design (ASD), as used with AISC 360-22 B3.1 / B3.2.

ASCE/SEI 7-22 Minimum Design Loads and Associated Criteria for Buildings and Other Structures,
Sections 2.3.1 and 2.4.1. Factors are (dead, live) pairs; the finished beam takes L as the floor
live load, the construction stage takes the construction live load as L (as AISC Design Examples
v16.0 Ex. I.2).
"""

from __future__ import annotations

LRFD_COMBINATIONS = ((1.4, 0.0), (1.2, 1.6))  # (dead, live) factors, ASCE/SEI 7-22 2.3.1 combos 1-2
ASD_COMBINATIONS = ((1.0, 1.0),)  # ASCE/SEI 7-22 2.4.1 combo 2


def combinations(method: str) -> tuple[tuple[float, float], ...]:
    """(dead, live) factor pairs for the design method: "LRFD" 1.4D and 1.2D + 1.6L, else D + L.
    ASCE/SEI 7-22 2.3.1 (combinations 1 and 2) and 2.4.1 (combination 2)."""
    return LRFD_COMBINATIONS if method == "LRFD" else ASD_COMBINATIONS
