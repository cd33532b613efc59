"""Adversarial inputs for fieldcomp's edges, and the oracle every run must satisfy.

Cases are structure-aware mutations of the shipped job files (jobs/*.toml and the starter), one
beam at a time or whole: values of the wrong kind, boundary numbers, absurd and odd lengths,
hostile text (terminal escapes, NUL, spreadsheet formulas, markup, bidi controls, paths), deleted
and unknown keys, inverted deck geometry, deep nesting, many rows, and text-level damage (byte
order mark, CRLF, bad UTF-8, truncation). Each case is run through a few of the commands (check,
camber, marks, findings, findings --import, the workbench session), chosen by the case's seed, so
a long run covers every command many times. A case is reproduced from its number alone.

The oracle (what "nothing lost, nothing crashes" means here):
- no exception escapes; the exit code is 0, 1, 2 or 3 (review); exit 2 says "error:" and names the file;
- stdout and stderr hold no control character but the newline, and no line runs past LINE_MAX;
- JSON parses strictly (no NaN, no Infinity); SVG parses as XML and holds no control character;
  every CSV text cell is free of control characters and cannot start a spreadsheet formula;
- a failed import leaves the job file byte for byte as it was; a good one keeps a .bak;
- the workbench computes every part or carries a message, never an internal error;
- every command finishes within CASE_SECONDS plus BEAM_SECONDS a beam (the long run also caps
  memory per worker).
"""

from __future__ import annotations

import contextlib
import copy
import csv
import datetime
import io
import json
import random
import re
import signal
import tomllib
import traceback
import xml.etree.ElementTree as ET
from dataclasses import dataclass, field
from pathlib import Path
from collections.abc import Callable
from typing import Any

import tomli_w

ROOT = Path(__file__).resolve().parents[2]
SHIPPED = sorted((ROOT / "jobs").glob("*.toml")) + [ROOT / "fieldcomp" / "jobs" / "starter.toml"]
LINE_MAX = 2000  # the longest line a message may print (values are cut to a sane length)
CASE_SECONDS = 20.0  # one command on a one-beam job takes milliseconds; past this (and BEAM_SECONDS per beam) it hangs
BEAM_SECONDS = 2.0  # the costliest beam the loader accepts (20 level-screed pour stages, 200 point loads) takes 0.7 s
FORMULA_START = ("=", "+", "-", "@", "\uff1d", "\uff0b", "\uff0d", "\uff20")  # as fieldcomp.views.csv_safety
NEST = "\ue000NEST\ue000"  # placeholder replaced in the TOML text by deeply nested brackets

# -- seeds: the shipped jobs, whole and one beam at a time ---------------------------------------


def _seeds() -> list[tuple[str, dict[str, Any]]]:
    seeds = []
    for path in SHIPPED:
        job = tomllib.loads(path.read_text(encoding="utf-8"))
        seeds.append((path.name, job))
        for beam in job["beam"]:
            single = {**{k: v for k, v in job.items() if k != "beam"}, "beam": [beam]}
            seeds.append((f"{path.name}:{beam['mark']}", single))
    return seeds


SEEDS = _seeds()

# -- value pools ---------------------------------------------------------------------------------

WRONG_KINDS: list[Any] = [True, False, 0, 1, -1, 0.0, 1.0, 26.0, "4", "", "true", "1.0", [1], [], {"a": 1}, {},
                          datetime.date(2024, 5, 14), datetime.time(7, 30), "design", "LRFD"]
NUMBERS: list[Any] = [0, -0.0, -1, 1e-12, 1e-6, 0.1, 0.5, 1, 2, 3, 4, 1000, 1e300, 10**18, 2**63 - 1, 5.000001,
                      69.99, 70, 70.01, 135, 134.9, 20.0, 20.0001]
LENGTHS = ["0 in", "0.0001 in", "0.001 in", "0.01 in", "1/64 in", "0.1 in", "1 in", "99999 ft", "1e3 in", "12",
           "1_0 in", "１２ in", "١٢ in", "3/0 in", "nan in", "inf ft", "-3 in", "0'-0\"", "30'-14\"", "½ in",
           " 6.5 in ", "6.5 IN", "1650 mm", "0.5 m", "100 ft", "1000 ft", "1 ft", "11 in", "12 in", "3 in",
           "5 furlongs", "4 in 4 in", "1'-0\"\"", "0.0000000001 ft"]
