"""Benchmark of the alternating enumeration and of the flype-class code.

1. ``alternating.codes(n)`` (prime alternating knots, n crossings) for n = 3 … N, each n
   in a fresh subprocess (so the lower levels are rebuilt and counted), wall time and
   peak resident memory (ru_maxrss of the child).
2. ``flype_codes`` on random reduced prime alternating diagrams of 20, 30, 40 crossings
   (``alternating.random_diagram``, 10 seeds each), by the fast route (members with the
   fewest twist regions, block flypes) and by the whole-orbit reference
   (``flype_codes_by_orbit``) in the same run: sizes searched, median and worst time,
   and that both return the same codes.
3. The same on structured diagrams with long twist regions (two-bridge chain, pretzel,
   Montesinos).

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
from pipeline.diagrams.flype import _codes_of, _fewest_regions, _gathered, _orbit_states
from pipeline.errors import BudgetExceeded

BUDGET = 1000  # members searched per route (the default is FLYPE_BUDGET)
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


def _with_codes(states, pick):
    """(number of members searched, (code, mirror code))."""
    return len(states), _codes_of(pick(states))


def _timed(fn):
    """(result of fn or 'over budget', milliseconds)."""
    t0 = time.perf_counter()
    try:
        res = fn()
    except BudgetExceeded:
        res = "over budget"
    return res, 1000 * (time.perf_counter() - t0)


def _size(res) -> str:
    return res if isinstance(res, str) else str(res[0])


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
    lines += ["## Flype-class code: fast route against the whole-orbit reference", "",
              "`fast` = `flype_codes(route=\"gathered\")` (search of the members with the fewest twist regions by "
              "block flypes); `orbit` = `flype_codes` (the default, used for knot keys: breadth-first search of the whole "
              f"orbit). Budget {BUDGET} members for each; `same` = both returned the same two codes "
              "(— when the reference is over budget).", "",
              "| diagram | crossings | searched fast / orbit | fast ms | orbit ms | orbit / fast | same |",
              "|---|---:|---|---:|---:|---:|:-:|"]
    ratios = {}
    cases = [(f"random {n}, seed {s}", alternating.random_diagram(n, seed=s), n)
             for n in (20, 30, 40) for s in range(10)]
    cases += [(f"`{t}`", parse(t), "structured") for t in STRUCTURED]
    for name, d, group in cases:
        fast, tf = _timed(lambda: _with_codes(_gathered(d, BUDGET), lambda st: st))
        slow, ts = _timed(lambda: _with_codes(_orbit_states(d, BUDGET), _fewest_regions))
        same = "—" if isinstance(slow, str) or isinstance(fast, str) else \
            ("yes" if fast[1] == slow[1] else "NO")
        ratio = ts / tf
        ratios.setdefault(group, []).append((tf, ts, ratio))
        lines.append(f"| {name} | {d.n_crossings} | {_size(fast)} / {_size(slow)} | {tf:.0f} | {ts:.0f} | "
                     f"{ratio:.1f} | {same} |")
        print(lines[-1], flush=True)
    lines += ["", "| group | median fast ms | worst fast ms | median orbit ms | median ratio |",
              "|---|---:|---:|---:|---:|"]
    for group, rows in ratios.items():
        lines.append(f"| {group} | {statistics.median(r[0] for r in rows):.0f} | {max(r[0] for r in rows):.0f} | "
                     f"{statistics.median(r[1] for r in rows):.0f} | {statistics.median(r[2] for r in rows):.1f} |")
    lines.append("")
    with open(args.out, "w") as fh:
        fh.write("\n".join(lines))
    return 0


if __name__ == "__main__":
    sys.exit(main())
