"""Batch verbs on many beams: the worker pool gives byte for byte the output of the serial run,
and the JSON assembled from per-beam pieces (one line each) parses to the whole (no engineering values
here: both sides of every comparison come from the same engine)."""

from __future__ import annotations

import io
import json
import sys
from pathlib import Path

from hypothesis import given, settings
from hypothesis import strategies as st

from fieldcomp.cli.main import main
from fieldcomp.cli import parallel

sys.path.insert(0, str(Path(__file__).resolve().parents[3] / "tools"))

from bench import DEMO, generated_job as many_beams  # the benchmark's generated floor


def run(args: list[str], capsys) -> tuple[int, str]:
    code = main(args)
    return code, capsys.readouterr().out


def test_pool_output_equals_serial_output(tmp_path, capsys, monkeypatch):
    # each beam its own type (engine.batch.repeats), so the pool has POOL_MIN_BEAMS + 10 to share
    count = parallel.POOL_MIN_BEAMS + 10
    job = tmp_path / "floor.toml"
    job.write_text(many_beams(count, distinct=True))
    pooled = [run(["check", str(job), "--json"], capsys), run(["check", str(job)], capsys)]
    monkeypatch.setattr(parallel, "POOL_MIN_BEAMS", 10**9)  # the same verb, in this process only
    serial = [run(["check", str(job), "--json"], capsys), run(["check", str(job)], capsys)]
    assert pooled == serial
    assert len(json.loads(pooled[0][1])["beams"]) == count


def test_pool_is_used_for_check_only(monkeypatch):
    seen: list[bool] = []
    real = parallel.map_beams
    monkeypatch.setattr(parallel, "map_beams", lambda fn, items, pooled=True: seen.append(pooled) or real(fn, items, pooled))
    main(["check", str(DEMO), "--json"])
    main(["camber", str(DEMO), "--json"])
    assert seen == [True, False]


def test_map_beams_keeps_input_order():
    items = list(range(parallel.POOL_MIN_BEAMS + 5))
    assert parallel.map_beams(abs, [-i for i in items]) == items


json_values = st.recursive(
    st.none() | st.booleans() | st.integers() | st.floats(allow_nan=False, allow_infinity=False) | st.text(max_size=8),
    lambda inner: st.lists(inner, max_size=4) | st.dictionaries(st.text(max_size=5), inner, max_size=4),
    max_leaves=20,
)


@settings(max_examples=100, deadline=None)
@given(head=st.dictionaries(st.text(max_size=5).filter(lambda k: k != "beams"), json_values, min_size=1, max_size=3),
       items=st.lists(json_values, max_size=4))
def test_json_from_pieces_equals_json_dumps(head, items):
    pieces = [parallel.json_item(item) for item in items]
    text = parallel.json_with_list(head, "beams", pieces)
    assert json.loads(text) == json.loads(json.dumps({**head, "beams": items}))
    assert len(text.splitlines()) == len(json.dumps({**head, "beams": []}, indent=2).splitlines()) + (
        len(items) + 1 if items else 0)  # one line per item


@settings(max_examples=100, deadline=None)
@given(head=st.dictionaries(st.text(max_size=5).filter(lambda k: k != "beams"), json_values, min_size=1, max_size=3),
       items=st.lists(json_values, max_size=4))
def test_json_written_item_by_item_equals_json_printed_whole(head, items):
    pieces = [parallel.json_item(item) for item in items]
    out = io.StringIO()
    parallel.write_json_with_list(out, head, "beams", iter(pieces))
    assert out.getvalue() == parallel.json_with_list(head, "beams", pieces) + "\n"


@given(mark=st.text(min_size=1, max_size=12).filter(lambda m: m.isprintable()))
def test_a_report_made_under_the_stand_in_reads_as_made_under_the_mark(mark):
    record = {"mark": parallel.MARK_STAND_IN, "note": f"beam {parallel.MARK_STAND_IN}", "other": "\\u0000mark\\u0000"}
    made = parallel.json_item(record)
    assert parallel.relabel_report(made, mark, True) == parallel.json_item(
        {"mark": mark, "note": f"beam {mark}", "other": "\\u0000mark\\u0000"})
    text = f"Beam {parallel.MARK_STAND_IN}: W18X35"
    assert parallel.relabel_report(text, mark, False) == f"Beam {mark}: W18X35"
