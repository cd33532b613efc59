"""Deck profile and slab geometry: rib widths, concrete per foot, slab weight, A_c.

Ribs are the concrete-filled flutes of the deck: `rib_top_width` is the width of a
concrete rib at the deck top, `rib_bottom_width` at the deck pan.
"""

from __future__ import annotations

from dataclasses import dataclass

CONCRETE_BELOW_DECK_TOP_IGNORED = "AISC 360-22 I3.2c.2"


@dataclass(frozen=True, slots=True)
class DeckProfile:
    """Formed steel deck: rib height hr, concrete rib widths, pitch (all in), weight (psf).

    `stud_offset` is how far an off-centre stud stands from the rib centreline (studs are
    pushed off-centre by the flute stiffener; AISC 360-22 Commentary I8.2a).
    """

    name: str
    rib_height: float
    rib_top_width: float
    rib_bottom_width: float
    pitch: float
    weight_psf: float
    stud_offset: float = 1.25

    @property
    def rib_average_width(self) -> float:
        """w_r, average width of the concrete rib (AISC 360-22 I3.2c.1)."""
        return 0.5 * (self.rib_top_width + self.rib_bottom_width)

    @property
    def rib_mid_height_width(self) -> float:
        """Width of the concrete rib at mid-height, where e_mid-ht is measured (AISC 360-22 I8.2a)."""
        return 0.5 * (self.rib_top_width + self.rib_bottom_width)

    @property
    def rib_fraction(self) -> float:
        """Share of the rib zone filled with concrete: rib cross-section area / (hr * pitch)."""
        return self.rib_average_width / self.pitch


@dataclass(frozen=True, slots=True)
class Slab:
    """Concrete slab, on deck or solid. `topping` is the concrete above the deck top
    (the whole thickness of a solid slab)."""

    name: str
    deck: DeckProfile | None
    topping: float
    concrete_pcf: float
    fc_ksi: float
    lightweight: bool

    @property
    def rib_height(self) -> float:
        return 0.0 if self.deck is None else self.deck.rib_height

    @property
    def total_thickness(self) -> float:
        """Top of steel to top of slab (Y_con in AISC 360-22 Commentary I3.2a)."""
        return self.topping + self.rib_height

    def concrete_volume_per_area(self) -> float:
        """Concrete volume per unit plan area (in^3/in^2 = in): topping plus concrete in the ribs."""
        if self.deck is None:
            return self.topping
        return self.topping + self.deck.rib_height * self.deck.rib_fraction

    def wet_weight_psf(self) -> float:
        """Weight of wet concrete per plan area (psf) from geometry (unit weight x volume)."""
        return self.concrete_pcf * self.concrete_volume_per_area() / 12.0

    def dead_weight_psf(self) -> float:
        """Slab plus deck weight per plan area (psf)."""
        deck_psf = 0.0 if self.deck is None else self.deck.weight_psf
        return self.wet_weight_psf() + deck_psf

    def strength_concrete_area(self, b_eff: float, orientation: str) -> float:
        """A_c, concrete area within b_eff counted for strength (in^2).

        AISC 360-22 I3.2c.2: with ribs perpendicular to the beam, concrete below the deck top
        is ignored; I3.2c.3: with ribs parallel it may be counted (here by the rib fraction).
        """
        if self.deck is None or orientation == "perpendicular":
            return b_eff * self.topping
        return b_eff * (self.topping + self.deck.rib_height * self.deck.rib_fraction)


def psf_to_kip_per_in(psf: float, width_in: float) -> float:
    """Area load (psf) over a width (in) as a line load (kip/in): psf x width / 144 / 1000."""
    return psf * width_in / 144_000.0


def plf_to_kip_per_in(plf: float) -> float:
    """Line load lb/ft as kip/in."""
    return plf / 12_000.0
