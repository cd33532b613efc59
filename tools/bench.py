"""Benchmarks against the targets in DESIGN.md section 5. Not collected by pytest.

    python tools/bench.py            # all figures, medians
    python tools/bench.py --quick    # fewer repetitions
"""

from __future__ import annotations

import argparse
import statistics
import subprocess
import sys
import tempfile
import time
import timeit
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "jobs" / "harbor_row_level3.toml"
sys.path.insert(0, str(ROOT))


def median_seconds(fn, repeat: int, number: int = 1) -> float:
    return statistics.median(timeit.repeat(fn, repeat=repeat, number=number)) / number


def generated_job(beams: int) -> str:
    """The demo job's decks and slabs with `beams` beams cycled from the demo's beams, renamed."""
    text = DEMO.read_text()
    head, _, rest = text.partition("[[beam]]")
    blocks = ["[[beam]]" + b for b in rest.split("[[beam]]")]
    out = [head]
    for i in range(beams):
        block = blocks[i % len(blocks)]
        mark = block.split('mark = "', 1)[1].split('"', 1)[0]
        out.append(block.replace(f'mark = "{mark}"', f'mark = "{mark}-{i:04d}"', 1))
    return "".join(out)


def cold_command(args: list[str], repeat: int) -> float:
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        subprocess.run([sys.executable, "-m", "fieldcomp.cli", *args], cwd=ROOT, stdout=subprocess.DEVNULL,
                       stderr=subprocess.DEVNULL, check=False)
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--quick", action="store_true")
    quick = ap.parse_args().quick
    from engine.evaluate import evaluate_beam
    from fieldcomp.jobfile import load_job
    from fieldcomp.to_engine import to_engine

    beams = to_engine(load_job(DEMO).job)
    rows = []
    for beam in beams:
        t = median_seconds(lambda: evaluate_beam(beam), repeat=5 if quick else 15, number=10)
        rows.append((f"evaluate_beam {beam.mark} ({beam.n_stations} stations)", t * 1e3, "ms", 1.0))
    with tempfile.TemporaryDirectory() as tmp:
        big = Path(tmp) / "floor2000.toml"
        big.write_text(generated_job(2000))
        rows.append(("fieldcomp check, 2,000-beam job, cold", cold_command(["check", str(big), "--json"],
                                                                        1 if quick else 3), "s", 3.0))
    rows.append(("fieldcomp --help, cold", cold_command(["--help"], 3 if quick else 9), "s", 0.3))
    print(f"{'what':58} {'median':>10}   target")
    for name, value, unit, target in rows:
        flag = "ok" if value <= target else "MISSED"
        print(f"{name:58} {value:8.3f} {unit:2}  <= {target:g} {unit}  {flag}")


if __name__ == "__main__":
    main()
