"""The findings review as the Findings pane shows it: when each finding was found, and the
remedies of each world it leaves open (before the pour: replacement in kind and the fewest studs;
after it: acceptance by analysis and what each remedy must supply).

Only renders: every line is the one `fieldcomp findings` prints (fieldcomp.views.findings_report),
styled here. User text (notes) is appended as plain text, never read as markup.
"""

from __future__ import annotations

from rich.text import Text

from fieldcomp.views.findings_report import FOUND_TEXT, TIMING_TEXT, finding_rows, printed_at, remedy_lines

FOUND_STYLE = {"before-pour": "green", "after-pour": "magenta", "unknown": "yellow"}
LEVEL_STYLE = {"PASS": "bold green", "REVIEW": "bold yellow", "FAIL": "bold red"}


def _line_style(line: str) -> str:
    """Headings of each world bold and underlined, the options and their labels bold."""
    if line and not line.startswith(" "):
        return "bold underline"
    if line.startswith(("  (a)", "  (b)", "  what each remedy", "  acceptance analysis", "  ribs the concrete")):
        return "bold"
    return ""


def review_text(review) -> Text:
    """The review (engine.pipeline.FieldReview) as styled text."""
    out = Text()
    out.append("Findings apply to: ", style="bold")
    out.append(review.source + "\n")
    out.append("Found: ", style="bold")
    out.append(TIMING_TEXT[review.timing] + "\n", style=FOUND_STYLE[review.timing])
    for row in finding_rows(review):
        out.append(f"  #{row['index']:<2} {row['kind']} x{row['count']}, rib {row['rib']} @ {row['station']}: ")
        out.append(FOUND_TEXT[row["found"]], style=FOUND_STYLE[row["found"]])
        if row["note"]:
            out.append(" - ")
            out.append(row["note"], style="italic")
        out.append("\n")
    for line in remedy_lines(review, printed_at(review.before.beam)):
        for label in ("  method: ", "  re-test: "):
            if line.startswith(label):
                out.append(label, style="bold")
                line = line[len(label):]
        out.append(line + "\n", style=_line_style(line))
    out.append("Field repairs need the engineer of record's approval.", style="dim")
    for word, style in LEVEL_STYLE.items():
        out.highlight_words([word], style=style)
    return out
