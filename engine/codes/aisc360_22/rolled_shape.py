"""The section properties of a rolled W-shape that the Chapter F, G and I functions read.

`RolledShape` types their `shape` argument: any object with these attributes will do
(e.g. `engine.model.shapes.WShape`). Units: in, in^2, in^3, in^4.
"""

from __future__ import annotations

from typing import Protocol


class RolledShape(Protocol):
    """Doubly symmetric rolled I-shape: lengths in, area in^2, S and Z in^3, I and J in^4.

    AISC 360-22 symbols (Chapters F, G, I), values as in the AISC Shapes Database v16.0.
    """

    def __hash__(self) -> int: ...  # hashable: the Chapter F terms are cached per shape

    @property
    def area(self) -> float: ...  # A_g, in^2

    @property
    def d(self) -> float: ...  # overall depth, in

    @property
    def bf(self) -> float: ...  # flange width, in

    @property
    def tf(self) -> float: ...  # flange thickness, in

    @property
    def tw(self) -> float: ...  # web thickness, in

    @property
    def ix(self) -> float: ...  # I_x, in^4

    @property
    def sx(self) -> float: ...  # S_x, in^3

    @property
    def zx(self) -> float: ...  # Z_x, in^3

    @property
    def ry(self) -> float: ...  # r_y, in

    @property
    def j(self) -> float: ...  # torsional constant J, in^4

    @property
    def rts(self) -> float: ...  # effective radius of gyration r_ts, in

    @property
    def ho(self) -> float: ...  # distance between flange centroids h_o, in

    @property
    def h_tw(self) -> float: ...  # web slenderness h/t_w
