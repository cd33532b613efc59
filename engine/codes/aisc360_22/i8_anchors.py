"""Steel headed stud anchors: area, e_mid-ht, group and position factors, nominal strength,
length, diameter and spacing limits.

Units: in, in^2, ksi, kip. Strength functions broadcast over numpy arrays (one value per rib or
stud); the length, diameter and spacing limits take scalars.
"""

from __future__ import annotations

from typing import cast

import numpy as np
import numpy.typing as npt

DECK_KINDS = ("none", "parallel", "perpendicular")
POSITION_SIGN = {"strong": 1.0, "weak": -1.0, "center": 0.0}

# AISC 360-22 I8.2a
_RP_WELDED_OR_PARALLEL = 0.75
_RP_STRONG = 0.75
_RP_WEAK = 0.6
_EMID_HT_LIMIT = 2.0  # in
_WR_HR_LIMIT = 1.5
_RG_PERPENDICULAR = (1.0, 1.0, 0.85, 0.7)  # index = studs in the rib, capped at 3 (0 -> 1.0)


def stud_area(d: npt.ArrayLike) -> npt.NDArray[np.float64]:
    """Cross-sectional area of a stud shank, A_sa = pi d^2 / 4, in^2.

    AISC 360-22 I8.2a (A_sa in Eq. I8-1).
    """
    d = np.asarray(d, dtype=float)
    if (d <= 0.0).any():
        raise ValueError(f"stud diameter {d} in must be > 0")
    return np.pi * d**2 / 4.0


def emid_ht(w_mid: npt.ArrayLike, offset: npt.ArrayLike, d: npt.ArrayLike, position: npt.ArrayLike) -> npt.NDArray[np.float64]:
    """Shank edge to rib wall at rib mid-height, in the direction the stud bears, in.

    AISC 360-22 I8.2a (definition of e_mid-ht); geometry e = w_mid/2 + s*offset - d/2 with
    s = +1 "strong", -1 "weak", 0 "center" (geometry derived from the I8.2a definition).
    `position` is one of those words or an array of them; `offset` is the distance of the
    stud axis from the rib centreline.
    """
    words = np.asarray(position)
    unknown = ({words.item()} if words.ndim == 0 else set(np.unique(words).tolist())) - set(POSITION_SIGN)
    if unknown:
        raise ValueError(f"stud position {sorted(unknown)} must be one of {sorted(POSITION_SIGN)}")
    sign = POSITION_SIGN[words.item()] if words.ndim == 0 else np.vectorize(POSITION_SIGN.__getitem__, otypes=[float])(words)
    e = np.asarray(w_mid, dtype=float) / 2.0 + sign * np.asarray(offset, dtype=float) - np.asarray(d, dtype=float) / 2.0
    if (e < 0.0).any():
        raise ValueError(
            # ignore: numpy's ArrayLike includes bytes, which an f-string prints as b'...'; these hold numbers
            f"stud at offset {offset} in does not fit a rib {w_mid} in wide at mid-height (e_mid-ht < 0)"  # type: ignore[str-bytes-safe]
        )
    return e


