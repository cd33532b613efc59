"""Strict types at the job-file edge: numbers are numbers, booleans are booleans, strings are
strings (TOML 1.0 gives every value its type: `true`, `1.0` and `"4"` are three different kinds),
text fields hold printable text; a value of the wrong kind is refused with what was expected.
Typed edits in the workbench meet the same loader: what is typed becomes the kind the field takes."""

from __future__ import annotations

import pytest

from fieldcomp.jobs.jobfile import JobFileError, parse_job
from fieldcomp.jobs.typed_text import value_from_text
from fieldcomp.tui.session import EditRejectedError, JobSession

MINIMAL = """[project]
name = "Edges"
[[deck]]
id = "D"
rib_height = "3 in"
rib_top_width = "7 in"
rib_bottom_width = "5 in"
pitch = "12 in"
weight_psf = 2.4
[[slab]]
id = "S"
deck = "D"
topping = "3 1/4 in"
concrete_pcf = 145
fc_ksi = 4.0
[[beam]]
mark = "B-7"
shape = "W18X35"
span = "30 ft"
spacing_left = "10 ft"
spacing_right = "10 ft"
slab = "S"
[beam.studs]
length = "5 1/4 in"
count = 20
"""


def refused(old: str, new: str) -> str:
    with pytest.raises(JobFileError) as info:
        parse_job(MINIMAL.replace(old, new, 1), "strict.toml")
    return str(info.value)


@pytest.mark.parametrize("old, new, where, expected", [
    ('slab = "S"\n[beam', 'slab = "S"\nfy_ksi = true\n[beam', "field 'fy_ksi'", "must be a number, not true or false (got true)"),
    ("count = 20", "count = true", "field 'studs.count'", "must be a whole number, not true or false; or must be 'design'"),
    ("count = 20", "count = 20.0", "field 'studs.count'", "must be a whole number or must be 'design' (got 20.0)"),
    ("fc_ksi = 4.0", 'fc_ksi = "4"', "field 'fc_ksi'", "must be a number, without quotes (got '4')"),
    ("fc_ksi = 4.0", "fc_ksi = 4.0\nlightweight = 1.0", "field 'lightweight'", "must be true or false (got 1.0)"),
    ("fc_ksi = 4.0", 'fc_ksi = 4.0\nlightweight = "true"', "field 'lightweight'", "must be true or false, without quotes"),
    ('mark = "B-7"', "mark = 7", "field 'mark'", "must be text in quotes (got 7)"),
    ('slab = "S"\n[beam', 'slab = "S"\nreference_end = 2024-05-14\n[beam', "field 'reference_end'",
     "TOML reads a bare date or time as a date"),
    ('span = "30 ft"', "span = 30", "field 'span'", "a length needs a unit, e.g. 32'-6 1/2\", 6.5 in or 1650 mm"),
    ('span = "30 ft"', 'span = "30"', "field 'span'", "a length needs a unit"),
    ('span = "30 ft"', "span = true", "field 'span'", "a length needs a unit"),
    ('name = "Edges"', 'name = "Edges"\nmethod = 1', "field 'method'", "must be 'LRFD' or 'ASD'"),
])
def test_a_value_of_the_wrong_kind_is_refused_with_what_was_expected(old, new, where, expected):
    message = refused(old, new)
    assert message.startswith("strict.toml: ")
    assert where in message and expected in message, message


def test_integers_are_numbers():
    """A TOML integer where a number belongs is a number (concrete_pcf = 145 in every shipped job)."""
    assert parse_job(MINIMAL).slab[0].concrete_pcf == 145.0


@pytest.mark.parametrize("text, code", [("B\x1b[31m", "U+001B"), ("B\x00", "U+0000"), ("B\t7", "U+0009"),
                                        ("B\u202e7", "U+202E"), ("B\u2028", "U+2028")])
def test_text_fields_refuse_non_printing_characters(text, code):
    """ECMA-48 control functions (ESC, NUL, HT) and Unicode format and line-separator characters
    (bidi override U+202E, U+2028; Unicode general categories Cc, Cf, Zl) cannot be in a mark."""
    escaped = "".join(c if c.isprintable() else f"\\u{ord(c):04X}" for c in text)  # TOML 1.0 \uXXXX escapes
    message = refused('mark = "B-7"', f'mark = "{escaped}"')
    assert "field 'mark'" in message and f"non-printing character ({code})" in message


def test_lengths_refuse_digits_of_other_scripts_and_underscores():
    """Python's float() reads '١٢' and '1_0' as 12 and 10; a length is written with 0-9 only."""
    for length in ("١٢ ft", "１２ ft", "1_0 ft"):
        assert "write its digits as 0-9" in refused('span = "30 ft"', f'span = "{length}"')


@pytest.mark.parametrize("path, text, value", [
    (("beam", 0, "fy_ksi"), "50", 50.0), (("beam", 0, "studs", "count"), "26", 26),
    (("beam", 0, "studs", "count"), "design", "design"), (("slab", 0, "lightweight"), "True", True),
    (("beam", 0, "span"), "30 ft", "30 ft"), (("beam", 0, "mark"), "12", "12"),
    (("beam", 0, "studs", "count"), "1_0", "1_0"), (("beam", 0, "fy_ksi"), "١٢", "١٢"),
])
def test_typed_text_becomes_the_kind_the_field_takes(path, text, value):
    got = value_from_text(path, text)
    assert got == value and type(got) is type(value)


def test_workbench_edits_meet_the_strict_loader(tmp_path):
    path = tmp_path / "job.toml"
    path.write_text(MINIMAL)
    session = JobSession.open(path)
    assert session.set_text(("beam", 0, "fy_ksi"), "55")
    assert session.job.beam[0].fy_ksi == 55.0
    assert session.set_text(("slab", 0, "lightweight"), "true")
    with pytest.raises(EditRejectedError, match="must be a number"):
        session.set_text(("beam", 0, "fy_ksi"), "true")
    with pytest.raises(EditRejectedError, match="must be a whole number"):
        session.set_text(("beam", 0, "studs", "count"), "1_0")
    with pytest.raises(EditRejectedError, match="must be true or false"):
        session.set_text(("slab", 0, "lightweight"), "1")
