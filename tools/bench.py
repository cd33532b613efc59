"""Benchmarks against the speed targets of the open issues. Not collected by pytest.

    python tools/bench.py            # all figures, medians, in one run
    python tools/bench.py --quick    # fewer repetitions, no 10,000-beam job
    python tools/bench.py --profile  # also cProfile the 2,000-beam check

"Full check" of a beam is what `fieldcomp check` computes for it (the construction stage, the
ponded concrete of a level screed, the stud layout, the finished beam: `as_poured` then
`evaluate_beam`) and, for a beam with findings, the field review with its repair
(`field_review`). A lone beam is checked with every engine cache (functools.lru_cache) empty, as
the workbench meets a beam edited; "in a batch" is the cost per beam of a floor of 200 beams of
the path, each different (their superimposed dead load differs by 0.01 psf), so no beam is a
repeat of another. Both are CPU time of this process (see `median_seconds`). The kernel
(tools/bench_kernel.py) is bare numpy over beams x stations: the limit the engine is measured
against. Cold commands run a fresh interpreter on a generated job: the demo's beams and a beam
whose layout falls short, cycled and renamed ("mixed": the repeats a floor has), or each beam
different ("distinct"); they give wall time, CPU time (all processes) and peak memory.
"""

from __future__ import annotations

import argparse
import cProfile
import io
import os
import pstats
import re
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
sys.path.insert(0, str(ROOT / "tools"))

# An invented beam whose drawings give too few studs: the layout falls short and the report says
# what would close it (the "what would close it" search runs).
SHORTFALL = '''
[[beam]]                       # too few studs on the drawings
mark = "3B-190"
shape = "W16X26"
span = "32'-0\\""
spacing_left = "10'-0\\""
spacing_right = "10'-0\\""
slab = "NW-3D"
superimposed_dead_psf = 20
live_psf = 100
[beam.studs]
length = "5 1/4 in"
position = "weak"
count = 10
'''

# The figures ("today") beside each row that has one; targets from the same issue.
TODAY = {"typical": "3-5 ms", "level screed": "9 ms", "shortfall": "20 ms", "findings with repair": "-"}


def median_seconds(fn, repeat: int, number: int = 1) -> float:
    """Median CPU time (s) of this process per call: the work is single-threaded, so on an idle
    machine it is the wall time; on a shared one it leaves out the time others held the cores."""
    return statistics.median(timeit.repeat(fn, repeat=repeat, number=number, timer=time.process_time)) / number


def generated_job(beams: int, distinct: bool = False, shortfall: bool = True) -> str:
    """The demo job's decks and slabs with `beams` beams cycled from the demo's beams (and the
    SHORTFALL beam), renamed; `distinct` makes each beam's superimposed dead load its own. A beam
    end on a girder names the girder of its own cycle; the demo's pour zones name its own plan
    and are left out."""
    text = DEMO.read_text().split("[[zone]]", 1)[0]
    head, _, rest = text.partition("[[beam]]")
    blocks = ["[[beam]]" + b for b in rest.split("[[beam]]")]
    if shortfall:
        blocks.append(SHORTFALL.strip("\n") + "\n\n")
    marks = [b.split('mark = "', 1)[1].split('"', 1)[0] for b in blocks]
    out = [head]
    for i in range(beams):
        block, mark = blocks[i % len(blocks)], marks[i % len(blocks)]
        block = block.replace(f'mark = "{mark}"', f'mark = "{mark}-{i:05d}"', 1)
        for k, girder in enumerate(marks):
            block = block.replace(f'girder = "{girder}"', f'girder = "{girder}-{i - i % len(blocks) + k:05d}"')
        if distinct:
            sdl = f"superimposed_dead_psf = {10 + i * 0.01:.2f}"
            block = (re.sub(r"superimposed_dead_psf = [0-9.]+", sdl, block, count=1) if "superimposed_dead_psf" in block
                     else block.replace("\n", f"\n{sdl}\n", 1))
        out.append(block)
    return "".join(out)


POOL_MODES = {  # how a cold command runs: as shipped, the worker pool off, the pool on for every verb
    "as shipped": "",
    "pool off": "parallel.POOL_MIN_BEAMS = 10**9; ",
    "pool on": "real = parallel.map_beams; parallel.map_beams = lambda fn, items, pooled=True: real(fn, items); ",
}


