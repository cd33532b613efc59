"""A terminal plot of values along the span: arrays mapped to character cells (rendering only).

Our own look: lines are drawn with thin strokes at three heights per cell, areas are hatched
with diagonal strokes, stations run from the reference end on the left; a value axis can point
down (deflections are positive downward).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Callable

import numpy as np
from rich.style import Style
from rich.text import Text
from textual.widget import Widget

from engine.model.units import format_ft_in

LEVELS = "▔─▁"  # a line at three heights within one cell, top to bottom
SUB = len(LEVELS)
HATCH, HATCH_OVER = "╱", "╳"
STYLES = ("plot--s1", "plot--s2", "plot--s3", "plot--s4", "plot--s5", "plot--s6")


@dataclass(frozen=True, slots=True)
class Series:
    """One curve: `y` at stations `x` (in). `hatch` draws the area between zero and y.
    `over` (same shape as y, bool) marks stations drawn in the warning style."""

    label: str
    x: np.ndarray
    y: np.ndarray
    hatch: bool = False
    over: np.ndarray | None = None
    tone: int = 0  # colour: 0 primary, 1 accent, 2 success, 3 warning, 4 secondary, 5 muted


def append_runs(out: Text, cells: list[tuple[str, Style | None]]) -> None:
    """Append cells to `out`, one span per run of equal style (fewer spans render faster)."""
    run, style = "", None
    for ch, st in cells:
        if st != style and run:
            out.append(run, style=style)
            run = ""
        run, style = run + ch, st
    if run:
        out.append(run, style=style)


class TerminalPlot(Widget):
    """Curves along a beam. Call `plot(...)` with the series; the widget redraws to its size."""

    COMPONENT_CLASSES = {*STYLES, "plot--axis", "plot--over", "plot--marker"}
    DEFAULT_CSS = """
    TerminalPlot { height: 12; min-height: 6; }
    TerminalPlot > .plot--s1 { color: $primary; }
    TerminalPlot > .plot--s2 { color: $accent; }
    TerminalPlot > .plot--s3 { color: $success; }
    TerminalPlot > .plot--s4 { color: $warning; }
    TerminalPlot > .plot--s5 { color: $secondary; }
    TerminalPlot > .plot--s6 { color: $foreground-muted; }
    TerminalPlot > .plot--axis { color: $foreground-muted; }
    TerminalPlot > .plot--over { color: $error; text-style: bold; }
    TerminalPlot > .plot--marker { color: $foreground-muted; }
    """

    def __init__(self, title: str = "", *, id: str | None = None, classes: str | None = None) -> None:
        super().__init__(id=id, classes=classes)
        self.title = title
        self.series: tuple[Series, ...] = ()
        self.span = 0.0
        self.downward = False
        self.unit = ""
        self.fmt: Callable[[float], str] = lambda v: f"{v:,.0f}"
        self.markers: tuple[tuple[float, str], ...] = ()
        self.note = ""

    def plot(self, series: list[Series] | tuple[Series, ...], span: float, *, title: str | None = None,
             unit: str = "", downward: bool = False, fmt: Callable[[float], str] | None = None,
             markers: tuple[tuple[float, str], ...] = (), note: str = "") -> None:
        """Show `series` over a span (in). `downward`: values grow down the screen."""
        self.series, self.span, self.unit, self.downward = tuple(series), float(span), unit, downward
        self.title = self.title if title is None else title
        self.fmt = fmt or self.fmt
        self.markers, self.note = markers, note
        self.refresh()

    def clear(self, note: str) -> None:
        self.series, self.note = (), note
        self.refresh()

    def render(self) -> Text:
        width, height = self.size.width, self.size.height
        head = Text(self.title, style="bold", no_wrap=True, overflow="crop")
        for s in self.series:
            head.append("  ")
            head.append("╱╱" if s.hatch else "━━", style=self.get_component_rich_style(STYLES[s.tone % len(STYLES)]))
            head.append(f" {s.label}")
        if not self.series or self.span <= 0 or width < 20 or height < 5:
            return head + Text("\n" + self.note, style="italic")
        return head + Text("\n") + self._body(width, height - 1)

    def _body(self, width: int, height: int) -> Text:
        rows = height - 2  # value rows; then the station axis and its labels
        lo, hi = self._range()
        ticks = [hi, (hi + lo) / 2.0, lo] if not self.downward else [lo, (hi + lo) / 2.0, hi]
        labels = [self.fmt(v) for v in ticks]
        margin = max(len(t) for t in labels) + 1
        cols = width - margin - 1
        grid: list[list[tuple[str, Style | None]]] = [[(" ", None)] * cols for _ in range(rows)]
        xc = (np.arange(cols) + 0.5) / cols * self.span

        def sub_row(v: np.ndarray) -> np.ndarray:
            frac = (v - lo) / (hi - lo)
            frac = frac if self.downward else 1.0 - frac
            return np.clip(np.round(frac * (rows * SUB - 1)), 0, rows * SUB - 1).astype(int)

        zero = int(sub_row(np.array([0.0]))[0]) // SUB
        over_style = self.get_component_rich_style("plot--over")
        for s in self.series:
            style = self.get_component_rich_style(STYLES[s.tone % len(STYLES)])
            y = np.interp(xc, s.x, s.y)
            over = np.interp(xc, s.x, s.over.astype(float)) > 0.5 if s.over is not None else np.zeros(cols, bool)
            r = sub_row(y)
            for c in range(cols):
                row = r[c] // SUB
                if s.hatch:
                    a, b = sorted((row, zero))
                    for rr in range(a, b + 1):
                        grid[rr][c] = (HATCH_OVER if over[c] else HATCH, over_style if over[c] else style)
                    continue
                prev = r[c - 1] // SUB if c else row
                for rr in range(min(prev, row) + 1, max(prev, row)):
                    grid[rr][c] = ("│", style)
                grid[row][c] = (LEVELS[r[c] % SUB], over_style if over[c] else style)
        axis = self.get_component_rich_style("plot--axis")
        marker = self.get_component_rich_style("plot--marker")
        for at, _ in self.markers:
            c = int(np.clip(at / self.span * cols, 0, cols - 1))
            for rr in range(rows):
                if grid[rr][c][0] == " ":
                    grid[rr][c] = ("┊", marker)
        out = Text(no_wrap=True, overflow="crop")
        tick_rows = {0: labels[0], rows // 2: labels[1], rows - 1: labels[2]}
        for rr in range(rows):
            out.append(tick_rows.get(rr, "").rjust(margin - 1) + " ", style=axis)
            out.append("┤" if rr in tick_rows else "│", style=axis)
            append_runs(out, grid[rr])
            out.append("\n")
        out.append(" " * margin + "└" + "─" * cols + "\n", style=axis)
        out.append(self._station_labels(margin + 1, cols), style=axis)
        return out

    def _range(self) -> tuple[float, float]:
        """Value range with zero in it, padded away from zero only."""
        values = np.concatenate([s.y for s in self.series])
        lo, hi = min(float(np.min(values)), 0.0), max(float(np.max(values)), 0.0)
        scale = max(hi - lo, 1e-9)
        lo = 0.0 if lo > -1e-6 * scale else lo - 0.06 * scale
        hi = 0.0 if hi < 1e-6 * scale else hi + 0.06 * scale
        if hi - lo < 1e-9:
            hi = lo + 1.0
        return lo, hi

    def _station_labels(self, indent: int, cols: int) -> str:
        line = [" "] * (indent + cols + 12)
        marks = [(0.0, format_ft_in(0.0))] + [(at, name) for at, name in self.markers] + [(self.span, format_ft_in(self.span))]
        taken = -1
        for at, name in sorted(marks, key=lambda m: m[0]):
            c = indent + int(np.clip(at / self.span * cols, 0, cols - 1))
            start = max(c - len(name) // 2, indent, taken + 2)
            if at >= self.span:
                start = max(indent + cols - len(name), taken + 2)
            if start + len(name) > len(line):
                continue
            line[start:start + len(name)] = list(name)
            taken = start + len(name)
        return "".join(line).rstrip()
