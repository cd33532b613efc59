"""`fieldcomp import SOURCE -o JOB.toml [--level NAME] [--template JOB] [--map key=Column]`: the
beams of one floor from an IFC model (.ifc) or a framing schedule (.csv, .xlsx) into a job file.
Into an existing job it is a re-import: geometry updated, the engineer's edits kept, the
changes printed. Never writes onto an input; the job is written atomically (.bak kept)."""

from __future__ import annotations

import argparse
import os
import stat
from pathlib import Path

from fieldcomp.cli.common import EXIT_PASS, EXIT_REVIEW, fail_input, fail_output


def register(sub) -> None:
    p = sub.add_parser("import", help="beams of a floor from an IFC model or a framing schedule into a job file",
                       description="Read the beams of one storey from an IFC model (IFC2x3, IFC4) or a framing "
                                   "schedule (CSV, XLSX) and write a job file; into an existing job: re-import.")
    p.set_defaults(command="import_floor")
    p.add_argument("source", help="the model (.ifc) or schedule (.csv, .xlsx)")
    p.add_argument("-o", "--output", required=True, metavar="JOB", help="job file to write (an existing job is re-imported)")
    p.add_argument("--level", metavar="NAME", help="storey to read (IFC; needed when beams are on several)")
    p.add_argument("--template", metavar="JOB", help="job whose deck, slab, loads and studs the beams take")
    p.add_argument("--template-beam", metavar="MARK", help="the template's beam to take loads and studs from (default its first)")
    p.add_argument("--map", action="append", default=[], metavar="KEY=COLUMN",
                   help="schedule: the column holding KEY (mark, shape, span, spacing, spacing_left, edge_left, "
                        "level, studs, x1 ...)")


def _kind(path: Path) -> str:
    suffix = path.suffix.lower()
    if suffix == ".ifc":
        return "ifc"
    if suffix in (".csv", ".txt", ".xlsx", ".xlsm"):
        return "schedule"
    try:
        if not stat.S_ISREG(os.stat(path).st_mode):
            return "schedule"  # not opened here (a FIFO would block): the reader refuses it by its kind
        with open(path, "rb") as fh:
            head = fh.read(16)
    except OSError:
        return "schedule"
    return "ifc" if head.lstrip().startswith(b"ISO-10303-21") else "schedule"


def _same_file(a: Path, b: Path) -> bool:
    try:
        return a.exists() and b.exists() and os.path.samefile(a, b)
    except OSError:
        return a.resolve() == b.resolve()


def _read(args: argparse.Namespace):
    """(records, Source, problems) from the IFC model or the schedule."""
    from fieldcomp.jobs.floor_job import SIDE_BASIS, SPAN_BASIS
    from fieldcomp.jobs.floor_text import Source, printable

    source = Path(args.source)
    if _kind(source) == "ifc":
        from fieldcomp.jobs.floor_geometry import lay_out
        from fieldcomp.jobs.floor_job import from_layout
        from fieldcomp.jobs.ifc_floor import open_model, read_storey

        model = open_model(source)
        storey = read_storey(source, model, args.level)
        records, problems = from_layout(lay_out(storey.members, storey.posts, storey.slabs), storey.level, storey.notes)
        problems = [str(p) for p in storey.problems] + problems
        project = next((p.Name for p in model.by_type("IfcProject") if p.Name), source.stem)
        info = Source(str(source), f"{storey.schema} model, length unit {storey.unit}", printable(project), storey.level,
                      [SPAN_BASIS, SIDE_BASIS], problems, [(s.source_id, s.thickness) for s in storey.slabs])
        return records, info
    from fieldcomp.jobs.schedule_floor import read_schedule

    mapping = {}
    for item in args.map:
        key, sep, column = item.partition("=")
        if not sep or not key.strip() or not column.strip():
            raise ValueError(f"--map {item!r}: write KEY=Column, e.g. --map span='Length (ft)'")
        mapping[key.strip()] = column.strip()
    records, problems, notes = read_schedule(source, mapping)
    info = Source(str(source), "framing schedule", source.stem, None,
                  ["span, spacings and coordinates as the schedule gives them", *notes], problems)
    return records, info


def run(args: argparse.Namespace) -> int:
    from engine.model.errors import FieldcompError
    from fieldcomp.jobs.atomic import write_bytes_atomic, write_text_atomic
    from fieldcomp.jobs.file_kinds import FileKindError, check_output, read_regular
    from fieldcomp.jobs.floor_text import CONFIRM, job_text
    from fieldcomp.jobs.jobfile import MAX_BYTES, load_job, parse_job
    from fieldcomp.jobs.reimport import reimport

    out = Path(args.output)
    backup = out.with_name(out.name + ".bak")
    for given in [Path(args.source)] + ([Path(args.template)] if args.template else []):
        if any(_same_file(target, given) or target.resolve() == given.resolve() for target in (out, backup)):
            return fail_input(f"{out}: writing it would overwrite the input {given}; give another -o")
    previous: bytes | None = None
    try:
        check_output(out)
        template = load_job(args.template).job if args.template else None
        records, info = _read(args)
        if not records:
            raise ValueError(f"{args.source}: no beam could be read" + "".join(f"\n  {p}" for p in info.left_out))
        if out.exists():
            previous = read_regular(out, MAX_BYTES, "job files")
            result = reimport(previous.decode("utf-8-sig"), load_job(out).job, records, info.level, template,
                              args.template_beam, tuple(info.slabs))
            text = result.text
        else:
            text = job_text(info, records, template, args.template_beam)
            parse_job(text, out)
    except (FieldcompError, ValueError) as exc:
        return fail_input(exc)
    try:
        if previous is not None:
            write_bytes_atomic(backup, previous)
        write_text_atomic(out, text)
    except FileKindError as exc:
        return fail_input(exc)
    except OSError as exc:
        return fail_output(exc, out)
    for line in info.left_out:
        print(f"not read: {line}")
    if previous is not None:
        _print_changes(out, result)
        copied = result.added and template is None  # new beams took loads from a beam of the job: to confirm
        return EXIT_REVIEW if info.left_out or result.gone or result.slabs or copied else EXIT_PASS
    girders = sum(r.girder for r in records)
    confirm = text.count(CONFIRM)
    print(f"wrote {out}: {len(records)} beam(s) ({girders} girder(s)) from {args.source}"
          + (f", level {info.level!r}" if info.level else ""))
    if confirm:
        print(f"{confirm} value(s) marked {CONFIRM} in {out}: confirm them before using any result")
    print(f"next: fieldcomp check {out}")
    return EXIT_REVIEW if info.left_out or confirm else EXIT_PASS


def _print_changes(out: Path, result) -> None:
    print(f"re-imported into {out} (previous version kept as {out.name}.bak): "
          f"{len(result.changed)} changed, {len(result.added)} added, {len(result.gone)} no longer in the source, "
          f"{result.unchanged} unchanged")
    for line in result.changed:
        print(f"  changed {line}")
    for line in result.added:
        print(f"  added   {line}")
    for line in result.gone:
        print(f"  kept    {line}")
    for line in result.slabs:
        print(f"  check   {line}")
