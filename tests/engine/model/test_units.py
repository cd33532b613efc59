"""engine.model.units: length strings in, ft-in-fraction out.

Check values are hand arithmetic: 1 ft = 12 in; 1 in = 25.4 mm exactly (international inch, 1959).
"""

from __future__ import annotations

import math
from fractions import Fraction

import pytest
from hypothesis import given
from hypothesis import strategies as st

from engine.model.units import UnitError, format_ft_in, format_inches, parse_length, round_to_sixteenth

PARSE_CASES = [
    # (text, inches)  -- every value: feet x 12 + inches, by hand
    ("45'-6 1/2\"", 546.5),  # 45 x 12 + 6.5
    ("45'-6\"", 546.0),  # 45 x 12 + 6
    ("45' 6\"", 546.0),
    ("45'6\"", 546.0),
    ("45'", 540.0),  # 45 x 12
    ("6\"", 6.0),
    ("6 1/2\"", 6.5),
    ("3/4\"", 0.75),
    ("6.5\"", 6.5),
    ("45 ft", 540.0),
    ("45.5 ft", 546.0),  # 45.5 x 12
    ("45 ft 6 in", 546.0),
    ("45 ft 6 1/2 in", 546.5),
    ("45 FT 6 IN", 546.0),
    ("6.5 in", 6.5),
    ("3/4 in", 0.75),
    ("1 3/4 in", 1.75),
    ("0'-0 1/16\"", 0.0625),  # 1/16
    ("32'-6 1/2\"", 390.5),  # 32 x 12 + 6.5
    ("  45'-6 1/2\"  ", 546.5),  # surrounding whitespace
    ("45\u2019-6 1/2\u201d", 546.5),  # curly quotes
    ("45\u2032 6\u2033", 546.0),  # prime marks
    ("1650 mm", 1650 / 25.4),  # 64.96 in
    ("16.5 cm", 165 / 25.4),  # 165 mm
    ("1.65 m", 1650 / 25.4),  # 1650 mm
    ("1650mm", 1650 / 25.4),
]


@pytest.mark.parametrize(("text", "inches"), PARSE_CASES)
def test_parse_length_reads_each_accepted_form(text: str, inches: float) -> None:
    assert parse_length(text) == pytest.approx(inches, rel=1e-12, abs=1e-12)


BAD_TEXT = [
    ("45", "needs a unit"),  # bare number
    ("6.5", "needs a unit"),
    ("6 1/2", "needs a unit"),
    ("3/4", "needs a unit"),
    ("", "empty"),
    ("   ", "empty"),
    ("nan ft", "needs a unit"),
    ("inf in", "needs a unit"),
    ("45 yd", "needs a unit"),  # unknown unit
    ("ft", "needs a unit"),
    ("45'-", "needs a unit"),  # dangling separator
    ("garbage", "needs a unit"),
    ("-6\"", "negative"),
    ("-45 ft", "negative"),
    ("3/0\"", "zero denominator"),
    ("6 1/0 in", "zero denominator"),
    ("6 5/4\"", "less than 1"),  # improper fraction after a whole number
    ("45'-14\"", "less than 12"),  # inches after feet
    ("9" * 400 + " ft", "too large"),  # overflows a float
]


@pytest.mark.parametrize(("text", "reason"), BAD_TEXT)
def test_parse_length_rejects_bad_text_naming_it(text: str, reason: str) -> None:
    with pytest.raises(UnitError) as caught:
        parse_length(text)
    message = str(caught.value)
    assert reason in message
    assert repr(text)[:20] in message  # names the offending text
    assert "1650 mm" in message  # and the accepted forms


@pytest.mark.parametrize("value", [45, 6.5, float("nan"), float("inf"), None, b"45 ft"])
def test_parse_length_rejects_non_text(value: object) -> None:
    with pytest.raises(UnitError, match="expected text"):
        parse_length(value)  # type: ignore[arg-type]


