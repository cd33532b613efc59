"""A building model's I-section profile to a W shape of the table: by its name when the table
has it (checked against its dimensions when the model gives them), otherwise by its dimensions.
A profile that matches no shape, or two equally, is refused with the reason; none is guessed."""

from __future__ import annotations

from dataclasses import dataclass

from engine.model.errors import FieldcompError
from engine.model.shapes import ShapeNotFoundError, WShape, find_shapes, get_shape

# A model's dimension matches the table's within the larger of these (the table gives d and bf
# to 0.1 in or 3 figures, tf and tw to 3 figures; a metric model rounds them to the millimetre).
ABS_TOLERANCE = 0.04  # in, about 1 mm
REL_TOLERANCE = 0.02


@dataclass(frozen=True, slots=True)
class Section:
    """What the model says of a section: its name and, when given, d, bf, tw, tf in inches."""

    name: str
    d: float | None = None
    bf: float | None = None
    tw: float | None = None
    tf: float | None = None

    @property
    def has_dimensions(self) -> bool:
        return None not in (self.d, self.bf, self.tw, self.tf)

    def dimensions_text(self) -> str:
        return f"d {self.d:.3f} in, bf {self.bf:.3f} in, tw {self.tw:.3f} in, tf {self.tf:.3f} in"


class ShapeMatchError(FieldcompError, ValueError):
    """Why a section is not matched to a W shape (reported per element; not a program error)."""


def _fits(value: float, table: float) -> bool:
    return abs(value - table) <= max(ABS_TOLERANCE, REL_TOLERANCE * table)


def _agrees(section: Section, shape: WShape) -> bool:
    return all(_fits(getattr(section, k), getattr(shape, k)) for k in ("d", "bf", "tw", "tf"))


def _misfit(section: Section, shape: WShape) -> float:
    return sum(abs(getattr(section, k) - getattr(shape, k)) / getattr(shape, k) for k in ("d", "bf", "tw", "tf"))


def match_section(section: Section) -> tuple[WShape, str]:
    """(the W shape, how it was matched: "" by name, else a note naming the dimensions)."""
    named: WShape | None = None
    if section.name.strip():
        try:
            named = get_shape(section.name)
        except ShapeNotFoundError:
            named = None
    if named is not None:
        if section.has_dimensions and not _agrees(section, named):
            raise ShapeMatchError(f"profile named {section.name!r} but its dimensions ({section.dimensions_text()}) "
                                  f"are not {named.name}'s (d {named.d}, bf {named.bf}, tw {named.tw}, tf {named.tf} in)")
        return named, ""
    if not section.has_dimensions:
        said = f"profile {section.name!r} is not a W shape of the table" if section.name.strip() else "the profile has no name"
        raise ShapeMatchError(f"{said} and gives no I-section dimensions to match")
    fits = sorted((s for s in find_shapes("W*") if _agrees(section, s)), key=lambda s: _misfit(section, s))
    if not fits:
        raise ShapeMatchError(f"profile {section.name!r} ({section.dimensions_text()}) matches no W shape of the table")
    if len(fits) > 1 and abs(_misfit(section, fits[0]) - _misfit(section, fits[1])) < 1e-9:
        raise ShapeMatchError(f"profile {section.name!r} ({section.dimensions_text()}) matches "
                              f"{fits[0].name} and {fits[1].name} equally")
    return fits[0], f"profile {section.name!r} matched to {fits[0].name} by its dimensions ({section.dimensions_text()})"
