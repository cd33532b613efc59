"""A table of engine checks: verdict word, ratio, check, demand, capacity, clause."""

from __future__ import annotations

from rich.text import Text

from engine.model.results import Check
from fieldcomp.tui.widgets.fmt import station, value
from fieldcomp.tui.widgets.table import Table
from fieldcomp.views.numbers import ratio_text


def check_row(c: Check) -> tuple[Text, Text, str, str, str, str]:
    style = {"pass": "green", "review": "bold yellow", "fail": "bold red"}[c.level]
    word = Text({"pass": "pass", "review": "REVIEW", "fail": "FAIL"}[c.level], style=style)
    where = f" @ {station(c.station)}" if c.station is not None else ""
    return (word, Text(f"{ratio_text(c.ratio):>5}", style="" if c.passed else style), c.name + where,
            value(c.demand, c.unit), value(c.capacity, c.unit), f"{c.clause}; {c.authority}")


class ChecksTable(Table):
    """Checks sorted by ratio, worst first."""

    def __init__(self, *, id: str | None = None) -> None:
        super().__init__("", "ratio", "check", "demand", "capacity", "source", id=id)

    def show(self, checks: tuple[Check, ...] | list[Check]) -> None:
        self.set_rows([check_row(c) for c in sorted(checks, key=lambda c: -c.ratio)])