def test_unit_error_is_a_value_error() -> None:
    assert issubclass(UnitError, ValueError)


FT_IN_CASES = [
    # (inches, text)  -- nearest 1/16 in, by hand
    (390.5, "32'-6 1/2\""),  # 32 x 12 = 384; + 6.5
    (12.0, "1'-0\""),
    (0.75, "0'-0 3/4\""),
    (395.99, "33'-0\""),  # 395.99 rounds to 396 = 33 ft exactly: carry into feet
    (0.0, "0'-0\""),
    (11.97, "1'-0\""),  # 11.97 x 16 = 191.5 -> 192/16 = 12 in: carry
    (546.5, "45'-6 1/2\""),
    (100.0 + 5 / 16, "8'-4 5/16\""),  # 96 + 4 + 5/16
    (-390.5, "-32'-6 1/2\""),
    (-0.01, "0'-0\""),  # rounds to zero: no sign
]


@pytest.mark.parametrize(("inches", "text"), FT_IN_CASES)
def test_format_ft_in(inches: float, text: str) -> None:
    assert format_ft_in(inches) == text


INCH_CASES = [
    (5.75, "5 3/4\""),
    (0.0625, "1/16\""),
    (2.0, "2\""),
    (0.0, "0\""),
    (1 / 32, "1/16\""),  # exactly half a sixteenth rounds up
    (1 / 32 - 1e-9, "0\""),
    (12.5, "12 1/2\""),  # no conversion to feet
    (-5.75, "-5 3/4\""),
]


@pytest.mark.parametrize(("inches", "text"), INCH_CASES)
def test_format_inches(inches: float, text: str) -> None:
    assert format_inches(inches) == text


@pytest.mark.parametrize("bad", [float("nan"), float("inf"), -float("inf")])
def test_formatters_reject_non_finite(bad: float) -> None:
    with pytest.raises(UnitError):
        format_ft_in(bad)
    with pytest.raises(UnitError):
        format_inches(bad)


lengths = st.floats(min_value=0.0, max_value=1.0e6, allow_nan=False, allow_infinity=False)


@given(lengths)
def test_ft_in_round_trip_within_half_a_sixteenth(inches: float) -> None:
    assert abs(parse_length(format_ft_in(inches)) - inches) <= 1 / 32 + 1e-9


@given(lengths)
def test_inches_round_trip_within_half_a_sixteenth(inches: float) -> None:
    assert abs(parse_length(format_inches(inches)) - inches) <= 1 / 32 + 1e-9


@given(st.floats(min_value=-1.0e6, max_value=1.0e6, allow_nan=False))
def test_round_to_sixteenth_is_a_nearest_sixteenth(inches: float) -> None:
    rounded = round_to_sixteenth(inches)
    assert abs(rounded - inches) <= 1 / 32 + 1e-9
    assert (rounded * 16).is_integer()


@given(st.integers(0, 5000), st.integers(0, 11), st.integers(0, 15))
def test_exact_ft_in_text_survives_parse_and_format(
    feet: int, inches: int, sixteenths: int
) -> None:
    # Canonical text built with fractions.Fraction (reduced independently of engine.model.units).
    part = Fraction(sixteenths, 16)
    fraction = f" {part.numerator}/{part.denominator}" if sixteenths else ""
    text = f"{feet}'-{inches}{fraction}\""
    value = parse_length(text)
    assert value == 12 * feet + inches + sixteenths / 16  # exact in binary floating point
    assert format_ft_in(value) == text


@given(st.floats(min_value=0.0, max_value=1.0e5), st.sampled_from(["mm", "cm", "m"]))
def test_metric_scales_by_the_exact_inch(value: float, unit: str) -> None:
    text = f"{value:.4f} {unit}"
    mm = float(f"{value:.4f}") * {"mm": 1.0, "cm": 10.0, "m": 1000.0}[unit]
    assert math.isclose(parse_length(text), mm / 25.4, rel_tol=1e-12, abs_tol=1e-12)
