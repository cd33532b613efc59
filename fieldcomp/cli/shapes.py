"""`fieldcomp shapes [PATTERN]`: list W shapes with key properties."""

from __future__ import annotations

import argparse
import sys

from fieldcomp.cli.common import EXIT_INPUT, EXIT_PASS


def register(sub) -> None:
    s = sub.add_parser("shapes", help="list W shapes with key properties")
    s.add_argument("pattern", nargs="?", default="*", help="glob such as 'W21*' (default: all)")


def run(args: argparse.Namespace) -> int:
    from engine.model.shapes import find_shapes

    rows = find_shapes(args.pattern.upper().replace(" ", ""))
    if not rows:
        print(f"no W shape matches {args.pattern!r}", file=sys.stderr)
        return EXIT_INPUT
    print(f"{'shape':10} {'lb/ft':>6} {'A in2':>7} {'d in':>6} {'bf in':>6} {'tf in':>6} {'tw in':>6} "
          f"{'Ix in4':>8} {'Zx in3':>7} {'Sx in3':>7} {'ry in':>6}")
    for s in rows:
        print(f"{s.name:10} {s.weight_plf:6.1f} {s.area:7.2f} {s.d:6.2f} {s.bf:6.2f} {s.tf:6.3f} {s.tw:6.3f} "
              f"{s.ix:8.0f} {s.zx:7.1f} {s.sx:7.1f} {s.ry:6.2f}")
    print("Source: AISC Shapes Database v16.0 figures (see README, data sources).")
    return EXIT_PASS