HOSTILE = ["\x1b[31mRED\x1b[0m", "\x1b]0;pwned\x07", "\x00=1+1", "=HYPERLINK(\"http://x\",\"y\")", "+1+1", "-2+3",
           "@SUM(A1:A9)", "\t=1", "\r=1", "=1", "＝1+1", "[/]", "[bold]x[/bold]", "[/x]", "\u202eevil\u202c",
           "../../etc/passwd", "CON", "NUL.txt", "a" * 5000, "x\r\ny", "\x07bell", "\x7fdel", "\x9b31m",
           "<svg onload=x>&amp;]]>", "\u2028line", "\ufeffbom", "$(rm -rf /)", "%s%n", "\\", "'", '"', " "]
LOG_ROWS = ["missing,2,,1,ok,2024-05-14,insp", "missing,1_0,,1,,,", "missing,١,,1,,,", "added,3,,1,=1+1,,",
            "missing,4,,1,\"unterminated", "short,5,,1,\"a\"\"b\",,", "missing,,12 in,1,,,", "weak-side,6,,1,,,",
            "missing,+7,,1,,,", "missing, 8 ,,1,,,", "failed-test,9,,true,,,", "MISSING,10,,1,\x1b[2J,,",
            "off-rib,11,,1,\x00=cmd,,", "missing,99999,,1,,,", "missing,2,,3,,,", "missing,,0.0001 in,1,,,"]
LOG_HEADER = "kind,rib,station,count,note,date,reported_by"

# -- mutations -----------------------------------------------------------------------------------


def _leaves(node: Any, prefix: tuple = ()) -> list[tuple]:
    out = []
    if isinstance(node, dict):
        for k, v in node.items():
            out += _leaves(v, prefix + (k,)) if isinstance(v, (dict, list)) and v else [prefix + (k,)]
    elif isinstance(node, list):
        for i, v in enumerate(node):
            out += _leaves(v, prefix + (i,)) if isinstance(v, (dict, list)) and v else [prefix + (i,)]
    return out


def _tables(node: Any, prefix: tuple = ()) -> list[tuple]:
    out = [prefix] if isinstance(node, dict) else []
    if isinstance(node, dict):
        for k, v in node.items():
            out += _tables(v, prefix + (k,))
    elif isinstance(node, list):
        for i, v in enumerate(node):
            out += _tables(v, prefix + (i,))
    return out


def _get(node: Any, path: tuple) -> Any:
    for part in path:
        node = node[part]
    return node


def _set(node: Any, path: tuple, value: Any) -> None:
    _get(node, path[:-1])[path[-1]] = value


def _is_length(value: Any) -> bool:
    return isinstance(value, str) and bool(re.search(r"\d", value)) and bool(re.search(r"in|ft|'|\"|mm|m$", value))


def _pick(rng: random.Random, job: dict, want: Callable[[Any], bool]) -> tuple | None:
    paths = [p for p in _leaves(job) if want(_get(job, p))]
    return rng.choice(paths) if paths else None


def m_wrong_kind(rng: random.Random, job: dict) -> str:
    path = rng.choice(_leaves(job))
    _set(job, path, copy.deepcopy(rng.choice(WRONG_KINDS)))
    return f"wrong kind at {path}"


def m_number(rng: random.Random, job: dict) -> str:
    path = _pick(rng, job, lambda v: isinstance(v, (int, float)) and not isinstance(v, bool))
    if path is None:
        return "no number"
    old = _get(job, path)
    value = rng.choice(NUMBERS + [old * 1000, old / 1000, -old, old + 0.5, int(old) if isinstance(old, float) else float(old)])
    _set(job, path, value)
    return f"number at {path}"


def m_length(rng: random.Random, job: dict) -> str:
    path = _pick(rng, job, _is_length)
    if path is None:
        return "no length"
    _set(job, path, rng.choice(LENGTHS))
    return f"length at {path}"


def m_text(rng: random.Random, job: dict) -> str:
    path = _pick(rng, job, lambda v: isinstance(v, str) and not _is_length(v))
    if path is None:
        return "no text"
    old, bad = _get(job, path), rng.choice(HOSTILE)
    _set(job, path, rng.choice([bad, old + bad, bad + old]))
    return f"text at {path}"


