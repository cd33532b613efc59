"""Finished-stage loads on a simply supported beam and their factors in the combinations.

Combinations per ASCE/SEI 7-22 Section 2.3.1 (LRFD: 1.4D; 1.2D + 1.6L) and 2.4.1 (ASD: D + L),
as used with AISC 360-22 B3.1 / B3.2 (engine.codes.asce7_22).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from engine.model.deck import plf_to_kip_per_in, psf_to_kip_per_in
from engine.model.inputs import BeamInput, PondedConcrete
from engine.mechanics.statics import Load, PointLoad, UniformLoad


@dataclass(frozen=True, slots=True)
class FinishedLoads:
    """Load sets on the finished beam: `precomposite_dead` acts on the bare steel (self-weight,
    deck, wet concrete, point-load parts placed before the slab cures); `postcomposite_dead`
    (superimposed dead) and `live` act on the composite section."""

    precomposite_dead: tuple[Load, ...]
    postcomposite_dead: tuple[Load, ...]
    live: tuple[Load, ...]

    @property
    def dead(self) -> tuple[Load, ...]:
        return self.precomposite_dead + self.postcomposite_dead


def finished_loads(beam: BeamInput) -> FinishedLoads:
    """Line and point loads from the beam's area loads, self-weight and point loads."""
    width = beam.tributary_width
    pre: list[Load] = [
        UniformLoad(plf_to_kip_per_in(beam.shape.weight_plf)),
        UniformLoad(psf_to_kip_per_in(beam.slab.dead_weight_psf(), width)),
    ]
    post: list[Load] = [UniformLoad(psf_to_kip_per_in(beam.superimposed_dead_psf, width))]
    live: list[Load] = [UniformLoad(psf_to_kip_per_in(beam.live_psf, width))]
    if beam.ponded is not None:
        pre += ponded_pieces(beam.ponded)
    for p in beam.point_loads:
        pre.append(PointLoad(p.precomposite_dead, p.x))
        post.append(PointLoad(p.dead - p.precomposite_dead, p.x))
        live.append(PointLoad(p.live, p.x))
    return FinishedLoads(_nonzero(pre), _nonzero(post), _nonzero(live))


PONDED_PIECES = 40  # uniform pieces carrying the ponded concrete (its moment to about 1e-4 of the total)


def ponded_pieces(ponded: PondedConcrete) -> list[Load]:
    """The ponded concrete of a level screed as uniform pieces of equal resultant over 40 equal
    lengths, negative parts (a camber that leaves the slab thinner) taken as zero: the delivered
    camber may be as little as 75 % of the order (AISC 303 6.4.4), so no credit is taken.
    Statics of a simple span (engine.mechanics.statics)."""
    x, q = np.asarray(ponded.x), np.maximum(np.asarray(ponded.q), 0.0)
    cuts = np.linspace(x[0], x[-1], PONDED_PIECES + 1)
    cumulative = np.concatenate(([0.0], np.cumsum(0.5 * (x[1:] - x[:-1]) * (q[:-1] + q[1:]))))
    weight = np.diff(np.interp(cuts, x, cumulative))
    return [UniformLoad(float(w / (b - a)), float(a), float(b)) for w, a, b in zip(weight, cuts[:-1], cuts[1:]) if w > 0.0]


def load_factors(loads: FinishedLoads, pairs: tuple[tuple[float, float], ...]) -> list[list[float]]:
    """For each (dead, live) factor pair, the factor of every load of `loads.dead + loads.live`."""
    return [[fd] * len(loads.dead) + [fl] * len(loads.live) for fd, fl in pairs]


def _nonzero(loads: list[Load]) -> tuple[Load, ...]:
    return tuple(ld for ld in loads if (ld.w if isinstance(ld, UniformLoad) else ld.p) != 0.0)
