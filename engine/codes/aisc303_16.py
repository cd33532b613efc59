"""Camber tolerance of members as the shop delivers them.

AISC 303-16 Code of Standard Practice for Steel Buildings and Bridges, Section 6.4.4.
Units: inch.
"""

from __future__ import annotations

import math

COSP_BASE_TOLERANCE = 0.5  # in, members up to 50 ft (AISC 303 Section 6.4.4(a))
COSP_BASE_LENGTH = 600.0  # in, 50 ft
COSP_STEP_LENGTH = 120.0  # in, each 10 ft or fraction beyond 50 ft ...
COSP_STEP_TOLERANCE = 0.125  # ... adds 1/8 in (AISC 303 Section 6.4.4(b))
# A member received with at least 75 % of the specified camber needs no further cambering (AISC 303 Section 6.4.4).
COSP_ACCEPTED_FRACTION = 0.75


def delivered_band(camber: float, length: float) -> tuple[float, float]:
    """Least and greatest camber (in) a member of `length` (in) ordered with `camber` may arrive
    with: 75 % of the order (no further cambering is required above it) to the order plus the
    over-camber tolerance. AISC 303 Code of Standard Practice Section 6.4.4."""
    if camber <= 0.0:
        return 0.0, 0.0
    return COSP_ACCEPTED_FRACTION * camber, camber + camber_tolerance(length)


def camber_tolerance(length: float) -> float:
    """Over-camber tolerance (in) for a member of `length` (in); under-camber tolerance is zero.
    AISC 303 Code of Standard Practice Section 6.4.4 (as quoted in AISC Engineering FAQ 3.2.2):
    -0/+1/2 in up to 50 ft, plus 1/8 in for each 10 ft or fraction thereof beyond 50 ft."""
    if not (math.isfinite(length) and length > 0.0):
        raise ValueError(f"member length {length} in must be > 0")
    excess = length - COSP_BASE_LENGTH
    steps = math.ceil(excess / COSP_STEP_LENGTH - 1e-9) if excess > 1e-9 else 0
    return COSP_BASE_TOLERANCE + COSP_STEP_TOLERANCE * steps
