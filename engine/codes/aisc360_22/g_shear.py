"""Web shear strength of rolled I-shapes without transverse stiffeners.

AISC 360-22 G2.1 (tension field action, G2.2, is not used). `shape` is any object with
the W-shape attributes `d, tw, h_tw` (h = d - 2 k_des). Units: kip, inch, ksi.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from engine.codes.aisc360_22.i1_materials import E_STEEL
from engine.codes.aisc360_22.rolled_shape import RolledShape

KV_UNSTIFFENED = 5.34  # AISC 360-22 G2.1(b)(2): webs without transverse stiffeners


@dataclass(frozen=True, slots=True)
class ShearStrength:
    """Nominal web shear strength (kip) with its resistance and safety factors."""

    vn: float
    phi: float
    omega: float
    cv1: float
    clause: str

    @property
    def phi_vn(self) -> float:
        """Design strength (LRFD), kip."""
        return self.phi * self.vn

    @property
    def vn_omega(self) -> float:
        """Allowable strength (ASD), kip."""
        return self.vn / self.omega


def web_shear_strength(shape: RolledShape, fy: float) -> ShearStrength:
    """Vn = 0.6 Fy Aw Cv1 with Aw = d tw, no transverse stiffeners (kv = 5.34).
    AISC 360-22 G2.1, Eqs. G2-1, G2-3, G2-4."""
    fy = float(fy)
    if not (math.isfinite(fy) and fy > 0.0):
        raise ValueError(f"fy = {fy!r}: must be a finite number > 0 ksi")
    h_tw = shape.h_tw
    aw = shape.d * shape.tw
    if h_tw <= 2.24 * math.sqrt(E_STEEL / fy):
        phi, omega, cv1 = 1.00, 1.50, 1.0
        clause = "AISC 360-22 G2.1(a), Eq. G2-1"
    else:
        phi, omega = 0.90, 1.67
        limit = 1.10 * math.sqrt(KV_UNSTIFFENED * E_STEEL / fy)
        if h_tw <= limit:
            cv1, clause = 1.0, "AISC 360-22 G2.1(b), Eqs. G2-1, G2-3"
        else:
            cv1, clause = limit / h_tw, "AISC 360-22 G2.1(b), Eqs. G2-1, G2-4"
    return ShearStrength(vn=0.6 * fy * aw * cv1, phi=phi, omega=omega, cv1=cv1, clause=clause)
