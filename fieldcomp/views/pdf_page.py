"""The frame of every PDF sheet fieldcomp prints (fpdf2, pure Python): a border, a title block
along the bottom with the job, the sheet's title, its number in the set, the revision and issue
date and a drawn / checked / approved block, and the caution above it. Landscape US letter
(11 x 8.5 in), drawn in inches; the core Helvetica font, so text is kept to Latin-1."""

from __future__ import annotations

from dataclasses import dataclass

from fpdf import FPDF

from engine.model.text import printable
from fieldcomp import __version__

PAGE_W, PAGE_H = 11.0, 8.5
MARGIN = 0.35
BLOCK_H = 0.78  # title block height
CAUTION_H = 0.34
TOP = MARGIN + 0.1
BOTTOM = PAGE_H - MARGIN - BLOCK_H - CAUTION_H  # lowest y a drawing may use
LEFT, RIGHT = MARGIN + 0.12, PAGE_W - MARGIN - 0.12
INK = (29, 42, 56)
GREY = (110, 120, 132)


def latin(text: object) -> str:
    """Printable text the core PDF fonts can set (Latin-1; anything else becomes '?')."""
    return printable(str(text)).encode("latin-1", "replace").decode("latin-1")


@dataclass(frozen=True, slots=True)
class Issue:
    """What every sheet of a set carries: the job, the set's sheet-number prefix (e.g. 'ES' for
    erector sheets), the revision and issue date, and the caution."""

    job: str
    prefix: str
    revision: str
    date: str
    caution: str


class SheetPdf(FPDF):
    """A set of sheets: `sheet(title)` starts a page with its frame and returns the drawing area
    (x0, y0, x1, y1) in inches; sheet numbers read 'ES-2 of 7'."""

    def __init__(self, issue: Issue, set_title: str):
        super().__init__(orientation="L", unit="in", format="letter")
        self.issue, self.set_name = issue, set_title
        self.set_auto_page_break(False)
        self.set_margins(MARGIN, MARGIN, MARGIN)
        self.set_title(latin(f"{set_title} - {issue.job}"))
        self.set_creator(f"fieldcomp {__version__}")
        self.alias_nb_pages("{nb}")

    def sheet(self, title: str) -> tuple[float, float, float, float]:
        self.add_page()
        self.set_draw_color(*INK)
        self.set_text_color(*INK)
        self.set_line_width(0.02)
        self.rect(MARGIN, MARGIN, PAGE_W - 2 * MARGIN, PAGE_H - 2 * MARGIN)
        self._caution()
        self._title_block(title)
        return LEFT, TOP, RIGHT, BOTTOM - 0.05

    def _caution(self) -> None:
        y = PAGE_H - MARGIN - BLOCK_H - CAUTION_H
        self.set_line_width(0.012)
        self.line(MARGIN, y, PAGE_W - MARGIN, y)
        self.set_xy(LEFT, y + 0.04)
        self.set_font("Helvetica", "", 7)
        self.multi_cell(RIGHT - LEFT, 0.12, latin("CAUTION: " + self.issue.caution))

    def _title_block(self, title: str) -> None:
        y = PAGE_H - MARGIN - BLOCK_H
        self.set_line_width(0.02)
        self.line(MARGIN, y, PAGE_W - MARGIN, y)
        number = f"{self.issue.prefix}-{self.page_no()} of {{nb}}"
        cells = [("JOB", self.issue.job, 2.4), ("SHEET", f"{self.set_name}: {title}", 2.9), ("SHEET NO.", number, 1.0),
                 ("REV.", self.issue.revision, 0.45), ("ISSUED", self.issue.date, 0.85)]
        x = MARGIN
        for key, value, width in cells:
            self._cell(x, y, width, key, value)
            x += width
            self.line(x, y, x, PAGE_H - MARGIN)
        rest = PAGE_W - MARGIN - x
        for k, who in enumerate(("DRAWN", "CHECKED", "APPROVED")):
            cx = x + k * rest / 3
            if k:
                self.line(cx, y, cx, PAGE_H - MARGIN)
            self.set_font("Helvetica", "", 6)
            self.set_text_color(*GREY)
            self.text(cx + 0.06, y + 0.14, who)
            self.text(cx + 0.06, y + 0.45, "name ________")
            self.text(cx + 0.06, y + 0.66, "date ________")
            self.set_text_color(*INK)
        self.set_font("Helvetica", "", 5)
        self.set_text_color(*GREY)
        self.text(x + 0.06, PAGE_H - MARGIN - 0.03, f"made with fieldcomp {__version__}")
        self.set_text_color(*INK)

    def _cell(self, x: float, y: float, width: float, key: str, value: str) -> None:
        self.set_font("Helvetica", "", 6)
        self.set_text_color(*GREY)
        self.text(x + 0.06, y + 0.14, key)
        self.set_text_color(*INK)
        self.set_font("Helvetica", "B", 9)
        self.set_xy(x + 0.04, y + 0.2)
        self.multi_cell(width - 0.08, 0.15, latin(value), max_line_height=0.15)

    def words(self, x: float, y: float, text: str, size: float = 9, style: str = "", grey: bool = False) -> None:
        """Set one line of text with its baseline at (x, y)."""
        self.set_font("Helvetica", style, size)
        self.set_text_color(*(GREY if grey else INK))
        self.text(x, y, latin(text))
        self.set_text_color(*INK)

    def paragraph(self, x: float, y: float, width: float, text: str, size: float = 8, style: str = "") -> float:
        """Wrap text into `width` from top y; returns the y below it."""
        self.set_font("Helvetica", style, size)
        self.set_xy(x, y)
        self.multi_cell(width, size / 72 * 1.25, latin(text))
        return self.get_y()

    def fit(self, text: str, width: float) -> str:
        """`text` in Latin-1, shortened with '...' to fit `width` in the current font."""
        t = latin(text)
        if self.get_string_width(t) <= width:
            return t
        while t and self.get_string_width(t + "...") > width:
            t = t[:-1]
        return t + "..."

    def wrap(self, text: str, width: float) -> list[str]:
        """`text` in Latin-1 broken into lines of at most `width` in the current font (words kept
        whole unless one alone is wider)."""
        lines: list[str] = []
        line = ""
        for word in latin(text).split():
            trial = f"{line} {word}".strip()
            if line and self.get_string_width(trial) > width:
                lines.append(line)
                line = word
            else:
                line = trial
        return [*lines, line] if line or not lines else lines

    def output_bytes(self) -> bytes:
        return bytes(self.output())


def fit_scale(length: float, room: float) -> tuple[float, str]:
    """The largest usual drawing scale showing `length` (in) within `room` (in of paper):
    (paper inches per real inch, its name as printed, e.g. '3/16" = 1\'-0" (1:64)')."""
    for ratio, name in ((12, '1" = 1\'-0"'), (16, '3/4" = 1\'-0"'), (24, '1/2" = 1\'-0"'), (32, '3/8" = 1\'-0"'),
                        (48, '1/4" = 1\'-0"'), (64, '3/16" = 1\'-0"'), (96, '1/8" = 1\'-0"'), (128, '3/32" = 1\'-0"'),
                        (192, '1/16" = 1\'-0"'), (384, '1/32" = 1\'-0"'), (768, '1/64" = 1\'-0"')):
        if length / ratio <= room:
            return 1.0 / ratio, f"{name} (1:{ratio})"
    ratio = int(length / room) + 1
    return 1.0 / ratio, f"1:{ratio}"
