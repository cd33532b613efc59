"""Length text in and out: feet-inch-fraction and metric strings to inches, inches to ft-in.

Lengths are non-negative here. Output is rounded to the nearest 1/16 in, fraction reduced.
"""

from __future__ import annotations

import math
import re
from functools import lru_cache
from engine.model.errors import FieldcompError

__all__ = ["UnitError", "format_ft_in", "format_inches", "parse_length", "round_to_sixteenth"]

_ACCEPTED_FORMS = (
    "45'-6 1/2\", 45' 6\", 45', 6 1/2\", 3/4\", 45 ft, 45.5 ft, 45 ft 6 1/2 in, "
    "6.5 in, 1 3/4 in, 1650 mm, 16.5 cm, 1.65 m"
)
_NEEDS_UNIT = "a length needs a unit, e.g. 32'-6 1/2\", 6.5 in or 1650 mm"

_MM_PER_INCH = 25.4  # exact: the international inch (1959)
_MM_PER_UNIT = {"mm": 1.0, "cm": 10.0, "m": 1000.0}  # millimetres per unit

# Typographic foot and inch marks (curly quotes, primes) read as ' and ".
_QUOTES = str.maketrans("\u2018\u2019\u2032\u201c\u201d\u2033", "'''\"\"\"")

_DECIMAL = r"(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)"
_MIXED = r"(?P<whole>[0-9]+)\s+(?P<num>[0-9]+)\s*/\s*(?P<den>[0-9]+)"  # 6 1/2
_PLAIN_FRACTION = r"(?P<fnum>[0-9]+)\s*/\s*(?P<fden>[0-9]+)"  # 1/2
_INCHES = rf"(?:{_MIXED}|{_PLAIN_FRACTION}|(?P<dec>{_DECIMAL}))\s*(?:\"|in\.?|inch|inches)"
_FEET = rf"(?P<feet>{_DECIMAL})\s*(?:'|ft\.?|feet|foot)"
# Feet, inches, or feet then inches separated by spaces and at most one dash.
_IMPERIAL = re.compile(rf"(?:{_FEET})?(?:(?(feet)\s*(?:-\s*)?|){_INCHES})?", re.IGNORECASE)
_METRIC = re.compile(rf"(?P<value>{_DECIMAL})\s*(?P<unit>mm|cm|m)", re.IGNORECASE)
_BARE_NUMBER = re.compile(rf"[+-]?{_DECIMAL}(?:\s+[0-9]+\s*/\s*[0-9]+)?|[+-]?[0-9]+\s*/\s*[0-9]+")


class UnitError(FieldcompError, ValueError):
    """A length string that cannot be read; the message names the text and the accepted forms."""


def _fail(text: object, reason: str) -> UnitError:
    shown = repr(text)
    if len(shown) > 60:
        shown = shown[:57] + "..."
    return UnitError(f"cannot read {shown} as a length: {reason}. Accepted forms: {_ACCEPTED_FORMS}")


def _fraction(text: str, num: str, den: str) -> float:
    if float(den) == 0.0:
        raise _fail(text, "a fraction has a zero denominator")
    return float(num) / float(den)


def _inch_amount(text: str, match: re.Match[str]) -> float:
    if match["whole"] is not None:
        fraction = _fraction(text, match["num"], match["den"])
        if fraction >= 1.0:
            raise _fail(text, "the fraction after a whole number must be less than 1")
        return float(match["whole"]) + fraction
    if match["fnum"] is not None:
        return _fraction(text, match["fnum"], match["fden"])
    return float(match["dec"])


def parse_length(text: str) -> float:
    """Read a length written with units and return it in inches.

    Feet/inches with marks or words (curly quotes allowed), fractions, or mm/cm/m; never negative.
    """
    if not isinstance(text, str):
        raise _fail(text, f"expected text, got {type(text).__name__}; {_NEEDS_UNIT}")
    return _parse_text(text)


@lru_cache(maxsize=1024)
def _parse_text(text: str) -> float:
    """`parse_length` of a string (a job repeats the same few lengths many times)."""
    cleaned = text.translate(_QUOTES).strip()
    if not cleaned:
        raise _fail(text, f"it is empty; {_NEEDS_UNIT}")
    if cleaned.startswith("-"):
        raise _fail(text, "lengths cannot be negative")
    if any(ch.isdigit() and not ch.isascii() for ch in cleaned) or "_" in cleaned:
        raise _fail(text, "write its digits as 0-9, without '_'")
    if _BARE_NUMBER.fullmatch(cleaned):
        raise _fail(text, _NEEDS_UNIT)
    metric = _METRIC.fullmatch(cleaned)
    if metric:
        inches = float(metric["value"]) * _MM_PER_UNIT[metric["unit"].lower()] / _MM_PER_INCH
    else:
        imperial = _IMPERIAL.fullmatch(cleaned)
        if imperial is None or not imperial.group(0):
            raise _fail(text, _NEEDS_UNIT)
        feet = float(imperial["feet"]) if imperial["feet"] is not None else 0.0
        has_inches = imperial["whole"] or imperial["fnum"] or imperial["dec"]
        inches_part = _inch_amount(text, imperial) if has_inches else 0.0
        if imperial["feet"] is not None and inches_part >= 12.0:
            raise _fail(text, "the inches after feet must be less than 12")
        inches = 12.0 * feet + inches_part
    if not math.isfinite(inches):
        raise _fail(text, "the number is too large")
    return inches


def round_to_sixteenth(inches: float) -> float:
    """Round to the nearest 1/16 in, halves away from zero."""
    return math.copysign(math.floor(abs(inches) * 16.0 + 0.5), inches) / 16.0


def _sixteenths(inches: float) -> tuple[str, int]:
    if not math.isfinite(inches):
        raise UnitError(f"cannot format {inches!r} as a length: it is not a finite number")
    count = math.floor(abs(inches) * 16.0 + 0.5)
    return ("-" if inches < 0.0 and count else ""), count


def _fraction_text(sixteenths: int) -> str:
    divisor = math.gcd(sixteenths, 16)
    return f"{sixteenths // divisor}/{16 // divisor}"


def format_ft_in(inches: float) -> str:
    """Feet-inch-fraction to the nearest 1/16 in, e.g. 390.5 -> 32'-6 1/2"; 12 -> 1'-0"."""
    sign, count = _sixteenths(inches)
    feet, rest = divmod(count, 192)
    whole, sixteenths = divmod(rest, 16)
    fraction = f" {_fraction_text(sixteenths)}" if sixteenths else ""
    return f"{sign}{feet}'-{whole}{fraction}\""


def format_inches(inches: float) -> str:
    """Inches and fraction to the nearest 1/16 in, e.g. 5.75 -> 5 3/4"; 0.0625 -> 1/16"."""
    sign, count = _sixteenths(inches)
    whole, sixteenths = divmod(count, 16)
    if not sixteenths:
        return f"{sign}{whole}\""
    fraction = _fraction_text(sixteenths)
    return f"{sign}{fraction}\"" if whole == 0 else f"{sign}{whole} {fraction}\""
