"""Compressive strength of concrete at an age of t days.

ACI 209R-92 Prediction of Creep, Shrinkage, and Temperature Effects in Concrete Structures,
Eq. 2-1. Units: ksi, days.
"""

from __future__ import annotations

from typing import cast

import numpy as np
import numpy.typing as npt

# ACI 209R-92 Eq. 2-1 constants for moist-cured concrete with Type I cement.
_ACI209_A_DAYS = 4.0
_ACI209_BETA = 0.85


def fc_at_age(fc28: npt.ArrayLike, days: npt.ArrayLike) -> npt.NDArray[np.float64]:
    """Compressive strength at age t days: f'c(t) = f'c * t / (4.0 + 0.85 t); t = 0 gives 0.

    ACI 209R-92 Eq. 2-1 (moist-cured, Type I cement: a = 4.0 days, beta = 0.85).
    """
    t = np.asarray(days, dtype=float)
    if (t < 0.0).any():
        # ignore: numpy's ArrayLike includes bytes, which an f-string prints as b'...'; days holds numbers
        raise ValueError(f"age {days} days must be >= 0")  # type: ignore[str-bytes-safe]
    # cast: numpy's stubs type products of np.asarray results as Any
    return cast("npt.NDArray[np.float64]", np.asarray(fc28, dtype=float) * t / (_ACI209_A_DAYS + _ACI209_BETA * t))
