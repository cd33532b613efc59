"""Job-file text patched in place (fieldcomp.jobs.toml_text, and block by block:
fieldcomp.jobs.toml_top_level): only the values that differ are
rewritten, rows come and go as whole blocks, comments, spacing, line endings and the byte-order
mark stay. The reference for "the same document" is the TOML 1.0.0 specification as read by
Python's tomllib (every patched text is parsed back and compared with the edited job), and for
"what changed" a line diff (difflib) of the old and new text."""

from __future__ import annotations

import difflib
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from fieldcomp.jobs.jobfile import parse_job
from fieldcomp.jobs.model import FindingIn
from fieldcomp.jobs.toml_top_level import patch_blocks, split_blocks
from fieldcomp.jobs.toml_text import BOM, join_form, minimal, patch_text, split_form

# An invented job written the way people write by hand: comments everywhere, aligned values,
# a literal string, dotted keys, an inline array of findings, whole numbers for floats.
ODD = """\
# hand-written job, odd spacing on purpose
[project]
name   =   'Dockside shed'     # literal string
method="LRFD"

[[slab]]
id = "S1"
topping = "6 in"
concrete_pcf = 145          # whole number for a float field
fc_ksi = 4

[[beam]]
mark = "X-1"
shape = "W16X26"
span = "24 ft"
spacing_left = "8 ft"
spacing_right = "8 ft"
slab = "S1"
studs.length = "5 in"
studs.count = 12
finding = [{kind = "missing", rib = 3}, {kind = "short", rib = 7, note = "bent"}]

# the second beam
[[beam]]
mark = "X-2"
shape = "W16X26"
span = "24 ft"
edge_left = "1 ft"
spacing_right = "8 ft"
slab = "S1"
[beam.studs]
length = "5 in"
count = 10
"""


def changed_lines(old: str, new: str) -> list[str]:
    """The lines removed and added, as difflib's ndiff marks them."""
    return [line for line in difflib.ndiff(old.splitlines(True), new.splitlines(True)) if line[:1] in "+-"]


def edited(job, beam: int, **changes):
    beams = list(job.beam)
    beams[beam] = beams[beam].model_copy(update=changes)
    return job.model_copy(update={"beam": beams})


def patched(text: str, new) -> str:
    out = patch_text(text, parse_job(text.removeprefix(BOM)), new)
    assert parse_job(out.removeprefix(BOM)) == new  # the text says what the edited job says
    return out


def test_unedited_text_comes_back_byte_for_byte():
    job = parse_job(ODD)
    assert patch_text(ODD, job, job) is ODD


@pytest.mark.parametrize("form", ["lf", "crlf", "bom", "bom+crlf"])
def test_line_endings_and_byte_order_mark_are_kept(form):
    text = ODD.replace("\n", "\r\n") if "crlf" in form else ODD
    text = BOM + text if "bom" in form else text
    new = edited(parse_job(ODD), 0, span="25 ft")
    out = patched(text, new)
    assert out.startswith(BOM) == ("bom" in form)
    if "crlf" in form:
        assert out.count("\r\n") == out.count("\n")
    else:
        assert "\r" not in out
    assert changed_lines(text, out) == [f'- span = "24 ft"{chr(13) if "crlf" in form else ""}\n',
                                        f'+ span = "25 ft"{chr(13) if "crlf" in form else ""}\n']


def test_split_and_join_form_are_inverse():
    for text in (ODD, BOM + ODD, ODD.replace("\n", "\r\n"), "a = 1\r\nb = 2\n"):  # the last: mixed, left alone
        assert join_form(*split_form(text)) == text


def test_a_value_keeps_its_line_comment_and_the_file_its_forms():
    job = parse_job(ODD)
    new = job.model_copy(update={"project": job.project.model_copy(update={"name": "Dockside shed 2"})})
    new = new.model_copy(update={"slab": [new.slab[0].model_copy(update={"concrete_pcf": 150.0})]})
    assert changed_lines(ODD, patched(ODD, new)) == [
        "- name   =   'Dockside shed'     # literal string\n", "+ name   =   'Dockside shed 2'     # literal string\n",
        "- concrete_pcf = 145          # whole number for a float field\n",
        "+ concrete_pcf = 150          # whole number for a float field\n"]


def test_a_dotted_key_is_edited_where_it_is():
    job = parse_job(ODD)
    studs = job.beam[0].studs.model_copy(update={"count": 14})
    assert changed_lines(ODD, patched(ODD, edited(job, 0, studs=studs))) == ["- studs.count = 12\n", "+ studs.count = 14\n"]


def test_switching_a_key_for_its_partner_is_one_line_in_place():
    job = parse_job(ODD)
    beam = job.beam[1].model_copy(update={"edge_left": None, "spacing_left": "9 ft"})
    out = patched(ODD, job.model_copy(update={"beam": [job.beam[0], beam]}))
    assert changed_lines(ODD, out) == ['- edge_left = "1 ft"\n', '+ spacing_left = "9 ft"\n']
    assert out.index('spacing_left = "9 ft"') < out.index('spacing_right = "8 ft"', out.index("X-2"))


def test_inline_findings_gain_and_lose_rows_on_their_own_line():
    job = parse_job(ODD)
    rows = list(job.beam[0].finding)
    out = patched(ODD, edited(job, 0, finding=rows[1:] + [FindingIn(kind="added", rib=9)]))
    assert changed_lines(ODD, out) == [
        '- finding = [{kind = "missing", rib = 3}, {kind = "short", rib = 7, note = "bent"}]\n',
        '+ finding = [{kind = "short", rib = 7, note = "bent"}, {kind = "added", rib = 9}]\n']