def m_delete(rng: random.Random, job: dict) -> str:
    path = rng.choice(_leaves(job) + _tables(job)[1:])
    parent = _get(job, path[:-1])
    if isinstance(parent, list) and len(parent) <= 1 and rng.random() < 0.7:
        return "kept the last item"
    del parent[path[-1]]
    return f"deleted {path}"


def m_unknown_key(rng: random.Random, job: dict) -> str:
    path = rng.choice(_tables(job))
    _get(job, path)[rng.choice(["spam", "Span", "count ", "studs_count", "\x1b", "mark2", "__class__"])] = 1
    return f"unknown key in {path}"


def m_deck(rng: random.Random, job: dict) -> str:
    if not job.get("deck"):
        return "no deck"
    deck = rng.choice(job["deck"])
    kind = rng.choice(["swap", "narrow bottom", "narrow top", "flat", "wide top"])
    if kind == "swap":
        deck["rib_top_width"], deck["rib_bottom_width"] = deck.get("rib_bottom_width"), deck.get("rib_top_width")
    elif kind == "narrow bottom":
        deck["rib_bottom_width"] = rng.choice(["0.5 in", "0.7 in", "0.75 in", "1 in", "0.0001 in"])
    elif kind == "narrow top":
        deck["rib_top_width"] = rng.choice(["1 in", "2 in", "0.5 in"])
    elif kind == "flat":
        deck["rib_height"] = rng.choice(["0.0001 in", "0 in", "0.1 in"])
    else:
        deck["rib_top_width"] = rng.choice(["11.99 in", "12 in", "13 in"])
    deck["stud_offset"] = rng.choice([deck.get("stud_offset", "1 1/4 in"), "0 in", "3 in", "10 in"])
    return f"deck geometry: {kind}"


def m_nest(rng: random.Random, job: dict) -> str:
    path = rng.choice(_leaves(job))
    _set(job, path, NEST)
    return f"nested at {path}"


def m_many(rng: random.Random, job: dict) -> str:
    beam = rng.choice(job["beam"]) if job.get("beam") else None
    if beam is None:
        return "no beam"
    what = rng.choice(["point_loads", "pour", "finding", "beam"])
    n = rng.choice([20, 60, 150])
    if what == "point_loads":
        beam["point_loads"] = [{"at": f"{1 + i % 20} ft", "dead_kips": 1.0} for i in range(n)]
    elif what == "pour":
        beam["pour"] = [{"name": f"p{i}", "start": f"{i * 0.1:.1f} in", "end": f"{(i + 1) * 0.1:.1f} in"}
                        for i in range(n - 1)] + [{"name": "rest", "start": f"{(n - 1) * 0.1:.1f} in"}]
    elif what == "finding":
        beam["finding"] = [{"kind": "missing", "rib": 1 + i} for i in range(n)]
    else:
        job["beam"] = [{**copy.deepcopy(beam), "mark": f"{beam.get('mark', 'B')}-{i}"} for i in range(min(n, 40))]
    return f"many {what}"


def m_swap(rng: random.Random, job: dict) -> str:
    leaves = _leaves(job)
    a, b = rng.choice(leaves), rng.choice(leaves)
    va, vb = _get(job, a), _get(job, b)
    _set(job, a, vb)
    _set(job, b, va)
    return f"swapped {a} and {b}"


def _field_info(path: tuple) -> Any:
    """The pydantic FieldInfo of the job model at `path`, or None."""
    from fieldcomp.jobs.model import Job
    from fieldcomp.jobs.typed_text import _kinds
    from pydantic import BaseModel

    model: Any = Job
    info = None
    for part in path:
        if isinstance(part, int):
            continue
        if model is None or part not in model.model_fields:
            return None
        info = model.model_fields[part]
        model = next((k for k in _kinds(info.annotation) if isinstance(k, type) and issubclass(k, BaseModel)), None)
    return info


