"""Uniform construction live load by operational class.

ASCE/SEI 37-14 Design Loads on Structures during Construction, Table 4-1. Units: psf.
"""

from __future__ import annotations

from types import MappingProxyType

CONSTRUCTION_LOAD_PSF = MappingProxyType({"very-light": 20.0, "light": 25.0, "medium": 50.0, "heavy": 75.0})
"""Uniform construction live load by operational class, psf: ASCE/SEI 37-14 Table 4-1. The light
class (25 psf: concrete placed by hose, finished by hand) is confirmed by AISC Design Examples
v16.0; very light 20, medium 50 and heavy 75 psf are from memory: verify against the standard."""