def test_clearing_a_key_removes_its_line_and_nothing_else():
    job = parse_job(ODD)
    findings = [job.beam[0].finding[0], job.beam[0].finding[1].model_copy(update={"note": ""})]
    new = edited(job, 0, finding=findings)
    out = patched(ODD, new)
    assert 'note = "bent"' not in out and len(changed_lines(ODD, out)) == 2


def test_a_new_table_holds_only_what_is_not_a_default():
    job = parse_job(ODD)
    camber = job.project.camber.model_copy(update={"fraction": 0.7})
    out = patched(ODD, job.model_copy(update={"project": job.project.model_copy(update={"camber": camber})}))
    assert changed_lines(ODD, out) == ["+ [project.camber]\n", "+ fraction = 0.7\n"]


def test_minimal_rows_leave_defaults_out():
    row = FindingIn(kind="missing", rib=4, count=1, note="", history=[])  # every default given explicitly
    assert minimal(row) == {"kind": "missing", "rib": 4}


def test_removing_the_second_beam_takes_its_comment_with_it():
    job = parse_job(ODD)
    out = patched(ODD, job.model_copy(update={"beam": job.beam[:1]}))
    assert "# the second beam" not in out and "X-2" not in out
    assert out == ODD[:ODD.index("\n# the second beam")]  # the gap before it goes too


def test_adding_a_beam_after_the_last_keeps_the_blank_line_between_beams():
    job = parse_job(ODD)
    third = job.beam[1].model_copy(update={"mark": "X-3"})
    out = patched(ODD, job.model_copy(update={"beam": [*job.beam, third]}))
    added = [line for line in changed_lines(ODD, out)]
    assert all(line.startswith("+ ") for line in added)
    assert out.startswith(ODD) and out[len(ODD):].startswith('\n[[beam]]\nmark = "X-3"\n')


DEMO_TEXT = (Path(__file__).resolve().parents[3] / "jobs" / "harbor_row_level3.toml").read_text()
ROW_EDITS = st.lists(st.tuples(st.sampled_from(["add", "remove", "note"]), st.integers(0, 6), st.integers(0, 5)),
                     min_size=1, max_size=8)


@settings(max_examples=60, deadline=None)
@given(ROW_EDITS)
def test_rows_added_removed_and_edited_at_random_read_back_as_the_edited_job(edits):
    """Any mix of added, removed and edited finding rows and removed beams is patched (never the
    plain fallback) into text that tomllib reads as the edited job, keeping every comment of a
    row that stays."""
    job = parse_job(DEMO_TEXT)
    beams = list(job.beam)
    held = {on.girder for x in job.beam for on in (x.left_on, x.right_on) if on is not None}  # girders stay
    for what, pick, i in edits:
        b = pick % len(beams)
        rows = list(beams[b].finding)
        if what == "add":
            rows.insert(min(i, len(rows)), FindingIn(kind="added", rib=1 + i, note=f"added {i}"))
        elif what == "remove" and rows:
            del rows[i % len(rows)]
        elif what == "remove" and len(beams) > 1 and beams[b].mark not in held:
            del beams[b]
            continue
        elif rows:
            rows[i % len(rows)] = rows[i % len(rows)].model_copy(update={"note": f"edited {i}"})
        beams[b] = beams[b].model_copy(update={"finding": rows})
    new = job.model_copy(update={"beam": beams})
    out = patched(DEMO_TEXT, new)
    kept = {b.mark for b in beams}
    for line in DEMO_TEXT.splitlines():
        if line.startswith("[[beam]]") and "#" in line:
            mark = DEMO_TEXT.split(line, 1)[1].split('mark = "', 1)[1].split('"', 1)[0]
            assert (line in out) == (mark in kept), line


@settings(max_examples=60, deadline=None)
@given(ROW_EDITS)
def test_block_by_block_patching_writes_what_the_whole_document_patch_writes(edits):
    """The fast path (only the changed top-level blocks parsed) and the whole-document patch
    give the same text; so the fast path inherits everything tested of the other."""
    job = parse_job(DEMO_TEXT)
    beams = list(job.beam)
    held = {on.girder for x in job.beam for on in (x.left_on, x.right_on) if on is not None}  # girders stay
    for n, (what, pick, i) in enumerate(edits):
        b = pick % len(beams)
        if what == "remove" and len(beams) > 1 and beams[b].mark not in held:
            del beams[b]
        elif what == "add":
            beams.insert(b, beams[b].model_copy(update={"mark": f"new-{n}"}))
        else:
            beams[b] = beams[b].model_copy(update={"live_psf": float(10 + i), "finding": beams[b].finding[:i]})
    new = job.model_copy(update={"beam": beams})
    fast = patch_blocks(DEMO_TEXT, job, new)
    assert fast is not None and fast == patched(DEMO_TEXT, new)


@pytest.mark.parametrize("text", [
    'x = """two\nlines"""\n[project]\nname = "a"\n',  # a multi-line string could hide a header
    '[project]\nname = "a"\n["beam"]\n',  # a quoted header
    'name = "a"\n[project]\n',  # a key before the first table
    '[[beam]]\nmark = "a"\n[slab]\n[beam.studs]\n',  # a sub-table away from its table
    '[project]\nname = "a"',  # no newline at the end
])
def test_text_that_is_not_plain_blocks_is_left_to_the_whole_document_patch(text):
    assert split_blocks(text) is None


def test_blocks_keep_their_trailing_comments_apart():
    head, blocks = split_blocks(ODD)
    assert head == "# hand-written job, odd spacing on purpose\n"
    assert [b.key for b in blocks] == ["project", "slab", "beam", "beam"]
    assert blocks[2].trailer == "\n# the second beam\n" and blocks[2].core.endswith('note = "bent"}]\n')
    assert head + "".join(b.core + b.trailer for b in blocks) == ODD
