"""`fieldcomp plan JOB [--svg PATH] [--pdf PATH] [--level NAME]`: the framing plan to scale from
the beams' plan coordinates, each beam with its mark, shape, studs, camber to order and verdict,
findings located, grid lines where beam ends are named for grids. Prints the beams as text.

Exit codes: as `check` (0 all pass, 1 some fail, 3 some need review, 2 bad input)."""

from __future__ import annotations

import argparse

from fieldcomp import CAUTION, __version__
from fieldcomp.cli.common import exit_code, fail_input, fail_output, load_inputs
from fieldcomp.cli.outputs import add_issue_options


def register(sub) -> None:
    p = sub.add_parser("plan", help="framing plan to scale: marks, shapes, studs, camber, verdicts (SVG, PDF)")
    p.add_argument("job", help="job file (.toml)")
    p.add_argument("--svg", metavar="PATH", help="write the plan (SVG) here")
    p.add_argument("--pdf", metavar="PATH", help="write the plan (PDF sheet) here")
    p.add_argument("--level", metavar="NAME", help="only the beams on this level (the beams' `level` field)")
    add_issue_options(p, with_date=True)


def plan_beam(model_beam, beam):
    """A beam of the job (model and engine input) on the plan: the worst verdict of the finished
    beam, the construction stage and (with findings) the beam as built; studs laid out, camber
    ordered, findings' stations."""
    from engine.field.as_built import finding_slot
    from engine.model.results import worst
    from engine.pipeline import as_poured, evaluate_beam, field_layout, field_review
    from fieldcomp.jobs.model import coordinate_inches
    from fieldcomp.views.plan_view import PlanBeam

    poured, construction = as_poured(beam)
    r = evaluate_beam(poured)
    layout = field_layout(poured)[0]
    verdicts = [r.verdict, construction.verdict] + ([field_review(beam).before.verdict] if beam.findings else [])
    stations = []
    for i, f in enumerate(beam.findings):
        try:
            stations.append(float(layout.x[finding_slot(layout, f, i)]))
        except ValueError:
            continue
    p = model_beam.plan
    return PlanBeam(beam.mark, beam.shape.name, coordinate_inches(p.x1), coordinate_inches(p.y1), coordinate_inches(p.x2),
                    coordinate_inches(p.y2), r.groups.total, construction.camber.camber,
                    str(worst(verdicts)), beam.ribs.reference_end, beam.ribs.far_end,
                    tuple(stations))


def _bays(job, beams, shown: set[str]):
    """The level's bays whose members are all on the drawn plan, and the pour zones (none without
    a bay): the engine's bay solve, shaped for the plan by views.plan_bay."""
    from fieldcomp.cli.camber import level_bays
    from fieldcomp.views.bay_report import bay_json
    from fieldcomp.views.plan_bay import plan_bays, plan_zones

    result = level_bays(job, beams)
    if result is None:
        return [], []
    bays = [b for b in plan_bays(bay_json(result)) if set(b.members) <= shown]
    return bays, plan_zones(job) if bays else []


def run(args: argparse.Namespace) -> int:
    from fieldcomp.cli.outputs import issue_of, write_output
    from fieldcomp.jobs.jobfile import JobFileError
    from fieldcomp.views.plan_view import plan_pdf, plan_svg

    try:
        job, beams = load_inputs(args.job)
    except (JobFileError, ValueError) as exc:
        return fail_input(exc)
    models = {b.mark: b for b in job.beam}
    if args.level is not None:
        levels = sorted({b.level for b in job.beam if b.level})
        beams = [b for b in beams if models[b.mark].level == args.level]
        if not beams:
            return fail_input(f"{args.job}: no beam on level {args.level!r}; levels: {', '.join(levels) or 'none given'}")
    placed = [plan_beam(models[b.mark], b) for b in beams if models[b.mark].plan is not None]
    try:
        bays, zones = _bays(job, beams, {b.mark for b in placed})
    except (JobFileError, ValueError) as exc:
        return fail_input(exc)
    unplaced = [b.mark for b in beams if models[b.mark].plan is None]
    level = f" - {args.level}" if args.level and args.level not in job.project.name else ""
    title = f"Framing plan - {job.project.name}{level}"
    try:
        issue = issue_of(job.project.name, "FP", args.revision, args.date)
        if args.svg:
            write_output(args.svg, plan_svg(issue, placed, title, unplaced, bays, zones), [args.job])
        if args.pdf:
            write_output(args.pdf, plan_pdf(issue, placed, title, unplaced, bays, zones), [args.job])
    except OSError as exc:
        return fail_output(exc, args.svg if args.svg and not args.pdf else args.pdf)
    print(f"fieldcomp {__version__} - framing plan - job '{job.project.name}' ({args.job})")
    print(f"CAUTION: {CAUTION}")
    for b in placed:
        print(f"{b.mark:<10} {b.shape:<8} studs {b.studs:>3}  camber {b.camber:>5.2f} in  {b.verdict.upper():<6}  "
              f"findings {len(b.findings)}")
    if unplaced:
        print(f"not on the plan (no plan coordinates): {', '.join(unplaced)}")
    return exit_code([b.verdict for b in placed])
