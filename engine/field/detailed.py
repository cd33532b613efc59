"""The studs as detailed on the shop drawings, rib by rib, on fieldcomp's slot grid: findings
apply to this layout when the job gives one (`BeamInput.detailed`), else to fieldcomp's own.

Each stud keeps the strength of its rib's count and side (AISC 360-22 Eq. I8-1, R_g and R_p per
I8.2a); a rib may hold more than fieldcomp's own limit if the drawings put them there.
"""

from __future__ import annotations

import numpy as np

from engine.field.as_built import FindingError, finding_slot
from engine.finished.slab_force import stud_qn
from engine.model.inputs import BeamInput, DetailedRib, Finding
from engine.studs.layout import StudLayout

SOURCE_DETAILED = "as detailed (shop drawings, given in the job)"
SOURCE_FIELDCOMP = "fieldcomp's own layout (no as-detailed layout given)"


class DetailedLayoutError(FindingError):
    """A row of the as-detailed layout that does not fit the beam's ribs; `index` is its 0-based row."""


def detailed_layout(beam: BeamInput, grid: StudLayout, rows: tuple[DetailedRib, ...]) -> StudLayout:
    """The layout of `rows` on the slots of `grid` (studs per slot; ribs not listed hold none).
    A station is matched to the nearest rib within half a pitch. Raises DetailedLayoutError.

    AISC 360-22 Eq. I8-1 with R_g by the studs in the rib and R_p by side (I8.2a).
    """
    count = np.zeros(grid.x.size, dtype=int)
    for i, row in enumerate(rows):
        if row.count < 0:
            raise DetailedLayoutError(i, f"as-detailed row {i + 1}: count must be 0 or more")
        try:
            k = finding_slot(grid, Finding("added", row.rib, row.station, max(row.count, 1)), i)
        except FindingError as exc:
            raise DetailedLayoutError(i, f"as-detailed row {i + 1}: {str(exc).split(': ', 1)[-1]}") from None
        count[k] += row.count
    qn = np.where(count > 0, stud_qn(beam, np.maximum(count, 1), grid.position), 0.0)
    return StudLayout(grid.x.copy(), count, grid.position.copy(), qn, np.maximum(grid.max_count, count), grid.x_flip)
