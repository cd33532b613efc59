"""A table of engine checks: verdict word, ratio, check, demand, capacity, clause."""

from __future__ import annotations

from rich.text import Text

from engine.model.results import Check
from fieldcomp.tui.widgets.fmt import station, value
from fieldcomp.tui.widgets.table import TextTable
from fieldcomp.tui.widgets.verdict import word
from fieldcomp.views.numbers import ratio_text


def check_row(c: Check) -> tuple[Text, Text, str, str, str, str]:
    level = word(str(c.level))
    where = f" @ {station(c.station)}" if c.station is not None else ""
    return (level, Text(f"{ratio_text(c.ratio):>5}", style="" if c.passed else level.style), c.name + where,
            value(c.demand, c.unit), value(c.capacity, c.unit), f"{c.clause}; {c.authority}")


class ChecksTable(TextTable):
    """Checks sorted by ratio, worst first."""

    def __init__(self, *, id: str | None = None) -> None:
        super().__init__("", "ratio", "check", "demand", "capacity", "source", id=id, keep=("", "ratio"))

    def show(self, checks: tuple[Check, ...] | list[Check]) -> None:
        self.set_rows([check_row(c) for c in sorted(checks, key=lambda c: -c.ratio)])
