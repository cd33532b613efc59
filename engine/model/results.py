"""A check result that carries its clause, so every view can show the source."""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True, slots=True)
class Check:
    """One limit check: demand against capacity.

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

    @property
    def ratio(self) -> float:
        if self.capacity <= 0.0:
            return float("inf") if self.demand > 0.0 else 0.0
        return float(self.demand / self.capacity)

    @property
    def passed(self) -> bool:
        return bool(self.ratio <= 1.0 + 1e-9)


@dataclass(frozen=True, slots=True)
class Flag:
    """Something the engine did not check, or a warning the engineer must read."""

    clause: str
    message: str
    severity: str = "warning"  # "warning" | "not-checked" | "info"
