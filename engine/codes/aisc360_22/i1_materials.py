"""Material properties for composite design: E_s, E_c, modular ratio, f'c range.

Units: ksi, pcf (unit weight only). Strength gain with age: engine.codes.aci209r_92.
"""

from __future__ import annotations

from typing import cast

import numpy as np
import numpy.typing as npt

E_STEEL = 29000.0
"""Modulus of elasticity of steel, ksi (AISC 360-22 Section B2, E = 29,000 ksi)."""

# AISC 360-22 I1.3: specified strength limits for strength calculations, ksi.
_FC_RANGE_NORMAL = (3.0, 10.0)
_FC_RANGE_LIGHTWEIGHT = (3.0, 6.0)


def ec(wc_pcf: npt.ArrayLike, fc_ksi: npt.ArrayLike) -> npt.NDArray[np.float64]:
    """Modulus of elasticity of concrete, E_c = w_c^1.5 sqrt(f'c), ksi (w_c in pcf, f'c in ksi).

    AISC 360-22 Section I2.1b (the E_c used in Eq. I8-1).
    """
    wc = np.asarray(wc_pcf, dtype=float)
    fc = np.asarray(fc_ksi, dtype=float)
    if (wc <= 0.0).any() or (fc <= 0.0).any():
        # ignore: numpy's ArrayLike includes bytes, which an f-string prints as b'...'; these hold numbers
        raise ValueError(f"unit weight {wc_pcf} pcf and f'c {fc_ksi} ksi must be > 0")  # type: ignore[str-bytes-safe]
    return cast("npt.NDArray[np.float64]", wc**1.5 * np.sqrt(fc))  # cast: numpy's stubs type ufunc results as Any


def modular_ratio(ec: npt.ArrayLike, es: float = E_STEEL) -> npt.NDArray[np.float64]:
    """Modular ratio n = E_s / E_c.

    AISC 360-22 Commentary I3.2 (transformed section).
    """
    e_c = np.asarray(ec, dtype=float)
    if (e_c <= 0.0).any():
        # ignore: numpy's ArrayLike includes bytes, which an f-string prints as b'...'; ec holds numbers
        raise ValueError(f"E_c {ec} ksi must be > 0")  # type: ignore[str-bytes-safe]
    return es / e_c


def fc_strength_range(lightweight: bool) -> tuple[float, float]:
    """(lowest, highest) specified f'c in ksi allowed for composite strength calculations.

    AISC 360-22 I1.3: 3 to 10 ksi normal-weight, 3 to 6 ksi lightweight concrete.
    """
    return _FC_RANGE_LIGHTWEIGHT if lightweight else _FC_RANGE_NORMAL
