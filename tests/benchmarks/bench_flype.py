"""Benchmark of the alternating enumeration and of the flype-class code.

1. ``alternating.codes(n)`` (prime alternating knots, n crossings) for n = 3 … N, each n
   in a fresh subprocess (so the lower levels are rebuilt and counted), wall time and
   peak resident memory (ru_maxrss of the child).
2. ``flype_code`` on random reduced prime alternating diagrams of 20, 30, 40 crossings
   (``alternating.random_diagram``, 10 seeds each): orbit size, median and worst time.
3. ``flype_code`` on a few structured 40-crossing diagrams with long twist regions
   (two-bridge, pretzel), where the orbit is large, with the default budget.

Usage::

    python tests/benchmarks/bench_flype.py [--max-n 12] [--out reports/bench_flype.md]
"""

from __future__ import annotations

import argparse
import multiprocessing as mp
import platform
import resource
import statistics
import sys
import time

from pipeline import parse
from pipeline.diagrams.families import alternating
from pipeline.diagrams.canonical import canonical_text
from pipeline.diagrams.flype import _orbit_states, flype_code
from pipeline.diagrams.shadow import to_diagram
from pipeline.errors import BudgetExceeded

BUDGET = 1000  # orbit members for the structured diagrams (the default is FLYPE_BUDGET)
STRUCTURED = ["conway:" + " ".join(["3", "2", "2"] * 6) + " 4", "pretzel:5,5,5,5,5,5,5,5",
              "montesinos:3/10,5/13,4/11,2/7"]


def _child(n: int, q) -> None:
    t0 = time.perf_counter()
    count = len(alternating.codes(n))
    q.put((count, time.perf_counter() - t0, resource.getrusage(resource.RUSAGE_SELF).ru_maxrss))


def enumeration_row(n: int):
    ctx = mp.get_context("spawn")
    q = ctx.Queue()
    p = ctx.Process(target=_child, args=(n, q))
    p.start()
    out = q.get()
    p.join()
    return out


def main(argv=None) -> int:
    ap = argparse.ArgumentParser()
    ap.add_argument("--max-n", type=int, default=12)
    ap.add_argument("--out", default="reports/bench_flype.md")
    args = ap.parse_args(argv)
    lines = ["# Benchmark: prime alternating enumeration and flype-class codes", "",
             f"Script: `tests/benchmarks/bench_flype.py`. Machine: {platform.machine()}, 2 cores shared "
             f"with other jobs (one core used), Python {sys.version.split()[0]}.", "",
             "## Enumeration of prime alternating knots (`alternating.codes(n)`)", "",
             "Each n in a fresh process: all prime reduced shadows up to n − 1 crossings are grown, "
             "the one-component shadows with n crossings formed and grouped into flype classes.", "",
             "| n | knots | seconds | peak RSS (MB) |", "|---:|---:|---:|---:|"]
    total = 0.0
    for n in range(3, args.max_n + 1) if args.max_n >= 3 else ():
        count, secs, rss = enumeration_row(n)
        total += secs
        lines.append(f"| {n} | {count} | {secs:.2f} | {rss / 1024:.0f} |")
        print(lines[-1], flush=True)
    lines += ["", f"Total 3…{args.max_n}: {total:.1f} s (each n from scratch; one process "
              f"building 3…{args.max_n} in turn reuses the levels and takes about the last row's time).", ""]
    lines += ["## Flype-class code of random reduced prime alternating diagrams", "",
              "`flype_code` = breadth-first flype orbit with one alternating map code per member.", "",
              f"Budget {BUDGET} orbit members; sizes over the diagrams within budget.", "",
              "| crossings | seeds | orbit sizes (min/median/max) | over budget | median ms | worst ms |",
              "|---:|---:|---|---:|---:|---:|"]
    for n in (20, 30, 40):
        times, sizes, over = [], [], 0
        for seed in range(10):
            d = alternating.random_diagram(n, seed=seed)
            t0 = time.perf_counter()
            try:
                states = _orbit_states(d, BUDGET)
                canonical_text(to_diagram(*states[min(states)]))  # = flype_code(d)
                sizes.append(len(states))
            except BudgetExceeded:
                over += 1
            times.append(1000 * (time.perf_counter() - t0))
        sizes = sizes or [0]
        lines.append(f"| {n} | 10 | {min(sizes)}/{int(statistics.median(sizes))}/{max(sizes)} | {over} | "
                     f"{statistics.median(times):.0f} | {max(times):.0f} |")
        print(lines[-1], flush=True)
    lines += ["", "## Structured 40-crossing diagrams (long twist regions)", "",
              f"Budget {BUDGET} orbit members.", "", "| diagram | crossings | result | seconds |", "|---|---:|---|---:|"]
    for text in STRUCTURED:
        d = parse(text)
        t0 = time.perf_counter()
        try:
            flype_code(d, budget=BUDGET)
            res = "code"
        except BudgetExceeded as e:
            res = str(e)
        lines.append(f"| `{text}` | {d.n_crossings} | {res} | {time.perf_counter() - t0:.1f} |")
        print(lines[-1], flush=True)
    lines.append("")
    with open(args.out, "w") as fh:
        fh.write("\n".join(lines))
    return 0


if __name__ == "__main__":
    sys.exit(main())
