"""Validation: Structural Steel Designer's Handbook, Ch. 6, p. 6.32, effective moment of inertia of a
composite beam with partial composite action.

Source: Structural Steel Designer's Handbook: AISC, AASHTO, AISI, ASTM, AREMA, and ASCE-07 Design
Standards, R. L. Brockenbrough and F. S. Merritt (eds.), McGraw-Hill; the edition published under
that title (5th, 2011: edition, year and editors from memory, check the copy); Ch. 6, p. 6.32.
Published values as read in the publication (tag V = read in the publication, D = derived
there from it). Units: kip, in, ksi.
"""

from __future__ import annotations

import pytest

from engine.codes.aisc360_22.i1_materials import ec, modular_ratio
from engine.codes.aisc360_22.i3_composite import cf_force, equivalent_inertia


def test_ssdh_page_6_32_effective_inertia():
    """Structural Steel Designer's Handbook, Ch. 6 p. 6.32: W21X44,
    lightweight concrete 115 pcf, f'c 3 ksi. Ec = 2,136 ksi, n = 13.58 (V). With Itr = 2,496,
    Is = 843, sum Qn = 260 kips, Cf = As Fy = 650 kips (less than 0.85 f'c Ac = 975.4 kips):
    I_eff = 843 + sqrt(260/650) (2,496 - 843) = 843 + 0.63246 * 1,653 = 1,888 in^4 (D)."""
    e_c = ec(115.0, 3.0)
    assert float(e_c) == pytest.approx(2136.0, rel=0.001)
    assert float(modular_ratio(e_c)) == pytest.approx(13.58, rel=0.001)
    cf = float(cf_force(650.0, 3.0, 975.4 / (0.85 * 3.0)))
    assert cf == pytest.approx(650.0)
    assert float(equivalent_inertia(843.0, 2496.0, 260.0, cf)) == pytest.approx(1888.0, abs=1.0)
