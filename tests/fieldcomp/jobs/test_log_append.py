"""fieldcomp/jobs/log_append.py: tables appended to one beam of a job file's text, every other
byte kept. The reference reader is Python's tomllib (TOML 1.0: a `[[beam.finding]]` header adds
an element to the `finding` array of the last `[[beam]]` above it)."""

from __future__ import annotations

import tomllib

import pytest
from hypothesis import given, settings, strategies as st

from fieldcomp.jobs.log_append import AppendError, append_tables, headers

TEXT = '''# job comment
[project]
name = "Demo"
notes = """
[[beam]]
not a header: inside a multi-line string
"""

[[beam]]   # first
mark = "A"
tags = [
  [1, 2],
  "[[beam]] in a string",
]
[[beam.finding]]
kind = "missing"
rib = 2

# --- second beam ---
[[beam]]
mark = "B"
[beam.studs]
diameter = "3/4 in"

[[slab]]
id = "S"
'''


def _added(new: str, old: str) -> list[str]:
    """The one block of lines `new` has and `old` lacks; fails if anything else differs."""
    lines, was = new.split("\n"), old.split("\n")
    cut = next(i for i, (a, b) in enumerate(zip(lines, was)) if a != b)
    extra = len(lines) - len(was)
    assert lines[:cut] + lines[cut + extra:] == was
    return lines[cut:cut + extra]


def test_headers_skip_multi_line_strings_and_arrays():
    assert [(h.name, h.array) for h in headers(TEXT)] == [
        ("project", False), ("beam", True), ("beam.finding", True), ("beam", True), ("beam.studs", False),
        ("slab", True)]


@pytest.mark.parametrize("index, mark", [(0, "A"), (1, "B")])
def test_a_finding_appended_to_either_beam_lands_there_and_nothing_else_changes(index, mark):
    before = tomllib.loads(TEXT)
    new = append_tables(TEXT.encode(), index, 2, [("finding", {"kind": "short", "rib": 4})]).decode()
    after = tomllib.loads(new)
    assert after["beam"][index]["finding"][-1] == {"kind": "short", "rib": 4}
    after["beam"][index]["finding"].pop()
    if not after["beam"][index]["finding"]:
        del after["beam"][index]["finding"]
    assert after == before
    assert _added(new, TEXT) == ['[[beam.finding]]', 'kind = "short"', "rib = 4"]  # and nothing else changed
    # the new table comes before the comment leading into the next beam
    assert index == 1 or new.index("rib = 4") < new.index("# --- second beam ---")


def test_a_file_without_a_last_line_ending_gets_one_then_the_table():
    text = '[project]\nname = "x"\n[[beam]]\nmark = "A"'
    new = append_tables(text.encode(), 0, 1, [("report", {"number": "SI-1"})]).decode()
    assert new == text + '\n[[beam.report]]\nnumber = "SI-1"\n'


def test_beams_written_inline_are_refused():
    with pytest.raises(AppendError, match="0 \\[\\[beam\\]\\] headers for 1 beams"):
        append_tables(b'beam = [{mark = "A"}]\n', 0, 1, [("finding", {"kind": "missing", "rib": 1})])


@settings(max_examples=60, deadline=None)
@given(note=st.text(st.characters(blacklist_categories=("Cs",)), max_size=40),
       crlf=st.booleans(), bom=st.booleans())
def test_any_note_reads_back_and_the_rest_of_the_file_is_kept_byte_for_byte(note, crlf, bom):
    text = TEXT.replace("\n", "\r\n") if crlf else TEXT
    data = (b"\xef\xbb\xbf" if bom else b"") + text.encode()
    new = append_tables(data, 0, 2, [("finding", {"kind": "missing", "rib": 3, "note": note})])
    assert new.startswith(b"\xef\xbb\xbf") == bom
    body = new.decode("utf-8-sig")
    assert tomllib.loads(body)["beam"][0]["finding"][-1]["note"] == note
    added = _added(body, text)
    assert len(added) == 4 and all(line.endswith("\r") for line in added) == crlf
