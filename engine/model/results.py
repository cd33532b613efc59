"""A check result that carries its clause and the authority of its rule, so every view can show
the source and the verdict is only as strong as the rule behind it."""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass
from enum import StrEnum


class Authority(StrEnum):
    """Whose rule a check applies. A broken specification, building-code or project limit fails;
    a broken commentary, design-guide or common-practice limit asks the engineer of record to review."""

    SPECIFICATION = "specification"  # the body of AISC 360-22 (or another standard's requirements)
    BUILDING_CODE = "building-code"  # e.g. IBC Table 1604.3 floor deflection limits
    PROJECT = "project"  # a limit the engineer typed into the job
    COMMENTARY = "commentary"  # AISC 360-22 Commentary
    DESIGN_GUIDE = "design-guide"  # an AISC Design Guide recommendation
    COMMON_PRACTICE = "common-practice"  # no published source: this tool's or the trade's habit


BINDING = frozenset({Authority.SPECIFICATION, Authority.BUILDING_CODE, Authority.PROJECT})


class Level(StrEnum):
    """The three verdict levels, in rising severity."""

    PASS = "pass"
    REVIEW = "review"
    FAIL = "fail"


_RANK = {Level.PASS: 0, Level.REVIEW: 1, Level.FAIL: 2}


def worst(levels: Iterable[Level]) -> Level:
    """The most severe of `levels` (pass when there are none)."""
    return max(levels, key=_RANK.__getitem__, default=Level.PASS)


@dataclass(frozen=True, slots=True)
class Check:
    """One limit check: demand against capacity.

    `authority` is whose rule it is; `level` follows from it (see `Authority`).
    `id` is the check's stable identity (e.g. "flexure.composite", "studs.spacing.max"): code,
    JSON and tests find a check by it, never by its display `name` or unit. `ratio` is
    demand / capacity (<= 1.0 passes). `station` is where it governs (inches from the reference
    end) or None when it is not tied to a station. A failed check is a result, never an exception.
    """

    id: str
    name: str
    clause: str
    demand: float
    capacity: float
    unit: str
    station: float | None = None
    note: str = ""
    kind: str = "strength"  # "strength" | "serviceability" | "detailing"
    authority: Authority = Authority.SPECIFICATION
    advisory: bool = False  # a possible outcome or a stated intent: exceeding it asks for review only

    @property
    def ratio(self) -> float:
        if self.capacity <= 0.0:
            return float("inf") if self.demand > 0.0 else 0.0
        return float(self.demand / self.capacity)

    @property
    def passed(self) -> bool:
        return bool(self.ratio <= 1.0 + 1e-9)

    @property
    def level(self) -> Level:
        """pass; fail when a binding rule (specification, building code, project) is broken;
        review when a commentary, design-guide or common-practice limit, or an advisory one, is."""
        if self.passed:
            return Level.PASS
        return Level.FAIL if self.authority in BINDING and not self.advisory else Level.REVIEW


@dataclass(frozen=True, slots=True)
class Flag:
    """Something the engine did not check, or a warning the engineer must read."""

    clause: str
    message: str
    severity: str = "warning"  # "warning" | "not-checked" | "info"


def verdict_of(checks: Iterable[Check]) -> Level:
    """A set of checks' verdict: the worst of their levels."""
    return worst(c.level for c in checks)