def rg_rp(
    deck: str, studs_in_rib: npt.ArrayLike, *, emid_ht: npt.ArrayLike | None = None, wr_over_hr: npt.ArrayLike | None = None
) -> tuple[npt.NDArray[np.float64], npt.NDArray[np.float64]]:
    """Group factor R_g and position factor R_p for studs in one rib (arrays, broadcast).

    AISC 360-22 I8.2a.
    deck "none" (welded directly to the steel): R_g 1.0, R_p 0.75.
    deck "parallel": R_g 1.0 if w_r/h_r >= 1.5 else 0.85; R_p 0.75. The Specification gives
    0.85 for one stud in a narrow rib and is silent on more; 0.85 is used for any count (whether
    a second stud fits across the rib is a detailing check, I3.2c.3).
    deck "perpendicular": R_g 1.0 / 0.85 / 0.7 for 1 / 2 / 3+ studs actually in the rib (0 studs:
    1.0, irrelevant); R_p 0.75 if e_mid-ht >= 2 in else 0.6.
    """
    if deck not in DECK_KINDS:
        raise ValueError(f"deck {deck!r} must be one of {DECK_KINDS}")
    n = np.asarray(studs_in_rib)
    if (n < 0).any():
        # ignore: numpy's ArrayLike includes bytes, which an f-string prints as b'...'; studs_in_rib holds numbers
        raise ValueError(f"studs in a rib {studs_in_rib} must be >= 0")  # type: ignore[str-bytes-safe]
    if deck == "none":
        return np.ones(n.shape), np.full(n.shape, _RP_WELDED_OR_PARALLEL)
    if deck == "parallel":
        if wr_over_hr is None:
            raise ValueError("parallel deck needs wr_over_hr (average rib width / rib height)")
        ratio = np.asarray(wr_over_hr, dtype=float)
        rg = np.where(ratio >= _WR_HR_LIMIT, 1.0, 0.85)
        rg, n = np.broadcast_arrays(rg, n)
        return rg.astype(float), np.full(n.shape, _RP_WELDED_OR_PARALLEL)
    if emid_ht is None:
        raise ValueError("perpendicular deck needs emid_ht (in) for every rib")
    e = np.asarray(emid_ht, dtype=float)
    rg = np.asarray(_RG_PERPENDICULAR)[np.minimum(n.astype(int), 3)]
    rp = np.where(e >= _EMID_HT_LIMIT, _RP_STRONG, _RP_WEAK)
    rg, rp = np.broadcast_arrays(rg, rp)
    return rg.astype(float), rp.astype(float)


def qn_concrete_limit(asa: npt.ArrayLike, fc: npt.ArrayLike, ec: npt.ArrayLike) -> npt.NDArray[np.float64]:
    """Concrete-side strength of one stud, 0.5 A_sa sqrt(f'c E_c), kip.

    AISC 360-22 Eq. I8-1 (first term).
    """
    # cast: numpy's stubs type ufunc results (np.sqrt) as Any
    return cast("npt.NDArray[np.float64]",
                0.5 * np.asarray(asa, dtype=float) * np.sqrt(np.asarray(fc, dtype=float) * np.asarray(ec, dtype=float)))


def qn_stud(
    asa: npt.ArrayLike, fc: npt.ArrayLike, ec: npt.ArrayLike, fu: float, rg: npt.ArrayLike, rp: npt.ArrayLike
) -> npt.NDArray[np.float64]:
    """Nominal strength of one stud, Q_n = 0.5 A_sa sqrt(f'c E_c) <= R_g R_p A_sa F_u, kip.

    AISC 360-22 Eq. I8-1.
    """
    steel = np.asarray(rg, dtype=float) * np.asarray(rp, dtype=float) * np.asarray(asa, dtype=float) * fu
    # cast: numpy's stubs type ufunc results as Any
    return cast("npt.NDArray[np.float64]", np.minimum(qn_concrete_limit(asa, fc, ec), steel))


def stud_length_min(d: float) -> float:
    """Least stud length after installation, 4 d, in.

    AISC 360-22 I8.2 (length of 4 d_sa or more from the base to the top of the head).
    """
    return 4.0 * d


def stud_diameter_max_off_web(tf: float) -> float:
    """Largest stud diameter not placed over the web, 2.5 t_f, in.

    AISC 360-22 I8.1.
    """
    return 2.5 * tf


def stud_spacing_min(d: float, in_perpendicular_ribs: bool) -> float:
    """Least centre-to-centre stud spacing along the beam, in: 4 d within the ribs of deck
    perpendicular to the beam, 6 d otherwise.

    AISC 360-22 I8.2d.
    """
    return 4.0 * d if in_perpendicular_ribs else 6.0 * d


def stud_spacing_transverse(d: float) -> float:
    """Least centre-to-centre spacing of studs across the beam, 4 d, in.

    AISC 360-22 I8.2d.
    """
    return 4.0 * d


def stud_spacing_max(slab_thickness: float) -> float:
    """Greatest centre-to-centre stud spacing, min(8 x total slab thickness, 36 in), in.

    AISC 360-22 I8.2d.
    """
    return min(8.0 * slab_thickness, 36.0)
