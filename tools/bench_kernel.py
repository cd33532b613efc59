"""A bare numpy kernel of the finished-beam arithmetic, for tools/bench.py: the distance of the
engine to its own limit. Not used by fieldcomp and not a check of anything: it computes, for
beams x stations arrays and no Python per beam, the same kinds of numbers a finished-beam check
computes (factored demand, slab force from placed studs, plastic strength for that force, the
lower-bound moment of inertia, live-load deflection, the governing ratio), in blocks of beams so
the temporaries stay small. Simplifications: uniform load only, a slab force in the topping,
the steel section as three rectangles.

Equations (all AISC 360-22 unless said): LRFD 1.2 D + 1.6 L (ASCE/SEI 7-22 2.3.1); C = min(sum
Qn, 0.85 f'c A_c, A_s F_y) (I3.2d.1); plastic moment of the composite section (I3.2a,
Commentary Fig. C-I3.3); I_LB (Commentary Eq. C-I3-1); deflection of a simple span under uniform
load, 5 w L^4 / (384 E I).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

E_STEEL = 29000.0  # ksi (AISC 360-22 B4 / I1.3 practice)


@dataclass(frozen=True)
class KernelBeams:
    """Beams for the kernel, one row each: span L (in); loads (kip/in) dead and live; steel A_s,
    d, b_f, t_f, t_w, I_x, F_y; slab b_eff, topping t_c, rib height h_r, f'c; studs at positions
    `stud_x` (B x S, NaN past the last) of strength `stud_q` (kip)."""

    span: np.ndarray
    w_dead: np.ndarray
    w_live: np.ndarray
    a_s: np.ndarray
    d: np.ndarray
    b_f: np.ndarray
    t_f: np.ndarray
    t_w: np.ndarray
    i_x: np.ndarray
    f_y: np.ndarray
    b_eff: np.ndarray
    t_c: np.ndarray
    h_r: np.ndarray
    f_c: np.ndarray
    stud_x: np.ndarray
    stud_q: np.ndarray

    def rows(self, lo: int, hi: int) -> KernelBeams:
        return KernelBeams(*(getattr(self, f)[lo:hi] for f in self.__dataclass_fields__))


def kernel_beams(beams) -> KernelBeams:
    """Kernel inputs from engine BeamInputs and their placed studs (engine.studs.design)."""
    from engine.finished.basis import finished_basis
    from engine.studs.design import design_layout

    rows = []
    for b in beams:
        lim = finished_basis(b).limits
        groups = design_layout(b).layout.groups()
        s = b.shape
        width = b.tributary_width
        psf = width / 144.0 / 1000.0  # psf to kip/in on the tributary width
        rows.append((b.span, (b.slab.dead_weight_psf() + b.superimposed_dead_psf) * psf + s.weight_plf / 12000.0,
                     b.live_psf * psf, s.area, s.d, s.bf, s.tf, s.tw, s.ix, b.fy, lim.b_eff,
                     b.slab.topping, b.slab.rib_height, b.slab.fc_ksi,
                     np.asarray(groups.x, float), np.asarray(groups.strength, float)))
    width = max(r[-2].size for r in rows)
    sx = np.full((len(rows), width), np.nan)
    sq = np.zeros((len(rows), width))
    for i, r in enumerate(rows):
        sx[i, : r[-2].size], sq[i, : r[-1].size] = r[-2], r[-1]
    cols = [np.array([r[k] for r in rows], float) for k in range(14)]
    return KernelBeams(*cols, sx, sq)


def kernel(k: KernelBeams, stations: int = 401, block: int = 256) -> np.ndarray:
    """The governing ratio of each beam (B,): max over stations of M_u / phi M_n(C(x)), and live
    deflection over L/360, the larger."""
    out = np.empty(k.span.size)
    for lo in range(0, k.span.size, block):
        out[lo: lo + block] = _block(k.rows(lo, lo + block), stations)
    return out


def _block(k: KernelBeams, n: int) -> np.ndarray:
    col = lambda a: a[:, None]  # noqa: E731
    x = col(k.span) * np.linspace(0.0, 1.0, n)[None, :]
    wu = 1.2 * k.w_dead + 1.6 * k.w_live
    mu = col(wu) * x * (col(k.span) - x) / 2.0
    # slab force from the studs: cumulative strength left and right of each station
    padded = np.where(np.isnan(k.stud_x), col(k.span) + 1.0, k.stud_x)  # past the far end, no strength
    order = np.argsort(padded, axis=1)
    sx = np.take_along_axis(padded, order, axis=1)
    sq = np.take_along_axis(k.stud_q, order, axis=1)
    cum = np.concatenate((np.zeros((sq.shape[0], 1)), np.cumsum(sq, axis=1)), axis=1)
    span_off = np.arange(sx.shape[0])[:, None] * 1e7
    flat = (sx + span_off).ravel()
    idx = np.searchsorted(flat, (x + span_off).ravel()).reshape(x.shape) - np.arange(sx.shape[0])[:, None] * sx.shape[1]
    left = np.take_along_axis(cum, idx, axis=1)
    right = cum[:, -1:] - left
    a_sfy = k.a_s * k.f_y
    c = np.minimum(np.minimum(left, right), col(np.minimum(0.85 * k.f_c * k.b_eff * k.t_c, a_sfy)))
    # plastic moment for C: the steel's tension T = (A_s F_y + C) / 2 about its PNA, the concrete
    # force C at the middle of its stress block depth a = C / (0.85 f'c b_eff)
    a = c / col(0.85 * k.f_c * k.b_eff)
    comp = (col(a_sfy) - c) / 2.0  # steel in compression
    flange = col(k.b_f * k.t_f * k.f_y)
    in_flange = comp <= flange
    y_f = comp / col(k.b_f * k.f_y)
    y_w = col(k.t_f) + (comp - flange) / col(k.t_w * k.f_y)
    y = np.where(in_flange, y_f, y_w)  # PNA depth below the top of steel
    top = col(k.h_r + k.t_c)
    mn = c * (top - a / 2.0 + y) + col(a_sfy) * (col(k.d) / 2.0 - y) + comp * y  # moments about the PNA, steel's share approx.
    ratio_m = (mu / (0.9 * np.maximum(mn, 1e-9))).max(axis=1)
    # I_LB at midspan (Commentary Eq. C-I3-1)
    qn = c[:, n // 2]
    y_ena = (k.a_s * k.d / 2.0 + qn / k.f_y * (k.d + k.h_r + k.t_c - a[:, n // 2] / 2.0)) / (k.a_s + qn / k.f_y)
    i_lb = k.i_x + k.a_s * (y_ena - k.d / 2.0) ** 2 + qn / k.f_y * (k.d + k.h_r + k.t_c - a[:, n // 2] / 2.0 - y_ena) ** 2
    xi = x / col(k.span)
    live = col(k.w_live * k.span**4 / (24.0 * E_STEEL * i_lb)) * xi * (1.0 - 2.0 * xi**2 + xi**3)
    return np.maximum(ratio_m, live.max(axis=1) / (k.span / 360.0))
