"""Benchmarks against the speed targets of the open issues. Not collected by pytest.

    python tools/bench.py            # all figures, medians
    python tools/bench.py --quick    # fewer repetitions
    python tools/bench.py --profile  # also cProfile the single-beam path and the 2,000-beam check

"Full evaluation" is what the workbench computes for one beam (fieldcomp.tui.outcome.compute_outcome):
the finished beam with its stud layout (`evaluate_beam`), the construction stage
(`evaluate_construction`), the layout as its own result (`design_layout`) and, for a beam with
findings, the as-built evaluation. The per-stage rows beneath it have no target of their own.
Every engine cache (functools.lru_cache) is cleared before each timed call, so the figures are
for a beam, shape and deck seen for the first time; stages of one call share what they compute.
"""

from __future__ import annotations

import argparse
import cProfile
import io
import pstats
import resource
import statistics
import subprocess
import sys
import tempfile
import time
import timeit
from contextlib import redirect_stdout
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
sys.path.insert(0, str(ROOT))


def median_seconds(fn, repeat: int, number: int = 1) -> float:
    return statistics.median(timeit.repeat(fn, repeat=repeat, number=number)) / number


def generated_job(beams: int) -> str:
    """The demo job's decks and slabs with `beams` beams cycled from the demo's beams, renamed."""
    text = DEMO.read_text().split("[[zone]]", 1)[0]  # the demo's pour zones name its own plan; left out
    head, _, rest = text.partition("[[beam]]")
    blocks = ["[[beam]]" + b for b in rest.split("[[beam]]")]
    marks = [b.split('mark = "', 1)[1].split('"', 1)[0] for b in blocks]
    out = [head]
    for i in range(beams):
        block, mark = blocks[i % len(blocks)], marks[i % len(blocks)]
        block = block.replace(f'mark = "{mark}"', f'mark = "{mark}-{i:04d}"', 1)
        for k, girder in enumerate(marks):  # a beam end on a girder names the girder of its own cycle
            block = block.replace(f'girder = "{girder}"', f'girder = "{girder}-{i - i % len(blocks) + k:04d}"')
        out.append(block)
    return "".join(out)


def cold_command(args: list[str], repeat: int) -> tuple[float, float]:
    """Median wall time (s) of a fresh `fieldcomp` process, and its median CPU time (s, user + system,
    worker processes included): CPU above wall means the work ran on several cores."""
    times, cpu = [], []
    for _ in range(repeat):
        before = resource.getrusage(resource.RUSAGE_CHILDREN)
        t0 = time.perf_counter()
        subprocess.run([sys.executable, "-m", "fieldcomp.cli.main", *args], cwd=ROOT, stdout=subprocess.DEVNULL,
                       stderr=subprocess.DEVNULL, check=False)
        times.append(time.perf_counter() - t0)
        after = resource.getrusage(resource.RUSAGE_CHILDREN)
        cpu.append(after.ru_utime - before.ru_utime + after.ru_stime - before.ru_stime)
    return statistics.median(times), statistics.median(cpu)


def engine_caches() -> list:
    """The lru_caches of the engine modules imported so far."""
    return [obj for name, mod in list(sys.modules.items()) if name == "engine" or name.startswith("engine.")
            for obj in vars(mod).values() if hasattr(obj, "cache_clear") and getattr(obj, "__module__", "") == name]


def cold(fn, caches: list):
    """`fn` run with every engine cache empty."""
    def run():
        for cache in caches:
            cache.cache_clear()
        fn()
    return run


def stages(beam):
    """The stages of a full evaluation of `beam`, as (name, callable)."""
    from engine.construction.evaluate import evaluate_construction
    from engine.pipeline import evaluate_beam
    from engine.field.as_built import evaluate_as_built
    from engine.studs.design import design_layout

    out = [("evaluate_beam", lambda: evaluate_beam(beam)),
           ("evaluate_construction", lambda: evaluate_construction(beam)),
           ("design_layout", lambda: design_layout(beam))]
    if beam.findings:
        designed = design_layout(beam).layout
        out.append(("evaluate_as_built", lambda: evaluate_as_built(beam, designed)))
    return out