def m_bounds(rng: random.Random, job: dict) -> str:
    """A number at, just inside or just outside one of the model's own limits."""
    path = _pick(rng, job, lambda v: isinstance(v, (int, float)) and not isinstance(v, bool))
    info = _field_info(path) if path else None
    limits = [getattr(m, name) for m in (info.metadata if info else []) for name in ("ge", "gt", "le", "lt")
              if getattr(m, name, None) is not None]
    if not limits:
        return "no bounded number"
    edge = float(rng.choice(limits))
    value = rng.choice([edge, edge + 1e-9, edge - 1e-9, edge * 1.000001, edge / 2 if edge else 1e-9])
    _set(job, path, int(value) if isinstance(_get(job, path), int) and value == int(value) else value)
    return f"bound {value} at {path}"


LADDER = ["0 in", "1/16 in", "1/4 in", "1 in", "3 in", "6 in", "1 ft", "2 ft", "10 ft", "29 ft 11 in", "50 ft", "99 ft",
          "100 ft", "500 ft", "1000 ft", "5 ft 11 15/16 in"]


def m_length_ladder(rng: random.Random, job: dict) -> str:
    """Any length field set to a plausible-but-extreme length: tiny, span-sized, enormous."""
    path = _pick(rng, job, _is_length)
    if path is None:
        return "no length"
    _set(job, path, rng.choice(LADDER))
    return f"ladder length at {path}"


def m_swap_same_kind(rng: random.Random, job: dict) -> str:
    """Two values of one kind exchanged (a span for a stud length, a pcf for a ksi)."""
    leaves = _leaves(job)
    a = rng.choice(leaves)
    kind = type(_get(job, a))
    same = [p for p in leaves if type(_get(job, p)) is kind and p != a]
    if not same:
        return "nothing of the same kind"
    b = rng.choice(same)
    va, vb = _get(job, a), _get(job, b)
    _set(job, a, vb)
    _set(job, b, va)
    return f"swapped {a} and {b}"


def m_setting(rng: random.Random, job: dict) -> str:
    """A rarely used setting switched on: station origin, support setbacks, level screed, parallel deck,
    construction classes and factors, limits, camber settings, first rib, keep-outs."""
    beam = rng.choice(job["beam"]) if job.get("beam") else {}
    choice = rng.randrange(10)
    if choice == 0:
        job["project"]["station_origin"] = "support"
        beam["end_setback"] = rng.choice(["6 in", "2 ft", "14 ft"])
    elif choice == 1:
        beam["screed"] = "level"
    elif choice == 2:
        beam["deck_orientation"] = "parallel"
    elif choice == 3:
        beam.pop("construction_live_psf", None)
        beam["construction_load"] = rng.choice(["very-light", "light", "medium", "heavy"])
    elif choice == 4:
        beam["construction_factors"] = [{"dead": rng.choice([0.0, 1.0, 3.0]), "live": rng.choice([0.0, 1.6, 3.0])}]
    elif choice == 5:
        beam["construction_limits"] = {"dead_ratio": rng.choice([60.0, 2000.0]), "live_ratio": rng.choice([60.0, 2000.0])}
    elif choice == 6:
        job["project"]["camber"] = {"fraction": rng.choice([1e-6, 0.5, 1.0]),
                                    "increment": rng.choice(["1/16 in", "1 in", "10 ft"]),
                                    "minimum": rng.choice(["0 in", "3/4 in", "10 ft"]),
                                    "min_length": rng.choice(["0 in", "100 ft"])}
    elif choice == 7:
        beam["first_rib"] = rng.choice(["0 in", "1/16 in", "11 in", "30 ft", "99 ft"])
    elif choice == 8:
        beam["keep_out_start"], beam["keep_out_end"] = rng.choice([("0 in", "29 ft"), ("14 ft", "15 ft 11 in"), ("1 in", "1 in")])
    else:
        beam["studs"] = {**beam.get("studs", {}), "count": rng.choice([0, 1, 2, 999, 1000, "design"]),
                         "max_per_rib": rng.choice([1, 2, 3]), "position": rng.choice(["strong", "weak", "center"])}
    return f"setting {choice}"


MUTATIONS = [m_wrong_kind, m_number, m_length, m_text, m_delete, m_unknown_key, m_deck, m_nest, m_many, m_swap,
             m_bounds, m_length_ladder, m_swap_same_kind, m_setting, m_bounds, m_length_ladder, m_setting]
VALID_MUTATIONS = [m_bounds, m_length_ladder, m_setting, m_swap_same_kind, m_number, m_deck, m_many, m_length]