def cold_command(args: list[str], repeat: int, pool: str = "as shipped") -> tuple[float, float, float]:
    """Median wall time (s) of a fresh `fieldcomp` process, its CPU time (s, user + system, worker
    processes included: CPU above wall means several cores worked) and peak memory (MB, the main
    process), run as POOL_MODES[pool] says."""
    code = ("import sys; from fieldcomp.cli import parallel; " + POOL_MODES[pool]
            + "from fieldcomp.cli.main import main; sys.exit(main(sys.argv[1:]))")
    cmd = [sys.executable, "-c", code] if POOL_MODES[pool] else [sys.executable, "-m", "fieldcomp.cli.main"]
    times, cpu, peak = [], [], []
    for _ in range(repeat):
        t0 = time.perf_counter()
        proc = subprocess.Popen([*cmd, *args], cwd=ROOT, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        _, _, usage = os.wait4(proc.pid, 0)
        times.append(time.perf_counter() - t0)
        cpu.append(usage.ru_utime + usage.ru_stime)
        peak.append(usage.ru_maxrss / 1024.0)
    return statistics.median(times), statistics.median(cpu), max(peak)


def engine_caches() -> list:
    """The lru_caches of the engine modules imported so far."""
    return [obj for name, mod in list(sys.modules.items()) if name == "engine" or name.startswith("engine.")
            for obj in vars(mod).values() if hasattr(obj, "cache_clear") and getattr(obj, "__module__", "") == name]


def full_check(beam) -> None:
    """What `check` computes for one beam, and the field review of a beam with findings."""
    from engine.pipeline import as_poured, evaluate_beam, field_review

    poured, _ = as_poured(beam)
    evaluate_beam(poured)
    if beam.findings:
        field_review(beam)


def path_beams():
    """(path name, beam) for each path of the check."""
    from fieldcomp.jobs.jobfile import parse_job
    from fieldcomp.jobs.to_engine import to_engine

    beams = {b.mark: b for b in to_engine(parse_job(generated_job(8)))}
    return [("typical", beams["3B-105-00005"]), ("level screed", beams["3B-102-00001"]),
            ("shortfall", beams["3B-190-00007"]), ("findings with repair", beams["3B-103-00002"])]


def distinct_floor(beam, count: int):
    from dataclasses import replace

    return [replace(beam, mark=f"{beam.mark}-{i}", superimposed_dead_psf=beam.superimposed_dead_psf + 0.01 * i)
            for i in range(count)]


def kernel_rows(quick: bool) -> tuple[float, float]:
    """(single beam, per beam batched over 2,000) kernel medians (s)."""
    from bench_kernel import kernel, kernel_beams
    from fieldcomp.jobs.jobfile import load_job
    from fieldcomp.jobs.to_engine import to_engine

    demo = to_engine(load_job(DEMO).job)
    one = kernel_beams(demo[:1])
    many = kernel_beams([demo[i % len(demo)] for i in range(2000)])
    single = median_seconds(lambda: kernel(one), repeat=7 if quick else 15, number=20)
    batched = median_seconds(lambda: kernel(many), repeat=3 if quick else 7) / 2000
    return single, batched


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--quick", action="store_true")
    ap.add_argument("--profile", action="store_true")
    opts = ap.parse_args()
    quick = opts.quick
    rows: list[tuple[str, str, str, str, str]] = []  # what, today, now, target, ratio / note

    k_single, k_batch = kernel_rows(quick)
    rows.append(("bare numpy kernel, one beam", "0.12 ms", f"{k_single * 1e3:.3f} ms", "", ""))
    rows.append(("bare numpy kernel, per beam batched (2,000 x 401)", "20 us", f"{k_batch * 1e6:.1f} us", "", ""))
    for beam in path_beams():
        full_check(beam[1])  # imports every module the path uses
    caches = engine_caches()
    for name, beam in path_beams():
        def lone(b=beam):
            for cache in caches:
                cache.cache_clear()
            full_check(b)
        t = median_seconds(lone, repeat=7 if quick else 15, number=3)
        rows.append((f"full check, lone beam, {name}", TODAY[name], f"{t * 1e3:.2f} ms", "1 ms",
                     f"{t / k_single:.0f}x kernel (single)"))
        floor = distinct_floor(beam, 60 if quick else 200)
        for b in floor[:3]:
            full_check(b)
        t0 = time.process_time()
        for b in floor:
            full_check(b)
        t = (time.process_time() - t0) / len(floor)
        rows.append((f"full check, in a batch, {name}", TODAY[name], f"{t * 1e3:.2f} ms", "0.1 ms",
                     f"{t / k_batch:.0f}x kernel (batched)"))

    with tempfile.TemporaryDirectory() as tmp:
        sizes = (1, 100, 2000) if quick else (1, 100, 2000, 10000)
        today = {(2000, "check"): "15 s", (10000, "check"): "80 s, 375 MB"}
        target = {(2000, "check"): "1.5 s", (10000, "check"): "5 s, 200 MB"}
        jobs = {}
        for n in sizes:
            jobs[n] = Path(tmp) / f"floor{n}.toml"
            jobs[n].write_text(generated_job(n))
        distinct = Path(tmp) / "distinct2000.toml"
        distinct.write_text(generated_job(2000, distinct=True))
        cold = 1 if quick else 3
        for verb in ("check", "camber"):
            for n in sizes:
                wall, cpu, peak = cold_command([verb, str(jobs[n]), "--json"], 1 if n == 10000 else cold)
                rows.append((f"{verb} --json, {n:,} mixed beams, cold", today.get((n, verb), ""),
                             f"{wall:.2f} s, {peak:.0f} MB", target.get((n, verb), ""), f"CPU {cpu:.2f} s"))
            runs: dict[str, list[tuple[float, float, float]]] = {"pool on": [], "pool off": []}
            for _ in range(cold):  # alternating, so both see much the same load on the machine
                for pool, done in runs.items():
                    done.append(cold_command([verb, str(distinct), "--json"], 1, pool=pool))
            for pool, done in runs.items():
                wall, cpu, peak = (statistics.median(v[i] for v in done) for i in range(3))
                rows.append((f"{verb} --json, 2,000 distinct beams, cold, {pool}", "",
                             f"{wall:.2f} s, {peak:.0f} MB", "", f"CPU {cpu:.2f} s"))
        wall, _, peak = cold_command(["--help"], 5 if quick else 11)
        rows.append(("fieldcomp --help, cold", "0.05 s", f"{wall:.3f} s", "0.1 s", f"{peak:.0f} MB"))
        print(f"{'what':62} {'today':>13} {'now':>17} {'target':>12}   ratio / note")
        for what, was, now, goal, note in rows:
            print(f"{what:62} {was:>13} {now:>17} {goal:>12}   {note}")
        if opts.profile:
            profile_cli(jobs[2000], "check")


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


if __name__ == "__main__":
    main()
