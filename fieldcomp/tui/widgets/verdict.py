"""The one verdict vocabulary of the workbench: pass / review / fail (the engine's levels), each
with its governing ratio, in the same words and colours in the beam list, the pane heads and the
check tables. "error" marks a part the engine could not compute, "..." one not computed yet."""

from __future__ import annotations

from rich.text import Text

from engine.finished.evaluate import governing_check
from fieldcomp.tui.outcome import BeamOutcome, Part
from fieldcomp.views.numbers import ratio_text

STYLES = {"pass": "green", "review": "bold yellow", "fail": "bold red", "error": "bold magenta", "...": "dim"}
PENDING = "..."


def word(level: str, *, badge: bool = False) -> Text:
    """The level as a word ("pass", "review", "fail"); `badge`: reversed, for a pane head."""
    style = STYLES.get(level, "dim")
    return Text(f" {level} ", style=f"{style} reverse") if badge else Text(level, style=style)


def verdict_cell(level: str, ratio: float | None) -> Text:
    """'fail 1.67': the level and the governing ratio, as a beam-list cell."""
    out = word(level)
    if ratio is not None:
        out.append(f" {ratio_text(ratio)}", style="")
    return out


def part_cell(part: Part | None) -> Text:
    """The cell of one part of a beam (finished, construction, as built): its verdict and governing
    ratio, "error" when the engine raised, "" when the part does not apply."""
    if part is None:
        return Text(PENDING, style="dim")
    if part.value is None:
        return word("error") if part.error else Text("")
    checks = part.value.checks
    return verdict_cell(str(part.value.verdict), governing_check(checks).ratio if checks else None)


def beam_cells(outcome: BeamOutcome | None) -> tuple[Text, Text, Text]:
    """(as designed, construction, as built) cells of the beam list."""
    if outcome is None:
        return part_cell(None), part_cell(None), part_cell(None)
    return part_cell(outcome.finished), part_cell(outcome.construction), part_cell(outcome.as_built)
