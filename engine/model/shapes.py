"""W-shape look-up over engine/model/data/w_shapes.py (AISC Shapes Database v16.0 figures)."""

from __future__ import annotations

import difflib
import fnmatch
from dataclasses import dataclass
from types import MappingProxyType

from engine.model.data.w_shapes import ROWS
from engine.model.errors import FieldcompError

__all__ = ["ShapeNotFoundError", "WShape", "find_shapes", "get_shape"]


@dataclass(frozen=True, slots=True)
class WShape:
    """One rolled W-shape. Lengths in in, area in^2, I and J in^4, S and Z in^3, Cw in^6.

    `k_des` is the design distance from the outer flange face to the web toe of the fillet.
    """

    name: str
    weight_plf: float
    area: float
    d: float
    bf: float
    tf: float
    tw: float
    k_des: float
    ix: float
    zx: float
    sx: float
    rx: float
    iy: float
    ry: float
    j: float
    cw: float
    rts: float
    ho: float

    @property
    def h_tw(self) -> float:
        """Web slenderness h/tw, with h = d - 2 k_des (the database's h for rolled shapes).

        AISC 360-22 B4.1b(a): h is the clear distance between flanges less each flange's fillet.
        """
        return (self.d - 2.0 * self.k_des) / self.tw


class ShapeNotFoundError(FieldcompError, ValueError):
    """No W-shape by that name; `suggestions` holds close names from the table."""

    def __init__(self, name: object, suggestions: tuple[str, ...]) -> None:
        hint = f"; close names: {', '.join(suggestions)}" if suggestions else ""
        super().__init__(f"no W-shape named {name!r} in the AISC Shapes Database v16.0 table{hint}")
        self.suggestions = suggestions


def _normalise(name: str) -> str:
    """Upper case, no spaces, any of x X × as the separator: ' w21 × 50 ' -> 'W21X50'."""
    return "".join(name.split()).upper().replace("\u00d7", "X")


def _listing_key(shape: WShape) -> tuple[float, float]:
    nominal_depth = int(shape.name[1:].split("X")[0])
    return (-nominal_depth, -shape.weight_plf)


_ALL = tuple(sorted((WShape(*row) for row in ROWS), key=_listing_key))
_BY_NAME = MappingProxyType({shape.name: shape for shape in _ALL})


def _close_names(key: str) -> tuple[str, ...]:
    """Same nominal depth, nearest weights first (W18X36 -> W18X35, W18X40 ...); otherwise
    names that look alike."""
    depth, _, weight = key.partition("X")
    try:
        target = float(weight)
    except ValueError:
        target = None
    same_depth = [s for s in _BY_NAME.values() if s.name.partition("X")[0] == depth]
    if target is not None and same_depth:
        return tuple(s.name for s in sorted(same_depth, key=lambda s: abs(s.weight_plf - target))[:3])
    return tuple(difflib.get_close_matches(key, _BY_NAME.keys(), n=3, cutoff=0.6))


def get_shape(name: str) -> WShape:
    """The W-shape with this designation; case, spaces and x / X / × are ignored."""
    if not isinstance(name, str):
        raise ShapeNotFoundError(name, ())
    key = _normalise(name)
    try:
        return _BY_NAME[key]
    except KeyError:
        raise ShapeNotFoundError(name, _close_names(key)) from None


def find_shapes(pattern: str = "*") -> tuple[WShape, ...]:
    """W-shapes matching a glob such as "W21X*", deepest nominal depth first, then heaviest."""
    if not isinstance(pattern, str):
        raise TypeError(f"a shape pattern is text such as 'W21X*', got {pattern!r}")
    key = _normalise(pattern)
    return tuple(shape for shape in _ALL if fnmatch.fnmatchcase(shape.name, key))
