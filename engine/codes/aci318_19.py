"""Which concrete counts as lightweight.

ACI 318-19 Building Code Requirements for Structural Concrete, Section 2.3 (definition of
lightweight concrete). Units: pcf.
"""

from __future__ import annotations

LIGHTWEIGHT_BELOW_PCF = 135.0  # ACI 318-19 2.3: lightweight concrete 90-135 pcf equilibrium density
