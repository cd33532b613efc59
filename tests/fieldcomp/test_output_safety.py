"""Every output is finite and clean: JSON holds no NaN or Infinity (a zero capacity is reported as
it is, with its ratio null and a note, and the check fails), text on the terminal holds no control
character, every CSV text cell is guarded against formulas, every SVG is XML; outputs go only to
regular files in folders that exist, never to a FIFO or a device."""

from __future__ import annotations

import csv
import dataclasses
import io
import json
import math
import os
import shutil
import signal
import xml.etree.ElementTree as ET
from pathlib import Path

import pytest

from fieldcomp import CAUTION
from fieldcomp.cli.common import PrintableStream
from fieldcomp.cli.main import main
from fieldcomp.jobs.jobfile import load_job
from fieldcomp.jobs.to_engine import to_engine
from fieldcomp.views.csv_safety import csv_cell
from fieldcomp.views.numbers import NO_CAPACITY, json_text

ROOT = Path(__file__).resolve().parents[2]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
# RFC 8259 section 6: "Numeric values that cannot be represented in the grammar below (such as
# Infinity and NaN) are not permitted."
def strict_json(text: str):
    def refuse(name):
        raise AssertionError(f"{name} is not JSON (RFC 8259 section 6)")
    return json.loads(text, parse_constant=refuse)


# OWASP "CSV Injection": cells starting with = + - @ (or tab, carriage return) run as formulas
FORMULA_START = ("=", "+", "-", "@", "\t", "\r")


def control_characters(text: str) -> set[str]:
    """ECMA-48 C0 and C1 controls, DEL, and other non-printing characters, except the newline."""
    return {c for c in text if c != "\n" and not c.isprintable()}


@pytest.fixture
def thin_topping(tmp_path) -> Path:
    """The demo job with a 0.1 in topping: 3.1 in of slab over a 5 1/4 in stud leaves a cover
    capacity of -2.15 in (AISC 360-22 I3.2c.1(c) asks for 1/2 in), a zero-or-less capacity."""
    path = tmp_path / "thin.toml"
    path.write_text(DEMO.read_text().replace('topping = "3 1/4 in"', 'topping = "0.1 in"', 1))
    return path


def test_a_zero_capacity_is_reported_as_it_is_in_check_json(thin_topping, capsys):
    assert main(["check", str(thin_topping), "--json", "--beam", "3B-101"]) == 1
    beam = strict_json(capsys.readouterr().out)["beams"][0]
    cover = next(c for c in beam["checks"] if c["id"] == "studs.cover")
    # cover over the stud head: slab 0.1 + 3 in (deck) less the 5 1/4 in stud = -2.15 in against the
    # 1/2 in minimum of AISC 360-22 I3.2c.1(c)
    assert cover["capacity"] == -2.15 and cover["demand"] == 0.5
    assert cover["ratio"] is None and cover["ratio_note"] == NO_CAPACITY and cover["passed"] is False
    governing = beam["governing"]
    assert governing["check"] == cover["name"] and governing["clause"] == cover["clause"]
    assert governing["ratio"] is None and governing["ratio_note"] == NO_CAPACITY and governing["level"] == "fail"
    assert beam["verdict"] == "fail"


def test_a_zero_capacity_reads_n_a_in_text_and_json_stays_strict_everywhere(thin_topping, capsys):
    assert main(["check", str(thin_topping), "--beam", "3B-101"]) == 1
    out = capsys.readouterr().out
    assert "  FAIL      n/a  concrete cover over stud head (min 1/2 in)" in out and "inf" not in out
    for argv in (["camber", str(thin_topping), "--json"], ["findings", str(thin_topping), "--beam", "3B-101", "--json"],
                 ["check", str(thin_topping), "--json"]):
        assert main(argv) in (0, 1, 3)
        strict_json(capsys.readouterr().out)


def test_json_text_never_writes_nan_or_infinity():
    data = {"a": math.inf, "b": [math.nan, -math.inf, 1.5], "c": {"d": (math.inf,)}, "e": "inf"}
    assert strict_json(json_text(data)) == {"a": None, "b": [None, None, 1.5], "c": {"d": [None]}, "e": "inf"}


def test_csv_cells_cannot_start_a_formula_even_behind_a_control_character():
    for bad in ("=1+1", "\x00=1+1", "\x1b=1", "+SUM(A1)", "-2+3", "@A1", "\t=1", "\r=1", "＝1"):
        cell = csv_cell(bad)
        assert cell.startswith("'") and not control_characters(cell), (bad, cell)
    assert csv_cell("grid 3") == "grid 3"


HOSTILE = "\x1b[2J\x00=HYPERLINK(\"http://x\")\x07[/]"


def _hostile(beam):
    """An engine input carrying control characters and a formula in every text it prints (the
    loader refuses these in a job file; other callers of the views might not)."""
    ribs = dataclasses.replace(beam.ribs, reference_end=HOSTILE + "ref", far_end=HOSTILE + "far")
    findings = tuple(dataclasses.replace(f, note=HOSTILE) for f in beam.findings)
    return dataclasses.replace(beam, mark=HOSTILE + beam.mark, ribs=ribs, findings=findings)