def _nested(rng: random.Random) -> str:
    depth = rng.choice([3, 9, 12, 60, 400, 3000])
    if rng.random() < 0.5:
        return "[" * depth + "1" + "]" * depth
    return "{a = " * depth + "1" + "}" * depth


def _text_damage(rng: random.Random, text: str) -> bytes:
    kind = rng.choice(["none"] * 6 + ["bom", "crlf", "cr", "nul", "bad utf-8", "truncate", "duplicate line",
                                      "utf-16", "dotted depth", "bom crlf"])
    if kind == "bom":
        return b"\xef\xbb\xbf" + text.encode("utf-8")
    if kind == "bom crlf":
        return b"\xef\xbb\xbf" + text.replace("\n", "\r\n").encode("utf-8")
    if kind == "crlf":
        return text.replace("\n", "\r\n").encode("utf-8")
    if kind == "cr":
        return text.replace("\n", "\r").encode("utf-8")
    if kind == "nul":
        return text.encode("utf-8") + b"\x00"
    if kind == "bad utf-8":
        data = bytearray(text.encode("utf-8"))
        data.insert(rng.randrange(len(data)), 0xFF)
        return bytes(data)
    if kind == "truncate":
        return text.encode("utf-8")[: rng.randrange(len(text))]
    if kind == "duplicate line":
        lines = text.splitlines(keepends=True)
        i = rng.randrange(len(lines))
        return "".join(lines[: i + 1] + [lines[i]] + lines[i + 1:]).encode("utf-8")
    if kind == "utf-16":
        return text.encode("utf-16")
    if kind == "dotted depth":
        keys = ".".join(f"k{i}" for i in range(rng.choice([20, 2000])))
        return text.replace("[project]\n", f"[project]\n{keys} = 1\n", 1).encode("utf-8")
    return text.encode("utf-8")


# -- cases ---------------------------------------------------------------------------------------

COMMANDS = ("check", "check --json", "camber", "camber --json --csv", "marks --all", "marks --beam",
            "findings", "findings --json", "findings --import", "workbench")


@dataclass
class Case:
    number: int
    seed: str
    steps: list[str]
    data: bytes
    marks: list[str]
    commands: list[str]
    log: str = ""  # inspection log text for `findings --import`


def make_case(number: int, commands_per_case: int = 3) -> Case:
    """Case `number`: a seed job, one to four mutations, maybe text damage, some commands."""
    rng = random.Random(number)
    name, base = rng.choice(SEEDS)
    job = copy.deepcopy(base)
    engine_bound = rng.random() < 0.5  # half the cases keep a loadable file, to reach the engine
    steps = ["engine-bound" if engine_bound else "edge-bound"]
    for _ in range(rng.choice([1, 1, 2, 2, 3, 4, 6])):
        try:
            steps.append(rng.choice(VALID_MUTATIONS if engine_bound else MUTATIONS)(rng, job))
        except (KeyError, IndexError, TypeError, ValueError, AttributeError):
            steps.append("mutation did not apply")
    try:
        text = tomli_w.dumps(job)
    except (TypeError, ValueError):
        text = tomli_w.dumps(base)
        steps.append("not TOML-writable; seed kept")
    while NEST in text:
        text = text.replace(f'"{NEST}"', _nested(rng), 1).replace(NEST, "x", 1)
    data = text.encode("utf-8") if engine_bound else _text_damage(rng, text)
    marks = [b.get("mark") for b in job.get("beam", []) if isinstance(b, dict) and isinstance(b.get("mark"), str)]
    log = "\n".join([LOG_HEADER] + rng.sample(LOG_ROWS, rng.choice([1, 2, 3]))) + rng.choice(["\n", "", "\r\n"])
    if rng.random() < 0.2:
        log = "\ufeff" + log
    return Case(number, name, steps, data, marks or ["B-1"], rng.sample(COMMANDS, commands_per_case), log)


# -- the oracle ----------------------------------------------------------------------------------


class Hang(BaseException):
    """Raised by the alarm when a command runs past CASE_SECONDS (a BaseException, so that no
    handler of the code under test takes it for an error of its own)."""


@dataclass
class Finding:
    signature: str
    case: int
    command: str
    detail: str