def full_evaluation(beam):
    """One call running every stage of `beam` as the workbench does (see the module docstring)."""
    from engine.construction.evaluate import evaluate_construction
    from engine.pipeline import evaluate_beam
    from engine.field.as_built import evaluate_as_built
    from engine.studs.design import design_layout

    def run():
        evaluate_beam(beam)
        evaluate_construction(beam)
        placed = design_layout(beam)
        if beam.findings:
            evaluate_as_built(beam, placed.layout)
    return run


def single_beam_rows(beams, quick: bool) -> list[tuple[str, float, str, float | None]]:
    rows: list[tuple[str, float, str, float | None]] = []
    repeat = 7 if quick else 25
    for beam in beams:
        full_evaluation(beam)()  # imports every engine module the stages use
    caches = engine_caches()
    for beam in beams:
        con = beam.construction
        what = [f"{con.screed} screed"] + ([f"{len(con.pours)} pours"] if con.pours else []) + (
            [f"{len(beam.findings)} findings"] if beam.findings else [])
        t = median_seconds(cold(full_evaluation(beam), caches), repeat=repeat, number=10)
        rows.append((f"full evaluation {beam.mark} ({beam.n_stations} st; {', '.join(what)})", t * 1e3, "ms", 1.0))
        for name, fn in stages(beam):
            rows.append((f"  {name}", median_seconds(cold(fn, caches), repeat=repeat, number=10) * 1e3, "ms", None))
    return rows


def loading_row(path: Path, quick: bool) -> tuple[str, float, str, None]:
    from fieldcomp.jobs.jobfile import load_job
    from fieldcomp.jobs.to_engine import to_engine

    t = median_seconds(lambda: to_engine(load_job(path).job, path), repeat=3 if quick else 5)
    return ("  load_job + to_engine, 2,000 beams (in process)", t, "s", None)


def profile_single(beams) -> None:
    runs = [full_evaluation(b) for b in beams]
    for run in runs:
        run()
    runs = [cold(run, engine_caches()) for run in runs]
    prof = cProfile.Profile()
    prof.enable()
    for _ in range(50):
        for run in runs:
            run()
    prof.disable()
    print(f"\n--- cProfile: full evaluation of the {len(beams)} demo beams x 50, by own time ---")
    pstats.Stats(prof).sort_stats("tottime").print_stats(25)


def profile_cli(path: Path, verb: str) -> None:
    """cProfile of the verb run in this process with the worker pool off, so the per-beam work shows."""
    from fieldcomp.cli.main import main
    from fieldcomp.cli import parallel

    prof = cProfile.Profile()
    pool_min, parallel.POOL_MIN_BEAMS = parallel.POOL_MIN_BEAMS, 10**9
    try:
        with redirect_stdout(io.StringIO()):
            prof.enable()
            main([verb, str(path), "--json"])
            prof.disable()
    finally:
        parallel.POOL_MIN_BEAMS = pool_min
    print(f"\n--- cProfile: fieldcomp {verb} --json (2,000 beams) serial in process, by cumulative time ---")
    pstats.Stats(prof).sort_stats("cumulative").print_stats(30)


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--quick", action="store_true")
    ap.add_argument("--profile", action="store_true")
    opts = ap.parse_args()
    quick = opts.quick
    from fieldcomp.jobs.jobfile import load_job
    from fieldcomp.jobs.to_engine import to_engine

    beams = to_engine(load_job(DEMO).job)
    rows = single_beam_rows(beams, quick)
    with tempfile.TemporaryDirectory() as tmp:
        big = Path(tmp) / "floor2000.toml"
        big.write_text(generated_job(2000))
        cold = 1 if quick else 3
        for verb in ("check", "camber"):
            wall, cpu = cold_command([verb, str(big), "--json"], cold)
            rows.append((f"fieldcomp {verb} --json, 2,000-beam job, cold", wall, "s", 3.0))
            rows.append(("  CPU time of that run (all processes)", cpu, "s", None))
        rows.append(loading_row(big, quick))
        rows.append(("fieldcomp --help, cold", cold_command(["--help"], 3 if quick else 9)[0], "s", 0.3))
        print(f"{'what':72} {'median':>10}   target")
        for name, value, unit, target in rows:
            goal = "" if target is None else f"<= {target:g} {unit}  " + ("ok" if value <= target else "MISSED")
            print(f"{name:72} {value:8.3f} {unit:2}  {goal}")
        if opts.profile:
            profile_single(beams)
            profile_cli(big, "check")


if __name__ == "__main__":
    main()
