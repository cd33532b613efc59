"""A drawn strip of one beam: ruler, studs stacked per rib, deck ribs, the steel, the supports.

Rendering only: stations, counts and kinds come from the engine's layout and findings.
Our own glyphs: a stud is a filled disc, a missing stud a ring, a failed one a crossed ring,
a proposed repair a diamond; deck ribs hang below the deck line as short teeth.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from rich.style import Style
from rich.text import Text
from textual.geometry import Size
from textual.widget import Widget

from engine.model.units import format_ft_in
from fieldcomp.tui.widgets.plot import append_runs

GLYPHS = {"stud": "●", "missing": "○", "failed-test": "⊗", "weak-side": "◐", "off-rib": "◌",
          "short": "▿", "added": "◆", "repair": "◇", "anchor": "▪"}
KIND_STYLE = {"stud": "strip--stud", "missing": "strip--bad", "failed-test": "strip--bad", "weak-side": "strip--warn",
              "off-rib": "strip--warn", "short": "strip--warn", "added": "strip--good", "repair": "strip--repair",
              "anchor": "strip--deck"}
LEGEND = (("stud", "stud"), ("missing", "missing"), ("failed-test", "failed test"), ("weak-side", "weak side"),
          ("off-rib", "off rib"), ("short", "short"), ("added", "added"), ("repair", "to add"),
          ("anchor", "deck weld, no stud"))


@dataclass(frozen=True, slots=True)
class StripMark:
    """`count` studs of one `kind` at station `x` (in)."""

    x: float
    count: int
    kind: str = "stud"


class StudStrip(Widget):
    """Call `draw(span, ribs, marks, ...)`; the strip scales the span to the widget's width."""

    COMPONENT_CLASSES = {"strip--stud", "strip--bad", "strip--warn", "strip--good", "strip--repair",
                         "strip--deck", "strip--steel", "strip--axis", "strip--keepout"}
    DEFAULT_CSS = """
    StudStrip { height: auto; }
    StudStrip > .strip--stud { color: $foreground; }
    StudStrip > .strip--bad { color: $error; text-style: bold; }
    StudStrip > .strip--warn { color: $warning; }
    StudStrip > .strip--good { color: $success; }
    StudStrip > .strip--repair { color: $accent; text-style: bold; }
    StudStrip > .strip--deck { color: $foreground-muted; }
    StudStrip > .strip--steel { color: $primary; }
    StudStrip > .strip--axis { color: $foreground-muted; }
    StudStrip > .strip--keepout { color: $foreground-muted; text-style: dim; }
    """

    def __init__(self, *, id: str | None = None, classes: str | None = None) -> None:
        super().__init__(id=id, classes=classes)
        self.span = 0.0
        self.ribs = np.empty(0)
        self.marks: tuple[StripMark, ...] = ()
        self.ends = ("", "")
        self.keep_out = (0.0, 0.0)
        self.note = ""

    def draw(self, span: float, ribs: np.ndarray, marks: list[StripMark] | tuple[StripMark, ...], *,
             ends: tuple[str, str] = ("", ""), keep_out: tuple[float, float] = (0.0, 0.0), note: str = "") -> None:
        self.span, self.ribs, self.marks = float(span), np.asarray(ribs, float), tuple(marks)
        self.ends, self.keep_out, self.note = ends, keep_out, note
        self.refresh()

    def clear(self, note: str) -> None:
        self.span, self.marks, self.note = 0.0, (), note
        self.refresh()

    def get_content_height(self, container: Size, viewport: Size, width: int) -> int:
        return self._text(width).plain.count("\n") + 1

    def render(self) -> Text:
        return self._text(self.size.width)

    def _text(self, width: int) -> Text:
        if self.span <= 0 or width < 20:
            return Text(self.note, style="italic")
        st = self.get_component_rich_style
        cols = width - 2
        col = lambda x: int(np.clip(x / self.span * cols, 0, cols - 1))  # noqa: E731
        stacks: list[list[str]] = [[] for _ in range(cols)]
        for m in sorted(self.marks, key=lambda m: (m.kind != "stud", m.x)):
            stacks[col(m.x)].extend([m.kind] * m.count)
        height = max(1, min(6, max((len(s) for s in stacks), default=0)))
        out = Text(no_wrap=True, overflow="crop")
        left, right = self.ends
        out.append(f"◀ {left}", style=st("strip--axis"))
        tail = f"{right} ▶"
        out.append(" " * max(1, width - len(left) - len(tail) - 3) + tail + "\n", style=st("strip--axis"))
        for level in range(height, 0, -1):
            cells: list[tuple[str, Style | None]] = [(" ", None)]
            for c in range(cols):
                stack = stacks[c]
                if len(stack) >= level:
                    extra = len(stack) > height and level == height
                    kind = stack[level - 1]
                    cells.append(("+" if extra else GLYPHS.get(kind, "?"), st(KIND_STYLE.get(kind, "strip--stud"))))
                else:
                    cells.append((" ", None))
            append_runs(out, cells)
            out.append("\n")
        rib_cols = {col(x) for x in self.ribs}
        lo, hi = col(self.keep_out[0]), col(self.span - self.keep_out[1])
        cells = [(" ", None)]
        for c in range(cols):
            keep = (self.keep_out[0] > 0 and c < lo) or (self.keep_out[1] > 0 and c > hi)
            cells.append(("┄", st("strip--keepout")) if keep else ("▔", st("strip--deck")))
        append_runs(out, cells)
        out.append("\n ")
        out.append("".join("▾" if c in rib_cols else " " for c in range(cols)), style=st("strip--deck"))
        out.append("\n")
        out.append("▲" + "━" * cols + "▲\n", style=st("strip--steel"))
        out.append(self._ruler(cols), style=st("strip--axis"))
        if self.note:
            out.append("\n" + self.note, style="italic")
        return out

    def _ruler(self, cols: int) -> str:
        feet = self.span / 12.0
        step = next(s for s in (1, 2, 5, 10, 20, 25, 50) if feet / s * 8 <= cols)
        line = [" "] * (cols + 2)
        taken = -2
        for ft in np.arange(0.0, feet + 1e-9, step):
            label = format_ft_in(ft * 12.0).split("-")[0]
            c = 1 + int(round(ft * 12.0 / self.span * (cols - 1)))
            c = min(c, len(line) - len(label))
            if c <= taken + 1:
                continue
            line[c:c + len(label)] = list(label)
            taken = c + len(label)
        return "".join(line).rstrip()


def legend(kinds: set[str]) -> Text:
    """A one-line key of the glyphs in use."""
    out = Text()
    for kind, words in LEGEND:
        if kind in kinds:
            out.append(f"{GLYPHS[kind]} {words}   ")
    return out