@dataclass
class Outcome:
    ran: int = 0
    findings: list[Finding] = field(default_factory=list)


def _control(text: str) -> str | None:
    bad = sorted({repr(c) for c in text if c != "\n" and not c.isprintable()})
    return ", ".join(bad[:5]) if bad else None


def _strict_json(text: str) -> Any:
    def refuse(name: str) -> Any:
        raise ValueError(f"{name} in JSON")
    return json.loads(text, parse_constant=refuse)


def check_csv(text: str) -> str | None:
    for row in csv.reader(io.StringIO(text, newline="")):
        for cell in row:
            if _control(cell):
                return f"control character in CSV cell {cell[:40]!r}"
            if cell.startswith(FORMULA_START) and not _is_number(cell):
                return f"CSV cell may run as a formula: {cell[:40]!r}"
    return None


def _is_number(cell: str) -> bool:
    try:
        float(cell)
    except ValueError:
        return False
    return True


def check_svg(text: str) -> str | None:
    if _control(text.replace("\n", "")):
        return "control character in SVG"
    try:
        ET.fromstring(text.encode("utf-8"))
    except ET.ParseError as exc:
        return f"SVG is not XML: {exc}"
    return None


def check_streams(rc: Any, out: str, err: str, named: list[Path], json_out: bool = False) -> str | None:
    """Exit code, clean streams, short lines (JSON prints one beam per line), and an exit 2 that
    says "error:" and names one of the files `named`."""
    if rc not in (0, 1, 2, 3):
        return f"exit code {rc!r}"
    for name, text in (("stdout", out), ("stderr", err)):
        bad = _control(text)
        if bad:
            return f"control character on {name}: {bad}"
        if not (json_out and name == "stdout") and any(len(line) > LINE_MAX for line in text.splitlines()):
            return f"a {name} line longer than {LINE_MAX}"
    if rc == 2 and not (err.startswith("error: ") and any(str(p) in err for p in named)):
        return f"exit 2 without 'error: <file>': {err[:200]!r}"
    return None


def _signature(exc: BaseException) -> str:
    frames = [f for f in traceback.extract_tb(exc.__traceback__) if "/engine/" in f.filename or "/fieldcomp/" in f.filename]
    where = f"{Path(frames[-1].filename).name}:{frames[-1].lineno}" if frames else "?"
    return f"{type(exc).__name__} at {where}"


def _run_cli(argv: list[str]) -> tuple[Any, str, str]:
    from fieldcomp.cli.main import main

    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        try:
            rc = main(argv)
        except SystemExit as exc:  # argparse
            rc = exc.code
    return rc, out.getvalue(), err.getvalue()


def _files(folder: Path, ext: str) -> list[Path]:
    return sorted(folder.rglob(f"*{ext}")) if folder.exists() else []


def run_command(case: Case, command: str, folder: Path) -> str | None:
    """Run one command of a case; the oracle's complaint, or None."""
    job = folder / "job.toml"
    job.write_bytes(case.data)
    out_dir = folder / "out"
    mark = case.marks[case.number % len(case.marks)]
    if command == "workbench":
        return run_workbench(job, case)
    argv = {
        "check": ["check", str(job)],
        "check --json": ["check", str(job), "--json"],
        "camber": ["camber", str(job)],
        "camber --json --csv": ["camber", str(job), "--json", "--csv", str(out_dir / "camber.csv")],
        "marks --all": ["marks", str(job), "--all", "--svg", str(out_dir / "svg"), "--csv", str(out_dir / "csv"),
                        "--date", "2024-05-14"],
        "marks --beam": ["marks", str(job), "--beam=" + mark, "--svg", str(out_dir / "m.svg"), "--csv", str(out_dir / "m.csv")],
        "findings": ["findings", str(job), "--beam=" + mark],
        "findings --json": ["findings", str(job), "--beam=" + mark, "--json", "--repair-svg", str(out_dir / "r.svg")],
        "findings --import": ["findings", str(job), "--beam=" + mark, "--import", str(folder / "log.csv")],
    }[command]
    out_dir.mkdir(exist_ok=True)
    (folder / "log.csv").write_bytes(case.log.encode("utf-8"))
    rc, out, err = _run_cli(argv)
    complaint = check_streams(rc, out, err, [job, folder / "log.csv", out_dir], "--json" in command)
    if complaint:
        return complaint
    if "--json" in command and rc in (0, 1):
        try:
            _strict_json(out)
        except ValueError as exc:
            return f"invalid JSON: {exc}"
    for svg in _files(out_dir, ".svg"):
        complaint = check_svg(svg.read_text(encoding="utf-8"))
        if complaint:
            return f"{svg.name}: {complaint}"
    for sheet in _files(out_dir, ".csv"):
        complaint = check_csv(sheet.read_text(encoding="utf-8"))
        if complaint:
            return f"{sheet.name}: {complaint}"
    if command == "findings --import":
        return _check_import(job, case, rc, err)
    return None


