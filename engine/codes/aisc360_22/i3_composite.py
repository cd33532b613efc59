"""Composite beam section: effective width, plastic strength for any slab force, stiffness;
the formed-deck limits and the rules for when composite action counts.

Units: kip, in, ksi, kip-in. `shape` is any object with the W-shape attributes `area`, `d`,
`bf`, `tf`, `ix` (e.g. `engine.model.shapes.WShape`). `y_con` is the distance from the top of the
steel to the top of the slab. Section functions broadcast over numpy arrays; the deck and slip
rules take scalars.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import cast

import numpy as np
import numpy.typing as npt

from engine.codes.aisc360_22.rolled_shape import RolledShape

PNA_LABELS = ("slab", "flange", "web")
PNA_SLAB, PNA_FLANGE, PNA_WEB = 0, 1, 2

# AISC 360-22 I3.1b: the steel alone carries the loads applied before the concrete reaches
# this share of f'c.
COMPOSITE_FC_SHARE = 0.75

# AISC 360-22 I3.2c.1: composite beams with formed steel deck, in.
DECK_RIB_HEIGHT_MAX = 3.0  # nominal rib height h_r
DECK_RIB_WIDTH_MIN = 2.0  # average width of the concrete rib w_r
DECK_STUD_DIAMETER_MAX = 0.75  # studs welded through the deck or to the steel
STUD_PROJECTION_MIN = 1.5  # studs extend above the top of the deck after installation
STUD_COVER_MIN = 0.5  # specified concrete cover above the top of the studs
DECK_TOPPING_MIN = 2.0  # slab thickness above the steel deck
DECK_ANCHOR_SPACING_MAX = 18.0  # deck anchored to every supporting member at this spacing or less

# AISC 360-22 I3.2c.3: deck ribs parallel to the beam at least this high (in) need w_r of 2 in
# for the first stud of a transverse row plus 4 d for each added stud.
PARALLEL_RIB_HEIGHT_MIN = 1.5


def effective_width(
    span: npt.ArrayLike, left: npt.ArrayLike, right: npt.ArrayLike
) -> tuple[npt.NDArray[np.float64], npt.NDArray[np.float64]]:
    """Effective slab width on each side of the beam centreline, (b_left, b_right), in.

    AISC 360-22 I3.1a: each side the least of span/8 and `left` / `right`, where the caller
    passes for each side half the distance to the adjacent beam or the distance to the slab edge.
    """
    span, left, right = (np.asarray(v, dtype=float) for v in (span, left, right))
    if (span <= 0.0).any() or (left < 0.0).any() or (right < 0.0).any():
        raise ValueError(f"span {span} in must be > 0 and side distances {left}, {right} in >= 0")
    return np.minimum(span / 8.0, left), np.minimum(span / 8.0, right)


def b_eff(span: npt.ArrayLike, left: npt.ArrayLike, right: npt.ArrayLike) -> npt.NDArray[np.float64]:
    """Total effective slab width b = b_left + b_right, in.

    AISC 360-22 I3.1a.
    """
    b_left, b_right = effective_width(span, left, right)
    return b_left + b_right


def cf_force(as_fy: npt.ArrayLike, fc: npt.ArrayLike, ac: npt.ArrayLike) -> npt.NDArray[np.float64]:
    """Slab force of full composite action, C_f = min(A_s F_y, 0.85 f'c A_c), kip.

    AISC 360-22 I3.2d.1 (V'); Commentary Eq. C-I3-3 (C_f).
    """
    # cast: numpy's stubs type ufunc results (np.minimum) as Any
    return cast("npt.NDArray[np.float64]",
                np.minimum(np.asarray(as_fy, dtype=float), 0.85 * np.asarray(fc, dtype=float) * np.asarray(ac, dtype=float)))


def stress_block_force(fc: npt.ArrayLike, width: npt.ArrayLike, depth: npt.ArrayLike) -> npt.NDArray[np.float64]:
    """Force of a concrete stress block of 0.85 f'c over `width` x `depth`, kip.

    AISC 360-22 I1.2a (0.85 f'c uniform over the compression zone), for the plastic stress
    distribution of I3.2a.
    """
    # cast: numpy's stubs type products of np.asarray results as Any
    return cast("npt.NDArray[np.float64]",
                0.85 * np.asarray(fc, dtype=float) * np.asarray(width, dtype=float) * np.asarray(depth, dtype=float))


SLIP_CAPACITY = 0.25  # in, S_u of headed studs, AISC 360-22 Commentary I3.2d (as in AISC Design Examples v16.0 Ex. I.1)
SLIP_EXEMPT_SPAN = 360.0  # in (30 ft)
SLIP_EXEMPT_COMPOSITE = 0.5
SLIP_EXEMPT_KIP_PER_FT = 16.0


def slip_exemption(span: float, side_ratio: float, side_kip_per_ft: float) -> str | None:
    """Which Commentary condition spares one shear span a slip-capacity evaluation, or None:
    span (in) of 30 ft or less; sum Q_n / C_f of that shear span 0.5 or more; or its average
    stud strength, sum Q_n over the shear span length, 16 kip/ft or more. The Commentary states
    them for uniformly loaded beams (or equally spaced equal point loads): the caller decides that.

    AISC 360-22 I3.2d.1 ("the slip capacity ... shall be considered"), Commentary I3.2d.
    """
    if span <= SLIP_EXEMPT_SPAN:
        return "span 30 ft or less"
    if side_ratio >= SLIP_EXEMPT_COMPOSITE:
        return f"{side_ratio:.0%} composite (50 % or more)"
    if side_kip_per_ft >= SLIP_EXEMPT_KIP_PER_FT:
        return f"{side_kip_per_ft:.1f} kip/ft of studs over the shear span (16 or more)"
    return None


def slip_coefficients(es_is: float, es_as: float, ec_ic: float, ec_ac: float, e: float) -> tuple[float, float]:
    """K1 (1/kip-in) and K2 (1/kip) of the interface slip strain K1 M - K2 C of a partially
    composite section: steel (E_s I_s, E_s A_s) and concrete (E_c I_c, E_c A_c) bending together,
    their centroids `e` (in) apart: K1 = e / (E_s I_s + E_c I_c); K2 = e^2 / (E_s I_s + E_c I_c)
    + 1 / (E_s A_s) + 1 / (E_c A_c).

    AISC 360-22 Commentary I3.2d (analytical slip demand; DE16 Ex. I.1: K1 = 493e-9, K2 = 10.6e-6).
    """
    stiffness = es_is + ec_ic
    return e / stiffness, e * e / stiffness + 1.0 / es_as + 1.0 / ec_ac


def slip_limited_moment(k1: float, k2: float, force_integral: float, shape_integral: float,
                        su: float = SLIP_CAPACITY) -> float:
    """Nominal moment Mn,sc (kip-in) at which the slip at the support reaches S_u: the slip strain
    K1 M(x) - K2 C(x) integrated over the shear span equals S_u, with M(x) = Mn,sc m(x):
    Mn,sc = (S_u + K2 integral C dx) / (K1 integral m dx) (kip-in^2 and in).

    AISC 360-22 Commentary I3.2d (analytical method).
    """
    return (su + k2 * force_integral) / (k1 * shape_integral)


def parallel_rib_studs_across(w_r: float, d: float) -> int:
    """Most studs of diameter d (in) in one transverse row of a deck rib parallel to the beam of
    average width w_r (in), ribs 1 1/2 in or higher: w_r >= 2 in for the first + 4 d per added stud.

    AISC 360-22 I3.2c.3.
    """
    return int(np.floor((w_r - 2.0) / (4.0 * d) + 1e-9)) + 1


@dataclass(frozen=True, slots=True)
class PlasticMoment:
    """Plastic stress distribution for a slab force C (arrays shaped like C).

    c: slab force used (kip); a: depth of the concrete stress block (in); y2: d1, top of steel to
    the concrete force (in); d2: top of steel to the steel compression force (in); d3: top of
    steel to the steel tension force P_y (in); mn: nominal moment (kip-in); pna: 0 slab,
    1 top flange, 2 web; pna_depth: PNA below the top of steel (in; 0 when in the slab).
    """

    c: np.ndarray
    a: np.ndarray
    y2: np.ndarray
    d2: np.ndarray
    d3: np.ndarray
    mn: np.ndarray
    pna: np.ndarray
    pna_depth: np.ndarray


def model_web_thickness(shape: RolledShape) -> float:
    """Web thickness that makes two bf x tf flanges plus the web equal the tabulated area, in.

    Model of this tool (fillets folded into the web) for AISC 360-22 I3.2a plastic analysis.
    """
    tw = (shape.area - 2.0 * shape.bf * shape.tf) / (shape.d - 2.0 * shape.tf)
    if tw <= 0.0:
        raise ValueError(f"shape {getattr(shape, 'name', '')}: area {shape.area} in^2 leaves no web")
    return tw


def plastic_moment(c: npt.ArrayLike, shape: RolledShape, fy: float, fc: float, b_eff: float, y_con: float) -> PlasticMoment:
    """Nominal flexural strength for slab force C: M_n = C (d1 + d2) + P_y (d3 - d2), kip-in.

    AISC 360-22 I3.2a (plastic stress distribution) and Commentary I3.2a.
    The caller limits C to min(sum Q_n, 0.85 f'c A_c, A_s F_y); here C is only clipped to
    A_s F_y. C = 0 gives the plastic moment of the bare steel.
    """
    c = np.asarray(c, dtype=float)
    if (c < 0.0).any():
        raise ValueError(f"slab force {c[c < 0.0]} kip must be >= 0")
    if fy <= 0.0 or fc <= 0.0 or b_eff <= 0.0 or y_con <= 0.0:
        raise ValueError(f"Fy {fy}, f'c {fc}, b_eff {b_eff}, y_con {y_con} must all be > 0")
    py = shape.area * fy
    tw = model_web_thickness(shape)
    flange = shape.bf * shape.tf * fy
    c = cast("npt.NDArray[np.float64]", np.minimum(c, py))  # cast: numpy's stubs type ufunc results as Any
    a = c / (0.85 * fc * b_eff)
    y2 = y_con - a / 2.0
    cs = (py - c) / 2.0  # steel in compression
    x_flange = np.minimum(cs, flange) / (shape.bf * fy)
    yw = np.maximum(cs - flange, 0.0) / (tw * fy)  # web depth in compression below the flange
    in_web = cs > flange
    web_d2 = (shape.bf * shape.tf**2 / 2.0 + tw * yw * (shape.tf + yw / 2.0)) / (shape.bf * shape.tf + tw * yw)
    d2 = np.where(in_web, web_d2, x_flange / 2.0)
    pna = np.where(cs <= 0.0, PNA_SLAB, np.where(in_web, PNA_WEB, PNA_FLANGE))
    pna_depth = np.where(in_web, shape.tf + yw, x_flange)
    d3 = np.full(c.shape, shape.d / 2.0)
    mn = c * (y2 + d2) + py * (d3 - d2)
    return PlasticMoment(c=c, a=a, y2=y2, d2=d2, d3=d3, mn=mn, pna=pna, pna_depth=pna_depth)


def pna_label(code: int) -> str:
    """Word for a PNA location code of `PlasticMoment.pna`: "slab", "flange" or "web".

    AISC 360-22 Commentary I3.2a (PNA in the slab, top flange or web).
    """
    return PNA_LABELS[int(code)]


def transformed_inertia(
    shape: RolledShape, b_eff: npt.ArrayLike, n: npt.ArrayLike, t_c: npt.ArrayLike, y_con: npt.ArrayLike
) -> tuple[npt.NDArray[np.float64], npt.NDArray[np.float64]]:
    """Elastic transformed moment of inertia I_tr and neutral axis above the steel bottom, in^4, in.

    AISC 360-22 Commentary I3.2 (transformed section). Concrete of thickness t_c at the top of
    the slab, width b_eff/n; if the neutral axis falls in the concrete, the concrete below it is
    ignored (cracked) and the compression depth x solves (b/n) x^2/2 = A_s (H - d/2).
    """
    b_eff, n, t_c, y_con = (np.asarray(v, dtype=float) for v in (b_eff, n, t_c, y_con))
    if (b_eff <= 0.0).any() or (n <= 0.0).any() or (t_c <= 0.0).any() or (t_c > y_con).any():
        raise ValueError(f"need b_eff {b_eff} > 0, n {n} > 0 and 0 < t_c {t_c} <= y_con {y_con} in")
    area, d = shape.area, shape.d
    w = b_eff / n
    top = d + y_con
    y_full = (area * d / 2.0 + w * t_c * (top - t_c / 2.0)) / (area + w * t_c)
    x_cracked = (-area + np.sqrt(area**2 + 2.0 * w * area * (top - d / 2.0))) / w
    cracked = y_full > top - t_c
    depth = np.where(cracked, x_cracked, t_c)
    y = np.where(cracked, top - x_cracked, y_full)
    i_tr = shape.ix + area * (y - d / 2.0) ** 2 + w * depth**3 / 12.0 + w * depth * (top - depth / 2.0 - y) ** 2
    return i_tr, y


def lower_bound_ena(
    shape: RolledShape, sum_qn: npt.ArrayLike, fy: float, y_con: float, a: npt.ArrayLike
) -> npt.NDArray[np.float64]:
    """Y_ENA of the lower-bound section, above the bottom of the steel, in.

    AISC 360-22 Commentary I3.2 (Y_ENA of Eq. C-I3-1):
    [A_s d3 + (sum Q_n/F_y)(2 d3 + d1)] / (A_s + sum Q_n/F_y), d1 = y_con - a/2, d3 = d/2.
    """
    q = np.asarray(sum_qn, dtype=float) / fy
    if (q < 0.0).any():
        # ignore: numpy's ArrayLike includes bytes, which an f-string prints as b'...'; sum_qn holds numbers
        raise ValueError(f"sum Qn {sum_qn} kip must be >= 0")  # type: ignore[str-bytes-safe]
    d1 = y_con - np.asarray(a, dtype=float) / 2.0
    d3 = shape.d / 2.0
    return (shape.area * d3 + q * (2.0 * d3 + d1)) / (shape.area + q)


def lower_bound_inertia(
    shape: RolledShape, sum_qn: npt.ArrayLike, fy: float, y_con: float, a: npt.ArrayLike
) -> npt.NDArray[np.float64]:
    """Lower-bound moment of inertia I_LB, in^4.

    AISC 360-22 Commentary Eq. C-I3-1: I_s + A_s (Y_ENA - d3)^2 + (sum Q_n/F_y)(2 d3 + d1 - Y_ENA)^2.
    """
    y_ena = lower_bound_ena(shape, sum_qn, fy, y_con, a)
    q = np.asarray(sum_qn, dtype=float) / fy
    d1 = y_con - np.asarray(a, dtype=float) / 2.0
    d3 = shape.d / 2.0
    return shape.ix + shape.area * (y_ena - d3) ** 2 + q * (2.0 * d3 + d1 - y_ena) ** 2


def equivalent_inertia(i_s: float, i_tr: npt.ArrayLike, sum_qn: npt.ArrayLike, cf: npt.ArrayLike) -> npt.NDArray[np.float64]:
    """Equivalent moment of inertia for partial composite action, in^4.

    AISC 360-22 Commentary Eq. C-I3-3: I_equiv = I_s + sqrt(sum Q_n / C_f) (I_tr - I_s), the ratio
    capped at 1.0 (no 0.75 factor; 360-16 had one). The Commentary does not cover
    sum Q_n / C_f < 0.25: the value is still returned, and the caller flags that range.
    """
    ratio = np.asarray(sum_qn, dtype=float) / np.asarray(cf, dtype=float)
    if (ratio < 0.0).any():
        # ignore: numpy's ArrayLike includes bytes, which an f-string prints as b'...'; these hold numbers
        raise ValueError(f"sum Qn {sum_qn} kip must be >= 0 and C_f {cf} kip > 0")  # type: ignore[str-bytes-safe]
    # cast: numpy's stubs type ufunc results (np.sqrt, np.minimum) as Any
    return cast("npt.NDArray[np.float64]", i_s + np.sqrt(np.minimum(ratio, 1.0)) * (np.asarray(i_tr, dtype=float) - i_s))