@pytest.fixture
def hostile_cli(monkeypatch):
    """The CLI verbs on the demo job, every text of it hostile."""
    from fieldcomp.cli import camber, check, common, marks

    loaded = load_job(DEMO)
    job = loaded.job.model_copy(update={"project": loaded.job.project.model_construct(
        **{**dict(loaded.job.project), "name": HOSTILE + "job"})})
    beams = [_hostile(b) for b in to_engine(loaded.job)]

    def load_inputs(path, only=None):
        chosen = [b for b in beams if only is None or b.mark == only or b.mark.endswith(only)]
        return job, chosen
    for module in (camber, check, common, marks):
        monkeypatch.setattr(module, "load_inputs", load_inputs, raising=False)
    return beams


def test_no_control_character_reaches_the_terminal_csv_or_svg(hostile_cli, tmp_path, capsys):
    mark = "3B-103"  # fails as built: the findings report and its repair sheet print every note
    runs = [["check", str(DEMO)], ["check", str(DEMO), "--json"], ["camber", str(DEMO), "--csv", str(tmp_path / "c.csv")],
            ["camber", str(DEMO), "--json"],
            ["marks", str(DEMO), "--all", "--svg", str(tmp_path / "svg"), "--csv", str(tmp_path / "csv"), "--date", HOSTILE],
            ["findings", str(DEMO), "--beam", mark, "--repair-svg", str(tmp_path / "r.svg")],
            ["findings", str(DEMO), "--beam", mark, "--json"]]
    for argv in runs:
        main(argv)
        captured = capsys.readouterr()
        assert not control_characters(captured.out + captured.err), argv
        if "--json" not in argv:
            assert '[2J=HYPERLINK("http://x")[/]' in captured.out, argv  # the text itself is kept, printable
        if "--json" in argv:
            strict_json(captured.out)
    sheets = [tmp_path / "c.csv", *sorted((tmp_path / "csv").iterdir())]
    for sheet in sheets:
        for row in csv.reader(io.StringIO(sheet.read_text(encoding="utf-8"), newline="")):
            for cell in row:
                assert not control_characters(cell), (sheet.name, cell)
                assert not cell.startswith(FORMULA_START) or _number(cell), (sheet.name, cell)
    for svg in [tmp_path / "r.svg", *sorted((tmp_path / "svg").iterdir())]:
        text = svg.read_text(encoding="utf-8")
        assert not control_characters(text.replace("\n", "")), svg.name  # XML 1.0 section 2.2: Char excludes them
        ET.fromstring(text.encode("utf-8"))


def _number(cell: str) -> bool:
    try:
        float(cell)
    except ValueError:
        return False
    return True


def test_a_file_name_with_an_escape_sequence_is_printed_without_it(tmp_path, capsys):
    path = tmp_path / "\x1b]0;owned\x07job.toml"
    assert main(["check", str(path)]) == 2
    err = capsys.readouterr().err
    assert err.startswith("error: ") and "]0;owned" in err and not control_characters(err)


def test_printable_stream_keeps_line_breaks_and_drops_other_controls():
    out = io.StringIO()
    stream = PrintableStream(out)
    assert stream.write("a\x1b[31mb\r\nc\x00\td\u202e\n") == 15
    assert out.getvalue() == "a[31mb\ncd\n"


@pytest.fixture
def no_hang():
    def hung(signum, frame):
        raise AssertionError("an output blocked on a FIFO")
    previous = signal.signal(signal.SIGALRM, hung)
    signal.alarm(20)
    yield
    signal.alarm(0)
    signal.signal(signal.SIGALRM, previous)


def _output_runs(job: Path, target: Path) -> list[list[str]]:
    return [["camber", str(job), "--csv", str(target)],
            ["marks", str(job), "--beam", "3B-101", "--svg", str(target)],
            ["marks", str(job), "--beam", "3B-101", "--csv", str(target)],
            ["findings", str(job), "--beam", "3B-103", "--repair-svg", str(target)]]


def test_fifo_and_device_outputs_are_refused_by_kind(tmp_path, capsys, no_hang):
    job = tmp_path / "job.toml"
    shutil.copyfile(DEMO, job)
    fifo = tmp_path / "out.fifo"
    os.mkfifo(fifo)
    for target, kind in ((fifo, "a pipe or FIFO"), (Path("/dev/null"), "a character device"), (tmp_path, "a folder")):
        for argv in _output_runs(job, target):
            assert main(argv) == 2, argv
            assert f"error: {target}: is {kind}; output is written only to regular files" in capsys.readouterr().err
    assert Path("/dev/null").is_char_device() and fifo.is_fifo()  # nothing replaced them


def test_outputs_into_a_missing_folder_are_refused_naming_the_folder(tmp_path, capsys):
    job = tmp_path / "job.toml"
    shutil.copyfile(DEMO, job)
    target = tmp_path / "no" / "such" / "out.csv"
    for argv in _output_runs(job, target) + [["new", str(target)]]:
        assert main(argv) == 2, argv
        assert f"error: {target}: the folder {target.parent} does not exist" in capsys.readouterr().err
    assert not (tmp_path / "no").exists()


def test_new_writes_a_starter_that_checks_and_never_overwrites(tmp_path, capsys):
    target = tmp_path / "starter.toml"
    assert main(["new", str(target)]) == 0
    assert main(["check", str(target)]) in (0, 1) and CAUTION in capsys.readouterr().out
    fifo = tmp_path / "fifo.toml"
    os.mkfifo(fifo)
    assert main(["new", str(fifo)]) == 2 and fifo.is_fifo()
    assert "exists; not overwritten" in capsys.readouterr().err