def _check_import(job: Path, case: Case, rc: Any, err: str) -> str | None:
    from fieldcomp.jobs.jobfile import JobFileError, load_job

    bak = job.with_name(job.name + ".bak")
    if not bak.exists():
        if job.read_bytes() != case.data:
            return "the job changed although the import did not save"
        return None
    if bak.read_bytes() != case.data:
        return ".bak is not the job as it was"
    try:
        load_job(job)
    except JobFileError as exc:
        return f"the saved job does not load: {exc}"
    return None


def run_workbench(job: Path, case: Case) -> str | None:
    """The workbench's own path: open (as `fieldcomp open` does), compute every pane's parts,
    then one edit of hostile text; the app is not drawn here (tests of the drawn app cover it)."""
    from fieldcomp.jobs.jobfile import JobFileError
    from fieldcomp.tui.outcome import OutcomeCache
    from fieldcomp.tui.session import EditRejectedError, JobSession

    try:
        session = JobSession.open(job)
    except JobFileError as exc:
        bad = _control(str(exc))
        return f"control character in a load error: {bad}" if bad else None
    cache = OutcomeCache()
    for outcome in cache.job(session.job, "2024-05-14"):
        done = cache.finished(outcome)
        for part in (done.finished, done.construction, done.layout, done.as_built, done.sheet, done.repair, done.repair_sheet):
            if part is not None and part.error and "internal error" in part.error:
                return f"workbench part: {part.error[:300]}"
    rng = random.Random(case.number)
    path = rng.choice([("project", "name"), ("beam", 0, "mark"), ("beam", 0, "reference_end"), ("beam", 0, "span"),
                       ("beam", 0, "fy_ksi"), ("beam", 0, "studs", "count"), ("slab", 0, "lightweight")])
    with contextlib.suppress(EditRejectedError):  # refused edits are the loader's to word
        session.set_text(path, rng.choice(HOSTILE + ["true", "50", "1.5", "30 ft", "design", "0.0001 in"]))
    return None


def run_case(case: Case, folder: Path) -> list[Finding]:
    """Every command of the case, each in a fresh copy of its files; findings, if any."""
    found = []
    for command in case.commands:
        where = folder / command.replace(" ", "_").replace("-", "")
        where.mkdir(parents=True, exist_ok=True)
        previous = signal.signal(signal.SIGALRM, _alarm)
        limit = CASE_SECONDS + BEAM_SECONDS * len(case.marks)
        signal.setitimer(signal.ITIMER_REAL, limit)
        try:
            complaint = run_command(case, command, where)
            if complaint:
                found.append(Finding(f"{command}: {_first_words(complaint)}", case.number, command, complaint))
        except Hang:
            found.append(Finding(f"{command}: over {limit:g} s", case.number, command, "; ".join(case.steps)))
        except BaseException as exc:  # anything escaping is what the suite looks for
            if isinstance(exc, KeyboardInterrupt):
                raise
            found.append(Finding(f"{command}: {_signature(exc)}", case.number, command,
                                 f"{type(exc).__name__}: {str(exc)[:300]} [{'; '.join(case.steps)}]"))
        finally:
            signal.setitimer(signal.ITIMER_REAL, 0)
            signal.signal(signal.SIGALRM, previous)
    return found


def _alarm(signum: int, frame: Any) -> None:
    raise Hang()


def _first_words(text: str) -> str:
    """A complaint without its case-specific details, to group findings."""
    return re.sub(r"'.*?'|\".*?\"|\d+(\.\d+)?", "_", text.split(":", 1)[0] if ": " in text[:60] else text)[:80]
